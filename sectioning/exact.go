package sectioning

import "context"

// Terms small enough are searched exhaustively after the heuristic
// (branch and bound over every request's every enrollment of every option,
// and "unplaced"), so that on them the result is optimal for the whole
// objective of score.go. "Small enough": the product over requests of
// 1 + their enrollments is at most exactLeaves.
const exactLeaves = 1 << 16

// objective is the full objective of score.go; lower is better.
type objective struct {
	unplaced int64
	prio     []int64 // unplaced requests by priority rank (index 1 = priority 1)
	alt      int64
	primary  int64 // moved and clash cost, weighted
}

// less compares lexicographically.
func (a *objective) less(b *objective) bool {
	if a.unplaced != b.unplaced {
		return a.unplaced < b.unplaced
	}
	for i := range a.prio {
		if a.prio[i] != b.prio[i] {
			return a.prio[i] < b.prio[i]
		}
	}
	if a.alt != b.alt {
		return a.alt < b.alt
	}
	return a.primary < b.primary
}

func (a *objective) clone() objective {
	c := *a
	c.prio = append([]int64(nil), a.prio...)
	return c
}

// maxRank is the largest priority rank of the requests.
func (p *problem) maxRank() int {
	m := 0
	for i := range p.reqs {
		m = max(m, p.reqs[i].rank)
	}
	return m
}

// objectiveNow evaluates the current state.
func (p *problem) objectiveNow() objective {
	tt := p.totals()
	ob := objective{unplaced: tt.unplaced, prio: make([]int64, p.maxRank()+1), alt: tt.altRank, primary: p.primary(tt)}
	for ri := range p.reqs {
		if p.st.opt[ri] < 0 {
			ob.prio[p.reqs[ri].rank]++
		}
	}
	return ob
}

// allEnrollments lists every enrollment (sectioned sections) of student k
// in course c, room ignored; false when there are more than most.
func (p *problem) allEnrollments(k, c int32, most int) ([][]int32, bool) {
	forced := p.fixedIn(k, c, nil)
	var out [][]int32
	for _, ai := range p.courseArr[c] {
		a := &p.arrs[ai]
		ok := true
		for _, f := range forced {
			ok = ok && p.secArr[f] == ai
		}
		if !ok {
			continue
		}
		chosen := make([]int32, len(a.parts))
		var rec func(pos int) bool
		rec = func(pos int) bool {
			if pos == len(a.parts) {
				for _, x := range chosen {
					if par := p.parent[x]; par >= 0 && !contains(chosen, par) {
						return true
					}
				}
				var secs []int32
				for _, x := range chosen {
					if !contains(forced, x) {
						secs = append(secs, x)
					}
				}
				out = append(out, secs)
				return len(out) <= most
			}
			pi := a.parts[pos]
			var cands []int32
			for _, f := range forced {
				if p.secPart[f] == pi {
					cands = append(cands, f)
				}
			}
			if len(cands) > 1 {
				return true
			}
			if len(cands) == 0 {
				cands = p.parts[pi].sections
			}
			for _, x := range cands {
				chosen[pos] = x
				if !rec(pos + 1) {
					return false
				}
			}
			return true
		}
		if !rec(0) {
			return nil, false
		}
	}
	return out, true
}

// exactCand is one choice for a request in the exhaustive search.
type exactCand struct {
	opt  int32 // -1 = unplaced
	secs []int32
}

// exact runs the exhaustive search when the term is small enough and
// leaves the best seating in the state; it reports whether it ran to the
// end (it stops, keeping the best found, when ctx ends).
func (p *problem) exact(ctx context.Context) bool {
	cands := make([][]exactCand, len(p.reqs))
	leaves := 1.0
	for ri := range p.reqs {
		r := int32(ri)
		k := p.reqs[r].student
		for o, c := range p.reqs[r].options {
			if c < 0 {
				continue
			}
			es, ok := p.allEnrollments(k, c, exactLeaves)
			if !ok {
				return false
			}
			for _, e := range es {
				cands[r] = append(cands[r], exactCand{opt: int32(o), secs: e})
			}
		}
		cands[r] = append(cands[r], exactCand{opt: -1})
		if leaves *= float64(len(cands[r])); leaves > exactLeaves {
			return false
		}
	}
	best := p.objectiveNow()
	bestSeat := p.snapshot()
	for ri := range p.reqs {
		p.unseat(int32(ri))
	}
	// requests student by student, so each enrollment's clashes are
	// counted against the same student's requests seated before it
	var order []int32
	for k := range p.students {
		order = append(order, p.students[k].reqs...)
	}
	cur := objective{prio: make([]int64, len(best.prio))}
	nodes := 0
	stopped := false
	var others []int32
	var rec func(i int)
	rec = func(i int) {
		if stopped {
			return
		}
		if nodes++; nodes%1024 == 0 && ctx.Err() != nil {
			stopped = true
			return
		}
		if !cur.less(&best) {
			return
		}
		if i == len(order) {
			best = cur.clone()
			bestSeat = p.snapshot()
			return
		}
		r := order[i]
		k := p.reqs[r].student
		for _, cd := range cands[r] {
			if cd.opt < 0 {
				rank := p.reqs[r].rank
				cur.unplaced++
				cur.prio[rank]++
				rec(i + 1)
				cur.unplaced--
				cur.prio[rank]--
				continue
			}
			c := p.reqs[r].options[cd.opt]
			if p.holdsCourse(k, c, r) || !p.roomAll(cd.secs) {
				continue
			}
			others = p.others(k, r, others)
			p.seat(r, cd.opt, cd.secs)
			add := p.enrollCost(r, cd.secs, others)
			cur.alt += int64(cd.opt)
			cur.primary += add
			rec(i + 1)
			cur.alt -= int64(cd.opt)
			cur.primary -= add
			p.unseat(r)
		}
	}
	rec(0)
	p.restore(bestSeat)
	return !stopped
}

// roomAll reports whether every section of secs has a free place.
func (p *problem) roomAll(secs []int32) bool {
	for _, x := range secs {
		if p.st.load[x] >= p.limit[x] {
			return false
		}
	}
	return true
}

// seating is a copy of every request's seating.
type seating struct {
	opt  []int32
	secs [][]int32
}

func (p *problem) snapshot() seating {
	s := seating{opt: append([]int32(nil), p.st.opt...), secs: make([][]int32, len(p.reqs))}
	for i := range p.reqs {
		s.secs[i] = append([]int32(nil), p.st.secs[i]...)
	}
	return s
}

func (p *problem) restore(s seating) {
	for ri := range p.reqs {
		p.unseat(int32(ri))
	}
	for ri := range p.reqs {
		if s.opt[ri] >= 0 {
			p.seat(int32(ri), s.opt[ri], s.secs[ri])
		}
	}
}
