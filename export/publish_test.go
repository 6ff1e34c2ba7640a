package export

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestPublish(t *testing.T) {
	term, s := demoTerm()
	dir := filepath.Join(t.TempDir(), "out")
	m, err := Publish(dir, term, s, Options{Generated: fixedClock, Students: true})
	require.NoError(t, err)

	counts := map[string]int{}
	for _, c := range m.Counts() {
		counts[c.Format+"/"+c.Kind] = c.Files
	}
	assert.Equal(t, map[string]int{
		"pdf/all": 1, "pdf/staff": 5, "pdf/room": 4, "pdf/cohort": 2,
		"ics/staff": 5, "ics/room": 4, "ics/cohort": 2, "ics/student": 3,
		"xlsx/all": 1, "csv/all": 1, "json/all": 1,
	}, counts)
	for _, f := range m.Files {
		fi, err := os.Stat(filepath.Join(dir, filepath.FromSlash(f.Path)))
		require.NoError(t, err, f.Path)
		assert.Equal(t, f.Bytes, fi.Size(), f.Path)
		assert.Positive(t, f.Bytes, f.Path)
	}
	var paths []string
	for _, f := range m.Files {
		paths = append(paths, f.Path)
	}
	assert.Contains(t, paths, "pdf/staff/S1.pdf")
	assert.Contains(t, paths, "calendar/rooms/R101.ics")
	assert.Contains(t, paths, "calendar/students/evil.ics") // from the student ID "../evil"
	assert.Contains(t, paths, "timetable.xlsx")

	// The CSV in the directory is the same as WriteTimetableCSV's.
	var csvBuf bytes.Buffer
	require.NoError(t, WriteTimetableCSV(&csvBuf, term, s))
	got, err := os.ReadFile(filepath.Join(dir, "timetable.csv"))
	require.NoError(t, err)
	assert.Equal(t, csvBuf.Bytes(), got)

	var onDisk Manifest
	b, err := os.ReadFile(filepath.Join(dir, ManifestName))
	require.NoError(t, err)
	require.NoError(t, json.Unmarshal(b, &onDisk))
	assert.Equal(t, m.Files, onDisk.Files)
	assert.Equal(t, "2027-08-30T14:05:00Z", onDisk.Generated)
	assertNoLeftovers(t, filepath.Dir(dir), "out")
}

// assertNoLeftovers checks that only the wanted entries remain in parent.
func assertNoLeftovers(t *testing.T, parent string, want ...string) {
	t.Helper()
	entries, err := os.ReadDir(parent)
	require.NoError(t, err)
	var names []string
	for _, e := range entries {
		names = append(names, e.Name())
	}
	assert.ElementsMatch(t, want, names)
}

func TestPublishWithoutStudents(t *testing.T) {
	term, s := demoTerm()
	m, err := Publish(filepath.Join(t.TempDir(), "out"), term, s, Options{Generated: fixedClock})
	require.NoError(t, err)
	for _, f := range m.Files {
		assert.NotEqual(t, "student", f.Kind)
	}
}

func TestPublishRefusesToClobber(t *testing.T) {
	term, s := demoTerm()
	opt := Options{Generated: fixedClock}
	tests := []struct {
		name    string
		setup   func(t *testing.T, dir string)
		force   bool
		wantErr string
	}{
		{"missing dir", func(t *testing.T, dir string) {}, false, ""},
		{"empty dir", func(t *testing.T, dir string) { require.NoError(t, os.Mkdir(dir, 0o755)) }, false, ""},
		{"user files", func(t *testing.T, dir string) {
			require.NoError(t, os.Mkdir(dir, 0o755))
			require.NoError(t, os.WriteFile(filepath.Join(dir, "notes.txt"), []byte("mine"), 0o644))
		}, false, "already holds files"},
		{"user files with force", func(t *testing.T, dir string) {
			require.NoError(t, os.Mkdir(dir, 0o755))
			require.NoError(t, os.WriteFile(filepath.Join(dir, "notes.txt"), []byte("mine"), 0o644))
		}, true, "was not written by termwright"},
		{"earlier publication", func(t *testing.T, dir string) {
			_, err := Publish(dir, term, s, opt)
			require.NoError(t, err)
		}, false, "--force"},
		{"earlier publication with force", func(t *testing.T, dir string) {
			_, err := Publish(dir, term, s, opt)
			require.NoError(t, err)
		}, true, ""},
		{"earlier publication plus a user file, with force", func(t *testing.T, dir string) {
			_, err := Publish(dir, term, s, opt)
			require.NoError(t, err)
			require.NoError(t, os.WriteFile(filepath.Join(dir, "pdf", "staff", "annotated.pdf"), []byte("mine"), 0o644))
		}, true, "pdf/staff/annotated.pdf"},
		{"a file", func(t *testing.T, dir string) {
			require.NoError(t, os.WriteFile(dir, []byte("mine"), 0o644))
		}, true, "not a directory"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			parent := t.TempDir()
			dir := filepath.Join(parent, "out")
			tc.setup(t, dir)
			before := snapshot(t, dir)
			_, err := Publish(dir, term, s, Options{Generated: fixedClock, Force: tc.force})
			if tc.wantErr == "" {
				require.NoError(t, err)
				_, err := os.Stat(filepath.Join(dir, "timetable.xlsx"))
				assert.NoError(t, err)
			} else {
				require.Error(t, err)
				assert.Contains(t, err.Error(), tc.wantErr)
				assert.Equal(t, before, snapshot(t, dir), "nothing changed")
			}
			assertNoLeftovers(t, parent, "out")
		})
	}
}

func TestPublishErrorsLeaveNothing(t *testing.T) {
	term, s := demoTerm()
	parent := t.TempDir()
	_, err := Publish(filepath.Join(parent, "out"), term, s, Options{Paper: "A5"})
	assert.ErrorContains(t, err, "A4 or Letter")
	term.TimeZone = "Nowhere/Special"
	_, err = Publish(filepath.Join(parent, "out"), term, s, Options{})
	assert.ErrorContains(t, err, "Time zone")
	assertNoLeftovers(t, parent)
}

// snapshot maps every file under dir to its content.
func snapshot(t *testing.T, dir string) map[string]string {
	out := map[string]string{}
	fi, err := os.Stat(dir)
	if err != nil {
		return out
	}
	if !fi.IsDir() {
		b, _ := os.ReadFile(dir)
		return map[string]string{".": string(b)}
	}
	require.NoError(t, filepath.Walk(dir, func(p string, info os.FileInfo, err error) error {
		if err == nil && !info.IsDir() {
			b, _ := os.ReadFile(p)
			out[strings.TrimPrefix(p, dir)] = string(b)
		}
		return err
	}))
	return out
}
