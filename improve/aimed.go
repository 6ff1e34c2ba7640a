package improve

import (
	"math/bits"
	"math/rand/v2"
)

// Aims of the aimed move: the criterion whose cost it tries to remove.
const (
	aimIsolated  = iota // a cohort's isolated period: next to another of its meetings
	aimSpread           // a section on too few days: a meeting sharing a day to a free day
	aimStability        // a section in several rooms: a meeting into another of its rooms
	nAims
)

// aimTries bounds the meetings (and starts) drawn to find one that carries
// the cost aimed at; the move is given up after that many.
const aimTries = 8

// proposeAimed fills x.chs with a move aimed at where the cost is: it
// picks one of the criteria above that costs something now, draws
// meetings until one carries that cost, and moves it to a place where
// that cost goes: next to another meeting of the isolated cohort, to a
// day its section does not meet on, or into a room its section already
// uses (at its time, swapping with the meeting there, or at a time that
// room is free). Time changes are single relocations or Kempe chains
// towards that start, half each. The rest of the cost is left to apply
// and the annealing rule, as for every move.
func (x *State) proposeAimed(rng *rand.Rand) bool {
	var aims [nAims]int
	n := 0
	if x.useMasks && len(x.movable) > 0 && x.weight[cCohortIsolated] > 0 && x.cur.w[cCohortIsolated] > 0 {
		aims[n] = aimIsolated
		n++
	}
	if x.nDays <= 64 && len(x.movable) > 0 && x.weight[cSpread] > 0 && x.cur.w[cSpread] > 0 {
		aims[n] = aimSpread
		n++
	}
	if len(x.roomy) > 0 && x.weight[cStability] > 0 && x.cur.w[cStability] > 0 {
		aims[n] = aimStability
		n++
	}
	if n == 0 {
		return false
	}
	switch aims[rng.IntN(n)] {
	case aimIsolated:
		return x.aimIsolated(rng)
	case aimSpread:
		return x.aimSpread(rng)
	}
	return x.aimStability(rng)
}

// dayMask is person res's busy mask on day number d, without meeting m's
// periods when m is on that day (the cohort's view of the day without m).
func (x *State) dayMask(res, d, m int32) uint64 {
	b := x.busyMask[res*int32(x.nDays)+d]
	mt := &x.mt[m]
	if x.dayNo[mt.p] == d {
		l := x.secs[mt.sec].length
		b &^= (uint64(1)<<l - 1) << (mt.p - x.dayFirst[mt.p])
	}
	return b
}

// aimIsolated finds a meeting at an isolated period of one of its cohorts
// (findIsolated; given up when it may not move) and moves it to a free period of that cohort next to one of the
// cohort's other busy periods (on any day but those keepDays excludes).
func (x *State) aimIsolated(rng *rand.Rand) bool {
	m, res, _, _ := x.findIsolated(rng)
	if m < 0 || !x.movableAt(m) {
		return false
	}
	return x.nextTo(m, res, x.keepDays(m), rng)
}

// nextTo moves meeting m to a free period of person res adjacent to one
// of res's busy periods without m, on a day not in skip (a day bit mask):
// drawn uniformly among all such periods of the week (two passes over the
// days, no allocation).
func (x *State) nextTo(m, res int32, skip uint64, rng *rand.Rand) bool {
	in := &x.secs[x.mt[m].sec]
	total := 0
	for d := range int32(x.nDays) {
		if skip>>d&1 == 1 {
			continue
		}
		b, c := x.dayMask(res, d, m), x.dayCons[d]
		total += bits.OnesCount64(((b<<1)&c | (b&c)>>1) &^ b)
	}
	if total == 0 {
		return false
	}
	k := rng.IntN(total)
	for d := range int32(x.nDays) {
		if skip>>d&1 == 1 {
			continue
		}
		b, c := x.dayMask(res, d, m), x.dayCons[d]
		after := (b << 1) & c &^ b
		adj := after | (b&c)>>1&^b
		if n := bits.OnesCount64(adj); k >= n {
			k -= n
			continue
		}
		for ; k > 0; k-- {
			adj &= adj - 1
		}
		i := bits.TrailingZeros64(adj)
		p := x.dayStart[d] + int32(i)
		if after>>i&1 == 0 {
			p -= int32(in.length) - 1 // the meeting ends just before a busy period
		}
		return x.moveTo(m, p, rng)
	}
	return false
}

// keepDays is the mask of days meeting m should not move to because its
// section would then meet on fewer days than its minimum: the days of the
// section's other meetings, when leaving m's day would cost spread days;
// 0 otherwise (masks in use, at most 64 days).
func (x *State) keepDays(m int32) uint64 {
	mt := &x.mt[m]
	sec := &x.t.Sections[mt.sec]
	if !sec.SameDay || sec.MinDays <= 0 || x.weight[cSpread] <= 0 {
		return 0
	}
	var others uint64
	for _, o := range x.bySec[mt.sec] {
		if o != m {
			others |= 1 << x.dayNo[x.mt[o].p]
		}
	}
	own := uint64(1) << x.dayNo[mt.p]
	if others&own != 0 || bits.OnesCount64(others|own) > sec.MinDays {
		return 0 // m's day is shared, or a day to spare: moving costs nothing
	}
	return others
}

