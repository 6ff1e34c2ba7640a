package solver

import (
	"context"
	"slices"
)

// Enumerate calls fn with each stable model under the assumptions set by
// Assume: the true atoms in ascending order, or, when project is not nil,
// only the true atoms of project, and then every call sees a different
// projection. fn may keep the slice; it returns false to stop. limit > 0
// stops after that many models. n is the number of calls made; complete
// reports that every model was found (the search space is exhausted). A
// cancelled ctx or Options.ConflictLimit ends the enumeration early. An
// assumption naming no atom is a misuse: Enumerate then returns 0, false
// without searching and Err returns an error wrapping ErrProgram.
//
// After AddAtoms, models differ by their program atoms (Model): without a
// projection the projection onto every program atom is used, since models
// that differ only in added atoms would otherwise repeat.
//
// Each model is blocked by a clause over its decisions (or its projection),
// guarded by a fresh activation literal that is assumed during the call and
// made false afterwards, so the solver is unchanged for later calls (Eén &
// Sörensson 2003 for activation literals).
func (s *Solver) Enumerate(ctx context.Context, limit int, project []Atom, fn func(model []Atom) bool) (n int, complete bool) {
	assumps, err := s.takeAssumptions("Enumerate")
	if err != nil {
		return 0, false
	}
	if project == nil && len(s.added) > 0 {
		project = make([]Atom, s.numAtoms)
		for i := range project {
			project[i] = Atom(i + 1)
		}
	}
	var proj []Atom
	if project != nil {
		proj = make([]Atom, 0, len(project))
		for _, a := range project {
			if s.isAtom(a) {
				proj = append(proj, a)
			}
		}
		slices.Sort(proj)
		proj = slices.Compact(proj)
	}
	s.cancelUntil(0)
	s.startBudget()
	act := Pos(Atom(s.newVar()))
	user := len(assumps)
	st := s.solve(ctx, append(assumps, act), user)
	var block []Lit
	for st == Satisfiable {
		n++
		var model []Atom
		if proj != nil {
			model = []Atom{}
			for _, a := range proj {
				if s.model[a] {
					model = append(model, a)
				}
			}
		} else {
			model = s.Model(nil)
		}
		if !fn(model) || (limit > 0 && n >= limit) {
			break
		}
		block = append(block[:0], act^1)
		if proj != nil {
			for _, a := range proj {
				if s.model[a] {
					block = append(block, Neg(a))
				} else {
					block = append(block, Pos(a))
				}
			}
		} else {
			for lvl := len(s.assumptions); lvl < s.decisionLevel(); lvl++ {
				block = append(block, s.trail[s.trailLim[lvl]]^1)
			}
		}
		if s.addClauseInSearch(block, false, 0) && !s.handleConflict() {
			st = Unsatisfiable
			break
		}
		st = s.search(ctx)
	}
	s.cancelUntil(0)
	s.addClauseLevel0([]Lit{act ^ 1})
	return n, st == Unsatisfiable
}
