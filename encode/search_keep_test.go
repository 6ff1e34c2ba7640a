package encode

import (
	"context"
	"testing"

	"github.com/termwright/termwright/solver"
)

// TestForbidSparesTheIncumbent: a room cut over the start combination of
// the kept incumbent is refuted by it (it has rooms), so Forbid leaves it
// out and the incumbent stays a model of the program (solver.Verify);
// a cut over another model's starts is still added. (On a 10,000-section
// term an unproved cut once forbade the incumbent, and a neighbourhood
// step built on it failed the verifier.)
func TestForbidSparesTheIncumbent(t *testing.T) {
	rng := newRand(5)
	for i := 0; i < 40; i++ {
		term := randomTinyTerm(rng)
		p, cat, err := Compile(term, Options{HardOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		startsOf := func(model []solver.Atom) []solver.Lit { return notAllStarts(cat, model) }
		x := NewSearch(term, p, cat, SearchOptions{Engine: solver.DefaultOptions()})
		st, model, err := x.Find(context.Background(), nil, func(context.Context, []solver.Atom) error { return nil }, 10)
		if err != nil || st != solver.Satisfiable {
			continue // an infeasible tiny term has no incumbent to keep
		}
		x.Keep(model)
		rules := len(p.Rules)
		x.Forbid(&RoomConflictError{nogoods: [][]solver.Lit{startsOf(model)}}, -1, "test", nil)
		if len(p.Rules) != rules {
			t.Fatalf("term %d: a cut over the incumbent's own starts was added", i)
		}
		if err := solver.Verify(p, model); err != nil {
			t.Fatalf("term %d: the incumbent fails the verifier: %v", i, err)
		}
		other := startsOf(model)[:1]
		if len(other) == 1 {
			other = []solver.Lit{other[0].Not()} // a clause the incumbent satisfies
			x.Forbid(&RoomConflictError{nogoods: [][]solver.Lit{other}}, -1, "test", nil)
			if len(p.Rules) != rules+1 {
				t.Fatalf("term %d: a cut the incumbent satisfies was left out", i)
			}
		}
	}
}

// notAllStarts is the clause "not all of these starts" over a model's
// start atoms: the nogood a room conflict over the model would add.
func notAllStarts(cat *Catalog, model []solver.Atom) []solver.Lit {
	var out []solver.Lit
	for _, a := range model {
		if cat.AtomInfo(a).Kind == AtomStart {
			out = append(out, solver.Neg(a))
		}
	}
	return out
}
