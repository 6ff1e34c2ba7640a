package encode

import (
	"context"
	"errors"
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
// program size: the hard requirements (what Solve searches) and the whole
// program with the optimiser's soft criteria.
func BenchmarkCompile(b *testing.B) {
	for _, n := range benchSizes {
		for _, hard := range []bool{true, false} {
			name := fmt.Sprintf("sections=%d/hard", n)
			if !hard {
				name = fmt.Sprintf("sections=%d/all", n)
			}
			benchCompile(b, name, benchTerm(n), Options{HardOnly: hard})
		}
	}
}

func benchCompile(b *testing.B, name string, term *timetable.Term, opt Options) {
	b.Run(name, func(b *testing.B) {
		b.ReportAllocs()
		var st Stats
		for b.Loop() {
			p, cat, err := Compile(term, opt)
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

// BenchmarkDecode measures Decode (per-period matching and room
// assignment) on a model of each generated term.
func BenchmarkDecode(b *testing.B) {
	for _, n := range benchSizes {
		term := benchTerm(n)
		p, cat, err := Compile(term, Options{})
		if err != nil {
			b.Fatal(err)
		}
		// A model that decodes: add the room families and room conflicts
		// Decode reports, as Solve does.
		var model []solver.Atom
		opts := solver.DefaultOptions()
		opts.Seed = 1 // as Solve does
		for {
			s, err := solver.New(p, opts)
			if err != nil {
				b.Fatal(err)
			}
			if st := s.Solve(context.Background()); st != solver.Satisfiable {
				b.Fatalf("status %v", st)
			}
			model = s.Model(nil)
			_, err = Decode(term, cat, model)
			var herr *HallError
			var rerr *RoomConflictError
			switch {
			case errors.As(err, &herr):
				for _, set := range herr.sets {
					cat.extender(p).addFamily(set, true)
				}
				continue
			case errors.As(err, &rerr):
				for _, ng := range rerr.nogoods {
					starts := make([]solver.Lit, len(ng))
					for i, l := range ng {
						starts[i] = l.Not()
					}
					cat.extender(p).rule(0, starts...)
				}
				continue
			case err != nil:
				b.Fatal(err)
			}
			break
		}
		b.Run(fmt.Sprintf("sections=%d", n), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				if _, err := Decode(term, cat, model); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
