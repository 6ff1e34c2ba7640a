package main

import (
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func TestNewWritesTemplate(t *testing.T) {
	path := filepath.Join(t.TempDir(), "autumn.xlsx")
	e, out, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"new", path}, e), errb.String())
	assert.Empty(t, out.String())
	assert.Contains(t, errb.String(), "wrote "+path)

	_, ps, err := timetable.Load(path)
	require.NoError(t, err)
	assert.Empty(t, ps.Warnings(), "the template has exactly the known sheets and columns")

	entries, err := os.ReadDir(filepath.Dir(path))
	require.NoError(t, err)
	assert.Len(t, entries, 1, "no temporary file is left behind")
}

func TestNewRefusesToOverwrite(t *testing.T) {
	path := filepath.Join(t.TempDir(), "mine.xlsx")
	require.NoError(t, os.WriteFile(path, []byte("precious"), 0o644))

	e, _, errb := checkEnv()
	assert.Equal(t, exitError, run([]string{"new", path}, e))
	assert.Contains(t, errb.String(), "already exists — choose another name, or add --force to replace it")
	data, err := os.ReadFile(path)
	require.NoError(t, err)
	assert.Equal(t, "precious", string(data), "the file is untouched")

	e, _, errb = checkEnv()
	assert.Equal(t, exitOK, run([]string{"new", "--force", path}, e), errb.String())
	data, err = os.ReadFile(path)
	require.NoError(t, err)
	assert.NotEqual(t, "precious", string(data))
}

func TestNewIntoMissingFolder(t *testing.T) {
	path := filepath.Join(t.TempDir(), "no", "such", "dir", "t.xlsx")
	e, _, errb := checkEnv()
	assert.Equal(t, exitError, run([]string{"new", path}, e))
	assert.Contains(t, errb.String(), "cannot write in")
}
