package encode

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// ExplainStudent answers, for one student and one timetable, "can this
// student get all the courses they asked for without a clash, and if not,
// why not". It needs no search engine: with the timetable fixed, every
// way of taking each requested course (one section of every part of one
// arrangement, parents included — the seating rule of timetable.Course)
// is enumerated, and two sections clash for the student as the criterion
// "student clashes" defines it (timetable/criteria.go): some meetings
// share a minute of a common day in a common week, or, when either
// section has meeting patterns, meet on a common day in a common week with
// less free time between them than the travel time between their rooms.
// A section already holding its limit of other students (fixed and
// sectioned enrolments, Term.SectionLimit) cannot be taken.
//
// When every combination clashes, the answer keeps a smallest set of the
// student's requests that already cannot be combined (dropping any one of
// them lets the rest fit; found by deletion), and lists the clashes and
// full sections that rule out every combination of it, each section with
// its times and workbook rows.
func ExplainStudent(t *timetable.Term, sched *timetable.Schedule, student string) (*StudentExplanation, error) {
	x, err := newStudentExplainer(t, sched, student)
	if err != nil {
		return nil, err
	}
	return x.run(), nil
}

// Outcomes of a student explanation (StudentExplanation.Status).
const (
	StudentFits     = "fits"      // some choice of sections has no clash
	StudentClashes  = "clashes"   // every choice clashes (or meets a full section)
	StudentTooLarge = "too large" // more combinations than maxStudentCombos: not decided
)

// maxStudentCombos bounds the combinations one explanation visits.
const maxStudentCombos = 2_000_000

// StudentExplanation is the answer for one student. Its JSON form is
// stable: fields are only ever added.
type StudentExplanation struct {
	Student string `json:"student"`
	Status  string `json:"status"`
	// Fixed are the student's fixed enrolments (Enrolments sheet), which
	// every choice keeps.
	Fixed []SectionTime `json:"fixed"`
	// Requests are the student's course requests with the ways of taking
	// each; with Status "clashes", only the smallest set that cannot be
	// combined.
	Requests []StudentRequest `json:"requests"`
	// Choice is a clash-free choice of sections (Status "fits").
	Choice []SectionTime `json:"choice,omitempty"`
	// Clashes are the pairs of sections that rule out every combination
	// of Requests (Status "clashes").
	Clashes []StudentClash `json:"clashes,omitempty"`
	// Full are the sections that cannot be taken because they hold their
	// limit of other students.
	Full []FullSection `json:"full,omitempty"`
	// AllRequests is the number of the student's requests; Requests may
	// list fewer (the smallest set that clashes).
	AllRequests int `json:"all_requests"`
}

// SectionTime is one section as the student would attend it.
type SectionTime struct {
	Section string   `json:"section"`
	Course  string   `json:"course,omitempty"`
	Part    string   `json:"part,omitempty"`
	Title   string   `json:"title,omitempty"`
	When    string   `json:"when"` // "Mon Wed Fri 09:00-09:50"; grid: "Tue 10:00-11:00, Thu 10:00-11:00"
	Room    string   `json:"room,omitempty"`
	Sources []string `json:"sources"` // Sections row, Meeting times row, timetable rows
}

// StudentRequest is one course request with its ways of taking it.
type StudentRequest struct {
	Course       string   `json:"course"`
	Alternatives []string `json:"alternatives,omitempty"`
	Source       string   `json:"source,omitempty"`
	// Options are the ways of taking it: each a set of sections (one per
	// part of one arrangement of the course or an alternative).
	Options [][]string `json:"options"`
}

// StudentClash is two sections the student cannot attend both of.
type StudentClash struct {
	A   SectionTime `json:"a"`
	B   SectionTime `json:"b"`
	Why string      `json:"why"` // "both meet Mon 09:00-09:50 in weeks 1-12", "10 free minutes between ASH-101 and BIR-010, 25 needed to get there"
}

// FullSection is a section that holds its limit of other students.
type FullSection struct {
	Section SectionTime `json:"section"`
	Limit   int         `json:"limit"`
	Held    int         `json:"held"` // students in it other than this one
}

