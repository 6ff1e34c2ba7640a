package export

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func TestTimetableCSV(t *testing.T) {
	term, s := demoTerm()
	var buf bytes.Buffer
	require.NoError(t, WriteTimetableCSV(&buf, term, s))
	golden(t, "timetable.csv", buf.Bytes())

	// RFC 4180 §2: records end in CRLF.
	assert.Contains(t, buf.String(), "\r\n")
	rows, err := csv.NewReader(bytes.NewReader(buf.Bytes())).ReadAll()
	require.NoError(t, err)
	require.Len(t, rows, 1+len(s.Placements))
	assert.Equal(t, CSVColumns, rows[0])
	assert.Equal(t, timetable.TimetableColumns, rows[0])
	assert.Equal(t, []string{"CS101", "Introduction to Programming", "1", "Mon", "09:00", "11:00", "R101", "S1", "C1"}, rows[1])
}

func TestTimetableJSON(t *testing.T) {
	term, s := demoTerm()
	var buf bytes.Buffer
	require.NoError(t, WriteTimetableJSON(&buf, term, s))
	golden(t, "timetable.json", buf.Bytes())

	var doc TimetableJSON
	require.NoError(t, json.Unmarshal(buf.Bytes(), &doc))
	require.Len(t, doc.Meetings, len(s.Placements))
	assert.Equal(t, "2027-09-13", doc.Term.FirstDay)
	assert.Equal(t, 13, doc.Term.TeachingWeeks)
	ch201 := doc.Meetings[0]
	for _, m := range doc.Meetings {
		if m.Section == "CH201" {
			ch201 = m
		}
	}
	assert.Equal(t, []int{1, 2, 3, 4, 5, 6}, ch201.Weeks)
	assert.Equal(t, "Thu", ch201.Day)
	assert.Equal(t, "17:00", ch201.End)
}

func TestViewRejectsBadPlacements(t *testing.T) {
	term, _ := demoTerm()
	bad := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "NOPE", Meeting: 1, Period: 0, Src: timetable.Source{Sheet: "Timetable", Row: 2}},
		{Section: "CS101", Meeting: 1, Period: 3, Room: "R101", Src: timetable.Source{Sheet: "Timetable", Row: 3}}, // 12:00 + 2 periods crosses lunch
		{Section: "CS102", Meeting: 1, Period: 0, Room: "ZZ"},
		{Section: "CS102", Meeting: 1, Period: 999},
	}}
	err := WriteTimetableCSV(&bytes.Buffer{}, term, bad)
	require.Error(t, err)
	for _, want := range []string{"Timetable row 2", `"NOPE"`, "Timetable row 3", "does not fit", `room "ZZ"`, "period 999"} {
		assert.Contains(t, err.Error(), want)
	}
}
