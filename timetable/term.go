package timetable

import (
	"strings"
	"time"
)

// Clock is a time of day in minutes after midnight (09:00 is 540).
type Clock int

// String formats the clock as HH:MM.
func (c Clock) String() string {
	return twoDigits(int(c)/60) + ":" + twoDigits(int(c)%60)
}

func twoDigits(n int) string {
	return string([]byte{byte('0' + n/10%10), byte('0' + n%10)})
}

// Source says where a record came from: a sheet (or CSV file stem) and a
// 1-based spreadsheet row, the header being row 1. The zero Source means the
// record was made in code.
type Source struct {
	Sheet string // sheet name as the registrar sees it, e.g. "Sections"
	Row   int    // 1-based row; 0 when unknown
}

// String gives the place's text form (see Position): "Sections row 14",
// "Sections" without a row, "" when unknown.
func (s Source) String() string { return Position{Sheet: s.Sheet, Row: s.Row}.String() }

// Period is one slot of the weekly grid. Term.Periods is sorted by day
// (Monday first) and start time, and Period.Index is the position in it.
type Period struct {
	Index int          // position in Term.Periods
	Day   time.Weekday // day of the week
	Start Clock        // start time
	End   Clock        // end time, after Start
	Src   Source       // Periods sheet row
}

// Label is the short human label "Tue 10:00".
func (p Period) Label() string { return DayName(p.Day) + " " + p.Start.String() }

// Room is a teaching space.
type Room struct {
	ID       string   // unique room code, e.g. "R204"
	Capacity int      // seats; must not exceed the posted legal occupancy
	Features []string // lower-case features, e.g. "lab", "projector", "step-free"
	Building string   // building name or code; "" when unknown
	Src      Source
}

// HasFeatures reports whether the room has every feature in needs
// (compared without regard to case).
func (r *Room) HasFeatures(needs []string) bool {
	for _, n := range needs {
		found := false
		for _, f := range r.Features {
			if strings.EqualFold(f, n) {
				found = true
				break
			}
		}
		if !found {
			return false
		}
	}
	return true
}

// Staff is an instructor or other member of staff who teaches sections.
type Staff struct {
	ID             string // unique staff ID
	Name           string // display name
	Email          string // optional
	MaxPerDay      int    // maximum teaching periods per day; 0 = no limit
	MaxConsecutive int    // maximum consecutive teaching periods; 0 = no limit
	// Weekly limits for part-time contracts (hard), per teaching week; 0 =
	// no limit. Periods count grid periods, minutes count every meeting.
	MaxWeekPeriods int
	MaxWeekMinutes int
	MaxWeekDays    int        // distinct days with a meeting
	Lunch          LunchBreak // guaranteed free time around midday (hard)
	Src            Source
}

// Cohort is a group of students who must never have two classes at once.
type Cohort struct {
	ID    string
	Name  string
	Size  int        // number of students; 0 when unknown
	Lunch LunchBreak // guaranteed free time around midday (hard)
	Src   Source
}

// WeekSet is a set of teaching weeks: bit i-1 set means teaching week i
// (week 1 is the week containing Term.FirstDay). Teaching weeks are at most 64.
type WeekSet uint64

// Overlaps reports whether two week sets share a week.
func (w WeekSet) Overlaps(o WeekSet) bool { return w&o != 0 }

// Has reports whether teaching week n (1-based) is in the set.
func (w WeekSet) Has(n int) bool { return n >= 1 && n <= 64 && w&(1<<(n-1)) != 0 }

// Fixed is a pre-assignment of one meeting of a section, e.g. "Tue 10:00 R204".
type Fixed struct {
	Day   time.Weekday
	Start Clock
	Room  string // "" when only the time is fixed
	Text  string // the text as written in the workbook
}

