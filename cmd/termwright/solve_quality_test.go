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

// TestSolveInterrupt sends SIGINT to a solve running in a child process
// (this test binary, re-run as the command) once it has shown its first
// timetable's cost, and requires the best timetable so far to be written
// and to pass the check.
func TestSolveInterrupt(t *testing.T) {
	if os.Getenv("TERMWRIGHT_SOLVE_CHILD") != "" {
		e := newEnv()
		e.stderrIsTerminal = true // draw progress, which the parent watches
		os.Exit(run(strings.Split(os.Getenv("TERMWRIGHT_SOLVE_CHILD"), "\x1f"), e))
	}
	dir := t.TempDir()
	out := filepath.Join(dir, "tt.xlsx")
	demo, err := filepath.Abs(solveDemoPath)
	require.NoError(t, err)
	cmd := exec.Command(os.Args[0], "-test.run=^TestSolveInterrupt$")
	cmd.Env = append(os.Environ(), "TERMWRIGHT_SOLVE_CHILD="+strings.Join([]string{"solve", demo, "-o", out, "--time-limit", "0"}, "\x1f"))
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
		if !sent && strings.Contains(line, " cost ") && !strings.Contains(line, "none yet") {
			require.NoError(t, cmd.Process.Signal(syscall.SIGINT))
			sent = true
		}
	}
	err = cmd.Wait()
	require.True(t, sent, "no progress with a cost was shown: %q", seen)
	require.NoError(t, err, "stdout: %s\nstderr: %q", stdout.String(), seen)
	assert.Contains(t, stdout.String(), "search stopped: interrupted")
	solveCheckWritten(t, solveDemoPath, out)
}

func TestSolveProgressLine(t *testing.T) {
	assert.Equal(t, "whole term       cost 0/23/20  bound 0/0/4    1.5 s  12 steps",
		solveProgressLine(encode.Progress{Phase: "whole term", Cost: []int64{0, 23, 20}, Bound: []int64{0, 0, 4}, Elapsed: 1500 * time.Millisecond, Steps: 12}))
	assert.Contains(t, solveProgressLine(encode.Progress{Phase: "first timetable", Bound: []int64{0}}), "cost none yet")
	e, _, errb := solveEnv()
	assert.Nil(t, newSolveProgress(e, false), "no drawing when stderr is not a terminal")
	e.stderrIsTerminal = true
	assert.Nil(t, newSolveProgress(e, true), "--quiet")
	p := newSolveProgress(e, false)
	p.show(encode.Progress{Phase: "whole term", Cost: []int64{1}, Bound: []int64{0}})
	p.done()
	assert.Equal(t, "\r\x1b[Kwhole term       cost 1  bound 0    0.0 s\n", errb.String())
}
