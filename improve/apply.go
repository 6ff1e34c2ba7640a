package improve

import (
	"math/rand/v2"

	"github.com/termwright/termwright/timetable"
)

// roomAuto asks apply to choose a room (pickRoom): the meeting's old room
// when it is free and allowed, otherwise the best free allowed room of up
// to maxRoomCandidates from a random offset in the section's room list.
const roomAuto = -3

// change asks for meeting m to start at p in room r (a room index, -1 for
// none, or roomAuto).
type change struct{ m, p, r int32 }

// apply makes the changes together if the result keeps every hard
// requirement and accept agrees, given the cost difference (new minus old).
// Otherwise the state is left exactly as it was. It reports whether the
// changes were kept. Cost is linear in the touched meetings, their people's
// days, their sections and those sections' relations.
func (x *State) apply(chs []change, rng *rand.Rand, accept func(delta *tally) bool) bool {
	x.nextStamp()
	if x.blocked(chs) {
		return false
	}
	return x.commit(chs, rng, accept)
}

// commit is apply after the blocked check, on a fresh stamp.
func (x *State) commit(chs []change, rng *rand.Rand, accept func(delta *tally) bool) bool {
	if x.roomOnly(chs) {
		if kept, handled := x.peekRooms(chs, accept); handled {
			return kept
		}
		return x.commitRooms(chs, accept)
	}
	return x.commitAll(chs, rng, accept)
}

// commitAll is commit for any move: it lifts the meetings with their
// people and rooms and puts them back at their new places.
func (x *State) commitAll(chs []change, rng *rand.Rand, accept func(delta *tally) bool) bool {
	var before, base tally
	x.begin(chs, &before, &base)
	for _, u := range x.log {
		x.remove(u.m)
	}
	placed := 0
	for i, ch := range chs {
		r, checked := ch.r, false
		if r == roomAuto {
			r, checked = x.pickRoom(ch.m, ch.p, x.log[i].r, rng)
		}
		if r == roomAuto || (!checked && !x.canPlace(ch.m, ch.p, r)) {
			break
		}
		x.insert(ch.m, ch.p, r)
		placed++
	}
	if placed < len(chs) || !x.hardOK() || !x.decide(&before, &base, accept) {
		x.undo(placed, base)
		return false
	}
	return true
}

// begin starts move chs: it marks what the move touches, writes the
// touched criteria to before and the running cost to base, and logs each
// moving meeting's place for undo.
func (x *State) begin(chs []change, before, base *tally) {
	x.markTouched(chs)
	x.touched(before)
	*base = x.cur
	x.log = x.log[:0]
	for _, ch := range chs {
		mt := &x.mt[ch.m]
		x.log = append(x.log, undoRec{ch.m, mt.p, mt.r})
	}
}

// decide adds to the running cost the touched criteria after the move
// less before (the running cost was base when the move began), puts the
// difference in x.delta and reports whether accept (nil: always) keeps
// the move.
func (x *State) decide(before, base *tally, accept func(delta *tally) bool) bool {
	var after tally
	x.touched(&after)
	x.cur.plus(&after)
	x.cur.minus(before)
	x.delta = x.cur
	x.delta.minus(base)
	return accept == nil || accept(&x.delta)
}

// markTouched lists the sections, person-days and relations whose
// criteria move chs can change, on the current stamp.
func (x *State) markTouched(chs []change) {
	x.touchSec, x.touchPD, x.touchRel = x.touchSec[:0], x.touchPD[:0], x.touchRel[:0]
	np := int32(x.np)
	for _, ch := range chs {
		mt := &x.mt[ch.m]
		si := mt.sec
		if x.markSec[si] != x.stamp {
			x.markSec[si] = x.stamp
			x.touchSec = append(x.touchSec, si)
			for _, ri := range x.secs[si].rels {
				if x.markRel[ri] != x.stamp {
					x.markRel[ri] = x.stamp
					x.touchRel = append(x.touchRel, ri)
				}
			}
		}
		if ch.p == mt.p && !x.anyBld {
			// Same start: its people's busy periods do not change, and
			// without buildings their days' criteria depend on nothing else.
			continue
		}
		for _, res := range x.secs[si].people {
			for _, d := range [2]int32{x.dayFirst[mt.p], x.dayFirst[ch.p]} {
				if k := res*np + d; x.markPD[k] != x.stamp {
					x.markPD[k] = x.stamp
					x.touchPD = append(x.touchPD, k)
				}
			}
		}
	}
}

