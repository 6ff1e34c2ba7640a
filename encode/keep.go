package encode

import (
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// keepModel is the kept timetable (Options.Keep) as the soft criteria see
// it: per section, its kept meetings in the order "moved meetings" pairs
// them (start period, then room, then meeting number).
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
// meeting number: the pairing order of "moved meetings".
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

// keepMeetings writes the time half of "moved meetings": the i-th meeting
// of a section (in start order) pairs with the i-th kept meeting and costs
// the criterion's weight unless it starts at the same period. "The i-th
// start is K" holds when start(S,K) holds and exactly i starts come before
// K, which a sequential counter over the section's candidates tells:
// upto(S,c,j) means at least j starts at or before candidate c. The room
// half is decided by room assignment, which prefers the kept room.
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
		if len(kept) == 0 {
			continue
		}
		sb.aboutSection(s)
		m := &sb.c.secs[s]
		pairs := min(len(kept), m.meetings)
		if m.meetings == 1 {
			if a := m.startAt(kept[0].Period); a != 0 {
				sb.weak(timetable.CritMoved, w, l, solver.Neg(a))
			} else {
				sb.weak(timetable.CritMoved, w, l)
			}
			continue
		}
		upto := sb.counter(s, pairs)
		for i := 0; i < pairs; i++ {
			k := kept[i].Period
			a := m.startAt(k)
			if a == 0 {
				sb.weak(timetable.CritMoved, w, l) // that start is gone: the meeting moves
				continue
			}
			body := []solver.Lit{solver.Pos(a)}
			prev := candidatesBelow(m.starts, k) - 1 // index of the last candidate before k
			if prev < 0 {
				if i > 0 {
					sb.weak(timetable.CritMoved, w, l) // cannot be the i-th start
					continue
				}
			} else {
				if i > 0 {
					if lit := upto[prev][i]; lit != 0 {
						body = append(body, lit)
					} else {
						sb.weak(timetable.CritMoved, w, l)
						continue
					}
				}
				if lit := upto[prev][i+1]; lit != 0 {
					body = append(body, lit.Not())
				}
			}
			keptAt := sb.newAtom(fmt.Sprintf("kept(%s,%d)", quote(sb.t.Sections[s].ID), i+1), aux(s, k))
			sb.rule(keptAt, body...)
			sb.weak(timetable.CritMoved, w, l, solver.Neg(keptAt))
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

// candidatesBelow is the number of candidates below p.
func candidatesBelow(starts []int, p int) int {
	i, _ := slices.BinarySearch(starts, p)
	return i
}

// counter returns, for section s, upto[c][j] for candidate index c and
// j = 0..most+1: a literal that holds when at least j of the section's
// starts lie at or before candidate c (0 when that can never hold; j = 0
// is never used). Rules: upto(c,1) :- start(c); upto(c,j) :- upto(c-1,j);
// upto(c,j) :- upto(c-1,j-1), start(c).
func (sb *softBuilder) counter(s, most int) [][]solver.Lit {
	m := &sb.c.secs[s]
	id := quote(sb.t.Sections[s].ID)
	top := min(most+1, m.meetings)
	upto := make([][]solver.Lit, len(m.starts))
	for c, p := range m.starts {
		upto[c] = make([]solver.Lit, most+2)
		st := solver.Pos(m.start[p])
		for j := 1; j <= min(top, c+1); j++ {
			var bodies [][]solver.Lit
			if j == 1 {
				bodies = append(bodies, []solver.Lit{st})
			} else if prev := upto[c-1][j-1]; prev != 0 {
				bodies = append(bodies, []solver.Lit{prev, st})
			}
			if c > 0 && upto[c-1][j] != 0 {
				bodies = append(bodies, []solver.Lit{upto[c-1][j]})
			}
			if len(bodies) == 0 {
				continue
			}
			if len(bodies) == 1 && len(bodies[0]) == 1 {
				upto[c][j] = bodies[0][0]
				continue
			}
			a := sb.newAtom(fmt.Sprintf("starts_upto(%s,%s,%d)", id, periodName(sb.t.Periods[p]), j), aux(s, p))
			for _, body := range bodies {
				sb.rule(a, body...)
			}
			upto[c][j] = solver.Pos(a)
		}
	}
	return upto
}
