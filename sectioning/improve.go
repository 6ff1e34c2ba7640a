package sectioning

import (
	"context"
	"math/rand/v2"
)

// Iterative improvement after the first seating, in rounds until a round
// changes nothing or ctx ends:
//   - unplaced requests are tried again (with repair) when a section of
//     one of their courses has opened since they last failed, and failing
//     that take the place of a less important request (priority.go);
//   - a request met by an alternative moves to an earlier option that has
//     room;
//   - student moves (student.go): each student, in seeded random order,
//     is re-seated in all their placed courses at once when that is
//     strictly cheaper (moved students and clashes, score.go); a student
//     is looked at again only when their seating changed or a section
//     that was full for them has room (watch);
//   - two students of one course swap enrollments when that lowers their
//     summed cost (limits are unaffected by a swap).
// Every step lowers the objective strictly, so the rounds end.

// enrollCost is the moved and clash cost of request r's current
// enrollment secs against the student's other sections.
func (p *problem) enrollCost(r int32, secs, others []int32) int64 {
	return p.enrollCostIn(r, p.course(r), secs, others)
}

// watch remembers, per student, what their last complete search saw: the
// student's change counter and the sections of their courses that were
// full (other than their own). Nothing else can make a student move pay.
type watch struct {
	ver  []uint32
	full [][]int32
}

// fired reports whether student k must be searched again.
func (p *problem) fired(w *watch, k int32) bool {
	if w.ver[k] != p.st.studentVer[k] {
		return true
	}
	for _, x := range w.full[k] {
		if p.st.load[x] < p.limit[x] {
			return true
		}
	}
	return false
}

// remember records student k's state after a complete search over the
// sections univ.
func (p *problem) remember(w *watch, k int32, univ []int32) {
	w.ver[k] = p.st.studentVer[k]
	w.full[k] = w.full[k][:0]
	for _, x := range univ {
		if p.st.load[x] >= p.limit[x] && !p.holds(k, x) {
			w.full[k] = append(w.full[k], x)
		}
	}
}

// holds reports whether student k is seated in or fixed to section x.
func (p *problem) holds(k, x int32) bool {
	for _, r := range p.students[k].reqs {
		if contains(p.st.secs[r], x) {
			return true
		}
	}
	return p.isFixed(k, x)
}

// improve runs the rounds.
func (p *problem) improve(ctx context.Context, sr *searcher, rep *repairer, rng *rand.Rand) {
	order := make([]int32, len(p.reqs))
	for i := range order {
		order[i] = int32(i)
	}
	seen := make([]uint64, len(p.reqs)) // unplaced or by alternative: version key + 1 at the last failed try
	students := make([]int32, len(p.students))
	for i := range students {
		students[i] = int32(i)
	}
	w := &watch{ver: make([]uint32, len(p.students)), full: make([][]int32, len(p.students))}
	ss := &studentSearch{}
	for ctx.Err() == nil {
		changed := false
		for _, r := range order {
			o := p.st.opt[r]
			if o == 0 {
				continue
			}
			key := p.optionsKey(r, o) + 1
			if seen[r] == key {
				continue
			}
			if o < 0 && (rep.repair(r) || p.ejectFor(sr, rep, r)) || o > 0 && p.placeBest(sr, r, int(o)) {
				changed = true
			} else {
				seen[r] = p.optionsKey(r, p.st.opt[r]) + 1
			}
		}
		rng.Shuffle(len(students), func(i, j int) { students[i], students[j] = students[j], students[i] })
		for n, k := range students {
			if n%256 == 0 && ctx.Err() != nil {
				return
			}
			if !p.fired(w, k) {
				continue
			}
			if p.improveStudent(ss, k) {
				changed = true
			}
			// a search of unchanged inputs finds the same (budget or not)
			p.remember(w, k, ss.univ)
		}
		rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
		if p.swapRound(ctx, rng, order) {
			changed = true
		}
		if !changed {
			return
		}
	}
}

// optionsKey is the version of what seating request r in an option
// before o (all options when o < 0) depends on: openings of sections in
// those courses, and the student's seating.
func (p *problem) optionsKey(r, o int32) uint64 {
	var v uint32
	for i, c := range p.reqs[r].options {
		if c >= 0 && (o < 0 || int32(i) < o) {
			v += p.st.courseVer[c]
		}
	}
	return uint64(v)<<32 | uint64(p.st.studentVer[p.reqs[r].student])
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
		if p.st.studentVer[ka] == p.st.zeroAt[a] {
			continue // known to cost nothing
		}
		oa = p.others(ka, a, oa)
		curA := p.enrollCost(a, p.st.secs[a], oa)
		if curA == 0 {
			p.st.zeroAt[a] = p.st.studentVer[ka]
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
