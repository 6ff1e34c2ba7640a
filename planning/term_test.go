package planning

import (
	"fmt"
	"math/rand"
	"time"

	"github.com/termwright/termwright/timetable"
)

// requestTerm is a small invented pattern term with courses in parts and
// students' requests: each course has a main class part (one section) and a
// lab part (two parallel sections with limits), every section a handful
// of Mon/Wed or Tue/Thu meeting times that overlap the other courses'
// times, rooms in two buildings 20 minutes apart, and students asking
// for two or three courses.
func requestTerm(seed int64, courses, students int) *timetable.Term {
	rng := rand.New(rand.NewSource(seed))
	t := &timetable.Term{
		Name:     "Harrowgate Institute — test term",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 10, 1, 0, 0, 0, 0, time.UTC),
		Rooms: []timetable.Room{
			{ID: "N1", Capacity: 40, Building: "North"}, {ID: "N2", Capacity: 40, Building: "North"},
			{ID: "S1", Capacity: 40, Building: "South"},
		},
		Travel: []timetable.Travel{{From: "North", To: "South", Minutes: 20}},
	}
	all := t.AllWeeks()
	days := []timetable.DaySet{timetable.DaysOf(time.Monday, time.Wednesday), timetable.DaysOf(time.Tuesday, time.Thursday)}
	for c := 0; c < courses; c++ {
		staff := fmt.Sprintf("T%d", c+1)
		t.Staff = append(t.Staff, timetable.Staff{ID: staff})
		add := func(id, part string, limit int) {
			sec := timetable.Section{ID: id, Title: "Course " + fmt.Sprint(c+1), Meetings: 1, Length: 1, Size: 20,
				Staff: []string{staff}, Weeks: all, Course: fmt.Sprintf("K%d", c+1), Part: part, Limit: limit,
				Src: timetable.Source{Sheet: "Sections", Row: len(t.Sections) + 2}}
			for k := 0; k < 3; k++ {
				sec.Times = append(sec.Times, timetable.TimeChoice{Days: days[rng.Intn(2)],
					Start: timetable.Clock(9*60 + 60*rng.Intn(4)), Minutes: 50, Weeks: all, Weight: k})
			}
			for _, r := range t.Rooms {
				sec.RoomChoices = append(sec.RoomChoices, timetable.RoomChoice{Room: r.ID})
			}
			t.Sections = append(t.Sections, sec)
		}
		add(fmt.Sprintf("K%d-L", c+1), "Main", 0)
		add(fmt.Sprintf("K%d-B1", c+1), "Lab", 1+students/3)
		add(fmt.Sprintf("K%d-B2", c+1), "Lab", 1+students/3)
	}
	for st := 0; st < students; st++ {
		for _, c := range rng.Perm(courses)[:2+rng.Intn(2)] {
			t.Requests = append(t.Requests, timetable.Request{Student: fmt.Sprintf("P%02d", st+1), Course: fmt.Sprintf("K%d", c+1),
				Src: timetable.Source{Sheet: "Course requests", Row: len(t.Requests) + 2}})
		}
	}
	return t
}
