package main

import (
	"bytes"
	"flag"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// generateEnv is an env with buffers for streams.
func generateEnv() (*env, *bytes.Buffer, *bytes.Buffer) {
	var out, errb bytes.Buffer
	return &env{stdin: bytes.NewReader(nil), stdout: &out, stderr: &errb, now: func() time.Time { return time.Unix(0, 0) }}, &out, &errb
}

func TestGenerateCommand(t *testing.T) {
	dir := t.TempDir()
	existing := filepath.Join(dir, "existing.xlsx")
	require.NoError(t, os.WriteFile(existing, []byte("keep me"), 0o644))
	csvFull := filepath.Join(dir, "full")
	require.NoError(t, os.MkdirAll(csvFull, 0o755))
	require.NoError(t, os.WriteFile(filepath.Join(csvFull, "Rooms.csv"), []byte("keep me"), 0o644))
	aFile := filepath.Join(dir, "a-file")
	require.NoError(t, os.WriteFile(aFile, nil, 0o644))

	cases := []struct {
		name    string
		args    []string
		code    int
		stderr  string // substring of stderr
		keepDir string // a file that must still say "keep me"
	}{
		{"xlsx", []string{"new.xlsx", "--sections", "40", "--seed", "3"}, exitOK, "wrote " + filepath.Join(dir, "new.xlsx") + ": 40 sections", ""},
		{"csv only", []string{"--csv", filepath.Join(dir, "folder"), "--sections", "20"}, exitOK, "20 sections", ""},
		{"no output", []string{"--sections", "20"}, exitError, "say where to write", ""},
		{"existing file", []string{existing, "--sections", "5"}, exitError, "existing.xlsx already exists — choose another name, or add --force", existing},
		{"existing csv", []string{"--csv", csvFull}, exitError, "Rooms.csv already exists", filepath.Join(csvFull, "Rooms.csv")},
		{"csv is a file", []string{"--csv", aFile}, exitError, "is a file, not a folder", ""},
		{"not xlsx", []string{"term.xls"}, exitError, "does not end in .xlsx", ""},
		{"no sections", []string{"x.xlsx", "--sections", "0"}, exitError, "--sections must be from 1 to 100000, not 0", ""},
		{"bad periods", []string{"x.xlsx", "--periods", "20"}, exitError, "--periods must be from 2 to 13", ""},
		{"two files", []string{"a.xlsx", "b.xlsx"}, exitError, "accepts at most 1 arg", ""},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			e, _, errb := generateEnv()
			args := append([]string{"generate"}, c.args...)
			if len(c.args) > 0 && filepath.Ext(c.args[0]) != "" && !filepath.IsAbs(c.args[0]) {
				args[1] = filepath.Join(dir, c.args[0])
			}
			code := run(args, e)
			assert.Equal(t, c.code, code, "stderr: %s", errb)
			assert.Contains(t, errb.String(), c.stderr)
			if c.keepDir != "" {
				data, err := os.ReadFile(c.keepDir)
				require.NoError(t, err)
				assert.Equal(t, "keep me", string(data), "nothing the user had is overwritten")
			}
		})
	}

	// What was written reads back clean.
	term, ps, err := timetable.Load(filepath.Join(dir, "new.xlsx"))
	require.NoError(t, err)
	assert.Empty(t, ps)
	assert.Len(t, term.Sections, 40)
	term, ps, err = timetable.Load(filepath.Join(dir, "folder"))
	require.NoError(t, err)
	assert.Empty(t, ps)
	assert.Len(t, term.Sections, 20)
	fi, err := os.Stat(filepath.Join(dir, "new.xlsx"))
	require.NoError(t, err)
	assert.Equal(t, os.FileMode(0o644), fi.Mode().Perm())
	leftovers, _ := filepath.Glob(filepath.Join(dir, ".*.tmp"))
	assert.Empty(t, leftovers, "no temporary files left behind")
}

func TestGenerateForceReplaces(t *testing.T) {
	dir := t.TempDir()
	out := filepath.Join(dir, "t.xlsx")
	require.NoError(t, os.WriteFile(out, []byte("old"), 0o644))
	e, _, errb := generateEnv()
	require.Equal(t, exitOK, run([]string{"generate", out, "--sections", "10", "--force", "--csv", filepath.Join(dir, "c")}, e), errb.String())
	_, ps, err := timetable.Load(out)
	require.NoError(t, err)
	assert.Empty(t, ps)
	e, _, errb = generateEnv()
	assert.Equal(t, exitOK, run([]string{"generate", "--csv", filepath.Join(dir, "c"), "--sections", "10", "--force"}, e), errb.String())
}

// TestGenerateDefaultsGiveDemo: with no size flags the command writes the
// checked-in demo workbook byte for byte, to standard output with "-".
func TestGenerateDefaultsGiveDemo(t *testing.T) {
	e, out, errb := generateEnv()
	require.Equal(t, exitOK, run([]string{"generate", "-"}, e), errb.String())
	want, err := os.ReadFile(filepath.Join("..", "..", "samples", "demo-term.xlsx"))
	require.NoError(t, err)
	assert.True(t, bytes.Equal(want, out.Bytes()), "generate - must reproduce samples/demo-term.xlsx")
	assert.Contains(t, errb.String(), "150 sections")
}

// TestGenerateHelp compares `generate --help` with its golden file
// (rewrite with -update).
func TestGenerateHelp(t *testing.T) {
	e, out, errb := generateEnv()
	require.Equal(t, exitOK, run([]string{"generate", "--help"}, e), errb.String())
	golden := filepath.Join("testdata", "generate-help.golden")
	if f := flag.Lookup("update"); f != nil && f.Value.String() == "true" {
		require.NoError(t, os.MkdirAll("testdata", 0o755))
		require.NoError(t, os.WriteFile(golden, out.Bytes(), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test ./cmd/termwright -run TestGenerateHelp -update")
	assert.Equal(t, string(want), out.String())
}

// The -update flag may be defined by another test file of this package;
// define it here only when nobody has.
func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files under testdata/")
	}
}
