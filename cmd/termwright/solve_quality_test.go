package main

import (
	"bufio"
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// solveQuick are the flags of a short, reproducible solve.
var solveQuick = []string{"--time-limit", "0", "--steps", "2"}

// solveRun runs termwright with args and requires exit code want.
func solveRun(t *testing.T, want int, args ...string) (string, string) {
	t.Helper()
	e, stdout, stderr := solveEnv()
	code := run(args, e)
	require.Equal(t, want, code, "stdout: %s\nstderr: %s", stdout, stderr)
	return stdout.String(), stderr.String()
}

// solveCheckWritten reads a written timetable back and requires that it
// passes the independent check.
func solveCheckWritten(t *testing.T, termPath, out string) *timetable.Schedule {
	t.Helper()
	term, ps, err := timetable.Load(termPath)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	s, ps, err := timetable.ReadSchedule(out, term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	require.Empty(t, timetable.HardViolations(timetable.Check(term, s)))
	return s
}

func TestSolveQualityReport(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "tt.xlsx")
	stdout, _ := solveRun(t, exitOK, append([]string{"solve", solveDemoPath, "-o", out}, solveQuick...)...)
	assert.Contains(t, stdout, "Cost by priority level")
	assert.Contains(t, stdout, "no timetable costs less than")
	assert.Contains(t, stdout, "staff gaps")
	solveCheckWritten(t, solveDemoPath, out)
	f, err := excelize.OpenFile(out)
	require.NoError(t, err)
	defer f.Close()
	rows, err := f.GetRows("Quality")
	require.NoError(t, err)
	require.NotEmpty(t, rows)
	assert.Equal(t, []string{"Part", "Name", "Level", "Weight", "Units", "Cost", "Lower bound"}, rows[0])
	parts := map[string]bool{}
	for _, r := range rows[1:] {
		parts[r[0]] = true
	}
	for _, want := range []string{"level", "criterion"} {
		assert.True(t, parts[want], "Quality sheet has %s rows", want)
	}
}

func TestSolveKeep(t *testing.T) {
	dir := t.TempDir()
	last := filepath.Join(dir, "last.xlsx")
	solveRun(t, exitOK, append([]string{"solve", solveDemoPath, "-o", last}, solveQuick...)...)

	// No edits: nothing moves.
	again := filepath.Join(dir, "again.xlsx")
	stdout, _ := solveRun(t, exitOK, append([]string{"solve", solveDemoPath, "-o", again, "--keep", last, "--json"}, solveQuick...)...)
	var rep solveReport
	require.NoError(t, json.Unmarshal([]byte(stdout), &rep))
	require.NotNil(t, rep.Quality)
	require.NotNil(t, rep.Quality.Keep)
	assert.Zero(t, rep.Quality.Keep.Moved)
	assert.Empty(t, rep.Quality.Keep.Moves)

	// One room closed all week: only its meetings move, and the report
	// says whom to tell.
	term, _, err := timetable.Load(solveDemoPath)
	require.NoError(t, err)
	s := solveCheckWritten(t, solveDemoPath, last)
	count := map[string]int{}
	for _, p := range s.Placements {
		count[p.Room]++
	}
	room := "" // the room with the fewest meetings, so that the rest can take them
	for _, r := range term.Rooms {
		if n := count[r.ID]; n > 0 && (room == "" || n < count[room]) {
			room = r.ID
		}
	}
	held := count[room]
	for _, d := range term.Days() {
		term.Unavailable = append(term.Unavailable, timetable.Unavailability{Who: room, Kind: timetable.WhoRoom, Day: d,
			From: 8 * 60, To: 20 * 60, Hard: true, Reason: "closed"})
	}
	closedDir := filepath.Join(dir, "closed")
	require.NoError(t, os.MkdirAll(closedDir, 0o755))
	closedTerm := solveWriteTerm(t, closedDir, term)
	moved := filepath.Join(dir, "moved.xlsx")
	stdout, _ = solveRun(t, exitOK, append([]string{"solve", closedTerm, "-o", moved, "--keep", last}, solveQuick...)...)
	assert.Contains(t, stdout, "Changes from the kept timetable")
	assert.Contains(t, stdout, "Who to tell:")
	assert.Contains(t, stdout, "room "+room+":")
	lines := 0
	in := false
	for _, l := range strings.Split(stdout, "\n") {
		switch {
		case strings.HasPrefix(l, "Changes from the kept timetable"):
			in = true
		case strings.HasPrefix(l, "Who to tell:"):
			in = false
		case in:
			lines++
			assert.Contains(t, l, " "+room+" → ", "only meetings of the closed room move: %s", l)
		}
	}
	assert.Equal(t, held, lines, "one line per meeting of the closed room\n%s", stdout)
	f, err := excelize.OpenFile(moved)
	require.NoError(t, err)
	defer f.Close()
	rows, err := f.GetRows("Changes")
	require.NoError(t, err)
	assert.Len(t, rows, held+1)

	// A kept timetable with unreadable rows is refused.
	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("Section,Meeting,Day,Start,Room\nANT101-L,1,Funday,09:00,ALD.001\n"), 0o644))
	_, stderr := solveRun(t, exitError, "solve", solveDemoPath, "-o", filepath.Join(dir, "x.xlsx"), "--keep", bad)
	assert.Contains(t, stderr, "cannot be read")
}

