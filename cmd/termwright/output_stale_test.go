package main

import (
	"io"
	"os"
	"path/filepath"
	"runtime"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
)

// A run killed while writing leaves its temporary file (and perhaps a
// probe file) beside the output; the next write there removes them, but
// never a file a live run still holds, nor anything that is not ours.
func TestWriteOutputRemovesStaleTemps(t *testing.T) {
	if runtime.GOOS == "windows" {
		t.Skip("no advisory locks here: leftovers are kept on purpose")
	}
	dir := t.TempDir()
	out := filepath.Join(dir, "timetable.xlsx")
	stale := filepath.Join(dir, ".timetable.xlsx.12345.tmp")
	probe := filepath.Join(dir, ".termwright-probe-777")
	live := filepath.Join(dir, ".timetable.xlsx.999.tmp")
	other := filepath.Join(dir, ".notes.xlsx.1.tmp")
	mine := filepath.Join(dir, "timetable.xlsx.tmp")
	young := filepath.Join(dir, ".timetable.xlsx.4242.tmp") // created, not yet locked
	old := time.Now().Add(-2 * staleAfter)
	for _, p := range []string{stale, probe, live, other, mine, young} {
		require.NoError(t, os.WriteFile(p, []byte("x"), 0o644))
		if p != young {
			require.NoError(t, os.Chtimes(p, old, old))
		}
	}
	release, held, err := export.TryLock(live) // a run that is still writing
	require.NoError(t, err)
	require.False(t, held)
	defer release()

	got, err := writeOutput(out, false, func(w io.Writer) error { _, err := w.Write([]byte("new")); return err })
	require.NoError(t, err)
	assert.Equal(t, out, got)

	assert.NoFileExists(t, stale, "a killed run's temporary file")
	assert.NoFileExists(t, probe, "a killed run's probe file")
	assert.FileExists(t, live, "a live run's file is held")
	assert.FileExists(t, young, "a file just created may not be locked yet")
	assert.FileExists(t, other, "another output's file is not ours to remove")
	assert.FileExists(t, mine, "a user's file that merely looks alike")
	data, err := os.ReadFile(out)
	require.NoError(t, err)
	assert.Equal(t, "new", string(data))
}
