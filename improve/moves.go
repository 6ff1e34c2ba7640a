package improve

import "math/rand/v2"

// Move kinds, in the order of Stats.Tried.
const (
	mvRelocate    = iota // one meeting to another start (and maybe room), or a swap with the meeting in that room
	mvRoom               // one meeting to another room at the same time, or a room swap
	mvKempe              // a Kempe chain between two starts over shared people
	mvSectionRoom        // every meeting of a section into one room
	mvSwap               // two meetings exchange their starts and rooms
	mvAimed              // a move aimed at a meeting that carries cost (aimed.go)
	mvShift              // a cohort's run of meetings shifted beside its isolated period (shift.go)
	nMoves
)

// moveNames names the kinds for reports.
var moveNames = [nMoves]string{"relocate", "room", "kempe", "section room", "swap", "aimed", "shift"}

// maxChain bounds a Kempe chain; longer chains are refused.
const maxChain = 48

// propose fills x.chs with a random move of kind k; false when none was
// found (nothing to change).
func (x *State) propose(k int, rng *rand.Rand) bool {
	x.chs = x.chs[:0]
	switch k {
	case mvRelocate:
		return x.proposeRelocate(rng)
	case mvRoom:
		return x.proposeRoom(rng)
	case mvKempe:
		return x.proposeKempe(rng)
	case mvSectionRoom:
		return x.proposeSectionRoom(rng)
	case mvSwap:
		return x.proposeSwap(rng)
	case mvAimed:
		return x.proposeAimed(rng)
	case mvShift:
		return x.proposeShift(rng)
	}
	return false
}

// soleAt returns the only meeting occupying room r at period p when it
// starts there with the given length and may move; -1 otherwise.
func (x *State) soleAt(r, p int32, length int, time bool) int32 {
	occ := x.occ[x.roomRes(r)*int32(x.np)+p]
	if len(occ) != 1 {
		return -1
	}
	o := occ[0]
	if x.mt[o].p != p || x.secs[x.mt[o].sec].length != length || x.mt[o].fixedR || (time && x.mt[o].fixedT) {
		return -1
	}
	return o
}

func (x *State) proposeRelocate(rng *rand.Rand) bool {
	if len(x.movable) == 0 {
		return false
	}
	m := x.movable[rng.IntN(len(x.movable))]
	mt := x.mt[m]
	in := &x.secs[mt.sec]
	p := in.starts[rng.IntN(len(in.starts))]
	r := int32(roomAuto)
	if !in.noRoom && !mt.fixedR && rng.IntN(2) == 0 {
		r = in.rooms[rng.IntN(len(in.rooms))]
	}
	if p == mt.p && (r == roomAuto || r == mt.r) {
		return false
	}
	x.chs = append(x.chs, change{m, p, r})
	if len(in.sameAs) > 0 {
		return x.withPartners(mt.p, p)
	}
	if r >= 0 {
		if o := x.soleAt(r, p, in.length, true); o >= 0 && o != m {
			x.chs = append(x.chs, change{o, mt.p, mt.r})
		}
	}
	return true
}

// withPartners adds to a one-meeting move from start from to start to
// the meetings of the sections bound to it by hard same-time relations
// that start at from, moving them to to as well (rooms chosen by apply),
// so that such groups can move at all.
func (x *State) withPartners(from, to int32) bool {
	m := x.chs[0].m
	for _, ps := range x.secs[x.mt[m].sec].sameAs {
		for _, o := range x.bySec[ps] {
			if x.mt[o].p != from {
				continue
			}
			if x.mt[o].fixedT {
				return false
			}
			x.chs = append(x.chs, change{o, to, roomAuto})
			break
		}
	}
	return true
}

func (x *State) proposeRoom(rng *rand.Rand) bool {
	if len(x.roomy) == 0 {
		return false
	}
	m := x.roomy[rng.IntN(len(x.roomy))]
	mt := x.mt[m]
	in := &x.secs[mt.sec]
	r := in.rooms[rng.IntN(len(in.rooms))]
	if r == mt.r {
		return false
	}
	x.chs = append(x.chs, change{m, mt.p, r})
	if o := x.soleAt(r, mt.p, in.length, false); o >= 0 {
		x.chs = append(x.chs, change{o, mt.p, mt.r})
	}
	return true
}

