package main

import (
	"bytes"
	"encoding/json"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/internal/testprog"
	"github.com/termwright/termwright/solver"
)

// logicEnv is an env with buffers for streams and the given stdin.
func logicEnv(stdin string) (*env, *bytes.Buffer, *bytes.Buffer) {
	var out, errb bytes.Buffer
	return &env{stdin: strings.NewReader(stdin), stdout: &out, stderr: &errb, now: func() time.Time { return time.Unix(0, 0) }}, &out, &errb
}

// logicFile writes text to a file in a fresh temporary folder.
func logicFile(t *testing.T, name, text string) string {
	t.Helper()
	path := filepath.Join(t.TempDir(), name)
	require.NoError(t, os.WriteFile(path, []byte(text), 0o644))
	return path
}

// logicProgramFile prints p into a temporary file.
func logicProgramFile(t *testing.T, name string, p *solver.Program) string {
	t.Helper()
	var b bytes.Buffer
	require.NoError(t, solver.WriteProgram(&b, p))
	return logicFile(t, name, b.String())
}

const logicEvenLoop = "a :- not b.\nb :- not a.\n{c} :- a.\n#show a.\n#show c.\n"

func TestLogicSolve(t *testing.T) {
	prog := logicFile(t, "loop.lp", logicEvenLoop)
	tests := []struct {
		name   string
		args   []string
		stdin  string
		code   int
		stdout string
		stderr string // substring
	}{
		{"first model", []string{prog}, "", exitOK,
			"1 stable model listed; more exist (--models 0 lists all).\n", ""},
		{"all models", []string{prog, "--models", "0"}, "", exitOK,
			"3 stable models; no other exists.\n", ""},
		{"two of three", []string{prog, "--models", "2"}, "", exitOK,
			"2 stable models listed; more exist (--models 0 lists all).\n", ""},
		{"exactly all", []string{prog, "--models", "3"}, "", exitOK,
			"3 stable models; no other exists.\n", ""},
		{"count", []string{prog, "--count"}, "", exitOK, "3\n", ""},
		{"count limited", []string{prog, "--count", "--models", "2"}, "", exitOK, "2\n", ""},
		{"stdin", []string{"-", "--count"}, "{p; q}.", exitOK, "4\n", ""},
		{"projection on shown atoms", []string{"-", "--count"}, "{p; q}. #show p.", exitOK, "2\n", ""},
		{"anonymous atoms hidden", []string{"-", "--count"}, "{p; _a2}. _a2 :- p.", exitOK, "2\n", ""},
		{"none", []string{"-"}, "a. :- a.", exitNone, "No stable model exists.\n", ""},
		{"none count", []string{"-", "--count"}, "a :- not a.", exitNone, "0\n", ""},
		{"syntax error", []string{"-"}, "a :- b c.\nd :- .", exitError, "",
			"<stdin>:1:8: expected \".\" after rule body, found name c\n<stdin>:2:6: expected an atom"},
		{"error count", []string{"-"}, "a :- b c.\nd :- .", exitError, "", "2 errors in the program; nothing was done"},
		{"missing file", []string{filepath.Join(t.TempDir(), "none.lp")}, "", exitError, "", "cannot open the program"},
		{"bad models", []string{prog, "--models", "-1"}, "", exitError, "", "--models must be 0 (all) or more, not -1"},
		{"bad time limit", []string{prog, "--time-limit", "-1s"}, "", exitError, "", "--time-limit must not be negative"},
		{"no file", nil, "", exitError, "", "accepts 1 arg"},
		{"invalid program", []string{"-"}, "2 {a} 1.", exitError, "", "cannot solve -: invalid program"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := logicEnv(tc.stdin)
			code := run(append([]string{"logic", "solve"}, tc.args...), e)
			assert.Equal(t, tc.code, code, "stderr: %s", errb)
			if tc.code == exitOK {
				// Models come in the engine's order: compare the closing line.
				assert.True(t, strings.HasSuffix(out.String(), tc.stdout), out.String())
			} else {
				assert.Equal(t, tc.stdout, out.String())
			}
			assert.Contains(t, errb.String(), tc.stderr)
		})
	}
}

// TestLogicSolveListsEveryModel checks the models printed for a program
// whose stable models are known: {b}, {a}, {a, c} (Gelfond & Lifschitz
// 1988 reduct; checked by hand).
func TestLogicSolveListsEveryModel(t *testing.T) {
	e, out, _ := logicEnv(logicEvenLoop)
	require.Equal(t, exitOK, run([]string{"logic", "solve", "-", "--models", "0"}, e))
	var models []string
	lines := strings.Split(strings.TrimSuffix(out.String(), "\n"), "\n")
	for i := 0; i+1 < len(lines); i += 2 {
		assert.True(t, strings.HasPrefix(lines[i], "Model "), lines[i])
		models = append(models, lines[i+1])
	}
	assert.ElementsMatch(t, []string{"", "a", "a c"}, models)
}

