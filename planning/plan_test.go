package planning

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/samples"
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
