package encode

import (
	"context"
	"errors"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// The local-search phase runs after the first timetable, and what it finds
// is kept only through the same gates as the engine's models: the result
// passes timetable.Check, its cost is timetable.Cost of it, and the
// engine's cost equals the cost without rooms (checkOptimized). With a
// move budget (no deadline) the same seed gives the same timetable.
func TestOptimizeLocalSearch(t *testing.T) {
	term := samples.Demo()
	opts := OptimizeOptions{Seed: 3, GlobalConflicts: -1, MaxSteps: 5}
	res, err := Optimize(context.Background(), term, opts)
	require.NoError(t, err)
	checkOptimized(t, term, nil, res)
	assert.Equal(t, 1, res.Local.Runs)
	assert.Equal(t, 1, res.Local.Adopted, "local search improves on the demo's first timetable")
	assert.Zero(t, res.Local.Rejected)
	assert.Positive(t, res.Local.Moves)

	again, err := Optimize(context.Background(), term, opts)
	require.NoError(t, err)
	assert.Equal(t, res.Schedule.Placements, again.Schedule.Placements, "same seed and budgets, same timetable")

	off := opts
	off.LocalShare = -1
	plain, err := Optimize(context.Background(), term, off)
	require.NoError(t, err)
	checkOptimized(t, term, nil, plain)
	assert.Zero(t, plain.Local.Runs)
}

// With a deadline, local search and neighbourhood search take turns until
// the time is up: the search never ends early on a stall.
func TestOptimizeUsesTheTimeLimit(t *testing.T) {
	if testing.Short() {
		t.Skip("a few seconds of search")
	}
	term := samples.Demo()
	ctx, cancel := context.WithTimeout(context.Background(), 3*time.Second)
	defer cancel()
	res, err := Optimize(ctx, term, OptimizeOptions{Seed: 1, GlobalConflicts: -1, MaxStall: 2})
	require.NoError(t, err)
	checkOptimized(t, term, nil, res)
	assert.Contains(t, []string{"time limit", "optimal"}, res.Stopped)
	if res.Stopped == "time limit" {
		assert.GreaterOrEqual(t, res.Local.Runs, 2, "local search runs again after neighbourhood search stalls")
	}
}

// adopt refuses what is not a legal timetable of the program: a start the
// program does not allow is not adopted, and a timetable that breaks a hard
// requirement is an error (local search must never produce one).
func TestAdoptGates(t *testing.T) {
	term := samples.Demo()
	first, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, GlobalConflicts: -1, MaxStall: -1, LocalShare: -1})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, first.Status)

	o := &optRun{ctx: context.Background(), t: term, levels: termLevels(term), res: &OptimizeResult{}}
	o.p, o.cat = first.Program, first.Catalog
	o.x = NewSearch(term, o.p, o.cat, SearchOptions{Engine: solver.DefaultOptions(), Tally: &o.res.Result})

	c, err := o.adopt(first.Schedule)
	require.NoError(t, err, "the optimiser's own timetable is adopted")
	assert.Equal(t, first.Total, c.total)
	require.NoError(t, solver.Verify(o.p, c.model))

	// Two meetings of one section at the same start: no model has that.
	bad := cloneSchedule(first.Schedule)
	idx := -1
	for i, p := range bad.Placements {
		if i > 0 && bad.Placements[i-1].Section == p.Section {
			idx = i
			break
		}
	}
	require.GreaterOrEqual(t, idx, 0, "the demo has a section with two meetings")
	bad.Placements[idx].Period = bad.Placements[idx-1].Period
	_, err = o.adopt(bad)
	assert.True(t, errors.Is(err, errNotAdopted), "%v", err)

	// Same starts, but a room clash: Check fails, which is a bug to report.
	clash := cloneSchedule(first.Schedule)
	var a, b = -1, -1
	for i := range clash.Placements {
		for j := i + 1; j < len(clash.Placements) && a < 0; j++ {
			pi, pj := clash.Placements[i], clash.Placements[j]
			if pi.Period == pj.Period && pi.Room != "" && pj.Room != "" && pi.Room != pj.Room {
				a, b = i, j
			}
		}
	}
	require.GreaterOrEqual(t, a, 0)
	clash.Placements[b].Room = clash.Placements[a].Room
	_, err = o.adopt(clash)
	assert.ErrorIs(t, err, ErrCheckFailed)
}

func cloneSchedule(s *timetable.Schedule) *timetable.Schedule {
	c := *s
	c.Placements = append([]timetable.Placement(nil), s.Placements...)
	return &c
}
