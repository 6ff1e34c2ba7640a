package encode

import (
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// patState is the builder's working state for pattern sections.
type patState struct {
	any     bool                   // the term has pattern sections
	anyTime map[string]solver.Atom // interned any_time atoms by section and pattern list
	nAny    int                    // any_time atoms made, for their names
	// roomTime: interned room_time atoms by section, room and time literal.
	roomTime map[[3]int]solver.Atom
	// Hard Unavailable rows by entity (indexed like the term's slices),
	// kept as rows so that minutes and weeks are exact.
	staff, cohort, section, room [][]timetable.Unavailability
}

// initPatterns marks the pattern sections and collects the hard
// unavailability rows they are checked against.
func (b *builder) initPatterns() {
	t := b.t
	b.c.pats = make([]patModel, len(t.Sections))
	b.pat.anyTime = map[string]solver.Atom{}
	b.pat.roomTime = map[[3]int]solver.Atom{}
	for s := range t.Sections {
		if t.Sections[s].UsesTimes() {
			b.c.pats[s].on = true
			b.pat.any = true
			b.c.anyPat = true
		}
	}
	if !b.pat.any {
		return
	}
	b.pat.staff = make([][]timetable.Unavailability, len(t.Staff))
	b.pat.cohort = make([][]timetable.Unavailability, len(t.Cohorts))
	b.pat.section = make([][]timetable.Unavailability, len(t.Sections))
	b.pat.room = make([][]timetable.Unavailability, len(t.Rooms))
	for _, row := range t.Unavailable {
		if !row.Hard {
			continue
		}
		var tab [][]timetable.Unavailability
		var idx map[string]int
		switch row.Kind {
		case timetable.WhoStaff:
			tab, idx = b.pat.staff, b.staffIdx
		case timetable.WhoCohort:
			tab, idx = b.pat.cohort, b.cohortIdx
		case timetable.WhoSection:
			tab, idx = b.pat.section, b.secIdx
		case timetable.WhoRoom:
			tab, idx = b.pat.room, b.roomIdx
		default:
			continue // reported by buildUnavail
		}
		if i, ok := idx[row.Who]; ok {
			tab[i] = append(tab[i], row)
		}
	}
}

// rowHits reports whether an Unavailable row meets a meeting of pattern tc:
// a common day, a common minute and a common teaching week (row weeks 0 =
// every week).
func rowHits(row *timetable.Unavailability, tc *timetable.TimeChoice) bool {
	if !tc.Days.Has(row.Day) || !(tc.Start < row.To && row.From < tc.End()) {
		return false
	}
	return row.Weeks == 0 || row.Weeks.Overlaps(tc.Weeks)
}

func rowsHit(rows []timetable.Unavailability, tc *timetable.TimeChoice) bool {
	for i := range rows {
		if rowHits(&rows[i], tc) {
			return true
		}
	}
	return false
}

// patternBlocked reports whether pattern i of section s meets during hard
// unavailability of the section, its staff or its cohorts.
func (b *builder) patternBlocked(s, i int) bool {
	sec := &b.t.Sections[s]
	tc := &sec.Times[i]
	if rowsHit(b.pat.section[s], tc) {
		return true
	}
	for _, id := range sec.Staff {
		if rowsHit(b.pat.staff[b.staffIdx[id]], tc) {
			return true
		}
	}
	for _, id := range sec.Cohorts {
		if rowsHit(b.pat.cohort[b.cohortIdx[id]], tc) {
			return true
		}
	}
	return false
}

// roomBlocked reports whether room r is unavailable at some meeting of tc.
func (p *patState) roomBlocked(r int, tc *timetable.TimeChoice) bool {
	return rowsHit(p.room[r], tc)
}