// studentExplainer holds the enumeration of one student's choices.
type studentExplainer struct {
	t       *timetable.Term
	sched   *timetable.Schedule
	student string
	secIdx  map[string]int
	place   map[int][]timetable.Placement // placements of each section in sched
	occ     map[int][]timetable.Occurrence
	fixed   []int               // sections the student is fixed in
	reqs    []timetable.Request // the student's requests, in sheet order
	options [][][]int           // options[r]: ways of taking request r
	full    map[int]FullSection // sections that are full for this student
	clash   map[[2]int]string   // memo: why two sections clash ("" none)
	visited int                 // combinations visited in the last search
}

// ErrNoStudent is returned when the term has no course request and no
// enrolment for the student.
var ErrNoStudent = errors.New("no such student")

func newStudentExplainer(t *timetable.Term, sched *timetable.Schedule, student string) (*studentExplainer, error) {
	x := &studentExplainer{t: t, sched: sched, student: student, secIdx: t.SectionIndex(),
		place: map[int][]timetable.Placement{}, occ: map[int][]timetable.Occurrence{},
		full: map[int]FullSection{}, clash: map[[2]int]string{}}
	for _, r := range t.Requests {
		if r.Student == student {
			x.reqs = append(x.reqs, r)
		}
	}
	for _, e := range t.Enrolments {
		if e.Student == student {
			if s, ok := x.secIdx[e.Section]; ok && !slices.Contains(x.fixed, s) {
				x.fixed = append(x.fixed, s)
			}
		}
	}
	if len(x.reqs) == 0 && len(x.fixed) == 0 {
		return nil, fmt.Errorf("%w: student %q has no row on the Course requests or Enrolments sheets — check the student ID", ErrNoStudent, student)
	}
	for _, pl := range sched.Placements {
		if s, ok := x.secIdx[pl.Section]; ok {
			x.place[s] = append(x.place[s], pl)
			x.occ[s] = append(x.occ[s], t.SectionOccurrences(&t.Sections[s], pl)...)
		}
	}
	held := map[int]int{}
	for _, e := range t.StudentEnrolments(sched) {
		if s, ok := x.secIdx[e.Section]; ok && e.Student != student {
			held[s]++
		}
	}
	courses := map[string]timetable.Course{}
	for _, c := range t.Courses() {
		courses[c.ID] = c
	}
	for _, r := range x.reqs {
		var opts [][]int
		for _, id := range append([]string{r.Course}, r.Alternatives...) {
			c, ok := courses[id]
			if !ok {
				continue
			}
			opts = append(opts, x.courseOptions(c)...)
		}
		x.options = append(x.options, opts)
	}
	for _, opts := range x.options {
		for _, o := range opts {
			for _, s := range o {
				if lim := t.SectionLimit(s); lim > 0 && held[s] >= lim {
					x.full[s] = FullSection{Section: x.sectionTime(s), Limit: lim, Held: held[s]}
				}
			}
		}
	}
	return x, nil
}

// courseOptions lists the ways of taking course c: for each arrangement,
// one section of every part, such that every chosen section's parent (if
// any) is chosen too.
func (x *studentExplainer) courseOptions(c timetable.Course) [][]int {
	var out [][]int
	for _, a := range c.Arrangements {
		pick := make([]int, len(a.Parts))
		var rec func(p int)
		rec = func(p int) {
			if len(out) > maxStudentCombos {
				return
			}
			if p == len(a.Parts) {
				for _, s := range pick {
					if par := x.t.Sections[s].Parent; par != "" {
						if ps, ok := x.secIdx[par]; !ok || !slices.Contains(pick, ps) {
							return
						}
					}
				}
				out = append(out, slices.Clone(pick))
				return
			}
			for _, s := range a.Parts[p].Sections {
				pick[p] = s
				rec(p + 1)
			}
		}
		rec(0)
	}
	return out
}

