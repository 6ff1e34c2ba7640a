package timetable

import (
	"slices"
	"sort"
	"strings"
)

// Violation is one broken requirement found by Check.
type Violation struct {
	// Rule is a short kind: "staff double-booked", "cohort double-booked",
	// "room double-booked", "student double-booked", "section overlaps
	// itself", "capacity", "features", "room not allowed", "unavailable",
	// "fixed meeting", "meetings per week", "meeting length", "same day",
	// "max per day", "max consecutive", "relation", "unknown section",
	// "unknown room", "no room", "outside grid", "meeting time", "travel
	// time", "weekly limit", "lunch break", "seating", "section limit",
	// "not requested".
	Rule string
	// Msg says in plain words who and what is involved, e.g. "Timetable rows
	// 12 and 15: staff Dr Ana Petrović (S-017) teaches BIO-101 and CHE-210
	// at Tue 10:00 (Sections rows 14 and 20; Staff row 18)". The leading
	// timetable rows appear only when the placements were read from a file.
	Msg        string
	Placements []int    // indexes into Schedule.Placements involved, increasing
	Sources    []Source // term rows involved (Sections, Staff, Unavailable, Relations rows ...)
	Hard       bool     // true for a broken hard requirement
}

// Rule names used by Check.
const (
	RuleStaffClash     = "staff double-booked"
	RuleCohortClash    = "cohort double-booked"
	RuleRoomClash      = "room double-booked"
	RuleStudentClash   = "student double-booked"
	RuleSelfOverlap    = "section overlaps itself"
	RuleCapacity       = "capacity"
	RuleFeatures       = "features"
	RuleRoomNotAllowed = "room not allowed"
	RuleUnavailable    = "unavailable"
	RuleFixed          = "fixed meeting"
	RuleMeetings       = "meetings per week"
	RuleLength         = "meeting length"
	RuleSameDay        = "same day"
	RuleMaxPerDay      = "max per day"
	RuleMaxConsecutive = "max consecutive"
	RuleRelation       = "relation"
	RuleUnknownSection = "unknown section"
	RuleUnknownRoom    = "unknown room"
	RuleNoRoom         = "no room"
	RuleOutsideGrid    = "outside grid"
)

// Check is the independent domain verifier: it reads only the Term and the
// Schedule and lists every broken hard requirement (Hard=true) and every
// student clash of fixed or sectioned students (Hard=false: students with
// clashes are a soft criterion). A schedule is acceptable when HardViolations of the
// result is empty.
//
// Hard requirements checked:
//   - every grid section has exactly Meetings placements, numbered
//     1..Meetings without repeats, every pattern section exactly one
//     (Meeting 1, Period -1, Time naming one of its Times), grid placements
//     name no Time, and every placement names a known section;
//   - every grid meeting starts at a period of the grid and fits in one run
//     of consecutive periods (Term.Span);
//   - no staff member, cohort or room is in two meetings of different
//     sections occupying a common period when those sections' week sets
//     overlap; a section's own meetings never overlap each other; where a
//     pattern placement is involved, two Occurrences of different sections
//     never overlap (a common minute of a common day in a common week; grid
//     meetings take their section's weeks);
//   - sections that take a room have a known room, allowed by the section's
//     RoomChoices when given (the exact list) or else its room list, with
//     every needed feature and (unless Term.SoftCapacity) enough seats;
//     no-room sections have no room;
//   - no meeting overlaps a hard Unavailable row of its staff, cohorts, room
//     or section (grid meetings by period, pattern meetings by minute; a row
//     with Weeks only in those weeks);
//   - every Fixed entry is matched by its own meeting at that day and start
//     (and room when given); for a pattern section, by a day of its chosen
//     meeting time;
//   - meetings of a section fall on different days unless SameDay;
//   - staff MaxPerDay (busy periods per day) and MaxConsecutive (longest run
//     of busy consecutive periods), counting grid periods whatever the weeks;
//   - staff MaxWeekPeriods (busy grid periods), MaxWeekMinutes (busy minutes
//     of every meeting) and MaxWeekDays in each teaching week;
//   - Term.Travel: no staff member or cohort has two meetings on a common
//     day in a common week with less free time between them than the travel
//     time between their rooms;
//   - lunch breaks of staff and cohorts: on each day and week they have a
//     meeting, the window holds a free run of the break's minutes;
//   - every hard relation holds as defined in term.go;
//   - the seating rule (Course's doc comment) for the sectioned students
//     (Schedule.Enrolments): see checker.seating.
//
// Student clashes count fixed and sectioned enrolments alike
// (Term.StudentEnrolments).
//
// A zero Section.Weeks is read as every week. The result is sorted: hard
// first, then by first placement, rule and message. Cost is
// O(P + Σ placements·log + clashes + Σ students·k²) for k sections per
// student, plus for pattern terms O(weeks · meetings) for the weekly rules
// and the pair work of each relation.
func Check(t *Term, s *Schedule) []Violation {
	if s == nil {
		s = &Schedule{}
	}
	c := &checker{x: newOccupancy(t, s)}
	c.placements()
	c.meetingCounts()
	c.sameDay()
	c.fixed()
	c.clashes()
	c.patternClashes()
	c.travel()
	c.students()
	c.seating()
	c.unavailable()
	c.staffLimits()
	c.weeklyLimits()
	c.lunch()
	c.relations()
	sortViolations(c.out)
	return c.out
}

