package timetable_test

import (
	"context"
	"fmt"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// requireBelow asserts that bound is at most the cost report of a legal
// timetable, criterion by criterion (units and cost) and per level.
func requireBelow(t *testing.T, what string, bound, cost timetable.CostReport) {
	t.Helper()
	require.Len(t, bound.Criteria, len(cost.Criteria))
	for k, c := range bound.Criteria {
		m := cost.Criteria[k]
		require.Equal(t, m.Name, c.Name, what)
		require.Equal(t, m.Level, c.Level, "%s %s", what, c.Name)
		require.Equal(t, m.Weight, c.Weight, "%s %s", what, c.Name)
		require.LessOrEqual(t, c.Count, m.Count, "%s %s: bound units above a legal timetable's", what, c.Name)
		require.LessOrEqual(t, c.Cost, m.Cost, "%s %s: bound cost above a legal timetable's", what, c.Name)
	}
	require.ElementsMatch(t, cost.Levels(), bound.Levels(), what)
	for l, v := range bound.ByLevel {
		require.LessOrEqual(t, v, cost.ByLevel[l], "%s level %d", what, l)
	}
}

// TestCountingBoundBelowSolved: the bound is at most the cost of legal
// timetables found independently of it: the engine's first timetable
// (encode.Solve, checked here by Check) and the generator's hidden witness
// (samples.GenerateWithWitness, which the samples tests check), on the
// demo, the meeting-pattern campus demo and generated terms, with and
// without a kept timetable (the witness kept, the engine's result
// judged).
func TestCountingBoundBelowSolved(t *testing.T) {
	type tc struct {
		name    string
		term    *timetable.Term
		witness *timetable.Schedule
	}
	demo, demoW := samples.GenerateWithWitness(samples.DemoConfig)
	gen60, gen60W := samples.GenerateWithWitness(samples.Config{Sections: 60, Seed: 11})
	odd, oddW := samples.GenerateWithWitness(samples.Config{Sections: 80, Seed: 5, Days: 6, PeriodsPerDay: 5, Weeks: 7})
	cases := []tc{{"demo", demo, demoW}, {"generated 60", gen60, gen60W}, {"generated odd grid", odd, oddW}, {"campus", samples.Campus(), nil}}
	if !testing.Short() {
		for _, n := range []int{2000, 10000} {
			g, w := samples.GenerateWithWitness(samples.Config{Sections: n, Seed: 1})
			cases = append(cases, tc{fmt.Sprintf("generated %d (witness only)", n), g, w})
		}
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			bound := timetable.CountingBound(c.term, nil)
			if c.witness != nil {
				require.Empty(t, timetable.HardViolations(timetable.Check(c.term, c.witness)))
				requireBelow(t, "witness", bound, timetable.Cost(c.term, c.witness, nil))
			}
			if len(c.term.Sections) > 500 {
				t.Logf("bound by level %v (%s); witness %v", bound.ByLevel, positives(bound), timetable.Cost(c.term, c.witness, nil).ByLevel)
				return
			}
			ctx, cancel := context.WithTimeout(context.Background(), 60*time.Second)
			defer cancel()
			res, err := encode.Solve(ctx, c.term, encode.SolveOptions{Seed: 1})
			require.NoError(t, err)
			require.NotNil(t, res.Schedule, "the engine found no timetable")
			require.Empty(t, timetable.HardViolations(timetable.Check(c.term, res.Schedule)))
			requireBelow(t, "engine", bound, timetable.Cost(c.term, res.Schedule, nil))
			if c.witness != nil {
				kept := timetable.CountingBound(c.term, c.witness)
				requireBelow(t, "engine, witness kept", kept, timetable.Cost(c.term, res.Schedule, c.witness))
				requireBelow(t, "witness, engine kept", timetable.CountingBound(c.term, res.Schedule), timetable.Cost(c.term, c.witness, res.Schedule))
			}
			t.Logf("bound by level %v (%s); engine's first timetable %v", bound.ByLevel, positives(bound), timetable.Cost(c.term, res.Schedule, nil).ByLevel)
		})
	}
}

// positives lists the criteria with a positive bound as "name units/cost".
func positives(r timetable.CostReport) string {
	var out []string
	for _, c := range r.Criteria {
		if c.Count > 0 {
			out = append(out, fmt.Sprintf("%s %d/%d", c.Name, c.Count, c.Cost))
		}
	}
	return strings.Join(out, ", ")
}
