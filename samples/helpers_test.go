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

var update = flag.Bool("update", false, "rewrite the demo workbooks and CSV folders")

// checkTermFiles writes term as a workbook and as a CSV folder and compares
// both byte for byte with the checked-in workbook and csvDir (a sheet the
// term does not use has no CSV file); with -update it rewrites them first.
// from names where the term comes from and test the test to rerun.
func checkTermFiles(t *testing.T, term *timetable.Term, workbook, csvDir, from, test string) {
	t.Helper()
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
	if *update {
		require.NoError(t, os.WriteFile(workbook, buf.Bytes(), 0o644))
		require.NoError(t, timetable.WriteTermCSV(term, csvDir))
	}
	want, err := os.ReadFile(workbook)
	require.NoError(t, err)
	assert.True(t, bytes.Equal(want, buf.Bytes()),
		"%s differs from %s; if it changed on purpose, run go test ./samples -run %s -update", workbook, from, test)

	dir := t.TempDir()
	require.NoError(t, timetable.WriteTermCSV(term, dir))
	for _, name := range timetable.TermCSVFiles() {
		got, err := os.ReadFile(filepath.Join(dir, name))
		if errors.Is(err, fs.ErrNotExist) {
			continue // a sheet this term does not use
		}
		require.NoError(t, err)
		want, err := os.ReadFile(filepath.Join(csvDir, name))
		require.NoError(t, err)
		assert.Equal(t, string(want), string(got), "%s/%s differs; rerun with -update", csvDir, name)
	}
}

// bookedBy lists who a meeting of section s in room occupies, each of them
// able to be in one place at a time: "staff S1", "cohort C1", "room R1"
// (no room when room is "").
func bookedBy(s timetable.Section, room string) []string {
	var who []string
	for _, id := range s.Staff {
		who = append(who, "staff "+id)
	}
	for _, id := range s.Cohorts {
		who = append(who, "cohort "+id)
	}
	if room != "" {
		who = append(who, "room "+room)
	}
	return who
}
