package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// explainDir holds a small hand-made term of an invented college (CSV
// folder "term") and a requests file. The term has a timetable; the tests
// plant conflicts in copies of it.
var explainDir = filepath.Join("testdata", "explain")

func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files under testdata/")
	}
}

// runExplainCmd runs `termwright explain args...` with captured streams.
func runExplainCmd(args ...string) (code int, stdout, stderr string) {
	var out, errb bytes.Buffer
	e := &env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb,
		now: func() time.Time { return time.Date(2028, 1, 3, 9, 0, 0, 0, time.UTC) }}
	code = run(append([]string{"explain"}, args...), e)
	return code, out.String(), errb.String()
}

// engineCounts matches the parts of the output that depend on how the
// engine happens to search (core sizes before shrinking, number of checks,
// work counters); goldens hold them masked.
var (
	engineLine   = regexp.MustCompile(`(?m)^\(\d+ reasons? and \d+ sections? in the engine's first core; (\d+ reasons? and \d+ sections?) after shrinking; \d+ checks?\.\)$`)
	engineFields = regexp.MustCompile(`"(core_groups|core_sections|checks|sat|unsat|unknown|rebuilds|families|nogoods|conflicts)": \d+`)
)

var countedLine = regexp.MustCompile(`(?m)^(\(Proved by counting, not by search: .*); \d+ checks?\.\)$`)

func maskEngine(s string) string {
	s = engineLine.ReplaceAllString(s, "(engine's first core masked; $1 after shrinking.)")
	s = countedLine.ReplaceAllString(s, "$1; checks masked.)")
	return engineFields.ReplaceAllString(s, `"$1": 0`)
}

// explainGolden compares the masked output with a golden file under
// testdata/explain, rewriting it with -update.
func explainGolden(t *testing.T, name, got string) {
	t.Helper()
	got = maskEngine(got)
	golden := filepath.Join(explainDir, name)
	if f := flag.Lookup("update"); f != nil && f.Value.String() == "true" {
		require.NoError(t, os.WriteFile(golden, []byte(got), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err)
	assert.Equal(t, string(want), got)
}

// plantedTerm copies the test term into a temporary folder with the given
// text replacements applied to its files ("Sections.csv": old → new), and
// returns the folder.
func plantedTerm(t *testing.T, edits map[string][2]string) string {
	t.Helper()
	dir := filepath.Join(t.TempDir(), "term")
	require.NoError(t, os.MkdirAll(dir, 0o755))
	src := filepath.Join(explainDir, "term")
	entries, err := os.ReadDir(src)
	require.NoError(t, err)
	for _, en := range entries {
		data, err := os.ReadFile(filepath.Join(src, en.Name()))
		require.NoError(t, err)
		if e, ok := edits[en.Name()]; ok {
			require.Contains(t, string(data), e[0], "edit of %s", en.Name())
			data = []byte(strings.Replace(string(data), e[0], e[1], 1))
		}
		require.NoError(t, os.WriteFile(filepath.Join(dir, en.Name()), data, 0o644))
	}
	return dir
}

// explainJSON decodes the JSON answer.
func explainJSON(t *testing.T, stdout string) map[string]any {
	t.Helper()
	var m map[string]any
	require.NoError(t, json.Unmarshal([]byte(stdout), &m), stdout)
	return m
}

func TestExplainFeasibleTerm(t *testing.T) {
	term := filepath.Join(explainDir, "term")
	code, stdout, stderr := runExplainCmd(term)
	require.Equal(t, exitOK, code, stderr)
	explainGolden(t, "feasible.golden.txt", stdout)

	// -o writes a timetable that reads back and passes the domain check;
	// an existing file is refused without --force.
	out := filepath.Join(t.TempDir(), "timetable.xlsx")
	code, _, stderr = runExplainCmd(term, "-o", out)
	require.Equal(t, exitOK, code, stderr)
	tm, _, err := timetable.Load(term)
	require.NoError(t, err)
	s, ps, err := timetable.ReadSchedule(out, tm)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.Empty(t, timetable.HardViolations(timetable.Check(tm, s)))
	code, _, stderr = runExplainCmd(term, "-o", out)
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "already exists")
	code, _, stderr = runExplainCmd(term, "-o", out, "--force")
	assert.Equal(t, exitOK, code, stderr)
}

func TestExplainRequestGranted(t *testing.T) {
	term := filepath.Join(explainDir, "term")
	out := filepath.Join(t.TempDir(), "granted.xlsx")
	code, stdout, stderr := runExplainCmd(term, "--section", "CHM110", "--at", "Tue 11:00", "--room", "SEM2", "-o", out)
	require.Equal(t, exitOK, code, stderr)
	explainGolden(t, "granted.golden.txt", strings.ReplaceAll(stdout, out, "OUT.xlsx"))

	// A request against a teacher's soft wish (Unavailable row 4, weight
	// 3) is granted at a price: the optimised timetables with and without
	// it differ by that wish.
	code, stdout, stderr = runExplainCmd(term, "--section", "STA100", "--at", "Mon 09:00", "--json")
	require.Equal(t, exitOK, code, stderr)
	explainGolden(t, "granted-cost.golden.json", stdout)
	cost := explainJSON(t, stdout)["cost"].(map[string]any)
	assert.Equal(t, true, cost["compared"])
	var avoid map[string]any
	for _, c := range cost["criteria"].([]any) {
		if c.(map[string]any)["name"] == timetable.CritAvoidTimes {
			avoid = c.(map[string]any)
		}
	}
	require.NotNil(t, avoid, "avoid times is priced")
	assert.Equal(t, float64(3), avoid["with"], "the row's weight 3 for one period")
	assert.Equal(t, float64(0), avoid["without"])
	tm, _, err := timetable.Load(term)
	require.NoError(t, err)
	s, _, err := timetable.ReadSchedule(out, tm)
	require.NoError(t, err)
	assert.Empty(t, timetable.HardViolations(timetable.Check(tm, s)))
	p := tm.PeriodAt(time.Tuesday, 11*60)
	found := false
	for _, pl := range s.Placements {
		found = found || (pl.Section == "CHM110" && pl.Period == p && pl.Room == "SEM2")
	}
	assert.True(t, found, "the written timetable grants the request")
}

func TestExplainRequestRefused(t *testing.T) {
	term := filepath.Join(explainDir, "term")
	code, stdout, stderr := runExplainCmd(term, "--section", "CHM110", "--at", "Tue 10:00")
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "refused.golden.txt", stdout)

	code, stdout, stderr = runExplainCmd(term, "--section", "CHM110", "--at", "Tue 10:00", "--json")
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "refused.golden.json", stdout)
	m := explainJSON(t, stdout)
	assert.Equal(t, "refused", m["status"])
	c := m["conflict"].(map[string]any)
	assert.GreaterOrEqual(t, c["core_groups"], float64(len(c["reasons"].([]any))), "core sizes before shrinking are at least the sizes after")
	assert.GreaterOrEqual(t, c["core_sections"], float64(len(c["sections"].([]any))))

	// A requested room that is too small: the reason names the room, and
	// the same time in another room is offered.
	code, stdout, stderr = runExplainCmd(term, "--section", "ZOO110", "--at", "Mon 09:00", "--room", "LAB1")
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "refused-room.golden.txt", stdout)
}

