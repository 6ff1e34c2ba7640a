package main

import (
	"encoding/json"
	"fmt"
	"io"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/timetable"
)

func init() { register("check", newCheckCmd) }

// checkOptions are the flags of `termwright check`.
type checkOptions struct {
	json bool // print a machine-readable report instead of text
}

func newCheckCmd(e *env) *cobra.Command {
	o := &checkOptions{}
	cmd := &cobra.Command{
		Use:   "check TERM",
		Short: "Report every mistake in a term workbook (.xlsx file or folder of CSV files)",
		Long: "check reads a term workbook, or a folder with one CSV file per sheet, prints a\n" +
			"summary of its size and then every problem found, errors first, each with the\n" +
			"sheet, column and row to fix (\"Sections!D14: ...\"). It exits with status 1\n" +
			"when there are errors and 0 when there are none (warnings allowed).",
		Args: cobra.ExactArgs(1),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runCheck(e, o, args[0]) }),
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print the summary and problems as JSON")
	addColumnsFlag(cmd, e)
	return cmd
}

// checkReport is the stable JSON form of a check.
type checkReport struct {
	Summary  timetable.Counts `json:"summary"`
	Columns  []string         `json:"columns"`
	Problems []checkProblem   `json:"problems"`
}

type checkProblem struct {
	Where    string `json:"where"`
	Severity string `json:"severity"`
	Message  string `json:"message"`
}

func runCheck(e *env, o *checkOptions, path string) error {
	term, problems, err := readTerm(e, path)
	if err != nil {
		return wrapCode(exitError, err)
	}
	ordered := append(problems.Errors(), problems.Warnings()...)
	counts := timetable.Summary(term)
	if o.json {
		if err := writeCheckJSON(e.stdout, term, counts, ordered); err != nil {
			return err
		}
	} else {
		writeCheckText(e.stdout, term, counts, ordered)
	}
	if n := len(problems.Errors()); n > 0 {
		return withCode(exitError, fmt.Sprintf("%s has %s", path, checkCount(n, "error")))
	}
	return nil
}

func writeCheckJSON(w io.Writer, t *timetable.Term, c timetable.Counts, ps timetable.Problems) error {
	rep := checkReport{Summary: c, Columns: renamedColumns(t), Problems: make([]checkProblem, 0, len(ps))}
	for _, p := range ps {
		rep.Problems = append(rep.Problems, checkProblem{Where: p.Pos.String(), Severity: p.Severity.String(), Message: p.Msg})
	}
	enc := json.NewEncoder(w)
	enc.SetIndent("", "  ")
	return enc.Encode(rep)
}

func writeCheckText(w io.Writer, t *timetable.Term, c timetable.Counts, ps timetable.Problems) {
	name := t.Name
	if name == "" {
		name = "(unnamed term)"
	}
	fmt.Fprintf(w, "%s: %s (%s), %s, %s, %s, %s, %s (%s)\n", name,
		checkCount(c.Sections, "section"), checkCount(c.Meetings, "meeting"), checkCount(c.Staff, "staff member"),
		checkCount(c.Rooms, "room"), checkCount(c.Cohorts, "cohort"), checkCount(c.Periods, "period"),
		checkCount(c.Students, "student"), checkCount(c.Enrolments, "enrolment"))
	if line := checkCourses(t); line != "" {
		fmt.Fprintln(w, line)
	}
	for _, r := range renamedColumns(t) {
		fmt.Fprintln(w, r)
	}
	for _, p := range ps {
		fmt.Fprintln(w, p.String())
	}
	errs, warns := len(ps.Errors()), len(ps.Warnings())
	switch {
	case errs == 0 && warns == 0:
		fmt.Fprintln(w, "No problems found.")
	default:
		fmt.Fprintf(w, "%s, %s.\n", checkCount(errs, "error"), checkCount(warns, "warning"))
	}
}

// checkCount gives "1 room" or "3 rooms".
func checkCount(n int, noun string) string {
	if n == 1 {
		return fmt.Sprintf("1 %s", noun)
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// renamedColumns lists the column renames the reader applied, one sentence
// each ("Sections: column \"Crs Nbr\" read as \"Section\""); never nil, so
// the JSON form is always a list.
func renamedColumns(t *timetable.Term) []string {
	out := []string{}
	if t == nil {
		return out
	}
	for _, r := range t.Columns {
		out = append(out, r.String())
	}
	return out
}

// checkCourses is "Sectioning: 4 requested courses (11 sections), 140
// course requests from 52 students." for a term with course requests, ""
// otherwise.
func checkCourses(t *timetable.Term) string {
	if len(t.Requests) == 0 {
		return ""
	}
	courses := t.Courses()
	secs := 0
	for _, c := range courses {
		for _, a := range c.Arrangements {
			for _, p := range a.Parts {
				secs += len(p.Sections)
			}
		}
	}
	students := map[string]bool{}
	for _, r := range t.Requests {
		students[r.Student] = true
	}
	return fmt.Sprintf("Sectioning: %s (%s), %s from %s.", checkCount(len(courses), "requested course"), checkCount(secs, "section"),
		checkCount(len(t.Requests), "course request"), checkCount(len(students), "student"))
}