// Section is a class that meets Meetings times a week for Length consecutive
// periods each time on the period grid, or, when Times is given, at one of
// its acceptable meeting patterns (then Meetings is 1 and Length unused).
type Section struct {
	ID       string
	Title    string
	Staff    []string // staff IDs, all of whom attend every meeting
	Cohorts  []string // cohort IDs, all of whom attend every meeting
	Size     int      // expected number of students
	Meetings int      // meetings per week, >= 1
	Length   int      // periods per meeting, >= 1
	Needs    []string // room features required (lower case); never contains the no-room marker
	Rooms    []string // allowed rooms; empty = any room that fits
	NoRoom   bool     // online or off-site: takes no room
	Fixed    []Fixed  // pre-assigned meetings (at most Meetings of them)
	Weeks    WeekSet  // teaching weeks this section meets; Term.AllWeeks() when "all"
	SameDay  bool     // meetings may share a day; default false: meetings fall on different days (hard)
	MinDays  int      // when SameDay: wanted number of distinct days (soft, criterion "spread days"); 0 = none
	// Times lists the acceptable meeting patterns; empty for a grid section.
	Times []TimeChoice
	// RoomChoices, when given, is the exact list of acceptable rooms with
	// their preference penalties (it replaces Rooms; capacity and features
	// still hold). Empty means Rooms / any room that fits.
	RoomChoices []RoomChoice
	// Sectioning: students ask for courses (Term.Requests) and the
	// sectioner places each in one section of every part of one
	// arrangement of the course (see Term.Courses and the seating rule
	// there). Empty Course: the section is not requested (its students
	// come from Enrolments and Cohorts).
	Course      string // the course this section teaches, as students request it
	Arrangement string // the course's arrangement of parts it belongs to; "" = the course's only arrangement
	Part        string // its part of the arrangement (e.g. "Lab"); "" = the arrangement's only part
	Parent      string // a section every student of this one also attends ("" none): same course and arrangement, another part
	Limit       int    // most students in it, fixed enrolments included; 0 = Size
	Src         Source
}

// WhoKind says what an unavailability or relation refers to.
type WhoKind int

// The kinds of things an Unavailable row can name.
const (
	WhoStaff WhoKind = iota + 1
	WhoRoom
	WhoCohort
	WhoSection
)

// String names the kind in plain words ("staff", "room", "cohort", "section").
func (k WhoKind) String() string {
	switch k {
	case WhoStaff:
		return "staff"
	case WhoRoom:
		return "room"
	case WhoCohort:
		return "cohort"
	case WhoSection:
		return "section"
	}
	return "unknown"
}

// Unavailability is a time when someone or something cannot (Hard) or would
// rather not (Weight > 0) be scheduled. A period is affected when it overlaps
// [From, To) on Day.
type Unavailability struct {
	Who    string
	Kind   WhoKind
	Day    time.Weekday
	From   Clock
	To     Clock
	Hard   bool // true: must not be scheduled; false: a preference with Weight
	Weight int  // penalty per affected meeting period when not Hard
	Reason string
	// Weeks limits the row to these teaching weeks; 0 means every week.
	// Grid meetings are affected when their section's weeks meet Weeks.
	Weeks WeekSet
	Src   Source
}

// Covers reports whether period p overlaps this unavailability.
func (u Unavailability) Covers(p Period) bool {
	return p.Day == u.Day && p.Start < u.To && u.From < p.End
}

// RelationKind is the kind of a relation between sections.
type RelationKind int

// The relation kinds of the Relations sheet. Each definition is the
// contract for the encoder and for Check ("occupies" counts every period of a
// multi-period meeting; week sets are ignored by relations unless the
// definition names weeks). "Meeting" means an Occurrence: a grid meeting, or
// one day of a chosen meeting pattern. The first seven kinds keep their grid
// wording; for pattern sections read "start period" as (day, start time) and
// "grid index" as (day in week order, time). Kinds marked "pairwise" hold
// for every pair of different listed sections; a soft relation costs its
// Weight once when broken, except the four kinds marked "counted", which
// cost what their definitions say (Weight times a count; the three per-week
// kinds divide Weight times their excess by the teaching weeks at the end).
const (
	SameTime      RelationKind = iota + 1 // all listed sections have the same set of start periods (validation: same Meetings and Length)
	NotSameTime                           // no two listed sections occupy a common period
	DifferentDays                         // no two listed sections meet on a common day
	SameDayRel                            // all listed sections meet on the same set of days
	Before                                // for each consecutive pair (A, B) in the list: every period A occupies has a lower grid index than every start of B
	BackToBack                            // for each consecutive pair (A, B): every meeting of B starts in the period right after (consecutive, same day) the last period of some meeting of A
	SameRoom                              // all meetings of all listed sections use one room

	SameStart      // all meetings of all listed sections start at one time of day
	WithinHours    // pairwise: for each two meetings of the pair, the start-to-end hours of one lie within the other's (days and weeks ignored)
	DifferentHours // pairwise: no two meetings of the pair overlap in time of day (days and weeks ignored)
	DaysWithin     // pairwise: the days one section meets are all among the other's days
	WeeksWithin    // pairwise: the teaching weeks one section meets are all among the other's
	DifferentWeeks // pairwise: no common teaching week
	OverlapRel     // pairwise: some meeting of one shares a minute of a common day in a common week with a meeting of the other
	NoOverlap      // pairwise: no meeting of one shares a minute of a common day in a common week with a meeting of the other
	DifferentRooms // pairwise: no room is used by both
	SamePeople     // pairwise: no overlap (as NoOverlap), and any two meetings on a common day in a common week leave at least Term.TravelMinutes between their rooms between the end of the earlier and the start of the later
	FirstBefore    // for each consecutive pair (A, B): A's first week is earlier than B's; or equal and A's first day (week order) is earlier; or equal too and A's meeting that day ends no later than B's meeting that day starts
	DaySpan        // pairwise: any two meetings on a common day in a common week lie within N minutes (latest end minus earliest start <= N)
	MinGap         // pairwise: any two meetings on a common day in a common week have at least N free minutes between them
	MaxDays        // counted: the listed sections together meet on at most N distinct weekdays (weeks ignored); count = days over N
	MaxDayMinutes  // counted: in every teaching week, every day's meetings of the listed sections total at most N minutes; cost = Weight x (sum over weeks and days of the minutes over N, in 5-minute steps, rounded down) / the term's teaching weeks, rounded down after multiplying
	MaxBreaks      // counted: in every teaching week and day, the listed sections' meetings form at most N+1 blocks (a meeting starting at most M minutes after a block's end joins it); cost = Weight x (sum over weeks and days of the blocks over N+1) / the teaching weeks, rounded down after multiplying
	MaxBlock       // counted: in every teaching week and day, no block (as in MaxBreaks, M minutes) of two or more meetings lasts more than N minutes from first start to last end; cost = Weight x (number of such blocks over weeks and days) / the teaching weeks, rounded down after multiplying; a lone meeting longer than N is no block
)

