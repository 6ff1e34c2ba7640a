package export

import (
	"errors"
	"fmt"
	"sort"
	"strings"
	"sync"
	"time"

	"github.com/termwright/termwright/timetable"
)

// meeting is one placement resolved against its term: everything a writer
// prints about it.
type meeting struct {
	sec   *timetable.Section
	num   int             // 1-based meeting number
	first int             // index of the first period in Term.Periods; -1 for a pattern meeting
	last  int             // index of the last period (first+Length-1); -1 for a pattern meeting
	day   time.Weekday    // day of the meeting
	from  timetable.Clock // start of the first period (or of the chosen pattern)
	to    timetable.Clock // end of the last period (or of the chosen pattern)
	room  *timetable.Room // nil for sections that take no room

	// A pattern placement is one meeting per day of its choice: time is
	// the choice (1-based, 0 for a grid meeting), days all its days and
	// part the index of this day among them (0 for the first day, which
	// stands for the placement on the master sheet).
	time  int
	days  timetable.DaySet
	part  int
	weeks timetable.WeekSet // the section's weeks, or the choice's for a pattern meeting; 0 = every week
	r0    int               // first grid row the meeting covers
	r1    int               // last grid row the meeting covers
}

// pattern reports whether m is one day of a pattern placement.
func (m *meeting) pattern() bool { return m.time > 0 }

// gridRow is one row of a weekly grid: a distinct period time of the term.
type gridRow struct {
	from, to timetable.Clock
}

// view is a Term and Schedule resolved once for all writers. meetings are
// sorted by start period (so by day and time), section ID and meeting
// number; the by* maps hold indexes into meetings in that order.
type view struct {
	t         *timetable.Term
	s         *timetable.Schedule // the timetable resolved, for the rules timetable judges (travel clashes)
	meetings  []meeting
	staff     map[string]*timetable.Staff
	rooms     map[string]*timetable.Room
	cohorts   map[string]*timetable.Cohort
	byStaff   map[string][]int
	byRoom    map[string][]int
	byCohort  map[string][]int
	byStudent map[string][]int
	students  []string // distinct enrolled student IDs (fixed and sectioned), sorted
	// enrolments are every student's sections: the term's fixed
	// enrolments, then the timetable's sectioned ones
	// (Term.StudentEnrolments).
	enrolments []timetable.Enrolment
	sectioned  []timetable.Enrolment // the timetable's own (Schedule.Enrolments)
	// classStudents are the students of each section for class lists,
	// made once by sectionStudents.
	classOnce     sync.Once
	classStudents map[string][]classStudent
	days          []time.Weekday
	dayCol        [7]int    // weekday -> grid column, -1 when the day has no periods
	rows          []gridRow // distinct period times sorted by start, then end
	rowOf         []int     // period index -> grid row
	has           [][]bool  // [row][column]: that day has a period at that time
	allWeeks      timetable.WeekSet
	minutes       bool          // the grid rows come from pattern times too: rows are drawn to scale (see buildGrid)
	cal           *calendarInfo // time zone and dates, made on first use by calendar()
}

// maxViewErrors bounds how many placement problems one error lists.
const maxViewErrors = 20

