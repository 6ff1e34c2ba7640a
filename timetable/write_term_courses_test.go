package timetable_test

import (
	"bytes"
	"strings"
	"testing"
	"unicode"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// courseTerm is handTerm with courses: CHM101 in two parts (a main class and
// two labs that name it as parent), CHM102 in two arrangements (the
// tutorial, or the online elective), limits, and course requests with
// priorities and alternatives. Invented data.
func courseTerm() *timetable.Term {
	t := handTerm()
	set := func(i int, course, arr, part, parent string, limit int) {
		s := &t.Sections[i]
		s.Course, s.Arrangement, s.Part, s.Parent, s.Limit = course, arr, part, parent, limit
	}
	set(0, "CHM101", "", "Main", "", 0)
	set(1, "CHM101", "", "Lab", "CHM101-L", 22)
	set(2, "CHM101", "", "Lab", "CHM101-L", 18)
	set(3, "CHM102", "Tutored", "", "", 22)
	set(4, "CHM102", "Online", "", "", 0)
	t.Requests = []timetable.Request{
		{Student: "Q2700002", Course: "CHM101", Priority: 1},
		{Student: "Q2700002", Course: "CHM102", Alternatives: []string{"CHM101"}},
		{Student: "Q2700003", Course: "CHM102", Priority: 3, Alternatives: []string{"CHM101"}},
	}
	return t
}

// TestCourseTermValidates: the course term is valid, so the round trip of
// TestWriteTermReadBack compares like with like.
func TestCourseTermValidates(t *testing.T) {
	assert.Empty(t, timetable.Validate(courseTerm()))
}

// TestCourseColumnsWritten: a term with courses gets the five course
// columns and the Course requests sheet; blank limit and priority stay blank.
func TestCourseColumnsWritten(t *testing.T) {
	f := openTermWorkbook(t, courseTerm())
	assert.Equal(t, []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights", "Course requests"}, f.GetSheetList())
	rows, err := f.GetRows("Sections")
	require.NoError(t, err)
	assert.Equal(t, []string{"Course", "Arrangement", "Part", "Parent section", "Limit"}, rows[0][12:])
	assert.Equal(t, []string{"CHM101", "", "Lab", "CHM101-L", "22"}, rows[2][12:])
	rows, err = f.GetRows("Course requests")
	require.NoError(t, err)
	assert.Equal(t, [][]string{
		{"Student", "Course", "Priority", "Or instead"},
		{"Q2700002", "CHM101", "1"},
		{"Q2700002", "CHM102", "", "CHM101"},
		{"Q2700003", "CHM102", "3", "CHM101"},
	}, rows)
}

// FuzzWriteCourseTermRoundTrip writes courseTerm with an arbitrary limit,
// priority, arrangement name and list of alternatives and reads it back
// through the workbook and the CSV folder: the term comes back unchanged
// (STYLE.md 14: print → read → print).
func FuzzWriteCourseTermRoundTrip(f *testing.F) {
	f.Add(22, 1, "Tutored", uint8(1))
	f.Add(1_000_000, 1_000_000, "A; B", uint8(0))
	f.Add(0, 0, "=cmd", uint8(3)) // a formula-like cell: SafeCSVCell guards it in CSV
	f.Fuzz(func(t *testing.T, limit, priority int, arr string, alts uint8) {
		clean := func(s string) string { // an ID as a cell holds it: one line, trimmed, no list separators
			s = strings.Map(func(r rune) rune {
				if r == ',' || r == ';' || r < ' ' || r == 0x7f || !utf8.ValidRune(r) || unicode.IsSpace(r) && r != ' ' {
					return -1
				}
				return r
			}, s)
			return strings.TrimSpace(strings.ToValidUTF8(s, ""))
		}
		abs := func(x int) int {
			if x < 0 {
				return -(x + 1)
			}
			return x
		}
		term := courseTerm()
		term.Sections[1].Limit = abs(limit)%1_000_000 + 1
		term.Requests[0].Priority = abs(priority) % 1_000_001
		a := clean(arr)
		if len(a) > 100 {
			a = clean(a[:100]) // cutting may split a character or leave a trailing space
		}
		if a != "" && a != "Online" {
			term.Sections[3].Arrangement = a
		}
		term.Requests[1].Alternatives = nil
		if alts&1 != 0 {
			term.Requests[1].Alternatives = []string{"CHM101"}
		}
		if ps := timetable.Validate(term); len(ps) > 0 {
			t.Skipf("not a valid term: %s", ps)
		}

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
