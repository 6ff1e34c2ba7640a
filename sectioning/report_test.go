package sectioning

import (
	"context"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestReport checks the report against the result it summarises: its
// unplaced requests are the result's, every section it lists holds at
// least 90% of its limit (counted here from the enrolments) and every
// section left out holds less, and its clashes add up to the clashes the
// criterion's definition gives (judge).
func TestReport(t *testing.T) {
	g := medium
	g.slack, g.patterns = 0.9, true
	term, sched := genTerm(rand.New(rand.NewPCG(21, 21)), g)
	res, err := Section(context.Background(), term, sched, Options{Seed: 21})
	require.NoError(t, err)
	rep := NewReport(term, sched, res)
	require.Equal(t, len(term.Requests), rep.Requests)
	require.Equal(t, len(term.Requests)-len(res.Unplaced), rep.Placed)
	require.Len(t, rep.Unplaced, len(res.Unplaced))
	require.NotEmpty(t, rep.Unplaced, "limits below demand leave requests out")
	for i, u := range rep.Unplaced {
		require.Equal(t, res.Unplaced[i].Request, u.Request)
		require.Equal(t, term.Requests[u.Request].Student, u.Student)
		require.NotEmpty(t, u.Reason)
	}
	load := map[string]int{}
	for _, e := range term.Enrolments {
		load[e.Section]++
	}
	for _, e := range res.Enrolments {
		load[e.Section]++
	}
	listed := map[string]bool{}
	for _, s := range rep.Sections {
		listed[s.Section] = true
		require.Equal(t, load[s.Section], s.Students, s.Section)
		require.GreaterOrEqual(t, 10*s.Students, 9*s.Limit, s.Section)
		require.Equal(t, s.Students >= s.Limit, s.Full)
	}
	for i, s := range term.Sections {
		if !listed[s.ID] && s.Course != "" {
			require.Less(t, 10*load[s.ID], 9*term.SectionLimit(i), s.ID)
		}
	}
	require.Equal(t, judge(term, sched, nil, res).clashes, rep.TotalClashes)
	travel := 0
	for _, c := range rep.Clashes {
		if c.Travel {
			travel++
		}
	}
	t.Logf("%d unplaced, %d sections near their limit, %d clashing pairs (%d by travel time)", len(rep.Unplaced), len(rep.Sections), len(rep.Clashes), travel)
}
