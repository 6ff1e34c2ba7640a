package improve

import (
	"math/bits"
	"math/rand/v2"
)

// proposeShift fills x.chs with a move aimed at a cohort's isolated
// period that moves other meetings to it, where the aimed move (aimed.go)
// moves the isolated meeting away: it finds a meeting, movable or not, at
// an isolated period of one of its cohorts (findIsolated), then, half
// each, either takes the run of that cohort's
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
	// The isolated meeting may itself be unable to move (fixed, a single
	// start): the run or the pulled meeting can still come to it.
	m, res, d, bit := x.findIsolated(rng)
	if m < 0 {
		return false
	}
	b := x.busyMask[res*int32(x.nDays)+d]
	if rng.IntN(2) == 0 {
		return x.pullTo(m, res, d, bit, b, rng)
	}
	return x.shiftRun(m, res, d, bit, b, rng)
}

// isoScan bounds the cohort-days findIsolated reads in one call.
const isoScan = 512

// findIsolated returns a meeting m at an isolated busy period of cohort
// resource res on day d (bit bit of its busy mask), found by scanning up
// to isoScan cohort-days cyclically from a random one and drawing uniformly among the
// isolated periods of the first that has any; m is -1 when there is none
// (or no meeting starts there). With k isolated cohort-days among n the
// scan reads about n/k busy masks, far fewer draws than sampling meetings
// when few are isolated.
func (x *State) findIsolated(rng *rand.Rand) (m, res, d int32, bit uint) {
	nd := int32(x.nDays)
	n := int32(x.nCohort) * nd
	if n == 0 {
		return -1, 0, 0, 0
	}
	k0 := int32(rng.IntN(int(n)))
	for i := range min(n, isoScan) {
		k := k0 + i
		if k >= n {
			k -= n
		}
		res, d = int32(x.nStaff)+k/nd, k%nd
		b, c := x.busyMask[res*nd+d], x.dayCons[d]
		iso := b &^ ((b<<1)&c | (b&c)>>1)
		if iso == 0 {
			continue
		}
		for j := rng.IntN(bits.OnesCount64(iso)); j > 0; j-- {
			iso &= iso - 1
		}
		bit = uint(bits.TrailingZeros64(iso))
		q := x.dayStart[d] + int32(bit)
		for _, o := range x.occ[res*int32(x.np)+q] {
			if x.mt[o].p == q {
				return o, res, d, bit
			}
		}
		return -1, 0, 0, 0
	}
	return -1, 0, 0, 0
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
	pullable := func(y, q int32) bool {
		my := &x.mt[y]
		return my.p == q && y != m && x.movableAt(y)
	}
	n := 0 // two passes: count, then take the k-th (one draw, no allocation)
	for q := range np {
		for _, y := range x.occ[res*np+q] {
			if pullable(y, q) {
				n++
			}
		}
	}
	if n == 0 {
		return false
	}
	k, o := rng.IntN(n), int32(-1)
	for q := int32(0); q < np && o < 0; q++ {
		for _, y := range x.occ[res*np+q] {
			if pullable(y, q) {
				if k == 0 {
					o = y
					break
				}
				k--
			}
		}
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