// RelationKinds lists every kind with its workbook spelling, in sheet order.
var RelationKinds = []struct {
	Kind RelationKind
	Name string
}{
	{SameTime, "same time"},
	{NotSameTime, "not same time"},
	{DifferentDays, "different days"},
	{SameDayRel, "same day"},
	{Before, "before"},
	{BackToBack, "back to back"},
	{SameRoom, "same room"},
	{SameStart, "same start"},
	{WithinHours, "within hours"},
	{DifferentHours, "different hours"},
	{DaysWithin, "days within"},
	{WeeksWithin, "weeks within"},
	{DifferentWeeks, "different weeks"},
	{OverlapRel, "overlap"},
	{NoOverlap, "no overlap"},
	{DifferentRooms, "different rooms"},
	{SamePeople, "same people"},
	{FirstBefore, "first before"},
	{DaySpan, "day span"},
	{MinGap, "minimum gap"},
	{MaxDays, "at most days"},
	{MaxDayMinutes, "at most minutes a day"},
	{MaxBreaks, "at most breaks"},
	{MaxBlock, "longest block"},
}

// OnGrid reports whether the kind is one of the first seven, defined on the
// period grid (the others are defined on meetings by clock time). The zero
// kind, which Validate refuses, counts as a grid kind.
func (k RelationKind) OnGrid() bool { return k <= SameRoom }

// Counted reports whether a soft relation of this kind costs its weight
// times a count (see the kind's definition) rather than once.
func (k RelationKind) Counted() bool {
	return k == MaxDays || k == MaxDayMinutes || k == MaxBreaks || k == MaxBlock
}

// Params says how many numbers (N, then M) a relation of this kind takes.
func (k RelationKind) Params() int {
	switch k {
	case DaySpan, MinGap, MaxDays, MaxDayMinutes:
		return 1
	case MaxBreaks, MaxBlock:
		return 2
	}
	return 0
}

// String gives the workbook spelling of the kind.
func (k RelationKind) String() string {
	for _, r := range RelationKinds {
		if r.Kind == k {
			return r.Name
		}
	}
	return "unknown"
}

// Relation ties two or more sections together.
type Relation struct {
	Kind     RelationKind
	Sections []string
	Hard     bool // true unless a weight was given
	Weight   int  // penalty when broken and not Hard
	N, M     int  // the kind's numbers (minutes or days), see RelationKind.Params
	Src      Source
}

// Enrolment puts one student in one section.
type Enrolment struct {
	Student string
	Section string
	Src     Source
}

// Request is one student's request for a course. It is met when the
// student is placed in Course or, failing that, in one of Alternatives.
type Request struct {
	Student      string
	Course       string
	Alternatives []string // courses taken instead, most wanted first, when Course cannot be placed
	// Priority orders who gets scarce places first: 1 is the most
	// important; 0 (not given) comes after every number.
	Priority int
	Src      Source
}

