package encode

import (
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// keepModel is the kept timetable (Options.Keep) as the soft criteria see
// it: per section, its kept meetings ordered by start period, room and
// meeting number.
type keepModel struct {
	secs [][]timetable.Placement // per section index; nil when the section has no kept meeting
}

// newKeepModel indexes the kept timetable by section; placements of
// sections the term no longer has are dropped.
func newKeepModel(t *timetable.Term, kept *timetable.Schedule) *keepModel {
	k := &keepModel{secs: make([][]timetable.Placement, len(t.Sections))}
	idx := t.SectionIndex()
	for _, p := range kept.Placements {
		if s, ok := idx[p.Section]; ok {
			k.secs[s] = append(k.secs[s], p)
		}
	}
	for s := range k.secs {
		sortMeetings(k.secs[s])
	}
	return k
}

// sortMeetings orders one section's placements by start period, room and
// meeting number.
func sortMeetings(ps []timetable.Placement) {
	slices.SortStableFunc(ps, func(a, b timetable.Placement) int {
		switch {
		case a.Period != b.Period:
			return a.Period - b.Period
		case a.Room != b.Room:
			if a.Room < b.Room {
				return -1
			}
			return 1
		}
		return a.Meeting - b.Meeting
	})
}

// keepMeetings writes the time half of "moved meetings". A kept meeting is
// kept when some meeting of its section sits at its day, time and room, and
// moved otherwise (timetable.Cost counts the same way). The engine sees
// times only, so here a kept meeting moves when its section does not start
// at its period: one weak constraint "not start(S,p)" per kept meeting. A
// section starts at most once per period, so of several kept meetings at
// one period (possible in an edited file) all but one move whatever the
// timetable; a kept period that is no candidate any more moves too. The
// room half (the section starts there, in none of the kept rooms) is added
// by room improvement (roomSearch.indexKept); both halves together are the
// count of the definition, and this half alone never exceeds it, so the
// engine's bounds stay bounds.
func (sb *softBuilder) keepMeetings() {
	if sb.opt.Keep == nil {
		return
	}
	km := newKeepModel(sb.t, sb.opt.Keep)
	sb.m.keep = km
	w, l, on := sb.weight(timetable.CritMoved, 1)
	if !on {
		return
	}
	for s, kept := range km.secs {
		if len(kept) == 0 || sb.c.pats[s].on {
			continue // pattern sections: keepPatterns
		}
		sb.aboutSection(s)
		m := &sb.c.secs[s]
		for i, p := range kept {
			a := m.startAt(p.Period)
			if a == 0 || (i > 0 && kept[i-1].Period == p.Period) {
				sb.weak(timetable.CritMoved, w, l) // that start is gone, or taken by another kept meeting
				continue
			}
			sb.weak(timetable.CritMoved, w, l, solver.Neg(a))
		}
	}
}

// startAt is the start atom of the section at period p, 0 when p is no
// candidate (or out of the grid).
func (m *secModel) startAt(p int) solver.Atom {
	if p < 0 || p >= len(m.start) {
		return 0
	}
	return m.start[p]
}
