package encode

import (
	"context"
	"errors"
	"testing"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
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

// TestPatternOptimumEqualsBrute: on seeded random pattern terms Optimize
// (no deadline: it ends by proof or stall) returns a timetable that passes
// timetable.Check, whose cost (time choice + room choice, both at level 1)
// equals the least cost found by brute-force enumeration, and that it
// proves optimal.
func TestPatternOptimumEqualsBrute(t *testing.T) {
	n := 0
	for seed := int64(1); seed <= 40; seed++ {
		tm := patternTerm(seed, 6, 4, 3)
		want, feasible := bruteBest(tm)
		if !feasible {
			continue
		}
		res, err := Optimize(context.Background(), tm, OptimizeOptions{Seed: seed, MaxStall: 20})
		if err != nil {
			t.Fatalf("seed %d: %v", seed, err)
		}
		if res.Status != solver.Satisfiable {
			t.Fatalf("seed %d: %v", seed, res.Status)
		}
		if hard := timetable.HardViolations(timetable.Check(tm, res.Schedule)); len(hard) > 0 {
			t.Fatalf("seed %d: %v", seed, hard)
		}
		got := res.Cost.ByLevel[1]
		if got != int64(want) {
			t.Fatalf("seed %d: cost %d, brute force %d", seed, got, want)
		}
		if !res.Proven {
			t.Errorf("seed %d: optimum %d not proven (bound %v)", seed, got, res.Bound)
		}
		if res.Local.Skipped == "" {
			t.Errorf("seed %d: local search should say it was skipped", seed)
		}
		n++
	}
	if n < 10 {
		t.Fatalf("only %d feasible terms", n)
	}
}

// TestPatternLazyRoomsAgreeWithBrute: with every room checked lazily
// (budget 0: Decode finds room clashes and the search forbids them), Solve
// still finds a timetable exactly when brute force does, passing
// timetable.Check, and Optimize still reaches the brute-force optimum.
func TestPatternLazyRoomsAgreeWithBrute(t *testing.T) {
	saved := lazyRoomBudget
	lazyRoomBudget = 0
	defer func() { lazyRoomBudget = saved }()
	lazy := 0
	for seed := int64(1); seed <= 40; seed++ {
		tm := patternTerm(seed, 7, 4, 2)
		want, feasible := bruteBest(tm)
		res, err := Solve(context.Background(), tm, SolveOptions{Seed: seed})
		var cerr CompileError
		if errors.As(err, &cerr) && !feasible {
			continue
		}
		if err != nil {
			t.Fatalf("seed %d: %v", seed, err)
		}
		lazy += res.Size.LazyRooms
		if (res.Status == solver.Satisfiable) != feasible {
			t.Fatalf("seed %d: engine %v, brute force feasible=%v", seed, res.Status, feasible)
		}
		if !feasible {
			continue
		}
		if hard := timetable.HardViolations(timetable.Check(tm, res.Schedule)); len(hard) > 0 {
			t.Fatalf("seed %d: %v", seed, hard)
		}
		opt, err := Optimize(context.Background(), tm, OptimizeOptions{Seed: seed, MaxStall: 20})
		if err != nil {
			t.Fatalf("seed %d: %v", seed, err)
		}
		if got := opt.Cost.ByLevel[1]; got != int64(want) || !opt.Proven {
			t.Fatalf("seed %d: cost %d (proven %v), brute force %d", seed, got, opt.Proven, want)
		}
	}
	if lazy == 0 {
		t.Fatal("no room was checked lazily")
	}
}
