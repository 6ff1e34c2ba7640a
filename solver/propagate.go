package solver

// propagate assigns every consequence of the trail: unit propagation over
// clauses, cardinality constraints and weighted sums to a fixpoint, then the
// unfounded-set check (non-tight programs), repeated until neither changes
// anything. It returns true on conflict, with the falsified clause or
// constraint explanation in s.conflict.
//
// Post-condition without conflict: qhead == len(trail), no clause is unit or
// false, no constraint can force anything, and no unassigned or true cyclic
// atom is unfounded.
func (s *Solver) propagate() bool {
	for {
		if s.propagateUnits() {
			return true
		}
		if s.ufs == nil || !s.ufs.pending() {
			return false
		}
		changed, conflict := s.ufsCheck()
		if conflict {
			return true
		}
		if !changed {
			return false
		}
	}
}

// propagateUnits propagates trail[qhead:] through watches, cardinality
// counters and weighted sums. It allocates nothing (watch lists are filtered
// in place) except when a watch list grows. Returns true on conflict.
func (s *Solver) propagateUnits() bool {
	for s.qhead < len(s.trail) {
		p := s.trail[s.qhead]
		s.qhead++
		s.stats.Propagations++
		occ := s.cardOcc[p]
		for _, o := range occ {
			switch o & 3 {
			case occTrue:
				s.cards[o>>2].nTrue++
			case occFalse:
				s.cards[o>>2].nFalse++
			}
		}
		socc := s.sumOcc[p]
		for _, o := range socc {
			if o&1 == 0 {
				s.sums[s.parts.of[o>>1]].sumTrue += s.parts.w[o>>1]
			}
		}
		if s.ufs != nil {
			s.ufs.falsified(p ^ 1)
		}

		falseLit := p ^ 1
		vals, arena := s.vals, s.arena
		ws := s.watches[falseLit]
		i, j := 0, 0
		for i < len(ws) {
			w := ws[i]
			i++
			if vals[w.blocker] == 1 {
				ws[j] = w
				j++
				continue
			}
			if w.cref&binaryWatch != 0 {
				ws[j] = w
				j++
				if vals[w.blocker] == -1 {
					j += copy(ws[j:], ws[i:])
					s.watches[falseLit] = ws[:j]
					s.conflict = append(s.conflict[:0], w.blocker, falseLit)
					return true
				}
				s.assign(w.blocker, w.cref&^binaryWatch)
				continue
			}
			c := w.cref
			n := uint32(arena[c] >> headerShift)
			lits := arena[c+clauseHeader : c+clauseHeader+n]
			if lits[0] == falseLit {
				lits[0], lits[1] = lits[1], falseLit
			}
			first := lits[0]
			if first != w.blocker && vals[first] == 1 {
				ws[j] = watch{c, first}
				j++
				continue
			}
			moved := false
			for k := 2; k < len(lits); k++ {
				if q := lits[k]; vals[q] != -1 {
					lits[1], lits[k] = q, falseLit
					s.watches[q] = append(s.watches[q], watch{c, first})
					moved = true
					break
				}
			}
			if moved {
				continue
			}
			ws[j] = watch{c, first}
			j++
			if vals[first] == -1 {
				j += copy(ws[j:], ws[i:])
				s.watches[falseLit] = ws[:j]
				s.conflict = append(s.conflict[:0], lits...)
				return true
			}
			s.assign(first, c)
		}
		s.watches[falseLit] = ws[:j]

		for _, o := range occ {
			if s.cardPropagate(o>>2, o&3) {
				return true
			}
		}
		for _, o := range socc {
			k := o >> 1
			if o&1 == 0 {
				k = s.parts.of[k]
			}
			if s.sumPropagate(k) {
				return true
			}
		}
	}
	return false
}
