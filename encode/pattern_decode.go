package encode

import (
	"fmt"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// readPatterns reads the placements of pattern sections from a model: one
// per section (Meeting 1, Period -1, Time the 1-based chosen pattern, Room
// the chosen room or "" for a section that takes none). A model with not
// exactly one time (and room) per pattern section does not belong to the
// program.
func (d *decoder) readPatterns(model []solver.Atom) error {
	if len(d.c.pats) == 0 {
		return nil
	}
	t := d.t
	timeOf := make([]int, len(t.Sections))
	roomOf := make([]int, len(t.Sections))
	nTime := make([]int, len(t.Sections))
	nRoom := make([]int, len(t.Sections))
	for _, a := range model {
		if int(a) >= len(d.c.atoms) {
			continue
		}
		info := &d.c.atoms[a]
		switch info.Kind {
		case AtomTime:
			timeOf[info.Section] = info.Time
			nTime[info.Section]++
		case AtomRoom:
			roomOf[info.Section] = info.Room
			nRoom[info.Section]++
		}
	}
	for s := range t.Sections {
		pm := &d.c.pats[s]
		if !pm.on {
			continue
		}
		wantRoom := 0
		if pm.roomAt != nil {
			wantRoom = 1
		}
		if nTime[s] != 1 || nRoom[s] != wantRoom {
			return fmt.Errorf("the model gives section %s %d meeting times and %d rooms, not 1 and %d: the model does not belong to this program", t.Sections[s].ID, nTime[s], nRoom[s], wantRoom)
		}
		pl := timetable.Placement{Section: t.Sections[s].ID, Meeting: 1, Period: -1, Time: timeOf[s]}
		if wantRoom == 1 {
			pl.Room = t.Rooms[roomOf[s]].ID
		}
		d.pats = append(d.pats, pl)
	}
	return nil
}

// splitPatterns separates the placements of pattern sections (Time set)
// from the grid's.
func splitPatterns(s *timetable.Schedule) (grid, pats *timetable.Schedule) {
	grid, pats = &timetable.Schedule{}, &timetable.Schedule{}
	for _, pl := range s.Placements {
		if pl.Time > 0 {
			pats.Placements = append(pats.Placements, pl)
		} else {
			grid.Placements = append(grid.Placements, pl)
		}
	}
	return grid, pats
}

// bestGridRooms is bestRooms on a term with pattern sections: their rooms
// are the engine's choice and stay; the grid meetings' rooms are improved
// on their own (room improvement knows the grid only).
func (o *optRun) bestGridRooms(s *timetable.Schedule) *timetable.Schedule {
	grid, pats := splitPatterns(s)
	if len(grid.Placements) == 0 {
		return s
	}
	grid = improveRooms(o.t, o.cat, grid, o.opt.Keep)
	out := &timetable.Schedule{Placements: append(grid.Placements, pats.Placements...)}
	return out
}