// newView resolves s against t. It fails, naming every bad placement (up to
// maxViewErrors), when a placement refers to an unknown section or room or
// does not fit the grid.
func newView(t *timetable.Term, s *timetable.Schedule) (*view, error) {
	if t == nil || s == nil {
		return nil, errors.New("there is nothing to publish: no term or no timetable was given")
	}
	v := &view{
		t:          t,
		s:          s,
		staff:      make(map[string]*timetable.Staff, len(t.Staff)),
		rooms:      make(map[string]*timetable.Room, len(t.Rooms)),
		cohorts:    make(map[string]*timetable.Cohort, len(t.Cohorts)),
		byStaff:    map[string][]int{},
		byRoom:     map[string][]int{},
		byCohort:   map[string][]int{},
		byStudent:  map[string][]int{},
		allWeeks:   t.AllWeeks(),
		enrolments: t.StudentEnrolments(s),
		sectioned:  s.Enrolments,
	}
	for i := range t.Staff {
		v.staff[t.Staff[i].ID] = &t.Staff[i]
	}
	for i := range t.Rooms {
		v.rooms[t.Rooms[i].ID] = &t.Rooms[i]
	}
	for i := range t.Cohorts {
		v.cohorts[t.Cohorts[i].ID] = &t.Cohorts[i]
	}
	if err := v.resolve(s); err != nil {
		return nil, err
	}
	if v.minutes {
		v.buildTimeGrid()
	} else {
		v.buildGrid()
	}
	for i := range v.meetings {
		v.placeRows(&v.meetings[i])
	}
	v.index()
	return v, nil
}

// buildGrid fills days, dayCol, rows, rowOf and has from the term's periods.
func (v *view) buildGrid() {
	for i := range v.dayCol {
		v.dayCol[i] = -1
	}
	v.days = v.t.Days()
	sort.SliceStable(v.days, func(i, j int) bool {
		return timetable.WeekOrder(v.days[i]) < timetable.WeekOrder(v.days[j])
	})
	for c, d := range v.days {
		v.dayCol[d] = c
	}
	seen := map[gridRow]bool{}
	for _, p := range v.t.Periods {
		r := gridRow{p.Start, p.End}
		if !seen[r] {
			seen[r] = true
			v.rows = append(v.rows, r)
		}
	}
	sort.Slice(v.rows, func(i, j int) bool {
		if v.rows[i].from != v.rows[j].from {
			return v.rows[i].from < v.rows[j].from
		}
		return v.rows[i].to < v.rows[j].to
	})
	at := make(map[gridRow]int, len(v.rows))
	for i, r := range v.rows {
		at[r] = i
	}
	v.rowOf = make([]int, len(v.t.Periods))
	v.has = make([][]bool, len(v.rows))
	for i := range v.has {
		v.has[i] = make([]bool, len(v.days))
	}
	for i, p := range v.t.Periods {
		r := at[gridRow{p.Start, p.End}]
		v.rowOf[i] = r
		v.has[r][v.dayCol[p.Day]] = true
	}
}

// resolve turns placements into meetings, collecting every problem.
func (v *view) resolve(s *timetable.Schedule) error {
	secIdx := v.t.SectionIndex()
	var errs []error
	bad := func(p timetable.Placement, format string, args ...any) {
		if len(errs) < maxViewErrors {
			where := ""
			if p.Src.Sheet != "" {
				where = p.Src.String() + ": "
			}
			errs = append(errs, fmt.Errorf("%ssection %q meeting %d: %s", where, p.Section, p.Meeting, fmt.Sprintf(format, args...)))
		}
	}
	v.meetings = make([]meeting, 0, len(s.Placements))
	for _, p := range s.Placements {
		si, ok := secIdx[p.Section]
		if !ok {
			bad(p, "no such section in the term; fix the Section column or the term workbook")
			continue
		}
		sec := &v.t.Sections[si]
		if sec.UsesTimes() {
			ms, ok := v.patternMeetings(p, sec, bad)
			if ok {
				v.meetings = append(v.meetings, ms...)
				v.minutes = true
			}
			continue
		}
		length := max(sec.Length, 1)
		span, ok := v.t.Span(p.Period, length)
		if !ok {
			bad(p, "a meeting of %d period(s) starting at period %d does not fit the weekly grid; place it where its periods follow each other on one day", length, p.Period)
			continue
		}
		m := meeting{sec: sec, num: p.Meeting, first: span[0], last: span[len(span)-1], weeks: sec.Weeks}
		m.day = v.t.Periods[m.first].Day
		m.from = v.t.Periods[m.first].Start
		m.to = v.t.Periods[m.last].End
		if p.Room != "" {
			r, ok := v.rooms[p.Room]
			if !ok {
				bad(p, "room %q is not in the term's Rooms sheet; use a listed room", p.Room)
				continue
			}
			m.room = r
		}
		v.meetings = append(v.meetings, m)
	}
	if len(errs) > 0 {
		return fmt.Errorf("the timetable does not fit its term workbook:\n%w", errors.Join(errs...))
	}
	if v.minutes {
		sort.SliceStable(v.meetings, func(i, j int) bool { return clockOrder(&v.meetings[i], &v.meetings[j]) })
		return nil
	}
	sort.SliceStable(v.meetings, func(i, j int) bool {
		a, b := &v.meetings[i], &v.meetings[j]
		if a.first != b.first {
			return a.first < b.first
		}
		if a.sec.ID != b.sec.ID {
			return a.sec.ID < b.sec.ID
		}
		return a.num < b.num
	})
	return nil
}

