package main

import (
	"fmt"
	"os"

	"github.com/spf13/cobra"

	"github.com/termwright/termwright/timetable"
)

// readTerm reads the term at path with the options every command shares:
// the column renames of --columns FILE, when given.
func readTerm(e *env, path string) (*timetable.Term, timetable.Problems, error) {
	var opts []timetable.LoadOption
	if e.columns != "" {
		m, err := timetable.ReadColumnMap(e.columns)
		if err != nil {
			return nil, nil, err
		}
		opts = append(opts, timetable.WithColumns(m))
	}
	return timetable.Load(path, opts...)
}

// addColumnsFlag gives a command that reads a term the --columns FILE flag.
func addColumnsFlag(cmd *cobra.Command, e *env) {
	cmd.Flags().StringVar(&e.columns, "columns", "", "rename the term's columns as `FILE` says (CSV or workbook with Sheet, Their column, Our column), for exports from other systems")
}

// openInput opens a file the user gave as input, refusing anything that is
// not a regular file: reading a FIFO would wait for ever and a device such
// as /dev/zero never ends.
func openInput(path, what string) (*os.File, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, fmt.Errorf("cannot open %s: %w", what, err)
	}
	if !fi.Mode().IsRegular() {
		return nil, fmt.Errorf("cannot open %s: %s is %s, not a regular file — give the path of a file", what, path, fileKind(fi.Mode()))
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, fmt.Errorf("cannot open %s: %w", what, err)
	}
	return f, nil
}

// fileKind names a file mode's type in plain words, with its article.
func fileKind(m os.FileMode) string {
	switch {
	case m.IsRegular():
		return "a regular file"
	case m.IsDir():
		return "a folder"
	case m&os.ModeSymlink != 0:
		return "a symbolic link"
	case m&os.ModeNamedPipe != 0:
		return "a named pipe"
	case m&os.ModeSocket != 0:
		return "a socket"
	case m&os.ModeDevice != 0:
		return "a device"
	}
	return "a special file"
}
