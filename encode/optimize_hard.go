package encode

import (
	"errors"
	"fmt"
	"slices"
	"time"

	"github.com/termwright/termwright/solver"
)

// HardProgram returns the program p (compiled with this catalog, perhaps
// extended since) without what the soft criteria added: no weak
// constraints, and none of the rules, choices and bounds that define their
// auxiliary atoms, which, left without rules, are false in every stable
// model. Atom numbers are unchanged, so the start atoms of its models mean
// what they mean in p, and assuming them in p determines the rest of a
// model of p. Searching for a first timetable is much faster without the
// weak constraints' atoms to branch on. It returns p itself when the
// catalog has no soft criteria.
func (c *Catalog) HardProgram(p *solver.Program) *solver.Program {
	m := c.soft
	if m == nil {
		return p
	}
	q := *p
	outside := func(i int, r [2]int) bool { return i < r[0] || i >= r[1] }
	q.Rules = nil
	for i, r := range p.Rules {
		if outside(i, m.rules) {
			q.Rules = append(q.Rules, r)
		}
	}
	q.Choices = nil
	for i, ch := range p.Choices {
		if outside(i, m.choices) {
			q.Choices = append(q.Choices, ch)
		}
	}
	q.Bounds = nil
	for i, b := range p.Bounds {
		if outside(i, m.bounds) {
			q.Bounds = append(q.Bounds, b)
		}
	}
	q.Weaks = nil
	q.Shows = slices.Clone(p.Shows)
	return &q
}

// first finds the first verified timetable: a model of the hard program,
// completed into a model of the whole program by assuming its starts, then
// the gates. Room problems are added to the program and the search is run
// again. It sets the result's status when there is no timetable.
func (o *optRun) first() error {
	for round := 0; round < 1000; round++ {
		if o.ctx.Err() != nil {
			o.res.Stopped = o.ctxStopped()
			return nil
		}
		t0 := time.Now()
		eopts := solver.DefaultOptions()
		eopts.Seed = o.opt.Seed
		hs, err := solver.New(o.cat.HardProgram(o.p), eopts)
		if err != nil {
			return fmt.Errorf("internal error: the engine rejects the compiled program: %w", err)
		}
		hs.SetProgress(func(solver.Stats) { o.note(false) })
		o.res.Rounds++
		st := hs.Solve(o.ctx)
		o.res.Engine = o.res.Engine.Add(hs.Stats())
		o.res.Timings.Solve += time.Since(t0)
		switch st {
		case solver.Unsatisfiable:
			o.res.Status = solver.Unsatisfiable
			if o.res.Incomplete {
				o.res.Status = solver.Unknown
			}
			return nil
		case solver.Unknown:
			o.res.Stopped = o.ctxStopped()
			return nil
		}
		s, err := o.engine()
		if err != nil {
			return err
		}
		for _, a := range hs.Model(nil) {
			if o.cat.AtomInfo(a).Kind == AtomStart {
				s.Assume(solver.Pos(a))
			}
		}
		t1 := time.Now()
		before := s.Stats()
		st = s.Solve(o.ctx)
		o.res.Engine = o.res.Engine.Add(s.Stats().Since(before))
		o.res.Timings.Solve += time.Since(t1)
		if st != solver.Satisfiable {
			if o.ctx.Err() != nil {
				o.res.Stopped = o.ctxStopped()
				return nil
			}
			return fmt.Errorf("internal error: the starts of a timetable of the hard program are %v in the whole program", st)
		}
		o.hall, o.conflict = nil, nil
		c, err := o.evaluate(s.Model(nil))
		var herr *HallError
		var rerr *RoomConflictError
		switch {
		case errors.As(err, &herr):
			o.hall = herr
		case errors.As(err, &rerr):
			o.conflict = rerr
		case err != nil:
			return err
		default:
			o.accept(c)
			return nil
		}
		if err := o.roomProblems(); err != nil {
			return err
		}
	}
	return errors.New("internal error: room assignment keeps failing after 1000 rounds")
}