func TestSolveTimeLimitWritesBest(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "tt.xlsx")
	stdout, _ := solveRun(t, exitOK, "solve", solveDemoPath, "-o", out, "--time-limit", "3s")
	assert.Contains(t, stdout, "Solved Autumn 2027")
	solveCheckWritten(t, solveDemoPath, out)
}

// TestSolveStopSignals sends each stop signal to a solve running in a
// child process (this test binary, re-run as the command) once it has
// shown its first timetable's cost, and requires the best timetable so far
// to be written and to pass the check, and the report to say which signal
// ended the search. It runs with stderr as a terminal (the redrawn line)
// and as a pipe (plain log lines).
func TestSolveStopSignals(t *testing.T) {
	if args := os.Getenv("TERMWRIGHT_SOLVE_CHILD"); args != "" {
		e := newEnv()
		e.stderrIsTerminal = os.Getenv("TERMWRIGHT_SOLVE_TTY") != ""
		os.Exit(run(strings.Split(args, "\x1f"), e))
	}
	for _, tc := range []struct {
		sig  syscall.Signal
		name string // signalName of sig
		tty  bool
	}{
		{syscall.SIGINT, "Ctrl-C", true},
		{syscall.SIGTERM, "SIGTERM", false},
		{syscall.SIGHUP, "SIGHUP", false},
	} {
		t.Run(tc.name, func(t *testing.T) {
			dir := t.TempDir()
			out := filepath.Join(dir, "tt.xlsx")
			demo, err := filepath.Abs(solveDemoPath)
			require.NoError(t, err)
			cmd := exec.Command(os.Args[0], "-test.run=^TestSolveStopSignals$")
			cmd.Env = append(os.Environ(), "TERMWRIGHT_SOLVE_CHILD="+strings.Join([]string{"solve", demo, "-o", out, "--time-limit", "0"}, "\x1f"))
			if tc.tty {
				cmd.Env = append(cmd.Env, "TERMWRIGHT_SOLVE_TTY=1")
			}
			var stdout bytes.Buffer
			cmd.Stdout = &stdout
			stderr, err := cmd.StderrPipe()
			require.NoError(t, err)
			require.NoError(t, cmd.Start())
			// Progress lines end in \r or \n; wait for one with a cost.
			sc := bufio.NewScanner(stderr)
			sc.Split(func(data []byte, atEOF bool) (int, []byte, error) {
				if i := bytes.IndexAny(data, "\r\n"); i >= 0 {
					return i + 1, data[:i], nil
				}
				if atEOF && len(data) > 0 {
					return len(data), data, nil
				}
				return 0, nil, nil
			})
			sent := false
			var seen []string
			for sc.Scan() {
				line := sc.Text()
				seen = append(seen, line)
				if !sent && strings.Contains(line, ": cost ") {
					require.NoError(t, cmd.Process.Signal(tc.sig))
					sent = true
				}
			}
			err = cmd.Wait()
			require.True(t, sent, "no progress with a cost was shown: %q", seen)
			require.NoError(t, err, "stdout: %s\nstderr: %q", stdout.String(), seen)
			assert.Contains(t, stdout.String(), "search stopped: interrupted ("+tc.name+")")
			assert.Contains(t, stdout.String(), "The search was interrupted ("+tc.name+"); the best timetable found until then was checked and written.")
			solveCheckWritten(t, solveDemoPath, out)
		})
	}
}

