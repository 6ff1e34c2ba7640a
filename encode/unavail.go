package encode

import (
	"github.com/termwright/termwright/timetable"
)

// entityUnavail is the hard unavailability of one staff member, cohort,
// section or room: which periods are blocked and the rows that say so.
type entityUnavail struct {
	periods []bool             // periods[p] true when blocked; nil when never blocked
	src     []timetable.Source // Unavailable rows
}

func (e *entityUnavail) blocked(p int) bool { return e.periods != nil && e.periods[p] }

// unavailTable holds hard unavailability by kind, indexed like the term's
// slices.
type unavailTable struct {
	staff, cohort, section, room []entityUnavail
}

// buildUnavail reads the term's hard Unavailable rows. Soft rows are
// preferences for the optimiser and are skipped here.
func (b *builder) buildUnavail() {
	t := b.t
	u := unavailTable{
		staff:   make([]entityUnavail, len(t.Staff)),
		cohort:  make([]entityUnavail, len(t.Cohorts)),
		section: make([]entityUnavail, len(t.Sections)),
		room:    make([]entityUnavail, len(t.Rooms)),
	}
	for _, row := range t.Unavailable {
		if !row.Hard {
			continue
		}
		var tab []entityUnavail
		var idx map[string]int
		switch row.Kind {
		case timetable.WhoStaff:
			tab, idx = u.staff, b.staffIdx
		case timetable.WhoCohort:
			tab, idx = u.cohort, b.cohortIdx
		case timetable.WhoSection:
			tab, idx = u.section, b.secIdx
		case timetable.WhoRoom:
			tab, idx = u.room, b.roomIdx
		default:
			b.errorf(row.Src, "unavailability of %q has an unknown kind: say whether it is staff, a room, a cohort or a section", row.Who)
			continue
		}
		i, ok := idx[row.Who]
		if !ok {
			b.errorf(row.Src, "%s %q is not in the term: correct the ID or remove the row", row.Kind, row.Who)
			continue
		}
		e := &tab[i]
		hit := false
		for p, per := range t.Periods {
			if row.Covers(per) {
				if e.periods == nil {
					e.periods = make([]bool, len(t.Periods))
				}
				e.periods[p] = true
				hit = true
			}
		}
		if hit {
			e.src = append(e.src, row.Src)
		}
	}
	b.unavail = u
}
