package encode

import (
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// patternSoft writes the weak constraints of pattern sections: "time
// choice" (the chosen pattern's Weight, one weak constraint per candidate
// pattern with a weight), "room choice" (the chosen room's Weight from
// RoomChoices, once per section: a pattern section has one placement) and,
// with Options.Keep, "moved meetings": a kept pattern section moves when
// it takes another pattern or another room, one weak constraint "not
// stays(S)" with stays(S) :- time(S,I), in(S,R) (the kept time alone for a
// section without a room); a kept pattern or room that is no candidate any
// more moves whatever the timetable.
func (sb *softBuilder) patternSoft() {
	if !sb.pat.any {
		return
	}
	t := sb.t
	wt, lt, onT := sb.weight(timetable.CritTimeChoice, 1)
	wr, lr, onR := sb.weight(timetable.CritRoomChoice, 1)
	for s := range t.Sections {
		pm := &sb.c.pats[s]
		if !pm.on {
			continue
		}
		sb.aboutSection(s)
		if onT {
			for _, i := range pm.times {
				if w := t.Sections[s].Times[i].Weight; w != 0 {
					sb.weak(timetable.CritTimeChoice, wt*int64(w), lt, solver.Pos(pm.time[i]))
				}
			}
		}
		if onR && len(t.Sections[s].RoomChoices) > 0 {
			for k, w := range pm.roomW {
				if w != 0 {
					sb.weak(timetable.CritRoomChoice, wr*int64(w), lr, solver.Pos(pm.room[k]))
				}
			}
		}
	}
	sb.patternAvoidTimes()
	sb.patternSeats()
	sb.keepPatterns()
}

// patternAvoidTimes writes "avoid times" for pattern sections: a soft
// Unavailable row of weight w costs w per day of the chosen pattern whose
// meeting overlaps the row's time (in a common week when the row names
// weeks): a weak constraint on the time atom for rows of the section, its
// staff and cohorts, on the time and room atoms together for rows of a
// room.
func (sb *softBuilder) patternAvoidTimes() {
	t := sb.t
	if w, _ := t.CriterionWeight(timetable.CritAvoidTimes); w == 0 {
		return
	}
	type hit struct{ s, i, r int } // r -1: any room
	sum := map[hit]int64{}
	var order []hit
	add := func(h hit, w int64) {
		if _, ok := sum[h]; !ok {
			order = append(order, h)
		}
		sum[h] += w
	}
	days := func(u *timetable.Unavailability, tc *timetable.TimeChoice) int64 {
		if u.Weeks != 0 && !u.Weeks.Overlaps(tc.Weeks) || !tc.Days.Has(u.Day) || !(tc.Start < u.To && u.From < tc.End()) {
			return 0
		}
		return 1 // one day of the pattern is the row's day
	}
	for k := range t.Unavailable {
		u := &t.Unavailable[k]
		if u.Hard || u.Weight <= 0 {
			continue
		}
		for s := range t.Sections {
			pm := &sb.c.pats[s]
			if !pm.on {
				continue
			}
			sec := &t.Sections[s]
			room := -1
			switch u.Kind {
			case timetable.WhoStaff:
				if !slices.Contains(sec.Staff, u.Who) {
					continue
				}
			case timetable.WhoCohort:
				if !slices.Contains(sec.Cohorts, u.Who) {
					continue
				}
			case timetable.WhoSection:
				if sec.ID != u.Who {
					continue
				}
			case timetable.WhoRoom:
				r, ok := sb.roomIdx[u.Who]
				if !ok || pm.roomAt == nil || pm.roomAt[r] < 0 {
					continue
				}
				room = r
			default:
				continue
			}
			for _, i := range pm.times {
				if n := days(u, &sec.Times[i]); n > 0 {
					add(hit{s, i, room}, n*int64(u.Weight))
				}
			}
		}
	}
	for _, h := range order {
		w, l, ok := sb.weight(timetable.CritAvoidTimes, sum[h])
		if !ok {
			continue
		}
		sb.aboutSection(h.s)
		pm := &sb.c.pats[h.s]
		if h.r < 0 {
			sb.weak(timetable.CritAvoidTimes, w, l, solver.Pos(pm.time[h.i]))
		} else {
			sb.weak(timetable.CritAvoidTimes, w, l, solver.Pos(pm.time[h.i]), solver.Pos(pm.room[pm.roomAt[h.r]]))
		}
	}
}

// patternSeats writes "wasted seats" and, under SoftCapacity, "room over
// capacity" for pattern sections: once per section (one placement), on
// its room atom.
func (sb *softBuilder) patternSeats() {
	t := sb.t
	ww, lw, onW := sb.weight(timetable.CritWastedSeats, 1)
	wo, lo, onO := sb.weight(timetable.CritOverCapacity, 1)
	onO = onO && t.SoftCapacity
	if !onW && !onO {
		return
	}
	for s := range t.Sections {
		pm := &sb.c.pats[s]
		if !pm.on {
			continue
		}
		sb.aboutSection(s)
		size := t.Sections[s].Size
		for k, r := range pm.rooms {
			c := t.Rooms[r].Capacity
			if onW && c > size {
				sb.weak(timetable.CritWastedSeats, ww*int64(c-size), lw, solver.Pos(pm.room[k]))
			}
			if onO && size > c {
				sb.weak(timetable.CritOverCapacity, wo*int64(size-c), lo, solver.Pos(pm.room[k]))
			}
		}
	}
}

// keepPatterns writes "moved meetings" for kept pattern sections (see
// patternSoft).
func (sb *softBuilder) keepPatterns() {
	if sb.opt.Keep == nil {
		return
	}
	w, l, on := sb.weight(timetable.CritMoved, 1)
	if !on {
		return
	}
	t := sb.t
	idx := t.SectionIndex()
	done := make([]bool, len(t.Sections))
	for _, kp := range sb.opt.Keep.Placements {
		s, ok := idx[kp.Section]
		if !ok || !sb.c.pats[s].on {
			continue
		}
		sb.aboutSection(s)
		pm := &sb.c.pats[s]
		if done[s] {
			sb.weak(timetable.CritMoved, w, l) // a second kept placement of a one-placement section
			continue
		}
		done[s] = true
		ta := sb.c.TimeAtom(s, kp.Time-1)
		if ta == 0 {
			sb.weak(timetable.CritMoved, w, l)
			continue
		}
		if pm.roomAt == nil {
			sb.weak(timetable.CritMoved, w, l, solver.Neg(ta))
			continue
		}
		r, ok := sb.roomIdx[kp.Room]
		if !ok || pm.roomAt[r] < 0 {
			sb.weak(timetable.CritMoved, w, l)
			continue
		}
		stay := sb.newAtom("stays("+quote(t.Sections[s].ID)+")",
			AtomInfo{Kind: AtomAux, Section: s, Period: -1, Staff: -1, Group: -1})
		sb.rule(stay, solver.Pos(ta), solver.Pos(pm.room[pm.roomAt[r]]))
		sb.weak(timetable.CritMoved, w, l, solver.Neg(stay))
	}
}