// Term is one academic term: everything needed to build and judge a
// timetable. Readers return a validated Term; code that builds a Term by hand
// should call Validate.
type Term struct {
	Name        string
	FirstDay    time.Time // date (midnight UTC) of the first teaching day
	LastDay     time.Time // date (midnight UTC) of the last teaching day
	TimeZone    string    // IANA name, e.g. "Europe/Dublin"
	Holidays    []time.Time
	Periods     []Period
	Rooms       []Room
	Staff       []Staff
	Cohorts     []Cohort
	Sections    []Section
	Enrolments  []Enrolment // students fixed to sections (never moved by the sectioner)
	Requests    []Request   // students' course requests, placed by the sectioner
	Unavailable []Unavailability
	Relations   []Relation
	// Travel holds travel times between rooms or buildings. Staff and
	// cohorts never have two meetings on a common day in a common week with
	// less free time between them than the travel time between their rooms
	// (hard).
	Travel  []Travel
	Weights map[string]Weight // soft criterion name -> weight and level (see Criteria)
	// SoftCapacity makes room capacity a preference (criterion "room over
	// capacity") instead of a hard requirement. Features stay hard.
	SoftCapacity bool
	// Columns lists the column renames the reader applied (the Columns
	// sheet, Columns.csv or WithColumns), in workbook order, for `check`
	// to print; nil when none applied.
	Columns []ColumnRename
}

// Weight is the weight of a soft criterion and its priority level (higher
// levels are minimised first).
type Weight struct {
	Weight int
	Level  int
	Src    Source
}

// TeachingWeeks is the number of calendar weeks from FirstDay to LastDay
// (week 1 contains FirstDay), at least 1 and at most 64.
func (t *Term) TeachingWeeks() int {
	if t.FirstDay.IsZero() || t.LastDay.Before(t.FirstDay) {
		return 1
	}
	start := mondayOf(t.FirstDay)
	n := int(t.LastDay.Sub(start).Hours()/24)/7 + 1
	if n > 64 {
		n = 64
	}
	return n
}

// AllWeeks is the week set holding every teaching week.
func (t *Term) AllWeeks() WeekSet {
	n := t.TeachingWeeks()
	if n >= 64 {
		return ^WeekSet(0)
	}
	return WeekSet(1)<<n - 1
}

func mondayOf(d time.Time) time.Time {
	off := (int(d.Weekday()) + 6) % 7
	return d.AddDate(0, 0, -off)
}

// Span returns the indexes of the periods a meeting of length periods
// starting at period start occupies, and false when the meeting would cross a
// gap, a day boundary or the end of the grid.
func (t *Term) Span(start, length int) ([]int, bool) {
	if start < 0 || length < 1 || start+length > len(t.Periods) {
		return nil, false
	}
	out := make([]int, 0, length)
	for i := start; i < start+length; i++ {
		if i > start && !t.Consecutive(i-1, i) {
			return nil, false
		}
		out = append(out, i)
	}
	return out, true
}

// Consecutive reports whether period b immediately follows period a on the
// same day with no gap (a.End == b.Start).
func (t *Term) Consecutive(a, b int) bool {
	pa, pb := t.Periods[a], t.Periods[b]
	return pa.Day == pb.Day && pa.End == pb.Start
}

// SectionIndex maps section IDs to positions in Sections.
func (t *Term) SectionIndex() map[string]int {
	return indexBy(t.Sections, func(s Section) string { return s.ID })
}

// RoomIndex maps room IDs to positions in Rooms.
func (t *Term) RoomIndex() map[string]int {
	return indexBy(t.Rooms, func(r Room) string { return r.ID })
}

// StaffIndex maps staff IDs to positions in Staff.
func (t *Term) StaffIndex() map[string]int {
	return indexBy(t.Staff, func(s Staff) string { return s.ID })
}

// CohortIndex maps cohort IDs to positions in Cohorts.
func (t *Term) CohortIndex() map[string]int {
	return indexBy(t.Cohorts, func(c Cohort) string { return c.ID })
}

// PeriodAt returns the index of the period on day starting at start, or -1.
func (t *Term) PeriodAt(day time.Weekday, start Clock) int {
	for i, p := range t.Periods {
		if p.Day == day && p.Start == start {
			return i
		}
	}
	return -1
}

func indexBy[T any](xs []T, key func(T) string) map[string]int {
	m := make(map[string]int, len(xs))
	for i, x := range xs {
		if _, dup := m[key(x)]; !dup {
			m[key(x)] = i
		}
	}
	return m
}

// Days lists the distinct days of the grid in week order (Monday first).
func (t *Term) Days() []time.Weekday {
	var out []time.Weekday
	for _, p := range t.Periods {
		if len(out) == 0 || out[len(out)-1] != p.Day {
			out = append(out, p.Day)
		}
	}
	return out
}
