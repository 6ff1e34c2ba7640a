package main

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"os"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/timetable"
)

func init() { register("new", newNewCmd) }

// newOptions are the flags of `termwright new`.
type newOptions struct {
	force bool // replace an existing file
}

func newNewCmd(e *env) *cobra.Command {
	o := &newOptions{}
	cmd := &cobra.Command{
		Use:   "new FILE",
		Short: "Write an empty term workbook to fill in",
		Long: "new writes an empty term workbook (.xlsx): every sheet with its column headers,\n" +
			"a note on each header explaining the column, and drop-down lists where the\n" +
			"values are fixed. It never replaces an existing file unless --force is given.",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runNew(e, o, args[0]) }),
	}
	cmd.Flags().BoolVar(&o.force, "force", false, "replace FILE if it exists")
	return cmd
}

func runNew(e *env, o *newOptions, path string) error {
	if _, err := os.Stat(path); err == nil && !o.force {
		return withCode(exitError, fmt.Sprintf("%s already exists — choose another name, or add --force to replace it", path))
	} else if err != nil && !errors.Is(err, fs.ErrNotExist) {
		return failf(exitError, "cannot use %s: %w", path, err)
	}
	var buf bytes.Buffer
	if err := timetable.WriteTemplate(&buf); err != nil {
		return failf(exitError, "cannot make the template: %w", err)
	}
	if err := writeBytesAtomic(path, buf.Bytes()); err != nil {
		return wrapCode(exitError, err)
	}
	fmt.Fprintf(e.stderr, "wrote %s: fill in each sheet, then run: termwright check %s\n", path, path)
	return nil
}
