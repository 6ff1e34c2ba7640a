package encode

import (
	"context"
	"errors"
	"testing"

	"github.com/termwright/termwright/solver"
)

// TestPatternEngineAgreesWithBrute: on seeded random pattern terms the
// engine finds a timetable exactly when brute-force enumeration does, and
// every model it finds passes solver.Verify and decodes to a timetable
// that meets every hard requirement as bruteCheck reads them from the
// definitions.
func TestPatternEngineAgreesWithBrute(t *testing.T) {
	var sat, unsat, cerrs int
	defer func() {
		t.Logf("%d with a timetable, %d without, %d refused at compile time", sat, unsat, cerrs)
		if sat < 10 || unsat+cerrs < 1 {
			t.Errorf("the generator should give both kinds of term")
		}
	}()
	for seed := int64(1); seed <= 60; seed++ {
		tm := patternTerm(seed, 6, 4, 3)
		p, cat, err := Compile(tm, Options{HardOnly: true})
		_, feasible := bruteBest(tm)
		var cerr CompileError
		if errors.As(err, &cerr) && !feasible {
			cerrs++
			continue // a section with no possible time or room: said at compile time
		}
		if err != nil {
			t.Fatalf("seed %d: %v", seed, err)
		}
		opts := solver.DefaultOptions()
		opts.Seed = seed
		s, err := solver.New(p, opts)
		if err != nil {
			t.Fatal(err)
		}
		st := s.Solve(context.Background())
		model := s.Model(nil)
		if (st == solver.Satisfiable) != feasible {
			t.Fatalf("seed %d: engine %v, brute force feasible=%v", seed, st, feasible)
		}
		if st != solver.Satisfiable {
			unsat++
			continue
		}
		sat++
		if err := solver.Verify(p, model); err != nil {
			t.Fatalf("seed %d: %v", seed, err)
		}
		sched, err := Decode(tm, cat, model)
		if err != nil {
			t.Fatalf("seed %d: %v", seed, err)
		}
		if _, probs := bruteCheck(tm, sched); len(probs) > 0 {
			t.Fatalf("seed %d: %v", seed, probs)
		}
	}
}
