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

func init() { register("diff", newDiffCmd) }

// diffOptions are the flags of `termwright diff`.
type diffOptions struct {
	json bool // print the comparison as JSON instead of text
}

func newDiffCmd(e *env) *cobra.Command {
	o := &diffOptions{}
	cmd := &cobra.Command{
		Use:   "diff OLD NEW [TERM]",
		Short: "Show what changed between two timetables, per section, staff member, room, cohort and student",
		Long: "diff compares two timetables (the .xlsx written by solve, or a .csv with the same\n" +
			"columns) and lists, per section and then per staff member, room, cohort and (with\n" +
			"enrolments) student, every meeting that moved (old → new: day, time, room, weeks),\n" +
			"was added or was dropped. A meeting is unchanged when the new timetable has a\n" +
			"meeting of its section at its old day, time and room; meeting numbers play no part.\n" +
			"A section placed by a meeting pattern is one meeting with all its days (Mon Wed Fri):\n" +
			"it moved when it takes another of its meeting times or another room.\n\n" +
			"With TERM, both timetables must fit that term workbook, and titles, staff,\n" +
			"cohorts and students come from it; without it, from the timetables' own columns.\n" +
			"It exits with status 0 when both were read, whether they differ or not.",
		Args: cobra.RangeArgs(2, 3),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error {
			term := ""
			if len(args) == 3 {
				term = args[2]
			}
			return runDiff(e, o, args[0], args[1], term)
		}),
	}
	cmd.Flags().BoolVar(&o.json, "json", false, "print the comparison as JSON")
	addColumnsFlag(cmd, e)
	return cmd
}

func runDiff(e *env, o *diffOptions, oldPath, newPath, termPath string) error {
	d, err := loadDiff(e, oldPath, newPath, termPath)
	if err != nil {
		return err
	}
	rep := diffBuildReport(d)
	if o.json {
		enc := json.NewEncoder(e.stdout)
		enc.SetIndent("", "  ")
		return enc.Encode(rep)
	}
	writeDiffText(e.stdout, rep)
	return nil
}

// diffInput is two timetables read and compared, with the term when given.
type diffInput struct {
	oldPath, newPath string
	term             *timetable.Term // nil without TERM
	cmp              *timetable.Comparison
	affected         []timetable.Affected
	newHard          []timetable.Violation  // hard requirements the new timetable breaks (with a term)
	newSched         *timetable.Schedule    // the new timetable as read for the term (with a term)
	oldSched         *timetable.Schedule    // the old timetable as read for the term (with a term)
	moves            []export.SectionChange // students' changes of section (with a term)
}

// loadDiff reads both timetables (with the term when termPath is not ""),
// prints their problems to stderr and compares them.
func loadDiff(e *env, oldPath, newPath, termPath string) (*diffInput, error) {
	d := &diffInput{oldPath: oldPath, newPath: newPath}
	if termPath != "" {
		t, ps, err := readTerm(e, termPath)
		if err != nil {
			return nil, wrapCode(exitError, err)
		}
		if err := diffProblems(e.stderr, termPath, ps, ""); err != nil {
			return nil, err
		}
		d.term = t
	}
	var sides [2][]timetable.Meeting
	for i, p := range []string{oldPath, newPath} {
		ms, s, ps, err := timetable.ReadMeetings(p, d.term)
		if err != nil {
			return nil, wrapCode(exitError, err)
		}
		if err := diffProblems(e.stderr, p, ps, termPath); err != nil {
			return nil, err
		}
		if d.term != nil {
			hard, err := diffFits(e.stderr, d.term, s, p, termPath, i == 0)
			if err != nil {
				return nil, err
			}
			if i == 1 {
				d.newHard, d.newSched = hard, s
			} else {
				d.oldSched = s
			}
		}
		sides[i] = ms
	}
	d.cmp = timetable.Compare(sides[0], sides[1])
	if d.term == nil {
		d.affected = d.cmp.Affected(nil)
		return d, nil
	}
	// Students are told of their section's changes only where they stay in
	// it; a change of section is told as such.
	d.moves = export.SectionChanges(d.term, d.oldSched, d.newSched)
	d.affected = export.WithSectionChanges(d.cmp.Affected(export.StayingStudents(d.term, d.oldSched, d.newSched)), d.moves)
	return d, nil
}

