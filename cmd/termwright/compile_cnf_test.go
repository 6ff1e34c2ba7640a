package main

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestCompileCNFAndLogicSat: compile --cnf writes a DIMACS file that logic
// sat decides as satisfiable, and whose model, restricted to the program's
// atoms, is a stable model of the compiled program (checked by
// solver.Verify).
func TestCompileCNFAndLogicSat(t *testing.T) {
	dir := t.TempDir()
	term := solveWriteTerm(t, dir, solveTinyTerm(2))
	out := filepath.Join(dir, "term.cnf")
	e, stdout, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"compile", term, "--cnf", "--cnf-names", "-o", out}, e), "stderr: %s", stderr)
	assert.Empty(t, stdout.String())
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	text := string(data)
	assert.Contains(t, text, "\np cnf ")
	assert.Contains(t, text, `start("A1",mon_09_00)`)

	e, stdout, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"logic", "sat", out}, e), "stderr: %s", stderr)
	assert.True(t, strings.HasPrefix(stdout.String(), "s SATISFIABLE\n"))
	assert.Contains(t, stderr.String(), "conflicts")

	// The v lines restricted to the program's atoms form a stable model.
	loaded, _, err := timetable.Load(term)
	require.NoError(t, err)
	p, _, err := encode.Compile(loaded, encode.Options{})
	require.NoError(t, err)
	var model []solver.Atom
	for _, line := range strings.Split(stdout.String(), "\n") {
		if !strings.HasPrefix(line, "v ") {
			continue
		}
		for _, f := range strings.Fields(line)[1:] {
			v, err := strconv.Atoi(f)
			require.NoError(t, err)
			if v > 0 && v <= p.NumAtoms() {
				model = append(model, solver.Atom(v))
			}
		}
	}
	require.NoError(t, solver.Verify(p, model))

	// Existing output refused.
	e, _, stderr = solveEnv()
	assert.Equal(t, exitError, run([]string{"compile", term, "--cnf", "-o", out}, e))
	assert.Contains(t, stderr.String(), "already exists")
}

func TestLogicSat(t *testing.T) {
	dir := t.TempDir()
	write := func(name, text string) string {
		path := filepath.Join(dir, name)
		require.NoError(t, os.WriteFile(path, []byte(text), 0o644))
		return path
	}
	cases := []struct {
		name, text string
		args       []string
		code       int
		out, err   string
	}{
		{"sat", "p cnf 2 2\n1 2 0\n-1 0\n", nil, exitOK, "s SATISFIABLE\nv -1 2 0\n", "2 variables, 2 clauses"},
		{"quiet", "p cnf 2 1\n1 2 0\n", []string{"-q"}, exitOK, "s SATISFIABLE\n", ""},
		{"unsat", "p cnf 1 2\n1 0\n-1 0\n", nil, exitNone, "s UNSATISFIABLE\n", ""},
		{"bad", "p cnf 1 1\n2 0\n", nil, exitError, "", "bad.cnf:2:1: literal 2 refers to variable 2"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			path := write(c.name+".cnf", c.text)
			e, stdout, stderr := solveEnv()
			require.Equal(t, c.code, run(append([]string{"logic", "sat", path}, c.args...), e), "stderr: %s", stderr)
			assert.Equal(t, c.out, stdout.String())
			assert.Contains(t, stderr.String(), c.err)
		})
	}
	e, _, stderr := solveEnv()
	assert.Equal(t, exitError, run([]string{"logic", "sat", filepath.Join(dir, "missing.cnf")}, e))
	assert.Contains(t, stderr.String(), "cannot open")
}

// TestCompileCNFFromCTT: a benchmark instance in the .ctt format compiles
// to CNF too.
func TestCompileCNFFromCTT(t *testing.T) {
	out := filepath.Join(t.TempDir(), "tiny.cnf")
	e, _, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"compile", tinyCTT, "--cnf", "-o", out}, e), "stderr: %s", stderr)
	e, stdout, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"logic", "sat", "-q", out}, e), "stderr: %s", stderr)
	assert.Equal(t, "s SATISFIABLE\n", stdout.String())
	e, _, stderr = solveEnv()
	assert.Equal(t, exitError, run([]string{"compile", filepath.Join(t.TempDir(), "none.ctt"), "--cnf"}, e))
	assert.Contains(t, stderr.String(), "cannot open the instance")
}