func TestSolveProgressLine(t *testing.T) {
	for _, tc := range []struct {
		name string
		pr   encode.Progress
		want string
	}{
		{"labelled levels", encode.Progress{Phase: "whole term", Levels: []int{3, 2, 1}, Cost: []int64{0, 23, 20}, Bound: []int64{0, 0, 4}, Elapsed: 1500 * time.Millisecond, Steps: 12},
			"whole term        level 3: cost 0 (bound 0)  level 2: cost 23 (bound 0)  level 1: cost 20 (bound 4)  1.5 s  12 steps"},
		{"before the first timetable", encode.Progress{Phase: "first timetable", Levels: []int{1}, Bound: []int64{0}},
			"first timetable  no timetable yet  level 1: (bound 0)  0.0 s"},
		{"no preference weighted", encode.Progress{Phase: "whole term", Cost: []int64{}},
			"whole term       timetable found (no preference is weighted)  0.0 s"},
	} {
		t.Run(tc.name, func(t *testing.T) { assert.Equal(t, tc.want, solveProgressLine(tc.pr)) })
	}
}

func TestSolveProgressTerminal(t *testing.T) {
	term := &timetable.Term{Weights: map[string]timetable.Weight{}}
	for _, c := range timetable.Criteria {
		term.Weights[c.Name] = timetable.Weight{}
	}
	term.Weights[timetable.Criteria[0].Name] = timetable.Weight{Weight: 2, Level: 1}
	e, _, errb := solveEnv()
	e.stderrIsTerminal = true
	assert.Nil(t, newSolveProgress(e, true, term), "--quiet")
	p := newSolveProgress(e, false, term)
	p.show(encode.Progress{Phase: "whole term", Levels: []int{1}, Cost: []int64{1}, Bound: []int64{0}})
	p.done()
	assert.Equal(t, "Priority levels (highest first): level 1: "+timetable.Criteria[0].Name+".\n"+
		"\r\x1b[Kwhole term        level 1: cost 1 (bound 0)  0.0 s\n", errb.String())
}

// TestSolveProgressLog checks the plain lines written when stderr is not a
// terminal: one at each change of phase, and otherwise at most one per
// interval of the injected clock.
func TestSolveProgressLog(t *testing.T) {
	e, _, errb := solveEnv()
	clock := time.Date(2027, 9, 1, 9, 0, 0, 0, time.UTC)
	e.now = func() time.Time { return clock }
	e.logEvery = 5 * time.Second
	p := newSolveProgress(e, false, &timetable.Term{})
	step := func(phase string, after time.Duration) {
		clock = clock.Add(after)
		p.show(encode.Progress{Phase: phase, Levels: []int{0}, Cost: []int64{7}, Bound: []int64{0}})
	}
	step("first timetable", 0)           // first line
	step("first timetable", time.Second) // too soon
	step("whole term", time.Second)      // phase changed
	step("whole term", 4*time.Second)    // too soon
	step("whole term", time.Second)      // 5 s after the last line
	p.done()
	all := strings.Split(strings.TrimSuffix(errb.String(), "\n"), "\n")
	require.True(t, strings.HasPrefix(all[0], "Priority levels (highest first): "), all[0])
	lines := all[1:]
	require.Len(t, lines, 3, errb.String())
	assert.True(t, strings.HasPrefix(lines[0], "progress: first timetable"), lines[0])
	assert.True(t, strings.HasPrefix(lines[1], "progress: whole term"), lines[1])
	assert.True(t, strings.HasPrefix(lines[2], "progress: whole term"), lines[2])
	assert.NotContains(t, errb.String(), "\r", "no terminal codes in a log")
}
