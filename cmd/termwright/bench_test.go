package main

import (
	"bytes"
	"context"
	"encoding/json"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// tinyCTT is the hand-made instance of the timetable package's tests.
var tinyCTT = filepath.Join("..", "..", "timetable", "benchfmt", "testdata", "ctt", "tiny.ctt")

// benchDir makes a folder holding the tiny instance as tiny.ctt.
func benchDir(t *testing.T) string {
	t.Helper()
	data, err := os.ReadFile(tinyCTT)
	require.NoError(t, err)
	dir := t.TempDir()
	require.NoError(t, os.WriteFile(filepath.Join(dir, "tiny.ctt"), data, 0o644))
	return dir
}

// tinyC is a feasible timetable of the tiny instance whose competition cost
// is 14 (worked out in timetable/itc_cost_test.go).
const tinyC = "alg big 0 2\nalg big 1 0\ngeo small 1 2\ngeo small 1 1\nhis big 0 0\n"

// fakeSolve returns a solver that answers with status and, when
// satisfiable, the tiny timetable tinyC; the clock moves on 1.5 s per
// reading so that times are fixed.
func fakeSolve(t *testing.T, status solver.Status, err error) func(context.Context, *timetable.Term, int64, int) (*encode.OptimizeResult, error) {
	return func(ctx context.Context, term *timetable.Term, seed int64, threads int) (*encode.OptimizeResult, error) {
		if err != nil {
			return nil, err
		}
		if _, has := ctx.Deadline(); !has {
			t.Error("bench must give the solver a deadline")
		}
		res := &encode.OptimizeResult{Result: encode.Result{Status: status}}
		if status == solver.Satisfiable {
			s, rerr := benchfmt.ReadCTTSolution(strings.NewReader(tinyC), "fake.sol", term)
			require.NoError(t, rerr)
			for i := range s.Placements {
				s.Placements[i].Src = timetable.Source{}
			}
			res.Schedule = s
		}
		return res, nil
	}
}

// runBenchWith runs the bench command with solve in place of encode.Solve.
func runBenchWith(t *testing.T, solve func(context.Context, *timetable.Term, int64, int) (*encode.OptimizeResult, error), args ...string) (code int, stdout, stderr string) {
	t.Helper()
	if solve != nil {
		old := benchSolve
		benchSolve = solve
		defer func() { benchSolve = old }()
	}
	clock := time.Date(2024, 1, 1, 9, 0, 0, 0, time.UTC)
	var out, errb bytes.Buffer
	e := &env{stdin: strings.NewReader(""), stdout: &out, stderr: &errb, now: func() time.Time {
		clock = clock.Add(1500 * time.Millisecond)
		return clock
	}}
	code = run(append([]string{"bench"}, args...), e)
	return code, out.String(), errb.String()
}

func TestBenchTable(t *testing.T) {
	dir := benchDir(t)
	best := filepath.Join(t.TempDir(), "best.csv")
	require.NoError(t, os.WriteFile(best, []byte("instance,best,lower_bound,source\ntiny,7,3,hand-made\n"), 0o644))
	code, out, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--time-limit", "5s", "--best", best)
	require.Equal(t, exitOK, code, stderr)
	want := "" +
		"instance  courses/meetings/rooms/curricula  feasible  cost  lower bound  first feasible  best at  best known  ratio\n" +
		"tiny      3/5/2/2                           yes       14    -            1.50s           1.50s    7           2.00\n" +
		"geometric mean of cost / best known: 2.00 over 1 of 1 instances\n" +
		"geometric mean of (cost+1)/(best known+1): 1.88 over the same instances\n" // (14+1)/(7+1)
	assert.Equal(t, want, out)
	assert.Contains(t, stderr, "bench: tiny: cost 14 after 1.50s")
}

func TestBenchJSON(t *testing.T) {
	dir := benchDir(t)
	code, out, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--json", "--time-limit", "2s", "--seed", "9")
	require.Equal(t, exitOK, code, stderr)
	want := `{
  "time_limit_ms": 2000,
  "seed": 9,
  "instances": [
    {
      "instance": "tiny", "format": "curriculum", "courses": 3, "meetings": 5, "rooms": 2, "curricula": 2,
      "status": "satisfiable", "feasible": true, "cost": 14,
      "parts": {"room_capacity": 10, "min_working_days": 0, "curriculum_compactness": 4, "room_stability": 0},
      "hard": {"meetings": 0, "conflicts": 0, "availability": 0, "room_occupancy": 0},
      "lower_bound": null, "first_feasible_ms": 1500, "best_ms": 1500, "total_ms": 1500
    }
  ],
  "geomean_ratio": null,
  "ratio_count": 0
}`
	assert.JSONEq(t, want, out)
}

func TestBenchWritesSolutions(t *testing.T) {
	dir := benchDir(t)
	solDir := filepath.Join(t.TempDir(), "sols")
	code, _, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--out", solDir)
	require.Equal(t, exitOK, code, stderr)
	sol := filepath.Join(solDir, "tiny.sol")
	got, err := os.ReadFile(sol)
	require.NoError(t, err)
	// Sorted by course, then period (benchfmt.WriteCTTSolution).
	assert.Equal(t, "alg big 0 2\nalg big 1 0\ngeo small 1 1\ngeo small 1 2\nhis big 0 0\n", string(got))

	t.Run("refuses to replace without --force", func(t *testing.T) {
		require.NoError(t, os.WriteFile(sol, []byte("mine\n"), 0o644))
		code, _, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--out", solDir)
		assert.Equal(t, exitError, code)
		assert.Contains(t, stderr, "already exists")
		assert.Contains(t, stderr, "--force")
		kept, err := os.ReadFile(sol)
		require.NoError(t, err)
		assert.Equal(t, "mine\n", string(kept))
	})
	t.Run("replaces with --force", func(t *testing.T) {
		code, _, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--out", solDir, "--force")
		require.Equal(t, exitOK, code, stderr)
		again, err := os.ReadFile(sol)
		require.NoError(t, err)
		assert.Equal(t, string(got), string(again))
		left, _ := filepath.Glob(filepath.Join(solDir, ".*.tmp"))
		assert.Empty(t, left, "no temporary files left behind")
	})
}

func TestBenchOutcomes(t *testing.T) {
	tests := []struct {
		name     string
		status   solver.Status
		err      error
		code     int
		feasible string
	}{
		{"time limit", solver.Unknown, nil, exitOK, "no (unknown)"},
		{"no timetable exists", solver.Unsatisfiable, nil, exitOK, "no (unsatisfiable)"},
		{"pipeline failure", 0, errors.New("internal error: boom"), exitError, "error"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			code, out, stderr := runBenchWith(t, fakeSolve(t, tc.status, tc.err), benchDir(t))
			assert.Equal(t, tc.code, code, stderr)
			lines := strings.Split(out, "\n")
			require.GreaterOrEqual(t, len(lines), 2, out)
			assert.Contains(t, lines[1], tc.feasible)
			assert.Contains(t, lines[1], "  -  ", "no cost")
		})
	}
}

