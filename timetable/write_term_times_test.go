package timetable_test

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"

	"github.com/termwright/termwright/timetable"
)

// mixedTerm is handTerm with what meeting patterns brought: a pattern
// section with a room choice list beside the grid sections, a grid section
// with room choices, weekly limits and lunch breaks, an unavailability of
// some weeks, relations with numbers and travel between buildings.
func mixedTerm() *timetable.Term {
	t := handTerm()
	t.Sections = append(t.Sections, timetable.Section{
		ID: "PAT-1", Title: "Patterned Lecture", Staff: []string{"S-1002"}, Size: 30, Meetings: 1, Length: 1,
		Weeks: t.AllWeeks(),
		Times: []timetable.TimeChoice{
			{Days: timetable.DaysOf(time.Monday, time.Wednesday, time.Friday), Start: 8*60 + 5, Minutes: 50, Weeks: t.AllWeeks()},
			{Days: timetable.DaysOf(time.Tuesday, time.Thursday), Start: 9*60 + 30, Minutes: 75, Weeks: t.AllWeeks() & 0x555, Weight: 3},
			{Days: timetable.DaysOf(time.Saturday), Start: 23 * 60, Minutes: 60, Weeks: 0b111100, Weight: 9},
		},
		RoomChoices: []timetable.RoomChoice{{Room: "BEA.010", Weight: 2}, {Room: "ALD.001"}},
	})
	t.Sections[0].RoomChoices = []timetable.RoomChoice{{Room: "ALD.001", Weight: 4}}
	t.Staff[1].MaxWeekMinutes, t.Staff[1].MaxWeekDays, t.Staff[1].MaxWeekPeriods = 900, 4, 12
	t.Staff[1].Lunch = timetable.LunchBreak{From: 11*60 + 30, To: 14 * 60, Minutes: 45}
	t.Cohorts[0].Lunch = timetable.LunchBreak{From: 12 * 60, To: 13 * 60, Minutes: 30}
	t.Unavailable[0].Weeks = 0b1010
	t.Relations = append(t.Relations,
		timetable.Relation{Kind: timetable.MaxBreaks, Sections: []string{"PAT-1", t.Sections[0].ID}, Weight: 2, N: 1, M: 15},
		timetable.Relation{Kind: timetable.DaySpan, Sections: []string{"PAT-1", t.Sections[1].ID}, Hard: true, N: 300},
		timetable.Relation{Kind: timetable.NoOverlap, Sections: []string{"PAT-1", t.Sections[2].ID}, Hard: true},
	)
	t.Travel = []timetable.Travel{
		{From: "Alder Court", To: "Beacon Hall", Minutes: 15},
		{From: "ALD.001", To: "ALD.102", Minutes: 5},
	}
	return t
}

// TestMixedTermValidates: the hand-made mixed term is a valid term, so the
// round trip in TestWriteTermReadBack compares like with like.
func TestMixedTermValidates(t *testing.T) {
	assert.Empty(t, timetable.Validate(mixedTerm()))
}

// TestGridTermWritesNoPatternParts: a term without meeting patterns gets
// neither the new sheets nor the new columns (its bytes are as before).
func TestGridTermWritesNoPatternParts(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(handTerm(), &buf))
	f, err := excelize.OpenReader(&buf)
	require.NoError(t, err)
	defer f.Close()
	assert.Equal(t, []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights"}, f.GetSheetList())
	rows, err := f.GetRows("Staff")
	require.NoError(t, err)
	assert.Equal(t, []string{"Staff ID", "Name", "Email", "Max periods per day", "Max consecutive periods"}, rows[0])

	buf.Reset()
	require.NoError(t, timetable.WriteTermWorkbook(mixedTerm(), &buf))
	g, err := excelize.OpenReader(&buf)
	require.NoError(t, err)
	defer g.Close()
	assert.Equal(t, []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights", "Meeting times", "Room choices", "Travel"}, g.GetSheetList())
	rows, err = g.GetRows("Meeting times")
	require.NoError(t, err)
	assert.Equal(t, []string{"Section", "Days", "Start", "Minutes", "Weeks", "Weight"}, rows[0])
	assert.Equal(t, []string{"PAT-1", "Mon Wed Fri", "08:05", "50"}, rows[1], "weeks equal to the section's and weight 0 are left blank")
	assert.Equal(t, []string{"PAT-1", "Tue Thu", "09:30", "75", "odd", "3"}, rows[2])
}

// TestTemplateCSVHasEveryColumn: the CSV form of `termwright new` has
// every sheet and every column of the layout, and reads back like the
// xlsx template.
func TestTemplateCSVHasEveryColumn(t *testing.T) {
	dir := t.TempDir()
	require.NoError(t, timetable.WriteTemplateCSV(dir))
	for _, name := range timetable.TermCSVFiles() {
		data, err := os.ReadFile(filepath.Join(dir, name))
		require.NoError(t, err, name)
		assert.NotEmpty(t, data)
	}
	head, err := os.ReadFile(filepath.Join(dir, "Staff.csv"))
	require.NoError(t, err)
	assert.Contains(t, string(head), "Max minutes per week,Max days per week,Lunch from,Lunch to,Lunch minutes")
	_, ps, err := timetable.ReadCSVDir(dir)
	require.NoError(t, err)
	assert.Empty(t, ps.Warnings(), "no unknown sheets or columns:\n%s", ps)
}
