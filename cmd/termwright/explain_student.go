package main

import (
	"encoding/json"
	"errors"
	"fmt"
	"io"
	"strings"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/timetable"
)

// runExplainStudent answers `termwright explain TERM TIMETABLE --student
// ID`: whether the student can get all requested courses without a clash
// on that timetable, and if not why (encode.ExplainStudent).
func runExplainStudent(e *env, o *explainOptions, termPath, schedPath string) error {
	term, _, err := explainLoad(e, termPath)
	if err != nil {
		return err
	}
	sched, ps, err := timetable.ReadSchedule(schedPath, term)
	if err != nil {
		return wrapCode(exitError, err)
	}
	if errs := ps.Errors(); len(errs) > 0 {
		for _, p := range errs {
			fmt.Fprintln(e.stderr, p.String())
		}
		return withCode(exitError, fmt.Sprintf("%s has %s — fix them first (termwright check %s %s lists them)",
			schedPath, checkCount(len(errs), "error"), termPath, schedPath))
	}
	ex, err := encode.ExplainStudent(term, sched, o.student)
	if err != nil {
		if errors.Is(err, encode.ErrNoStudent) {
			return withCode(exitError, err.Error())
		}
		return wrapCode(exitError, err)
	}
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		if err := enc.Encode(ex); err != nil {
			return err
		}
	} else {
		explainStudentText(e.stdout, term, ex)
	}
	switch ex.Status {
	case encode.StudentFits:
		return nil
	case encode.StudentClashes:
		return withCode(exitNone, "")
	}
	return withCode(exitError, "the student's requests have too many combinations to try — ask about fewer courses")
}

// explainStudentText prints the answer in plain sentences.
func explainStudentText(w io.Writer, t *timetable.Term, ex *encode.StudentExplanation) {
	name := t.Name
	if name == "" {
		name = "(unnamed term)"
	}
	fmt.Fprintf(w, "%s: student %s, %s", name, ex.Student, checkCount(ex.AllRequests, "course request"))
	if len(ex.Fixed) > 0 {
		fmt.Fprintf(w, ", %s", checkCount(len(ex.Fixed), "fixed enrolment"))
	}
	fmt.Fprintln(w, ".")
	if len(ex.Fixed) > 0 {
		fmt.Fprintln(w, "\nFixed enrolments (kept in every choice):")
		for _, s := range ex.Fixed {
			fmt.Fprintln(w, "  "+sectionLine(s))
		}
	}
	fmt.Fprintln(w)
	switch ex.Status {
	case encode.StudentFits:
		fmt.Fprintf(w, "Student %s can get all %s without a clash on this timetable, for example:\n", ex.Student, checkCount(ex.AllRequests, "requested course"))
		for _, s := range ex.Choice {
			fmt.Fprintln(w, "  "+sectionLine(s))
		}
		return
	case encode.StudentTooLarge:
		fmt.Fprintln(w, "No answer: the requests have too many combinations of sections to try.")
		return
	}
	if len(ex.Requests) == ex.AllRequests {
		fmt.Fprintf(w, "Student %s cannot get all %s without a clash on this timetable (drop any one and the rest fit):\n", ex.Student, checkCount(ex.AllRequests, "requested course"))
	} else {
		fmt.Fprintf(w, "Student %s cannot get all %s without a clash on this timetable: already these %d cannot be combined (drop any one and the rest fit):\n",
			ex.Student, checkCount(ex.AllRequests, "requested course"), len(ex.Requests))
	}
	for _, r := range ex.Requests {
		line := "  " + r.Course
		if len(r.Alternatives) > 0 {
			line += " (or instead " + strings.Join(r.Alternatives, ", ") + ")"
		}
		var opts []string
		for _, o := range r.Options {
			opts = append(opts, strings.Join(o, " + "))
		}
		switch {
		case len(opts) == 0:
			line += ": no section of it is in the term"
		default:
			line += ": " + strings.Join(opts, ", or ")
		}
		if r.Source != "" {
			line += " [" + r.Source + "]"
		}
		fmt.Fprintln(w, line)
	}
	if len(ex.Clashes)+len(ex.Full) > 0 {
		fmt.Fprintln(w, "\nEvery choice meets one of these:")
	}
	n := 0
	for _, c := range ex.Clashes {
		n++
		fmt.Fprintf(w, "  %d. %s and %s: %s.\n", n, sectionLine(c.A), sectionLine(c.B), c.Why)
	}
	for _, f := range ex.Full {
		n++
		fmt.Fprintf(w, "  %d. %s is full: %s, its limit %d.\n", n, sectionLine(f.Section), checkCount(f.Held, "other student"), f.Limit)
	}
}

// sectionLine is "BIO-L1 (Mon 09:00-09:50 in N1) [Sections row 2; Meeting
// times row 2; Timetable row 2]".
func sectionLine(s encode.SectionTime) string {
	out := s.Section + " (" + s.When
	if s.Room != "" {
		out += " in " + s.Room
	}
	out += ")"
	if len(s.Sources) > 0 {
		out += " [" + strings.Join(s.Sources, "; ") + "]"
	}
	return out
}
