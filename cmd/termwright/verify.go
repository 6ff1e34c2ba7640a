package main

import (
	"encoding/json"
	"fmt"
	"io"
	"strings"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

func init() { register("verify", newVerifyCmd) }

// verifyOptions are the flags of `termwright verify`.
type verifyOptions struct {
	json bool // print a machine-readable report instead of text
}

func newVerifyCmd(e *env) *cobra.Command {
	o := &verifyOptions{}
	cmd := &cobra.Command{
		Use:   "verify TERM TIMETABLE",
		Short: "Check a timetable (for example one edited by hand) against its term",
		Long: "verify reads a term workbook (or folder of CSV files) and a timetable workbook\n" +
			"(.xlsx, its Timetable sheet) or .csv file with the same columns, then lists\n" +
			"every broken hard requirement — double bookings, rooms, availability, fixed\n" +
			"meetings, day limits, relations — and every student clash, each with the\n" +
			"timetable rows and term rows involved, followed by the cost of the timetable\n" +
			"per preference. It exits with status 1 when a hard requirement is broken or\n" +
			"the timetable cannot be read, and 0 otherwise.",
		Args: cobra.ExactArgs(2),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error { return runVerify(e, o, args[0], args[1]) }),
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print the report as JSON")
	addColumnsFlag(cmd, e)
	return cmd
}

// verifyReport is the stable JSON form of a verification.
type verifyReport struct {
	Term       string            `json:"term"`
	Timetable  string            `json:"timetable"`
	Meetings   int               `json:"meetings"` // placements read
	OK         bool              `json:"ok"`       // no hard violation and no error reading the timetable
	Hard       int               `json:"hard"`
	Soft       int               `json:"soft"`
	Problems   []checkProblem    `json:"problems"` // problems reading the timetable
	Violations []verifyViolation `json:"violations"`
	Cost       verifyCost        `json:"cost"`
	// Sectioning is the sectioning report of the timetable's students
	// (terms with course requests only), from the timetable alone.
	Sectioning *solveSectioning `json:"sectioning,omitempty"`
	Caution    string           `json:"caution,omitempty"`
}

type verifyViolation struct {
	Rule    string   `json:"rule"`
	Hard    bool     `json:"hard"`
	Message string   `json:"message"`
	Rows    []int    `json:"rows"`    // timetable rows of the meetings involved
	Sources []string `json:"sources"` // term rows involved, e.g. "Sections row 14"
}

type verifyCost struct {
	Levels   []verifyLevel             `json:"levels"` // highest level (minimised first) first
	Criteria []timetable.CriterionCost `json:"criteria"`
}

type verifyLevel struct {
	Level int   `json:"level"`
	Cost  int64 `json:"cost"`
}

// verifyCaution is shown when a broken rule touches safety, access or
// workload; the numbers come from the registrar's own data.
const verifyCaution = "Room capacities, room features such as step-free access, and staff workload limits " +
	"come from your term data: check them against each room's posted legal occupancy, accessibility " +
	"needs, local agreements and institution policy."

func runVerify(e *env, o *verifyOptions, termPath, ttPath string) error {
	term, tps, err := readTerm(e, termPath)
	if err != nil {
		return wrapCode(exitError, err)
	}
	if errs := tps.Errors(); len(errs) > 0 {
		fmt.Fprintln(e.stderr, errs.String())
		return withCode(exitError, fmt.Sprintf("%s has %s — fix them first (termwright check %s lists them)",
			termPath, checkCount(len(errs), "error"), termPath))
	}
	s, sps, err := timetable.ReadSchedule(ttPath, term)
	if err != nil {
		return wrapCode(exitError, err)
	}
	vs := timetable.Check(term, s)
	rep := verifyBuild(term, ttPath, s, sps, vs, timetable.Cost(term, s, nil))
	if len(term.Requests) > 0 {
		if fs, err := export.SectioningFindings(term, s, nil); err == nil {
			rep.Sectioning = newSolveSectioning(term, s, fs)
		}
	}
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(rep); err != nil {
			return err
		}
	} else {
		verifyText(e.stdout, rep)
	}
	if rep.OK {
		return nil
	}
	switch {
	case rep.Hard > 0:
		return withCode(exitError, fmt.Sprintf("%s breaks %s", ttPath, checkCount(rep.Hard, "hard requirement")))
	default:
		return withCode(exitError, fmt.Sprintf("%s has rows that cannot be read", ttPath))
	}
}

