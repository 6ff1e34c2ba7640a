package encode

import (
	"context"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// trapOptions make neighbourhood search the only improvement phase, with
// small budgets, so that it stalls in a local optimum of a small term.
func trapOptions(seed int64, horizon int) OptimizeOptions {
	// noFloor: a counting bound that meets a stalled incumbent would end
	// the search before the restarts are seen.
	return OptimizeOptions{Seed: seed, GlobalConflicts: -1, LocalShare: -1, StepConflicts: 200, MaxStall: 25, Horizon: horizon, noFloor: true}
}

// trapTerm is the trap term of the tests below (skipped in -short runs)
// and its reference optimisation, which proves its optimum.
func trapTerm(t *testing.T) (*timetable.Term, *OptimizeResult) {
	t.Helper()
	if testing.Short() {
		t.Skip("several optimisations of a 12-section term")
	}
	term := samples.Generate(samples.Config{Sections: 12, Seed: 1})
	ref, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, LocalShare: -1})
	require.NoError(t, err)
	require.True(t, ref.Proven, "the reference run proves its optimum (cost %v, bound %v)", ref.Total, ref.Bound)
	return term, ref
}

// TestRestartsLeaveTheTrap: on a small generated term (invented names,
// samples.Generate) plain neighbourhood search stalls above the optimum
// for some seeds, and with restarts every seed reaches it. The optimum is
// proven by the whole-term phase (model-improving search with core-guided
// bounds, checked against brute force in TestOptimizeAgainstBruteForce):
// its cost equals its lower bound.
func TestRestartsLeaveTheTrap(t *testing.T) {
	term, ref := trapTerm(t)
	stalled := 0
	for seed := int64(1); seed <= 3; seed++ {
		plain, err := Optimize(context.Background(), term, trapOptions(seed, 0))
		require.NoError(t, err)
		checkOptimized(t, term, nil, plain)
		require.Zero(t, plain.Restarts)
		assert.Equal(t, "no improvement", plain.Stopped)
		if compareLevels(plain.Total, ref.Total) > 0 {
			stalled++
		}
		res, err := Optimize(context.Background(), term, trapOptions(seed, 12))
		require.NoError(t, err)
		checkOptimized(t, term, nil, res)
		assert.Equal(t, 12, res.Restarts, "seed %d", seed)
		assert.Equal(t, ref.Total, res.Total, "seed %d: restarts reach the proven optimum", seed)
		assert.LessOrEqual(t, compareLevels(res.Total, plain.Total), 0, "seed %d: restarts start from the incumbent", seed)
	}
	require.Positive(t, stalled, "the term is no trap: every seed found the optimum without restarts")
}

// TestRestartsDeterministic: the same seed, one thread and a run that
// ends by itself (restarts counted by Horizon) give the same timetable.
func TestRestartsDeterministic(t *testing.T) {
	term := samples.Generate(samples.Config{Sections: 12, Seed: 1})
	opt := trapOptions(2, 3)
	opt.MaxStall = 10
	a, err := Optimize(context.Background(), term, opt)
	require.NoError(t, err)
	b, err := Optimize(context.Background(), term, opt)
	require.NoError(t, err)
	checkOptimized(t, term, nil, a)
	assert.Equal(t, 3, a.Restarts)
	assert.Equal(t, a.Steps, b.Steps)
	assert.Equal(t, a.Restarts, b.Restarts)
	assert.Equal(t, a.Total, b.Total)
	assert.Equal(t, a.Schedule.Placements, b.Schedule.Placements)
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, b.Schedule)))
}

// TestTrapWithDefaults: the same trap term with the default settings and
// a deadline (warm-up, local search, neighbourhood turns, restarts)
// reaches the proven optimum for every seed and ends there, the proof
// being the bound meeting the cost.
func TestTrapWithDefaults(t *testing.T) {
	term, ref := trapTerm(t)
	for seed := int64(1); seed <= 3; seed++ {
		ctx, cancel := context.WithTimeout(context.Background(), 2*time.Minute)
		res, err := Optimize(ctx, term, OptimizeOptions{Seed: seed})
		cancel()
		require.NoError(t, err)
		checkOptimized(t, term, nil, res)
		assert.Equal(t, ref.Total, res.Total, "seed %d", seed)
		assert.True(t, res.Proven, "seed %d: bound %v", seed, res.Bound)
		assert.Equal(t, "optimal", res.Stopped, "seed %d", seed)
	}
}
