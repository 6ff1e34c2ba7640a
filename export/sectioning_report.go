package export

import (
	"fmt"

	"github.com/termwright/termwright/timetable"
)

// SectioningSheet is the name of the timetable workbook's sectioning
// report sheet.
const SectioningSheet = "Sectioning"

// Kinds of Finding, in the order the report lists them.
const (
	FindingUnplaced   = "unplaced request"
	FindingFull       = "full section"
	FindingNearlyFull = "nearly full section"
	FindingClash      = "student clash"
)

// SectioningColumns are the headers of the sectioning report sheet.
var SectioningColumns = []string{"Finding", "Student", "Course", "Section", "Students", "Limit", "Details", "Workbook row"}

// Finding is one line of the sectioning report; the JSON names are
// stable (solve --json prints findings).
type Finding struct {
	Kind     string `json:"kind"`               // FindingUnplaced, FindingFull, FindingNearlyFull or FindingClash
	Student  string `json:"student,omitempty"`  // unplaced requests and clashes
	Course   string `json:"course,omitempty"`   // the requested course; a section's course
	Section  string `json:"section,omitempty"`  // full and nearly full sections; the first section of a clash
	Students int    `json:"students,omitempty"` // full and nearly full sections: students in it, fixed enrolments included
	Limit    int    `json:"limit,omitempty"`    // full and nearly full sections: Term.SectionLimit
	Details  string `json:"details"`            // the reason, the free places, or what the section clashes with and when
	Where    string `json:"where,omitempty"`    // the term row: "Course requests row 5", "Sections row 12"
}

// SectioningFindings is the sectioning report of s, in this order:
//   - every request of t.Requests that the student's sections (fixed and
//     sectioned) meet neither by its course nor by an alternative, in
//     request order, with reasons[i] (the sectioner's reason for request i)
//     or, when there is none, a plain "not placed";
//   - every section with a Course that is full (no free place under
//     Term.SectionLimit) and then every one nearly full (at least
//     NearlyFullPercent of its limit taken), in term order;
//   - per student (sorted by ID) every pair of their sections that meet
//     at the same time (a common minute of a common day in a common week),
//     with the first such time, then every pair that leaves too little
//     time between two meetings for the travel between their rooms
//     (timetable.TravelClashes), with the first such gap: together the
//     student clashes that timetable.Cost counts.
//
// It fails only when s does not fit t.
func SectioningFindings(t *timetable.Term, s *timetable.Schedule, reasons map[int]string) ([]Finding, error) {
	v, err := newView(t, s)
	if err != nil {
		return nil, err
	}
	return v.sectioningFindings(reasons), nil
}

func (v *view) sectioningFindings(reasons map[int]string) []Finding {
	t := v.t
	secIdx := t.SectionIndex()
	held := map[string]map[string]bool{} // student -> courses they hold a section of
	count := make([]int, len(t.Sections))
	type pair struct{ st, sec string }
	seen := map[pair]bool{}
	for _, e := range v.enrolments {
		si, ok := secIdx[e.Section]
		if !ok || seen[pair{e.Student, e.Section}] {
			continue
		}
		seen[pair{e.Student, e.Section}] = true
		count[si]++
		if c := t.Sections[si].Course; c != "" {
			if held[e.Student] == nil {
				held[e.Student] = map[string]bool{}
			}
			held[e.Student][c] = true
		}
	}
	var out []Finding
	for i, r := range t.Requests {
		met := held[r.Student][r.Course]
		for _, alt := range r.Alternatives {
			met = met || held[r.Student][alt]
		}
		if met {
			continue
		}
		why := reasons[i]
		if why == "" {
			why = "not placed in the course or any of its alternatives"
		}
		out = append(out, Finding{Kind: FindingUnplaced, Student: r.Student, Course: r.Course, Details: why, Where: r.Src.String()})
	}
	var nearly []Finding
	for si := range t.Sections {
		s := &t.Sections[si]
		limit := t.SectionLimit(si)
		if s.Course == "" || limit <= 0 {
			continue
		}
		f := Finding{Course: s.Course, Section: s.ID, Students: count[si], Limit: limit, Where: s.Src.String()}
		switch full, near := sectionFill(count[si], limit); {
		case full:
			f.Kind, f.Details = FindingFull, FillDetails(count[si], limit)
			out = append(out, f)
		case near:
			f.Kind, f.Details = FindingNearlyFull, FillDetails(count[si], limit)
			nearly = append(nearly, f)
		}
	}
	out = append(out, nearly...)
	return append(out, v.studentClashFindings()...)
}

// NearlyFullPercent is the share of its limit from which a section is
// reported as nearly full: 90%, a common-practice warning level for
// enrolment (the sectioner's report uses the same).
const NearlyFullPercent = 90

