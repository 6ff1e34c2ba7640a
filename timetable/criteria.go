package timetable

// Criterion describes one soft criterion: its name as written in the Weights
// sheet, its default weight and priority level, and its definition. The
// definitions below are the contract shared by Cost (which evaluates them on
// a Schedule) and the encoder (which writes them as weak constraints); the
// two must agree to the unit. A weight of 0 switches a criterion off.
// Higher levels are minimised first (lexicographically).
type Criterion struct {
	Name   string
	Weight int
	Level  int
	Doc    string // one-line definition in plain words
}

// Names of the soft criteria (the Criterion column of the Weights sheet).
const (
	CritMoved          = "moved meetings"
	CritStudentClash   = "student clashes"
	CritAvoidTimes     = "avoid times"
	CritStaffGaps      = "staff gaps"
	CritStaffDays      = "staff days"
	CritCohortGaps     = "cohort gaps"
	CritCohortIsolated = "cohort isolated"
	CritSpreadDays     = "spread days"
	CritRoomStability  = "room stability"
	CritOverCapacity   = "room over capacity"
	CritWastedSeats    = "wasted seats"
	CritTravel         = "travel"
	CritEarly          = "early periods"
	CritLate           = "late periods"
	CritSoftRelations  = "soft relations"
	CritTimeChoice     = "time choice"
	CritRoomChoice     = "room choice"
	CritUnplaced       = "unplaced requests"
	CritMovedStudents  = "moved students"
)

// Criteria lists every soft criterion with its defaults. Unless a
// definition says otherwise, "busy(x, p)" means that some meeting involving
// x (a staff member, cohort, room or student through their sections) occupies
// period p; "day" means the periods of one weekday in grid order.
var Criteria = []Criterion{
	{CritMoved, 1, 3, "per meeting of the kept timetable (--keep) that no meeting of its section holds any more at its day, start time and room (for a pattern section: its meeting time and room; meetings a section no longer has count too)"},
	{CritStudentClash, 1, 2, "per student, per pair of that student's sections (fixed and sectioned enrolments) whose week sets overlap, per period both occupy; when either section uses meeting patterns, 1 per student for the pair when some meetings of the two share a minute of a common day in a common week, or meet on a common day in a common week with less free time between them than the travel time between their rooms"},
	{CritAvoidTimes, 1, 1, "for each soft Unavailable row (weight w), w per occupied period of a grid meeting involving its staff/room/cohort/section that overlaps the row's time, and w per day of a chosen meeting pattern involving them that overlaps it; a row naming weeks counts only meetings in a common week; the criterion weight multiplies w"},
	{CritStaffGaps, 1, 1, "per staff member and day, number of periods not busy that lie between their first and last busy period of that day (grid meetings only: pattern meetings occupy no periods)"},
	{CritStaffDays, 0, 1, "per staff member, number of days with at least one busy period (grid meetings only)"},
	{CritCohortGaps, 1, 1, "per cohort and day, number of periods not busy between its first and last busy period of that day (grid meetings only)"},
	{CritCohortIsolated, 1, 1, "per cohort, per busy period p where neither the period right before p nor right after p (consecutive, same day) is busy for that cohort (grid meetings only)"},
	{CritSpreadDays, 5, 1, "per section with SameDay and MinDays > 0: MinDays minus the number of distinct days its meetings use, when positive"},
	{CritRoomStability, 1, 1, "per section that takes rooms: number of distinct rooms used by its meetings minus 1"},
	{CritOverCapacity, 1, 1, "only when SoftCapacity: per meeting (a pattern section's one placement counts once), students over the room's capacity (Size - Capacity when positive)"},
	{CritWastedSeats, 0, 0, "per meeting (a pattern section's one placement counts once), empty seats (Capacity - Size when positive)"},
	{CritTravel, 1, 1, "per staff member or cohort, per pair of their meetings in consecutive periods of one day held in rooms of different non-empty buildings (grid meetings only; the travel times between rooms are a hard rule for every meeting)"},
	{CritEarly, 0, 0, "per grid meeting that occupies the first period of its day"},
	{CritLate, 0, 0, "per grid meeting that occupies the last period of its day"},
	{CritSoftRelations, 1, 1, "for each soft Relation row (weight w), w when the relation is broken, once however many pairs break it (for the counted kinds at most days, at most minutes a day, at most breaks and longest block: the cost the kind defines); the criterion weight multiplies w"},
	{CritTimeChoice, 1, 1, "per pattern section, the Weight of its chosen meeting time; the criterion weight multiplies it"},
	{CritRoomChoice, 1, 1, "per meeting of a section with room choices (a pattern section's one placement counts once), the Weight of its room; the criterion weight multiplies it"},
	{CritUnplaced, 1, 4, "per course request (Term.Requests) for which the student is placed neither in its course nor in any of its alternatives"},
	{CritMovedStudents, 1, 3, "per sectioned enrolment (student, section) of the kept timetable (--keep) whose student is still placed in that section's course but no longer in that section"},
}

// CriterionWeight returns the weight and level of criterion name for term t:
// the Weights sheet entry when present, otherwise the default. The
// sectioning criteria (unplaced requests, moved students) have no default
// weight in a term without course requests (CriterionApplies), so such a
// term is judged, and reported, exactly as before they existed.
func (t *Term) CriterionWeight(name string) (weight, level int) {
	if w, ok := t.Weights[name]; ok {
		return w.Weight, w.Level
	}
	for _, c := range Criteria {
		if c.Name == name {
			if !t.CriterionApplies(name) {
				return 0, c.Level
			}
			return c.Weight, c.Level
		}
	}
	return 0, 0
}

// CriterionApplies reports whether criterion name can count in t: the
// sectioning criteria only where students request courses or the Weights
// sheet names them. Reports list only the criteria that apply, so that a
// term without requests reads as it did before sectioning existed.
func (t *Term) CriterionApplies(name string) bool {
	if name != CritUnplaced && name != CritMovedStudents || len(t.Requests) > 0 {
		return true
	}
	_, named := t.Weights[name]
	return named
}
