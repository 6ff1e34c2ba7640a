package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"slices"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// The -update flag rewrites golden files; another test file may define it.
func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files under testdata/")
	}
}

// verifyDir holds a small hand-made term (CSV folder, invented data) and
// timetables for it: good.csv passes; clash.csv has a staff double
// booking, a room without the needed lab, a meeting in a hard unavailable
// time, a student clash and a Staff cell that disagrees with the term;
// badrows.csv has a start time that is not in the grid.
var verifyDir = filepath.Join("testdata", "verify")

// runVerifyCmd runs `termwright verify args...` with captured streams.
func runVerifyCmd(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	e := &env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb,
		now: func() time.Time { return time.Date(2028, 1, 3, 9, 0, 0, 0, time.UTC) }}
	code = run(append([]string{"verify"}, args...), e)
	return code, out.String(), errb.String()
}

// verifyGolden compares got with the golden file, rewriting it with -update.
func verifyGolden(t *testing.T, name, got string) {
	t.Helper()
	golden := filepath.Join(verifyDir, name)
	if f := flag.Lookup("update"); f != nil && f.Value.String() == "true" {
		require.NoError(t, os.WriteFile(golden, []byte(got), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err)
	assert.Equal(t, string(want), got)
}

func TestVerifyExitCodes(t *testing.T) {
	term := filepath.Join(verifyDir, "term")
	broken := t.TempDir()
	for _, f := range []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections"} {
		data, err := os.ReadFile(filepath.Join(term, f+".csv"))
		require.NoError(t, err)
		if f == "Sections" {
			data = bytes.Replace(data, []byte("GEO120,Field Methods,T-02"), []byte("GEO120,Field Methods,T-99"), 1)
		}
		require.NoError(t, os.WriteFile(filepath.Join(broken, f+".csv"), data, 0o644))
	}
	cases := []struct {
		name   string
		args   []string
		code   int
		stdout string // expected in stdout
		stderr string // expected in stderr
	}{
		{"clean timetable", []string{term, filepath.Join(verifyDir, "good.csv")}, exitOK, "No hard requirement is broken.", ""},
		{"clashes", []string{term, filepath.Join(verifyDir, "clash.csv")}, exitError, "The timetable breaks 3 hard requirements.", "breaks 3 hard requirements"},
		{"unreadable row", []string{term, filepath.Join(verifyDir, "badrows.csv")}, exitError, "badrows!E3: no period starts at Tue 09:30", "breaks 1 hard requirement"},
		{"missing term", []string{filepath.Join(verifyDir, "nope"), filepath.Join(verifyDir, "good.csv")}, exitError, "", "does not exist"},
		{"missing timetable", []string{term, filepath.Join(verifyDir, "nope.xlsx")}, exitError, "", "nope.xlsx does not exist"},
		{"term with errors", []string{broken, filepath.Join(verifyDir, "good.csv")}, exitError, "", "fix them first"},
		{"one argument", []string{term}, exitError, "", "accepts 2 arg(s)"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			code, out, errs := runVerifyCmd(tc.args...)
			assert.Equal(t, tc.code, code, "stdout:\n%s\nstderr:\n%s", out, errs)
			assert.Contains(t, out, tc.stdout)
			assert.Contains(t, errs, tc.stderr)
			assert.NotContains(t, errs, "goroutine", "no stack trace")
		})
	}
}

// TestVerifyText compares the report for people with its golden file (run
// with -update to rewrite it after a deliberate change).
func TestVerifyText(t *testing.T) {
	code, out, _ := runVerifyCmd(filepath.Join(verifyDir, "term"), filepath.Join(verifyDir, "clash.csv"))
	assert.Equal(t, exitError, code)
	verifyGolden(t, "clash.golden.txt", out)
}

