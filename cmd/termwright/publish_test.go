package main

import (
	"bytes"
	"encoding/json"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// publishFiles writes a synthetic term workbook and its valid timetable
// (edited by edit, when given) into dir and returns their paths.
func publishFiles(t *testing.T, dir string, edit func(*timetable.Term, *timetable.Schedule)) (termPath, ttPath string) {
	t.Helper()
	term, s := samples.GenerateWithWitness(samples.Config{Sections: 30, Seed: 5})
	termPath = filepath.Join(dir, "term.xlsx")
	var buf bytes.Buffer
	require.NoError(t, timetable.WriteTermWorkbook(term, &buf))
	require.NoError(t, os.WriteFile(termPath, buf.Bytes(), 0o644))
	if edit != nil {
		edit(term, s)
	}
	ttPath = filepath.Join(dir, "timetable.xlsx")
	buf.Reset()
	require.NoError(t, export.WriteTimetableWorkbook(&buf, term, s, export.Options{}))
	require.NoError(t, os.WriteFile(ttPath, buf.Bytes(), 0o644))
	return termPath, ttPath
}

func TestPublishCommand(t *testing.T) {
	dir := t.TempDir()
	termPath, ttPath := publishFiles(t, dir, nil)
	badDir := t.TempDir()
	// Two meetings of different sections with a common staff member at the same start: a hard clash.
	badTerm, badTT := publishFiles(t, badDir, func(term *timetable.Term, s *timetable.Schedule) {
		secs := map[string]timetable.Section{}
		for _, sec := range term.Sections {
			secs[sec.ID] = sec
		}
		for i := range s.Placements {
			for j := range s.Placements {
				a, b := secs[s.Placements[i].Section], secs[s.Placements[j].Section]
				if a.ID != b.ID && a.Length == b.Length && len(a.Staff) > 0 && len(b.Staff) > 0 && a.Staff[0] == b.Staff[0] && a.Weeks.Overlaps(b.Weeks) {
					a := s.Placements[i]
					s.Placements[j].Period = a.Period
					return
				}
			}
		}
		t.Fatal("no two sections share a staff member")
	})
	occupied := filepath.Join(dir, "occupied")
	require.NoError(t, os.MkdirAll(occupied, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(occupied, "notes.txt"), []byte("keep me"), 0o644))

	cases := []struct {
		name   string
		args   []string
		code   int
		stdout string // substring
		stderr string // substring
	}{
		{"publish", []string{termPath, ttPath, "-o", filepath.Join(dir, "out")}, exitOK, "Published", ""},
		{"letter and students", []string{termPath, ttPath, "-o", filepath.Join(dir, "out2"), "--paper", "Letter", "--students"}, exitOK, "ics   student", ""},
		{"again without force", []string{termPath, ttPath, "-o", filepath.Join(dir, "out")}, exitError, "", "--force"},
		{"again with force", []string{termPath, ttPath, "-o", filepath.Join(dir, "out"), "--force"}, exitOK, "Published", ""},
		{"someone else's folder", []string{termPath, ttPath, "-o", occupied, "--force"}, exitError, "", "not written by termwright"},
		{"no output", []string{termPath, ttPath}, exitError, "", "-o DIR"},
		{"bad paper", []string{termPath, ttPath, "-o", filepath.Join(dir, "out3"), "--paper", "A3"}, exitError, "", "A4 or Letter"},
		{"hard violation", []string{badTerm, badTT, "-o", filepath.Join(badDir, "out")}, exitError, "", "not published"},
		{"missing timetable", []string{termPath, filepath.Join(dir, "nope.xlsx"), "-o", filepath.Join(dir, "out4")}, exitError, "", "does not exist"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := checkEnv()
			code := run(append([]string{"publish"}, tc.args...), e)
			assert.Equal(t, tc.code, code, "stderr: %s", errb.String())
			assert.Contains(t, out.String(), tc.stdout)
			assert.Contains(t, errb.String(), tc.stderr)
			assert.NotContains(t, errb.String(), "panic")
		})
	}
	for _, p := range []string{"timetable.pdf", "timetable.xlsx", "timetable.csv", "timetable.json", "manifest.json"} {
		_, err := os.Stat(filepath.Join(dir, "out", p))
		assert.NoError(t, err, p)
	}
	b, err := os.ReadFile(filepath.Join(occupied, "notes.txt"))
	require.NoError(t, err)
	assert.Equal(t, "keep me", string(b))
	_, err = os.Stat(filepath.Join(badDir, "out"))
	assert.True(t, os.IsNotExist(err), "nothing published for a clashing timetable")
	for _, d := range []string{filepath.Join(dir, "out3"), filepath.Join(dir, "out4")} {
		_, err = os.Stat(d)
		assert.True(t, os.IsNotExist(err), d)
	}
}

