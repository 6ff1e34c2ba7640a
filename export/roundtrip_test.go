package export

import (
	"sort"
	"testing"

	"github.com/stretchr/testify/assert"
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
	xlsx, csvPath := writeTimetableFiles(t, t.TempDir(), term, s)
	assertReadsBack(t, term, s, xlsx, csvPath)
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
