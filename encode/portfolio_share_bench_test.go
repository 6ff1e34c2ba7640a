package encode

import (
	"context"
	"os"
	"strconv"
	"testing"
	"time"
)

// BenchmarkPortfolioShare measures what a second thread gains on the
// 2,000-section generated term (samples.Generate, seed 1, as `termwright
// generate g.xlsx --sections 2000 --seed 1`): OptimizePortfolio with one
// thread runs for TW_PORTFOLIO_SECONDS (default 60) and its final cost is
// the target; then with two threads (one member annealing on both cores,
// portfolioMembers) as long, and the metric is the time each took to
// reach the target (from its history), and their ratio ("speed-up"; the
// two-thread time is the limit when it never got there). Both runs are
// budgeted by time, so one run of each is one sample: repeat it.
// Run one iteration on an otherwise quiet machine with two cores:
//
//	TW_PORTFOLIO_SECONDS=60 go test ./encode/ -run '^$' -bench BenchmarkPortfolioShare -benchtime 1x
func BenchmarkPortfolioShare(b *testing.B) {
	limit := 60 * time.Second
	if v, err := strconv.Atoi(os.Getenv("TW_PORTFOLIO_SECONDS")); err == nil && v > 0 {
		limit = time.Duration(v) * time.Second
	}
	term := benchTerm(2000)
	b.ReportAllocs()
	for b.Loop() {
		run := func(threads int) *OptimizeResult {
			ctx, cancel := context.WithTimeout(context.Background(), limit)
			defer cancel()
			res, err := OptimizePortfolio(ctx, term, OptimizeOptions{Seed: 1}, threads)
			if err != nil {
				b.Fatal(err)
			}
			if res.Schedule == nil {
				b.Fatalf("no timetable with %d threads: %v", threads, res.Status)
			}
			return res
		}
		one := run(1)
		target := one.Total
		t1 := reachedAt(one, target, limit)
		two := run(2)
		t2 := reachedAt(two, target, limit)
		b.ReportMetric(t1.Seconds(), "s-to-target-1")
		b.ReportMetric(t2.Seconds(), "s-to-target-2")
		b.ReportMetric(t1.Seconds()/t2.Seconds(), "speed-up")
		b.ReportMetric(float64(two.Adopted), "adopted")
		b.ReportMetric(float64(compareLevels(two.Total, target)), "two-vs-one")
		b.Logf("target %v: one thread %v, two threads %v (final %v, adopted %d, restarts %d, local workers %d)", target, t1, t2, two.Total, two.Adopted, two.Restarts, two.Local.Workers)
	}
}

// reachedAt is the time at which res's history first reached a cost no
// higher than target, or limit when it never did.
func reachedAt(res *OptimizeResult, target []int64, limit time.Duration) time.Duration {
	for _, h := range res.History {
		if h.Cost != nil && compareLevels(h.Cost, target) <= 0 {
			return h.Elapsed
		}
	}
	return limit
}
