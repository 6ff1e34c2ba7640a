package encode

import (
	"context"
	"fmt"
	"testing"
	"time"

	"github.com/termwright/termwright/timetable"
)

// BenchmarkOptimize runs Optimize on the demo for 1, 10 and 60 seconds and
// on the 2,000-section generated term for 60 and 300 seconds, and reports
// the cost and lower bound per level of the best timetable (metrics
// "cost-L<level>" and "bound-L<level>"), the neighbourhood steps and
// whether the optimum was proven. Run one iteration each:
//
//	go test ./encode -run XXX -bench Optimize -benchtime 1x -timeout 30m
//
// The cost reached in a given time depends on the machine and its load;
// these are measurements, not assertions.
func BenchmarkOptimize(b *testing.B) {
	runs := []struct {
		sections int
		limit    time.Duration
	}{{150, time.Second}, {150, 10 * time.Second}, {150, 60 * time.Second}, {2000, 60 * time.Second}, {2000, 300 * time.Second}}
	for _, r := range runs {
		term := benchTerm(r.sections)
		b.Run(fmt.Sprintf("sections=%d/limit=%v", r.sections, r.limit), func(b *testing.B) {
			b.ReportAllocs()
			var res *OptimizeResult
			for b.Loop() {
				ctx, cancel := context.WithTimeout(context.Background(), r.limit)
				var err error
				res, err = Optimize(ctx, term, OptimizeOptions{Seed: 1})
				cancel()
				if err != nil {
					b.Fatal(err)
				}
			}
			reportCost(b, res)
		})
	}
}

// reportCost reports the cost vector and bound of a result as metrics.
func reportCost(b *testing.B, res *OptimizeResult) {
	if res.Schedule == nil {
		b.Fatalf("no timetable: %v", res.Status)
	}
	for i, l := range res.Levels {
		b.ReportMetric(float64(res.Total[i]), fmt.Sprintf("cost-L%d", l))
		b.ReportMetric(float64(res.Bound[i]), fmt.Sprintf("bound-L%d", l))
	}
	b.ReportMetric(float64(res.Steps), "steps")
	proven := 0.0
	if res.Proven {
		proven = 1
	}
	b.ReportMetric(proven, "proven")
	b.Logf("%s: cost %v, bound %v, stopped: %s; %s", res.Catalog.term.Name, res.Total, res.Bound, res.Stopped, costLine(res.Cost))
}

// costLine lists the criteria with a cost.
func costLine(rep timetable.CostReport) string {
	s := ""
	for _, c := range rep.Criteria {
		if c.Cost != 0 {
			s += fmt.Sprintf("%s %d; ", c.Name, c.Cost)
		}
	}
	return s
}

// BenchmarkNeighbourhoodSteps measures neighbourhood search on the
// 2,000-section generated term: Optimize with the whole-term phase skipped,
// once without neighbourhood steps and once with a fixed number of them
// (everything before the steps is the same: every budget counts
// conflicts), and reports the steps per second of the difference and the
// share of it spent constructing engines ("build-share"). Run one
// iteration:
//
//	go test ./encode -run XXX -bench NeighbourhoodSteps -benchtime 1x -timeout 30m
func BenchmarkNeighbourhoodSteps(b *testing.B) {
	term := benchTerm(2000)
	const steps = 40
	run := func(opt OptimizeOptions) (*OptimizeResult, time.Duration) {
		opt.Seed, opt.GlobalConflicts = 1, -1
		t0 := time.Now()
		res, err := Optimize(context.Background(), term, opt)
		if err != nil {
			b.Fatal(err)
		}
		if res.Schedule == nil {
			b.Fatalf("no timetable: %v", res.Status)
		}
		return res, time.Since(t0)
	}
	b.ReportAllocs()
	for b.Loop() {
		first, firstWall := run(OptimizeOptions{MaxStall: -1})
		res, wall := run(OptimizeOptions{MaxSteps: steps, MaxStall: steps + 1})
		lns := wall - firstWall
		build := res.Timings.Derive - first.Timings.Derive
		b.ReportMetric(float64(res.Steps)/lns.Seconds(), "steps/s")
		b.ReportMetric(build.Seconds()/lns.Seconds(), "build-share")
		b.ReportMetric(firstWall.Seconds(), "first-s")
		b.Logf("%d steps in %v, engine construction %v of it; first timetable after %v", res.Steps, lns, build, firstWall)
	}
}
