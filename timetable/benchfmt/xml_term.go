package benchfmt

import (
	"time"

	"github.com/termwright/termwright/timetable"
)

// xmlSlot is the length of a slot of the ITC-2019 format in minutes.
const xmlSlot = 5

// xmlFirstDay is the Monday the mapped terms start on (the format has no
// dates; any Monday gives the same weeks).
var xmlFirstDay = time.Date(2024, time.January, 1, 0, 0, 0, 0, time.UTC)

// xmlRelation maps each distribution type to our relation kind; the
// definitions agree pairwise (term.go's contract against the rules'
// definitions, e.g. SameDays "the days of one are all among the other's").
var xmlRelation = map[string]timetable.RelationKind{
	"SameStart":      timetable.SameStart,
	"SameTime":       timetable.WithinHours,
	"DifferentTime":  timetable.DifferentHours,
	"SameDays":       timetable.DaysWithin,
	"DifferentDays":  timetable.DifferentDays,
	"SameWeeks":      timetable.WeeksWithin,
	"DifferentWeeks": timetable.DifferentWeeks,
	"Overlap":        timetable.OverlapRel,
	"NotOverlap":     timetable.NoOverlap,
	"SameRoom":       timetable.SameRoom,
	"DifferentRoom":  timetable.DifferentRooms,
	"SameAttendees":  timetable.SamePeople,
	"Precedence":     timetable.FirstBefore,
	"WorkDay":        timetable.DaySpan,
	"MinGap":         timetable.MinGap,
	"MaxDays":        timetable.MaxDays,
	"MaxDayLoad":     timetable.MaxDayMinutes,
	"MaxBreaks":      timetable.MaxBreaks,
	"MaxBlock":       timetable.MaxBlock,
}

// xmlDaySet maps a days bit string (bit 0 = the first day, Monday) to a
// DaySet.
func xmlDaySet(days uint8) timetable.DaySet {
	var s timetable.DaySet
	for i := 0; i < 7; i++ {
		if days&(1<<i) != 0 {
			s |= timetable.DaysOf(time.Weekday((i + 1) % 7))
		}
	}
	return s
}

// Term maps the instance into a term of pattern sections. Each class is a
// section (ID the class ID) choosing one of its times (TimeChoice, weight
// its penalty) and one of its rooms (RoomChoice, weight its penalty), or no
// room; rooms keep capacity and unavailable times (one hard row per day);
// travel times become Term.Travel (slots are 5 minutes); distributions
// become relations (a soft pairwise one as one 2-section relation per pair,
// so that each broken pair costs its penalty as in the rules; the counted
// kinds and every required one as one relation over all its classes); the
// weights become the criteria "time choice", "room choice" and "soft
// relations", every other criterion 0. The term has TeachingWeeks() equal
// to the instance's weeks.
//
// Courses and students: each class's section names its course (Course, the
// course ID), its configuration (Arrangement, the configuration ID), its
// subpart (Part, the subpart ID), its parent class (Parent) and its limit
// (Limit, the class limit); each student's course list becomes one Request
// per course (no alternatives, Priority 0), the student ID kept as text.
// The student part's weight goes to "student clashes" (the criterion and
// the rules count alike: 1 per student per pair of classes that overlap or
// leave too little travel time); "unplaced requests" stays on, above every
// other criterion, because the rules require every student placed.
//
// Capacity: the rules list every acceptable room explicitly and do not
// check capacity, while our capacity is hard; a section's Size is its
// limit, lowered to the smallest capacity among its listed rooms, so every
// listed room stays acceptable.
func (in *XMLInstance) Term() *timetable.Term {
	t := &timetable.Term{
		Name:     in.Name,
		FirstDay: xmlFirstDay,
		LastDay:  xmlFirstDay.AddDate(0, 0, 7*in.Weeks-1),
		TimeZone: "UTC",
		Weights:  xmlWeights(in.Weights),
	}
	caps := map[string]int{}
	for _, r := range in.Rooms {
		caps[r.ID] = r.Capacity
		t.Rooms = append(t.Rooms, timetable.Room{ID: r.ID, Capacity: r.Capacity})
		for _, u := range r.Unavailable {
			if u.Weeks == 0 || u.Days == 0 {
				continue // affects nothing
			}
			for _, d := range xmlDaySet(u.Days).List() {
				t.Unavailable = append(t.Unavailable, timetable.Unavailability{
					Who: r.ID, Kind: timetable.WhoRoom, Day: d,
					From: timetable.Clock(u.Start * xmlSlot), To: timetable.Clock(u.End() * xmlSlot),
					Hard: true, Weeks: timetable.WeekSet(u.Weeks), Reason: "not available",
				})
			}
		}
	}
	t.Travel = xmlTravel(in)
	for _, c := range in.Classes {
		t.Sections = append(t.Sections, xmlSection(c, caps, t.AllWeeks()))
	}
	for _, d := range in.Distributions {
		t.Relations = append(t.Relations, xmlRelations(d)...)
	}
	t.Requests = xmlRequests(in.Students)
	return t
}