// blocked reports, before anything is lifted or costed, whether some
// change must fail whatever the rest of the move does: a start or room its
// section may not take, or a person, the room or the section itself held
// then by a meeting that is not part of the move (weeks overlapping). It
// marks the moving meetings with the current stamp. A move it passes may
// still fail in apply (two changes into one room, a rule over several
// meetings). O(changes · length · occupants).
func (x *State) blocked(chs []change) bool {
	for _, ch := range chs {
		x.markMt[ch.m] = x.stamp
	}
	np := int32(x.np)
	for _, ch := range chs {
		si := x.mt[ch.m].sec
		in := &x.secs[si]
		p, r := ch.p, ch.r
		if p < 0 || int(p) >= x.np || !in.startOK[p] {
			return true
		}
		if r != roomAuto && (in.noRoom != (r < 0) || (r >= 0 && !in.roomOK[r])) {
			return true
		}
		for q := p; q < p+int32(in.length); q++ {
			if x.secOcc[si*np+q] > 0 && x.ownStays(si, q) {
				return true
			}
			for _, res := range in.people {
				if x.staysAt(res*np+q, in.weeks) {
					return true
				}
			}
			if r >= 0 && (x.roomBlock[r*np+q] || x.staysAt(x.roomRes(r)*np+q, in.weeks)) {
				return true
			}
		}
	}
	return false
}

// staysAt reports whether occupancy list k holds a meeting outside the
// move whose weeks overlap weeks.
func (x *State) staysAt(k int32, weeks timetable.WeekSet) bool {
	for _, o := range x.occ[k] {
		if x.markMt[o] != x.stamp && x.secs[x.mt[o].sec].weeks.Overlaps(weeks) {
			return true
		}
	}
	return false
}

// ownStays reports whether a meeting of section si outside the move
// occupies period q.
func (x *State) ownStays(si, q int32) bool {
	length := int32(x.secs[si].length)
	for _, o := range x.bySec[si] {
		if p := x.mt[o].p; x.markMt[o] != x.stamp && p <= q && q < p+length {
			return true
		}
	}
	return false
}

// undo takes out the first placed meetings of the log, puts every logged
// meeting back and restores the running cost to base.
func (x *State) undo(placed int, base tally) {
	for _, u := range x.log[:placed] {
		x.remove(u.m)
	}
	for _, u := range x.log {
		x.insert(u.m, u.p, u.r)
	}
	x.cur = base
}

// touched adds the section, person-day and relation criteria of what the
// current move touches.
func (x *State) touched(out *tally) {
	for _, si := range x.touchSec {
		x.secContrib(si, out)
	}
	x.pdsContrib(out)
	for _, ri := range x.touchRel {
		x.relContrib(ri, out)
	}
}

// pdsContrib adds the criteria of the person-days the current move
// touches.
func (x *State) pdsContrib(out *tally) {
	np := int32(x.np)
	for _, k := range x.touchPD {
		x.pdContrib(k/np, k%np, out)
	}
}

// hardOK checks the rules over several meetings on what the move touched:
// different days, staff limits and hard relations.
func (x *State) hardOK() bool {
	np := int32(x.np)
	for _, si := range x.touchSec {
		if !x.sameDayOK(si) {
			return false
		}
	}
	for _, k := range x.touchPD {
		if res := k / np; int(res) < x.nStaff && x.isStaffLim[res] && !x.staffDayOK(res, k%np) {
			return false
		}
	}
	for _, ri := range x.touchRel {
		if x.rels[ri].Hard && x.relBroken(ri) {
			return false
		}
	}
	return true
}

// nextStamp starts a new generation of the mark slices (clearing them all
// when the counter wraps).
func (x *State) nextStamp() {
	x.stamp++
	if x.stamp == 0 {
		clear(x.markSec)
		clear(x.markPD)
		clear(x.markRel)
		clear(x.chainSeen)
		clear(x.markMt)
		x.stamp = 1
	}
}

// restore moves every meeting to its place in s (an earlier timetable of
// this state, placements in the same order), keeping the state legal
// throughout: all meetings are lifted, then put back.
func (x *State) restore(s *timetable.Schedule) {
	roomIdx := x.t.RoomIndex()
	for m := range x.mt {
		x.remove(int32(m))
	}
	x.cur = tally{}
	for m, pl := range s.Placements {
		r := int32(-1)
		if pl.Room != "" {
			r = int32(roomIdx[pl.Room])
		}
		x.insert(int32(m), int32(pl.Period), r)
	}
	x.recount()
}
