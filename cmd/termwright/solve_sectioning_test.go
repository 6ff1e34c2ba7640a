package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// solveCourseTerm is a term with one requested course, STA100: a main class
// (limit 5) with two tutorials that belong to it (limits t1 and t2), each
// taught by its own person in its own room so that any two can meet at
// once, four Monday periods, and students S1..S<n> asking for STA100.
func solveCourseTerm(n, t1, t2 int) *timetable.Term {
	t := &timetable.Term{
		Name:     "Sectioned",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 9, 24, 0, 0, 0, 0, time.UTC),
		TimeZone: "UTC",
		Rooms:    []timetable.Room{{ID: "R1", Capacity: 30}, {ID: "R2", Capacity: 30}, {ID: "R3", Capacity: 30}},
		Staff:    []timetable.Staff{{ID: "P1", Name: "Pia Lund"}, {ID: "P2", Name: "Olek Marr"}, {ID: "P3", Name: "Ruth Enver"}},
	}
	for k := 0; k < 4; k++ {
		start := timetable.Clock(9*60 + 60*k)
		t.Periods = append(t.Periods, timetable.Period{Index: k, Day: time.Monday, Start: start, End: start + 60})
	}
	sec := func(id, staff, part, parent string, limit int) timetable.Section {
		return timetable.Section{ID: id, Title: "Statistics " + part, Staff: []string{staff}, Size: 10, Meetings: 1, Length: 1,
			Weeks: t.AllWeeks(), Course: "STA100", Part: part, Parent: parent, Limit: limit}
	}
	t.Sections = []timetable.Section{sec("STA100-L", "P1", "Main", "", 5), sec("STA100-T1", "P2", "Tutorial", "STA100-L", t1), sec("STA100-T2", "P3", "Tutorial", "STA100-L", t2)}
	for i := 1; i <= n; i++ {
		t.Requests = append(t.Requests, timetable.Request{Student: "S" + string(rune('0'+i)), Course: "STA100"})
	}
	return t
}

// TestSolveWithRequests solves a term in which five students ask for a
// course whose tutorials hold four (limits 2 and 2): the output names one
// unmet request with its reason and both tutorials full; the workbook's
// Class lists sheet holds the eight seats (four students, main class and
// tutorial each) and reads back as the timetable's sectioned students,
// which pass timetable.Check's seating rule; the Sectioning sheet lists
// the unmet request and the full tutorials.
func TestSolveWithRequests(t *testing.T) {
	dir := t.TempDir()
	termPath := solveWriteTerm(t, dir, solveCourseTerm(5, 2, 2))
	out := filepath.Join(dir, "tt.xlsx")
	e, stdout, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"solve", termPath, "-o", out, "--time-limit", "0", "--steps", "5"}, e), "stderr: %s", stderr)
	text := stdout.String()
	assert.Contains(t, text, "Sectioning: 4 of 5 course requests met, 8 student places in sections; 2 full and 0 nearly full sections; 0 students with clashes.")
	assert.Contains(t, text, "Requests not met:\n  S")
	assert.Contains(t, text, "Full sections:\n  STA100-T1 (STA100): 2 of 2 places taken\n  STA100-T2 (STA100): 2 of 2 places taken\n")
	// The summary, from "Sectioning:" to the program line, is fixed by the
	// seed: golden file.
	from, to := strings.Index(text, "Sectioning:"), strings.Index(text, "Program:")
	require.True(t, from >= 0 && to > from, text)
	solveGolden(t, "testdata/solve-sectioning.golden.txt", []byte(text[from:to]))

	term, ps, err := timetable.Load(termPath)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	s, ps, err := timetable.ReadSchedule(out, term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.Len(t, s.Enrolments, 8)
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, s)), "the seating rule holds")

	f, err := excelize.OpenFile(out)
	require.NoError(t, err)
	defer f.Close()
	rows, err := f.GetRows(export.SectioningSheet)
	require.NoError(t, err)
	require.Len(t, rows, 4, "header, one unmet request, two full tutorials")
	assert.Equal(t, export.FindingUnplaced, rows[1][0])
	assert.NotEmpty(t, rows[1][6], "with the sectioner's reason")
	assert.Equal(t, []string{export.FindingFull, "", "STA100", "STA100-T1", "2", "2", "2 of 2 places taken"}, rows[2][:7])

	// publish of the workbook writes the class lists; publish of a CSV
	// timetable (no class lists) says that nobody is seated in it.
	e, _, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"publish", termPath, out, "-o", filepath.Join(dir, "pub")}, e), "stderr: %s", stderr)
	assert.FileExists(t, filepath.Join(dir, "pub", "classlists.csv"))
	assert.NotContains(t, stderr.String(), "no class lists")
	csvPath := filepath.Join(dir, "tt.csv")
	fh, err := os.Create(csvPath)
	require.NoError(t, err)
	require.NoError(t, export.WriteTimetableCSV(fh, term, s))
	require.NoError(t, fh.Close())
	e, _, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"publish", termPath, csvPath, "-o", filepath.Join(dir, "pub2")}, e), "stderr: %s", stderr)
	assert.Contains(t, stderr.String(), "tt.csv has no class lists, so none of the term's 5 course requests is met in it")

	// check counts the courses and requests; verify reports the same
	// sectioning from the written timetable alone.
	e, stdout, stderr = solveEnv()
	run([]string{"check", termPath}, e)
	assert.Contains(t, stdout.String(), "Sectioning: 1 requested course (3 sections), 5 course requests from 5 students.\n", "stderr: %s", stderr)
	e, stdout, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"verify", termPath, out}, e), "stderr: %s", stderr)
	assert.Contains(t, stdout.String(), "Sectioning: 4 of 5 course requests met, 8 student places in sections; 2 full and 0 nearly full sections; 0 students with clashes.")
}

