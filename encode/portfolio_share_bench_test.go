package encode

import (
	"context"
	"os"
	"slices"
	"strconv"
	"testing"
	"time"
)

// BenchmarkPortfolioShare measures what a second thread gains on the
// 2,000-section generated term (samples.Generate, seed 1, as `termwright
// generate g.xlsx --sections 2000 --seed 1`) as a time-to-target
// comparison (Aiex, Resende, Ribeiro 2007, "TTT plots: a perl program to
// create time-to-target plots", Optimization Letters 1: the empirical
// distribution of the time a stochastic search takes to reach a target
// cost, over independent runs). OptimizePortfolio runs with one thread for
// TW_PORTFOLIO_SECONDS (default 60) at seeds 1..TW_PORTFOLIO_SAMPLES
// (default 3), then with two threads (one member annealing on both cores,
// portfolioMembers) at the same seeds. The target is the highest final
// cost of the one-thread runs, so that every one of them reaches it; each
// run's time to the target comes from its history (the limit when it
// never got there), and the metric "speed-up" is the median one-thread
// time over the median two-thread time. "paired-speed-up" is the median
// over seeds of the one-thread time to its own final cost over the
// two-thread time to that cost at the same seed. Budgets are time, so
// run it on an otherwise quiet machine with two cores:
//
//	TW_PORTFOLIO_SECONDS=60 go test ./encode/ -run '^$' -bench BenchmarkPortfolioShare -benchtime 1x
func BenchmarkPortfolioShare(b *testing.B) {
	limit := 60 * time.Second
	if v, err := strconv.Atoi(os.Getenv("TW_PORTFOLIO_SECONDS")); err == nil && v > 0 {
		limit = time.Duration(v) * time.Second
	}
	samples := 3
	if v, err := strconv.Atoi(os.Getenv("TW_PORTFOLIO_SAMPLES")); err == nil && v > 0 {
		samples = v
	}
	term := benchTerm(2000)
	b.ReportAllocs()
	for b.Loop() {
		run := func(threads int, seed int64) *OptimizeResult {
			ctx, cancel := context.WithTimeout(context.Background(), limit)
			defer cancel()
			res, err := OptimizePortfolio(ctx, term, OptimizeOptions{Seed: seed}, threads)
			if err != nil {
				b.Fatal(err)
			}
			if res.Schedule == nil {
				b.Fatalf("no timetable with %d threads at seed %d: %v", threads, seed, res.Status)
			}
			return res
		}
		ones, twos := make([]*OptimizeResult, samples), make([]*OptimizeResult, samples)
		for i := range ones {
			ones[i] = run(1, int64(i+1))
		}
		for i := range twos {
			twos[i] = run(2, int64(i+1))
		}
		target := ones[0].Total
		for _, r := range ones[1:] {
			if compareLevels(r.Total, target) > 0 {
				target = r.Total
			}
		}
		t1, t2, paired := make([]float64, samples), make([]float64, samples), make([]float64, samples)
		for i := range ones {
			t1[i] = reachedAt(ones[i], target, limit).Seconds()
			t2[i] = reachedAt(twos[i], target, limit).Seconds()
			paired[i] = reachedAt(ones[i], ones[i].Total, limit).Seconds() / reachedAt(twos[i], ones[i].Total, limit).Seconds()
			b.Logf("seed %d: one thread ended %v (at %.1fs), two threads %v (at %.1fs, local workers %d); to the target %.1fs and %.1fs",
				i+1, ones[i].Total, bestAt(ones[i]).Seconds(), twos[i].Total, bestAt(twos[i]).Seconds(), twos[i].Local.Workers, t1[i], t2[i])
		}
		m1, m2 := median(t1), median(t2)
		b.ReportMetric(m1, "s-to-target-1")
		b.ReportMetric(m2, "s-to-target-2")
		b.ReportMetric(m1/m2, "speed-up")
		b.ReportMetric(median(paired), "paired-speed-up")
		b.Logf("target %v (highest one-thread final): median time one thread %.1fs, two threads %.1fs, speed-up %.2f; paired speed-ups %.2f",
			target, m1, m2, m1/m2, paired)
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

// bestAt is the time at which res's history reached its final cost.
func bestAt(res *OptimizeResult) time.Duration {
	return reachedAt(res, res.Total, 0)
}

// median is the middle value of v (the mean of the two middle ones for an
// even count).
func median(v []float64) float64 {
	s := slices.Sorted(slices.Values(v))
	n := len(s)
	if n%2 == 1 {
		return s[n/2]
	}
	return (s[n/2-1] + s[n/2]) / 2
}
