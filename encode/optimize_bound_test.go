package encode

import (
	"context"
	"errors"
	"os"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// TestOptimizeStartsFromTheCountingBound: on the public ITC-2007 instance
// comp01 (shared data, skipped when absent), whose largest course is
// larger than every room, the optimiser's bound is at least
// timetable.CountingBound without any engine bound (the whole-term phase
// is off), the timetable costs at least the bound, and the bound is at most
// the best known cost of best-known.csv (the competition's results; a
// bound above it would be wrong). The time part is not claimed proven by
// the room floor.
func TestOptimizeStartsFromTheCountingBound(t *testing.T) {
	dir := benchfmt.DataDir("itc2007", ".ctt")
	term, err := benchfmt.OpenCTT(dir, "comp01")
	if dir == "" || errors.Is(err, os.ErrNotExist) {
		t.Skip("shared ITC-2007 data not found")
	}
	require.NoError(t, err)
	best, err := benchfmt.OpenCTTBest(dir)
	require.NoError(t, err)

	floor := timetable.CountingBound(term, nil).ByLevel[benchfmt.CTTLevel]
	require.Positive(t, floor, "comp01 has a course larger than every room")
	// A short run: only its bound and gates matter here.
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Second)
	defer cancel()
	res, err := Optimize(ctx, term, OptimizeOptions{Seed: 1, GlobalConflicts: -1, LocalShare: -1, MaxStall: 5})
	require.NoError(t, err)
	require.NotNil(t, res.Schedule)
	require.Len(t, res.Bound, 1)
	assert.Equal(t, floor, res.Bound[0], "no engine bound: the counting bound")
	assert.GreaterOrEqual(t, res.Total[0], res.Bound[0])
	assert.LessOrEqual(t, res.Bound[0], int64(best["comp01"].Best))
	assert.Equal(t, res.Total[0] == res.Bound[0], res.Proven)
	if res.EngineCost != nil && res.Total[0] > 0 {
		// The floor is room capacity alone: it proves nothing about the
		// time part unless that part is at the engine's (zero) bound.
		assert.Equal(t, res.Total[0]-roomPartOf(res) == 0, res.TimeProven)
	}
}

// roomPartOf is the cost of the room criteria in res.
func roomPartOf(res *OptimizeResult) int64 {
	var n int64
	for _, c := range res.Cost.Criteria {
		for _, r := range roomCriteria {
			if c.Name == r {
				n += c.Cost
			}
		}
	}
	return n
}
