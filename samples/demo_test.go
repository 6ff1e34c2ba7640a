package samples

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// TestDemoFiles regenerates the demo term and compares it byte for byte with
// the checked-in workbook and CSV folder.
func TestDemoFiles(t *testing.T) {
	checkTermFiles(t, Demo(), DemoWorkbook, DemoCSVDir, "Generate(DemoConfig)", "TestDemoFiles")
}

// TestDemoReadsClean loads the checked-in demo files with the workbook
// readers: no errors and no warnings, and the counts the issue asks for.
func TestDemoReadsClean(t *testing.T) {
	for _, path := range []string{DemoWorkbook, DemoCSVDir} {
		t.Run(path, func(t *testing.T) {
			term, ps, err := timetable.Load(path)
			require.NoError(t, err)
			assert.Empty(t, ps, "problems:\n%s", ps)
			c := timetable.Summary(term)
			assert.Equal(t, 150, c.Sections)
			assert.InDelta(t, 30, c.Rooms, 6, "about 30 rooms")
			assert.InDelta(t, 70, c.Staff, 10, "about 70 staff")
			assert.InDelta(t, 25, c.Cohorts, 6, "about 25 cohorts")
			assert.Equal(t, 45, c.Periods, "Mon-Fri x 9 periods")
			assert.True(t, c.Students >= 200 && c.Students <= 900, "a few hundred students, got %d", c.Students)
		})
	}
}
