package main

import (
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func TestCompileCommand(t *testing.T) {
	dir := t.TempDir()
	term := solveWriteTerm(t, dir, solveTinyTerm(2))
	out := filepath.Join(dir, "program.lp")
	e, stdout, stderr := solveEnv()
	require.Equal(t, exitOK, run([]string{"compile", term, "-o", out}, e), "stderr: %s", stderr)
	assert.Empty(t, stdout.String())
	assert.Contains(t, stderr.String(), "requirement groups")
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	solveGolden(t, "testdata/compile.golden.lp", data)
	text := string(data)
	assert.Contains(t, text, `% [staff no-overlap] staff Ada Quill (T1) teaches at most one meeting at a time`)
	assert.Contains(t, text, `start("A1",mon_09_00)`)

	// The dump reads back as the same program.
	read, err := solver.ReadProgram(strings.NewReader(text), "program.lp")
	require.NoError(t, err)
	loaded, _, err := timetable.Load(term)
	require.NoError(t, err)
	p, _, err := encode.Compile(loaded, encode.Options{})
	require.NoError(t, err)
	assert.Equal(t, p.NumAtoms(), read.NumAtoms())
	assert.Equal(t, len(p.Rules), len(read.Rules))
	assert.Equal(t, len(p.Bounds), len(read.Bounds))

	// Existing output refused, then replaced with --force; --explain frees
	// the selectors.
	e, _, stderr = solveEnv()
	assert.Equal(t, exitError, run([]string{"compile", term, "-o", out, "--explain"}, e))
	assert.Contains(t, stderr.String(), "already exists")
	e, _, stderr = solveEnv()
	require.Equal(t, exitOK, run([]string{"compile", term, "-o", out, "--explain", "--force"}, e), "stderr: %s", stderr)
	data, err = os.ReadFile(out)
	require.NoError(t, err)
	assert.Contains(t, string(data), `{req(staff_no_overlap,"T1")}.`)

	// Standard output when no -o is given.
	e, stdout, _ = solveEnv()
	require.Equal(t, exitOK, run([]string{"compile", term}, e))
	assert.Contains(t, stdout.String(), "% Ground program of term \"Tiny\"")
}
