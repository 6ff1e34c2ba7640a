package main

import (
	"fmt"
	"io"
	"strings"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/timetable"
)

// solveSectioning is the sectioning part of the solve report: how many
// requests were met, the findings of the sectioning report (the workbook's
// Sectioning sheet) and, with --keep, the students who changed section.
type solveSectioning struct {
	Requests         int                `json:"requests"`
	Unplaced         int                `json:"unplaced"`
	ByAlternative    int                `json:"met_by_alternative"`
	Sectioned        int                `json:"sectioned_enrolments"` // (student, section) pairs the sectioner made
	Full             int                `json:"full_sections"`
	NearlyFull       int                `json:"nearly_full_sections"`
	ClashingStudents int                `json:"students_with_clashes"`
	TotalClashes     int                `json:"clashes"` // units of criterion "student clashes", fixed and sectioned students
	Findings         []export.Finding   `json:"findings"`
	Moves            []solveStudentMove `json:"moved_students,omitempty"` // with --keep
	Kept             bool               `json:"kept"`                     // --keep was given
	byKind           map[string][]int   // finding kind -> indexes into Findings
}

// solveStudentMove is one student's change of section against the kept
// timetable (sectioning.Move); From or To is empty when the student was
// not, or is no longer, in a section of that part.
type solveStudentMove struct {
	Student string `json:"student"`
	Course  string `json:"course"`
	From    string `json:"from,omitempty"`
	To      string `json:"to,omitempty"`
}

// solveReasons are the sectioner's reasons by request, for the report.
func solveReasons(res *planning.Result) map[int]string {
	if res.Sectioning == nil {
		return nil
	}
	out := make(map[int]string, len(res.Sectioning.Unplaced))
	for _, u := range res.Sectioning.Unplaced {
		out[u.Request] = u.Reason
	}
	return out
}

// solveBuildSectioning summarises the sectioning of the written timetable
// from the sectioner's own report (sectioning.NewReport); nil for a term
// without course requests.
func solveBuildSectioning(t *timetable.Term, res *planning.Result) *solveSectioning {
	if len(t.Requests) == 0 || res.Schedule == nil || res.Sectioning == nil {
		return nil
	}
	rep := sectioning.NewReport(t, res.Schedule, res.Sectioning)
	sec := newSolveSectioning(t, res.Schedule, solveFindings(t, rep))
	sec.ByAlternative, sec.TotalClashes, sec.Kept = rep.ByAlternative, rep.TotalClashes, res.Kept
	if res.Kept {
		sec.Moves = []solveStudentMove{}
		for _, m := range res.Sectioning.Moves {
			sec.Moves = append(sec.Moves, solveStudentMove(m))
		}
	}
	return sec
}

// newSolveSectioning counts the findings of a sectioning report of
// timetable s (verify builds it from the timetable alone, with
// export.SectioningFindings).
func newSolveSectioning(t *timetable.Term, s *timetable.Schedule, fs []export.Finding) *solveSectioning {
	sec := &solveSectioning{Requests: len(t.Requests), Sectioned: len(s.Enrolments), Findings: fs, byKind: map[string][]int{}}
	if sec.Findings == nil {
		sec.Findings = []export.Finding{}
	}
	clashing := map[string]bool{}
	for i, f := range fs {
		sec.byKind[f.Kind] = append(sec.byKind[f.Kind], i)
		switch f.Kind {
		case export.FindingUnplaced:
			sec.Unplaced++
		case export.FindingFull:
			sec.Full++
		case export.FindingNearlyFull:
			sec.NearlyFull++
		case export.FindingClash:
			clashing[f.Student] = true
		}
	}
	sec.ClashingStudents = len(clashing)
	return sec
}

// solveFindings turns the sectioner's report into the lines of the
// workbook's Sectioning sheet (export.Finding): unplaced requests with
// their reasons, then the full and nearly full sections, then each
// student's clashing pairs.
func solveFindings(t *timetable.Term, rep *sectioning.Report) []export.Finding {
	out := []export.Finding{}
	for _, u := range rep.Unplaced {
		out = append(out, export.Finding{Kind: export.FindingUnplaced, Student: u.Student, Course: u.Course, Details: u.Reason, Where: u.Src.String()})
	}
	var nearly []export.Finding
	for _, f := range rep.Sections {
		x := export.Finding{Kind: export.FindingFull, Course: f.Course, Section: f.Section, Students: f.Students, Limit: f.Limit,
			Details: export.FillDetails(f.Students, f.Limit), Where: f.Src.String()}
		if !f.Full {
			x.Kind = export.FindingNearlyFull
			nearly = append(nearly, x)
			continue
		}
		out = append(out, x)
	}
	out = append(out, nearly...)
	idx := t.SectionIndex()
	for _, c := range rep.Clashes {
		x := export.Finding{Kind: export.FindingClash, Student: c.Student, Section: c.A}
		if i, ok := idx[c.A]; ok {
			x.Course, x.Where = t.Sections[i].Course, t.Sections[i].Src.String()
		}
		switch {
		case c.Travel:
			x.Details = "too little time to travel between it and " + c.B
		case c.Count > 1:
			x.Details = fmt.Sprintf("meets together with %s (%d common periods)", c.B, c.Count)
		default:
			x.Details = "meets together with " + c.B
		}
		out = append(out, x)
	}
	return out
}