func TestExplainRequestsFile(t *testing.T) {
	term := filepath.Join(explainDir, "term")
	code, stdout, stderr := runExplainCmd(term, "--requests", filepath.Join(explainDir, "requests.csv"))
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "requests.golden.txt", stdout)
}

func TestExplainInfeasibleTerm(t *testing.T) {
	// A fixed meeting during its teacher's research seminar: the term
	// check sees it at once, and the search explains it.
	dir := plantedTerm(t, map[string][2]string{"Sections.csv": {"CHM120,Titration Lab,T-14,CHE-1,20,1,2,lab,,,", "CHM120,Titration Lab,T-14,CHE-1,20,1,2,lab,,Tue 09:00,"}})
	code, stdout, stderr := runExplainCmd(dir)
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "fixed-unavailable.golden.txt", stdout)
	code, stdout, stderr = runExplainCmd(dir, "--json")
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "fixed-unavailable.golden.json", stdout)

	// Two sections of one cohort that must meet at the same time: only the
	// search finds it.
	dir = plantedTerm(t, map[string][2]string{"Relations.csv": {"hard\n", "hard\nsame time,\"ZOO110, STA100\",hard\n"}})
	code, stdout, stderr = runExplainCmd(dir)
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "same-time.golden.txt", stdout)
}

func TestExplainCountedOverload(t *testing.T) {
	// A teacher away all Monday and Tuesday morning cannot teach three
	// sections in the two periods left: the term check counts it at once,
	// and the explanation is proved by the same count.
	dir := plantedTerm(t, map[string][2]string{"Unavailable.csv": {"T-12,Mon,09:00,11:00,hard,Field station duty", "T-12,Mon,09:00,13:00,hard,Field station duty\nT-11,Mon,,,hard,Open day\nT-11,Tue,09:00,11:00,hard,Open day"}})
	code, stdout, stderr := runExplainCmd(dir)
	require.Equal(t, exitNone, code, stderr)
	explainGolden(t, "counted.golden.txt", stdout)
}

