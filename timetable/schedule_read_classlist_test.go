package timetable

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

// ckClassTerm is ckTerm with BIO-101 and ART-120 as courses.
func ckClassTerm() *Term {
	t := ckTerm()
	for i := range t.Sections {
		switch t.Sections[i].ID {
		case "BIO-101":
			t.Sections[i].Course, t.Sections[i].Part = "BIO", "Main"
		case "ART-120":
			t.Sections[i].Course = "ART"
		}
	}
	return t
}

// ckWorkbook writes a workbook with the given sheets, in order.
func ckWorkbook(t testing.TB, sheets ...testSheet) []byte {
	f := excelize.NewFile()
	defer f.Close()
	for i, s := range sheets {
		if i == 0 {
			require.NoError(t, f.SetSheetName("Sheet1", s.name))
		} else {
			_, err := f.NewSheet(s.name)
			require.NoError(t, err)
		}
		for r, row := range s.rows {
			for c, v := range row {
				cell, err := excelize.CoordinatesToCellName(c+1, r+1)
				require.NoError(t, err)
				require.NoError(t, f.SetCellStr(s.name, cell, v))
			}
		}
	}
	var b bytes.Buffer
	_, err := f.WriteTo(&b)
	require.NoError(t, err)
	return b.Bytes()
}

// ckClassRows is a valid class list for ckClassTerm.
func ckClassRows() [][]string {
	return [][]string{
		append([]string(nil), ClassListColumns...),
		{"BIO-101", "BIO", "Main", "", "st7"},
		{"ART-120", "ART", "", "", "st7"},
		{"BIO-101", "", "", "", "st8"},
	}
}

// TestReadClassLists: the Class lists sheet of a timetable workbook gives
// Schedule.Enrolments with their rows; mistakes are reported at their cells.
func TestReadClassLists(t *testing.T) {
	tm := ckClassTerm()
	timetable := testSheet{TimetableSheet, ckTimetableRows(tm, ckSchedule())}
	t.Run("read", func(t *testing.T) {
		s, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", ckWorkbook(t, timetable, testSheet{ClassListSheet, ckClassRows()})), tm)
		require.NoError(t, err)
		require.Empty(t, ps)
		src := func(r int) Source { return Source{Sheet: ClassListSheet, Row: r} }
		assert.Equal(t, []Enrolment{{"st7", "BIO-101", src(2)}, {"st7", "ART-120", src(3)}, {"st8", "BIO-101", src(4)}}, s.Enrolments)
		assert.Len(t, s.Placements, len(ckSchedule().Placements))
	})
	t.Run("no class lists sheet", func(t *testing.T) {
		s, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", ckWorkbook(t, timetable)), tm)
		require.NoError(t, err)
		require.Empty(t, ps)
		assert.Empty(t, s.Enrolments)
	})
	cases := []struct {
		name string
		edit func(rows [][]string) [][]string
		at   string
		sev  Severity
		msg  string
	}{
		{"unknown section", func(r [][]string) [][]string { r[2][0] = "ART-999"; return r }, "Class lists!A3", Error, `section "ART-999" is not on the Sections sheet of the term — correct the ID, or delete the row`},
		{"blank section", func(r [][]string) [][]string { r[2][0] = ""; return r }, "Class lists!A3", Error, "the Section is blank"},
		{"blank student", func(r [][]string) [][]string { r[3][4] = " "; return r }, "Class lists!E4", Error, "the Student is blank — write the student's ID, or delete the row"},
		{"duplicate row", func(r [][]string) [][]string { return append(r, []string{"BIO-101", "", "", "", "st8"}) }, "Class lists!E5", Error, `student "st8" is listed in section "BIO-101" again (first in row 4) — delete the repeat`},
		{"no Student column", func(r [][]string) [][]string { r[0][4] = "Learner"; return r }, "Class lists row 1", Error, "the header row has no Student column"},
		{"unknown column", func(r [][]string) [][]string { r[0][3] = "Notes"; return r }, "Class lists!D1", Warning, `column "Notes" is not a class-list column`},
		{"course disagrees", func(r [][]string) [][]string { r[1][1] = "BIOL"; return r }, "Class lists!B2", Warning, `course "BIOL" differs from the Sections sheet, where section "BIO-101" has "BIO"`},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			rows := tc.edit(ckClassRows())
			s, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", ckWorkbook(t, timetable, testSheet{ClassListSheet, rows})), tm)
			require.NoError(t, err)
			found := false
			for _, p := range ps {
				if p.Pos.String() == tc.at && p.Severity == tc.sev && strings.Contains(p.Msg, tc.msg) {
					found = true
				}
			}
			assert.True(t, found, "want %s %v %q in:\n%s", tc.at, tc.sev, tc.msg, ps)
			for _, e := range s.Enrolments {
				assert.NotEmpty(t, e.Student)
				assert.Contains(t, tm.SectionIndex(), e.Section, "rows in error are left out")
			}
		})
	}
}

// TestReadMeetingsClassLists: with a term, ReadMeetings reads a workbook
// as ReadSchedule does, sectioned students and their problems included, so
// a comparison of two timetables sees who was sectioned where.
func TestReadMeetingsClassLists(t *testing.T) {
	tm := ckClassTerm()
	timetable := testSheet{TimetableSheet, ckTimetableRows(tm, ckSchedule())}
	path := ckWrite(t, "t.xlsx", ckWorkbook(t, timetable, testSheet{ClassListSheet, ckClassRows()}))
	ms, s, ps, err := ReadMeetings(path, tm)
	require.NoError(t, err)
	require.Empty(t, ps)
	want, _, err := ReadSchedule(path, tm)
	require.NoError(t, err)
	require.Len(t, want.Enrolments, 3)
	assert.Equal(t, want, s, "the schedule, sectioned students included, is ReadSchedule's")
	assert.Len(t, ms, len(want.Placements))

	rows := ckClassRows()
	rows[3][4] = ""
	ms, _, ps, err = ReadMeetings(ckWrite(t, "bad.xlsx", ckWorkbook(t, timetable, testSheet{ClassListSheet, rows})), tm)
	require.NoError(t, err)
	assert.Nil(t, ms)
	require.Len(t, ps.Errors(), 1)
	assert.Equal(t, "Class lists!E4", ps.Errors()[0].Pos.String())
}

// TestReadClassListCSV: the CSV form reads the same enrolments, naming the
// file stem as the sheet.
func TestReadClassListCSV(t *testing.T) {
	tm := ckClassTerm()
	es, ps, err := ReadClassListCSV(ckWrite(t, "Class lists.csv", ckCSV(ckClassRows())), tm)
	require.NoError(t, err)
	require.Empty(t, ps)
	require.Len(t, es, 3)
	assert.Equal(t, Enrolment{"st8", "BIO-101", Source{Sheet: "Class lists", Row: 4}}, es[2])
	_, _, err = ReadClassListCSV(ckWrite(t, "x.csv", []byte("a,\"b")), tm)
	assert.ErrorIs(t, err, ErrUnreadable)
}
