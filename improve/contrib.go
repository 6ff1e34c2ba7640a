package improve

import (
	"math/bits"

	"github.com/termwright/termwright/timetable"
)

// secContrib adds the criteria of section si: moved meetings, spread days
// and room stability. O(meetings²) (moved meetings and rooms).
func (x *State) secContrib(si int32, out *tally) {
	x.secRoomContrib(si, out)
	if sec := &x.t.Sections[si]; sec.SameDay && sec.MinDays > 0 {
		if short := int64(sec.MinDays) - x.secDays(x.bySec[si]); short > 0 {
			out.add(cSpread, short, short)
		}
	}
}

// secRoomContrib adds the criteria of section si that a change of rooms
// alone can change: moved meetings (a kept meeting matches on start and
// room) and room stability.
func (x *State) secRoomContrib(si int32, out *tally) {
	in := &x.secs[si]
	ms := x.bySec[si]
	if len(in.kept) > 0 {
		var used uint64 // meetings already matching a kept one (sections have < 64 meetings)
		var n int64
		for _, k := range in.kept {
			found := false
			for j, m := range ms {
				if j < 64 && used&(1<<j) == 0 && x.mt[m].p == k.p && x.mt[m].r == k.r {
					used |= 1 << j
					found = true
					break
				}
			}
			if !found {
				n++
			}
		}
		out.add(cMoved, n, n)
	}
	if !in.noRoom {
		rooms := int64(0)
		for j, m := range ms {
			r := x.mt[m].r
			if r < 0 {
				continue
			}
			dup := false
			for _, o := range ms[:j] {
				if x.mt[o].r == r {
					dup = true
					break
				}
			}
			if !dup {
				rooms++
			}
		}
		if rooms > 1 {
			out.add(cStability, rooms-1, rooms-1)
		}
	}
}

// secDays counts the distinct days of meetings ms: with masks by a day
// bit set, O(meetings); otherwise O(meetings²).
func (x *State) secDays(ms []int32) int64 {
	if x.useMasks {
		var seen uint64
		for _, m := range ms {
			seen |= 1 << x.dayNo[x.mt[m].p]
		}
		return int64(bits.OnesCount64(seen))
	}
	days := int64(0)
	for j, m := range ms {
		d := x.dayFirst[x.mt[m].p]
		dup := false
		for _, o := range ms[:j] {
			if x.dayFirst[x.mt[o].p] == d {
				dup = true
				break
			}
		}
		if !dup {
			days++
		}
	}
	return days
}

// busy reports whether resource res is busy at period q.
func (x *State) busy(res int32, q int32) bool { return len(x.occ[res*int32(x.np)+q]) > 0 }

// pdContrib adds the criteria of person res (staff or cohort) on the day
// starting at period d: gaps, staff days or isolated periods, and travel.
// O(1) from the day's busy mask (O(periods of the day) without masks),
// plus O(periods of the day · meetings there) for travel when some room
// names a building.
func (x *State) pdContrib(res, d int32, out *tally) {
	var first, lastBusy int32
	var count, iso int64
	if x.useMasks {
		b := x.busyMask[res*int32(x.nDays)+x.dayNo[d]]
		if b == 0 {
			return
		}
		c := x.dayCons[x.dayNo[d]]
		first = d + int32(bits.TrailingZeros64(b))
		lastBusy = d + 63 - int32(bits.LeadingZeros64(b))
		count = int64(bits.OnesCount64(b))
		// A busy period is linked when the one before (after) is busy and
		// consecutive with it.
		linked := (b<<1)&c | (b&c)>>1
		iso = int64(bits.OnesCount64(b &^ linked))
	} else if first, lastBusy, count, iso = x.pdScan(res, d); first < 0 {
		return
	}
	gaps := int64(lastBusy-first+1) - count
	np := int32(x.np)
	var travel int64
	for q := first; x.anyBld && q < lastBusy; q++ {
		if !x.prevCons[q+1] {
			continue
		}
		for _, a := range x.occ[res*np+q] {
			ma := &x.mt[a]
			if ma.r < 0 || x.roomBld[ma.r] < 0 || ma.p+int32(x.secs[ma.sec].length)-1 != q {
				continue
			}
			for _, b := range x.occ[res*np+q+1] {
				mb := &x.mt[b]
				if b != a && mb.p == q+1 && mb.r >= 0 && x.roomBld[mb.r] >= 0 && x.roomBld[mb.r] != x.roomBld[ma.r] {
					travel++
				}
			}
		}
	}
	out.add(cTravel, travel, travel)
	if int(res) < x.nStaff {
		out.add(cStaffGaps, gaps, gaps)
		out.add(cStaffDays, 1, 1)
	} else {
		out.add(cCohortGaps, gaps, gaps)
		out.add(cCohortIsolated, iso, iso)
	}
}

