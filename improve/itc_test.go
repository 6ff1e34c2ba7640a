package improve_test

import (
	"context"
	"fmt"
	"math"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// itcDir is the shared ITC-2007 folder (never copied into the
// repository), found as benchfmt's tests find it; "" when absent.
var itcDir = benchfmt.DataDir("itc2007", ".ctt")

// itcInstances are the public competition instances measured.
var itcInstances = []string{"comp01", "comp02", "comp03", "comp04", "comp05", "comp06", "comp07"}

// readITC reads one instance, skipping when the shared data is absent.
func readITC(tb testing.TB, name string) *timetable.Term {
	tb.Helper()
	f, err := os.Open(filepath.Join(itcDir, name+".ctt"))
	if itcDir == "" || os.IsNotExist(err) {
		tb.Skipf("%s not found under %s", name, itcDir)
	}
	require.NoError(tb, err)
	defer f.Close()
	term, err := benchfmt.ReadCTT(f, name+".ctt")
	require.NoError(tb, err)
	return term
}

// firstTimetable gets a legal start from the engine.
func firstTimetable(tb testing.TB, term *timetable.Term) *timetable.Schedule {
	tb.Helper()
	ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
	defer cancel()
	res, err := encode.Solve(ctx, term, encode.SolveOptions{Seed: 1})
	require.NoError(tb, err)
	require.NotNil(tb, res.Schedule, "no first timetable for %s", term.Name)
	return res.Schedule
}

// TestITC2007 runs the annealer on comp01–comp07 for the time in
// IMPROVE_ITC (for example "30s"; the test is skipped without it or
// without the shared data) from the engine's first timetable, and prints
// cost against the best known. It checks every result with the
// competition's own hard constraints and cost (benchfmt.CTTHardViolations
// and benchfmt.CTTCost, which implement the definitions of Di Gaspero,
// McCollum, Schaerf 2007, QUB/IEEE/Tech/ITC2007/CurriculumCTT/v1.0). No
// timing is asserted.
func TestITC2007(t *testing.T) {
	limit := measureBudget(t, "IMPROVE_ITC", "a duration per instance (e.g. 30s) to run the ITC-2007 measurement")
	f, err := os.Open(filepath.Join(itcDir, "best-known.csv"))
	if itcDir == "" || os.IsNotExist(err) {
		t.Skip("shared ITC-2007 data not found")
	}
	require.NoError(t, err)
	best, err := benchfmt.ReadCTTBest(f, "best-known.csv")
	f.Close()
	require.NoError(t, err)
	// IMPROVE_SHARE and IMPROVE_SEED optionally set Options.CycleShare
	// and the seed (default 1) for experiments.
	share, _ := strconv.ParseFloat(os.Getenv("IMPROVE_SHARE"), 64)
	seed, _ := strconv.ParseUint(os.Getenv("IMPROVE_SEED"), 10, 64)
	seed = max(seed, 1)
	var rows []string
	logSum, logPlain, n := 0.0, 0.0, 0
	for _, name := range itcInstances {
		term := readITC(t, name)
		start := firstTimetable(t, term)
		startCost, _ := benchfmt.CTTCost(term, start)
		ctx, cancel := context.WithTimeout(context.Background(), limit)
		var bestAt time.Duration
		t0 := time.Now()
		res, err := improve.Run(ctx, term, start, nil, improve.Options{Seed: seed, CycleShare: share, OnBest: func(*timetable.Schedule, timetable.CostReport) { bestAt = time.Since(t0) }})
		cancel()
		require.NoError(t, err)
		cost, parts := competitionCost(t, name, term, res)
		b := best[name].Best
		ratio := float64(cost+1) / float64(b+1)
		logSum += math.Log(ratio)
		logPlain += math.Log(float64(cost) / float64(max(b, 1)))
		n++
		rows = append(rows, fmt.Sprintf("%-7s %6d %6d %6d %8.2f  %-22s %7.1fs %8.0f %8.0f",
			name, startCost, cost, b, ratio, fmt.Sprintf("%d/%d/%d/%d", parts.RoomCapacity, parts.MinWorkingDays, parts.CurriculumCompactness, parts.RoomStability),
			bestAt.Seconds(), res.Stats.TriedPerSec, res.Stats.AcceptPerSec))
	}
	t.Logf("ITC-2007 at %v per instance, seed %d, from encode.Solve's first timetable\n"+
		"instance  start   cost   best (c+1)/(b+1) cap/mwd/compact/stab    best at  tried/s  accepted/s\n%s\n"+
		"geometric mean of (cost+1)/(best+1): %.2f, of cost/best: %.2f, over %d instances",
		limit, seed, strings.Join(rows, "\n"), math.Exp(logSum/float64(n)), math.Exp(logPlain/float64(n)), n)
}

// competitionCost checks a run's best timetable against the competition's
// own hard constraints and cost (benchfmt.CTTHardViolations and
// benchfmt.CTTCost, after Di Gaspero, McCollum, Schaerf 2007) and returns
// that cost and its parts; termwright's running cost must agree.
func competitionCost(t *testing.T, name string, term *timetable.Term, res improve.Result) (int, benchfmt.CTTParts) {
	t.Helper()
	require.Zero(t, benchfmt.CTTHardViolations(term, res.Best).Total(), "%s breaks the competition's hard constraints", name)
	cost, parts := benchfmt.CTTCost(term, res.Best)
	require.Equal(t, int64(cost), res.Cost.ByLevel[1]+res.Cost.ByLevel[0], "%s: termwright's cost differs from the competition's", name)
	return cost, parts
}

// TestITC2007Moves runs the annealer on the instances in
// IMPROVE_ITC_ONLY (default comp01–comp07) with a budget of
// IMPROVE_ITC_MOVES tried moves per run (skipped without it), once per
// seed in IMPROVE_ITC_SEEDS (default "1 2 3 4"), from the engine's first
// timetable, and prints each cost and the mean per instance. A move budget
// makes a run depend only on the term, the start and the seed, not on the
// machine's load, so two variants can be compared on a busy machine;
// IMPROVE_SHARE, IMPROVE_ACCEPT and IMPROVE_COOLING set Options.CycleShare,
// AcceptShare and Cooling (0: the defaults). No timing is asserted.
func TestITC2007Moves(t *testing.T) {
	moves, err := strconv.ParseInt(os.Getenv("IMPROVE_ITC_MOVES"), 10, 64)
	if err != nil || moves <= 0 {
		t.Skip("set IMPROVE_ITC_MOVES to a move budget per run (e.g. 40000000) to run the ITC-2007 measurement")
	}
	share, _ := strconv.ParseFloat(os.Getenv("IMPROVE_SHARE"), 64)
	accept, _ := strconv.ParseFloat(os.Getenv("IMPROVE_ACCEPT"), 64)
	cooling, _ := strconv.ParseFloat(os.Getenv("IMPROVE_COOLING"), 64)
	names := strings.Fields(os.Getenv("IMPROVE_ITC_ONLY"))
	if len(names) == 0 {
		names = itcInstances
	}
	seeds := strings.Fields(os.Getenv("IMPROVE_ITC_SEEDS"))
	if len(seeds) == 0 {
		seeds = []string{"1", "2", "3", "4"}
	}
	var rows []string
	for _, name := range names {
		term := readITC(t, name)
		start := firstTimetable(t, term)
		row, sum := fmt.Sprintf("%-7s", name), 0
		for _, s := range seeds {
			seed, err := strconv.ParseUint(s, 10, 64)
			require.NoError(t, err, "IMPROVE_ITC_SEEDS")
			res, err := improve.Run(context.Background(), term, start, nil, improve.Options{Seed: seed, MaxMoves: moves, CycleShare: share, AcceptShare: accept, Cooling: cooling})
			require.NoError(t, err)
			cost, _ := competitionCost(t, name, term, res)
			sum += cost
			row += fmt.Sprintf(" %5d", cost)
		}
		rows = append(rows, fmt.Sprintf("%s   mean %.2f", row, float64(sum)/float64(len(seeds))))
	}
	t.Logf("ITC-2007, %d moves per run, cycle share %v, accept share %v, cooling %v, seeds %v, from encode.Solve's first timetable\n%s",
		moves, share, accept, cooling, seeds, strings.Join(rows, "\n"))
}

// BenchmarkMovesITC measures the annealer's moves per second on comp07
// (skipped without the shared data), from the engine's first timetable:
// one run of b.N moves (the state Run builds is timed with them).
func BenchmarkMovesITC(b *testing.B) {
	term := readITC(b, "comp07")
	start := firstTimetable(b, term)
	b.ReportAllocs()
	b.ResetTimer()
	res, err := improve.Run(context.Background(), term, start, nil, improve.Options{Seed: 1, MaxMoves: int64(b.N)})
	if err != nil {
		b.Fatal(err)
	}
	b.ReportMetric(float64(res.Stats.Tried)/b.Elapsed().Seconds(), "moves/s")
}