// HardViolations returns the violations with Hard set, in the same order.
func HardViolations(vs []Violation) []Violation {
	var out []Violation
	for _, v := range vs {
		if v.Hard {
			out = append(out, v)
		}
	}
	return out
}

// checker accumulates violations over one occupancy index.
type checker struct {
	x   *occupancy
	out []Violation

	seatMatch []int  // seatRequested's matching, reused per student
	seatSeen  []bool // seatRequested's visited requests, reused per student
}

// add records a violation; msg is the sentence without rows, which add
// frames with the timetable rows of the placements and the term sources.
func (c *checker) add(rule string, hard bool, placements []int, sources []Source, msg string) {
	pls := slices.Clone(placements)
	slices.Sort(pls)
	pls = slices.Compact(pls)
	srcs := chkSources(sources)
	var b strings.Builder
	var rows []Source
	for _, i := range pls {
		rows = append(rows, c.x.s.Placements[i].Src)
	}
	if w := chkWhere(rows); w != "" {
		b.WriteString(w)
		b.WriteString(": ")
	}
	b.WriteString(msg)
	if w := chkWhere(srcs); w != "" {
		b.WriteString(" (")
		b.WriteString(w)
		b.WriteString(")")
	}
	c.out = append(c.out, Violation{Rule: rule, Msg: b.String(), Placements: pls, Sources: srcs, Hard: hard})
}

// sortViolations orders hard before soft, then by first placement (those
// with none first), then by rule and message.
func sortViolations(vs []Violation) {
	first := func(v Violation) int {
		if len(v.Placements) == 0 {
			return -1
		}
		return v.Placements[0]
	}
	sort.SliceStable(vs, func(i, j int) bool {
		a, b := vs[i], vs[j]
		if a.Hard != b.Hard {
			return a.Hard
		}
		if fa, fb := first(a), first(b); fa != fb {
			return fa < fb
		}
		if a.Rule != b.Rule {
			return a.Rule < b.Rule
		}
		return a.Msg < b.Msg
	})
}

// chkSources drops zero and repeated sources and sorts by sheet and row.
func chkSources(srcs []Source) []Source {
	var out []Source
	for _, s := range srcs {
		if s.Sheet != "" {
			out = append(out, s)
		}
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Sheet != out[j].Sheet {
			return out[i].Sheet < out[j].Sheet
		}
		return out[i].Row < out[j].Row
	})
	return slices.Compact(out)
}
