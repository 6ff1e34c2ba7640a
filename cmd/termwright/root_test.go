package main

import (
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"runtime/debug"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/spf13/cobra"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
)

// parseOnly runs a command line with the parsing hook set and returns the
// options and arguments the command received; the command itself does not
// run (it would fail on the made-up paths).
func parseOnly(t *testing.T, args ...string) (any, []string) {
	t.Helper()
	e, out, errb := checkEnv()
	var got any
	var gotArgs []string
	e.parsed = func(o any, a []string) { got, gotArgs = o, a }
	require.Equal(t, exitOK, run(args, e), errb.String())
	require.NotNil(t, got, "the command's run function was reached without the hook")
	assert.Empty(t, out.String(), "nothing ran")
	return got, gotArgs
}

// TestFlagParsing fills each command's options from a command line,
// without running the command.
func TestFlagParsing(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want any
	}{
		{[]string{"check", "t.xlsx", "--json"}, &checkOptions{json: true}},
		{[]string{"new", "x/", "--csv", "--force"}, &newOptions{csv: true, force: true}},
		{[]string{"solve", "t.xlsx", "-o", "tt.xlsx", "--seed", "7", "--time-limit", "90s", "--force", "--publish", "pub", "--quiet", "--keep", "old.xlsx", "--steps", "40", "--threads", "2"},
			&solveOptions{out: "tt.xlsx", seed: 7, timeLimit: 90 * time.Second, force: true, publish: "pub", quiet: true, keep: "old.xlsx", steps: 40, threads: 2}},
		{[]string{"solve", "t.xlsx", "--json"}, &solveOptions{seed: 1, timeLimit: 60 * time.Second, json: true, threads: 1}},
		{[]string{"publish", "t.xlsx", "tt.xlsx", "-o", "out", "--paper", "Letter", "--students", "--force"},
			&publishOptions{out: "out", paper: "Letter", students: true, force: true}},
		{[]string{"compile", "t.xlsx", "-o", "t.cnf", "--cnf", "--cnf-names", "--explain"},
			&compileOptions{out: "t.cnf", cnf: true, names: true, explain: true}},
		{[]string{"generate", "big.xlsx", "--sections", "2000", "--seed", "9", "--csv", "dir"},
			&generateOptions{cfg: samples.Config{Sections: 2000, Seed: 9, Days: 5, PeriodsPerDay: 9, Weeks: 12}, csvDir: "dir"}},
	} {
		t.Run(strings.Join(tc.args, " "), func(t *testing.T) {
			got, args := parseOnly(t, tc.args...)
			assert.Equal(t, tc.want, got)
			assert.Equal(t, tc.args[1], args[0])
		})
	}
	// Every command with a run function goes through the hook.
	e, _, _ := checkEnv()
	var walk func(c *cobra.Command)
	walk = func(c *cobra.Command) {
		for _, sub := range c.Commands() {
			walk(sub)
		}
		if c.RunE == nil || c.Name() == "logic" || !c.HasParent() {
			return
		}
		reached := false
		e.parsed = func(any, []string) { reached = true }
		assert.NoError(t, c.RunE(c, []string{"a", "b"}), c.CommandPath())
		assert.True(t, reached, "%s does not call the parsing hook", c.CommandPath())
	}
	walk(newRoot(e))
}

// TestFlagErrorsPrintUsage: a mistake in the command line is printed with
// the command's usage line and a pointer to --help, and exits 1.
func TestFlagErrorsPrintUsage(t *testing.T) {
	for _, tc := range []struct {
		args []string
		want string
	}{
		{[]string{"solve", "t.xlsx", "--bogus"}, "unknown flag: --bogus"},
		{[]string{"solve", "t.xlsx", "--time-limit", "soon"}, `invalid argument "soon" for "--time-limit"`},
		{[]string{"solve"}, "accepts 1 arg(s), received 0"},
		{[]string{"logic", "solve", "--models", "x", "f.lp"}, `invalid argument "x" for "--models"`},
	} {
		t.Run(strings.Join(tc.args, " "), func(t *testing.T) {
			e, out, errb := checkEnv()
			assert.Equal(t, exitError, run(tc.args, e))
			assert.Empty(t, out.String())
			lines := strings.Split(strings.TrimSpace(errb.String()), "\n")
			require.Len(t, lines, 3, errb.String())
			assert.Contains(t, lines[0], tc.want)
			assert.True(t, strings.HasPrefix(lines[1], "Usage: termwright "+tc.args[0]), lines[1])
			assert.Contains(t, lines[2], "--help")
		})
	}
}

