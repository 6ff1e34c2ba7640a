package samples

import (
	"fmt"
	"time"

	"github.com/termwright/termwright/timetable"
)

//go:generate go test -run TestCampusFiles -update .

// Files of the checked-in second demo term, relative to this package's
// directory. Both are written from Campus(); TestCampusFiles fails when they
// drift and rewrites them with -update.
const (
	CampusWorkbook = "campus-term.xlsx" // the meeting-pattern demo workbook
	CampusCSVDir   = "campus"           // the same tables as CSV files
)

// CampusInstitution is the invented institution of the second demo term.
const CampusInstitution = "Vellmoor University"

// Campus returns the second demo term: Vellmoor University's spring term,
// scheduled by meeting patterns instead of a period grid. Main classes meet
// Mon Wed Fri for 50 minutes or Tue Thu for 75 minutes; labs meet every
// other week; one intensive course runs in weeks 3 to 6 only. Sections list
// their acceptable rooms with preferences; the Town campus and the Cray Hill
// campus are 25 minutes apart. Students ask for courses (campusCourses):
// three courses have a main class with two parallel labs that belong to it,
// Calculus runs in two parallel sections, and History Methods may be taken
// in two ways (the archive seminar, or online). Every name is invented.
func Campus() *timetable.Term {
	t := &timetable.Term{
		Name:     CampusInstitution + " — Spring 2028",
		FirstDay: time.Date(2028, 1, 17, 0, 0, 0, 0, time.UTC), // a Monday
		LastDay:  time.Date(2028, 4, 28, 0, 0, 0, 0, time.UTC), // 15 teaching weeks
		TimeZone: "America/Denver",
		Holidays: []time.Time{time.Date(2028, 3, 13, 0, 0, 0, 0, time.UTC)},
	}
	all := t.AllWeeks()
	odd := all & 0x5555555555555555
	campusRooms(t)
	campusPeople(t)
	c := &campusBuilder{t: t, all: all}
	c.mainClasses()
	c.labs(odd, all&^odd)
	c.block()
	c.online()
	campusRelations(t)
	campusCourses(t)
	t.Unavailable = []timetable.Unavailability{
		{Who: "VU-06", Kind: timetable.WhoStaff, Day: time.Friday, From: 12 * 60, To: 24 * 60, Hard: true, Reason: "conference travel", Weeks: 0b1100000000}, // weeks 9-10
		{Who: "CED-1", Kind: timetable.WhoRoom, Day: time.Tuesday, From: 8 * 60, To: 12 * 60, Hard: true, Reason: "floor works", Weeks: 0b11},                // weeks 1-2
		{Who: "VU-03", Kind: timetable.WhoStaff, Day: time.Monday, From: 0, To: 10 * 60, Weight: 2, Reason: "school run"},
	}
	t.Weights = map[string]timetable.Weight{
		timetable.CritTimeChoice: {Weight: 2, Level: 1},
		timetable.CritRoomChoice: {Weight: 1, Level: 1},
	}
	return t
}

// campusRooms adds the rooms of the two campuses and the travel times
// between their buildings.
func campusRooms(t *timetable.Term) {
	t.Rooms = []timetable.Room{
		{ID: "ASH-101", Capacity: 60, Features: []string{"projector"}, Building: "Ash Hall"},
		{ID: "ASH-102", Capacity: 40, Features: []string{"projector"}, Building: "Ash Hall"},
		{ID: "ASH-201", Capacity: 140, Features: []string{"projector", "step-free"}, Building: "Ash Hall"},
		{ID: "BIR-010", Capacity: 24, Features: []string{"lab", "step-free"}, Building: "Birch Labs"},
		{ID: "BIR-012", Capacity: 24, Features: []string{"lab"}, Building: "Birch Labs"},
		{ID: "CED-1", Capacity: 90, Features: []string{"projector", "step-free"}, Building: "Cedar House"},
		{ID: "CED-2", Capacity: 36, Features: []string{"projector"}, Building: "Cedar House"},
		{ID: "DUN-S1", Capacity: 30, Features: []string{"studio"}, Building: "Dunmore Studio"},
	}
	// Town campus: Ash Hall, Birch Labs. Cray Hill campus: Cedar House,
	// Dunmore Studio. The shuttle between campuses takes 25 minutes; the
	// walk between the Town buildings 10.
	t.Travel = []timetable.Travel{
		{From: "Ash Hall", To: "Birch Labs", Minutes: 10},
		{From: "Ash Hall", To: "Cedar House", Minutes: 25},
		{From: "Ash Hall", To: "Dunmore Studio", Minutes: 25},
		{From: "Birch Labs", To: "Cedar House", Minutes: 25},
		{From: "Birch Labs", To: "Dunmore Studio", Minutes: 25},
	}
}

