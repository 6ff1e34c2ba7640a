package solver

import "slices"

// card is a counting constraint: when cond holds (or cond is 0), between
// lower and upper of its members are true. Counters cover exactly the
// propagated trail (trail[:qhead]) and are restored on backtracking.
// Propagation is O(1) per member assignment until a bound is reached, then
// O(n) to force the remaining members; explanations are built lazily.
type card struct {
	start  uint32 // first member in Solver.cardLits
	n      int32  // number of members (distinct literals)
	lower  int32  // 0..n: at least lower members true
	upper  int32  // 0..n: at most upper members true
	cond   Lit    // activating literal, 0 when always active
	nTrue  int32  // members true in trail[:qhead]
	nFalse int32  // members false in trail[:qhead]
}

// Occurrence tags in cardOcc (low two bits).
const (
	occTrue  = 0 // the literal is a member: it becoming true counts towards upper
	occFalse = 1 // the literal is a member's complement: a member became false
	occCond  = 2 // the literal is the condition
)

// addCard adds lower <= #true(lits) <= upper when cond holds (cond 0: always),
// at decision level 0. lower may be NoBound (0) and upper NoBound (no limit).
// Trivial and degenerate constraints become clauses; lits is copied.
func (s *Solver) addCard(lits []Lit, lower, upper int, cond Lit) {
	if !s.ok {
		return
	}
	start := len(s.cardLits)
	s.cardLits = append(s.cardLits, lits...)
	m := s.cardLits[start:]
	slices.Sort(m)
	m = slices.Compact(m)
	s.cardLits = s.cardLits[:start+len(m)]
	n := len(m)
	if lower < 0 {
		lower = 0
	}
	if upper < 0 || upper > n {
		upper = n
	}
	end := start // members stay only when a card is made
	defer func() { s.cardLits = s.cardLits[:end] }()
	var tmp []Lit
	clause := func(lits ...Lit) {
		tmp = append(tmp[:0], lits...)
		if cond != 0 {
			tmp = append(tmp, cond^1)
		}
		s.addClauseLevel0(tmp)
	}
	switch {
	case lower > upper:
		clause()
		return
	case lower == 0 && upper == n:
		return
	case upper == 0:
		for _, p := range m {
			clause(p ^ 1)
		}
		return
	case lower == n:
		for _, p := range m {
			clause(p)
		}
		return
	case upper == n && lower == 1:
		clause(m...)
		return
	}
	k := uint32(len(s.cards))
	end = start + n
	c := card{start: uint32(start), n: int32(n), lower: int32(lower), upper: int32(upper), cond: cond}
	s.cards = append(s.cards, c)
	if !s.building {
		s.indexCard(k)
	}
	c = s.cards[k]
	for _, p := range m {
		if s.vals[p] != 0 && int(s.trailPos[p>>1]) < s.qhead {
			if s.vals[p] == 1 {
				c.nTrue++
			} else {
				c.nFalse++
			}
		}
	}
	s.cards[k] = c
	if s.qhead > 0 && s.cardPropagate(k, occCond) {
		s.ok = false // only at level 0: the constraint contradicts the facts
	}
}

// cardPropagate checks card k after a change of the kind given by tag and
// forces members or the condition. It returns true on conflict, leaving the
// conflict in s.conflict.
func (s *Solver) cardPropagate(k uint32, tag uint32) bool {
	c := &s.cards[k]
	active := c.cond == 0 || s.vals[c.cond] == 1
	condOpen := c.cond != 0 && s.vals[c.cond] == 0
	if !active && !condOpen {
		return false
	}
	members := s.cardLits[c.start : c.start+uint32(c.n)]
	if tag != occFalse && c.upper < c.n {
		switch {
		case c.nTrue > c.upper:
			if active {
				s.cardConflict(k, true)
				return true
			}
			s.assign(c.cond^1, extReason(kindCardCondUp, k))
			return false
		case c.nTrue == c.upper && active:
			r := extReason(kindCardFalse, k)
			for _, p := range members {
				if s.vals[p] == 0 {
					s.assign(p^1, r)
				}
			}
		}
	}
	if tag != occTrue && c.lower > 0 {
		room := c.n - c.lower
		switch {
		case c.nFalse > room:
			if active {
				s.cardConflict(k, false)
				return true
			}
			if s.vals[c.cond] == 0 {
				s.assign(c.cond^1, extReason(kindCardCondLow, k))
			}
		case c.nFalse == room && active:
			r := extReason(kindCardTrue, k)
			for _, p := range members {
				if s.vals[p] == 0 {
					s.assign(p, r)
				}
			}
		}
	}
	return false
}

