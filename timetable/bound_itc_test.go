package timetable_test

import (
	"errors"
	"os"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// TestCountingBoundITC2007 checks the bound on the public ITC-2007
// curriculum-based instances comp01–comp07 (shared data, never copied into
// the repository; skipped when absent) against the best known costs of
// best-known.csv: the best timetables known for these instances
// (Urli's table of best-known values, the competition's own results; the
// file names its sources) cost at most that, and ReadCTT prices a
// timetable exactly as the competition does (benchfmt's agreement tests),
// so a bound above a best known cost would be wrong. It prints the bound
// next to the best published lower bound (Burke, Marecek, Parkes, Rudova,
// Ann. Oper. Res. 194, 2012), which comes from far stronger methods.
func TestCountingBoundITC2007(t *testing.T) {
	dir := benchfmt.DataDir("itc2007", ".ctt")
	best, err := benchfmt.OpenCTTBest(dir)
	if dir == "" || errors.Is(err, os.ErrNotExist) {
		t.Skip("shared ITC-2007 data not found")
	}
	require.NoError(t, err)
	for _, name := range []string{"comp01", "comp02", "comp03", "comp04", "comp05", "comp06", "comp07"} {
		term, err := benchfmt.OpenCTT(dir, name)
		if errors.Is(err, os.ErrNotExist) {
			t.Logf("%s not found under %s", name, dir)
			continue
		}
		require.NoError(t, err)
		rec, ok := best[name]
		require.True(t, ok, "%s has no row in best-known.csv", name)
		b := timetable.CountingBound(term, nil)
		got := b.ByLevel[benchfmt.CTTLevel]
		require.LessOrEqual(t, got, int64(rec.Best), "%s: the counting bound exceeds the best known cost", name)
		t.Logf("%s: counting bound %d, best published lower bound %d, best known %d", name, got, rec.LowerBound, rec.Best)
		for _, c := range b.Criteria {
			if c.Cost > 0 {
				t.Logf("  %s: %d units, cost %d", c.Name, c.Count, c.Cost)
			}
		}
	}
}