func TestLogicSolveCountsQueens(t *testing.T) {
	// 6-queens has 4 solutions, 8-queens 92 (OEIS A000170).
	for n, want := range map[int]string{6: "4\n", 8: "92\n"} {
		prog := logicProgramFile(t, "queens.lp", testprog.Queens(n))
		e, out, errb := logicEnv("")
		require.Equal(t, exitOK, run([]string{"logic", "solve", prog, "--count"}, e), errb.String())
		assert.Equal(t, want, out.String())
	}
}

func TestLogicSolveJSON(t *testing.T) {
	prog := logicFile(t, "loop.lp", logicEvenLoop)
	e, out, _ := logicEnv("")
	require.Equal(t, exitOK, run([]string{"logic", "solve", prog, "--json", "--models", "0"}, e))
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	require.Len(t, lines, 4)
	var models [][]string
	for _, l := range lines[:3] {
		var m struct {
			Model []string `json:"model"`
		}
		require.NoError(t, json.Unmarshal([]byte(l), &m))
		require.NotNil(t, m.Model, "an empty model is [] not null: %s", l)
		models = append(models, m.Model)
	}
	assert.ElementsMatch(t, [][]string{{}, {"a"}, {"a", "c"}}, models)
	var sum map[string]any
	require.NoError(t, json.Unmarshal([]byte(lines[3]), &sum))
	assert.Equal(t, "satisfiable", sum["result"])
	assert.Equal(t, 3.0, sum["models"])
	assert.Equal(t, true, sum["complete"])
	stats, ok := sum["stats"].(map[string]any)
	require.True(t, ok)
	for _, k := range []string{"conflicts", "decisions", "propagations", "restarts", "learned", "loop_formulas", "deleted"} {
		assert.Contains(t, stats, k)
	}

	e, out, _ = logicEnv("a. :- a.")
	require.Equal(t, exitNone, run([]string{"logic", "solve", "-", "--json"}, e))
	assert.True(t, strings.HasPrefix(out.String(), `{"result":"unsatisfiable","models":0,"complete":true,"stats":{`), out.String())

	e, out, _ = logicEnv("{a; b}.")
	require.Equal(t, exitOK, run([]string{"logic", "solve", "-", "--json", "--count"}, e))
	assert.True(t, strings.HasPrefix(out.String(), `{"result":"satisfiable","models":4,"complete":true,`), out.String())
}

func TestLogicSolveTimeLimit(t *testing.T) {
	// 11 pigeons into 10 holes with pairwise constraints needs a long
	// resolution refutation (Haken 1985); a limit of 1ns stops it at once.
	prog := logicProgramFile(t, "php.lp", testprog.Pigeonhole(11, 10, true))
	e, out, errb := logicEnv("")
	code := run([]string{"logic", "solve", prog, "--time-limit", "1ns"}, e)
	assert.Equal(t, exitError, code)
	assert.Equal(t, "No stable model found before the search stopped.\n", out.String())
	assert.Contains(t, errb.String(), "the time limit of 1ns ran out before any model was found; try a longer --time-limit")
}

func TestLogicVerify(t *testing.T) {
	prog := logicFile(t, "p.lp", "a :- not b.\nb :- not a.\n{c} :- a.\n:- c, b.\n:~ c. [2@1]\n:~ a. [1@0]\n")
	modelFile := logicFile(t, "m.txt", "a\nc\n")
	tests := []struct {
		name   string
		args   []string
		stdin  string
		code   int
		stdout string
		stderr string
	}{
		{"stable", []string{prog, "--model", "a, c"}, "", exitOK,
			"The candidate is a stable model.\nCost at level 1: 2\nCost at level 0: 1\n", ""},
		{"stable from file", []string{prog, "--model-file", modelFile}, "", exitOK,
			"The candidate is a stable model.\nCost at level 1: 2\nCost at level 0: 1\n", ""},
		{"stable from stdin", []string{prog, "--model-file", "-"}, "b", exitOK,
			"The candidate is a stable model.\nCost at level 1: 0\nCost at level 0: 0\n", ""},
		{"program from stdin", []string{"-", "--model", "b"}, "b :- not a. a :- not b.", exitOK,
			"The candidate is a stable model.\n", ""},
		{"empty candidate", []string{prog, "--model", ""}, "", exitNone,
			"The candidate is not a stable model (2 problems):\n" +
				"  - atom a is derived by rule 0 (`a :- not b.`) but false in the candidate\n" +
				"  - atom b is derived by rule 1 (`b :- not a.`) but false in the candidate\n", ""},
		{"unsupported", []string{prog, "--model", "b c"}, "", exitNone,
			"The candidate is not a stable model (2 problems):\n" +
				"  - atom c is true but has no support in the reduct (no rule derives it: choice 0 needs a (not derived))\n" +
				"  - constraint at rule 2 (`:- c, b.`) is violated: all of its body is true\n", ""},
		{"unknown atom", []string{prog, "--model", "a, d"}, "", exitError, "",
			"--model:1:4: d is not an atom of the program: check the spelling\ntermwright: 1 error in the candidate"},
		{"no candidate", []string{prog}, "", exitError, "", "give the candidate with exactly one of --model"},
		{"two candidates", []string{prog, "--model", "a", "--model-file", modelFile}, "", exitError, "", "exactly one of"},
		{"both stdin", []string{"-", "--model-file", "-"}, "", exitError, "", "cannot both come from standard input"},
		{"missing model file", []string{prog, "--model-file", filepath.Join(t.TempDir(), "x")}, "", exitError, "", "cannot open the candidate"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := logicEnv(tc.stdin)
			code := run(append([]string{"logic", "verify"}, tc.args...), e)
			assert.Equal(t, tc.code, code, "stderr: %s", errb)
			assert.Equal(t, tc.stdout, out.String())
			assert.Contains(t, errb.String(), tc.stderr)
		})
	}
}

