package encode

import (
	"errors"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// startAtoms lists the decision atoms that put the meetings of s where s
// has them: start atoms of grid meetings, time and room atoms of pattern
// sections. Placements that name an unknown section, or a time, period or
// room that is no candidate, are left out (the engine decides those).
func (c *Catalog) startAtoms(s *timetable.Schedule) []solver.Atom {
	if s == nil {
		return nil
	}
	idx := make(map[string]int, len(c.term.Sections))
	for i := range c.term.Sections {
		idx[c.term.Sections[i].ID] = i
	}
	roomIdx := make(map[string]int, len(c.term.Rooms))
	for i := range c.term.Rooms {
		roomIdx[c.term.Rooms[i].ID] = i
	}
	var out []solver.Atom
	for _, pl := range s.Placements {
		si, ok := idx[pl.Section]
		if !ok {
			continue
		}
		if !c.IsPattern(si) {
			if a := c.StartAtom(si, pl.Period); a != 0 {
				out = append(out, a)
			}
			continue
		}
		if a := c.TimeAtom(si, pl.Time-1); a != 0 {
			out = append(out, a)
		}
		if r, ok := roomIdx[pl.Room]; ok && pl.Room != "" {
			if a := c.RoomAtom(si, r); a != 0 {
				out = append(out, a)
			}
		}
	}
	return out
}

// startFrom makes the warm start (OptimizeOptions.Start) the first
// timetable when the whole program has a model with its decisions: the
// engine completes it under those assumptions and the model goes through
// the gates. It reports false, with nothing kept, when the start is not a
// timetable of this term, or its rooms need a cut (the search for a first
// timetable then runs as usual, the start's places tried first).
func (o *optRun) startFrom() (bool, error) {
	c, err := o.completeStarts(o.opt.Start)
	switch {
	case errors.Is(err, errNotAdopted):
		return false, nil
	case err != nil:
		return false, err
	}
	o.accept(c)
	return true, nil
}

// completeStarts solves the live engine under timetable s's starts and
// puts its model through the gates. It returns errNotAdopted when s has no
// starts of this term, the engine finds no model under them, or the
// model's rooms need a cut (made) or the run ended.
func (o *optRun) completeStarts(s *timetable.Schedule) (*candidate, error) {
	atoms := o.cat.startAtoms(s)
	if len(atoms) == 0 {
		return nil, errNotAdopted
	}
	lits := make([]solver.Lit, len(atoms))
	for i, a := range atoms {
		lits[i] = solver.Pos(a)
	}
	st, err := o.x.Solve(o.ctx, lits...)
	if err != nil {
		return nil, err
	}
	if st != solver.Satisfiable {
		return nil, errNotAdopted
	}
	c, err := o.evaluate(o.x.Model())
	if err != nil {
		if o.x.Cut(err) || o.ctx.Err() != nil {
			return nil, errNotAdopted
		}
		return nil, err
	}
	return c, nil
}
