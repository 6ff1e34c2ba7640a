package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/timetable"
)

func init() { register("new", newNewCmd) }

// newOptions are the flags of `termwright new`.
type newOptions struct {
	force bool // replace an existing file
	csv   bool // write the folder-of-CSV-files form
}

// newNotesFile is the note file written into a new CSV term folder: the
// CSV files cannot carry the notes the workbook's header cells have.
const newNotesFile = "NOTES.txt"

func newNewCmd(e *env) *cobra.Command {
	o := &newOptions{}
	cmd := &cobra.Command{
		Use:   "new FILE.xlsx | new DIR/ | new --csv DIR",
		Short: "Write an empty term workbook (or folder of CSV files) to fill in",
		Long: "new writes an empty term workbook (.xlsx): every sheet with its column headers,\n" +
			"a note on each header explaining the column, and drop-down lists where the\n" +
			"values are fixed. Given a folder (a name ending in /, or --csv), it writes the\n" +
			"same term as one CSV file per sheet with its header row, and " + newNotesFile + "\n" +
			"explaining every column. It never replaces an existing file unless --force is given.",
		Example: "  termwright new autumn.xlsx\n  termwright new autumn/\n  termwright new --csv autumn",
		Args:    cobra.ExactArgs(1),
		RunE:    e.runner(o, func(cmd *cobra.Command, args []string) error { return runNew(e, o, args[0]) }),
	}
	cmd.Flags().BoolVar(&o.force, "force", false, "replace FILE (or the folder's term files) if they exist")
	cmd.Flags().BoolVar(&o.csv, "csv", false, "write a folder of CSV files, one per sheet, instead of a workbook")
	return cmd
}

func runNew(e *env, o *newOptions, path string) error {
	asDir := o.csv || strings.HasSuffix(path, "/") || strings.HasSuffix(path, string(filepath.Separator))
	if fi, err := os.Stat(path); err == nil && fi.IsDir() && !strings.EqualFold(filepath.Ext(path), ".xlsx") {
		asDir = true // an existing folder not named like a workbook means the folder form
	}
	if asDir {
		return runNewCSV(e, o, filepath.Clean(path))
	}
	if ext := filepath.Ext(path); !strings.EqualFold(ext, ".xlsx") {
		if strings.EqualFold(ext, ".csv") {
			return withCode(exitError, fmt.Sprintf("%s: a term in CSV form is a folder of files, one per sheet — give a folder name ending in / (termwright new %s/), or a workbook name ending in .xlsx",
				path, strings.TrimSuffix(path, ext)))
		}
		return withCode(exitError, fmt.Sprintf("%s does not end in .xlsx — give the workbook a name ending in .xlsx, or a folder name ending in / for CSV files", path))
	}
	if err := checkOutput(path, o.force, ".xlsx"); err != nil {
		return err
	}
	var buf bytes.Buffer
	if err := timetable.WriteTemplate(&buf); err != nil {
		return failf(exitError, "cannot make the template: %w", err)
	}
	written, err := writeOutput(path, o.force, func(w io.Writer) error {
		_, err := w.Write(buf.Bytes())
		return err
	})
	if written == "" {
		return wrapCode(exitError, err)
	}
	fmt.Fprintf(e.stderr, "wrote %s: fill in each sheet, then run: termwright check %s\n", written, written)
	return wrapOrNil(err)
}

// runNewCSV writes the CSV-folder form of an empty term into dir.
func runNewCSV(e *env, o *newOptions, dir string) error {
	if fi, err := os.Lstat(dir); err == nil && !fi.IsDir() {
		return withCode(exitError, fmt.Sprintf("%s exists and is not a folder — give a new folder name", dir))
	} else if err != nil && !errors.Is(err, fs.ErrNotExist) {
		return failf(exitError, "cannot use %s: %w", dir, err)
	}
	files := append(timetable.TermCSVFiles(), newNotesFile)
	for _, name := range files {
		p := filepath.Join(dir, name)
		fi, err := os.Lstat(p)
		switch {
		case err == nil:
			if err := refuseNonRegular(p, fi); err != nil {
				return err
			}
			if !o.force {
				return withCode(exitError, fmt.Sprintf("%s already exists — choose a new folder, or add --force to replace the term files in it", p))
			}
		case !errors.Is(err, fs.ErrNotExist):
			return failf(exitError, "cannot use %s: %w", p, err)
		}
	}
	if err := os.MkdirAll(dir, 0o755); err != nil {
		return failf(exitError, "cannot create the folder %s: %w", dir, err)
	}
	if err := probeFolder(dir); err != nil {
		return err
	}
	if err := timetable.WriteTemplateCSV(dir); err != nil {
		return failf(exitError, "cannot write the CSV files into %s: %w", dir, err)
	}
	if _, err := writeOutput(filepath.Join(dir, newNotesFile), true, func(w io.Writer) error { return writeNewNotes(w) }); err != nil {
		return wrapCode(exitError, err)
	}
	fmt.Fprintf(e.stderr, "wrote %s%c: %s and %s; fill in each file below its header row, then run: termwright check %s\n",
		dir, filepath.Separator, checkCount(len(files)-1, "CSV file"), newNotesFile, dir)
	return nil
}

// writeNewNotes writes the note file of a CSV term folder: what the folder
// is, and every column's note from the workbook template.
func writeNewNotes(w io.Writer) error {
	var b strings.Builder
	b.WriteString("This folder is a term for termwright, one CSV file per sheet of the term workbook.\n" +
		"Keep each file's header row and add one row per record below it; files of sheets\n" +
		"you do not need may stay with their header only. Then run: termwright check FOLDER\n" +
		"(the layout is described in docs/workbook.md). The columns:\n")
	sheet := ""
	for _, n := range timetable.TemplateNotes() {
		if n.Sheet != sheet {
			sheet = n.Sheet
			fmt.Fprintf(&b, "\n%s.csv\n", sheet)
		}
		fmt.Fprintf(&b, "  %s: %s\n", n.Column, strings.ReplaceAll(n.Note, "\n", " "))
	}
	_, err := io.WriteString(w, b.String())
	return err
}

// wrapOrNil is wrapCode(exitError, err), or nil for a nil err.
func wrapOrNil(err error) error {
	if err == nil {
		return nil
	}
	return wrapCode(exitError, err)
}
