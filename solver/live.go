package solver

import (
	"fmt"
	"math"
	"slices"
)

// A live solver grows between searches: clauses, cardinality bounds and
// weighted sums are added at decision level 0 with the same propagators
// (and the same explanations for conflict analysis) as the constraints New
// builds, and AddAtoms makes free atoms for activation literals. Every
// addition is permanent; a contradiction makes every later search
// Unsatisfiable. The Add methods are called between searches, never from
// an Enumerate, Optimize or progress callback (they return the solver to
// level 0).

// AddClause adds the permanent clause lits (Pos(a): a true, Neg(a): a
// false) over atoms of the program or made by AddAtoms, for example to block
// a model. Call it between searches; an empty clause makes every
// later search Unsatisfiable. It returns an error wrapping ErrProgram when a
// literal names no atom, and then adds nothing.
func (s *Solver) AddClause(lits ...Lit) error {
	if err := s.checkLits("AddClause", "literal", lits); err != nil {
		return err
	}
	s.cancelUntil(0)
	s.addClauseLevel0(append([]Lit(nil), lits...))
	return nil
}

// AddBound adds the permanent cardinality constraint lower <=
// #true(lits) <= upper, active when every literal of cond holds, exactly as
// Program.AddBound does before New: lower or upper may be NoBound, a
// literal listed twice counts once, and an empty cond means always active.
// It is propagated natively (cardinality.go). It returns an error wrapping
// ErrProgram, and adds nothing, when a literal names no atom of the program
// or of AddAtoms, a limit is below NoBound, or lower exceeds upper. On a
// solver that is already unsatisfiable it does nothing and returns nil.
// Call it between searches.
//
// A cond of two or more literals gets a fresh internal variable defined as
// their conjunction (not shared between calls).
func (s *Solver) AddBound(lits []Lit, lower, upper int, cond ...Lit) error {
	if err := s.checkLits("AddBound", "element", lits); err != nil {
		return err
	}
	if err := s.checkLits("AddBound", "condition", cond); err != nil {
		return err
	}
	if lower < NoBound || upper < NoBound {
		return fmt.Errorf("%w: AddBound: limits %d..%d; a limit is NoBound (-1) or at least 0", ErrProgram, lower, upper)
	}
	if lower != NoBound && upper != NoBound && lower > upper {
		return fmt.Errorf("%w: AddBound: lower limit %d exceeds upper limit %d; swap or correct them", ErrProgram, lower, upper)
	}
	s.cancelUntil(0)
	c, ok := s.condLit(cond)
	if ok {
		s.addCard(lits, lower, upper, c)
	}
	return nil
}

// AddWeightSum adds the permanent constraint sum(weights[i] * [lits[i]
// true]) <= upper, active when every literal of cond holds. Weights may have
// any sign (w on p is rewritten as -w on not p plus the constant w) and a
// literal listed twice has its weights added; it is propagated by the
// weighted-sum propagator that optimisation uses (weightsum.go). It returns
// an error wrapping ErrProgram, and adds nothing, when a literal names no
// atom of the program or of AddAtoms, the slices differ in length, or the
// weights and upper add up beyond the range of int64. On a solver that is
// already unsatisfiable it does nothing and returns nil. Call it between
// searches.
func (s *Solver) AddWeightSum(lits []Lit, weights []int64, upper int64, cond ...Lit) error {
	if len(weights) != len(lits) {
		return fmt.Errorf("%w: AddWeightSum: %d literals but %d weights; give one weight per literal", ErrProgram, len(lits), len(weights))
	}
	if err := s.checkLits("AddWeightSum", "element", lits); err != nil {
		return err
	}
	if err := s.checkLits("AddWeightSum", "condition", cond); err != nil {
		return err
	}
	ls := make([]Lit, 0, len(lits))
	ws := make([]int64, 0, len(lits))
	bound, total := upper, int64(0) // positive form: sum(ws over true ls) <= bound; total = sum(ws)
	over := false
	for i, p := range lits {
		w := weights[i]
		switch {
		case w == 0:
			continue
		case w < 0:
			if w == math.MinInt64 {
				over = true
				break
			}
			p, w = p^1, -w
			if bound > math.MaxInt64-w {
				over = true
			}
			bound += w
		}
		if total > math.MaxInt64-w {
			over = true
		}
		total += w
		ls = append(ls, p)
		ws = append(ws, w)
	}
	if over {
		return fmt.Errorf("%w: AddWeightSum: the weights and the upper limit add up beyond the range of int64; scale them down", ErrProgram)
	}
	s.cancelUntil(0)
	if !s.ok || total <= bound {
		return nil // unsatisfiable already, or the sum can never exceed the limit
	}
	c, ok := s.condLit(cond)
	if ok {
		s.addSum(ls, ws, bound, c)
	}
	return nil
}

// AddAtoms makes n new atoms without rules, free to take either value (as
// under a choice rule "{a}."), and returns the first: they are
// first..first+n-1. They may be used in clauses, bounds, sums, assumptions,
// SetPhase, Value and Enumerate projections, typically as activation
// literals (a clause "not act ∨ C" holds only while act is assumed; the
// clause "not act" retires it). They are numbered after the engine's
// internal variables, are not counted by NumAtoms and not listed by Model.
// It returns 0 when n < 1. Call it between searches.
func (s *Solver) AddAtoms(n int) Atom {
	if n < 1 {
		return 0
	}
	s.cancelUntil(0)
	s.reserve(s.numVars + n + 1)
	first := Atom(s.numVars + 1)
	for range n {
		s.newVar()
	}
	for len(s.added) <= s.numVars {
		s.added = append(s.added, len(s.added) >= int(first))
	}
	return first
}

// checkLits returns an error wrapping ErrProgram when a literal of lits
// names no atom; call and what name the method and the kind of literal.
func (s *Solver) checkLits(call, what string, lits []Lit) error {
	for _, l := range lits {
		if !s.isAtom(l.Atom()) {
			return fmt.Errorf("%w: %s: %s refers to atom %d, which is neither an atom of the program (it has %d) nor one made by AddAtoms",
				ErrProgram, call, what, l.Atom(), s.numAtoms)
		}
	}
	return nil
}

// condLit returns a literal that holds iff every literal of cond holds (0
// for the empty conjunction), adding at level 0 a fresh variable defined by
// clauses when cond has two or more distinct literals. ok is false when cond
// can never hold (it contains a literal and its complement) or the solver is
// unsatisfiable.
func (s *Solver) condLit(cond []Lit) (Lit, bool) {
	if !s.ok {
		return 0, false
	}
	norm, taut := normalize(slices.Clone(cond))
	switch {
	case taut:
		return 0, false
	case len(norm) == 0:
		return 0, true
	case len(norm) == 1:
		return norm[0], true
	}
	v := Pos(Atom(s.newVar()))
	for _, l := range norm { // v -> l for each l
		s.addClauseLevel0([]Lit{v ^ 1, l})
	}
	all := []Lit{v} // l1 ∧ ... ∧ lm -> v
	for _, l := range norm {
		all = append(all, l^1)
	}
	s.addClauseLevel0(all)
	return v, true
}
