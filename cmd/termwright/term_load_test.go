package main

import (
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// A student information system's export names its columns its own way;
// --columns FILE maps them to ours, and check says what it renamed.
func TestCheckColumnsFile(t *testing.T) {
	term := tinyTerm(t, map[string]string{"Sections!A1": "Crs Nbr", "Staff!B1": "Instructor name"})
	cols := filepath.Join(t.TempDir(), "columns.csv")
	require.NoError(t, os.WriteFile(cols, []byte("Sheet,Their column,Our column\nSections,Crs Nbr,Section\nStaff,Instructor name,Name\n"), 0o644))

	e, out, _ := checkEnv()
	code := run([]string{"check", term}, e)
	assert.Equal(t, exitError, code, "without the renames the Section column is missing: %s", out.String())

	e, out, errb := checkEnv()
	code = run([]string{"check", "--columns", cols, term}, e)
	require.Equal(t, exitOK, code, out.String()+errb.String())
	assert.Contains(t, out.String(), `Sections: column "Crs Nbr" read as "Section"`)
	assert.Contains(t, out.String(), `Staff: column "Instructor name" read as "Name"`)
	assert.Contains(t, out.String(), "No problems found.")

	e, out, _ = checkEnv()
	require.Equal(t, exitOK, run([]string{"check", "--json", "--columns", cols, term}, e))
	var rep checkReport
	require.NoError(t, json.Unmarshal(out.Bytes(), &rep))
	assert.Len(t, rep.Columns, 2)

	e, _, errb = checkEnv()
	code = run([]string{"check", "--columns", filepath.Join(t.TempDir(), "missing.csv"), term}, e)
	assert.Equal(t, exitError, code)
	assert.Contains(t, errb.String(), "column names file")
}

// Inputs that are not regular files are refused in one sentence instead of
// hanging (a FIFO) or reading for ever (a device).
func TestLogicInputsMustBeRegular(t *testing.T) {
	dir := t.TempDir()
	fifo := filepath.Join(dir, "pipe.cnf")
	require.NoError(t, syscall.Mkfifo(fifo, 0o644))
	prog := filepath.Join(dir, "p.lp")
	require.NoError(t, os.WriteFile(prog, []byte("a.\n"), 0o644))
	cases := []struct {
		name string
		args []string
		want string
	}{
		{"sat on a FIFO", []string{"logic", "sat", fifo}, "is a named pipe, not a regular file"},
		{"solve on a device", []string{"logic", "solve", os.DevNull}, "is a device, not a regular file"},
		{"verify on a folder", []string{"logic", "verify", dir, "--model", ""}, "is a folder, not a regular file"},
		{"candidate from a device", []string{"logic", "verify", prog, "--model-file", os.DevNull}, "is a device, not a regular file"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			e, _, errb := checkEnv()
			code := run(c.args, e)
			assert.Equal(t, exitError, code)
			assert.Contains(t, errb.String(), c.want)
			assert.Equal(t, 1, strings.Count(strings.TrimSpace(errb.String()), "\n")+1, errb.String())
		})
	}
}

// Weights whose sum passes 2^63 are an error, never a negative cost.
func TestLogicVerifyCostOverflow(t *testing.T) {
	prog := filepath.Join(t.TempDir(), "w.lp")
	// Each weight fits; the reader refuses totals past 2^62 per level, so
	// this program is refused with its position before any cost is summed.
	require.NoError(t, os.WriteFile(prog, []byte("a.\n:~ a. [4611686018427387904@0]\n:~ a. [4611686018427387904@0, 1]\n"), 0o644))
	e, out, errb := checkEnv()
	code := run([]string{"logic", "verify", prog, "--model", "a"}, e)
	assert.Equal(t, exitError, code, out.String())
	assert.NotContains(t, out.String(), "-")
	assert.Contains(t, errb.String(), "w.lp:")
}
