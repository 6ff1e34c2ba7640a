package sectioning

import (
	"sort"

	"github.com/termwright/termwright/timetable"
)

// Report is the registrar's summary of a sectioning: what could not be
// met and why, which sections are at or near their limit, and which
// students have clashes. export and cmd render it; it holds no
// formatting.
type Report struct {
	Requests int // requests in the term
	Placed   int // requests met by their course or an alternative
	// ByAlternative counts the placed requests met by an alternative.
	ByAlternative int
	Unplaced      []UnplacedRequest // in request order
	// Sections lists every course section holding at least
	// NearlyFullPercent of its limit (fixed enrolments included), fullest first, then in term
	// order.
	Sections []SectionFill
	// Clashes lists every pair of one student's sections (fixed and
	// sectioned) that clash as criterion "student clashes" counts them,
	// by student, then sections; Count is that criterion's units.
	Clashes      []StudentClash
	TotalClashes int // sum of Count over Clashes
	Moves        int // students' changes of section against the kept timetable (Result.Moves)
}

// NearlyFullPercent is the share of its limit at which a section is
// listed in Report.Sections: 90%, a common-practice warning level for
// enrolment (not a rule of the term).
const NearlyFullPercent = 90

// UnplacedRequest is one request the sectioning left unmet.
type UnplacedRequest struct {
	Request  int    // index into Term.Requests
	Student  string // the request's student
	Course   string // the requested course
	Priority int    // as requested (0: not given)
	Reason   string // Unplaced.Reason: one sentence
	Src      timetable.Source
}

// SectionFill is a section at or near its limit.
type SectionFill struct {
	Section, Course, Part string
	Students              int // fixed and sectioned
	Limit                 int // Term.SectionLimit
	Full                  bool
	Src                   timetable.Source
}

// StudentClash is one clashing pair of a student's sections.
type StudentClash struct {
	Student string
	A, B    string // section IDs, A before B in term order
	// Count is the pair's units of criterion "student clashes": common
	// periods of two grid sections, or 1 for a pair with a pattern section.
	Count int
	// Travel is true when the pair's meetings never overlap and the clash
	// is too little time to travel between their rooms.
	Travel bool
}

// NewReport summarises res, a sectioning of timetable s of term t (the
// Result Section returned for them; entries naming no request or section
// of t are left out). It runs in
// O(sections + enrolments + Σ students·k²) for k sections per student.
func NewReport(t *timetable.Term, s *timetable.Schedule, res *Result) *Report {
	p := newProblem(t, s)
	p.restoreFrom(res)
	rep := &Report{Requests: len(t.Requests), Moves: len(res.Moves)}
	for ri := range p.reqs {
		if o := p.st.opt[ri]; o >= 0 {
			rep.Placed++
			if o > 0 {
				rep.ByAlternative++
			}
		}
	}
	for _, u := range res.Unplaced {
		if u.Request < 0 || u.Request >= len(t.Requests) {
			continue // not a request of t
		}
		r := t.Requests[u.Request]
		rep.Unplaced = append(rep.Unplaced, UnplacedRequest{Request: u.Request, Student: r.Student, Course: r.Course, Priority: r.Priority, Reason: u.Reason, Src: r.Src})
	}
	sort.Slice(rep.Unplaced, func(i, j int) bool { return rep.Unplaced[i].Request < rep.Unplaced[j].Request })
	load := make([]int, len(t.Sections))
	seen := map[timetable.Enrolment]bool{}
	for _, e := range t.StudentEnrolments(&timetable.Schedule{Enrolments: res.Enrolments}) {
		key := timetable.Enrolment{Student: e.Student, Section: e.Section}
		if si, ok := p.secIdx[e.Section]; ok && !seen[key] {
			seen[key] = true
			load[si]++
		}
	}
	for si := range t.Sections {
		sec := &t.Sections[si]
		lim := t.SectionLimit(si)
		if sec.Course == "" || lim <= 0 || 100*load[si] < NearlyFullPercent*lim {
			continue
		}
		rep.Sections = append(rep.Sections, SectionFill{Section: sec.ID, Course: sec.Course, Part: sec.Part,
			Students: load[si], Limit: lim, Full: load[si] >= lim, Src: sec.Src})
	}
	sort.SliceStable(rep.Sections, func(i, j int) bool {
		a, b := rep.Sections[i], rep.Sections[j]
		return a.Students*b.Limit > b.Students*a.Limit
	})
	var secs []int32
	for k := range p.students {
		secs = p.others(int32(k), -1, secs)
		sort.Slice(secs, func(i, j int) bool { return secs[i] < secs[j] })
		for i, a := range secs {
			for _, b := range secs[i+1:] {
				if n := p.clash.get(a, b); n > 0 && a != b {
					rep.Clashes = append(rep.Clashes, StudentClash{Student: p.students[k].id, A: t.Sections[a].ID, B: t.Sections[b].ID,
						Count: n, Travel: !p.clash.overlap(a, b)})
					rep.TotalClashes += n
				}
			}
		}
	}
	sort.SliceStable(rep.Clashes, func(i, j int) bool { return rep.Clashes[i].Student < rep.Clashes[j].Student })
	return rep
}