// cardConflict writes the violated constraint as a conflict clause: the
// condition and the propagated members that are true (upper) or false
// (lower).
func (s *Solver) cardConflict(k uint32, upper bool) {
	c := &s.cards[k]
	s.conflict = s.conflict[:0]
	if c.cond != 0 {
		s.conflict = append(s.conflict, c.cond^1)
	}
	for _, p := range s.cardLits[c.start : c.start+uint32(c.n)] {
		if int(s.trailPos[p>>1]) >= s.qhead {
			continue
		}
		if upper && s.vals[p] == 1 {
			s.conflict = append(s.conflict, p^1)
		} else if !upper && s.vals[p] == -1 {
			s.conflict = append(s.conflict, p)
		}
	}
}

// explainCard appends to dst the false literals that forced a literal at
// trail position pos through card k: the negated condition and enough
// members assigned before pos.
func (s *Solver) explainCard(dst []Lit, k, kind uint32, pos int32) []Lit {
	c := &s.cards[k]
	if c.cond != 0 && (kind == kindCardTrue || kind == kindCardFalse) {
		dst = append(dst, c.cond^1)
	}
	var want int32
	needTrue := kind == kindCardFalse || kind == kindCardCondUp
	switch kind {
	case kindCardFalse:
		want = c.upper
	case kindCardCondUp:
		want = c.upper + 1
	case kindCardTrue:
		want = c.n - c.lower
	case kindCardCondLow:
		want = c.n - c.lower + 1
	}
	for _, p := range s.cardLits[c.start : c.start+uint32(c.n)] {
		if want == 0 {
			break
		}
		val := s.vals[p]
		if val == 0 || s.trailPos[p>>1] >= pos {
			continue
		}
		if needTrue && val == 1 {
			dst = append(dst, p^1)
			want--
		} else if !needTrue && val == -1 {
			dst = append(dst, p)
			want--
		}
	}
	return dst
}

// indexCard adds the occurrences of card k to cardOcc.
func (s *Solver) indexCard(k uint32) {
	c := &s.cards[k]
	for _, p := range s.cardLits[c.start : c.start+uint32(c.n)] {
		if c.upper < c.n {
			s.cardOcc[p] = append(s.cardOcc[p], k<<2|occTrue)
		}
		if c.lower > 0 {
			s.cardOcc[p^1] = append(s.cardOcc[p^1], k<<2|occFalse)
		}
	}
	if c.cond != 0 {
		s.cardOcc[c.cond] = append(s.cardOcc[c.cond], k<<2|occCond)
	}
}

// indexCards builds cardOcc for every card in one allocation (end of New).
func (s *Solver) indexCards() {
	count := make([]uint32, len(s.cardOcc))
	for k := range s.cards {
		c := &s.cards[k]
		for _, p := range s.cardLits[c.start : c.start+uint32(c.n)] {
			if c.upper < c.n {
				count[p]++
			}
			if c.lower > 0 {
				count[p^1]++
			}
		}
		if c.cond != 0 {
			count[c.cond]++
		}
	}
	total := 0
	for _, n := range count {
		total += int(n)
	}
	buf := make([]uint32, total)
	off := 0
	for i, n := range count {
		s.cardOcc[i] = buf[off : off : off+int(n)]
		off += int(n)
	}
	for k := range s.cards {
		s.indexCard(uint32(k))
	}
}

// dropCards removes the cards from index base on and their members from
// cardLits[litsBase:], with their occurrences. Called at level 0 once the
// cards can no longer propagate (their conditions are false for good).
func (s *Solver) dropCards(base, litsBase int) {
	if base >= len(s.cards) {
		return
	}
	keep := func(p Lit) {
		occ := s.cardOcc[p]
		j := 0
		for _, o := range occ {
			if int(o>>2) >= base {
				continue
			}
			occ[j] = o
			j++
		}
		s.cardOcc[p] = occ[:j]
	}
	for _, p := range s.cardLits[litsBase:] {
		keep(p)
		keep(p ^ 1)
	}
	for _, c := range s.cards[base:] {
		if c.cond != 0 {
			keep(c.cond)
		}
	}
	s.cards = s.cards[:base]
	s.cardLits = s.cardLits[:litsBase]
}
