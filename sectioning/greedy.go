package sectioning

import (
	"math"
	"math/rand/v2"
	"sort"
)

// The first seating is greedy: requests are taken by priority (1 first,
// 0 last), and within a priority student by student, hardest first (the
// student whose most constrained course has the fewest enrollments, then
// the one with most requests; ties by the seeded order). Each request gets
// the cheapest enrollment with room of its course, else of its first
// alternative that has one, else a repair (repair.go) frees a seat; what
// still fails is unplaced with its reason.

// choices estimates the number of enrollments of course c (the sum over
// its arrangements of the product of their parts' sizes, parent links
// ignored), as a logarithm.
func (p *problem) choices(c int32) float64 {
	total := 0.0
	for _, ai := range p.courseArr[c] {
		prod := 1.0
		for _, pi := range p.arrs[ai].parts {
			prod *= float64(len(p.parts[pi].sections))
		}
		total += prod
	}
	return math.Log(total + 1)
}

// order lists the requests in greedy order.
func (p *problem) order(rng *rand.Rand) []int32 {
	perm := rng.Perm(len(p.students))
	tie := make([]int, len(p.students))
	for i, k := range perm {
		tie[k] = i
	}
	hard := make([]float64, len(p.students))
	for k := range p.students {
		h := math.Inf(1)
		for _, r := range p.students[k].reqs {
			if c := p.reqs[r].options[0]; c >= 0 {
				h = min(h, p.choices(c))
			}
		}
		hard[k] = h
	}
	out := make([]int32, len(p.reqs))
	for i := range out {
		out[i] = int32(i)
	}
	sort.SliceStable(out, func(i, j int) bool {
		a, b := &p.reqs[out[i]], &p.reqs[out[j]]
		if a.rank != b.rank {
			return a.rank < b.rank
		}
		if a.student == b.student {
			return out[i] < out[j]
		}
		if hard[a.student] != hard[b.student] {
			return hard[a.student] < hard[b.student]
		}
		na, nb := len(p.students[a.student].reqs), len(p.students[b.student].reqs)
		if na != nb {
			return na > nb
		}
		return tie[a.student] < tie[b.student]
	})
	return out
}

// placeBest seats request r in its best option with room, trying options
// up to (not including) upto; it reports whether it did.
func (p *problem) placeBest(sr *searcher, r int32, upto int) bool {
	for o := 0; o < upto && o < len(p.reqs[r].options); o++ {
		if p.placeOption(sr, r, int32(o)) {
			return true
		}
	}
	return false
}

// placeOption seats request r in its cheapest enrollment with room of
// option o (r's own sections count as room); it reports whether it did.
func (p *problem) placeOption(sr *searcher, r, o int32) bool {
	rq := &p.reqs[r]
	k := rq.student
	c := rq.options[o]
	if c < 0 || p.holdsCourse(k, c, r) {
		return false
	}
	sr.others = p.others(k, r, sr.others)
	q := query{r: r, k: k, c: c, others: sr.others, pass: -1}
	if p.course(r) == c {
		q.own = p.st.secs[r]
	}
	e, ok := sr.find(&q)
	if ok {
		p.seat(r, o, e.secs)
	}
	return ok
}

// greedy seats every request in order, repairing where places run out.
func (p *problem) greedy(sr *searcher, rng *rand.Rand, rep *repairer) {
	for _, r := range p.order(rng) {
		if p.st.opt[r] >= 0 {
			continue // kept
		}
		if !p.placeBest(sr, r, len(p.reqs[r].options)) {
			rep.repair(r)
		}
	}
}