// verifyBuild assembles the report; violations come sorted from Check
// (hard first).
func verifyBuild(t *timetable.Term, path string, s *timetable.Schedule, ps timetable.Problems,
	vs []timetable.Violation, cost timetable.CostReport) verifyReport {
	rep := verifyReport{
		Term: t.Name, Timetable: path, Meetings: len(s.Placements),
		Problems:   []checkProblem{},
		Violations: []verifyViolation{},
		Cost:       verifyCost{Levels: []verifyLevel{}, Criteria: termCriteria(t, cost.Criteria)},
	}
	for _, p := range append(ps.Errors(), ps.Warnings()...) {
		rep.Problems = append(rep.Problems, checkProblem{Where: p.Pos.String(), Severity: p.Severity.String(), Message: p.Msg})
	}
	caution := false
	for _, v := range vs {
		out := verifyViolation{Rule: v.Rule, Hard: v.Hard, Message: v.Msg, Rows: []int{}, Sources: []string{}}
		for _, i := range v.Placements {
			if r := s.Placements[i].Src.Row; r > 0 {
				out.Rows = append(out.Rows, r)
			}
		}
		for _, src := range v.Sources {
			out.Sources = append(out.Sources, src.String())
		}
		rep.Violations = append(rep.Violations, out)
		if v.Hard {
			rep.Hard++
		} else {
			rep.Soft++
		}
		switch v.Rule {
		case timetable.RuleCapacity, timetable.RuleFeatures, timetable.RuleMaxPerDay, timetable.RuleMaxConsecutive:
			caution = true
		}
	}
	if caution {
		rep.Caution = verifyCaution
	}
	for _, l := range cost.Levels() {
		rep.Cost.Levels = append(rep.Cost.Levels, verifyLevel{Level: l, Cost: cost.ByLevel[l]})
	}
	rep.OK = rep.Hard == 0 && len(ps.Errors()) == 0
	return rep
}

// verifyText prints the report for people: reading problems, hard
// violations, student clashes, the verdict and the cost per level.
func verifyText(w io.Writer, rep verifyReport) {
	name := rep.Term
	if name == "" {
		name = "(unnamed term)"
	}
	fmt.Fprintf(w, "%s: %s read from %s\n", name, checkCount(rep.Meetings, "meeting"), rep.Timetable)
	if len(rep.Problems) > 0 {
		fmt.Fprintln(w, "\nReading the timetable:")
		for _, p := range rep.Problems {
			prefix := p.Where + ": "
			if p.Severity == timetable.Warning.String() {
				prefix += "warning: "
			}
			fmt.Fprintln(w, "  "+prefix+p.Message)
		}
	}
	section := func(title string, hard bool, n int) {
		if n == 0 {
			return
		}
		fmt.Fprintf(w, "\n%s (%d):\n", title, n)
		for _, v := range rep.Violations {
			if v.Hard == hard {
				fmt.Fprintln(w, "  "+v.Message)
			}
		}
	}
	section("Hard requirements broken", true, rep.Hard)
	section("Student clashes, a preference", false, rep.Soft)
	fmt.Fprintln(w)
	switch {
	case rep.OK:
		fmt.Fprintln(w, "No hard requirement is broken.")
	case rep.Hard > 0:
		fmt.Fprintf(w, "The timetable breaks %s.\n", checkCount(rep.Hard, "hard requirement"))
	default:
		fmt.Fprintln(w, "Some timetable rows could not be read; fix them and verify again.")
	}
	var parts []string
	for _, l := range rep.Cost.Levels {
		var items []string
		for _, c := range rep.Cost.Criteria {
			if c.Level == l.Level && c.Weight != 0 && c.Cost != 0 {
				items = append(items, fmt.Sprintf("%s %d", c.Name, c.Cost))
			}
		}
		part := fmt.Sprintf("level %d: %d", l.Level, l.Cost)
		if len(items) > 0 {
			part += " (" + strings.Join(items, ", ") + ")"
		}
		parts = append(parts, part)
	}
	if len(parts) > 0 {
		fmt.Fprintln(w, "Cost, most important level first: "+strings.Join(parts, "; "))
	}
	if rep.Sectioning != nil {
		solvePrintSectioning(w, rep.Sectioning)
	}
	if rep.Caution != "" {
		fmt.Fprintln(w, "\nNote: "+rep.Caution)
	}
}