func (x *State) proposeSectionRoom(rng *rand.Rand) bool {
	if len(x.roomy) == 0 {
		return false
	}
	m := x.roomy[rng.IntN(len(x.roomy))]
	si := x.mt[m].sec
	if len(x.bySec[si]) < 2 {
		return false
	}
	// Prefer a room the section already uses, as a registrar would.
	r := x.mt[x.bySec[si][rng.IntN(len(x.bySec[si]))]].r
	if rng.IntN(3) == 0 {
		in := &x.secs[si]
		r = in.rooms[rng.IntN(len(in.rooms))]
	}
	in := &x.secs[si]
	for _, o := range x.bySec[si] {
		mo := x.mt[o]
		if mo.r == r {
			continue
		}
		if mo.fixedR {
			return false
		}
		x.chs = append(x.chs, change{o, mo.p, r})
		// The meeting holding the room then takes this one's room.
		if other := x.soleAt(r, mo.p, in.length, false); other >= 0 && x.mt[other].sec != si {
			x.chs = append(x.chs, change{other, mo.p, mo.r})
		}
	}
	return len(x.chs) > 0
}

// proposeKempe builds the chain of meetings that must swap between starts
// p1 and p2 so that no person gets two meetings at once: start from one
// meeting at p1, and repeatedly add the meetings at the other start that
// share a person (with overlapping weeks) or the section with a chain
// member's target periods. Every member must start exactly at p1 or p2
// with the same length and have a free time.
func (x *State) proposeKempe(rng *rand.Rand) bool {
	if len(x.movable) == 0 {
		return false
	}
	m := x.movable[rng.IntN(len(x.movable))]
	in := &x.secs[x.mt[m].sec]
	return x.kempe(m, in.starts[rng.IntN(len(in.starts))])
}

// kempe fills x.chs with the Kempe chain that moves meeting m to start p2
// (see proposeKempe); false when there is none within maxChain.
func (x *State) kempe(m, p2 int32) bool {
	x.chs = x.chs[:0]
	in := &x.secs[x.mt[m].sec]
	p1 := x.mt[m].p
	if p1 == p2 {
		return false
	}
	length := in.length
	x.nextStamp()
	x.chainSeen[m] = x.stamp
	x.chs = append(x.chs, change{m, p2, roomAuto})
	np := int32(x.np)
	for i := 0; i < len(x.chs); i++ {
		y := x.chs[i].m
		target := x.chs[i].p
		yi := &x.secs[x.mt[y].sec]
		join := func(o int32) bool {
			if x.chainSeen[o] == x.stamp {
				return true
			}
			mo := x.mt[o]
			if mo.p != target || x.secs[mo.sec].length != length || mo.fixedT || len(x.chs) >= maxChain {
				return false
			}
			x.chainSeen[o] = x.stamp
			other := p1
			if target == p1 {
				other = p2
			}
			x.chs = append(x.chs, change{o, other, roomAuto})
			return true
		}
		for q := target; q < target+int32(length); q++ {
			for _, res := range yi.people {
				for _, o := range x.occ[res*np+q] {
					if x.secs[x.mt[o].sec].weeks.Overlaps(yi.weeks) && !join(o) {
						return false
					}
				}
			}
			if x.secOcc[x.mt[y].sec*np+q] > 0 {
				for _, o := range x.bySec[x.mt[y].sec] {
					mo := x.mt[o]
					if o != y && mo.p <= q && q < mo.p+int32(length) && !join(o) {
						return false
					}
				}
			}
		}
	}
	return true
}

// proposeSwap exchanges the places of two meetings of different sections
// with the same length and different starts: each takes the other's start
// and room (Lü and Hao 2010's simple swap). A room the other section may
// not use is left to apply's choice. Sections in hard same-time groups
// are not swapped (their partners would have to follow).
func (x *State) proposeSwap(rng *rand.Rand) bool {
	if len(x.movable) < 2 {
		return false
	}
	m := x.movable[rng.IntN(len(x.movable))]
	o := x.movable[rng.IntN(len(x.movable))]
	a, b := x.mt[m], x.mt[o]
	ia, ib := &x.secs[a.sec], &x.secs[b.sec]
	if a.sec == b.sec || a.p == b.p || ia.length != ib.length || len(ia.sameAs) > 0 || len(ib.sameAs) > 0 {
		return false
	}
	x.chs = append(x.chs, change{m, b.p, x.roomFor(m, b.r)}, change{o, a.p, x.roomFor(o, a.r)})
	return true
}

// roomFor is room r for meeting m when its section may take it, -1 for a
// section without rooms, else roomAuto.
func (x *State) roomFor(m, r int32) int32 {
	in := &x.secs[x.mt[m].sec]
	switch {
	case in.noRoom:
		return -1
	case x.mt[m].fixedR:
		return x.mt[m].r
	case r >= 0 && in.roomOK[r]:
		return r
	}
	return roomAuto
}
