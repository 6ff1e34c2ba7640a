package encode

import (
	"context"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestShareBoard: the board keeps the cheapest timetable, offers it only
// to other members and only when it beats theirs, keeps the highest bound,
// and stops the portfolio when a timetable meets the bound.
func TestShareBoard(t *testing.T) {
	stopped := false
	b := &shareBoard{stop: func() { stopped = true }}
	s1 := &timetable.Schedule{Placements: []timetable.Placement{{Section: "A", Meeting: 1, Period: 2}}}
	s2 := &timetable.Schedule{Placements: []timetable.Placement{{Section: "A", Meeting: 1, Period: 3}}}
	b.publish(0, s1, []int64{0, 5})
	got, v, _ := b.offer(0, 0, []int64{0, 9})
	assert.Nil(t, got, "a member's own timetable is not offered back")
	got, _, _ = b.offer(1, 0, []int64{0, 5})
	assert.Nil(t, got, "not better than the member's own")
	got, v1, _ := b.offer(1, 0, []int64{0, 6})
	require.NotNil(t, got)
	assert.Equal(t, s1.Placements, got.Placements)
	got.Placements[0].Period = 7
	assert.Equal(t, 2, s1.Placements[0].Period, "the offer is a copy")
	got, _, _ = b.offer(1, v1, []int64{0, 6})
	assert.Nil(t, got, "nothing new since the last look")
	b.publish(1, s2, []int64{0, 7})
	assert.Equal(t, []int64{0, 5}, b.total, "a dearer timetable is not kept")
	b.publishBound([]int64{0, 3})
	b.publishBound([]int64{0, 2})
	_, _, bound := b.offer(1, v, nil)
	assert.Equal(t, []int64{0, 3}, bound, "the highest bound is kept")
	assert.False(t, stopped)
	b.publish(1, s2, []int64{0, 3})
	assert.True(t, stopped, "a timetable at the bound stops the portfolio")
}

// TestPortfolioShareReachesOptimum: two sharing members on the term of
// TestRestartsLeaveTheTrap return a checked timetable no worse than the
// optimum proven by the whole-term phase allows, never below it.
func TestPortfolioShareReachesOptimum(t *testing.T) {
	if testing.Short() {
		t.Skip("optimisations of a 12-section term")
	}
	term := samples.Generate(samples.Config{Sections: 12, Seed: 1})
	ref, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, LocalShare: -1})
	require.NoError(t, err)
	require.True(t, ref.Proven)
	res, err := OptimizePortfolio(context.Background(), term, trapOptions(1, 12), 2)
	require.NoError(t, err)
	checkOptimized(t, term, nil, res)
	assert.Equal(t, ref.Total, res.Total)
	// With the whole-term phase on, the members prove the optimum and stop.
	res, err = OptimizePortfolio(context.Background(), term, OptimizeOptions{Seed: 1, LocalShare: -1}, 2)
	require.NoError(t, err)
	checkOptimized(t, term, nil, res)
	assert.True(t, res.Proven)
	assert.Equal(t, "optimal", res.Stopped)
	assert.Equal(t, ref.Total, res.Total)
}
