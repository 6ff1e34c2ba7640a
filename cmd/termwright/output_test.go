package main

import (
	"errors"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"sync"
	"syscall"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestOutputRefusesNonRegular: with --force, a symbolic link, a named pipe
// and a folder at the output path are refused and left as they were
// (rename(2) would replace the link or pipe itself with a regular file).
func TestOutputRefusesNonRegular(t *testing.T) {
	dir := t.TempDir()
	target := filepath.Join(dir, "precious.xlsx")
	require.NoError(t, os.WriteFile(target, []byte("precious"), 0o644))
	link := filepath.Join(dir, "link.xlsx")
	require.NoError(t, os.Symlink(target, link))
	fifo := filepath.Join(dir, "pipe.xlsx")
	require.NoError(t, syscall.Mkfifo(fifo, 0o644))
	folder := filepath.Join(dir, "folder.xlsx")
	require.NoError(t, os.Mkdir(folder, 0o755))
	term := tinyTerm(t, nil)
	for _, tc := range []struct {
		name, path, want string
		mode             fs.FileMode // the type the path must still have
	}{
		{"symbolic link", link, "is a symbolic link, not a regular file", fs.ModeSymlink},
		{"named pipe", fifo, "is a named pipe, not a regular file", fs.ModeNamedPipe},
		{"folder", folder, "is a folder, not a regular file", fs.ModeDir},
	} {
		for _, args := range [][]string{
			{"new", "--force", tc.path},
			{"solve", term, "-o", tc.path, "--force"},
			{"compile", term, "-o", tc.path, "--force"},
		} {
			t.Run(tc.name+"/"+args[0], func(t *testing.T) {
				e, out, errb := checkEnv()
				assert.Equal(t, exitError, run(args, e))
				assert.Contains(t, errb.String(), tc.want)
				assert.Empty(t, out.String(), "refused before any work")
				fi, err := os.Lstat(tc.path)
				require.NoError(t, err)
				assert.Equal(t, tc.mode, fi.Mode().Type())
			})
		}
	}
	data, err := os.ReadFile(target)
	require.NoError(t, err)
	assert.Equal(t, "precious", string(data), "the link's target is untouched")
}

// TestRefuseNonRegularDevice checks the device case on /dev/null (a
// character device on every Linux system, by the Filesystem Hierarchy
// Standard) without writing anything: only Lstat is used.
func TestRefuseNonRegularDevice(t *testing.T) {
	fi, err := os.Lstat("/dev/null")
	if err != nil || fi.Mode()&fs.ModeDevice == 0 {
		t.Skip("no /dev/null device here")
	}
	err = refuseNonRegular("/dev/null", fi)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "/dev/null is a device, not a regular file")
	e, _, errb := checkEnv()
	assert.Equal(t, exitError, run([]string{"new", "--force", "/dev/null"}, e))
	assert.Contains(t, errb.String(), "does not end in .xlsx", "refused by its name before its type")
}

// TestWriteOutputRechecksAtTheEnd: a pipe put at the path after the first
// check is still refused when the file is written with force.
func TestWriteOutputRechecksAtTheEnd(t *testing.T) {
	path := filepath.Join(t.TempDir(), "tt.xlsx")
	require.NoError(t, checkOutput(path, true, ".xlsx"))
	require.NoError(t, syscall.Mkfifo(path, 0o644))
	written, err := writeOutput(path, true, func(w io.Writer) error { _, err := io.WriteString(w, "x"); return err })
	assert.Empty(t, written)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "is a named pipe")
	fi, err := os.Lstat(path)
	require.NoError(t, err)
	assert.Equal(t, fs.ModeNamedPipe, fi.Mode().Type())
}