// campusPeople adds the staff (one part-timer with weekly limits, two with
// a guaranteed lunch break) and the cohorts.
func campusPeople(t *timetable.Term) {
	names := []string{"Maren Ostrow", "Tobias Quayle", "Ines Harrowgate", "Dev Pillai-Strand", "Oona Feld",
		"Rafe Calloway", "Suvi Marrak", "Jonah Threlkeld", "Amara Voss", "Kit Lindqvar"}
	for i, n := range names {
		t.Staff = append(t.Staff, timetable.Staff{
			ID: fmt.Sprintf("VU-%02d", i+1), Name: n,
			Email: fmt.Sprintf("staff%02d@vellmoor.example", i+1),
		})
	}
	lunch := timetable.LunchBreak{From: 11*60 + 30, To: 13*60 + 30, Minutes: 30}
	t.Staff[0].Lunch = lunch
	t.Staff[3].Lunch = lunch
	// VU-10 is part-time: at most 8 hours of teaching on at most two days.
	t.Staff[9].MaxWeekMinutes, t.Staff[9].MaxWeekDays = 480, 2
	t.Cohorts = []timetable.Cohort{
		{ID: "BIO-1", Name: "Biology, first year", Size: 80, Lunch: lunch},
		{ID: "BIO-2", Name: "Biology, second year", Size: 45},
		{ID: "CHM-1", Name: "Chemistry, first year", Size: 50},
		{ID: "ART-1", Name: "Fine Art, first year", Size: 28},
		{ID: "HIS-2", Name: "History, second year", Size: 34},
	}
}

// campusBuilder adds sections with their meeting times and room choices.
type campusBuilder struct {
	t   *timetable.Term
	all timetable.WeekSet
}

var (
	mwf  = timetable.DaysOf(time.Monday, time.Wednesday, time.Friday)
	tuth = timetable.DaysOf(time.Tuesday, time.Thursday)
)

// mwfTimes are the usual 50-minute Mon Wed Fri starts, early ones less
// wanted; tuthTimes the 75-minute Tue Thu starts.
func mwfTimes(weeks timetable.WeekSet, starts ...int) []timetable.TimeChoice {
	return pattern(mwf, 50, weeks, starts)
}

func tuthTimes(weeks timetable.WeekSet, starts ...int) []timetable.TimeChoice {
	return pattern(tuth, 75, weeks, starts)
}

// pattern lists meeting times on days of minutes length at starts (HHMM);
// a start before 09:00 or from 16:00 costs weight 2.
func pattern(days timetable.DaySet, minutes int, weeks timetable.WeekSet, starts []int) []timetable.TimeChoice {
	var out []timetable.TimeChoice
	for _, hm := range starts {
		c := timetable.TimeChoice{Days: days, Start: timetable.Clock(hm/100*60 + hm%100), Minutes: minutes, Weeks: weeks}
		if hm < 900 || hm >= 1600 {
			c.Weight = 2
		}
		out = append(out, c)
	}
	return out
}

// add appends a pattern section with its meeting times and room choices.
func (c *campusBuilder) add(id, title, staff, cohort string, size int, needs []string, times []timetable.TimeChoice, rooms ...timetable.RoomChoice) {
	s := timetable.Section{
		ID: id, Title: title, Staff: []string{staff}, Size: size, Meetings: 1, Length: 1,
		Needs: needs, Weeks: c.all, Times: times, RoomChoices: rooms,
	}
	if cohort != "" {
		s.Cohorts = []string{cohort}
	}
	c.t.Sections = append(c.t.Sections, s)
}

// pick is a room choice of a campus section.
func pick(id string, weight int) timetable.RoomChoice {
	return timetable.RoomChoice{Room: id, Weight: weight}
}

