package solver

// A reason is a uint32: 0 for decisions and level-0 facts; otherwise the top
// three bits give the kind and the rest a clause offset or constraint index.
const (
	reasonKindShift = 29
	reasonPayload   = 1<<reasonKindShift - 1

	kindClause      = 0 // payload: clause offset; the implied literal is the clause's first (binary: either)
	kindCardTrue    = 1 // member forced true by the lower bound of card payload
	kindCardFalse   = 2 // member forced false by the upper bound of card payload
	kindCardCondLow = 3 // condition forced false: too many members false
	kindCardCondUp  = 4 // condition forced false: too many members true
	kindSumFalse    = 5 // member forced false by weighted sum payload
	kindSumCond     = 6 // condition of weighted sum payload forced false
)

func extReason(kind, k uint32) uint32 { return kind<<reasonKindShift | k }

// reasonLits returns the implication that assigned variable v (which must be
// implied, not a decision): the literal now true first, then literals that
// are false and were assigned before it. Constraint reasons are built on
// first request into explArena and cached until clearExplanations. The
// returned slice is valid until the next call that builds an explanation.
func (s *Solver) reasonLits(v uint32) []Lit {
	r := s.reason[v]
	if r>>reasonKindShift == kindClause {
		lits := s.clauseLits(r)
		if lits[0]>>1 != Lit(v) {
			lits[0], lits[1] = lits[1], lits[0] // binary clause propagated through its second literal
		}
		return lits
	}
	if i := s.explIndex[v]; i != 0 {
		n := uint32(s.explArena[i-1])
		return s.explArena[i : i+n]
	}
	start := len(s.explArena)
	s.explArena = append(s.explArena, 0)
	p := Lit(v) << 1
	if s.vals[p] != 1 {
		p ^= 1
	}
	s.explArena = append(s.explArena, p)
	k := r & reasonPayload
	switch r >> reasonKindShift {
	case kindCardTrue, kindCardFalse, kindCardCondLow, kindCardCondUp:
		s.explArena = s.explainCard(s.explArena, k, r>>reasonKindShift, s.trailPos[v])
	case kindSumFalse, kindSumCond:
		s.explArena = s.explainSum(s.explArena, k, p, s.trailPos[v])
	}
	s.explArena[start] = Lit(len(s.explArena) - start - 1)
	s.explIndex[v] = uint32(start + 1)
	s.explVars = append(s.explVars, v)
	return s.explArena[start+1:]
}

// clearExplanations forgets the cached constraint explanations.
func (s *Solver) clearExplanations() {
	for _, v := range s.explVars {
		s.explIndex[v] = 0
	}
	s.explVars = s.explVars[:0]
	s.explArena = s.explArena[:0]
}
