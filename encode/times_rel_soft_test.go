package encode

import (
	"context"
	"math/rand"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// surrogateTerm is a term with one soft "at most minutes a day" row whose
// sections meet in odd or even weeks only (of 4), so that the row's terms
// are not multiples of the teaching weeks and the exact counter is needed.
func surrogateTerm() *timetable.Term {
	term := relTestTerm(rand.New(rand.NewSource(11)), timetable.MaxDayMinutes, false, 2)
	for s := range term.Sections {
		term.Sections[s].Times = []timetable.TimeChoice{
			{Days: timetable.DaysOf(time.Monday), Start: 9 * 60, Minutes: 75, Weeks: 0b0101},
			{Days: timetable.DaysOf(time.Monday), Start: 11 * 60, Minutes: 105, Weeks: 0b1010},
			{Days: timetable.DaysOf(time.Tuesday), Start: 9 * 60, Minutes: 45, Weeks: 0b0101},
		}
	}
	term.Relations[0].N, term.Relations[0].Weight = 60, 3
	return term
}

// TestCountedExactCounter: with the counter (the default cap) the engine's
// cost of every timetable equals the reference count (times_rel_ref_test.go)
// and timetable.Cost, and the catalog reports an exact objective.
func TestCountedExactCounter(t *testing.T) {
	term := surrogateTerm()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if !cat.Exact() {
		t.Fatal("the counter fits the cap: the objective should be exact")
	}
	counter := 0
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		if strings.HasPrefix(p.Name(a), "sum(relation,") {
			counter++
		}
	}
	if counter == 0 {
		t.Fatal("no counter atoms: the test term should need the weighted counter")
	}
	compareWithReference(t, term)
}

// TestCountedSurrogateStaysSound: beyond the cap the row gets a surrogate;
// the catalog says so, the third gate compares the engine with
// timetable.Cost without that row, and Optimize reports timetable.Cost
// and proves nothing from the engine's bound.
func TestCountedSurrogateStaysSound(t *testing.T) {
	saved := countCap
	countCap = 0
	defer func() { countCap = saved }()
	term := surrogateTerm()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if cat.Exact() {
		t.Fatal("with cap 0 the row should have a surrogate")
	}
	if got := cat.boundOf([]int64{5}); got != nil {
		t.Fatalf("boundOf = %v under a surrogate, want nil", got)
	}
	if n := len(cat.exactTerm(term).Relations); n != 0 {
		t.Fatalf("exactTerm keeps %d rows, want 0", n)
	}
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	soft := critIndex[timetable.CritSoftRelations]
	s.Enumerate(context.Background(), 0, nil, func(model []solver.Atom) bool {
		if c := cat.EngineCost(p, model)[soft]; c != 0 {
			t.Fatalf("the surrogate's weak constraints count %d in EngineCost, want 0", c)
		}
		return true
	})
	res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, MaxStall: 5, LocalShare: -1})
	if err != nil {
		t.Fatal(err)
	}
	if res.Status != solver.Satisfiable {
		t.Fatalf("status %v", res.Status)
	}
	want := timetable.Cost(term, res.Schedule, nil)
	if got := res.Cost.Criterion(timetable.CritSoftRelations).Cost; got != want.Criterion(timetable.CritSoftRelations).Cost {
		t.Fatalf("reported soft relations cost %d, timetable.Cost %d", got, want.Criterion(timetable.CritSoftRelations).Cost)
	}
	if res.Proven && res.Total[0] != 0 {
		t.Fatalf("proven optimal at cost %v under a surrogate objective", res.Total)
	}
}