// TestSolveKeepMovesFewStudents solves a term where four students fill
// two tutorials of limit 2, then lowers the first tutorial's limit to 1
// and raises the second's to 3, and solves again keeping the first
// timetable: exactly one student has to change tutorial (one seat fewer
// in T1; the main class has room for all), and the change report, text and
// JSON and the Moved students sheet, names that one student moving from
// STA100-T1 to STA100-T2. diff and notify then tell that student of the
// change of section.
func TestSolveKeepMovesFewStudents(t *testing.T) {
	dir := t.TempDir()
	first := solveWriteTerm(t, dir, solveCourseTerm(4, 2, 2))
	v1 := filepath.Join(dir, "v1.xlsx")
	e, _, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"solve", first, "-o", v1, "--time-limit", "0", "--steps", "5"}, e), "stderr: %s", stderr)

	dir2 := filepath.Join(dir, "late")
	require.NoError(t, os.Mkdir(dir2, 0o755))
	second := solveWriteTerm(t, dir2, solveCourseTerm(4, 1, 3))
	v2 := filepath.Join(dir, "v2.xlsx")
	e, stdout, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"solve", second, "-o", v2, "--keep", v1, "--time-limit", "0", "--steps", "5", "--json"}, e), "stderr: %s", stderr)
	var rep solveReport
	require.NoError(t, json.Unmarshal(stdout.Bytes(), &rep))
	require.NotNil(t, rep.Sectioning)
	require.Len(t, rep.Sectioning.Moves, 1, "one student leaves T1, nobody else moves")
	mv := rep.Sectioning.Moves[0]
	assert.Equal(t, "STA100-T1", mv.From)
	assert.Equal(t, "STA100-T2", mv.To)
	assert.Equal(t, 0, rep.Sectioning.Unplaced)

	f, err := excelize.OpenFile(v2)
	require.NoError(t, err)
	rows, err := f.GetRows("Moved students")
	require.NoError(t, err)
	f.Close()
	assert.Equal(t, [][]string{{"Student", "Course", "From section", "To section"}, {mv.Student, "STA100", "STA100-T1", "STA100-T2"}}, rows)

	e, stdout, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"diff", v1, v2, second}, e), "stderr: %s", stderr)
	assert.Contains(t, stdout.String(), "; 1 student change of section\n")
	assert.Contains(t, stdout.String(), "Students\n  "+mv.Student+"\n    STA100 Tutorial: section STA100-T1 → STA100-T2\n")

	notes := filepath.Join(dir, "notes")
	e, stdout, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"notify", second, v1, v2, "-o", notes}, e), "stderr: %s", stderr)
	assert.Contains(t, stdout.String(), mv.Student+": 1 change")
	txt, err := os.ReadFile(filepath.Join(notes, "students", mv.Student+".txt"))
	require.NoError(t, err)
	assert.Contains(t, string(txt), "STA100 Tutorial: your section is now STA100-T2 instead of STA100-T1\n  was: STA100-T1 meeting 1, Mondays ")
	cal, err := os.ReadFile(filepath.Join(notes, "students", mv.Student+".ics"))
	require.NoError(t, err)
	assert.Contains(t, string(cal), "STATUS:CANCELLED", "the tutorial left is cancelled in the student's calendar")
	assert.Equal(t, 1, strings.Count(string(cal), "STATUS:CANCELLED"))
}