// sectionFill says whether a section holding students under limit is
// full (no place left) or nearly full (at least NearlyFullPercent).
func sectionFill(students, limit int) (full, nearly bool) {
	return students >= limit, students < limit && 100*students >= NearlyFullPercent*limit
}

// FillDetails is "9 of 10 places taken, 1 free", "10 of 10 places taken"
// or "12 of 10 places taken (2 over the limit)".
func FillDetails(students, limit int) string {
	s := fmt.Sprintf("%d of %d places taken", students, limit)
	switch free := limit - students; {
	case free > 0:
		s += fmt.Sprintf(", %d free", free)
	case free < 0:
		s += fmt.Sprintf(" (%d over the limit)", -free)
	}
	return s
}

// studentClashFindings lists, per student in ID order, every pair of
// distinct sections of theirs with meetings at the same time (the lower
// section ID first, pairs in the order of their first meeting), naming the
// first common time in week order; then the student's travel clashes.
func (v *view) studentClashFindings() []Finding {
	var out []Finding
	travel := timetable.TravelClashes(v.t, v.s) // sorted by student, as v.students
	secIdx := v.t.SectionIndex()
	for _, st := range v.students {
		type pair struct{ a, b string }
		first := map[pair]int{} // index into out and ats
		var ats []clashAt
		var others []string
		ms := v.byStudent[st]
		base := len(out)
		for x := 0; x < len(ms); x++ {
			for y := x + 1; y < len(ms); y++ {
				a, b := &v.meetings[ms[x]], &v.meetings[ms[y]]
				if a.sec.ID == b.sec.ID || !v.meetTogether(a, b) {
					continue
				}
				if a.sec.ID > b.sec.ID {
					a, b = b, a
				}
				k := pair{a.sec.ID, b.sec.ID}
				at := clashTime(a, b)
				if i, ok := first[k]; ok {
					if at.before(ats[i]) {
						ats[i] = at
					}
					continue
				}
				first[k] = len(ats)
				ats = append(ats, at)
				others = append(others, b.sec.ID)
				out = append(out, Finding{Kind: FindingClash, Student: st, Course: a.sec.Course, Section: a.sec.ID, Where: a.sec.Src.String()})
			}
		}
		for i, at := range ats {
			out[base+i].Details = fmt.Sprintf("meets together with %s at %s %s–%s", others[i], at.day, at.from, at.until)
		}
		for len(travel) > 0 && travel[0].Student < st {
			travel = travel[1:] // not expected: both lists come from the same enrolments
		}
		for ; len(travel) > 0 && travel[0].Student == st; travel = travel[1:] {
			tc := travel[0]
			sec := &v.t.Sections[secIdx[tc.First]]
			out = append(out, Finding{Kind: FindingClash, Student: st, Course: sec.Course, Section: tc.First, Where: tc.Src.String(),
				Details: "too little time to travel between it and " + tc.Second + " on " + tc.At})
		}
	}
	return out
}

// meetTogether reports whether two meetings share a minute of a common day
// in a common week (weeks 0 means every week).
func (v *view) meetTogether(a, b *meeting) bool {
	wa, wb := a.weeks, b.weeks
	if wa == 0 {
		wa = v.allWeeks
	}
	if wb == 0 {
		wb = v.allWeeks
	}
	return a.day == b.day && a.from < b.to && b.from < a.to && wa&wb != 0
}

// clashAt is the common time of two meetings.
type clashAt struct {
	rank        int // timetable.WeekOrder of the day
	day         string
	from, until timetable.Clock
}

func (c clashAt) before(d clashAt) bool {
	if c.rank != d.rank {
		return c.rank < d.rank
	}
	return c.from < d.from
}

func clashTime(a, b *meeting) clashAt {
	return clashAt{rank: timetable.WeekOrder(a.day), day: timetable.DayName(a.day), from: max(a.from, b.from), until: min(a.to, b.to)}
}

// sectioningSheet writes the SectioningSheet (opt.Findings, or else
// SectioningFindings with opt.Reasons): one row per finding with
// SectioningColumns (Students and Limit as numbers, empty when they do not
// apply), frozen header, AutoFilter.
func (wb *workbook) sectioningSheet(name string, opt Options) error {
	fs := opt.Findings
	if fs == nil {
		fs = wb.v.sectioningFindings(opt.Reasons)
	}
	rows := make([][]any, len(fs))
	for i, f := range fs {
		var n, l any = "", ""
		if f.Kind == FindingFull || f.Kind == FindingNearlyFull {
			n, l = f.Students, f.Limit
		}
		rows[i] = []any{f.Kind, f.Student, f.Course, f.Section, n, l, f.Details, f.Where}
	}
	return wb.table(name, SectioningColumns, []float64{20, 14, 12, 12, 10, 8, 60, 22}, rows)
}
