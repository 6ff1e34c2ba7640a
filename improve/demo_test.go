package improve_test

import (
	"context"
	"fmt"
	"os"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestDemoTimeToZero measures, for the time budget in IMPROVE_DEMO (for
// example "60s"; skipped without it), how long the annealer takes from the
// engine's first timetable of the demo term to cost 0 on every level (a
// proven optimum: no criterion counts below zero), for the seeds 1 to
// IMPROVE_DEMO_SEEDS (default 3). It prints the time of each new best; it
// asserts only that every result passes timetable.Check and that its cost
// is timetable.Cost of it, never a time.
func TestDemoTimeToZero(t *testing.T) {
	limit := measureBudget(t, "IMPROVE_DEMO", "a time budget (e.g. 60s) to measure the time to cost 0 on the demo")
	seeds, _ := strconv.Atoi(os.Getenv("IMPROVE_DEMO_SEEDS"))
	seeds = max(seeds, 3)
	term := samples.Demo()
	start := firstTimetable(t, term)
	var rows []string
	for seed := 1; seed <= seeds; seed++ {
		ctx, cancel := context.WithTimeout(context.Background(), limit)
		var trail []string
		t0 := time.Now()
		res, err := improve.Run(ctx, term, start, nil, improve.Options{Seed: uint64(seed), OnBest: func(_ *timetable.Schedule, c timetable.CostReport) {
			trail = append(trail, fmt.Sprintf("%s@%.2fs", levelText(c), time.Since(t0).Seconds()))
		}})
		cancel()
		require.NoError(t, err)
		requireSound(t, term, res)
		end := "not reached"
		if res.Stats.Optimal {
			end = fmt.Sprintf("%.2fs", res.Stats.Elapsed.Seconds())
		}
		if len(trail) > 6 {
			trail = append(trail[:2], append([]string{"…"}, trail[len(trail)-4:]...)...)
		}
		rows = append(rows, fmt.Sprintf("seed %d: cost 0 %s, %d cycles, %.0f moves/s; bests %s", seed, end, res.Stats.Cycles, res.Stats.TriedPerSec, strings.Join(trail, " ")))
	}
	t.Logf("demo from encode.Solve's first timetable, budget %v (start %s)\n%s", limit, levelText(timetable.Cost(term, start, nil)), strings.Join(rows, "\n"))
}

// levelText writes a cost by level, highest level first, as a/b/c.
func levelText(c timetable.CostReport) string {
	var parts []string
	for _, l := range c.Levels() {
		parts = append(parts, strconv.FormatInt(c.ByLevel[l], 10))
	}
	return strings.Join(parts, "/")
}