// TestErrorsKeepTheirChain: the error a command returns still wraps the
// file system's error (errors.Is sees fs.ErrNotExist through every layer)
// although run prints it as one sentence.
func TestErrorsKeepTheirChain(t *testing.T) {
	dir := t.TempDir()
	term := tinyTerm(t, nil)
	for _, args := range [][]string{
		{"solve", term, "-o", filepath.Join(dir, "no", "tt.xlsx")},
		{"new", filepath.Join(dir, "no", "t.xlsx")},
		{"logic", "solve", filepath.Join(dir, "none.lp")},
		{"logic", "sat", filepath.Join(dir, "none.cnf")},
		{"compile", filepath.Join(dir, "none.ctt")},
	} {
		t.Run(args[0], func(t *testing.T) {
			e, _, _ := checkEnv()
			root := newRoot(e)
			root.SetArgs(args)
			err := root.Execute()
			require.Error(t, err)
			assert.True(t, errors.Is(err, fs.ErrNotExist), "chain lost: %v", err)
			var ce *exitCodeError
			require.True(t, errors.As(err, &ce))
			assert.Equal(t, exitError, ce.code)
		})
	}
}

// TestSyntaxErrorsKeepTheirList: logic solve prints each syntax error on
// its own line and a one-line summary, and the returned error still holds
// the engine's error list.
func TestSyntaxErrorsKeepTheirList(t *testing.T) {
	path := filepath.Join(t.TempDir(), "bad.lp")
	require.NoError(t, os.WriteFile(path, []byte("a :- .\nb c.\n"), 0o644))
	e, _, errb := checkEnv()
	root := newRoot(e)
	root.SetArgs([]string{"logic", "solve", path})
	err := root.Execute()
	require.Error(t, err)
	var list solver.SyntaxErrors
	require.True(t, errors.As(err, &list), "chain lost: %v", err)
	assert.NotEmpty(t, list)
	assert.Contains(t, err.Error(), "in the program; nothing was done")
	assert.Contains(t, errb.String(), path)
}

// TestVersion reads the version from the build information, with the
// revision when the build recorded one (the vcs.* keys that the go
// command's documentation for -buildvcs lists).
func TestVersion(t *testing.T) {
	for _, tc := range []struct {
		name string
		bi   *debug.BuildInfo
		ok   bool
		want string
	}{
		{"release", &debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Version: "v1.4.0"}}, true, "v1.4.0, go1.26.8"},
		{"checkout", &debug.BuildInfo{GoVersion: "go1.26.8", Main: debug.Module{Version: "(devel)"}, Settings: []debug.BuildSetting{
			{Key: "vcs.revision", Value: "0123456789abcdef0123"}, {Key: "vcs.time", Value: "2027-08-30T10:00:00Z"}, {Key: "vcs.modified", Value: "true"}}},
			true, "(devel) (revision 0123456789ab of 2027-08-30T10:00:00Z, with uncommitted changes), go1.26.8"},
		{"no information", nil, false, "(unknown version: built without module information)"},
	} {
		t.Run(tc.name, func(t *testing.T) { assert.Equal(t, tc.want, version(tc.bi, tc.ok)) })
	}
	e, out, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"--version"}, e), errb.String())
	assert.True(t, strings.HasPrefix(out.String(), "termwright "), out.String())
	assert.Contains(t, out.String(), "go1.")
}

