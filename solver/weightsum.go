package solver

import (
	"cmp"
	"slices"
)

// wsum is a weighted-sum upper bound: when cond holds (or cond is 0), the
// total weight of the true members is at most bound. Members are stored by
// decreasing weight so that the members that no longer fit form a prefix.
// The counter covers exactly the propagated trail.
type wsum struct {
	start   uint32 // first member in Solver.sumLits / sumW
	n       int32  // number of members
	bound   int64  // largest allowed total weight of true members
	cond    Lit    // activating literal, 0 when always active
	sumTrue int64  // weight of members true in trail[:qhead]
}

// sumParts holds the members of all weighted sums.
type sumParts struct {
	lits []Lit    // member literals, grouped by sum
	w    []int64  // w[i] > 0 is the weight of lits[i]
	of   []uint32 // of[i] is the sum that member i belongs to
}

// addSum adds the bound sum(w_i * [lits_i]) <= bound when cond holds, at
// decision level 0. Weights must be positive; a literal listed twice has its
// weights added. It returns the index of the sum.
func (s *Solver) addSum(lits []Lit, weights []int64, bound int64, cond Lit) int {
	type member struct {
		p Lit
		w int64
	}
	ms := make([]member, 0, len(lits))
	for i, p := range lits {
		ms = append(ms, member{p, weights[i]})
	}
	slices.SortFunc(ms, func(a, b member) int { return cmp.Compare(a.p, b.p) })
	j := 0
	for i := range ms {
		if j > 0 && ms[j-1].p == ms[i].p {
			ms[j-1].w += ms[i].w
			continue
		}
		ms[j] = ms[i]
		j++
	}
	ms = ms[:j]
	slices.SortStableFunc(ms, func(a, b member) int { return cmp.Compare(b.w, a.w) })
	k := uint32(len(s.sums))
	w := wsum{start: uint32(len(s.parts.lits)), n: int32(len(ms)), bound: bound, cond: cond}
	for _, m := range ms {
		i := uint32(len(s.parts.lits))
		s.parts.lits = append(s.parts.lits, m.p)
		s.parts.w = append(s.parts.w, m.w)
		s.parts.of = append(s.parts.of, k)
		s.sumOcc[m.p] = append(s.sumOcc[m.p], i<<1)
		if s.vals[m.p] == 1 && int(s.trailPos[m.p>>1]) < s.qhead {
			w.sumTrue += m.w
		}
	}
	if cond != 0 {
		s.sumOcc[cond] = append(s.sumOcc[cond], k<<1|1)
	}
	s.sums = append(s.sums, w)
	if s.decisionLevel() == 0 && s.sumPropagate(k) {
		s.ok = false
	}
	return int(k)
}

// sumPropagate checks sum k and forces members that no longer fit (or the
// condition) false. It returns true on conflict, left in s.conflict.
func (s *Solver) sumPropagate(k uint32) bool {
	w := &s.sums[k]
	active := w.cond == 0 || s.vals[w.cond] == 1
	if !active && s.vals[w.cond] == -1 {
		return false
	}
	if w.sumTrue > w.bound {
		if active {
			s.sumConflict(k)
			return true
		}
		s.assign(w.cond^1, extReason(kindSumCond, k))
		return false
	}
	if !active {
		return false
	}
	slack := w.bound - w.sumTrue
	end := w.start + uint32(w.n)
	r := extReason(kindSumFalse, k)
	for i := w.start; i < end && s.parts.w[i] > slack; i++ {
		if p := s.parts.lits[i]; s.vals[p] == 0 {
			s.assign(p^1, r)
		}
	}
	return false
}

// sumConflict writes the violated sum as a conflict: the negated condition
// and the propagated true members.
func (s *Solver) sumConflict(k uint32) {
	w := &s.sums[k]
	s.conflict = s.conflict[:0]
	if w.cond != 0 {
		s.conflict = append(s.conflict, w.cond^1)
	}
	for i := w.start; i < w.start+uint32(w.n); i++ {
		p := s.parts.lits[i]
		if s.vals[p] == 1 && int(s.trailPos[p>>1]) < s.qhead {
			s.conflict = append(s.conflict, p^1)
		}
	}
}

// explainSum appends the false literals that forced p (now true) through
// sum k at trail position pos: the negated condition and heavy true members
// assigned before pos that leave no room for p's member (or, when p negates
// the condition, exceed the bound).
func (s *Solver) explainSum(dst []Lit, k uint32, p Lit, pos int32) []Lit {
	w := &s.sums[k]
	end := w.start + uint32(w.n)
	need := w.bound // the chosen true members must weigh more than need
	if w.cond == 0 || p != w.cond^1 {
		if w.cond != 0 {
			dst = append(dst, w.cond^1)
		}
		for i := w.start; i < end; i++ {
			if s.parts.lits[i] == p^1 {
				need -= s.parts.w[i]
				break
			}
		}
	}
	var got int64
	for i := w.start; i < end && got <= need; i++ {
		q := s.parts.lits[i]
		if s.vals[q] == 1 && s.trailPos[q>>1] < pos {
			dst = append(dst, q^1)
			got += s.parts.w[i]
		}
	}
	return dst
}

// dropSums removes the sums from index base on (and their members from
// partsBase on), with their occurrences; called at level 0 when their
// activation literals are false for good.
func (s *Solver) dropSums(base, partsBase int) {
	if base >= len(s.sums) {
		return
	}
	keep := func(p Lit) {
		occ := s.sumOcc[p]
		j := 0
		for _, o := range occ {
			if (o&1 == 0 && int(o>>1) >= partsBase) || (o&1 == 1 && int(o>>1) >= base) {
				continue
			}
			occ[j] = o
			j++
		}
		s.sumOcc[p] = occ[:j]
	}
	for _, p := range s.parts.lits[partsBase:] {
		keep(p)
	}
	for _, w := range s.sums[base:] {
		if w.cond != 0 {
			keep(w.cond)
		}
	}
	s.sums = s.sums[:base]
	s.parts.lits = s.parts.lits[:partsBase]
	s.parts.w = s.parts.w[:partsBase]
	s.parts.of = s.parts.of[:partsBase]
}