func TestExplainInputErrors(t *testing.T) {
	term := filepath.Join(explainDir, "term")
	badReqs := filepath.Join(t.TempDir(), "reqs.csv")
	require.NoError(t, os.WriteFile(badReqs, []byte("Section,At\nCHM110,Tue 10:00\nNOPE,Tue 10:00\nCHM110,Tue 13:00\n"), 0o644))
	badCells := filepath.Join(t.TempDir(), "cells.csv")
	require.NoError(t, os.WriteFile(badCells, []byte("Section,At\nCHM110,Tue 25:00\n,Tue 10:00\n"), 0o644))
	brokenTerm := plantedTerm(t, map[string][2]string{"Rooms.csv": {"LAB1,24,", "LAB1,twenty,"}})
	cases := []struct {
		name string
		args []string
		want []string
	}{
		{"section without time", []string{term, "--section", "CHM110"}, []string{"needs both --section and --at"}},
		{"bad time", []string{term, "--section", "CHM110", "--at", "Tue 25:00"}, []string{"--at:", "24-hour time"}},
		{"both forms", []string{term, "--section", "CHM110", "--at", "Tue 10:00", "--requests", badReqs}, []string{"not both"}},
		{"unknown section", []string{term, "--section", "CHM999", "--at", "Tue 10:00"}, []string{`section "CHM999" is not on the Sections sheet`}},
		{"not a period start", []string{term, "--section", "CHM110", "--at", "Tue 10:30"}, []string{"Tue 10:30 is not the start of a period"}},
		{"unknown room", []string{term, "--section", "CHM110", "--at", "Tue 10:00", "--room", "X9"}, []string{`room "X9" is not on the Rooms sheet`}},
		{"every bad request row", []string{term, "--requests", badReqs}, []string{"reqs row 3:", `section "NOPE"`, "reqs row 4:", "Tue 13:00 is not the start"}},
		{"missing requests file", []string{term, "--requests", filepath.Join(t.TempDir(), "none.csv")}, []string{"none.csv does not exist"}},
		{"unreadable request cells", []string{term, "--requests", badCells}, []string{"cells!B2: At:", "cells!A3: the Section is blank", "cells.csv has 2 errors — correct them and run again"}},
		{"unreadable term cell", []string{brokenTerm}, []string{"Rooms!B3", "stop it being read as written"}},
		{"no term", []string{filepath.Join(t.TempDir(), "none.xlsx")}, nil},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			code, stdout, stderr := runExplainCmd(tc.args...)
			assert.Equal(t, exitError, code, "stdout: %s\nstderr: %s", stdout, stderr)
			for _, w := range tc.want {
				assert.Contains(t, stderr, w)
			}
			assert.NotContains(t, stderr, "goroutine", "no stack traces")
		})
	}
}

func TestExplainHelp(t *testing.T) {
	code, stdout, _ := runExplainCmd("--help")
	require.Equal(t, exitOK, code)
	explainGolden(t, "help.golden.txt", stdout)
}

// TestExplainDemo: the demo term of the invented polytechnic has a
// timetable, and a request during a teacher's hard unavailability is
// refused with that teacher's row.
func TestExplainDemo(t *testing.T) {
	if testing.Short() {
		t.Skip("loads the demo workbook")
	}
	demo := "../../samples/demo-term.xlsx"
	code, stdout, stderr := runExplainCmd(demo)
	require.Equal(t, exitOK, code, stderr)
	assert.Contains(t, stdout, "A timetable meeting every hard requirement exists")
	tm, _, err := timetable.Load(demo)
	require.NoError(t, err)
	// Find a section whose only teacher has a hard unavailable row.
	var sec, at string
	for _, u := range tm.Unavailable {
		if !u.Hard || u.Kind != timetable.WhoStaff {
			continue
		}
		for _, s := range tm.Sections {
			if len(s.Staff) == 1 && s.Staff[0] == u.Who && len(s.Fixed) == 0 && s.Length == 1 {
				for _, p := range tm.Periods {
					if u.Covers(p) {
						sec, at = s.ID, p.Label()
						break
					}
				}
			}
			if sec != "" {
				break
			}
		}
		if sec != "" {
			break
		}
	}
	require.NotEmpty(t, sec, "the demo has a teacher with a hard unavailable row")
	code, stdout, stderr = runExplainCmd(demo, "--section", sec, "--at", at, "--json")
	require.Equal(t, exitNone, code, stderr)
	m := explainJSON(t, stdout)
	reasons := m["conflict"].(map[string]any)["reasons"].([]any)
	require.Len(t, reasons, 2)
	assert.Equal(t, "request", reasons[0].(map[string]any)["kind"])
	assert.Equal(t, "staff availability", reasons[1].(map[string]any)["kind"])
}
