package timetable

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestReadGoodTerm(t *testing.T) {
	term, ps := readSheets(t, goodSheets())
	require.Empty(t, ps, "the base term must be clean:\n%s", ps)

	assert.Equal(t, "Autumn 2027", term.Name)
	assert.Equal(t, time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), term.FirstDay)
	assert.Equal(t, time.Date(2027, 12, 17, 0, 0, 0, 0, time.UTC), term.LastDay)
	assert.Equal(t, "Europe/Dublin", term.TimeZone)
	assert.Equal(t, []time.Time{time.Date(2027, 10, 25, 0, 0, 0, 0, time.UTC)}, term.Holidays)
	assert.Equal(t, 14, term.TeachingWeeks())

	require.Len(t, term.Periods, 25)
	for i, p := range term.Periods {
		assert.Equal(t, i, p.Index)
	}
	assert.Equal(t, Period{Index: 3, Day: time.Monday, Start: 13 * 60, End: 14 * 60, Src: Source{"Periods", 5}}, term.Periods[3])
	assert.True(t, term.Consecutive(0, 1))
	assert.False(t, term.Consecutive(2, 3), "the lunch gap breaks the run")

	require.Len(t, term.Rooms, 3)
	assert.Equal(t, Room{ID: "R102", Capacity: 25, Features: []string{"lab", "projector"}, Building: "North", Src: Source{"Rooms", 3}}, term.Rooms[1])
	assert.Equal(t, Staff{ID: "S-1", Name: "Ada Quill", Email: "ada@example.edu", MaxPerDay: 4, MaxConsecutive: 3, Src: Source{"Staff", 2}}, term.Staff[0])
	assert.Equal(t, Cohort{ID: "C-2", Name: "Second year", Size: 30, Src: Source{"Cohorts", 3}}, term.Cohorts[1])

	require.Len(t, term.Sections, 4)
	s1, s2, s3, s4 := term.Sections[0], term.Sections[1], term.Sections[2], term.Sections[3]
	assert.Equal(t, []Fixed{{Day: time.Monday, Start: 540, Room: "H1", Text: "Mon 09:00 H1"}}, s1.Fixed)
	assert.Equal(t, term.AllWeeks(), s1.Weeks)
	assert.False(t, s1.SameDay)
	assert.Equal(t, 2, s2.Length)
	assert.Equal(t, []string{"lab"}, s2.Needs)
	assert.Equal(t, WeekSet(0b01010101010101), s2.Weeks, "odd weeks of a 14-week term")
	assert.Equal(t, []string{"S-1", "S-3"}, s3.Staff)
	assert.Equal(t, []string{"R101", "H1"}, s3.Rooms)
	assert.Equal(t, WeekSet(0b111111), s3.Weeks)
	assert.True(t, s3.SameDay)
	assert.Equal(t, 2, s3.MinDays)
	assert.True(t, s4.NoRoom)
	assert.Empty(t, s4.Needs)
	assert.Equal(t, Source{"Sections", 5}, s4.Src)

	assert.Equal(t, Enrolment{Student: "ST2", Section: "SEC-2", Src: Source{"Enrolments", 4}}, term.Enrolments[2])
	require.Len(t, term.Unavailable, 2)
	assert.Equal(t, Unavailability{Who: "S-2", Kind: WhoStaff, Day: time.Friday, From: 0, To: 24 * 60, Hard: true, Reason: "research day", Src: Source{"Unavailable", 2}}, term.Unavailable[0])
	assert.Equal(t, Unavailability{Who: "R101", Kind: WhoRoom, Day: time.Wednesday, From: 780, To: 900, Weight: 3, Reason: "cleaning", Src: Source{"Unavailable", 3}}, term.Unavailable[1])
	assert.Equal(t, []Relation{{Kind: NotSameTime, Sections: []string{"SEC-1", "SEC-4"}, Hard: true, Src: Source{"Relations", 2}}}, term.Relations)
	assert.Equal(t, map[string]Weight{CritStaffGaps: {Weight: 2, Level: 1, Src: Source{"Weights", 2}}}, term.Weights)
	assert.False(t, term.SoftCapacity)

	assert.Equal(t, Counts{Sections: 4, Meetings: 7, Staff: 3, Rooms: 3, Cohorts: 2, Periods: 25, Students: 2, Enrolments: 3}, Summary(term))
	assert.Empty(t, Validate(term), "Validate of a read term agrees with the reader")
}

