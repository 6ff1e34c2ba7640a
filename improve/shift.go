package improve

import (
	"math/bits"
	"math/rand/v2"
)

// proposeShift fills x.chs with a move aimed at a cohort's isolated
// period that moves other meetings to it, where the aimed move (aimed.go)
// moves the isolated meeting away: it draws meetings (at most aimTries,
// movable or not) until one sits at an isolated period of one of its
// cohorts, then, half each, either takes the run of that cohort's
// consecutive busy periods nearest to it on the same day (before or after,
// half each when both exist) and shifts every meeting of the run by the
// same number of periods so that the run ends just beside the isolated
// period, or pulls one other meeting of the cohort (from any day) to a
// free period just beside it (pullTo). The meetings of a run keep their
// rooms where free (apply's choice otherwise); the run moves as a block
// in the spirit of the Kempe-chain neighbourhoods of Thompson and Dowsland
// (1998): several meetings change together so that the cohort's day stays
// compact. Legality and cost are apply's, as for every move.
func (x *State) proposeShift(rng *rand.Rand) bool {
	if !x.useMasks || len(x.movable) == 0 || x.weight[cCohortIsolated] <= 0 || x.cur.w[cCohortIsolated] <= 0 {
		return false
	}
	// The isolated meeting itself is drawn among all meetings: when it
	// may not move (fixed, a single start), the run can still come to it.
	for range aimTries {
		m := int32(rng.IntN(len(x.mt)))
		mt := &x.mt[m]
		in := &x.secs[mt.sec]
		d := x.dayNo[mt.p]
		c := x.dayCons[d]
		bit := uint(mt.p - x.dayFirst[mt.p])
		cohorts := in.people[len(in.staff):]
		if len(cohorts) == 0 {
			continue
		}
		// Start from a random cohort so that every cohort of a shared
		// section gets its turn.
		off := rng.IntN(len(cohorts))
		for i := range cohorts {
			res := cohorts[(off+i)%len(cohorts)]
			b := x.busyMask[res*int32(x.nDays)+d]
			linked := (b<<1)&c | (b&c)>>1
			if (b&^linked)>>bit&1 == 1 {
				if rng.IntN(2) == 0 {
					return x.pullTo(m, res, d, bit, b, rng)
				}
				return x.shiftRun(m, res, d, bit, b, rng)
			}
		}
	}
	return false
}

// shiftRun moves the run of person res's busy periods nearest to bit
// (an isolated busy period of res on day d, held by meeting m; b is res's
// busy mask that day) so that it ends beside bit. Every period between the
// run and bit must follow the one before consecutively, or adjacency
// would not count.
func (x *State) shiftRun(m, res, d int32, bit uint, b uint64, rng *rand.Rand) bool {
	c := x.dayCons[d]
	in := &x.secs[x.mt[m].sec]
	lenM := uint(in.length)
	below := b & (uint64(1)<<bit - 1)         // busy periods before m
	above := b &^ (uint64(1)<<(bit+lenM) - 1) // busy periods after m
	if below == 0 && above == 0 {
		return false
	}
	useBelow := above == 0 || (below != 0 && rng.IntN(2) == 0)
	var lo, hi uint // the run, inclusive bit numbers
	var shift int32
	if useBelow {
		hi = 63 - uint(bits.LeadingZeros64(below))
		lo = hi
		for lo > 0 && b>>(lo-1)&1 == 1 && c>>lo&1 == 1 {
			lo--
		}
		shift = int32(bit) - 1 - int32(hi) // the run's last period to bit-1
		// Periods hi+1 .. bit must each follow the one before.
		if !consecutive(c, hi+1, bit) {
			return false
		}
	} else {
		lo = uint(bits.TrailingZeros64(above))
		hi = lo
		for hi < 63 && b>>(hi+1)&1 == 1 && c>>(hi+1)&1 == 1 {
			hi++
		}
		end := bit + lenM - 1 // m's last period
		shift = int32(end) + 1 - int32(lo)
		if !consecutive(c, end+1, lo) {
			return false
		}
	}
	if shift == 0 {
		return false
	}
	np := int32(x.np)
	start := x.dayStart[d]
	x.chs = x.chs[:0]
	x.nextStamp()
	for q := lo; q <= hi; q++ {
		for _, o := range x.occ[res*np+start+int32(q)] {
			if x.chainSeen[o] == x.stamp {
				continue
			}
			x.chainSeen[o] = x.stamp
			mo := &x.mt[o]
			io := &x.secs[mo.sec]
			if mo.fixedT || len(io.sameAs) > 0 || len(x.chs) >= maxChain {
				return false
			}
			// A meeting reaching outside the run would leave part of
			// itself behind the shift; such runs are not moved.
			if first := uint(mo.p - start); first < lo || first+uint(io.length)-1 > hi {
				return false
			}
			r := int32(roomAuto)
			if mo.fixedR {
				r = mo.r
			}
			x.chs = append(x.chs, change{o, mo.p + shift, r})
		}
	}
	return len(x.chs) > 0
}

// consecutive reports whether every period from bit from to bit to
// (inclusive; none when from > to) follows the one before it on the day
// whose consecutive flags are c.
func consecutive(c uint64, from, to uint) bool {
	for i := from; i <= to; i++ {
		if c>>i&1 == 0 {
			return false
		}
	}
	return true
}

// pullTo moves one other meeting of person res (drawn uniformly among its
// meetings that may move, from any day) to a free period just before or
// just after meeting m, which sits at isolated bit of res's busy mask b on
// day d: by a relocation or a Kempe chain, as moveTo does. The period
// beside m must follow (or precede) m's consecutively.
func (x *State) pullTo(m, res, d int32, bit uint, b uint64, rng *rand.Rand) bool {
	c := x.dayCons[d]
	lenM := uint(x.secs[x.mt[m].sec].length)
	start := x.dayStart[d]
	canBefore := bit > 0 && c>>bit&1 == 1 && b>>(bit-1)&1 == 0
	after := bit + lenM // the bit just after m
	canAfter := after < 64 && c>>after&1 == 1 && b>>after&1 == 0
	if !canBefore && !canAfter {
		return false
	}
	before := canBefore && (!canAfter || rng.IntN(2) == 0)
	np := int32(x.np)
	o, seen := int32(-1), 0
	for q := range np {
		for _, y := range x.occ[res*np+q] {
			my := &x.mt[y]
			if my.p != q || y == m || my.fixedT || len(x.secs[my.sec].starts) < 2 {
				continue
			}
			if seen++; rng.IntN(seen) == 0 {
				o = y
			}
		}
	}
	if o < 0 {
		return false
	}
	p := start + int32(after)
	if before {
		p = start + int32(bit) - int32(x.secs[x.mt[o].sec].length)
	}
	if p < start || x.dayNo[min(p, np-1)] != d {
		return false
	}
	return x.moveTo(o, p, rng)
}