// moveTo fills x.chs with meeting m moved to start p: a Kempe chain or a
// relocation (with its hard same-time partners, room chosen by apply),
// half each; false when p is not a start of m's section.
func (x *State) moveTo(m, p int32, rng *rand.Rand) bool {
	mt := &x.mt[m]
	in := &x.secs[mt.sec]
	if p < 0 || int(p) >= x.np || !in.startOK[p] || p == mt.p {
		return false
	}
	if len(in.sameAs) == 0 && rng.IntN(2) == 0 {
		return x.kempe(m, p)
	}
	x.chs = append(x.chs[:0], change{m, p, roomAuto})
	if len(in.sameAs) > 0 {
		return x.withPartners(mt.p, p)
	}
	return true
}

// aimSpread finds a movable meeting of a section that meets on fewer days
// than it should and shares its day with another meeting of the section
// (findShort), and moves it to a start on a day the section does not meet
// on (half the time one beside a busy period of one of its cohorts).
func (x *State) aimSpread(rng *rand.Rand) bool {
	m, days := x.findShort(rng)
	if m < 0 {
		return false
	}
	in := &x.secs[x.mt[m].sec]
	// Half the time, beside a busy period of one of its cohorts on such a
	// day, so that the new day does not isolate the meeting.
	if cohorts := in.people[len(in.staff):]; x.useMasks && len(cohorts) > 0 && rng.IntN(2) == 0 {
		return x.nextTo(m, cohorts[rng.IntN(len(cohorts))], days, rng)
	}
	for range aimTries {
		if p := in.starts[rng.IntN(len(in.starts))]; days>>x.dayNo[p]&1 == 0 {
			return x.moveTo(m, p, rng)
		}
	}
	return false
}

// shortScan bounds the sections findShort reads in one call.
const shortScan = 64

// findShort scans up to shortScan sections cyclically from a random one
// for a section on fewer days than its minimum with a movable meeting
// sharing its day with another of the section's meetings, and returns
// such a meeting (drawn uniformly among the section's) and the section's
// day mask; m is -1 when none was found.
func (x *State) findShort(rng *rand.Rand) (m int32, days uint64) {
	n := len(x.secs)
	k0 := rng.IntN(n)
	for i := range min(n, shortScan) {
		si := k0 + i
		if si >= n {
			si -= n
		}
		sec := &x.t.Sections[si]
		ms := x.bySec[si]
		if !sec.SameDay || sec.MinDays <= 0 || len(ms) < 2 {
			continue
		}
		var twice uint64 // days holding two or more of the section's meetings
		days = 0
		for _, o := range ms {
			d := uint64(1) << x.dayNo[x.mt[o].p]
			twice |= days & d
			days |= d
		}
		if bits.OnesCount64(days) >= sec.MinDays {
			continue
		}
		cand := 0
		for _, o := range ms {
			if x.movableAt(o) && twice>>x.dayNo[x.mt[o].p]&1 == 1 {
				cand++
			}
		}
		if cand == 0 {
			continue
		}
		k := rng.IntN(cand)
		for _, o := range ms {
			if x.movableAt(o) && twice>>x.dayNo[x.mt[o].p]&1 == 1 {
				if k == 0 {
					return o, days
				}
				k--
			}
		}
	}
	return -1, 0
}

// movableAt reports whether meeting m's time may change (not fixed, more
// than one start), as for the meetings in x.movable.
func (x *State) movableAt(m int32) bool {
	return !x.mt[m].fixedT && len(x.secs[x.mt[m].sec].starts) > 1
}

// aimStability finds a meeting whose section uses another room besides
// its own and moves it into that room: at its own time (swapping with the
// one meeting there, as the room move does) or, half the time when its
// time may change, at a start where that room is free.
func (x *State) aimStability(rng *rand.Rand) bool {
	for range aimTries {
		m := x.roomy[rng.IntN(len(x.roomy))]
		mt := &x.mt[m]
		ms := x.bySec[mt.sec]
		in := &x.secs[mt.sec]
		r := x.mt[ms[rng.IntN(len(ms))]].r
		if r < 0 || r == mt.r || !in.roomOK[r] {
			continue
		}
		if mt.fixedT || len(in.starts) < 2 || rng.IntN(2) == 0 {
			x.chs = append(x.chs[:0], change{m, mt.p, r})
			if o := x.soleAt(r, mt.p, in.length, false); o >= 0 {
				x.chs = append(x.chs, change{o, mt.p, mt.r})
			}
			return true
		}
		for range aimTries {
			p := in.starts[rng.IntN(len(in.starts))]
			if p == mt.p || !x.roomFree(r, p, in) {
				continue
			}
			x.chs = append(x.chs[:0], change{m, p, r})
			if len(in.sameAs) > 0 {
				return x.withPartners(mt.p, p)
			}
			return true
		}
		return false
	}
	return false
}

// roomFree reports whether room r is open and held by no meeting whose
// weeks overlap in's over a meeting of in starting at p.
func (x *State) roomFree(r, p int32, in *secInfo) bool {
	for q := p; q < p+int32(in.length); q++ {
		if x.roomHeld(r, q, in) {
			return false
		}
	}
	return true
}
