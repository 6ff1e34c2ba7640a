package encode

import (
	"context"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestExplainSelectors: in Explain mode every requirement group is switched
// by its selector. Assuming all of them reproduces the normal outcome; the
// engine's core names groups whose conflict is real; dropping one of them
// makes the term feasible.
func TestExplainSelectors(t *testing.T) {
	term := newTerm(1, 2).room("R1", 30).room("R2", 30).
		section("A", staffOf("T")).section("B", staffOf("T")).
		unavailable(timetable.WhoStaff, "T", time.Monday, 9, 10).t
	p, cat, err := Compile(term, Options{Explain: true})
	if err != nil {
		t.Fatal(err)
	}
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	s.Assume(cat.Selectors()...)
	if st := s.Solve(context.Background()); st != solver.Unsatisfiable {
		t.Fatalf("all requirements: %v, want unsatisfiable", st)
	}
	core := s.Core(nil)
	kinds := map[string]bool{}
	for _, l := range core {
		g, ok := cat.GroupOf(l.Atom())
		if !ok {
			t.Fatalf("core literal %d is not a selector", l)
		}
		kinds[g.Kind] = true
	}
	if !kinds[KindStaffAvailability] || !kinds[KindStaffNoOverlap] {
		t.Fatalf("core kinds %v, want staff availability and staff no-overlap", kinds)
	}
	// Re-solving with the core alone is unsatisfiable.
	s.Assume(core...)
	if st := s.Solve(context.Background()); st != solver.Unsatisfiable {
		t.Fatalf("core alone: %v, want unsatisfiable", st)
	}
	// Dropping the availability group makes it feasible.
	var assume []solver.Lit
	for _, g := range cat.Groups {
		if g.Kind == KindStaffAvailability {
			assume = append(assume, solver.Neg(g.Selector))
		} else {
			assume = append(assume, solver.Pos(g.Selector))
		}
	}
	s.Assume(assume...)
	if st := s.Solve(context.Background()); st != solver.Satisfiable {
		t.Fatalf("without availability: %v, want satisfiable", st)
	}
	if err := solver.Verify(p, s.Model(nil)); err != nil {
		t.Fatal(err)
	}
}

// TestExplainAgreesWithNormal: on random tiny terms, an Explain-mode program
// with every selector assumed is feasible exactly when the normal program
// is.
func TestExplainAgreesWithNormal(t *testing.T) {
	rng := newRand(21)
	n := 60
	if testing.Short() {
		n = 20
	}
	for i := 0; i < n; i++ {
		term := randomTinyTerm(rng)
		normal := solveEngine(t, term)
		p, cat, err := Compile(term, Options{Explain: true})
		if err != nil {
			t.Fatal(err)
		}
		s, err := solver.New(p, solver.DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		s.Assume(cat.Selectors()...)
		st := s.Solve(context.Background())
		if st == solver.Satisfiable {
			if err := solver.Verify(p, s.Model(nil)); err != nil {
				t.Fatal(err)
			}
		}
		// The explain program has no lazy room families, so it may
		// be satisfiable where rooms run short; never the reverse.
		if normal.feasible && st != solver.Satisfiable {
			t.Fatalf("instance %d: normal feasible, explain %v\n%s", i, st, describeTerm(term))
		}
		if !normal.feasible && st == solver.Satisfiable {
			// Only room shortage may explain the difference: decode.
			if _, err := Decode(term, cat, s.Model(nil)); err == nil {
				t.Fatalf("instance %d: normal infeasible, explain finds a timetable\n%s", i, describeTerm(term))
			}
		}
	}
}