// index fills the by* maps and the student list (fixed and sectioned
// enrolments).
func (v *view) index() {
	bySection := map[string][]int{}
	for i, m := range v.meetings {
		bySection[m.sec.ID] = append(bySection[m.sec.ID], i)
		for _, id := range uniq(m.sec.Staff) {
			v.byStaff[id] = append(v.byStaff[id], i)
		}
		for _, id := range uniq(m.sec.Cohorts) {
			v.byCohort[id] = append(v.byCohort[id], i)
		}
		if m.room != nil {
			v.byRoom[m.room.ID] = append(v.byRoom[m.room.ID], i)
		}
	}
	taken := map[string]map[string]bool{}
	for _, e := range v.enrolments {
		if taken[e.Student] == nil {
			taken[e.Student] = map[string]bool{}
			v.students = append(v.students, e.Student)
		}
		if taken[e.Student][e.Section] {
			continue
		}
		taken[e.Student][e.Section] = true
		v.byStudent[e.Student] = append(v.byStudent[e.Student], bySection[e.Section]...)
	}
	sort.Strings(v.students)
	for _, list := range v.byStudent {
		sort.Ints(list)
	}
}

func uniq(ids []string) []string {
	if len(ids) < 2 {
		return ids
	}
	out := make([]string, 0, len(ids))
	for i, id := range ids {
		dup := false
		for _, prev := range ids[:i] {
			if prev == id {
				dup = true
				break
			}
		}
		if !dup {
			out = append(out, id)
		}
	}
	return out
}

// of returns the meetings (indexes into v.meetings) of a subject, and an
// error when the subject is not in the term.
func (v *view) of(who Subject) ([]int, error) {
	switch who.Kind {
	case timetable.WhoStaff:
		if v.staff[who.ID] == nil {
			return nil, fmt.Errorf("there is no staff member %q in the term; use an ID from the Staff sheet", who.ID)
		}
		return v.byStaff[who.ID], nil
	case timetable.WhoRoom:
		if v.rooms[who.ID] == nil {
			return nil, fmt.Errorf("there is no room %q in the term; use an ID from the Rooms sheet", who.ID)
		}
		return v.byRoom[who.ID], nil
	case timetable.WhoCohort:
		if v.cohorts[who.ID] == nil {
			return nil, fmt.Errorf("there is no cohort %q in the term; use an ID from the Cohorts sheet", who.ID)
		}
		return v.byCohort[who.ID], nil
	case WhoStudent:
		if _, ok := v.byStudent[who.ID]; !ok {
			return nil, fmt.Errorf("there is no student %q on the Enrolments sheet or the timetable's class lists; use a student ID from them", who.ID)
		}
		return v.byStudent[who.ID], nil
	}
	return nil, fmt.Errorf("a timetable can be published for a staff member, room, cohort or student, not for a %s", kindWord(who.Kind))
}