// mainClasses adds the sections that meet two or three times a week, one
// row each: its rooms in order of preference with their weights.
func (c *campusBuilder) mainClasses() {
	a := c.all
	proj, studio := []string{"projector"}, []string{"studio"}
	type rc = []timetable.RoomChoice
	for _, m := range []struct {
		id, title, staff, cohort string
		size                     int
		needs                    []string
		times                    []timetable.TimeChoice
		rooms                    rc
	}{
		{"BIO101-L", "Cells and Organisms", "VU-01", "BIO-1", 80, proj, mwfTimes(a, 800, 900, 1000, 1100), rc{pick("ASH-201", 0), pick("CED-1", 2)}},
		{"BIO102-L", "Ecology Today", "VU-02", "BIO-1", 80, proj, tuthTimes(a, 800, 930, 1100, 1400), rc{pick("ASH-201", 0), pick("CED-1", 0)}},
		{"BIO201-L", "Genetics", "VU-01", "BIO-2", 45, proj, tuthTimes(a, 930, 1100, 1400, 1530), rc{pick("ASH-101", 0), pick("CED-1", 3), pick("ASH-201", 5)}},
		{"BIO202-L", "Field Methods", "VU-03", "BIO-2", 45, proj, mwfTimes(a, 900, 1000, 1300, 1400), nil},
		{"CHM101-L", "General Chemistry", "VU-04", "CHM-1", 50, proj, mwfTimes(a, 800, 900, 1000, 1300), rc{pick("ASH-101", 0), pick("ASH-201", 1)}},
		{"CHM102-L", "Chemistry in Context", "VU-05", "CHM-1", 50, proj, tuthTimes(a, 930, 1100, 1230, 1400), rc{pick("CED-1", 0), pick("ASH-101", 1)}},
		{"MTH110-A", "Calculus I (section A)", "VU-06", "CHM-1", 50, proj, mwfTimes(a, 900, 1000, 1100, 1400), rc{pick("ASH-101", 0), pick("CED-1", 1)}},
		{"MTH110-B", "Calculus I (section B)", "VU-07", "BIO-1", 80, proj, mwfTimes(a, 900, 1000, 1100, 1400), rc{pick("ASH-201", 0), pick("CED-1", 0)}},
		{"ART101-L", "Drawing Fundamentals", "VU-08", "ART-1", 28, studio, tuthTimes(a, 930, 1100, 1400), nil},
		{"ART102-L", "Art and Its Histories", "VU-09", "ART-1", 28, proj, mwfTimes(a, 1000, 1100, 1300), rc{pick("CED-2", 0), pick("ASH-102", 1)}},
		{"HIS201-L", "Rivers and Empires", "VU-09", "HIS-2", 34, proj, tuthTimes(a, 1100, 1230, 1400), rc{pick("CED-2", 0), pick("ASH-102", 0)}},
		{"HIS202-S", "Archive Seminar", "VU-03", "HIS-2", 20, nil, pattern(timetable.DaysOf(time.Wednesday), 110, a, []int{1300, 1500}), rc{pick("ASH-102", 0), pick("CED-2", 2)}},
	} {
		c.add(m.id, m.title, m.staff, m.cohort, m.size, m.needs, m.times, m.rooms...)
	}
}

// labs adds labs that meet every other week (groups 1 in odd weeks, groups
// 2 in even weeks).
func (c *campusBuilder) labs(odd, even timetable.WeekSet) {
	lab := []string{"lab"}
	for _, l := range []struct {
		id, title, staff, cohort string
		day                      time.Weekday
	}{
		{"BIO101-LAB", "Cells and Organisms lab", "VU-02", "BIO-1", time.Tuesday},
		{"CHM101-LAB", "General Chemistry lab", "VU-04", "CHM-1", time.Thursday},
		{"BIO201-LAB", "Genetics lab", "VU-10", "BIO-2", time.Monday},
	} {
		for g, weeks := range []timetable.WeekSet{odd, even} {
			times := []timetable.TimeChoice{
				{Days: timetable.DaysOf(l.day), Start: 13 * 60, Minutes: 170, Weeks: weeks},
				{Days: timetable.DaysOf(l.day), Start: 14 * 60, Minutes: 170, Weeks: weeks, Weight: 1},
			}
			c.add(fmt.Sprintf("%s-%d", l.id, g+1), fmt.Sprintf("%s, group %d", l.title, g+1), l.staff, "", 24, lab, times,
				pick("BIR-010", 0), pick("BIR-012", 1))
		}
	}
}

// block adds an intensive course that meets four mornings a week in weeks
// 3 to 6 only.
func (c *campusBuilder) block() {
	weeks := timetable.WeekSet(0b111100) // weeks 3-6
	c.add("ART150-X", "Printmaking Intensive", "VU-08", "", 16, []string{"studio"},
		[]timetable.TimeChoice{{Days: timetable.DaysOf(time.Monday, time.Tuesday, time.Wednesday, time.Thursday), Start: 13 * 60, Minutes: 180, Weeks: weeks}})
}

