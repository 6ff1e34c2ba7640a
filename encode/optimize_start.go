package encode

import (
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