// title is the display name of a subject: "Name (ID)", "Room R204", ...
func (v *view) title(who Subject) string {
	switch who.Kind {
	case timetable.WhoStaff:
		if s := v.staff[who.ID]; s != nil && s.Name != "" && s.Name != s.ID {
			return s.Name + " (" + s.ID + ")"
		}
	case timetable.WhoRoom:
		return "Room " + who.ID
	case timetable.WhoCohort:
		if c := v.cohorts[who.ID]; c != nil && c.Name != "" && c.Name != c.ID {
			return c.Name + " (" + c.ID + ")"
		}
	case WhoStudent:
		return "Student " + who.ID
	}
	return who.ID
}

// detail is a one-line description of a subject for headers: email, room
// building and seats, cohort size.
func (v *view) detail(who Subject) string {
	var parts []string
	switch who.Kind {
	case timetable.WhoStaff:
		parts = append(parts, "Staff timetable")
		if s := v.staff[who.ID]; s != nil && s.Email != "" {
			parts = append(parts, s.Email)
		}
	case timetable.WhoRoom:
		parts = append(parts, "Room timetable")
		if r := v.rooms[who.ID]; r != nil {
			if r.Building != "" {
				parts = append(parts, r.Building)
			}
			if r.Capacity > 0 {
				parts = append(parts, fmt.Sprintf("%d seats as entered", r.Capacity))
			}
			if len(r.Features) > 0 {
				parts = append(parts, strings.Join(r.Features, ", "))
			}
		}
	case timetable.WhoCohort:
		parts = append(parts, "Cohort timetable")
		if c := v.cohorts[who.ID]; c != nil && c.Size > 0 {
			parts = append(parts, fmt.Sprintf("%d students", c.Size))
		}
	case WhoStudent:
		parts = append(parts, "Student timetable")
	}
	return strings.Join(parts, " · ")
}

// staffNames lists the display names of a section's staff (IDs when the
// name is unknown).
func (v *view) staffNames(sec *timetable.Section) []string {
	out := make([]string, 0, len(sec.Staff))
	for _, id := range sec.Staff {
		if s := v.staff[id]; s != nil && s.Name != "" {
			out = append(out, s.Name)
		} else {
			out = append(out, id)
		}
	}
	return out
}

// weeks is the label of a meeting's weeks on grids: "wks 1-6, 9", "odd
// weeks", "even weeks", or "" when it meets every teaching week.
func (v *view) weeks(m *meeting) string { return v.weeksLabel(m.weeks) }

// weeksLabel is weeks as grids label them (see weeks); "" for every week.
func (v *view) weeksLabel(w timetable.WeekSet) string {
	switch r := v.weekRangesOf(w); r {
	case "":
		return ""
	case "odd", "even":
		return r + " weeks"
	default:
		return "wks " + r
	}
}

// weekRanges is a meeting's weeks (its section's, or its pattern's) as
// lists and tables show them: "1-6, 9", "odd" or "even" (as on the
// Sections sheet), or "" when it meets every teaching week.
func (v *view) weekRanges(m *meeting) string { return v.weekRangesOf(m.weeks) }

// weekRangesOf is weekRanges for a set of weeks (0 = every week).
func (v *view) weekRangesOf(w timetable.WeekSet) string {
	if w == 0 || w&v.allWeeks == v.allWeeks {
		return ""
	}
	if t := v.t.WeeksText(w & v.allWeeks); t == "odd" || t == "even" {
		return t
	}
	return (w & v.allWeeks).Ranges()
}

// roomText is "R204, Main Building" (or "" for no room).
func roomText(r *timetable.Room) string {
	if r == nil {
		return ""
	}
	if r.Building == "" {
		return r.ID
	}
	return r.ID + ", " + r.Building
}

// dateText formats a date as "6 Sep 2027".
func dateText(d time.Time) string { return d.Format("2 Jan 2006") }

// termDates is "6 Sep 2027 – 17 Dec 2027".
func termDates(t *timetable.Term) string {
	if t.FirstDay.IsZero() {
		return ""
	}
	return dateText(t.FirstDay) + " – " + dateText(t.LastDay)
}
