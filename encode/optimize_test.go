package encode

import (
	"context"
	"errors"
	"slices"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// checkResult re-checks an optimisation result from the outside: the
// timetable passes timetable.Check, Total and Cost are timetable.Cost of it,
// and the engine's cost equals the cost without rooms (the third gate).
func checkOptimized(t *testing.T, term *timetable.Term, kept *timetable.Schedule, res *OptimizeResult) {
	t.Helper()
	require.Equal(t, solver.Satisfiable, res.Status)
	hard := timetable.HardViolations(timetable.Check(term, res.Schedule))
	require.Empty(t, hard, "the timetable breaks hard requirements")
	rep := timetable.Cost(term, res.Schedule, kept)
	for i, l := range res.Levels {
		assert.Equal(t, rep.ByLevel[l], res.Total[i], "level %d", l)
	}
	assert.Equal(t, rep.Criteria, res.Cost.Criteria)
	timeRep := TimeCost(term, res.Schedule, kept)
	for k := range timetable.Criteria {
		assert.Equal(t, timeRep.Criteria[k].Cost, res.EngineCost[k], "criterion %s", timetable.Criteria[k].Name)
	}
}

// TestOptimizeAgainstBruteForce compares Optimize with exhaustive search
// over every schedule of random tiny terms. When only time-based criteria
// are on (the engine sees the whole objective), the optimum must be found
// and proven. With room criteria too, the reported bound must never exceed
// the true optimum, the timetable must never beat it, and a proven result
// must equal it.
func TestOptimizeAgainstBruteForce(t *testing.T) {
	n := 60
	if testing.Short() {
		n = 16
	}
	rng := newRand(bruteSoftSeed)
	exact, withRooms, hit := 0, 0, 0
	for i := 0; i < n; i++ {
		timeOnly := i%2 == 0
		term := randomSoftTerm(rng, timeOnly)
		var kept *timetable.Schedule
		if i%3 == 0 {
			if first, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 5, GlobalConflicts: -1, MaxStall: -1}); err == nil && first.Schedule != nil {
				kept = first.Schedule
				term.Weights[timetable.CritMoved] = timetable.Weight{Weight: 1 + rng.IntN(2), Level: 3}
			}
		}
		want, feasible := bruteOptimum(term, kept)
		res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, Keep: kept, MaxSteps: 30})
		require.NoError(t, err, "instance %d\n%s", i, describeTerm(term))
		if !feasible {
			require.Equal(t, solver.Unsatisfiable, res.Status, "instance %d: brute force finds no timetable\n%s", i, describeTerm(term))
			continue
		}
		checkOptimized(t, term, kept, res)
		require.LessOrEqual(t, slices.Compare(res.Bound, want), 0, "instance %d: bound %v above the optimum %v\n%s", i, res.Bound, want, describeTerm(term))
		require.GreaterOrEqual(t, slices.Compare(res.Total, want), 0, "instance %d: cost %v below the optimum %v", i, res.Total, want)
		if res.Proven {
			require.Equal(t, want, res.Total, "instance %d: proven but not optimal", i)
		}
		if timeOnly && (kept == nil || !hasRooms(kept)) { // the room half of moved meetings depends on rooms
			exact++
			require.True(t, res.Proven, "instance %d: time-only objective not proven (cost %v, bound %v, optimum %v)\n%s", i, res.Total, res.Bound, want, describeTerm(term))
			require.Equal(t, want, res.Total, "instance %d", i)
		} else {
			withRooms++
			if slices.Equal(want, res.Total) {
				hit++
			}
		}
	}
	t.Logf("%d time-only terms proven optimal; %d of %d terms with room criteria at the optimum", exact, hit, withRooms)
}

// bruteSoftSeed seeds the random terms of the brute-force comparisons.
var bruteSoftSeed uint64 = 23

func hasRooms(s *timetable.Schedule) bool {
	for _, p := range s.Placements {
		if p.Room != "" {
			return true
		}
	}
	return false
}