// diffProblems prints a reader's problems and fails when any is an error;
// termPath, when not "", is the term a timetable was read for.
func diffProblems(w io.Writer, path string, ps timetable.Problems, termPath string) error {
	for _, p := range append(ps.Errors(), ps.Warnings()...) {
		fmt.Fprintln(w, p.String())
	}
	if n := len(ps.Errors()); n > 0 {
		hint := "fix them and compare again"
		if termPath != "" {
			hint = fmt.Sprintf("fix them, or, if %s changed its grid since, leave TERM out to compare the timetables alone", termPath)
		}
		return withCode(exitError, fmt.Sprintf("%s has %s; %s", path, checkCount(n, "error"), hint))
	}
	return nil
}

// diffFits checks that timetable s, read from path, fits the term: for
// the new timetable every section and room known (the old one may hold
// sections and rooms the term no longer has: they are compared by the
// timetable's own cells). Other broken requirements (a clash, a full
// room) are only noted: comparing is still meaningful. It returns the
// timetable's hard violations.
func diffFits(w io.Writer, t *timetable.Term, s *timetable.Schedule, path, termPath string, old bool) ([]timetable.Violation, error) {
	hard := timetable.HardViolations(timetable.Check(t, s))
	misfits, gone := 0, 0
	for _, v := range hard {
		unknown := v.Rule == timetable.RuleUnknownSection || v.Rule == timetable.RuleUnknownRoom
		switch {
		case unknown && old:
			gone++
		case unknown, v.Rule == timetable.RuleOutsideGrid:
			fmt.Fprintf(w, "%s: %s: %s\n", path, v.Rule, v.Msg)
			misfits++
		}
	}
	if misfits > 0 {
		return nil, withCode(exitError, fmt.Sprintf("%s does not fit %s (%s); give the term the timetables were made for, or leave TERM out to compare the timetables alone",
			path, termPath, checkCount(misfits, "problem")))
	}
	if gone > 0 {
		fmt.Fprintf(w, "note: %s names %s that %s no longer has; those meetings are compared as the timetable's own cells give them\n",
			path, checkCount(gone, "section or room"), termPath)
	}
	if n := len(hard) - gone; n > 0 {
		fmt.Fprintf(w, "note: %s breaks %s of %s (run termwright verify for the details); compared anyway\n", path, checkCount(n, "hard requirement"), termPath)
	}
	return hard, nil
}

// diffReport is the stable JSON form of a comparison.
type diffReport struct {
	Old      string        `json:"old"`
	New      string        `json:"new"`
	Term     string        `json:"term,omitempty"` // the term's name, when a term was given
	Summary  diffSummary   `json:"summary"`
	Sections []diffSection `json:"sections"` // sections with a change, by ID
	Affected []diffSubject `json:"affected"` // staff, rooms, cohorts, students, each by ID
	// StudentSections are the students' changes of section (with TERM,
	// for a term whose students are sectioned).
	StudentSections []export.SectionChange `json:"student_sections,omitempty"`
}

type diffSummary struct {
	Unchanged int `json:"unchanged"`
	Moved     int `json:"moved"`
	Added     int `json:"added"`
	Dropped   int `json:"dropped"`
}

type diffSection struct {
	ID      string       `json:"id"`
	Title   string       `json:"title,omitempty"`
	Changes []diffChange `json:"changes"`
}

type diffSubject struct {
	Kind    string       `json:"kind"` // staff, room, cohort or student
	ID      string       `json:"id"`
	Name    string       `json:"name,omitempty"`
	Changes []diffChange `json:"changes"`
	// Sections are a student's changes of section.
	Sections []export.SectionChange `json:"sections,omitempty"`
}

