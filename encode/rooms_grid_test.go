package encode

import (
	"context"
	"fmt"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestGeneratePatternsSolves: the generated terms that mix grid and
// pattern sections (samples.GeneratePatterns: grid sections with room
// lists shared with pattern sections, same-room rows across both, travel
// between buildings, weekly minute limits) compile, with explicit rooms
// for their grid sections, and Solve finds a timetable that passes
// timetable.Check. The generator's witness, checked by Check here, shows
// one exists, so "unsatisfiable" would be a bug.
func TestGeneratePatternsSolves(t *testing.T) {
	// The generator adds travel between buildings from 150 sections.
	cfgs := []samples.Config{{Sections: 40, Seed: 1}, {Sections: 80, Seed: 2}, {Sections: 120, Seed: 3}, {Sections: 180, Seed: 5}}
	if testing.Short() {
		cfgs = cfgs[:1]
	}
	for _, cfg := range cfgs {
		t.Run(fmt.Sprintf("%d/%d", cfg.Sections, cfg.Seed), func(t *testing.T) {
			term, w := samples.GeneratePatternsWithWitness(cfg)
			require.Empty(t, timetable.HardViolations(timetable.Check(term, w)), "the witness")
			_, cat, err := Compile(term, Options{})
			require.NoError(t, err)
			require.NotEmpty(t, cat.gridRooms, "grid sections with explicit rooms")
			if cfg.Sections >= 150 {
				require.NotEmpty(t, term.Travel, "travel between buildings")
			}
			res, err := Solve(context.Background(), term, SolveOptions{Seed: 1})
			require.NoError(t, err)
			require.Equal(t, solver.Satisfiable, res.Status)
			require.Empty(t, timetable.HardViolations(timetable.Check(term, res.Schedule)))
		})
	}
}

// TestGeneratePatternsOptimizes: a short Optimize on a generated mixed
// term keeps every timetable it reports valid under timetable.Check, its
// engine cost equal to timetable.Cost (the third gate, checked inside).
func TestGeneratePatternsOptimizes(t *testing.T) {
	if testing.Short() {
		t.Skip("optimisation run")
	}
	term := samples.GeneratePatterns(samples.Config{Sections: 60, Seed: 4})
	ctx, cancel := context.WithTimeout(context.Background(), 20*time.Second)
	defer cancel()
	res, err := Optimize(ctx, term, OptimizeOptions{Seed: 1, MaxSteps: 30})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	require.Empty(t, timetable.HardViolations(timetable.Check(term, res.Schedule)))
}

// BenchmarkCompileMixedRooms: compile size and time of generated terms
// mixing grid and pattern sections (explicit grid rooms, travel, mixed
// relations); reports atoms, rules, bounds and grid_in atoms per section.
func BenchmarkCompileMixedRooms(b *testing.B) {
	for _, n := range []int{100, 300} {
		b.Run(fmt.Sprint(n), func(b *testing.B) {
			term := samples.GeneratePatterns(samples.Config{Sections: n, Seed: 1})
			b.ReportAllocs()
			var p *solver.Program
			var cat *Catalog
			for b.Loop() {
				var err error
				if p, cat, err = Compile(term, Options{}); err != nil {
					b.Fatal(err)
				}
			}
			ex := 0
			for _, gm := range cat.gridRooms {
				for _, xs := range gm.rooms {
					ex += len(xs)
				}
			}
			secs := float64(len(term.Sections))
			b.ReportMetric(float64(p.NumAtoms())/secs, "atoms/section")
			b.ReportMetric(float64(len(p.Rules))/secs, "rules/section")
			b.ReportMetric(float64(len(p.Bounds))/secs, "bounds/section")
			b.ReportMetric(float64(ex)/secs, "grid_in/section")
		})
	}
}
