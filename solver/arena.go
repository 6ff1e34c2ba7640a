package solver

import "slices"

// Clause layout in the arena, at offset c:
//
//	arena[c]   header: size<<headerShift | flags
//	arena[c+1] literal block distance (learned clauses)
//	arena[c+2:c+2+size] literals; the first two are watched
//
// Offsets fit in 29 bits (reason.go); the arena is compacted at level 0.
const (
	headerShift  = 2
	flagLearnt   = 1 // deletable learned clause (or loop formula)
	flagDeleted  = 2 // deleted; space reclaimed by the next compaction
	clauseHeader = 2 // header words before the literals
	maxArena     = 1 << reasonKindShift
	binaryWatch  = 1 << 31 // set in watch.cref for clauses of two literals
)

// watch is an entry of a watch list: the clause and a literal of it whose
// truth makes visiting the clause unnecessary (for binary clauses: the other
// literal).
type watch struct {
	cref    uint32 // clause offset, with binaryWatch set for binary clauses
	blocker Lit    // a literal of the clause other than the watched one
}

func (s *Solver) clauseSize(c uint32) int { return int(s.arena[c] >> headerShift) }

func (s *Solver) clauseLits(c uint32) []Lit {
	n := uint32(s.arena[c] >> headerShift)
	return s.arena[c+clauseHeader : c+clauseHeader+n]
}

// allocClause stores lits (at least two) and returns the offset.
func (s *Solver) allocClause(lits []Lit, learnt bool, lbd int) uint32 {
	c := uint32(len(s.arena))
	if int(c)+clauseHeader+len(lits) >= maxArena {
		panic("solver: clause arena exceeds 2^29 words") // a bug or an absurd program; compaction keeps it small
	}
	h := Lit(len(lits)) << headerShift
	if learnt {
		h |= flagLearnt
	}
	s.arena = append(s.arena, h, Lit(lbd))
	s.arena = append(s.arena, lits...)
	s.numClauses++
	if learnt {
		s.learnts = append(s.learnts, c)
	}
	return c
}

// attach adds the watches of clause c on its first two literals (deferred
// to rebuildWatches while New builds the solver).
func (s *Solver) attach(c uint32) {
	if s.building {
		return
	}
	lits := s.clauseLits(c)
	ref := c
	if len(lits) == 2 {
		ref |= binaryWatch
	}
	s.watches[lits[0]] = append(s.watches[lits[0]], watch{ref, lits[1]})
	s.watches[lits[1]] = append(s.watches[lits[1]], watch{ref, lits[0]})
}

// deleteClause marks c deleted; the caller rebuilds the watches (reduce.go).
func (s *Solver) deleteClause(c uint32) {
	s.arena[c] |= flagDeleted
	s.numClauses--
	s.wasted += clauseHeader + s.clauseSize(c)
	s.stats.Deleted++
}

// normalize sorts and deduplicates lits in place, returning the result and
// whether the clause is a tautology (contains p and not p).
func normalize(lits []Lit) ([]Lit, bool) {
	slices.Sort(lits)
	lits = slices.Compact(lits)
	for i := 1; i < len(lits); i++ {
		if lits[i] == lits[i-1]^1 {
			return lits, true
		}
	}
	return lits, false
}

// addClauseLevel0 adds a permanent clause at decision level 0 (outside
// search): literals false at level 0 are dropped, satisfied clauses are
// skipped, units are assigned (propagated by the next search). It clears ok
// when the clause is empty after simplification. lits is modified.
func (s *Solver) addClauseLevel0(lits []Lit) {
	if !s.ok {
		return
	}
	lits, taut := normalize(lits)
	if taut {
		return
	}
	j := 0
	for _, p := range lits {
		switch s.vals[p] {
		case 1:
			return
		case 0:
			lits[j] = p
			j++
		}
	}
	lits = lits[:j]
	switch len(lits) {
	case 0:
		s.ok = false
	case 1:
		s.assign(lits[0], 0)
	default:
		s.attach(s.allocClause(lits, false, 0))
	}
}

// addClauseInSearch adds a clause at any decision level. It orders the
// literals so that the watches are the best two (true, then unassigned, then
// false by decreasing level). A unit clause is asserted at level 0. When the
// clause is unit under the assignment its open literal is assigned at the
// current level; when every literal is false the clause is copied to
// s.conflict and true is returned. lits (non-empty, no duplicate variables)
// is reordered.
func (s *Solver) addClauseInSearch(lits []Lit, learnt bool, lbd int) (conflict bool) {
	if len(lits) == 1 {
		s.cancelUntil(0)
		switch s.vals[lits[0]] {
		case -1:
			s.ok = false
			s.conflict = append(s.conflict[:0], lits[0])
			return true
		case 0:
			s.assign(lits[0], 0)
		}
		return false
	}
	rank := func(p Lit) int32 {
		switch s.vals[p] {
		case 1:
			return 1 << 30
		case 0:
			return 1 << 29
		}
		return s.level[p>>1]
	}
	for i := 0; i < 2; i++ {
		best := i
		for k := i + 1; k < len(lits); k++ {
			if rank(lits[k]) > rank(lits[best]) {
				best = k
			}
		}
		lits[i], lits[best] = lits[best], lits[i]
	}
	c := s.allocClause(lits, learnt, lbd)
	if learnt {
		s.stats.Learned++
	}
	s.attach(c)
	switch {
	case s.vals[lits[0]] == -1:
		s.conflict = append(s.conflict[:0], lits...)
		return true
	case s.vals[lits[0]] == 0 && s.vals[lits[1]] == -1:
		s.assign(lits[0], c)
	}
	return false
}

// rebuildWatches recreates every watch list from the arena. The lists share
// one allocation, each with some spare capacity; a list that outgrows it is
// moved by append. O(arena size).
func (s *Solver) rebuildWatches() {
	count := make([]uint32, len(s.watches))
	arena := s.arena
	for c := clauseHeader; c < len(arena); c += clauseHeader + int(arena[c]>>headerShift) {
		if arena[c]&flagDeleted == 0 {
			count[arena[c+clauseHeader]]++
			count[arena[c+clauseHeader+1]]++
		}
	}
	total := 0
	for i, n := range count {
		n += n/4 + 2
		count[i] = n
		total += int(n)
	}
	buf := make([]watch, total)
	off := 0
	for i, n := range count {
		s.watches[i] = buf[off : off : off+int(n)]
		off += int(n)
	}
	for c := clauseHeader; c < len(arena); c += clauseHeader + int(arena[c]>>headerShift) {
		if arena[c]&flagDeleted == 0 {
			s.attach(uint32(c))
		}
	}
}
