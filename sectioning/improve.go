package sectioning

import (
	"context"
	"math/rand/v2"
)

// Iterative improvement after the first seating, in rounds until a round
// changes nothing or ctx ends:
//   - unplaced requests are tried again (with repair): moves of the round
//     before may have opened a seat;
//   - a request met by an alternative moves to an earlier option with room;
//   - every placed request, in seeded random order, moves to its cheapest
//     enrollment with room in its course when that is strictly cheaper
//     (moved students and clashes, score.go) — the change in cost is
//     evaluated from the student's own sections only;
//   - two students of one course swap enrollments when that lowers their
//     summed cost (limits are unaffected by a swap).
// Every step lowers the objective strictly, so the rounds end.

// enrollCost is the moved and clash cost of request r's current
// enrollment secs against the student's other sections.
func (p *problem) enrollCost(r int32, secs, others []int32) int64 {
	return p.enrollCostIn(r, p.course(r), secs, others)
}

// improve runs the rounds. A request is looked at again only when
// something it depends on changed since it last failed to improve: its
// student's seating, or room in its course (state's change counters).
func (p *problem) improve(ctx context.Context, sr *searcher, rep *repairer, rng *rand.Rand) {
	order := make([]int32, len(p.reqs))
	for i := range order {
		order[i] = int32(i)
	}
	seen := make([]uint64, len(p.reqs)) // version key + 1 at the last failed look; 0 none
	var others []int32
	for ctx.Err() == nil {
		changed := false
		for _, r := range order {
			if p.st.opt[r] >= 0 {
				continue
			}
			if key := p.unplacedKey(r) + 1; seen[r] != key {
				if rep.repair(r) {
					changed = true
				} else {
					seen[r] = p.unplacedKey(r) + 1
				}
			}
		}
		rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
		for n, r := range order {
			if n%256 == 0 && ctx.Err() != nil {
				return
			}
			o := p.st.opt[r]
			if o < 0 {
				continue
			}
			key := p.placedKey(r) + 1
			if seen[r] == key {
				continue
			}
			if o > 0 && p.placeBest(sr, r, int(o)) {
				changed = true
				continue
			}
			if p.moveBetter(sr, r, &others) {
				changed = true
			} else {
				seen[r] = p.placedKey(r) + 1
			}
		}
		if p.swapRound(ctx, rng, order) {
			changed = true
		}
		if !changed {
			return
		}
	}
}

// placedKey is the version of what a placed request's best move depends
// on: its student's seating and room in its course.
func (p *problem) placedKey(r int32) uint64 {
	return uint64(p.st.courseVer[p.course(r)])<<32 | uint64(p.st.studentVer[p.reqs[r].student])
}

// unplacedKey is the version for an unplaced request: room in any of its
// courses (summed) and its student's seating.
func (p *problem) unplacedKey(r int32) uint64 {
	var v uint32
	for _, c := range p.reqs[r].options {
		if c >= 0 {
			v += p.st.courseVer[c]
		}
	}
	return uint64(v)<<32 | uint64(p.st.studentVer[p.reqs[r].student])
}

// moveBetter moves placed request r to its cheapest enrollment with room
// in the same course when that is strictly cheaper.
func (p *problem) moveBetter(sr *searcher, r int32, others *[]int32) bool {
	k := p.reqs[r].student
	c := p.course(r)
	*others = p.others(k, r, *others)
	cur := p.enrollCost(r, p.st.secs[r], *others)
	if cur == 0 {
		return false
	}
	q := query{r: r, k: k, c: c, others: *others, own: p.st.secs[r], pass: -1}
	e, ok := sr.find(&q)
	if !ok || e.cost >= cur {
		return false
	}
	p.seat(r, p.st.opt[r], e.secs)
	return true
}

// swapTries is how many partners of one course each request tries per round.
const swapTries = 4

// swapRound tries, for each placed request, swaps of enrollments with a
// few random students of the same course.
func (p *problem) swapRound(ctx context.Context, rng *rand.Rand, order []int32) bool {
	byCourse := make([][]int32, len(p.courses))
	for _, r := range order {
		if c := p.course(r); c >= 0 && len(p.fixedIn(p.reqs[r].student, c, nil)) == 0 {
			byCourse[c] = append(byCourse[c], r)
		}
	}
	changed := false
	var oa, ob []int32
	for n, a := range order {
		if n%256 == 0 && ctx.Err() != nil {
			return changed
		}
		c := p.course(a)
		if c < 0 || len(byCourse[c]) < 2 || len(p.fixedIn(p.reqs[a].student, c, nil)) > 0 {
			continue
		}
		ka := p.reqs[a].student
		oa = p.others(ka, a, oa)
		curA := p.enrollCost(a, p.st.secs[a], oa)
		if curA == 0 {
			continue
		}
		for range swapTries {
			b := byCourse[c][rng.IntN(len(byCourse[c]))]
			kb := p.reqs[b].student
			if b == a || kb == ka || p.course(b) != c || sameSecs(p.st.secs[a], p.st.secs[b]) {
				continue
			}
			ob = p.others(kb, b, ob)
			curB := p.enrollCost(b, p.st.secs[b], ob)
			sa, sb := append([]int32(nil), p.st.secs[a]...), append([]int32(nil), p.st.secs[b]...)
			newA := p.enrollCostIn(a, c, sb, oa)
			newB := p.enrollCostIn(b, c, sa, ob)
			if newA+newB < curA+curB {
				oaOpt, obOpt := p.st.opt[a], p.st.opt[b]
				p.seat(a, oaOpt, sb)
				p.seat(b, obOpt, sa)
				changed = true
				break
			}
		}
	}
	return changed
}

// enrollCostIn is enrollCost for secs in course c (r need not be in c).
func (p *problem) enrollCostIn(r, c int32, secs, others []int32) int64 {
	k := p.reqs[r].student
	var clashes int
	for i, x := range secs {
		clashes += p.crossClash(x, others)
		for _, y := range secs[i+1:] {
			clashes += p.clash.get(x, y)
		}
	}
	cost := int64(clashes) * p.mulClash
	if len(p.students[k].kept[c]) > 0 {
		all := append(p.fixedIn(k, c, nil), secs...)
		cost += int64(p.keptMoved(k, c, all)) * p.mulMoved
	}
	return cost
}

func sameSecs(a, b []int32) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}
