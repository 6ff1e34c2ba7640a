package main

import (
	"bufio"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
)

// An output file is checked twice. checkOutput runs before any work, so
// that a bad -o is found in a second and not after an hour of search;
// writeOutput runs at the end and decides again, at the moment of writing,
// because the file system may have changed in between.

// checkOutput refuses, before any work, an output path that termwright
// must not write: one that does not end in ext (when ext is not ""), one
// that is or lies inside any of the inputs (a term file, or a folder of CSV
// files), anything but a regular file (a folder, a device, a named pipe, a
// symbolic link — even with force), an existing file without force, and a
// folder termwright cannot create files in.
func checkOutput(out string, force bool, ext string, inputs ...string) error {
	if ext != "" && !strings.EqualFold(filepath.Ext(out), ext) {
		return withCode(exitError, fmt.Sprintf("%s does not end in %s: this output is a workbook — give it a name ending in %s", out, ext, ext))
	}
	for _, in := range inputs {
		if err := refuseInsideInput(out, in); err != nil {
			return err
		}
	}
	fi, err := os.Lstat(out)
	switch {
	case err == nil:
		if err := refuseNonRegular(out, fi); err != nil {
			return err
		}
		if !force {
			return withCode(exitError, fmt.Sprintf("%s already exists — choose another name, or add --force to replace it", out))
		}
	case !errors.Is(err, fs.ErrNotExist):
		return failf(exitError, "cannot use %s: %w", out, err)
	}
	return probeFolder(filepath.Dir(out))
}

// refuseNonRegular refuses to replace anything but a regular file: renaming
// over a symbolic link, a device (as root, /dev/null) or a named pipe would
// replace the thing itself with a file.
func refuseNonRegular(path string, fi fs.FileInfo) error {
	if fi.Mode().IsRegular() {
		return nil
	}
	what := fileKind(fi.Mode())
	return withCode(exitError, fmt.Sprintf("%s is %s, not a regular file; termwright replaces only regular files (not even with --force) — give the name of a new file", path, what))
}

// refuseInsideInput refuses an output that is the input file (by path, or
// the same file under another name) or lies inside the input folder.
func refuseInsideInput(out, in string) error {
	fin, err := os.Stat(in)
	if err != nil {
		return nil // the reader reports a missing input
	}
	if fin.IsDir() {
		dir := resolvedPath(filepath.Dir(out))
		root := resolvedPath(in)
		if dir == root || strings.HasPrefix(dir, root+string(filepath.Separator)) {
			return withCode(exitError, fmt.Sprintf("%s is inside the term folder %s, whose files are the input — write the output outside that folder", out, in))
		}
		return nil
	}
	if fo, err := os.Stat(out); err == nil && os.SameFile(fo, fin) {
		return withCode(exitError, fmt.Sprintf("%s is the input term; choose another output file", out))
	}
	if resolvedPath(out) == resolvedPath(in) {
		return withCode(exitError, fmt.Sprintf("%s is the input term; choose another output file", out))
	}
	return nil
}

// resolvedPath is p made absolute with symbolic links resolved as far as
// the path exists (the rest, not yet created, is kept as written).
func resolvedPath(p string) string {
	abs, err := filepath.Abs(p)
	if err != nil {
		return filepath.Clean(p)
	}
	rest := ""
	for cur := abs; ; {
		if r, err := filepath.EvalSymlinks(cur); err == nil {
			return filepath.Join(r, rest)
		}
		parent := filepath.Dir(cur)
		if parent == cur {
			return abs
		}
		rest = filepath.Join(filepath.Base(cur), rest)
		cur = parent
	}
}

// probeFolder checks that files can be created in dir by creating and
// removing an empty one.
func probeFolder(dir string) error {
	f, err := os.CreateTemp(dir, ".termwright-probe-*")
	if err != nil {
		if errors.Is(err, fs.ErrNotExist) {
			return failf(exitError, "cannot write in %s: the folder does not exist — create it first: %w", dir, err)
		}
		return failf(exitError, "cannot write in %s: %w — choose a folder you may write to", dir, err)
	}
	name := f.Name()
	return errors.Join(f.Close(), os.Remove(name))
}

// writeOutput writes path through a temporary file beside it, so that a
// failure never leaves a half-written file, and puts it in place only at
// the end. Without force the file is created exclusively: when path has
// appeared since checkOutput (another run, another program), it is left
// as it is and the result is kept under the first free name path-2.ext,
// path-3.ext, ..., which is returned with an error that says so. With
// force only a regular file is replaced. It returns the path written.
func writeOutput(path string, force bool, write func(io.Writer) error) (string, error) {
	tmp, err := os.CreateTemp(filepath.Dir(path), "."+filepath.Base(path)+".*.tmp")
	if err != nil {
		return "", fmt.Errorf("cannot write in %s: %w", filepath.Dir(path), err)
	}
	defer os.Remove(tmp.Name()) // a no-op once the file is in place
	bw := bufio.NewWriter(tmp)
	werr := write(bw)
	if werr == nil {
		werr = bw.Flush()
	}
	werr = errors.Join(werr, tmp.Close())
	if werr == nil {
		werr = os.Chmod(tmp.Name(), 0o644)
	}
	if werr != nil {
		return "", fmt.Errorf("cannot write %s: %w", path, werr)
	}
	if force {
		if fi, err := os.Lstat(path); err == nil {
			if err := refuseNonRegular(path, fi); err != nil {
				return "", err
			}
		}
		if err := os.Rename(tmp.Name(), path); err != nil {
			return "", fmt.Errorf("cannot write %s: %w", path, err)
		}
		return path, nil
	}
	err = placeExclusive(tmp.Name(), path)
	if !errors.Is(err, fs.ErrExist) {
		if err != nil {
			return "", fmt.Errorf("cannot write %s: %w", path, err)
		}
		return path, nil
	}
	ext := filepath.Ext(path)
	stem := strings.TrimSuffix(path, ext)
	for i := 2; i <= 99; i++ {
		alt := fmt.Sprintf("%s-%d%s", stem, i, ext)
		err := placeExclusive(tmp.Name(), alt)
		if err == nil {
			return alt, fmt.Errorf("%s appeared while termwright was working and was left as it is (%w); the result was written to %s instead", path, ErrOutputAppeared, alt)
		}
		if !errors.Is(err, fs.ErrExist) {
			break
		}
	}
	return "", fmt.Errorf("%s appeared while termwright was working and was left as it is (%w); run again with another output name", path, ErrOutputAppeared)
}

// ErrOutputAppeared is in the chain of writeOutput's error when the output
// file was created by someone else during the run.
var ErrOutputAppeared = errors.New("created during the run")

// placeExclusive gives the finished file tmp the name path only if path
// does not exist (an error satisfying errors.Is(err, fs.ErrExist)
// otherwise). A hard link is atomic: exactly one of two runs racing for
// path wins. Where the file system has no hard links, path is created with
// O_EXCL and filled by copying, which is exclusive too.
func placeExclusive(tmp, path string) error {
	err := os.Link(tmp, path)
	if err == nil || errors.Is(err, fs.ErrExist) {
		return err
	}
	src, err := os.Open(tmp)
	if err != nil {
		return err
	}
	defer src.Close()
	dst, err := os.OpenFile(path, os.O_WRONLY|os.O_CREATE|os.O_EXCL, 0o644)
	if err != nil {
		return err
	}
	_, err = io.Copy(dst, src)
	if err = errors.Join(err, dst.Close()); err != nil {
		os.Remove(path)
	}
	return err
}
