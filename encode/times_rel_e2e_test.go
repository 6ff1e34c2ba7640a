package encode

import (
	"context"
	"math/rand"
	"testing"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// withRandomRelations adds n relation rows of random kinds over two or
// three random sections of term, hard or soft (weight 1..4).
func withRandomRelations(term *timetable.Term, rng *rand.Rand, n int, hard bool) {
	for r := 0; r < n; r++ {
		k := timetable.RelationKinds[rng.Intn(len(timetable.RelationKinds))].Kind
		rel := timetable.Relation{Kind: k, Hard: hard, Src: timetable.Source{Sheet: "Relations", Row: r + 2}}
		for _, s := range rng.Perm(len(term.Sections))[:2+rng.Intn(2)] {
			rel.Sections = append(rel.Sections, term.Sections[s].ID)
		}
		if !hard {
			rel.Weight = 1 + rng.Intn(4)
		}
		switch k.Params() {
		case 1:
			rel.N = []int{1, 2, 90, 150, 240}[rng.Intn(5)]
		case 2:
			rel.N, rel.M = []int{0, 1, 120}[rng.Intn(3)], []int{0, 15}[rng.Intn(2)]
		}
		term.Relations = append(term.Relations, rel)
	}
}

// TestPatternRelationsSolve: Solve on random pattern terms with hard rows
// of every kind; each timetable found passes timetable.Check (solveEngine).
func TestPatternRelationsSolve(t *testing.T) {
	found := 0
	for seed := int64(1); seed <= 20; seed++ {
		term := patternTerm(seed, 8, 5, 4)
		withRandomRelations(term, rand.New(rand.NewSource(seed)), 3, true)
		if _, _, err := Compile(term, Options{}); err != nil {
			continue // a random section with no possible time or room
		}
		if solveEngine(t, term).feasible {
			found++
		}
	}
	if found == 0 {
		t.Fatal("no term had a timetable: the test checks nothing")
	}
}

// TestPatternSoftRelationsOptimize: Optimize on random pattern terms with
// soft rows of every kind; the engine's "soft relations" cost of the best
// timetable equals timetable.Cost's on it (the third gate for this
// criterion) and the reported cost is timetable.Cost.
func TestPatternSoftRelationsOptimize(t *testing.T) {
	checked := 0
	for seed := int64(1); seed <= 4; seed++ {
		term := patternTerm(seed, 6, 4, 3)
		withRandomRelations(term, rand.New(rand.NewSource(seed)), 6, false)
		if _, _, err := Compile(term, Options{}); err != nil {
			continue // a random section with no possible time or room
		}
		res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, MaxStall: 3, LocalShare: -1})
		if err != nil {
			t.Fatal(err)
		}
		if res.Status != solver.Satisfiable {
			continue
		}
		checked++
		k := critIndex[timetable.CritSoftRelations]
		want := TimeCost(term, res.Schedule, nil).Criteria[k].Cost
		if res.EngineCost[k] != want {
			t.Fatalf("seed %d: engine soft relations cost %d, timetable.Cost %d", seed, res.EngineCost[k], want)
		}
		if got := timetable.Cost(term, res.Schedule, nil); got.Criteria[k].Cost != res.Cost.Criteria[k].Cost {
			t.Fatalf("seed %d: reported %d, timetable.Cost %d", seed, res.Cost.Criteria[k].Cost, got.Criteria[k].Cost)
		}
	}
	if checked == 0 {
		t.Fatal("no term had a timetable: the test checks nothing")
	}
}