// TestReadExcelCells reads time and date cells stored as numbers, as a
// spreadsheet program stores them (ECMA-376 Part 1 §18.17.4: the whole part
// counts days in the 1900 date base system, the fraction is the time of day).
func TestReadExcelCells(t *testing.T) {
	sheets := applyEdits(t, goodSheets(),
		cellEdit{sheet: "Periods", cell: "B2", value: "#n:0.375"},             // 09:00
		cellEdit{sheet: "Periods", cell: "C2", value: "#n:0.416666666666667"}, // 10:00
		cellEdit{sheet: "Term", cell: "B3", value: "#n:46643"},                // 2027-09-13
		cellEdit{sheet: "Rooms", cell: "B2", value: "#n:40"},
	)
	term, ps := readSheets(t, sheets)
	require.Empty(t, ps, "%s", ps)
	assert.Equal(t, Clock(540), term.Periods[0].Start)
	assert.Equal(t, Clock(600), term.Periods[0].End)
	assert.Equal(t, time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), term.FirstDay)
	assert.Equal(t, 40, term.Rooms[0].Capacity)
}

func TestReadSortsPeriods(t *testing.T) {
	sheets := applyEdits(t, goodSheets(),
		cellEdit{sheet: "Periods", cell: "A7", value: "Sat"}, // Tue 09:00 becomes Sat 09:00, out of order
	)
	term, ps := readSheets(t, sheets)
	require.Empty(t, ps.Errors(), "%s", ps)
	last := term.Periods[len(term.Periods)-1]
	assert.Equal(t, time.Saturday, last.Day)
	assert.Equal(t, Source{"Periods", 7}, last.Src)
	assert.Equal(t, len(term.Periods)-1, last.Index)
}

// TestCSVEqualsXLSX reads the same data as a workbook and as a CSV folder.
func TestCSVEqualsXLSX(t *testing.T) {
	for _, tc := range []struct {
		name  string
		edits []cellEdit
	}{
		{"clean", nil},
		{"with problems", []cellEdit{
			{sheet: "Sections", cell: "C2", value: "S-117"},
			{sheet: "Periods", cell: "B3", value: "9.00"},
			{sheet: "Rooms", cell: "E1", value: "Colour"},
			{sheet: "Weights", cell: "A2", value: "happiness"},
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sheets := applyEdits(t, goodSheets(), tc.edits...)
			xt, xps := readSheets(t, sheets)
			ct, cps, err := ReadCSVDir(csvDir(t, sheets))
			require.NoError(t, err)
			assert.Equal(t, xt, ct)
			assert.Equal(t, xps, cps)
		})
	}
}

func TestReadCSVDialects(t *testing.T) {
	for _, tc := range []struct {
		name, data string
		want       []string
		wantErr    string
	}{
		{"comma", "Room,Capacity\nR1,30\n", []string{"R1", "30"}, ""},
		{"byte order mark", "\xEF\xBB\xBFRoom,Capacity\nR1,30\n", []string{"R1", "30"}, ""},
		{"semicolons", "Room;Capacity\nR1;30\n", []string{"R1", "30"}, ""},
		{"crlf", "Room,Capacity\r\nR1,30\r\n", []string{"R1", "30"}, ""},
		{"quoted comma", "Room,Features\nR1,\"lab, projector\"\n", []string{"R1", "lab, projector"}, ""},
		{"bad quote", "Room,Capacity\nR1,\"30\n", nil, "Rooms row 2: the line cannot be read as CSV"},
		{"not utf-8", "Room,Capacity\nR\xe91,30\n", nil, "Rooms: the file is not UTF-8 text"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			rs, p := readCSV([]byte(tc.data), "Rooms")
			if tc.wantErr != "" {
				require.NotNil(t, p)
				assert.Contains(t, p.String(), tc.wantErr)
				return
			}
			require.Nil(t, p)
			require.Len(t, rs.rows, 2)
			assert.Equal(t, tc.want, rs.rows[1])
			assert.Equal(t, []int{1, 2}, rs.line)
		})
	}
}