// solveShown is how many findings of each kind the text summary lists
// before "and n more" (the workbook's Sectioning sheet has them all).
const solveShown = 5

// solvePrintSectioning prints the sectioning summary.
func solvePrintSectioning(w io.Writer, s *solveSectioning) {
	alt := ""
	if s.ByAlternative > 0 {
		alt = fmt.Sprintf(" (%d by an alternative)", s.ByAlternative)
	}
	fmt.Fprintf(w, "Sectioning: %d of %s met%s, %s in sections; %d full and %d nearly full section%s; %s with clashes.\n",
		s.Requests-s.Unplaced, checkCount(s.Requests, "course request"), alt, checkCount(s.Sectioned, "student place"),
		s.Full, s.NearlyFull, plural(s.NearlyFull, "", "s"), checkCount(s.ClashingStudents, "student"))
	list := func(kind, head string, text func(export.Finding) string) {
		idx := s.byKind[kind]
		if len(idx) == 0 {
			return
		}
		fmt.Fprintln(w, head)
		for k, i := range idx {
			if k == solveShown {
				fmt.Fprintf(w, "  and %d more (see the Sectioning sheet)\n", len(idx)-solveShown)
				break
			}
			fmt.Fprintf(w, "  %s\n", text(s.Findings[i]))
		}
	}
	list(export.FindingUnplaced, "Requests not met:", func(f export.Finding) string {
		return fmt.Sprintf("%s %s: %s (%s)", f.Student, f.Course, f.Details, f.Where)
	})
	list(export.FindingFull, "Full sections:", func(f export.Finding) string {
		return fmt.Sprintf("%s (%s): %s", f.Section, f.Course, f.Details)
	})
	list(export.FindingNearlyFull, "Nearly full sections:", func(f export.Finding) string {
		return fmt.Sprintf("%s (%s): %s", f.Section, f.Course, f.Details)
	})
	list(export.FindingClash, "Students with clashes:", func(f export.Finding) string {
		return fmt.Sprintf("%s: %s %s", f.Student, f.Section, f.Details)
	})
	if !s.Kept {
		return
	}
	if len(s.Moves) == 0 {
		fmt.Fprintln(w, "No student changed section from the kept timetable.")
		return
	}
	students := map[string]bool{}
	for _, m := range s.Moves {
		students[m.Student] = true
	}
	fmt.Fprintf(w, "Students moved between sections (%s, %s of section):\n", checkCount(len(students), "student"), checkCount(len(s.Moves), "change"))
	for _, line := range moveLines(s.Moves) {
		fmt.Fprintf(w, "  %s\n", line)
	}
}

// moveLines gives one line per student and course: "st-001 MA110:
// MA110-T1 → MA110-T2", "st-002 MA110: no longer in MA110-L,
// MA110-T2", "st-003 MA110: now in MA110-L, MA110-T1" (changes of
// section first, then the sections joined, then those left).
func moveLines(moves []solveStudentMove) []string {
	type key struct{ student, course string }
	var order []key
	changed, joined, left := map[key][]string{}, map[key][]string{}, map[key][]string{}
	for _, m := range moves {
		k := key{m.Student, m.Course}
		if len(changed[k])+len(joined[k])+len(left[k]) == 0 {
			order = append(order, k)
		}
		switch {
		case m.From == "":
			joined[k] = append(joined[k], m.To)
		case m.To == "":
			left[k] = append(left[k], m.From)
		default:
			changed[k] = append(changed[k], m.From+" → "+m.To)
		}
	}
	out := make([]string, len(order))
	for i, k := range order {
		parts := changed[k]
		if l := joined[k]; len(l) > 0 {
			parts = append(parts, "now in "+strings.Join(l, ", "))
		}
		if l := left[k]; len(l) > 0 {
			parts = append(parts, "no longer in "+strings.Join(l, ", "))
		}
		out[i] = k.student + " " + k.course + ": " + strings.Join(parts, "; ")
	}
	return out
}

// solveMovedStudentsSheet is the Moved students sheet of the timetable
// workbook written with --keep.
func solveMovedStudentsSheet(s *sectioning.Result) export.ExtraSheet {
	x := export.ExtraSheet{Name: "Moved students", Header: []string{"Student", "Course", "From section", "To section"}}
	for _, m := range s.Moves {
		x.Rows = append(x.Rows, []any{m.Student, m.Course, m.From, m.To})
	}
	return x
}
