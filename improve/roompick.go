package improve

import "math/rand/v2"

// maxRoomCandidates bounds the free rooms pickRoom compares, so that a
// section allowed hundreds of rooms costs a bounded scan on most moves.
const maxRoomCandidates = 16

// pickRoom chooses a room for unplaced meeting m at p: old when it fits,
// else the best of the first maxRoomCandidates allowed rooms that fit
// from a random offset (roomScore; ties to the first found); roomAuto
// when none does. A fixed room is never changed. checked reports that m
// may start at p in the room returned (canPlace holds); the start's own
// checks (section, people) are made once, not for every room tried.
//
// Choosing the best free room rather than the first lets a time move
// carry its room cost at its best: with the first free room, a good new
// time was often refused for the seats or the room change it happened to
// get (BENCHMARKS §1p).
func (x *State) pickRoom(m, p, old int32, rng *rand.Rand) (r int32, checked bool) {
	in := &x.secs[x.mt[m].sec]
	if in.noRoom {
		return -1, false
	}
	if old >= 0 && x.mt[m].fixedR {
		return old, false
	}
	ok := x.canStart(m, p)
	if old >= 0 && ok && x.roomFits(old, p, in) {
		return old, true
	}
	n := len(in.rooms)
	if n == 0 {
		return roomAuto, false
	}
	off := rng.IntN(n) // drawn even when nothing fits, so that the draws do not depend on it
	if !ok {
		return roomAuto, false
	}
	best, found := int32(roomAuto), 0
	for i := 0; i < n && found < maxRoomCandidates; i++ {
		r := in.rooms[(off+i)%n]
		if !x.roomFits(r, p, in) {
			continue
		}
		x.roomScore(m, p, r, x.scoreTry)
		if found == 0 || better(x.scoreTry, x.scoreBest) {
			best = r
			x.scoreBest, x.scoreTry = x.scoreTry, x.scoreBest
		}
		found++
	}
	return best, found > 0
}

// roomScore writes to out, per level (highest first), the weighted cost
// that room r brings meeting m starting at p on its own: over capacity
// and wasted seats, the room's avoid times, a new room for its section
// (stability: other meetings of the section are in rooms, none in r) and
// a kept placement matched (moved meetings). It is a guide for pickRoom
// (m's section takes rooms); the move's exact cost is counted afterwards
// as for every move.
func (x *State) roomScore(m, p, r int32, out []int64) {
	clear(out)
	add := func(c int, units int64) {
		if l := x.level[c]; l >= 0 && units != 0 {
			out[l] += x.weight[c] * units
		}
	}
	si := x.mt[m].sec
	in := &x.secs[si]
	over, waste := x.seatUnits(m, r)
	add(cOverCap, over)
	add(cWasted, waste)
	_, avoid := x.roomAvoid(r, p, in.length)
	add(cAvoid, avoid)
	used, others := false, false
	for _, o := range x.bySec[si] {
		if or := x.mt[o].r; o != m && or >= 0 {
			others = true
			if or == r {
				used = true
				break
			}
		}
	}
	if others && !used {
		add(cStability, 1)
	}
	for _, k := range in.kept {
		if k.p == p && k.r == r {
			add(cMoved, -1)
			break
		}
	}
}