// xmlRequests gives one request per student and course, in file order.
func xmlRequests(students []XMLStudent) []timetable.Request {
	n := 0
	for _, st := range students {
		n += len(st.Courses)
	}
	if n == 0 {
		return nil
	}
	out := make([]timetable.Request, 0, n)
	for _, st := range students {
		for _, c := range st.Courses {
			out = append(out, timetable.Request{Student: st.ID, Course: c})
		}
	}
	return out
}

// xmlWeights sets the three mapped criteria and zeroes every other one.
func xmlWeights(w XMLWeights) map[string]timetable.Weight {
	m := map[string]timetable.Weight{}
	for _, c := range timetable.Criteria {
		m[c.Name] = timetable.Weight{Weight: 0, Level: 1}
	}
	m[timetable.CritTimeChoice] = timetable.Weight{Weight: w.Time, Level: 1}
	m[timetable.CritRoomChoice] = timetable.Weight{Weight: w.Room, Level: 1}
	m[timetable.CritSoftRelations] = timetable.Weight{Weight: w.Distribution, Level: 1}
	m[timetable.CritStudentClash] = timetable.Weight{Weight: w.Student, Level: 1}
	m[timetable.CritUnplaced] = timetable.Weight{Weight: 1, Level: 4}
	return m
}

// xmlTravel gives one row per pair of rooms, the largest time given in
// either direction, in room order.
func xmlTravel(in *XMLInstance) []timetable.Travel {
	var out []timetable.Travel
	seen := map[[2]string]int{}
	for _, r := range in.Rooms {
		for _, tr := range r.Travel {
			if tr.Slots == 0 || tr.Room == r.ID {
				continue
			}
			k := [2]string{r.ID, tr.Room}
			if tr.Room < r.ID {
				k = [2]string{tr.Room, r.ID}
			}
			if i, ok := seen[k]; ok {
				out[i].Minutes = max(out[i].Minutes, tr.Slots*xmlSlot)
				continue
			}
			seen[k] = len(out)
			out = append(out, timetable.Travel{From: r.ID, To: tr.Room, Minutes: tr.Slots * xmlSlot})
		}
	}
	return out
}

// xmlSection maps one class.
func xmlSection(c XMLClass, caps map[string]int, all timetable.WeekSet) timetable.Section {
	s := timetable.Section{
		ID: c.ID, Title: "course " + c.Course, Size: c.Limit,
		Meetings: 1, Length: 1, Weeks: all, NoRoom: c.NoRoom || len(c.Rooms) == 0,
		Course: c.Course, Arrangement: c.Config, Part: c.Subpart, Parent: c.Parent, Limit: c.Limit,
	}
	for _, rc := range c.Rooms {
		s.RoomChoices = append(s.RoomChoices, timetable.RoomChoice{Room: rc.Room, Weight: rc.Penalty})
		if caps[rc.Room] < s.Size {
			s.Size = caps[rc.Room]
		}
	}
	for _, tm := range c.Times {
		s.Times = append(s.Times, timetable.TimeChoice{
			Days: xmlDaySet(tm.Days), Start: timetable.Clock(tm.Start * xmlSlot), Minutes: tm.Length * xmlSlot,
			Weeks: timetable.WeekSet(tm.Weeks), Weight: tm.Penalty,
		})
	}
	return s
}

// xmlPairwise reports whether a kind holds pair by pair (so a soft one is
// split into pairs); the counted kinds hold over all classes together.
func xmlPairwise(k timetable.RelationKind) bool { return !k.Counted() }

// xmlRelations maps one distribution. Minutes are slots times 5.
func xmlRelations(d XMLDistribution) []timetable.Relation {
	kind, ok := xmlRelation[d.Type]
	if !ok || (!d.Required && d.Penalty == 0) {
		return nil
	}
	r := timetable.Relation{Kind: kind, Hard: d.Required, Weight: d.Penalty}
	switch d.Type {
	case "WorkDay", "MinGap", "MaxDayLoad":
		r.N = d.Params[0] * xmlSlot
	case "MaxDays":
		r.N = d.Params[0]
	case "MaxBreaks":
		r.N, r.M = d.Params[0], d.Params[1]*xmlSlot
	case "MaxBlock":
		r.N, r.M = d.Params[0]*xmlSlot, d.Params[1]*xmlSlot
	}
	if !xmlPairwise(kind) {
		if len(d.Classes) == 0 {
			return nil
		}
		r.Sections = append([]string(nil), d.Classes...)
		return []timetable.Relation{r}
	}
	if len(d.Classes) < 2 {
		return nil // a pairwise rule over one class holds
	}
	if d.Required {
		r.Sections = append([]string(nil), d.Classes...)
		return []timetable.Relation{r}
	}
	var out []timetable.Relation
	for i := range d.Classes {
		for j := i + 1; j < len(d.Classes); j++ {
			p := r
			p.Sections = []string{d.Classes[i], d.Classes[j]}
			out = append(out, p)
		}
	}
	return out
}