// TestThirdGateOnManyModels enumerates models of random tiny terms and
// requires, for every one that decodes, that the engine's cost of each
// criterion equals timetable.Cost of the timetable without rooms.
func TestThirdGateOnManyModels(t *testing.T) {
	n := 80
	if testing.Short() {
		n = 20
	}
	rng := newRand(bruteSoftSeed + 8)
	models := 0
	for i := 0; i < n; i++ {
		term := randomSoftTerm(rng, i%2 == 0)
		var kept *timetable.Schedule
		if i%2 == 1 {
			if first, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 2, GlobalConflicts: -1, MaxStall: -1}); err == nil && first.Schedule != nil {
				kept = first.Schedule
			}
		}
		p, cat, err := Compile(term, Options{Keep: kept})
		require.NoError(t, err)
		s, err := solver.New(p, solver.DefaultOptions())
		require.NoError(t, err)
		var starts []solver.Atom
		for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
			if cat.AtomInfo(a).Kind == AtomStart {
				starts = append(starts, a)
			}
		}
		full, err := solver.New(p, solver.DefaultOptions())
		require.NoError(t, err)
		s.Enumerate(context.Background(), 30, starts, func(proj []solver.Atom) bool {
			// The projection fixes every start; the rest of the model
			// follows from it.
			for _, a := range proj {
				full.Assume(solver.Pos(a))
			}
			require.Equal(t, solver.Satisfiable, full.Solve(context.Background()))
			model := full.Model(nil)
			require.NoError(t, solver.Verify(p, model))
			sched, err := Decode(term, cat, model)
			var herr *HallError
			var rerr *RoomConflictError
			if errors.As(err, &herr) || errors.As(err, &rerr) {
				return true
			}
			require.NoError(t, err)
			models++
			if err := cat.thirdGate(term, p, model, sched, kept); err != nil {
				t.Fatalf("instance %d: %v\n%s", i, err, describeTerm(term))
			}
			// The engine's own sum per level agrees with the program's.
			eng := cat.EngineCost(p, model)
			byLevel := map[int]int64{}
			for k, c := range timetable.Criteria {
				_, l := term.CriterionWeight(c.Name)
				byLevel[l] += eng[k]
			}
			for li, l := range solver.Levels(p) {
				assert.Equal(t, solver.Cost(p, model)[li], byLevel[l], "level %d", l)
			}
			return true
		})
	}
	t.Logf("%d models checked", models)
	require.Greater(t, models, n)
}

// TestOptimizeDemo runs the whole pipeline on the demo with a step limit:
// every gate holds, the result is reproducible, and the bound is below the
// cost.
func TestOptimizeDemo(t *testing.T) {
	term := samples.Demo()
	opts := OptimizeOptions{Seed: 3, MaxSteps: 6}
	res, err := Optimize(context.Background(), term, opts)
	require.NoError(t, err)
	checkOptimized(t, term, nil, res)
	assert.LessOrEqual(t, slices.Compare(res.Bound, res.Total), 0)
	assert.NotEmpty(t, res.History)
	again, err := Optimize(context.Background(), term, opts)
	require.NoError(t, err)
	assert.Equal(t, res.Schedule.Placements, again.Schedule.Placements, "same seed, same timetable")
	assert.Equal(t, res.Total, again.Total)
}

// TestOptimizeCancelled: a context that ends before the search finishes
// still yields the best verified timetable found so far; one that ends
// before anything is found yields Unknown.
func TestOptimizeCancelled(t *testing.T) {
	term := samples.Demo()
	ctx, cancel := context.WithCancel(context.Background())
	var got *Progress
	res, err := Optimize(ctx, term, OptimizeOptions{Seed: 1, Progress: func(p Progress) {
		if p.Cost != nil && got == nil {
			got = &p
			cancel() // as Ctrl-C would, right after the first timetable
		}
	}})
	require.NoError(t, err)
	require.NotNil(t, got)
	checkOptimized(t, term, nil, res)
	assert.Equal(t, "interrupted", res.Stopped)

	done, stop := context.WithCancel(context.Background())
	stop()
	res, err = Optimize(done, term, OptimizeOptions{Seed: 1})
	require.NoError(t, err)
	assert.Equal(t, solver.Unknown, res.Status)
	assert.Nil(t, res.Schedule)

	short, cancel2 := context.WithTimeout(context.Background(), 2*time.Second)
	defer cancel2()
	res, err = Optimize(short, term, OptimizeOptions{Seed: 1})
	require.NoError(t, err)
	checkOptimized(t, term, nil, res) // the demo's first timetable comes well within the limit
}

// TestOptimizeInfeasible: a term without timetables is reported as such.
func TestOptimizeInfeasible(t *testing.T) {
	b := newTerm(1, 1).room("R1", 30)
	b.section("A", staffOf("T1")).section("B", staffOf("T1"))
	res, err := Optimize(context.Background(), b.t, OptimizeOptions{Seed: 1})
	require.NoError(t, err)
	assert.Equal(t, solver.Unsatisfiable, res.Status)
	assert.Nil(t, res.Schedule)
}
