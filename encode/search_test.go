package encode

import (
	"context"
	"testing"

	"github.com/termwright/termwright/solver"
)

// TestSearchCutsReachLiveEngine: cuts written into the program reach the
// live engine without a rebuild. On random tiny terms every combination
// of starts is found once by forbidding each one found (a room-conflict
// cut over its starts), and the count equals the count of the reference
// SAT library (refSolve, github.com/crillab/gophersat) with blocking
// clauses on the program as compiled; every model passes solver.Verify.
func TestSearchCutsReachLiveEngine(t *testing.T) {
	rng := newRand(3)
	total := 0
	for i := 0; i < 300; i++ {
		term := randomTinyTerm(rng)
		p, cat, err := Compile(term, Options{HardOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		q, _, err := Compile(term, Options{HardOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		startsOf := func(model []solver.Atom) []solver.Lit { return notAllStarts(cat, model) }
		x := NewSearch(term, p, cat, SearchOptions{Engine: solver.DefaultOptions()})
		found := 0
		st, _, err := x.Find(context.Background(), nil, func(_ context.Context, model []solver.Atom) error {
			if err := solver.Verify(p, model); err != nil {
				t.Fatalf("term %d: model fails the verifier: %v", i, err)
			}
			found++
			x.Forbid(&RoomConflictError{nogoods: [][]solver.Lit{startsOf(model)}}, -1, "test", nil)
			return errSearchAgain
		}, 100000)
		if err != nil || st != solver.Unsatisfiable {
			t.Fatalf("term %d: Find = %v, %v; want Unsatisfiable once every combination is forbidden", i, st, err)
		}
		var extra [][]solver.Lit
		want := 0
		for {
			model, ok := refSolve(q, extra)
			if !ok {
				break
			}
			want++
			extra = append(extra, startsOf(model))
		}
		if found != want {
			t.Fatalf("term %d: the search found %d combinations of starts, the reference library %d\n%s", i, found, want, describeTerm(term))
		}
		total += found
		if x.Builds() != 1 {
			t.Fatalf("term %d: %d engines built, want 1 (cuts go to the live engine)", i, x.Builds())
		}
	}
	if total == 0 {
		t.Fatal("no term had a timetable: the test checks nothing")
	}
	t.Logf("%d combinations of starts in all", total)
}

// TestSearchFamiliesGoLive: a room family added after the engine was built
// reaches it as native bounds, without a rebuild, and its selector (a fact
// the engine lacks) is added to every model. Every room set of a term
// (the sets of one and two rooms) is added as a family; each model then
// passes solver.Verify on the grown program, and the engine's answer
// agrees with the reference SAT library (refSolve) on that program.
func TestSearchFamiliesGoLive(t *testing.T) {
	rng := newRand(9)
	grown := 0
	for i := 0; i < 60; i++ {
		term := randomTinyTerm(rng)
		p, cat, err := Compile(term, Options{HardOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		x := NewSearch(term, p, cat, SearchOptions{Engine: solver.DefaultOptions()})
		if _, err := x.Solve(context.Background()); err != nil {
			t.Fatal(err)
		}
		n := cat.rooms.n
		herr := &HallError{}
		for a := 0; a < n; a++ {
			for b := a; b < n; b++ {
				set := newRoomSet(n)
				set.add(a)
				set.add(b)
				herr.sets = append(herr.sets, set)
			}
		}
		bounds := len(p.Bounds)
		added := x.AddFamilies(herr)
		st, err := x.Solve(context.Background())
		if err != nil {
			t.Fatal(err)
		}
		if x.Builds() != 1 {
			t.Fatalf("term %d: %d engines built after adding %d families, want 1", i, x.Builds(), added)
		}
		if len(p.Bounds) > bounds {
			grown++
		}
		_, refOK := refSolve(p, nil)
		if (st == solver.Satisfiable) != refOK {
			t.Fatalf("term %d: engine %v, reference library satisfiable=%v\n%s", i, st, refOK, describeTerm(term))
		}
		if st == solver.Satisfiable {
			if err := solver.Verify(p, x.Model()); err != nil {
				t.Fatalf("term %d: model fails the verifier on the grown program: %v", i, err)
			}
		}
	}
	if grown == 0 {
		t.Fatal("no family added a bound: the test checks nothing")
	}
}
