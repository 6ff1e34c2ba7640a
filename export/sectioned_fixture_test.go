package export

import (
	"time"

	"github.com/termwright/termwright/timetable"
)

// sectionedTerm is demoTerm with a requested course: MA110 has one
// main class (limit 5) and two tutorials (limit 2 each) that belong to it,
// and six students ask for it. Four are sectioned (one of them with an ID
// a spreadsheet would take for a formula), st-001's tutorial T1 meets at
// the time of its fixed CS101 (a clash), st-012 is left out with the
// sectioner's reason, and st-013's request is met by its alternative
// CH203, where the student is a fixed enrolment.
func sectionedTerm() (*timetable.Term, *timetable.Schedule) {
	t, s := demoTerm()
	all := t.AllWeeks()
	for i := range t.Sections {
		t.Sections[i].Src = timetable.Source{Sheet: "Sections", Row: i + 2}
	}
	t.Sections = append(t.Sections,
		timetable.Section{ID: "MA110-L1", Title: "Calculus I", Staff: []string{"S2"}, Size: 60, Limit: 5, Meetings: 1, Length: 1, Weeks: all,
			Course: "MA110", Part: "Main", Src: timetable.Source{Sheet: "Sections", Row: 8}},
		timetable.Section{ID: "MA110-T1", Title: "Calculus I tutorial", Staff: []string{"S5"}, Size: 10, Limit: 2, Meetings: 1, Length: 1, Weeks: all,
			Course: "MA110", Part: "Tutorial", Parent: "MA110-L1", Src: timetable.Source{Sheet: "Sections", Row: 9}},
		timetable.Section{ID: "MA110-T2", Title: "Calculus I tutorial", Staff: []string{"S5"}, Size: 10, Limit: 2, Meetings: 1, Length: 1, Weeks: all,
			Course: "MA110", Part: "Tutorial", Parent: "MA110-L1", Src: timetable.Source{Sheet: "Sections", Row: 10}},
	)
	t.Sections[4].Course = "CH203" // the safety briefing is a course of its own, taken instead of MA110
	t.Enrolments = append(t.Enrolments, timetable.Enrolment{Student: "st-013", Section: "CH203"})
	req := func(row int, st string, alt ...string) timetable.Request {
		return timetable.Request{Student: st, Course: "MA110", Alternatives: alt, Src: timetable.Source{Sheet: "Course requests", Row: row}}
	}
	t.Requests = []timetable.Request{req(2, "st-001"), req(3, "st-010"), req(4, "st-011"), req(5, "=cmd"), req(6, "st-012"), req(7, "st-013", "CH203")}
	at := func(d time.Weekday, h int) int { return t.PeriodAt(d, timetable.Clock(h*60)) }
	s.Placements = append(s.Placements,
		timetable.Placement{Section: "MA110-L1", Meeting: 1, Period: at(time.Tuesday, 10), Room: "A1"},
		timetable.Placement{Section: "MA110-T1", Meeting: 1, Period: at(time.Monday, 10), Room: "R999"},
		timetable.Placement{Section: "MA110-T2", Meeting: 1, Period: at(time.Wednesday, 14), Room: "R999"},
	)
	en := func(st, sec string) timetable.Enrolment { return timetable.Enrolment{Student: st, Section: sec} }
	s.Enrolments = []timetable.Enrolment{
		en("=cmd", "MA110-L1"), en("=cmd", "MA110-T1"),
		en("st-001", "MA110-L1"), en("st-001", "MA110-T1"),
		en("st-010", "MA110-L1"), en("st-010", "MA110-T2"),
		en("st-011", "MA110-L1"), en("st-011", "MA110-T2"),
	}
	return t, s
}

// sectionedReasons is what a sectioner would say about st-012's request.
var sectionedReasons = map[int]string{4: "every section of MA110 Tutorial is full"}
