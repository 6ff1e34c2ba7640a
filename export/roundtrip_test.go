package export

import (
	"os"
	"path/filepath"
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestDemoScheduleIsValid guards the fixture itself: the demo timetable has
// no hard violation according to the independent domain checker.
func TestDemoScheduleIsValid(t *testing.T) {
	term, s := demoTerm()
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, s)))
}

// TestWorkbookReadsBack writes the timetable workbook and the CSV and reads
// both back with timetable.ReadSchedule: the same placements come back,
// with no problems reported.
func TestWorkbookReadsBack(t *testing.T) {
	term, s := demoTerm()
	dir := t.TempDir()
	xlsx := filepath.Join(dir, "timetable.xlsx")
	f, err := os.Create(xlsx)
	require.NoError(t, err)
	require.NoError(t, WriteTimetableWorkbook(f, term, s, Options{Generated: fixedClock}))
	require.NoError(t, f.Close())
	csvPath := filepath.Join(dir, "timetable.csv")
	f, err = os.Create(csvPath)
	require.NoError(t, err)
	require.NoError(t, WriteTimetableCSV(f, term, s))
	require.NoError(t, f.Close())

	for _, p := range []string{xlsx, csvPath} {
		t.Run(filepath.Ext(p), func(t *testing.T) {
			got, problems, err := timetable.ReadSchedule(p, term)
			require.NoError(t, err)
			assert.Empty(t, problems)
			assert.Equal(t, placements(s), placements(got))
		})
	}
}

// placements lists a schedule's placements without their sources, sorted.
func placements(s *timetable.Schedule) []timetable.Placement {
	out := make([]timetable.Placement, len(s.Placements))
	for i, p := range s.Placements {
		p.Src = timetable.Source{}
		out[i] = p
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Section != out[j].Section {
			return out[i].Section < out[j].Section
		}
		return out[i].Meeting < out[j].Meeting
	})
	return out
}
