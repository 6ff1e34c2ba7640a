package encode

import (
	"context"
	"fmt"
	"slices"

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
// the gates. Room problems become cuts and the search goes on. It sets the
// result's status when there is no timetable.
func (o *optRun) first() error {
	if ok, err := o.startFrom(); err != nil || ok {
		return err
	}
	st, _, err := o.h.Find(o.ctx, nil, func(ctx context.Context, hard []solver.Atom) error {
		var assume []solver.Lit
		for _, a := range hard {
			if isDecision(o.cat.AtomInfo(a).Kind) {
				assume = append(assume, solver.Pos(a))
			}
		}
		st, err := o.x.Solve(ctx, assume...)
		switch {
		case err != nil:
			return err
		case st != solver.Satisfiable && ctx.Err() != nil:
			return ctx.Err()
		case st != solver.Satisfiable:
			return fmt.Errorf("internal error: the starts of a timetable of the hard program are %v in the whole program", st)
		}
		c, err := o.evaluate(o.x.Model())
		if err != nil {
			return err
		}
		o.accept(c)
		return nil
	}, maxFirstRounds)
	switch {
	case err != nil:
		return err
	case st == solver.Unsatisfiable:
		o.res.Status = solver.Unsatisfiable
		if o.res.Incomplete {
			o.res.Status = solver.Unknown
		}
	case st == solver.Unknown && o.ctx.Err() != nil:
		o.res.Stopped = o.ctxStopped()
	case st == solver.Unknown:
		return fmt.Errorf("internal error: room assignment keeps failing after %d rounds", maxFirstRounds)
	}
	return nil
}

// maxFirstRounds caps the rounds of the search for a first timetable.
const maxFirstRounds = 1000