// online adds a section that takes no room.
func (c *campusBuilder) online() {
	c.add("HIS210-W", "Digital History (online)", "VU-05", "HIS-2", 34, nil,
		pattern(timetable.DaysOf(time.Friday), 90, c.all, []int{1300, 1500}))
	c.t.Sections[len(c.t.Sections)-1].NoRoom = true
}

// campusRelations adds a few of the pattern-era relations.
func campusRelations(t *timetable.Term) {
	t.Relations = []timetable.Relation{
		// The two Calculus sections run in parallel at one start time.
		{Kind: timetable.SameStart, Sections: []string{"MTH110-A", "MTH110-B"}, Hard: true},
		// Each lab group meets after the week's first main class.
		{Kind: timetable.FirstBefore, Sections: []string{"BIO101-L", "BIO101-LAB-1"}, Weight: 3},
		// The two lab groups alternate weeks and so never share a week.
		{Kind: timetable.DifferentWeeks, Sections: []string{"CHM101-LAB-1", "CHM101-LAB-2"}, Hard: true},
		// Second-year biology keeps its main classes within three days.
		{Kind: timetable.MaxDays, Sections: []string{"BIO201-L", "BIO202-L"}, Weight: 2, N: 3},
		// A quarter of an hour between the history class and its seminar.
		{Kind: timetable.MinGap, Sections: []string{"HIS201-L", "HIS202-S"}, Hard: true, N: 15},
		// Fine Art's teaching day spans at most six hours.
		{Kind: timetable.DaySpan, Sections: []string{"ART101-L", "ART102-L"}, Weight: 1, N: 360},
		// No more than three hours of teaching in a row for first-year chemistry.
		{Kind: timetable.MaxBlock, Sections: []string{"CHM101-L", "CHM102-L", "MTH110-A"}, Weight: 2, N: 180, M: 15},
	}
}

// campusCourses makes courses of the sections and adds the course requests
// of 44 invented students (IDs V28001 to V28044): BIO101, CHM101 and
// BIO201 each have a main class (part Main) and two parallel labs (part
// Lab) whose parent is the main class; MTH110 has two parallel sections;
// HIS220 (History Methods) has two arrangements, the Archive seminar or the
// Online class.
func campusCourses(t *timetable.Term) {
	type course struct{ course, arr, part, parent string }
	of := map[string]course{
		"BIO101-L": {"BIO101", "", "Main", ""}, "BIO101-LAB-1": {"BIO101", "", "Lab", "BIO101-L"}, "BIO101-LAB-2": {"BIO101", "", "Lab", "BIO101-L"},
		"CHM101-L": {"CHM101", "", "Main", ""}, "CHM101-LAB-1": {"CHM101", "", "Lab", "CHM101-L"}, "CHM101-LAB-2": {"CHM101", "", "Lab", "CHM101-L"},
		"BIO201-L": {"BIO201", "", "Main", ""}, "BIO201-LAB-1": {"BIO201", "", "Lab", "BIO201-L"}, "BIO201-LAB-2": {"BIO201", "", "Lab", "BIO201-L"},
		"MTH110-A": {"MTH110", "", "", ""}, "MTH110-B": {"MTH110", "", "", ""},
		"HIS202-S": {"HIS220", "Archive", "", ""}, "HIS210-W": {"HIS220", "Online", "", ""},
	}
	for i := range t.Sections {
		if c, ok := of[t.Sections[i].ID]; ok {
			s := &t.Sections[i]
			s.Course, s.Arrangement, s.Part, s.Parent = c.course, c.arr, c.part, c.parent
		}
	}
	// The seminar takes 18 of its 20 seats: two are kept for visiting students.
	for i := range t.Sections {
		if t.Sections[i].ID == "HIS202-S" {
			t.Sections[i].Limit = 18
		}
	}
	for n := 1; n <= 44; n++ {
		st := fmt.Sprintf("V28%03d", n)
		ask := func(course string, priority int, instead ...string) {
			t.Requests = append(t.Requests, timetable.Request{Student: st, Course: course, Priority: priority, Alternatives: instead})
		}
		switch {
		case n <= 20: // first-year biology
			ask("BIO101", 1)
			ask("MTH110", 2)
			ask("HIS220", 0)
		case n <= 36: // first-year chemistry
			ask("CHM101", 1)
			ask("MTH110", 1)
			ask("BIO101", 3, "HIS220")
		default: // second-year biology
			ask("BIO201", 1)
			if n%2 == 0 {
				ask("HIS220", 2)
			} else {
				ask("CHM101", 2, "MTH110")
			}
		}
	}
}
