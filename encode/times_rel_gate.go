package encode

import (
	"slices"

	"github.com/termwright/termwright/timetable"
)

// relModel is what the catalog keeps of the pattern relations.
type relModel struct {
	// inexact lists the soft counted rows (indexes into Term.Relations)
	// whose weak constraints are a surrogate of their cost (softCounted):
	// the engine's objective does not equal timetable.Cost on them.
	inexact []int
}

// Exact reports whether the engine's weak constraints encode every soft
// criterion of the term exactly (no counted relation row was left to a
// surrogate). When false, the engine's lower bounds say nothing about
// timetable.Cost, so Optimize proves no optimum.
func (c *Catalog) Exact() bool { return len(c.rel.inexact) == 0 }

// exactTerm is the term the third gate compares the engine's cost with:
// t itself, or, when some rows are encoded by a surrogate, a copy without
// those rows (their weak constraints are not counted by EngineCost, and
// the reported cost, timetable.Cost on the whole term, still counts them).
func (c *Catalog) exactTerm(t *timetable.Term) *timetable.Term {
	if c.Exact() {
		return t
	}
	cp := *t
	cp.Relations = nil
	for ri, r := range t.Relations {
		if !slices.Contains(c.rel.inexact, ri) {
			cp.Relations = append(cp.Relations, r)
		}
	}
	return &cp
}

// boundOf is the engine's lower bound lb as a bound on timetable.Cost:
// lb itself, or nil when the objective has a surrogate.
func (c *Catalog) boundOf(lb []int64) []int64 {
	if !c.Exact() {
		return nil
	}
	return lb
}
