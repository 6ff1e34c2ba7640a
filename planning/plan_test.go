package planning

import (
	"context"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestPlanWithoutRequestsIsThePortfolio: a term without requests gets
// exactly encode.OptimizePortfolio's timetable for the same seed (runs that
// end by themselves are deterministic, see encode.Optimize).
func TestPlanWithoutRequestsIsThePortfolio(t *testing.T) {
	term := samples.Campus()
	term.Requests = nil
	opt := encode.OptimizeOptions{Seed: 7, MaxSteps: 20, GlobalConflicts: 2000, LocalShare: -1}
	want, err := encode.OptimizePortfolio(context.Background(), term, opt, 1)
	require.NoError(t, err)
	got, err := Plan(context.Background(), term, Options{OptimizeOptions: opt})
	require.NoError(t, err)
	require.Nil(t, got.Sectioning)
	require.Equal(t, want.Schedule, got.Schedule)
	require.Equal(t, want.Total, got.Total)
}

// TestPlanWithRequests: on small terms with requests Plan returns a
// timetable with its sectioned students that timetable.Check accepts,
// whose Cost is timetable.Cost of its Schedule (the independent
// evaluator), whose Total is that cost per level, and whose Bound is not
// above it (lexicographically); every sectioned student is in a course
// they asked for.
func TestPlanWithRequests(t *testing.T) {
	for seed := int64(1); seed <= 4; seed++ {
		term := requestTerm(seed, 4, 12)
		opt := Options{OptimizeOptions: encode.OptimizeOptions{Seed: seed, MaxStall: 30, LocalShare: -1}, Rounds: 2}
		res, err := Plan(context.Background(), term, opt)
		require.NoError(t, err)
		require.Equal(t, solver.Satisfiable, res.Status)
		require.NotNil(t, res.Sectioning)
		require.NotEmpty(t, res.Schedule.Enrolments)
		require.Empty(t, timetable.HardViolations(timetable.Check(term, res.Schedule)))
		cost := timetable.Cost(term, res.Schedule, nil)
		require.Equal(t, cost, res.Cost)
		for i, l := range res.Levels {
			require.Equal(t, cost.ByLevel[l], res.Total[i], "level %d", l)
		}
		require.LessOrEqual(t, slices.Compare(res.Bound, res.Total), 0)
		_, unplacedLevel := term.CriterionWeight(timetable.CritUnplaced)
		require.Zero(t, res.Bound[slices.Index(res.Levels, unplacedLevel)], "no bound on a level only requests have")
		require.Len(t, res.Rounds, 3)
		asked := map[[2]string]bool{}
		for _, r := range term.Requests {
			asked[[2]string{r.Student, r.Course}] = true
		}
		course := map[string]string{}
		for _, s := range term.Sections {
			course[s.ID] = s.Course
		}
		for _, e := range res.Schedule.Enrolments {
			require.True(t, asked[[2]string{e.Student, course[e.Section]}], "%v", e)
		}
		t.Logf("seed %d: levels %v total %v bound %v rounds %+v", seed, res.Levels, res.Total, res.Bound, res.Rounds)
	}
}