// diffChange is one change; Change is the subject's view in Affected.
type diffChange struct {
	Section string     `json:"section"`
	Title   string     `json:"title,omitempty"`
	Change  string     `json:"change"`         // moved, added or dropped
	What    []string   `json:"what,omitempty"` // for moved: day, time, room, weeks
	From    *diffPlace `json:"from,omitempty"`
	To      *diffPlace `json:"to,omitempty"`
}

type diffPlace struct {
	Meeting int    `json:"meeting"`
	Day     string `json:"day"` // "Tue", or the days of a meeting pattern, "Mon Wed Fri"
	Start   string `json:"start"`
	End     string `json:"end,omitempty"`
	Room    string `json:"room,omitempty"`
	Weeks   string `json:"weeks"`
}

func diffBuildReport(d *diffInput) diffReport {
	c := d.cmp
	rep := diffReport{Old: d.oldPath, New: d.newPath, Sections: []diffSection{}, Affected: []diffSubject{},
		Summary: diffSummary{Unchanged: c.Count(timetable.ChangeUnchanged), Moved: c.Count(timetable.ChangeMoved),
			Added: c.Count(timetable.ChangeAdded), Dropped: c.Count(timetable.ChangeDropped)}}
	if d.term != nil {
		rep.Term = d.term.Name
	}
	rep.StudentSections = d.moves
	byStudent := map[string][]export.SectionChange{}
	for _, mv := range d.moves {
		byStudent[mv.Student] = append(byStudent[mv.Student], mv)
	}
	for i, ch := range c.Changes {
		if ch.Kind == timetable.ChangeUnchanged {
			continue
		}
		dc := diffChangeOf(c, i, ch.Kind)
		if n := len(rep.Sections); n == 0 || rep.Sections[n-1].ID != ch.Section {
			rep.Sections = append(rep.Sections, diffSection{ID: ch.Section, Title: dc.Title})
		}
		s := &rep.Sections[len(rep.Sections)-1]
		s.Changes = append(s.Changes, dc)
	}
	var cohortNames map[string]int
	if d.term != nil {
		cohortNames = d.term.CohortIndex()
	}
	for _, a := range d.affected {
		sub := diffSubject{Kind: a.Kind, ID: a.ID, Name: a.Name, Changes: []diffChange{}}
		if a.Kind == timetable.SubjectStudent {
			sub.Sections = byStudent[a.ID]
		}
		if i, ok := cohortNames[a.ID]; ok && a.Kind == timetable.SubjectCohort && d.term.Cohorts[i].Name != a.ID {
			sub.Name = d.term.Cohorts[i].Name
		}
		for _, sc := range a.Changes {
			sub.Changes = append(sub.Changes, diffChangeOf(c, sc.Change, sc.Kind))
		}
		rep.Affected = append(rep.Affected, sub)
	}
	return rep
}

// diffChangeOf is change i of c seen as kind.
func diffChangeOf(c *timetable.Comparison, i int, kind string) diffChange {
	ch := c.Changes[i]
	dc := diffChange{Section: ch.Section, Change: kind, From: diffPlaceOf(ch.Old), To: diffPlaceOf(ch.New)}
	if kind == timetable.ChangeMoved || ch.Kind == timetable.ChangeMoved {
		dc.What = ch.What
	}
	for _, m := range []*timetable.Meeting{ch.New, ch.Old} {
		if m != nil && dc.Title == "" {
			dc.Title = m.Title
		}
	}
	return dc
}

func diffPlaceOf(m *timetable.Meeting) *diffPlace {
	if m == nil {
		return nil
	}
	p := &diffPlace{Meeting: m.Number, Day: m.DayText(), Start: m.Start.String(), Room: m.Room, Weeks: m.Weeks}
	if m.End != 0 {
		p.End = m.End.String()
	}
	return p
}

