package timetable_test

import (
	"bytes"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// mixedTerm is handTerm with what meeting patterns brought: a pattern
// section with a room choice list beside the grid sections, a grid section
// with room choices, weekly limits and lunch breaks, an unavailability of
// some weeks, relations with numbers and travel between buildings.
func mixedTerm() *timetable.Term {
	t := handTerm()
	t.Sections = append(t.Sections, timetable.Section{
		ID: "PAT-1", Title: "Patterned Class", Staff: []string{"S-1002"}, Size: 30, Meetings: 1, Length: 1,
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
	f := openTermWorkbook(t, handTerm())
	assert.Equal(t, []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights"}, f.GetSheetList())
	rows, err := f.GetRows("Staff")
	require.NoError(t, err)
	assert.Equal(t, []string{"Staff ID", "Name", "Email", "Max periods per day", "Max consecutive periods"}, rows[0])

	g := openTermWorkbook(t, mixedTerm())
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

// FuzzWriteMixedTermRoundTrip writes mixedTerm with an arbitrary valid
// meeting time, room-choice weight, travel time, lunch break and relation
// numbers, and reads it back through the workbook and the CSV folder: the
// term must come back unchanged (STYLE.md 14: print → read → print).
func FuzzWriteMixedTermRoundTrip(f *testing.F) {
	f.Add(uint8(0b0101010), 108, 9, uint64(0xfff), 3, 15, 660, 300, 1, 15)
	f.Add(uint8(1), 287, 0, uint64(1), 0, 0, 0, 0, 0, 0)
	f.Add(uint8(0x7f), 0, 287, ^uint64(0), 1_000_000, 1440, 1439, 1440, 100, 1440)
	f.Fuzz(func(t *testing.T, days uint8, start, length int, weeks uint64, weight, travel, lunchFrom, n, breaks, gap int) {
		abs := func(x int) int {
			if x < 0 {
				return -(x + 1)
			}
			return x
		}
		term := mixedTerm()
		c := &term.Sections[len(term.Sections)-1].Times[0]
		c.Days = timetable.DaySet(days&0x7f | 1<<(days%7)) // never empty
		c.Start = timetable.Clock(abs(start) % 288 * 5)
		c.Minutes = 5 * (1 + abs(length)%((24*60-int(c.Start))/5))
		c.Weeks = timetable.WeekSet(weeks) & term.AllWeeks()
		if c.Weeks == 0 {
			c.Weeks = 1
		}
		c.Weight = abs(weight) % 1_000_001
		term.Sections[len(term.Sections)-1].RoomChoices[0].Weight = abs(weight) % 7
		term.Travel[0].Minutes = abs(travel) % 1441
		from := abs(lunchFrom) % (24 * 60)
		term.Staff[1].Lunch = timetable.LunchBreak{From: timetable.Clock(from), To: 24 * 60, Minutes: 1 + abs(n)%(24*60-from)}
		term.Relations[len(term.Relations)-3].N = abs(breaks) % 101
		term.Relations[len(term.Relations)-3].M = abs(gap) % 1441
		term.Relations[len(term.Relations)-2].N = abs(n) % 1441
		require.Empty(t, timetable.Validate(term), "the fuzzed term is valid")

		var buf bytes.Buffer
		require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
		got, ps, err := timetable.ReadWorkbook(&buf, "fuzz.xlsx")
		require.NoError(t, err)
		require.Empty(t, ps, "problems:\n%s", ps)
		assertSameTerm(t, term, got)

		dir := t.TempDir()
		require.NoError(t, timetable.WriteTermCSV(term, dir))
		got, ps, err = timetable.ReadCSVDir(dir)
		require.NoError(t, err)
		require.Empty(t, ps, "problems:\n%s", ps)
		assertSameTerm(t, term, got)
	})
}

// BenchmarkReadPatternWorkbook measures reading and validating a generated
// 2,000-section term that mixes meeting patterns with the grid (setup
// outside the timed loop).
func BenchmarkReadPatternWorkbook(b *testing.B) {
	var buf bytes.Buffer
	require.NoError(b, timetable.WriteTermWorkbook(samples.GeneratePatterns(samples.Config{Sections: 2000, Seed: 1}), &buf))
	data := buf.Bytes()
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		_, ps, err := timetable.ReadWorkbook(bytes.NewReader(data), "bench.xlsx")
		if err != nil || len(ps.Errors()) > 0 {
			b.Fatalf("%v %v", err, ps.Errors())
		}
	}
}

// BenchmarkValidatePatternTerm measures Validate on the same term.
func BenchmarkValidatePatternTerm(b *testing.B) {
	term := samples.GeneratePatterns(samples.Config{Sections: 2000, Seed: 1})
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if ps := timetable.Validate(term); len(ps.Errors()) > 0 {
			b.Fatal(ps.Errors())
		}
	}
}
