package solver

import (
	"cmp"
	"slices"
)

// reduceDB deletes about half of the learned clauses, those with the highest
// literal block distance (Audemard & Simon 2009), never those with LBD at
// most GlueLBD, then compacts the arena. Called at decision level 0 only, so
// no learned clause is the reason of a variable that analysis can reach.
func (s *Solver) reduceDB() {
	ls := s.learnts
	slices.SortFunc(ls, func(a, b uint32) int {
		if c := cmp.Compare(s.arena[b+1], s.arena[a+1]); c != 0 {
			return c // higher LBD first
		}
		return cmp.Compare(a, b) // older first
	})
	limit := len(ls) / 2
	for i, c := range ls {
		if i >= limit {
			break
		}
		if int(s.arena[c+1]) > s.opts.GlueLBD {
			s.deleteClause(c)
		}
	}
	s.compact()
}

// compact rewrites the arena without deleted clauses and, using the level-0
// assignment, without satisfied clauses and false literals; then it rebuilds
// every watch list and the learned-clause list, clears the reasons of
// level-0 variables (no longer needed) and drops them from the heap. Must
// be called at level 0 at a propagation fixpoint. O(arena size + number of
// variables).
func (s *Solver) compact() {
	old := s.arena
	arena := make([]Lit, clauseHeader, len(old)-s.wasted+clauseHeader)
	s.learnts = s.learnts[:0]
	s.numClauses = 0
	var unit []Lit
	for c := clauseHeader; c < len(old); {
		h := old[c]
		n := int(h >> headerShift)
		next := c + clauseHeader + n
		if h&flagDeleted != 0 {
			c = next
			continue
		}
		start := len(arena)
		arena = append(arena, h, old[c+1])
		sat := false
		for _, p := range old[c+clauseHeader : next] {
			switch s.vals[p] {
			case 1:
				sat = true
			case 0:
				arena = append(arena, p)
			}
		}
		c = next
		kept := len(arena) - start - clauseHeader
		switch {
		case sat:
			arena = arena[:start]
		case kept <= 1:
			if kept == 0 {
				s.ok = false
			} else {
				unit = append(unit, arena[start+clauseHeader])
			}
			arena = arena[:start]
		default:
			arena[start] = Lit(kept)<<headerShift | h&flagLearnt
			s.numClauses++
			if h&flagLearnt != 0 {
				s.learnts = append(s.learnts, uint32(start))
			}
		}
	}
	s.arena = arena
	s.wasted = 0
	s.rebuildWatches()
	for _, p := range s.trail {
		s.reason[p>>1] = 0
	}
	for _, p := range unit {
		if s.vals[p] == 0 {
			s.assign(p, 0)
		}
	}
	s.simpTrail = len(s.trail)
	// Variables fixed at level 0 are never decided: drop them from the heap
	// at once (a neighbourhood step fixes most of them).
	s.order.keepOnly(func(v uint32) bool { return s.vals[Lit(v)<<1] == 0 })
}