func TestPublishManifestText(t *testing.T) {
	var out bytes.Buffer
	writeManifest(&out, export.Manifest{Dir: "out", Files: []export.ManifestFile{
		{Path: "pdf/staff/a.pdf", Format: "pdf", Kind: "staff", ID: "a", Bytes: 31000},
		{Path: "pdf/staff/b.pdf", Format: "pdf", Kind: "staff", ID: "b", Bytes: 32000},
		{Path: "timetable.csv", Format: "csv", Kind: "all", Bytes: 900},
	}})
	assert.Equal(t, "Published 3 files (63.9 kB) to out:\n"+
		"  csv   all           1      900 B\n"+
		"  pdf   staff         2    63.0 kB\n", out.String())
	assert.Equal(t, "3.2 MB", sizeText(3_200_000))
}

func TestPublishHelp(t *testing.T) {
	e, out, _ := checkEnv()
	require.Equal(t, exitOK, run([]string{"publish", "--help"}, e))
	path := filepath.Join("testdata", "publish-help.golden")
	if updateGolden() {
		require.NoError(t, os.WriteFile(path, out.Bytes(), 0o644))
	}
	want, err := os.ReadFile(path)
	require.NoError(t, err)
	assert.Equal(t, string(want), out.String())
}

// TestPublishKilled kills (SIGKILL, which no program can catch) a child
// process that republishes over an earlier publication with --force, at a
// different moment in each trial, and requires that the folder always
// holds a complete publication (a valid manifest whose files all exist)
// and that the next publication leaves nothing hidden beside it.
func TestPublishKilled(t *testing.T) {
	if args := os.Getenv("TERMWRIGHT_PUBLISH_CHILD"); args != "" {
		os.Exit(run(strings.Split(args, "\x1f"), newEnv()))
	}
	dir := t.TempDir()
	termPath, ttPath := publishFiles(t, dir, nil)
	out := filepath.Join(dir, "out")
	args := []string{"publish", termPath, ttPath, "-o", out, "--force"}
	e, _, errb := checkEnv()
	require.Equal(t, exitOK, run(args, e), errb.String())
	for trial := range 6 {
		cmd := exec.Command(os.Args[0], "-test.run=^TestPublishKilled$")
		cmd.Env = append(os.Environ(), "TERMWRIGHT_PUBLISH_CHILD="+strings.Join(args, "\x1f"))
		require.NoError(t, cmd.Start())
		// Some moment during the child's run; where exactly does not matter:
		// the property must hold at every one.
		time.Sleep(time.Duration(trial) * 40 * time.Millisecond)
		require.NoError(t, cmd.Process.Kill())
		_ = cmd.Wait()
		b, err := os.ReadFile(filepath.Join(out, export.ManifestName))
		require.NoError(t, err, "trial %d: no complete publication at %s", trial, out)
		var m export.Manifest
		require.NoError(t, json.Unmarshal(b, &m))
		for _, f := range m.Files {
			require.FileExists(t, filepath.Join(out, filepath.FromSlash(f.Path)), "trial %d", trial)
		}
	}
	before, err := filepath.Glob(filepath.Join(dir, ".out.partial-*"))
	require.NoError(t, err)
	t.Logf("%d working directories left by the killed runs", len(before))
	e, _, errb = checkEnv()
	require.Equal(t, exitOK, run(args, e), errb.String())
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	for _, en := range entries {
		assert.False(t, strings.Contains(en.Name(), ".partial-"), "leftover %s", en.Name())
	}
}
