package improve_test

import (
	"context"
	"os"
	"strconv"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestScale2000 runs the annealer for the time in IMPROVE_SCALE (skipped
// without it) on the 2,000-section generated term (seed 1) from the
// engine's first timetable and prints the cost per level, highest first,
// with IMPROVE_WORKERS workers (default 1).
// It checks the result with timetable.Check and that the reported cost is
// timetable.Cost of the result; no timing is asserted.
func TestScale2000(t *testing.T) {
	limit := measureBudget(t, "IMPROVE_SCALE", "a duration (e.g. 60s) to run the 2,000-section measurement")
	term := samples.Generate(samples.Config{Sections: 2000, Seed: 1})
	t0 := time.Now()
	start := firstTimetable(t, term)
	first := time.Since(t0)
	ctx, cancel := context.WithTimeout(context.Background(), limit)
	defer cancel()
	workers, _ := strconv.Atoi(os.Getenv("IMPROVE_WORKERS"))
	res, err := improve.Run(ctx, term, start, nil, improve.Options{Seed: 1, Workers: workers})
	require.NoError(t, err)
	requireSound(t, term, res)
	sc := timetable.Cost(term, start, nil)
	t.Logf("2,000 sections: first timetable in %v, cost by level %v; after %v of annealing %v (tried %.0f/s, accepted %.0f/s, %d cycles, %d workers, %d shared, %d stale)",
		first.Round(time.Millisecond), sc.ByLevel, limit, res.Cost.ByLevel, res.Stats.TriedPerSec, res.Stats.AcceptPerSec, res.Stats.Cycles, res.Stats.Workers, res.Stats.Shared, res.Stats.Stale)
	for _, c := range res.Cost.Criteria {
		if c.Weight != 0 {
			t.Logf("  %-20s level %d  %d -> %d", c.Name, c.Level, sc.Criterion(c.Name).Cost, c.Cost)
		}
	}
}
