package timetable

import (
	"time"
)

// ckTerm is the hand-made term shared by the Check and Cost tests (invented
// data). Grid: Mon, Tue, Wed with periods 09:00, 10:00, 11:00, then a lunch
// break, then 13:00 and 14:00 — indexes Mon 0–4, Tue 5–9, Wed 10–14; period
// 2 (11:00) and period 3 (13:00) are not consecutive.
func ckTerm() *Term {
	t := &Term{
		Name:     "Test term",
		FirstDay: time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 12, 10, 0, 0, 0, 0, time.UTC),
		TimeZone: "UTC",
	}
	for _, d := range []time.Weekday{time.Monday, time.Tuesday, time.Wednesday} {
		for _, h := range []int{9, 10, 11, 13, 14} {
			t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: d, Start: Clock(h * 60), End: Clock(h*60 + 60),
				Src: Source{Sheet: "Periods", Row: len(t.Periods) + 2}})
		}
	}
	t.Rooms = []Room{
		{ID: "R1", Capacity: 60, Features: []string{"projector"}, Building: "North", Src: Source{"Rooms", 2}},
		{ID: "R2", Capacity: 60, Features: []string{"lab", "projector"}, Building: "South", Src: Source{"Rooms", 3}},
		{ID: "R3", Capacity: 20, Building: "North", Src: Source{"Rooms", 4}},
	}
	t.Staff = []Staff{
		{ID: "S1", Name: "Dr Ana Petrović", Src: Source{"Staff", 2}},
		{ID: "S2", Name: "Ben Okafor", MaxPerDay: 3, MaxConsecutive: 2, Src: Source{"Staff", 3}},
	}
	t.Cohorts = []Cohort{
		{ID: "C1", Name: "Year 1 Biology", Size: 25, Src: Source{"Cohorts", 2}},
		{ID: "C2", Name: "Year 1 Chemistry", Size: 50, Src: Source{"Cohorts", 3}},
	}
	all := t.AllWeeks()
	t.Sections = []Section{
		{ID: "BIO-101", Title: "Cells", Staff: []string{"S1"}, Cohorts: []string{"C1"}, Size: 25, Meetings: 2, Length: 1,
			Rooms: []string{"R1", "R2"}, Fixed: []Fixed{{Day: time.Monday, Start: 540, Room: "R1", Text: "Mon 09:00 R1"}},
			Weeks: all, Src: Source{"Sections", 2}},
		{ID: "CHE-210", Title: "Reactions", Staff: []string{"S2"}, Cohorts: []string{"C2"}, Size: 50, Meetings: 1, Length: 2,
			Needs: []string{"lab"}, Weeks: all, Src: Source{"Sections", 3}},
		{ID: "PHY-110", Title: "Motion", Staff: []string{"S1"}, Cohorts: []string{"C2"}, Size: 18, Meetings: 1, Length: 1,
			Rooms: []string{"R3"}, Weeks: all, Src: Source{"Sections", 4}},
		{ID: "ONL-100", Title: "Study skills", Staff: []string{"S2"}, Cohorts: []string{"C1"}, Size: 25, Meetings: 1, Length: 1,
			NoRoom: true, Weeks: all, Src: Source{"Sections", 5}},
		{ID: "ART-120", Title: "Drawing", Staff: []string{"S2"}, Size: 10, Meetings: 1, Length: 1,
			Weeks: all, Src: Source{"Sections", 6}},
	}
	t.Enrolments = []Enrolment{
		{Student: "st1", Section: "BIO-101", Src: Source{"Enrolments", 2}},
		{Student: "st1", Section: "ART-120", Src: Source{"Enrolments", 3}},
		{Student: "st2", Section: "BIO-101", Src: Source{"Enrolments", 4}},
		{Student: "st2", Section: "ART-120", Src: Source{"Enrolments", 5}},
	}
	t.Unavailable = []Unavailability{
		{Who: "S2", Kind: WhoStaff, Day: time.Wednesday, From: 13 * 60, To: 15 * 60, Hard: true, Reason: "committee", Src: Source{"Unavailable", 2}},
		{Who: "S1", Kind: WhoStaff, Day: time.Monday, From: 9 * 60, To: 10 * 60, Weight: 3, Src: Source{"Unavailable", 3}},
	}
	t.Relations = []Relation{
		{Kind: DifferentDays, Sections: []string{"BIO-101", "CHE-210"}, Hard: true, Src: Source{"Relations", 2}},
	}
	return t
}

// ckSchedule is a valid timetable for ckTerm:
//
//	0 BIO-101 m1 Mon 09:00 R1      (period 0)
//	1 BIO-101 m2 Wed 09:00 R1      (period 10)
//	2 CHE-210 m1 Tue 09:00–11:00 R2 (periods 5, 6)
//	3 PHY-110 m1 Mon 10:00 R3      (period 1)
//	4 ONL-100 m1 Mon 13:00 no room (period 3)
//	5 ART-120 m1 Tue 14:00 R3      (period 9)
func ckSchedule() *Schedule {
	return &Schedule{Placements: []Placement{
		{Section: "BIO-101", Meeting: 1, Period: 0, Room: "R1"},
		{Section: "BIO-101", Meeting: 2, Period: 10, Room: "R1"},
		{Section: "CHE-210", Meeting: 1, Period: 5, Room: "R2"},
		{Section: "PHY-110", Meeting: 1, Period: 1, Room: "R3"},
		{Section: "ONL-100", Meeting: 1, Period: 3},
		{Section: "ART-120", Meeting: 1, Period: 9, Room: "R3"},
	}}
}

// ckPlace moves placement i of s to period p in room.
func ckPlace(s *Schedule, i, p int, room string) {
	s.Placements[i].Period = p
	s.Placements[i].Room = room
}

// ckRules lists the rules of vs in order.
func ckRules(vs []Violation) []string {
	out := []string{}
	for _, v := range vs {
		out = append(out, v.Rule)
	}
	return out
}