// TestVerifyJSON checks the --json report's content and compares it with
// its golden file.
func TestVerifyJSON(t *testing.T) {
	code, out, _ := runVerifyCmd("--json", filepath.Join(verifyDir, "term"), filepath.Join(verifyDir, "clash.csv"))
	assert.Equal(t, exitError, code)
	var rep verifyReport
	require.NoError(t, json.Unmarshal([]byte(out), &rep), out)
	assert.False(t, rep.OK)
	assert.Equal(t, 4, rep.Meetings)
	assert.Equal(t, 3, rep.Hard)
	assert.Equal(t, 1, rep.Soft)
	var rules []string
	for _, v := range rep.Violations {
		rules = append(rules, v.Rule)
	}
	assert.Equal(t, []string{timetable.RuleStaffClash, timetable.RuleFeatures, timetable.RuleUnavailable, timetable.RuleStudentClash}, rules)
	assert.Equal(t, []int{2, 5}, rep.Violations[0].Rows)
	assert.Equal(t, []string{"Sections row 2", "Sections row 4", "Staff row 2"}, rep.Violations[0].Sources)
	require.Len(t, rep.Problems, 1)
	assert.Equal(t, "clash!H5", rep.Problems[0].Where)
	assert.Equal(t, "warning", rep.Problems[0].Severity)
	assert.NotEmpty(t, rep.Caution, "a room lacks a needed feature")
	verifyGolden(t, "clash.golden.json", out)

	code, out, _ = runVerifyCmd("--json", filepath.Join(verifyDir, "term"), filepath.Join(verifyDir, "good.csv"))
	assert.Equal(t, exitOK, code)
	var clean verifyReport
	require.NoError(t, json.Unmarshal([]byte(out), &clean))
	assert.True(t, clean.OK)
	assert.Empty(t, clean.Violations)
	assert.Empty(t, clean.Caution)
}

// TestVerifyExportedWorkbook writes a generated term and its feasible
// timetable with the export package, verifies it, then moves one meeting
// onto another of the same staff member and expects verify to name it.
func TestVerifyExportedWorkbook(t *testing.T) {
	term, w := samples.GenerateWithWitness(samples.Config{Sections: 40, Seed: 9})
	dir := t.TempDir()
	termPath := filepath.Join(dir, "term.xlsx")
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
	require.NoError(t, os.WriteFile(termPath, buf.Bytes(), 0o644))
	write := func(name string, s *timetable.Schedule) string {
		var b bytes.Buffer
		require.NoError(t, export.WriteTimetableWorkbook(&b, term, s, export.Options{}))
		p := filepath.Join(dir, name)
		require.NoError(t, os.WriteFile(p, b.Bytes(), 0o644))
		return p
	}

	code, out, errs := runVerifyCmd(termPath, write("good.xlsx", w))
	require.Equal(t, exitOK, code, "%s\n%s", out, errs)

	// Move a meeting of one section onto a meeting of another section taught
	// by the same staff member.
	secs := term.SectionIndex()
	moved := &timetable.Schedule{Placements: slices.Clone(w.Placements)}
	found := false
	for i := 0; i < len(moved.Placements) && !found; i++ {
		for j := range moved.Placements {
			a, b := term.Sections[secs[moved.Placements[i].Section]], term.Sections[secs[moved.Placements[j].Section]]
			if a.ID != b.ID && a.Length == b.Length && len(a.Staff) > 0 && slices.Contains(b.Staff, a.Staff[0]) {
				moved.Placements[i].Period = moved.Placements[j].Period
				found = true
				break
			}
		}
	}
	require.True(t, found, "two sections share a staff member")
	code, out, _ = runVerifyCmd("--json", termPath, write("moved.xlsx", moved))
	assert.Equal(t, exitError, code)
	var rep verifyReport
	require.NoError(t, json.Unmarshal([]byte(out), &rep), out)
	var staff []verifyViolation
	for _, v := range rep.Violations {
		if v.Rule == timetable.RuleStaffClash {
			staff = append(staff, v)
		}
	}
	require.NotEmpty(t, staff, out)
	assert.Len(t, staff[0].Rows, 2)
	assert.True(t, strings.HasPrefix(staff[0].Message, "Timetable rows "), staff[0].Message)
}
