package main

import (
	"bytes"
	"errors"
	"fmt"
	"io/fs"
	"os"
	"path/filepath"
	"strings"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

func init() { register("generate", newGenerateCmd) }

// generateOptions are the flags of `termwright generate`.
type generateOptions struct {
	cfg    samples.Config // sizes and seed of the synthetic term
	csvDir string         // also (or only) write the tables as CSV files here
	force  bool           // replace existing outputs
}

func newGenerateCmd(e *env) *cobra.Command {
	o := &generateOptions{}
	cmd := &cobra.Command{
		Use:   "generate [OUT.xlsx] [--csv DIR]",
		Short: "Write a synthetic term of any size for trials and benchmarks",
		Long: "generate writes an invented term of " + samples.Institution + " as a term workbook\n" +
			"(OUT.xlsx, or - for standard output) and/or as a folder of CSV files (--csv DIR).\n" +
			"The term is built around a hidden timetable that meets every hard requirement,\n" +
			"so it is feasible. The same flags always give the same bytes; the defaults give\n" +
			"the demo term (samples/demo-term.xlsx). Existing files are replaced only with --force.\n\n" +
			"Everything in it is invented, room capacities included: in a real term, capacities\n" +
			"must not exceed each room's posted legal occupancy, and staff limits follow local\n" +
			"agreements and institution policy.",
		Example: "  termwright generate big.xlsx --sections 2000 --seed 7\n" +
			"  termwright generate --csv demo-folder",
		Args: cobra.MaximumNArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error {
			out := ""
			if len(args) == 1 {
				out = args[0]
			}
			return runGenerate(e, o, out)
		}),
	}
	f := cmd.Flags()
	f.IntVar(&o.cfg.Sections, "sections", samples.DemoConfig.Sections, "number of sections")
	f.Uint64Var(&o.cfg.Seed, "seed", samples.DemoConfig.Seed, "seed of the random source")
	f.IntVar(&o.cfg.Days, "days", 5, "teaching days a week, from Monday (1-7)")
	f.IntVar(&o.cfg.PeriodsPerDay, "periods", 9, "one-hour periods a day from 08:00, lunch after the fourth (2-13)")
	f.IntVar(&o.cfg.Weeks, "weeks", 12, "teaching weeks (1-52)")
	f.StringVar(&o.csvDir, "csv", "", "also write the tables as CSV files into `DIR`")
	f.BoolVar(&o.force, "force", false, "replace existing output files")
	return cmd
}

func runGenerate(e *env, o *generateOptions, out string) error {
	if out == "" && o.csvDir == "" {
		return withCode(exitError, "say where to write: give OUT.xlsx (or - for standard output), or --csv DIR, or both")
	}
	if err := o.cfg.Validate(); err != nil {
		return withCode(exitError, "--"+strings.Replace(err.Error(), "periods per day", "periods", 1))
	}
	if out != "" && out != "-" && !strings.EqualFold(filepath.Ext(out), ".xlsx") {
		return withCode(exitError, fmt.Sprintf("%s does not end in .xlsx — give the workbook a name ending in .xlsx", out))
	}
	if err := generateRefuseExisting(out, o); err != nil {
		return err
	}
	term := samples.Generate(o.cfg)
	if out != "" {
		var buf bytes.Buffer
		if err := timetable.WriteTermWorkbook(term, &buf); err != nil {
			return failf(exitError, "cannot make the workbook: %w", err)
		}
		if out == "-" {
			if _, err := e.stdout.Write(buf.Bytes()); err != nil {
				return failf(exitError, "cannot write to standard output: %w", err)
			}
		} else if err := writeBytesAtomic(out, buf.Bytes()); err != nil {
			return wrapCode(exitError, err)
		}
	}
	if o.csvDir != "" {
		if err := timetable.WriteTermCSV(term, o.csvDir); err != nil {
			return failf(exitError, "cannot write the CSV files into %s: %w", o.csvDir, err)
		}
	}
	n := timetable.Summary(term)
	var where []string
	if out != "" && out != "-" {
		where = append(where, out)
	}
	if o.csvDir != "" {
		where = append(where, o.csvDir+string(filepath.Separator))
	}
	if len(where) > 0 {
		fmt.Fprintf(e.stderr, "wrote %s: ", strings.Join(where, " and "))
	}
	fmt.Fprintf(e.stderr, "%d sections, %d meetings, %d rooms, %d staff, %d cohorts, %d students, %d periods (seed %d)\n",
		n.Sections, n.Meetings, n.Rooms, n.Staff, n.Cohorts, n.Students, n.Periods, o.cfg.Seed)
	return nil
}

// generateRefuseExisting fails when an output already exists and --force
// was not given, naming the file, and on anything but a regular file at an
// output's name even with --force.
func generateRefuseExisting(out string, o *generateOptions) error {
	var paths []string
	if out != "" && out != "-" {
		paths = append(paths, out)
	}
	if o.csvDir != "" {
		if fi, err := os.Stat(o.csvDir); err == nil && !fi.IsDir() {
			return withCode(exitError, fmt.Sprintf("%s is a file, not a folder — give --csv a folder name", o.csvDir))
		}
		for _, name := range timetable.TermCSVFiles() {
			paths = append(paths, filepath.Join(o.csvDir, name))
		}
	}
	for _, p := range paths {
		if fi, err := os.Lstat(p); err == nil {
			if err := refuseNonRegular(p, fi); err != nil {
				return err
			}
			if !o.force {
				return withCode(exitError, fmt.Sprintf("%s already exists — choose another name, or add --force to replace it", p))
			}
		} else if !errors.Is(err, fs.ErrNotExist) {
			return failf(exitError, "cannot use %s: %w", p, err)
		}
	}
	return nil
}
