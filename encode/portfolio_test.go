package encode

import (
	"context"
	"errors"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func TestSolvePortfolio(t *testing.T) {
	term := samples.Generate(samples.Config{Sections: 40, Seed: 3})
	for _, threads := range []int{1, 2, 3} {
		t.Run("threads", func(t *testing.T) {
			res, err := SolvePortfolio(context.Background(), term, SolveOptions{Seed: 5}, threads)
			require.NoError(t, err)
			require.Equal(t, solver.Satisfiable, res.Status)
			assert.Empty(t, timetable.HardViolations(timetable.Check(term, res.Schedule)))
		})
	}
}

// TestOptimizePortfolioNoWorseThanMember0: member 0 runs the caller's seed;
// with budgets counted in conflicts, steps and moves (no time limit) and
// one local-search worker each member is deterministic, so the
// portfolio's best is never worse than the plain run with that seed.
func TestOptimizePortfolioNoWorseThanMember0(t *testing.T) {
	term := samples.Generate(samples.Config{Sections: 30, Seed: 4})
	opt := OptimizeOptions{Seed: 2, GlobalConflicts: 2000, StepConflicts: 200, MaxSteps: 20, LocalWorkers: 1}
	single, err := Optimize(context.Background(), term, opt)
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, single.Status)
	multi, err := OptimizePortfolio(context.Background(), term, opt, 2)
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, multi.Status)
	assert.LessOrEqual(t, compareLevels(multi.Total, single.Total), 0, "portfolio %v, single %v", multi.Total, single.Total)
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, multi.Schedule)))
	assert.LessOrEqual(t, compareLevels(multi.Bound, multi.Total), 0)
}

// TestPortfolioGivesAnnealingTwoCores: with LocalWorkers left to it, a
// portfolio of two threads anneals on both cores (one member, two local
// workers) and of three adds a member; without local search every thread
// is a member. The timetable passes the checks.
func TestPortfolioGivesAnnealingTwoCores(t *testing.T) {
	term := samples.Generate(samples.Config{Sections: 30, Seed: 4})
	cases := []struct {
		opt              OptimizeOptions
		threads          int
		members, workers int
	}{
		{OptimizeOptions{}, 2, 1, 2},
		{OptimizeOptions{}, 3, 2, 2},
		{OptimizeOptions{LocalWorkers: 1}, 2, 2, 1},
		{OptimizeOptions{LocalShare: -1}, 2, 2, 0},
	}
	for _, c := range cases {
		m, w := portfolioMembers(term, c.opt, c.threads)
		assert.Equal(t, [2]int{c.members, c.workers}, [2]int{m, w}, "%+v, %d threads", c.opt, c.threads)
	}
	res, err := OptimizePortfolio(context.Background(), term, OptimizeOptions{Seed: 2, GlobalConflicts: -1, StepConflicts: 200, MaxSteps: 20, noFloor: true}, 2)
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	assert.Equal(t, 2, res.Local.Workers)
	assert.Positive(t, res.Local.Runs)
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, res.Schedule)))
	assert.Equal(t, timetable.Cost(term, res.Schedule, nil).ByLevel, res.Cost.ByLevel)
}

func compareLevels(a, b []int64) int {
	for i := range min(len(a), len(b)) {
		if a[i] != b[i] {
			if a[i] < b[i] {
				return -1
			}
			return 1
		}
	}
	return len(a) - len(b)
}

func TestPickPortfolio(t *testing.T) {
	sat := func(total, bound []int64) *OptimizeResult {
		r := &OptimizeResult{Total: total, Bound: bound}
		r.Status = solver.Satisfiable
		return r
	}
	unknown := &OptimizeResult{}
	boom := errors.New("boom")
	cases := []struct {
		name      string
		results   []*OptimizeResult
		errs      []error
		wantTotal []int64
		wantBound []int64
		proven    bool
		wantErr   bool
	}{
		{"cheaper wins", []*OptimizeResult{sat([]int64{5, 9}, []int64{1, 0}), sat([]int64{5, 3}, []int64{0, 0})}, []error{nil, nil}, []int64{5, 3}, []int64{1, 0}, false, false},
		{"higher level first", []*OptimizeResult{sat([]int64{4, 90}, []int64{0, 0}), sat([]int64{5, 0}, []int64{0, 0})}, []error{nil, nil}, []int64{4, 90}, []int64{0, 0}, false, false},
		{"bound shared proves", []*OptimizeResult{sat([]int64{3}, []int64{1}), sat([]int64{4}, []int64{3})}, []error{nil, nil}, []int64{3}, []int64{3}, true, false},
		{"timetable beats unknown", []*OptimizeResult{unknown, sat([]int64{7}, []int64{0})}, []error{nil, nil}, []int64{7}, []int64{0}, false, false},
		{"error ignored when another answers", []*OptimizeResult{nil, sat([]int64{7}, []int64{0})}, []error{boom, nil}, []int64{7}, []int64{0}, false, false},
		{"all fail", []*OptimizeResult{nil, nil}, []error{boom, boom}, nil, nil, false, true},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			got, err := pickPortfolio(c.results, c.errs)
			if c.wantErr {
				require.Error(t, err)
				return
			}
			require.NoError(t, err)
			assert.Equal(t, c.wantTotal, got.Total)
			assert.Equal(t, c.wantBound, got.Bound)
			assert.Equal(t, c.proven, got.Proven)
		})
	}
}
