package main

import (
	"fmt"
	"io"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/timetable"
)

// solveSectioning is the sectioning part of the solve report: how many
// requests were met, the findings of the sectioning report (the workbook's
// Sectioning sheet) and, with --keep, the students who changed section.
type solveSectioning struct {
	Requests         int               `json:"requests"`
	Unplaced         int               `json:"unplaced"`
	Sectioned        int               `json:"sectioned_enrolments"` // (student, section) pairs the sectioner made
	Full             int               `json:"full_sections"`
	NearlyFull       int               `json:"nearly_full_sections"`
	ClashingStudents int               `json:"students_with_clashes"`
	Findings         []export.Finding  `json:"findings"`
	Moves            []sectioning.Move `json:"moved_students,omitempty"` // with --keep
	Kept             bool              `json:"kept"`                     // --keep was given
	byKind           map[string][]int  // finding kind -> indexes into Findings
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

// solveBuildSectioning summarises the sectioning of the written timetable;
// nil for a term without course requests.
func solveBuildSectioning(t *timetable.Term, res *planning.Result) *solveSectioning {
	if len(t.Requests) == 0 || res.Schedule == nil {
		return nil
	}
	fs, err := export.SectioningFindings(t, res.Schedule, solveReasons(res))
	if err != nil {
		fs = nil // the timetable passed the checks; a view error here would be a bug, and the counts stay 0
	}
	sec := &solveSectioning{Requests: len(t.Requests), Sectioned: len(res.Schedule.Enrolments), Findings: fs,
		Kept: res.Kept, byKind: map[string][]int{}}
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
	if res.Sectioning != nil && res.Kept {
		sec.Moves = res.Sectioning.Moves
	}
	return sec
}

// solveShown is how many findings of each kind the text summary lists
// before "and n more" (the workbook's Sectioning sheet has them all).
const solveShown = 5

// solvePrintSectioning prints the sectioning summary.
func solvePrintSectioning(w io.Writer, s *solveSectioning) {
	fmt.Fprintf(w, "Sectioning: %d of %s met, %s placed in sections; %d full and %d nearly full section%s; %s with clashes.\n",
		s.Requests-s.Unplaced, checkCount(s.Requests, "course request"), checkCount(s.Sectioned, "student-section place"),
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
	fmt.Fprintf(w, "Students moved between sections (%s):\n", checkCount(len(s.Moves), "change"))
	for _, m := range s.Moves {
		fmt.Fprintf(w, "  %s\n", moveText(m))
	}
}

// moveText is "st-001 MA110: MA110-T1 → MA110-T2" ("now in", "no longer
// in" when one side is empty).
func moveText(m sectioning.Move) string {
	head := m.Student + " " + m.Course + ": "
	switch {
	case m.From == "":
		return head + "now in " + m.To
	case m.To == "":
		return head + "no longer in " + m.From
	}
	return head + m.From + " → " + m.To
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
