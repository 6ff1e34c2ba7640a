package encode

import (
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
	sb.keepPatterns()
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