// TestOutputInsideInput: nothing is written into a CSV term folder (at any
// depth, or through a link to it), over the input under another name (a
// hard link), or as a workbook with another extension.
func TestOutputInsideInput(t *testing.T) {
	dir := t.TempDir()
	folder := filepath.Join(dir, "T")
	e, _, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"new", folder + "/"}, e), errb.String())
	sections := filepath.Join(folder, "Sections.csv")
	before, err := os.ReadFile(sections)
	require.NoError(t, err)
	require.NoError(t, os.Mkdir(filepath.Join(folder, "sub"), 0o755))
	alias := filepath.Join(dir, "alias")
	require.NoError(t, os.Symlink(folder, alias))
	book := tinyTerm(t, nil)
	hard := filepath.Join(filepath.Dir(book), "other-name.xlsx")
	require.NoError(t, os.Link(book, hard))
	for _, tc := range []struct {
		name string
		args []string
		want string
	}{
		{"term file", []string{"solve", folder, "-o", sections, "--force"}, "does not end in .xlsx"},
		{"into the folder", []string{"solve", folder, "-o", filepath.Join(folder, "tt.xlsx"), "--force"}, "is inside the term folder"},
		{"below the folder", []string{"solve", folder, "-o", filepath.Join(folder, "sub", "tt.xlsx")}, "is inside the term folder"},
		{"through a link", []string{"explain", folder, "-o", filepath.Join(alias, "tt.xlsx")}, "is inside the term folder"},
		{"program into the folder", []string{"compile", folder, "-o", filepath.Join(folder, "Sections.csv"), "--force"}, "is inside the term folder"},
		{"hard link to the input", []string{"solve", book, "-o", hard, "--force"}, "is the input term"},
		{"same path", []string{"compile", book, "-o", book, "--force"}, "is the input term"},
		{"workbook as .csv", []string{"solve", book, "-o", filepath.Join(dir, "x.csv")}, "x.csv does not end in .xlsx"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := checkEnv()
			assert.Equal(t, exitError, run(tc.args, e))
			assert.Contains(t, errb.String(), tc.want)
			assert.Empty(t, out.String())
		})
	}
	after, err := os.ReadFile(sections)
	require.NoError(t, err)
	assert.Equal(t, before, after, "the term file is untouched")
	entries, err := os.ReadDir(filepath.Join(folder, "sub"))
	require.NoError(t, err)
	assert.Empty(t, entries)
}

// TestOutputFolderCheckedFirst: a missing (or, unless root, read-only)
// output folder is reported before any search: nothing is printed on
// standard output, where a search's report would go.
func TestOutputFolderCheckedFirst(t *testing.T) {
	dir := t.TempDir()
	term := tinyTerm(t, nil)
	for _, tc := range []struct {
		name string
		args []string
	}{
		{"solve -o", []string{"solve", term, "-o", filepath.Join(dir, "no", "such", "tt.xlsx")}},
		{"solve --publish", []string{"solve", term, "-o", filepath.Join(dir, "tt.xlsx"), "--publish", filepath.Join(dir, "no", "such", "out")}},
		{"explain -o", []string{"explain", term, "-o", filepath.Join(dir, "no", "such", "tt.xlsx")}},
		{"compile -o", []string{"compile", term, "-o", filepath.Join(dir, "no", "such", "t.lp")}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			e, out, errb := checkEnv()
			assert.Equal(t, exitError, run(tc.args, e))
			assert.Contains(t, errb.String(), "the folder does not exist — create it first")
			assert.NotContains(t, errb.String(), "progress:")
			assert.Empty(t, out.String(), "no search ran")
		})
	}
	if os.Geteuid() == 0 {
		t.Log("running as root, which may write anywhere: the read-only folder case is skipped")
		return
	}
	ro := filepath.Join(dir, "ro")
	require.NoError(t, os.Mkdir(ro, 0o555))
	e, out, errb := checkEnv()
	assert.Equal(t, exitError, run([]string{"solve", term, "-o", filepath.Join(ro, "tt.xlsx")}, e))
	assert.Contains(t, errb.String(), "cannot write in "+ro)
	assert.Empty(t, out.String())
}