func TestLogicVerifyListsAtMost50Problems(t *testing.T) {
	// 60 facts, none in the candidate: 60 problems, 50 listed.
	var b strings.Builder
	for i := range 60 {
		fmt.Fprintf(&b, "f(%d).\n", i)
	}
	e, out, _ := logicEnv(b.String())
	require.Equal(t, exitNone, run([]string{"logic", "verify", "-", "--model", ""}, e))
	lines := strings.Split(strings.TrimSpace(out.String()), "\n")
	require.Len(t, lines, 52)
	assert.Equal(t, "The candidate is not a stable model (60 problems):", lines[0])
	assert.Equal(t, "  and 10 more (--json lists all)", lines[51])
}

func TestLogicVerifyJSON(t *testing.T) {
	prog := logicFile(t, "p.lp", "p :- p.\n:~ p. [4@2]\n")
	e, out, _ := logicEnv("")
	require.Equal(t, exitNone, run([]string{"logic", "verify", prog, "--model", "p", "--json"}, e))
	assert.Equal(t, `{"stable":false,"problems":[{"kind":"unsupported","atom":"p","message":"atom p is true but has no support in the reduct (no rule derives it: rule 0 `+"`p :- p.`"+` needs p (not derived))"}],"cost":[]}`+"\n", out.String())

	e, out, _ = logicEnv("")
	require.Equal(t, exitOK, run([]string{"logic", "verify", prog, "--model", "", "--json"}, e))
	assert.Equal(t, `{"stable":true,"problems":[],"cost":[{"level":2,"cost":0}]}`+"\n", out.String())
}

func TestLogicVerifyReadsSolveOutput(t *testing.T) {
	// What solve prints for a model reads back as the candidate for verify.
	p, _ := testprog.Hamiltonian(5, testprog.CompleteArcs(5))
	prog := logicProgramFile(t, "ham.lp", p)
	e, out, _ := logicEnv("")
	require.Equal(t, exitOK, run([]string{"logic", "solve", prog}, e))
	lines := strings.Split(out.String(), "\n")
	require.GreaterOrEqual(t, len(lines), 2)
	// The shown atoms are the arcs; reach atoms follow from them, so the
	// arcs alone are not stable: verify names the missing reach atoms.
	e, out, _ = logicEnv("")
	assert.Equal(t, exitNone, run([]string{"logic", "verify", prog, "--model", lines[1]}, e))
	assert.Contains(t, out.String(), "atom reach(1) is derived by rule")
}

func TestLogicNeedsSubcommand(t *testing.T) {
	e, _, errb := logicEnv("")
	assert.Equal(t, exitError, run([]string{"logic"}, e))
	assert.Contains(t, errb.String(), "say what to do")
}

// logicUpdate reports the -update flag (defined by whichever test file
// registers it first).
func logicUpdate() bool {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files under testdata/")
	}
	f := flag.Lookup("update")
	return f != nil && f.Value.String() == "true"
}

func init() { logicUpdate() }

func TestLogicHelpGolden(t *testing.T) {
	for _, args := range [][]string{{"logic", "--help"}, {"logic", "solve", "--help"}, {"logic", "verify", "--help"}} {
		name := strings.Join(args[:len(args)-1], "-") + "-help.golden"
		t.Run(name, func(t *testing.T) {
			e, out, _ := logicEnv("")
			require.Equal(t, exitOK, run(args, e))
			golden := filepath.Join("testdata", name)
			if logicUpdate() {
				require.NoError(t, os.WriteFile(golden, out.Bytes(), 0o644))
			}
			want, err := os.ReadFile(golden)
			require.NoError(t, err, "run go test ./cmd/termwright -run TestLogicHelpGolden -update")
			assert.Equal(t, string(want), out.String())
		})
	}
}
