package main

import (
	"fmt"
	"io"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

func init() { register("publish", newPublishCmd) }

// publishOptions are the flags of `termwright publish`.
type publishOptions struct {
	out      string // output directory
	paper    string // PDF paper size: A4 or Letter
	students bool   // also a grid PDF and a calendar per student
	force    bool   // replace an earlier publication in out
}

func newPublishCmd(e *env) *cobra.Command {
	o := &publishOptions{}
	cmd := &cobra.Command{
		Use:   "publish TERM TIMETABLE -o DIR",
		Short: "Write every staff member's, room's and cohort's schedule as PDF, workbook and calendar files",
		Long: "publish reads a term workbook and a timetable for it (the .xlsx written by solve,\n" +
			"or a .csv with the same columns), checks the timetable, and writes into DIR:\n\n" +
			"  timetable.pdf       cover page, master list by day and time, every weekly grid\n" +
			"  timetable.xlsx      Timetable sheet, one weekly grid sheet per staff member,\n" +
			"                      room and cohort, and a Load sheet (teaching load, room use);\n" +
			"                      with course requests also Class lists and Sectioning sheets\n" +
			"  timetable.csv/json  the master timetable for other systems\n" +
			"  pdf/{staff,rooms,cohorts}/NAME.pdf       one landscape weekly grid each\n" +
			"  calendar/{staff,rooms,cohorts}/NAME.ics  iCalendar files to import (RFC 5545)\n" +
			"  {pdf,calendar}/students/NAME.*           with --students, a grid and a calendar\n" +
			"                                           per student (fixed and sectioned)\n" +
			"  classlists.csv      with course requests: every sectioned student's sections\n" +
			"  classlists/staff/NAME.xlsx               with course requests: per staff member,\n" +
			"                                           a printable class list per section\n" +
			"  manifest.json       every file written, with the ID it belongs to\n\n" +
			"A timetable that breaks a hard requirement is not published: the problems are\n" +
			"listed and publish exits with status 1. DIR must be new or empty; --force\n" +
			"replaces an earlier publication, never a folder holding other files.",
		Args: cobra.ExactArgs(2),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runPublish(e, o, args[0], args[1]) }),
	}
	cmd.Flags().StringVarP(&o.out, "out", "o", "", "directory to publish into (required; new, empty, or an earlier publication with --force)")
	cmd.Flags().StringVar(&o.paper, "paper", "A4", "PDF paper size: A4 or Letter")
	cmd.Flags().BoolVar(&o.students, "students", false, "also write a weekly grid PDF and a calendar per student")
	cmd.Flags().BoolVar(&o.force, "force", false, "replace an earlier publication in the output directory")
	addColumnsFlag(cmd, e)
	return cmd
}

func runPublish(e *env, o *publishOptions, termPath, timetablePath string) error {
	if o.out == "" {
		return withCode(exitError, "publish needs an output directory: add -o DIR")
	}
	if err := checkPublishDir(o.out, o.force, termPath); err != nil {
		return err
	}
	term, problems, err := readTerm(e, termPath)
	if err != nil {
		return wrapCode(exitError, err)
	}
	if err := reportProblems(e.stderr, termPath, problems); err != nil {
		return err
	}
	s, problems, err := timetable.ReadSchedule(timetablePath, term)
	if err != nil {
		return wrapCode(exitError, err)
	}
	if err := reportProblems(e.stderr, timetablePath, problems); err != nil {
		return err
	}
	violations := timetable.Check(term, s)
	if hard := timetable.HardViolations(violations); len(hard) > 0 {
		for _, v := range hard {
			fmt.Fprintf(e.stderr, "%s: %s\n", v.Rule, v.Msg)
		}
		return withCode(exitError, fmt.Sprintf("%s breaks %s, so it was not published; fix the timetable (or solve again) and publish it then",
			timetablePath, checkCount(len(hard), "hard requirement")))
	}
	if len(term.Requests) > 0 && len(s.Enrolments) == 0 {
		fmt.Fprintf(e.stderr, "note: %s has no class lists, so none of the term's %s is met in it; publish the workbook solve wrote (its Class lists sheet seats the students), or solve again\n",
			timetablePath, checkCount(len(term.Requests), "course request"))
	}
	if soft := len(violations); soft > 0 {
		fmt.Fprintf(e.stderr, "note: %s not met (the timetable is valid; see termwright's cost report for details)\n", checkCount(soft, "preference"))
	}
	m, err := export.Publish(o.out, term, s, export.Options{
		Paper: o.paper, Generated: e.now(), Students: o.students, Force: o.force,
	})
	if err != nil {
		return wrapCode(exitError, err)
	}
	writeManifest(e.stdout, m)
	return nil
}

// reportProblems prints a reader's problems to w and fails when any is an
// error.
func reportProblems(w io.Writer, path string, ps timetable.Problems) error {
	for _, p := range append(ps.Errors(), ps.Warnings()...) {
		fmt.Fprintln(w, p.String())
	}
	if n := len(ps.Errors()); n > 0 {
		return withCode(exitError, fmt.Sprintf("%s has %s; fix them and publish again", path, checkCount(n, "error")))
	}
	return nil
}

// writeManifest prints what was published, one line per format and kind.
func writeManifest(w io.Writer, m export.Manifest) {
	var total int64
	for _, f := range m.Files {
		total += f.Bytes
	}
	fmt.Fprintf(w, "Published %s (%s) to %s:\n", checkCount(len(m.Files), "file"), sizeText(total), m.Dir)
	for _, c := range m.Counts() {
		fmt.Fprintf(w, "  %-5s %-8s %6d  %9s\n", c.Format, c.Kind, c.Files, sizeText(c.Bytes))
	}
}

// sizeText formats a byte count as "812 B", "45.1 kB", "3.2 MB".
func sizeText(n int64) string {
	switch {
	case n < 1000:
		return fmt.Sprintf("%d B", n)
	case n < 1000*1000:
		return fmt.Sprintf("%.1f kB", float64(n)/1000)
	}
	return fmt.Sprintf("%.1f MB", float64(n)/1e6)
}