// run decides and explains.
func (x *studentExplainer) run() *StudentExplanation {
	out := &StudentExplanation{Student: x.student, Fixed: []SectionTime{}, Requests: []StudentRequest{}, AllRequests: len(x.reqs)}
	for _, s := range x.fixed {
		out.Fixed = append(out.Fixed, x.sectionTime(s))
	}
	all := make([]int, len(x.reqs))
	for i := range all {
		all[i] = i
	}
	choice, ok := x.fits(all)
	switch {
	case ok:
		out.Status = StudentFits
		for _, r := range all {
			for _, s := range x.options[r][choice[r]] {
				out.Choice = append(out.Choice, x.sectionTime(s))
			}
		}
		for _, r := range all {
			out.Requests = append(out.Requests, x.request(r))
		}
		return out
	case x.visited > maxStudentCombos:
		out.Status = StudentTooLarge
		return out
	}
	out.Status = StudentClashes
	// Deletion: drop each request in turn; keep it out when the rest still
	// cannot be combined.
	core := slices.Clone(all)
	for i := 0; i < len(core); {
		rest := slices.Delete(slices.Clone(core), i, i+1)
		if _, ok := x.fits(rest); !ok && x.visited <= maxStudentCombos {
			core = rest
			continue
		}
		i++
	}
	for _, r := range core {
		out.Requests = append(out.Requests, x.request(r))
	}
	out.Clashes, out.Full = x.reasons(core)
	return out
}

// fits searches the combinations of the requests rs (indexes into x.reqs)
// for one without a clash among themselves and with the fixed sections,
// none of them full; it returns the option chosen per request (indexed
// like x.reqs).
func (x *studentExplainer) fits(rs []int) (map[int]int, bool) {
	x.visited = 0
	choice := map[int]int{}
	var held []int
	held = append(held, x.fixed...)
	var rec func(k int) bool
	rec = func(k int) bool {
		if k == len(rs) {
			return true
		}
		r := rs[k]
		for oi, o := range x.options[r] {
			x.visited++
			if x.visited > maxStudentCombos {
				return false
			}
			if !x.optionOK(o, held) {
				continue
			}
			n := len(held)
			held = append(held, o...)
			choice[r] = oi
			if rec(k + 1) {
				return true
			}
			held = held[:n]
		}
		return false
	}
	return choice, rec(0)
}

// optionOK reports whether option o can be taken beside the sections held:
// none of its sections full, none clashing with another of o or of held.
func (x *studentExplainer) optionOK(o, held []int) bool {
	for i, s := range o {
		if _, full := x.full[s]; full {
			return false
		}
		for _, h := range held {
			if x.why(s, h) != "" {
				return false
			}
		}
		for _, q := range o[:i] {
			if x.why(s, q) != "" {
				return false
			}
		}
	}
	return true
}

// reasons lists, for the requests rs that cannot be combined, the clashes
// and full sections that rule out each combination: for every
// combination the first reason met, each listed once.
func (x *studentExplainer) reasons(rs []int) ([]StudentClash, []FullSection) {
	var clashes []StudentClash
	var full []FullSection
	seenPair := map[[2]int]bool{}
	seenFull := map[int]bool{}
	held := slices.Clone(x.fixed)
	visited := 0
	var rec func(k int)
	rec = func(k int) {
		if k == len(rs) || visited > maxStudentCombos {
			return
		}
		for _, o := range x.options[rs[k]] {
			visited++
			if s, h, ok := x.firstReason(o, held); ok {
				switch {
				case h < 0 && !seenFull[s]:
					seenFull[s] = true
					full = append(full, x.full[s])
				case h >= 0:
					key := [2]int{min(s, h), max(s, h)}
					if !seenPair[key] {
						seenPair[key] = true
						clashes = append(clashes, StudentClash{A: x.sectionTime(key[0]), B: x.sectionTime(key[1]), Why: x.why(key[0], key[1])})
					}
				}
				continue
			}
			n := len(held)
			held = append(held, o...)
			rec(k + 1)
			held = held[:n]
		}
	}
	rec(0)
	return clashes, full
}