// TestWriteOutputExclusive: without force, a file that appeared at the
// path after the first check is left alone and the result goes to the
// first free name beside it; of several writers racing for one path,
// exactly one gets it and each result lands in a file of its own.
func TestWriteOutputExclusive(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "tt.xlsx")
	require.NoError(t, checkOutput(path, false, ".xlsx"))
	require.NoError(t, os.WriteFile(path, []byte("someone else's"), 0o644))
	written, err := writeOutput(path, false, func(w io.Writer) error { _, err := io.WriteString(w, "ours"); return err })
	require.Error(t, err)
	assert.True(t, errors.Is(err, ErrOutputAppeared))
	assert.Equal(t, filepath.Join(dir, "tt-2.xlsx"), written)
	assert.Contains(t, err.Error(), "tt.xlsx appeared while termwright was working and was left as it is")
	got, _ := os.ReadFile(path)
	assert.Equal(t, "someone else's", string(got))
	got, _ = os.ReadFile(written)
	assert.Equal(t, "ours", string(got))

	race := filepath.Join(dir, "race.xlsx")
	const n = 8
	var wg sync.WaitGroup
	paths := make([]string, n)
	errs := make([]error, n)
	for i := range n {
		wg.Add(1)
		go func() {
			defer wg.Done()
			paths[i], errs[i] = writeOutput(race, false, func(w io.Writer) error { _, err := io.WriteString(w, strings.Repeat("x", i+1)); return err })
		}()
	}
	wg.Wait()
	winners, seen := 0, map[string]bool{}
	for i := range n {
		require.NotEmpty(t, paths[i], "result %d was lost: %v", i, errs[i])
		assert.False(t, seen[paths[i]], "two results in %s", paths[i])
		seen[paths[i]] = true
		if errs[i] == nil {
			winners++
			assert.Equal(t, race, paths[i])
		}
		data, err := os.ReadFile(paths[i])
		require.NoError(t, err)
		assert.Len(t, data, i+1, "each file holds its own writer's bytes")
	}
	assert.Equal(t, 1, winners)
	entries, err := os.ReadDir(dir)
	require.NoError(t, err)
	for _, en := range entries {
		assert.False(t, strings.HasSuffix(en.Name(), ".tmp"), "temporary file left: %s", en.Name())
	}
}

// TestSolveSecondRunToSameOutput: two solves to one -o do not both say
// "written": the second is refused (already exists) before it searches.
func TestSolveSecondRunToSameOutput(t *testing.T) {
	dir := t.TempDir()
	term := tinyTerm(t, nil)
	out := filepath.Join(dir, "tt.xlsx")
	e, stdout, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"solve", term, "-o", out}, e), errb.String())
	assert.Contains(t, stdout.String(), "timetable written to "+out)
	first, err := os.ReadFile(out)
	require.NoError(t, err)
	e, stdout, errb = checkEnv()
	assert.Equal(t, exitError, run([]string{"solve", term, "-o", out}, e))
	assert.Contains(t, errb.String(), "already exists")
	assert.NotContains(t, stdout.String(), "written")
	second, err := os.ReadFile(out)
	require.NoError(t, err)
	assert.Equal(t, first, second)
}

// TestGenerateAndPublishRefuseLinks: generate --force will not replace a
// symbolic link among its CSV files, and publish will not swap a folder in
// over a symbolic link to an earlier publication, nor publish inside the
// term's own folder.
func TestGenerateAndPublishRefuseLinks(t *testing.T) {
	dir := t.TempDir()
	csvDir := filepath.Join(dir, "csv")
	require.NoError(t, os.Mkdir(csvDir, 0o755))
	target := filepath.Join(dir, "mine.csv")
	require.NoError(t, os.WriteFile(target, []byte("mine"), 0o644))
	require.NoError(t, os.Symlink(target, filepath.Join(csvDir, "Rooms.csv")))
	e, _, errb := checkEnv()
	assert.Equal(t, exitError, run([]string{"generate", "--csv", csvDir, "--force", "--sections", "10"}, e))
	assert.Contains(t, errb.String(), "Rooms.csv is a symbolic link, not a regular file")
	data, err := os.ReadFile(target)
	require.NoError(t, err)
	assert.Equal(t, "mine", string(data))

	termPath, ttPath := publishFiles(t, dir, nil)
	real := filepath.Join(dir, "real")
	e, _, errb = checkEnv()
	require.Equal(t, exitOK, run([]string{"publish", termPath, ttPath, "-o", real}, e), errb.String())
	link := filepath.Join(dir, "link")
	require.NoError(t, os.Symlink(real, link))
	e, _, errb = checkEnv()
	assert.Equal(t, exitError, run([]string{"publish", termPath, ttPath, "-o", link, "--force"}, e))
	assert.Contains(t, errb.String(), "is a symbolic link")
	fi, err := os.Lstat(link)
	require.NoError(t, err)
	assert.Equal(t, fs.ModeSymlink, fi.Mode().Type(), "the link is still a link")

	e, _, _ = checkEnv()
	require.Equal(t, exitOK, run([]string{"new", filepath.Join(dir, "T") + "/"}, e))
	e, _, errb = checkEnv()
	assert.Equal(t, exitError, run([]string{"publish", filepath.Join(dir, "T"), ttPath, "-o", filepath.Join(dir, "T", "out")}, e))
	assert.Contains(t, errb.String(), "is inside the term folder")
}
