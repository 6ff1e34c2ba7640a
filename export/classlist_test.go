package export

import (
	"bytes"
	"encoding/csv"
	"fmt"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// TestClassListCSV writes the class lists of the sectioned term: golden
// file, RFC 4180 with CRLF (encoding/csv reads it back), one row per
// sectioned student and section sorted by section then student, and the
// formula-like student ID "=cmd" quoted (OWASP "CSV Injection").
func TestClassListCSV(t *testing.T) {
	term, s := sectionedTerm()
	var b bytes.Buffer
	require.NoError(t, WriteClassListCSV(&b, term, s))
	golden(t, "classlists.csv", b.Bytes())
	assert.True(t, bytes.HasSuffix(b.Bytes(), []byte("\r\n")))
	rows, err := csv.NewReader(bytes.NewReader(b.Bytes())).ReadAll()
	require.NoError(t, err)
	require.Len(t, rows, 1+len(s.Enrolments))
	assert.Equal(t, timetable.ClassListColumns, rows[0])
	assert.True(t, slices.IsSortedFunc(rows[1:], func(a, b []string) int {
		if c := strings.Compare(a[0], b[0]); c != 0 {
			return c
		}
		return strings.Compare(a[4], b[4])
	}), "sorted by section, then student")
	assert.Contains(t, rows, []string{"MA110-L1", "MA110", "Main", "Calculus I", "'=cmd"})
	for _, r := range rows[1:] {
		assert.NotEqual(t, "CH203", r[0], "fixed enrolments are term data, not class-list rows")
	}
}

// TestClassListsSheet reads the timetable workbook of the sectioned term
// with excelize: the Class lists sheet holds exactly the CSV's rows (the
// ID "=cmd" as a text cell, not a formula) under a real AutoFilter, and
// the Sectioning sheet the findings; a term without requests gets neither
// sheet, so its workbook keeps the sheets it had.
func TestClassListsSheet(t *testing.T) {
	term, s := sectionedTerm()
	var b bytes.Buffer
	require.NoError(t, WriteTimetableWorkbook(&b, term, s, Options{Generated: fixedClock, Reasons: sectionedReasons}))
	f, err := excelize.OpenReader(bytes.NewReader(b.Bytes()))
	require.NoError(t, err)
	defer f.Close()
	sheets := f.GetSheetList()
	require.Contains(t, sheets, timetable.ClassListSheet)
	require.Contains(t, sheets, SectioningSheet)
	assert.Equal(t, LoadSheet, sheets[slices.Index(sheets, timetable.ClassListSheet)-1], "after the Load sheet")

	got, err := f.GetRows(timetable.ClassListSheet)
	require.NoError(t, err)
	var csvOut bytes.Buffer
	require.NoError(t, WriteClassListCSV(&csvOut, term, s))
	want, err := csv.NewReader(&csvOut).ReadAll()
	require.NoError(t, err)
	for _, r := range want {
		for i, c := range r {
			r[i] = strings.TrimPrefix(c, "'")
		}
	}
	assert.Equal(t, want, got)
	formula, err := f.GetCellFormula(timetable.ClassListSheet, "E2")
	require.NoError(t, err)
	assert.Empty(t, formula)
	assert.Equal(t, "=cmd", got[1][4])

	rep, err := f.GetRows(SectioningSheet)
	require.NoError(t, err)
	assert.Equal(t, SectioningColumns, rep[0])
	fs, err := SectioningFindings(term, s, sectionedReasons)
	require.NoError(t, err)
	assert.Len(t, rep, 1+len(fs))

	plain, ps := demoTerm()
	b.Reset()
	require.NoError(t, WriteTimetableWorkbook(&b, plain, ps, Options{Generated: fixedClock}))
	f2, err := excelize.OpenReader(bytes.NewReader(b.Bytes()))
	require.NoError(t, err)
	defer f2.Close()
	assert.NotContains(t, f2.GetSheetList(), timetable.ClassListSheet)
	assert.NotContains(t, f2.GetSheetList(), SectioningSheet)
}

// TestSectioningFindings checks the report of the sectioned term against
// the fixture worked out by hand: st-012's request unplaced with the
// sectioner's reason and its Course requests row, st-013's met by its
// alternative (not listed); both tutorials full (2 of 2), the main class
// not listed (4 of 5 is 80%, under NearlyFullPercent); st-001's tutorial MA110-T1 (Mon 10:00)
// meets together with its fixed CS101 (Mon 09:00-11:00). Golden file for
// the report's text form.
func TestSectioningFindings(t *testing.T) {
	term, s := sectionedTerm()
	fs, err := SectioningFindings(term, s, sectionedReasons)
	require.NoError(t, err)
	var b strings.Builder
	for _, f := range fs {
		fmt.Fprintf(&b, "%s\t%s\t%s\t%s\t%d\t%d\t%s\t%s\n", f.Kind, f.Student, f.Course, f.Section, f.Students, f.Limit, f.Details, f.Where)
	}
	golden(t, "sectioning-report.tsv", []byte(b.String()))
	kinds := map[string]int{}
	for _, f := range fs {
		kinds[f.Kind]++
	}
	assert.Equal(t, map[string]int{FindingUnplaced: 1, FindingFull: 2, FindingClash: 1}, kinds)
	assert.Equal(t, Finding{Kind: FindingUnplaced, Student: "st-012", Course: "MA110", Details: sectionedReasons[4], Where: "Course requests row 6"}, fs[0])
	assert.Equal(t, "st-001", fs[3].Student)
	assert.Equal(t, "CS101", fs[3].Section)
	assert.Equal(t, "meets together with MA110-T1 at Mon 10:00–11:00", fs[3].Details)

	fs, err = SectioningFindings(term, s, nil)
	require.NoError(t, err)
	assert.Equal(t, "not placed in the course or any of its alternatives", fs[0].Details)
}

// TestStaffClassLists reads back S5's class-list workbook (the two
// tutorials): the first sheet lists both sections' students, each
// section's sheet carries its meeting, head count against its limit and
// its students; S1's (CS101, CS103) lists CS101's fixed students as
// fixed. Publish writes one per staff member with students (fixed
// students count: S4 has only CH202's), the class-list CSV, and with
// Students a PDF and a calendar for a student who is only sectioned.
func TestStaffClassLists(t *testing.T) {
	term, s := sectionedTerm()
	var b bytes.Buffer
	require.NoError(t, WriteStaffClassLists(&b, term, s, "S5", Options{Generated: fixedClock}))
	f, err := excelize.OpenReader(bytes.NewReader(b.Bytes()))
	require.NoError(t, err)
	defer f.Close()
	assert.Equal(t, []string{ClassListsSheet, "MA110-T1", "MA110-T2"}, f.GetSheetList())
	rows, err := f.GetRows(ClassListsSheet)
	require.NoError(t, err)
	assert.Equal(t, [][]string{StaffClassListColumns,
		{"MA110-T1", "MA110", "Tutorial", "Calculus I tutorial", "=cmd", "sectioned"},
		{"MA110-T1", "MA110", "Tutorial", "Calculus I tutorial", "st-001", "sectioned"},
		{"MA110-T2", "MA110", "Tutorial", "Calculus I tutorial", "st-010", "sectioned"},
		{"MA110-T2", "MA110", "Tutorial", "Calculus I tutorial", "st-011", "sectioned"},
	}, rows)
	sec, err := f.GetRows("MA110-T1")
	require.NoError(t, err)
	golden(t, "classlist-S5-MA110-T1.txt", []byte(dumpRows(sec)))
	assert.Equal(t, "Meeting 1: Mon 10:00–11:00, R999", sec[2][0], "every week: no weeks named")
	assert.Equal(t, "2 students (limit 2)", sec[3][0])

	b.Reset()
	require.NoError(t, WriteStaffClassLists(&b, term, s, "S1", Options{Generated: fixedClock}))
	f1, err := excelize.OpenReader(bytes.NewReader(b.Bytes()))
	require.NoError(t, err)
	defer f1.Close()
	rows, err = f1.GetRows(ClassListsSheet)
	require.NoError(t, err)
	assert.Contains(t, rows, []string{"CS101", "", "", "Introduction to Programming", "st-001", "fixed"})
	assert.Error(t, WriteStaffClassLists(&b, term, s, "nobody", Options{}))

	dir := filepath.Join(t.TempDir(), "pub")
	m, err := Publish(dir, term, s, Options{Generated: fixedClock, Students: true})
	require.NoError(t, err)
	var paths []string
	for _, file := range m.Files {
		paths = append(paths, file.Path)
	}
	for _, p := range []string{"classlists.csv", "classlists/staff/S1.xlsx", "classlists/staff/S2.xlsx", "classlists/staff/S3.xlsx",
		"classlists/staff/S4.xlsx", "classlists/staff/S5.xlsx", "pdf/students/st-010.pdf", "calendar/students/st-010.ics"} {
		assert.Contains(t, paths, p)
	}
	data, err := os.ReadFile(filepath.Join(dir, "classlists.csv"))
	require.NoError(t, err)
	var direct bytes.Buffer
	require.NoError(t, WriteClassListCSV(&direct, term, s))
	assert.Equal(t, direct.Bytes(), data)
}

// dumpRows is a sheet's rows as tab-separated lines.
func dumpRows(rows [][]string) string {
	var b strings.Builder
	for _, r := range rows {
		b.WriteString(strings.Join(r, "\t"))
		b.WriteString("\n")
	}
	return b.String()
}

// TestSectionFill checks the full and nearly full thresholds at their
// edges: full when no place is left, nearly full from 90% of the limit
// (NearlyFullPercent, common practice).
func TestSectionFill(t *testing.T) {
	for _, tc := range []struct {
		students, limit int
		full, nearly    bool
		details         string
	}{
		{9, 10, false, true, "9 of 10 places taken, 1 free"},
		{8, 10, false, false, "8 of 10 places taken, 2 free"},
		{10, 10, true, false, "10 of 10 places taken"},
		{12, 10, true, false, "12 of 10 places taken (2 over the limit)"},
		{4, 5, false, false, "4 of 5 places taken, 1 free"},
		{1, 1, true, false, "1 of 1 places taken"},
		{0, 1, false, false, "0 of 1 places taken, 1 free"},
		{27, 30, false, true, "27 of 30 places taken, 3 free"},
	} {
		t.Run(tc.details, func(t *testing.T) {
			full, nearly := sectionFill(tc.students, tc.limit)
			assert.Equal(t, tc.full, full)
			assert.Equal(t, tc.nearly, nearly)
			assert.Equal(t, tc.details, FillDetails(tc.students, tc.limit))
		})
	}
}

// TestSectioningFindingsTravel: a student whose two pattern sections leave
// 10 free minutes (MA110 ends Mon 09:50 in A1, Aula; ST140 starts 10:00 in
// L2, Science Wing) where the Travel sheet asks 15 gets a clash line, as
// timetable.Cost counts it (criterion "student clashes", criteria.go);
// with 10 minutes of travel there is none.
func TestSectioningFindingsTravel(t *testing.T) {
	term, s := patternTerm()
	mwf := timetable.DaysOf(time.Monday, time.Wednesday, time.Friday)
	term.Sections = append(term.Sections, timetable.Section{ID: "ST140", Title: "Statistics", Staff: []string{"S5"}, Size: 10,
		Course: "ST140", Src: timetable.Source{Sheet: "Sections", Row: 40},
		Times: []timetable.TimeChoice{{Days: mwf, Start: 10 * 60, Minutes: 50, Weeks: term.AllWeeks()}}})
	s.Placements = append(s.Placements, timetable.Placement{Section: "ST140", Meeting: 1, Period: -1, Time: 1, Room: "L2"})
	term.Enrolments = append(term.Enrolments, timetable.Enrolment{Student: "st-500", Section: "MA110"}, timetable.Enrolment{Student: "st-500", Section: "ST140"})
	term.Travel = []timetable.Travel{{From: "Aula", To: "Science Wing", Minutes: 15}}
	require.Equal(t, int64(1), timetable.Cost(term, s, nil).Criterion(timetable.CritStudentClash).Count)
	fs, err := SectioningFindings(term, s, nil)
	require.NoError(t, err)
	var clashes []Finding
	for _, f := range fs {
		if f.Kind == FindingClash {
			clashes = append(clashes, f)
		}
	}
	require.Len(t, clashes, 1)
	assert.Equal(t, Finding{Kind: FindingClash, Student: "st-500", Section: "MA110", // no course, no row in the fixture
		Details: "too little time to travel between it and ST140 on Mon 09:50–10:00 (10 minutes to get from A1 to L2, which takes 15 minutes)"}, clashes[0])

	term.Travel[0].Minutes = 10
	fs, err = SectioningFindings(term, s, nil)
	require.NoError(t, err)
	for _, f := range fs {
		assert.NotEqual(t, FindingClash, f.Kind, "%+v", f)
	}
}