// firstReason is the first reason option o cannot join held: a full
// section s (h = -1) or a section s clashing with h.
func (x *studentExplainer) firstReason(o, held []int) (s, h int, ok bool) {
	for i, a := range o {
		if _, full := x.full[a]; full {
			return a, -1, true
		}
		for _, b := range held {
			if x.why(a, b) != "" {
				return a, b, true
			}
		}
		for _, b := range o[:i] {
			if x.why(a, b) != "" {
				return a, b, true
			}
		}
	}
	return 0, 0, false
}

// why says why the student cannot attend both sections a and b, or "".
func (x *studentExplainer) why(a, b int) string {
	if a == b {
		return ""
	}
	key := [2]int{min(a, b), max(a, b)}
	if w, ok := x.clash[key]; ok {
		return w
	}
	w := x.clashWhy(key[0], key[1])
	x.clash[key] = w
	return w
}

func (x *studentExplainer) clashWhy(a, b int) string {
	t := x.t
	travel := t.Sections[a].UsesTimes() || t.Sections[b].UsesTimes()
	for _, oa := range x.occ[a] {
		for _, ob := range x.occ[b] {
			if oa.Day != ob.Day || !oa.Weeks.Overlaps(ob.Weeks) {
				continue
			}
			if oa.Overlaps(ob) {
				from, to := max(oa.Start, ob.Start), min(oa.End, ob.End)
				return fmt.Sprintf("both meet %s %s-%s%s", timetable.DayName(oa.Day), from, to, x.weeksText(oa.Weeks&ob.Weeks))
			}
			if !travel {
				continue
			}
			ra, rb := x.roomOf(a), x.roomOf(b)
			need := t.TravelMinutes(ra, rb)
			gap := int(ob.Start - oa.End)
			if ob.Start < oa.Start {
				gap = int(oa.Start - ob.End)
			}
			if gap < need {
				return fmt.Sprintf("only %d free minutes on %s%s between %s and %s, %d needed to get from one room to the other",
					gap, timetable.DayName(oa.Day), x.weeksText(oa.Weeks&ob.Weeks), ra, rb, need)
			}
		}
	}
	return ""
}

// roomOf is the room of section s's first placement ("" for none).
func (x *studentExplainer) roomOf(s int) string {
	if pls := x.place[s]; len(pls) > 0 {
		return pls[0].Room
	}
	return ""
}

func (x *studentExplainer) weeksText(w timetable.WeekSet) string {
	if w == x.t.AllWeeks() {
		return ""
	}
	return " in weeks " + w.Ranges()
}

// sectionTime describes section s as placed in the timetable.
func (x *studentExplainer) sectionTime(s int) SectionTime {
	sec := &x.t.Sections[s]
	st := SectionTime{Section: sec.ID, Course: sec.Course, Part: sec.Part, Title: sec.Title, Room: x.roomOf(s), Sources: []string{}}
	if src := sec.Src.String(); src != "" {
		st.Sources = append(st.Sources, src)
	}
	var when []string
	for _, pl := range x.place[s] {
		if sec.UsesTimes() && pl.Time >= 1 && pl.Time <= len(sec.Times) {
			tc := &sec.Times[pl.Time-1]
			when = append(when, patternText(x.t, tc))
			if src := tc.Src.String(); src != "" {
				st.Sources = append(st.Sources, src)
			}
		} else {
			for _, o := range x.t.SectionOccurrences(sec, pl) {
				when = append(when, timetable.DayName(o.Day)+" "+o.Start.String()+"-"+o.End.String())
			}
		}
		if src := pl.Src.String(); src != "" {
			st.Sources = append(st.Sources, src)
		}
	}
	st.When = strings.Join(when, ", ")
	if st.When == "" {
		st.When = "not in the timetable"
	}
	return st
}

// request describes request r with its options.
func (x *studentExplainer) request(r int) StudentRequest {
	req := x.reqs[r]
	out := StudentRequest{Course: req.Course, Alternatives: req.Alternatives, Source: req.Src.String(), Options: [][]string{}}
	for _, o := range x.options[r] {
		ids := make([]string, len(o))
		for i, s := range o {
			ids[i] = x.t.Sections[s].ID
		}
		out.Options = append(out.Options, ids)
	}
	return out
}
