package improve

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestRunEveryAcceptedMove runs the annealer with a hook that compares the
// running cost with timetable.Cost and checks the timetable with
// timetable.Check after every accepted move, then checks that the result's
// cost is timetable.Cost of the returned timetable and no worse than the
// start.
func TestRunEveryAcceptedMove(t *testing.T) {
	cases := []struct {
		name  string
		cfg   samples.Config
		moves int64
		keep  bool
	}{
		{"demo", samples.DemoConfig, 4000, false},
		{"demo kept", samples.DemoConfig, 3000, true},
		{"small seed 3", samples.Config{Sections: 20, Seed: 3}, 20000, false},
		{"small seed 5", samples.Config{Sections: 30, Seed: 5, Days: 4, PeriodsPerDay: 6}, 20000, true},
		{"small seed 9", samples.Config{Sections: 15, Seed: 9, Weeks: 2}, 20000, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(tc.cfg)
			var kept *timetable.Schedule
			if tc.keep {
				// Start elsewhere so that moved meetings have cost to lose.
				kept = wit
				pre, err := Run(context.Background(), term, wit, nil, Options{Seed: 9, MaxMoves: 3000})
				require.NoError(t, err)
				wit = pre.Best
			}
			accepted := 0
			var lastBest timetable.CostReport
			opts := Options{Seed: 4, MaxMoves: tc.moves, StepsPerTemp: 200,
				OnBest: func(_ *timetable.Schedule, c timetable.CostReport) { lastBest = c },
				onAccept: func(x *State) {
					accepted++
					requireSameCost(t, x, kept, accepted)
				}}
			res, err := Run(context.Background(), term, wit, kept, opts)
			require.NoError(t, err)
			require.Positive(t, accepted)
			require.Empty(t, timetable.HardViolations(timetable.Check(term, res.Best)))
			want := timetable.Cost(term, res.Best, kept)
			require.Equal(t, want.ByLevel, res.Cost.ByLevel)
			start := timetable.Cost(term, wit, kept)
			require.False(t, lexLess(start.ByLevel, res.Cost.ByLevel), "the result is worse than the start")
			if res.Stats.Improvements > 0 {
				require.Equal(t, want.ByLevel, lastBest.ByLevel, "the last best reported is not the result")
				require.Equal(t, want.Criteria, lastBest.Criteria)
			}
			if res.Stats.Optimal {
				for _, c := range res.Cost.ByLevel {
					require.Zero(t, c, "stopped as optimal with cost left")
				}
			} else {
				require.Equal(t, tc.moves, res.Stats.Tried, "stopped before the move limit")
			}
			t.Logf("start %v best %v, %d accepted, %d improvements", start.ByLevel, res.Cost.ByLevel, accepted, res.Stats.Improvements)
		})
	}
}

// lexLess compares two level maps lexicographically, highest level first.
func lexLess(a, b map[int]int64) bool {
	levels := timetable.CostReport{ByLevel: a}.Levels()
	for _, l := range levels {
		if a[l] != b[l] {
			return a[l] < b[l]
		}
	}
	return false
}

// TestRunDeterministic runs twice with one seed and move limit and gets
// the same timetable; another seed takes another path.
func TestRunDeterministic(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.DemoConfig)
	run := func(seed uint64) Result {
		res, err := Run(context.Background(), term, wit, nil, Options{Seed: seed, MaxMoves: 30000})
		require.NoError(t, err)
		return res
	}
	a, b, c := run(7), run(7), run(8)
	require.Equal(t, a.Best, b.Best)
	require.Equal(t, a.Stats.Accepted, b.Stats.Accepted)
	require.NotEqual(t, a.Stats.Accepted, c.Stats.Accepted, "two seeds made the same number of accepted moves")
}

// TestRunStopsOnlyAtTheDeadline checks that a cancelled context ends the
// run and that a run with time left keeps going (it tries far more moves
// than one cooling cycle).
func TestRunStopsOnlyAtTheDeadline(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.Config{Sections: 10, Seed: 2})
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	res, err := Run(ctx, term, wit, nil, Options{})
	require.NoError(t, err)
	require.LessOrEqual(t, res.Stats.Tried, int64(1))
	res, err = Run(context.Background(), term, wit, nil, Options{MaxMoves: 200000, StepsPerTemp: 1000, MinTemp: 0.5, InitialTemp: 5})
	require.NoError(t, err)
	require.False(t, res.Stats.Optimal, "this term was expected to keep some cost")
	require.Equal(t, int64(200000), res.Stats.Tried)
	require.Greater(t, res.Stats.Cycles, 1, "the search did not reheat")
}

// TestRunStopsAtZero checks that a run whose best reaches cost 0 on every
// level stops and says so, and that the cost is really 0.
func TestRunStopsAtZero(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.Config{Sections: 15, Seed: 9, Weeks: 2})
	res, err := Run(context.Background(), term, wit, nil, Options{Seed: 4, MaxMoves: 2_000_000})
	require.NoError(t, err)
	require.True(t, res.Stats.Optimal)
	require.Less(t, res.Stats.Tried, int64(2_000_000))
	for l, c := range timetable.Cost(term, res.Best, nil).ByLevel {
		require.Zero(t, c, "level %d", l)
	}
}

// TestRunRejectsBadInput covers the error paths.
func TestRunRejectsBadInput(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.Config{Sections: 10, Seed: 2})
	_, err := Run(context.Background(), term, wit, nil, Options{Cooling: 1.5})
	require.Error(t, err)
	bad := &timetable.Schedule{Placements: append([]timetable.Placement(nil), wit.Placements...)}
	bad.Placements[1] = bad.Placements[0]
	_, err = Run(context.Background(), term, bad, nil, Options{})
	require.ErrorContains(t, err, "hard requirement")
}
