package encode

import (
	"context"
	"fmt"
	"testing"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// benchSizes are the demo size and a whole university's.
var benchSizes = []int{150, 2000}

func benchTerm(n int) *timetable.Term {
	if n == samples.DemoConfig.Sections {
		return samples.Demo()
	}
	return samples.Generate(samples.Config{Sections: n, Seed: 1})
}

// BenchmarkCompile measures Compile on generated terms and reports the
// program size.
func BenchmarkCompile(b *testing.B) {
	for _, n := range benchSizes {
		term := benchTerm(n)
		b.Run(fmt.Sprintf("sections=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			var st Stats
			for b.Loop() {
				p, cat, err := Compile(term, Options{})
				if err != nil {
					b.Fatal(err)
				}
				st = cat.Stats(p)
			}
			b.ReportMetric(float64(st.Atoms), "atoms")
			b.ReportMetric(float64(st.Rules+st.Choices), "rules")
			b.ReportMetric(float64(st.Bounds), "bounds")
			b.ReportMetric(float64(st.BoundLits), "bound-lits")
		})
	}
}

// BenchmarkSolve measures the whole pipeline (compile, search, verify,
// decode, check) to the first verified timetable.
func BenchmarkSolve(b *testing.B) {
	for _, n := range benchSizes {
		term := benchTerm(n)
		b.Run(fmt.Sprintf("sections=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			var res *Result
			for b.Loop() {
				var err error
				res, err = Solve(context.Background(), term, SolveOptions{Seed: 1})
				if err != nil {
					b.Fatal(err)
				}
				if res.Status != solver.Satisfiable {
					b.Fatalf("status %v", res.Status)
				}
			}
			b.ReportMetric(float64(res.Size.Atoms), "atoms")
			b.ReportMetric(float64(res.Engine.Conflicts), "conflicts")
			b.ReportMetric(float64(res.Rounds), "rounds")
			b.ReportMetric(res.Timings.Compile.Seconds(), "compile-s")
			b.ReportMetric(res.Timings.Solve.Seconds(), "search-s")
			b.ReportMetric(res.Timings.Verify.Seconds(), "verify-s")
			b.ReportMetric(res.Timings.Decode.Seconds(), "decode-s")
			b.ReportMetric(res.Timings.Check.Seconds(), "check-s")
		})
	}
}