func TestBenchBadInput(t *testing.T) {
	t.Run("no instances", func(t *testing.T) {
		code, _, stderr := runBenchWith(t, nil, t.TempDir())
		assert.Equal(t, exitError, code)
		assert.Contains(t, stderr, "holds no .ctt or .xml files")
	})
	t.Run("missing folder", func(t *testing.T) {
		code, _, stderr := runBenchWith(t, nil, filepath.Join(t.TempDir(), "nowhere"))
		assert.Equal(t, exitError, code)
		assert.Contains(t, stderr, "cannot read")
	})
	t.Run("broken instance names its line", func(t *testing.T) {
		dir := benchDir(t)
		require.NoError(t, os.WriteFile(filepath.Join(dir, "bad.ctt"), []byte("Name: B\nCourses: x\n"), 0o644))
		code, out, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir)
		assert.Equal(t, exitError, code)
		assert.Contains(t, stderr, "bad.ctt:2: the file ends without the END. line")
		assert.Contains(t, out, "tiny ", "the other instances still run")
	})
	t.Run("broken best-known table", func(t *testing.T) {
		best := filepath.Join(t.TempDir(), "best.csv")
		require.NoError(t, os.WriteFile(best, []byte("instance,best\ntiny,many\n"), 0o644))
		code, _, stderr := runBenchWith(t, nil, benchDir(t), "--best", best)
		assert.Equal(t, exitError, code)
		assert.Contains(t, stderr, "best.csv:2: best of tiny \"many\" is not a whole number")
	})
	t.Run("time limit must be positive", func(t *testing.T) {
		code, _, stderr := runBenchWith(t, nil, benchDir(t), "--time-limit", "0s")
		assert.Equal(t, exitError, code)
		assert.Contains(t, stderr, "--time-limit must be positive")
	})
}

// The real pipeline on the tiny instance: a feasible timetable whose cost
// the competition's evaluator and termwright's agree on.
func TestBenchRealSolveTiny(t *testing.T) {
	code, out, stderr := runBenchWith(t, nil, benchDir(t), "--json", "--time-limit", "60s")
	require.Equal(t, exitOK, code, stderr)
	var rep benchReport
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Instances, 1)
	r := rep.Instances[0]
	assert.Equal(t, "satisfiable", r.Status)
	assert.True(t, r.Feasible)
	require.NotNil(t, r.Cost)
	assert.NotContains(t, stderr, "differs")
}

func TestBenchJSONOut(t *testing.T) {
	dir := benchDir(t)
	file := filepath.Join(t.TempDir(), "results.json")
	code, out, stderr := runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--json-out", file)
	require.Equal(t, exitOK, code, stderr)
	assert.True(t, strings.HasPrefix(out, "instance "), "the table still goes to stdout")
	data, err := os.ReadFile(file)
	require.NoError(t, err)
	var rep benchReport
	require.NoError(t, json.Unmarshal(data, &rep))
	require.Len(t, rep.Instances, 1)
	assert.Equal(t, 14, *rep.Instances[0].Cost)

	code, _, stderr = runBenchWith(t, fakeSolve(t, solver.Satisfiable, nil), dir, "--json-out", file)
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "already exists")
}
