package export

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

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
		"pdf/all": 1, "pdf/staff": 5, "pdf/room": 4, "pdf/cohort": 2, "pdf/student": 3, // --students: a grid PDF per student too
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

// agedDir makes a directory (with one file) last changed an hour ago, as
// a run killed then leaves it.
func agedDir(t *testing.T, p string, withManifest bool, manifestTime time.Time) {
	t.Helper()
	require.NoError(t, os.MkdirAll(filepath.Join(p, "pdf"), 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(p, "pdf", "half.pdf"), []byte("%PDF-"), 0o644))
	if withManifest {
		m := filepath.Join(p, ManifestName)
		require.NoError(t, os.WriteFile(m, []byte(`{"generator":"termwright","files":[{"path":"pdf/half.pdf"}]}`), 0o644))
		require.NoError(t, os.Chtimes(m, manifestTime, manifestTime))
	}
	old := time.Now().Add(-time.Hour)
	require.NoError(t, os.Chtimes(p, old, old))
}

// TestPublishCleansStaleLeftovers: working directories of killed runs
// (.out.partial-*, and .old ones moved aside, however recent: no live run
// holds their lock) are removed; one a live run holds locked, and anything
// not named as ours, are kept.
func TestPublishCleansStaleLeftovers(t *testing.T) {
	term, s := demoTerm()
	parent := t.TempDir()
	at := func(name string) string { return filepath.Join(parent, name) }
	agedDir(t, at(".out.partial-111"), false, time.Time{})
	agedDir(t, at(".out.partial-222.old"), false, time.Time{})
	agedDir(t, at(".out.partial-444"), false, time.Time{})
	agedDir(t, at(".other.partial-555"), false, time.Time{})
	agedDir(t, at("out.partial-666"), false, time.Time{})
	require.NoError(t, os.Mkdir(at(".out.partial-333"), 0o755)) // a run killed just now
	release, held, err := TryLock(at(".out.partial-444"))
	require.NoError(t, err)
	require.False(t, held)
	defer release()

	_, err = Publish(at("out"), term, s, Options{Generated: fixedClock})
	require.NoError(t, err)
	assertNoLeftovers(t, parent, "out", ".out.partial-444", ".other.partial-555", "out.partial-666")
}

// TestPublishRecoversAnInterruptedSwap: a run killed between the two
// renames of the fallback swap leaves dir missing with the new and the
// earlier publication beside it; the next run moves the newer back to dir
// (so dir holds a complete publication again), and then treats it like
// any earlier publication: refused without --force, replaced with it.
func TestPublishRecoversAnInterruptedSwap(t *testing.T) {
	term, s := demoTerm()
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	older, newer := time.Now().Add(-time.Hour), time.Now().Add(-10*time.Minute)
	agedDir(t, filepath.Join(parent, ".out.partial-777.old"), true, older)
	agedDir(t, filepath.Join(parent, ".out.partial-777"), true, newer)

	_, err := Publish(dir, term, s, Options{Generated: fixedClock})
	require.Error(t, err)
	assert.Contains(t, err.Error(), "already holds files")
	fi, err := os.Stat(filepath.Join(dir, ManifestName))
	require.NoError(t, err, "the publication is back at its name")
	assert.WithinDuration(t, newer, fi.ModTime(), time.Second, "the newer of the two came back")
	assertNoLeftovers(t, parent, "out")

	_, err = Publish(dir, term, s, Options{Generated: fixedClock, Force: true})
	require.NoError(t, err)
	assertNoLeftovers(t, parent, "out")
}

// TestPublishReplaceInOneStep: replacing an earlier publication leaves
// only the new one at the name and nothing beside it.
func TestPublishReplaceInOneStep(t *testing.T) {
	term, s := demoTerm()
	parent := t.TempDir()
	dir := filepath.Join(parent, "out")
	_, err := Publish(dir, term, s, Options{Generated: fixedClock})
	require.NoError(t, err)
	later := fixedClock.Add(time.Hour)
	_, err = Publish(dir, term, s, Options{Generated: later, Force: true})
	require.NoError(t, err)
	var m Manifest
	b, err := os.ReadFile(filepath.Join(dir, ManifestName))
	require.NoError(t, err)
	require.NoError(t, json.Unmarshal(b, &m))
	assert.Equal(t, later.Format(time.RFC3339), m.Generated)
	assertNoLeftovers(t, parent, "out")
}

// TestExchange swaps two directories in one step where the system offers
// it (renameat2 RENAME_EXCHANGE, Linux man page rename(2)).
func TestExchange(t *testing.T) {
	a, b := filepath.Join(t.TempDir(), "a"), filepath.Join(t.TempDir(), "b")
	require.NoError(t, os.MkdirAll(a, 0o755))
	require.NoError(t, os.MkdirAll(b, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(a, "from-a"), nil, 0o644))
	require.NoError(t, os.WriteFile(filepath.Join(b, "from-b"), nil, 0o644))
	if err := exchange(a, b); err != nil {
		t.Skipf("no one-step exchange here (%v): swapInto falls back to two renames", err)
	}
	assert.FileExists(t, filepath.Join(a, "from-b"))
	assert.FileExists(t, filepath.Join(b, "from-a"))
}
