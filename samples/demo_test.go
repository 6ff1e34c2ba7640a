package samples

import (
	"bytes"
	"errors"
	"flag"
	"io/fs"
	"os"
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

var update = flag.Bool("update", false, "rewrite the demo workbook and CSV folder")

// TestDemoFiles regenerates the demo term and compares it byte for byte with
// the checked-in workbook and CSV folder.
func TestDemoFiles(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(Demo(), &buf))
	if *update {
		require.NoError(t, os.WriteFile(DemoWorkbook, buf.Bytes(), 0o644))
		require.NoError(t, timetable.WriteTermCSV(Demo(), DemoCSVDir))
	}
	want, err := os.ReadFile(DemoWorkbook)
	require.NoError(t, err)
	assert.True(t, bytes.Equal(want, buf.Bytes()),
		"%s differs from Generate(DemoConfig); if the generator changed on purpose, run go test ./samples -run TestDemoFiles -update", DemoWorkbook)

	dir := t.TempDir()
	require.NoError(t, timetable.WriteTermCSV(Demo(), dir))
	for _, name := range timetable.TermCSVFiles() {
		got, err := os.ReadFile(filepath.Join(dir, name))
		if errors.Is(err, fs.ErrNotExist) {
			continue // a sheet the grid demo does not use
		}
		require.NoError(t, err)
		want, err := os.ReadFile(filepath.Join(DemoCSVDir, name))
		require.NoError(t, err)
		assert.Equal(t, string(want), string(got), "%s/%s differs; rerun with -update", DemoCSVDir, name)
	}
}

// TestDemoReadsClean loads the checked-in demo files with the workbook
// readers: no errors and no warnings, and the counts the issue asks for.
func TestDemoReadsClean(t *testing.T) {
	for _, path := range []string{DemoWorkbook, DemoCSVDir} {
		t.Run(path, func(t *testing.T) {
			term, ps, err := timetable.Load(path)
			require.NoError(t, err)
			assert.Empty(t, ps, "problems:\n%s", ps)
			c := timetable.Summary(term)
			assert.Equal(t, 150, c.Sections)
			assert.InDelta(t, 30, c.Rooms, 6, "about 30 rooms")
			assert.InDelta(t, 70, c.Staff, 10, "about 70 staff")
			assert.InDelta(t, 25, c.Cohorts, 6, "about 25 cohorts")
			assert.Equal(t, 45, c.Periods, "Mon-Fri x 9 periods")
			assert.True(t, c.Students >= 200 && c.Students <= 900, "a few hundred students, got %d", c.Students)
		})
	}
}