// TestSolveImpossibleByCounting: a term the counting checks prove
// impossible (one staff member with three periods of teaching and two
// periods in the week) is "no timetable exists", exit 2, with the reasons
// and the pointer to explain — not "fix them first".
func TestSolveImpossibleByCounting(t *testing.T) {
	term := tinyTerm(t, map[string]string{"Sections!A3": "B", "Sections!B3": "Painting", "Sections!C3": "S1", "Sections!E3": "10", "Sections!F3": "1"})
	out := filepath.Join(t.TempDir(), "tt.xlsx")
	e, stdout, errb := checkEnv()
	assert.Equal(t, exitNone, run([]string{"solve", term, "-o", out}, e))
	assert.Contains(t, stdout.String(), "No timetable exists for Spring 2028 (2 sections): counting alone proves it, before any search:")
	assert.Contains(t, stdout.String(), `Staff!A2: staff "S1" must teach 3 periods in some week but is available for only 2`)
	assert.Contains(t, errb.String(), "run `termwright explain "+term+"`")
	assert.NotContains(t, errb.String(), "fix them first")
	assert.NoFileExists(t, out)

	e, stdout, _ = checkEnv()
	assert.Equal(t, exitNone, run([]string{"solve", term, "-o", out, "--json"}, e))
	rep := explainJSON(t, stdout.String())
	assert.Equal(t, "infeasible", rep["status"])
	assert.NotEmpty(t, rep["reasons"])

	// A mistake of another kind beside the counting proof is still a
	// mistake to fix first.
	bad := tinyTerm(t, map[string]string{"Sections!A3": "B", "Sections!C3": "S1", "Sections!D3": "NOPE", "Sections!E3": "10", "Sections!F3": "1"})
	e, _, errb = checkEnv()
	assert.Equal(t, exitError, run([]string{"solve", bad, "-o", out}, e))
	assert.Contains(t, errb.String(), "fix them first")
}

// TestSolveInterruptedBeforeFirst: a stop signal (here delivered through
// the injected signal source before the search starts) ends the search
// before the first timetable, and both the report and the error say it was
// interrupted, not that time ran out.
func TestSolveInterruptedBeforeFirst(t *testing.T) {
	for _, sig := range []os.Signal{os.Interrupt, syscall.SIGTERM, syscall.SIGHUP} {
		t.Run(signalName(sig), func(t *testing.T) {
			out := filepath.Join(t.TempDir(), "tt.xlsx")
			e, stdout, errb := checkEnv()
			ch := make(chan os.Signal, 1)
			ch <- sig
			e.signals = func() (<-chan os.Signal, func()) { return ch, func() {} }
			assert.Equal(t, exitError, run([]string{"solve", tinyTerm(t, nil), "-o", out}, e))
			assert.Contains(t, stdout.String(), "the search was interrupted ("+signalName(sig)+") before the first timetable")
			assert.NotContains(t, stdout.String(), "in the time allowed")
			assert.Contains(t, errb.String(), "interrupted ("+signalName(sig)+") before the first timetable was found; nothing was written")
			assert.NoFileExists(t, out)
		})
	}
}

// TestSolveTimesAddUp: the wall times printed (read, compile and search,
// write) add up to the total, to the rounding of the printout.
func TestSolveTimesAddUp(t *testing.T) {
	out := filepath.Join(t.TempDir(), "tt.xlsx")
	e, stdout, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"solve", tinyTerm(t, nil), "-o", out, "--json"}, e), errb.String())
	rep := explainJSON(t, stdout.String())
	tm := rep["timings_ms"].(map[string]any)
	sum := tm["read"].(float64) + tm["search_wall"].(float64) + tm["write"].(float64)
	total := tm["total"].(float64)
	assert.LessOrEqual(t, sum, total+0.003, "parts %v exceed the total %v", sum, total)
	assert.LessOrEqual(t, tm["compile"].(float64), tm["search_wall"].(float64), "compile is inside compile and search")

	e, stdout, _ = checkEnv()
	require.Equal(t, exitOK, run([]string{"solve", tinyTerm(t, nil), "-o", filepath.Join(t.TempDir(), "tt.xlsx")}, e))
	assert.Contains(t, stdout.String(), " in all: read and check the term ")
	assert.Contains(t, stdout.String(), "(these overlap: most timetables are verified, decoded and checked while the engine searches)")
}