// writeDiffText prints the comparison for people.
func writeDiffText(w io.Writer, rep diffReport) {
	s := rep.Summary
	term := ""
	if rep.Term != "" {
		term = " (term " + rep.Term + ")"
	}
	fmt.Fprintf(w, "%s → %s%s: %d moved, %d added, %d dropped, %d unchanged", rep.Old, rep.New, term, s.Moved, s.Added, s.Dropped, s.Unchanged)
	if n := len(rep.StudentSections); n > 0 {
		fmt.Fprintf(w, "; %s of section", checkCount(n, "student change"))
	}
	fmt.Fprintln(w)
	if len(rep.Sections) == 0 && len(rep.StudentSections) == 0 {
		fmt.Fprintln(w, "No differences.")
		return
	}
	if len(rep.Sections) > 0 {
		fmt.Fprintln(w, "\nSections")
	}
	for _, sec := range rep.Sections {
		fmt.Fprintf(w, "  %s\n", diffLabel(sec.ID, sec.Title))
		for _, ch := range sec.Changes {
			fmt.Fprintf(w, "    %s\n", diffChangeText(ch))
		}
	}
	heads := map[string]string{timetable.SubjectStaff: "Staff", timetable.SubjectRoom: "Rooms", timetable.SubjectCohort: "Cohorts", timetable.SubjectStudent: "Students"}
	last := ""
	for _, a := range rep.Affected {
		if a.Kind != last {
			fmt.Fprintf(w, "\n%s\n", heads[a.Kind])
			last = a.Kind
		}
		if a.Name != "" {
			fmt.Fprintf(w, "  %s (%s)\n", a.Name, a.ID)
		} else {
			fmt.Fprintf(w, "  %s\n", a.ID)
		}
		for _, mv := range a.Sections {
			fmt.Fprintf(w, "    %s\n", sectionChangeText(mv))
		}
		for _, ch := range a.Changes {
			fmt.Fprintf(w, "    %s: %s\n", diffLabel(ch.Section, ch.Title), diffChangeText(ch))
		}
	}
}

// sectionChangeText is "MA110 Tutorial: section MA110-T1 → MA110-T2"
// ("now in", "no longer in" when one side is empty).
func sectionChangeText(mv export.SectionChange) string {
	head := mv.Course
	if mv.Part != "" {
		head += " " + mv.Part
	}
	switch {
	case mv.From == "":
		return head + ": now in section " + mv.To
	case mv.To == "":
		return head + ": no longer in section " + mv.From
	}
	return head + ": section " + mv.From + " → " + mv.To
}

// diffLabel is "A101 Algebra" (the ID alone without a title).
func diffLabel(id, title string) string {
	if title == "" {
		return id
	}
	return id + " " + title
}

// diffChangeText is "moved (day, room): Wed 09:00–10:00 in R1 → Thu 09:00–10:00 in R2".
func diffChangeText(ch diffChange) string {
	head := ch.Change
	if len(ch.What) > 0 {
		head += " (" + strings.Join(ch.What, ", ") + ")"
	}
	switch {
	case ch.From != nil && ch.To != nil:
		to := *ch.To
		to.Meeting = 0 // the meeting is the old one's; its number in the new file is in --json
		return head + ": " + diffPlaceText(ch.From) + " → " + diffPlaceText(&to)
	case ch.From != nil:
		return head + ": " + diffPlaceText(ch.From)
	}
	return head + ": " + diffPlaceText(ch.To)
}

// diffPlaceText is "meeting 2, Wed 09:00–10:00 in R1, weeks 1-6" (the
// meeting left out when 0, weeks when it meets every week).
func diffPlaceText(p *diffPlace) string {
	s := fmt.Sprintf("%s %s", p.Day, p.Start)
	if p.Meeting > 0 {
		s = fmt.Sprintf("meeting %d, %s", p.Meeting, s)
	}
	if p.End != "" {
		s += "–" + p.End
	}
	if p.Room != "" {
		s += " in " + p.Room
	} else {
		s += ", no room"
	}
	if p.Weeks != "all" && p.Weeks != "" {
		s += ", weeks " + p.Weeks
	}
	return s
}
