package encode

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestOptimizeWarmStart: with OptimizeOptions.Start and no improvement
// phases, Optimize returns the start itself when it is a timetable of the
// term (its first timetable is the start), and a valid timetable when the
// start names places that are no candidates.
func TestOptimizeWarmStart(t *testing.T) {
	n := 0
	for seed := int64(1); seed <= 12; seed++ {
		tm := patternTerm(seed, 6, 4, 3)
		base, err := Optimize(context.Background(), tm, OptimizeOptions{Seed: seed, MaxStall: 20})
		if err != nil || base.Schedule == nil {
			continue
		}
		opt := OptimizeOptions{Seed: seed + 100, GlobalConflicts: -1, MaxStall: -1, Start: base.Schedule}
		got, err := Optimize(context.Background(), tm, opt)
		require.NoError(t, err)
		require.Equal(t, base.Schedule.Placements, got.Schedule.Placements, "seed %d", seed)
		bad := &timetable.Schedule{Placements: append([]timetable.Placement(nil), base.Schedule.Placements...)}
		bad.Placements[0].Time = 99
		got, err = Optimize(context.Background(), tm, OptimizeOptions{Seed: seed, GlobalConflicts: -1, MaxStall: -1, Start: bad})
		require.NoError(t, err)
		require.NotNil(t, got.Schedule)
		require.Empty(t, timetable.HardViolations(timetable.Check(tm, got.Schedule)))
		n++
	}
	require.Greater(t, n, 5)
}