// pdScan finds by scanning the first and last busy period of person res on
// the day starting at d (-1 when free), the busy periods and the isolated
// ones.
func (x *State) pdScan(res, d int32) (first, lastBusy int32, count, iso int64) {
	last := x.dayLast[d]
	first, lastBusy = -1, -1
	for q := d; q <= last; q++ {
		if !x.busy(res, q) {
			continue
		}
		if first < 0 {
			first = q
		}
		lastBusy = q
		count++
		before := q > d && x.prevCons[q] && x.busy(res, q-1)
		after := q < last && x.prevCons[q+1] && x.busy(res, q+1)
		if !before && !after {
			iso++
		}
	}
	return first, lastBusy, count, iso
}

// relContrib adds relation ri's cost when it is soft and broken.
func (x *State) relContrib(ri int32, out *tally) {
	r := &x.rels[ri]
	if !r.Hard && x.relBroken(ri) {
		out.add(cSoftRel, 1, int64(r.Weight))
	}
}

// sameDayOK reports whether a section without SameDay meets on different days.
func (x *State) sameDayOK(si int32) bool {
	if x.t.Sections[si].SameDay {
		return true
	}
	ms := x.bySec[si]
	for j, m := range ms {
		for _, o := range ms[:j] {
			if x.dayFirst[x.mt[o].p] == x.dayFirst[x.mt[m].p] {
				return false
			}
		}
	}
	return true
}

// staffDayOK reports whether staff k keeps MaxPerDay and MaxConsecutive on
// the day starting at period d.
func (x *State) staffDayOK(k, d int32) bool {
	st := &x.t.Staff[k]
	n, run := 0, 0
	for q := d; q <= x.dayLast[d]; q++ {
		if !x.busy(k, q) {
			run = 0
			continue
		}
		n++
		if q > d && x.prevCons[q] && x.busy(k, q-1) {
			run++
		} else {
			run = 1
		}
		if st.MaxConsecutive > 0 && run > st.MaxConsecutive {
			return false
		}
	}
	return st.MaxPerDay <= 0 || n <= st.MaxPerDay
}

// recount recomputes the running cost from scratch (used once by New; the
// per-meeting part was added by insert).
func (x *State) recount() {
	var add tally
	for si := range x.secs {
		x.secContrib(int32(si), &add)
	}
	np := int32(x.np)
	for res := int32(0); res < int32(x.nStaff+x.nCohort); res++ {
		for d := int32(0); d < np; d = x.dayLast[d] + 1 {
			x.pdContrib(res, d, &add)
		}
	}
	for ri := range x.rels {
		x.relContrib(int32(ri), &add)
	}
	x.cur.plus(&add)
}

// Cost is the running cost in the terms of timetable.Cost: Criteria (every
// criterion in timetable.Criteria order) and ByLevel; the Per* maps are left
// nil (timetable.Cost of Schedule gives them).
func (x *State) Cost() timetable.CostReport {
	rep := timetable.CostReport{ByLevel: map[int]int64{}}
	for c, name := range critNames {
		w, l := x.t.CriterionWeight(name)
		cc := timetable.CriterionCost{Name: name, Level: l, Weight: w, Count: x.cur.u[c], Cost: int64(w) * x.cur.w[c]}
		rep.Criteria = append(rep.Criteria, cc)
		if w != 0 {
			rep.ByLevel[l] += cc.Cost
		}
	}
	return rep
}

// Schedule returns a copy of the current timetable: the starting
// schedule's placements in the same order with their current start and room.
func (x *State) Schedule() *timetable.Schedule {
	out := &timetable.Schedule{Placements: make([]timetable.Placement, len(x.mt))}
	copy(out.Placements, x.src.Placements)
	for i := range x.mt {
		out.Placements[i].Period = int(x.mt[i].p)
		out.Placements[i].Room = ""
		if r := x.mt[i].r; r >= 0 {
			out.Placements[i].Room = x.t.Rooms[r].ID
		}
	}
	return out
}

// levelCosts writes the weighted cost per level in use (highest first).
func (x *State) levelCosts(t *tally, out []int64) {
	for i := range out {
		out[i] = 0
	}
	for c := range nCrit {
		if l := x.level[c]; l >= 0 {
			out[l] += x.weight[c] * t.w[c]
		}
	}
}
