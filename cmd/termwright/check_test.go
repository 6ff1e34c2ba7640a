package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

// The -update flag rewrites golden files; another test file may define it.
func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files under testdata/")
	}
}

func updateGolden() bool {
	f := flag.Lookup("update")
	return f != nil && f.Value.String() == "true"
}

// checkEnv gives an env with captured streams and a fixed clock.
func checkEnv() (*env, *bytes.Buffer, *bytes.Buffer) {
	var out, errb bytes.Buffer
	return &env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb,
		now: func() time.Time { return time.Date(2027, 9, 1, 9, 0, 0, 0, time.UTC) }}, &out, &errb
}

// tinyTerm is a small valid term (invented data); edits replace cells as
// "Sheet!A1" -> value.
func tinyTerm(t *testing.T, edits map[string]string) string {
	sheets := []struct {
		name string
		rows [][]string
	}{
		{"Term", [][]string{{"Key", "Value"}, {"Name", "Spring 2028"}, {"First day", "2028-01-10"}, {"Last day", "2028-03-31"}}},
		{"Periods", [][]string{{"Day", "Start", "End"}, {"Mon", "09:00", "10:00"}, {"Tue", "09:00", "10:00"}}},
		{"Rooms", [][]string{{"Room", "Capacity", "Features", "Building"}, {"R1", "30", "", ""}}},
		{"Staff", [][]string{{"Staff ID", "Name"}, {"S1", "Dana Pell"}}},
		{"Cohorts", [][]string{{"Cohort", "Name", "Size"}, {"C1", "Year one", "20"}}},
		{"Sections", [][]string{{"Section", "Title", "Staff", "Cohorts", "Expected size", "Meetings per week"}, {"A", "Drawing", "S1", "C1", "20", "2"}}},
		{"Enrolments", [][]string{{"Student", "Section"}, {"P1", "A"}, {"P2", "A"}}},
	}
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
				cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
				require.NoError(t, f.SetCellStr(s.name, cell, v))
			}
		}
	}
	for at, v := range edits {
		sheet, cell, _ := strings.Cut(at, "!")
		require.NoError(t, f.SetCellStr(sheet, cell, v))
	}
	path := filepath.Join(t.TempDir(), "term.xlsx")
	require.NoError(t, f.SaveAs(path))
	return path
}

func TestCheckClean(t *testing.T) {
	e, out, errb := checkEnv()
	code := run([]string{"check", tinyTerm(t, nil)}, e)
	assert.Equal(t, exitOK, code, errb.String())
	assert.Equal(t, "Spring 2028: 1 section (2 meetings), 1 staff member, 1 room, 1 cohort, 2 periods, 2 students (2 enrolments)\nNo problems found.\n", out.String())
	assert.Empty(t, errb.String())
}

func TestCheckErrorsFirst(t *testing.T) {
	path := tinyTerm(t, map[string]string{"Sections!C2": "S9", "Rooms!B2": "900", "Enrolments!B3": "Z"})
	e, out, errb := checkEnv()
	code := run([]string{"check", path}, e)
	assert.Equal(t, exitError, code)
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	require.Len(t, lines, 6, out.String())
	assert.Equal(t, `Sections!C2: staff "S9" is not on the Staff sheet — add them to Staff or correct the ID`, lines[1])
	assert.Equal(t, `Enrolments!B3: section "Z" is not on the Sections sheet — correct the ID or add the section`, lines[2])
	assert.True(t, strings.HasPrefix(lines[3], "Rooms!B2: warning: capacity 900 is unusually large"), "warnings after errors: %s", lines[3])
	assert.True(t, strings.HasPrefix(lines[4], `Staff!A2: warning: staff "S1" teaches no section`), lines[4])
	assert.Equal(t, "2 errors, 2 warnings.", lines[5])
	assert.Equal(t, "termwright: "+path+" has 2 errors\n", errb.String())
}

// TestCheckJSON compares the --json report with a golden file (run with
// -update to rewrite it after a deliberate change).
func TestCheckJSON(t *testing.T) {
	path := tinyTerm(t, map[string]string{"Sections!C2": "S9", "Rooms!B2": "900", "Sections!F2": "3"})
	e, out, _ := checkEnv()
	code := run([]string{"check", "--json", path}, e)
	assert.Equal(t, exitError, code)
	var rep checkReport
	require.NoError(t, json.Unmarshal(out.Bytes(), &rep), out.String())
	assert.Equal(t, 1, rep.Summary.Sections)
	assert.Equal(t, 3, rep.Summary.Meetings)

	golden := filepath.Join("testdata", "check.golden.json")
	if updateGolden() {
		require.NoError(t, os.WriteFile(golden, out.Bytes(), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err)
	assert.Equal(t, string(want), out.String())
}

func TestCheckUnreadable(t *testing.T) {
	bad := filepath.Join(t.TempDir(), "term.xlsx")
	require.NoError(t, os.WriteFile(bad, []byte("not a workbook at all"), 0o644))
	for _, tc := range []struct {
		name  string
		args  []string
		want  string
		lines int // a command-line mistake adds the usage line and a pointer to --help
	}{
		{"text file", []string{"check", bad}, "termwright: term.xlsx is a text file, not an .xlsx workbook", 1},
		{"missing", []string{"check", filepath.Join(t.TempDir(), "none.xlsx")}, "does not exist", 1},
		{"no argument", []string{"check"}, "accepts 1 arg(s), received 0\nUsage: termwright check TERM [flags]\n", 3},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := checkEnv()
			assert.Equal(t, exitError, run(tc.args, e))
			assert.Empty(t, out.String())
			assert.Contains(t, errb.String(), tc.want)
			assert.Equal(t, tc.lines, strings.Count(errb.String(), "\n"), "%q", errb.String())
		})
	}
}
