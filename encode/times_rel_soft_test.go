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

// unevenWeeksTerm is a term with one soft "at most minutes a day" row whose
// sections meet in odd or even weeks only (of 4), so that the row's terms
// are not multiples of the teaching weeks and the exact counter is needed.
func unevenWeeksTerm() *timetable.Term {
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

// TestCountedExactCounter: with the unary counter (the default cap) the
// engine's cost of every timetable equals the reference count
// (times_rel_ref_test.go) and timetable.Cost.
func TestCountedExactCounter(t *testing.T) {
	term := unevenWeeksTerm()
	p, _, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
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

// TestCountedBinary: with no room for the unary counter (cap 0) the row is
// counted in binary (adders and a long division by the teaching weeks);
// the engine's cost of every timetable still equals the reference count
// and timetable.Cost, and Optimize reaches the reference optimum.
func TestCountedBinary(t *testing.T) {
	saved := countCap
	countCap = 0
	defer func() { countCap = saved }()
	for _, k := range []timetable.RelationKind{timetable.MaxDayMinutes, timetable.MaxBreaks, timetable.MaxBlock} {
		rng := rand.New(rand.NewSource(int64(k)))
		for round := 0; round < 6; round++ {
			term := relTestTerm(rng, k, false, 2+round%2)
			compareWithReference(t, term)
		}
	}
	term := unevenWeeksTerm()
	p, _, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	gates := 0
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		if strings.HasPrefix(p.Name(a), "bit_") {
			gates++
		}
	}
	if gates == 0 {
		t.Fatal("no gate atoms: the row should be counted in binary")
	}
	compareWithReference(t, term)
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
}