// TestMoveLines groups the moved students one line per student and
// course: changes of section, then sections joined, then sections left.
func TestMoveLines(t *testing.T) {
	for _, tc := range []struct {
		name  string
		moves []solveStudentMove
		want  []string
	}{
		{"one change", []solveStudentMove{{"S1", "C1", "T1", "T2"}}, []string{"S1 C1: T1 → T2"}},
		{"left a course", []solveStudentMove{{"S2", "C1", "L", ""}, {"S2", "C1", "T2", ""}}, []string{"S2 C1: no longer in L, T2"}},
		{"joined and changed", []solveStudentMove{{"S3", "C1", "", "L"}, {"S3", "C1", "T1", "T2"}, {"S3", "C2", "X", "Y"}},
			[]string{"S3 C1: T1 → T2; now in L", "S3 C2: X → Y"}},
		{"none", nil, []string{}},
	} {
		t.Run(tc.name, func(t *testing.T) { assert.Equal(t, tc.want, moveLines(tc.moves)) })
	}
}

// TestSolvePublishStudents: solve --publish DIR --students writes the
// per-student grids and calendars that publish --students writes from the
// same timetable (the same files under pdf/students and calendar/students);
// --students without --publish is refused.
func TestSolvePublishStudents(t *testing.T) {
	dir := t.TempDir()
	termPath := solveWriteTerm(t, dir, solveCourseTerm(5, 2, 2))
	out, pub, again := filepath.Join(dir, "tt.xlsx"), filepath.Join(dir, "pub"), filepath.Join(dir, "again")
	e, _, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"solve", termPath, "-o", out, "--publish", pub, "--students", "--time-limit", "0", "--steps", "5"}, e), "stderr: %s", stderr)
	e, _, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"publish", termPath, out, "-o", again, "--students"}, e), "stderr: %s", stderr)
	for _, sub := range []string{"pdf/students", "calendar/students"} {
		names := func(root string) []string {
			es, err := os.ReadDir(filepath.Join(root, sub))
			require.NoError(t, err)
			var out []string
			for _, de := range es {
				out = append(out, de.Name())
			}
			return out
		}
		got := names(pub)
		assert.Len(t, got, 4, "%s: the four sectioned students", sub)
		assert.Equal(t, names(again), got, sub)
	}

	e, _, stderr = solveEnv()
	assert.Equal(t, exitError, run([]string{"solve", termPath, "-o", filepath.Join(dir, "x.xlsx"), "--students"}, e))
	assert.Contains(t, stderr.String(), "give --publish DIR too")
}
