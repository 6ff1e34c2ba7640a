package export

import (
	"time"

	"github.com/termwright/termwright/timetable"
)

// patternTerm is demoTerm with sections placed by meeting patterns beside
// its grid sections (a mixed term): a Mon Wed Fri 50-minute class that
// starts on the hour but ends ten minutes before the next period, a
// Tue Thu 75-minute class at half past ten, a lab in odd weeks only, and a
// block course in weeks 3-6 across the lunch hour the grid leaves out
// (12:00-13:00 and 14:00 periods, nothing at 13:00). Staff S6 and cohort
// C3 attend only pattern sections.
func patternTerm() (*timetable.Term, *timetable.Schedule) {
	t, s := demoTerm()
	t.Staff = append(t.Staff, timetable.Staff{ID: "S6", Name: "Ines Valcárcel"})
	t.Cohorts = append(t.Cohorts, timetable.Cohort{ID: "C3", Name: "Foundation year", Size: 10})
	all := t.AllWeeks()
	odd := timetable.WeekSet(0x5555) & all
	block := timetable.WeekSet(0b111100) // weeks 3-6
	mwf := timetable.DaysOf(time.Monday, time.Wednesday, time.Friday)
	tth := timetable.DaysOf(time.Tuesday, time.Thursday)
	t.Sections = append(t.Sections,
		timetable.Section{ID: "MA110", Title: "Calculus I", Staff: []string{"S6"}, Cohorts: []string{"C3"}, Size: 10, Times: []timetable.TimeChoice{
			{Days: mwf, Start: 9 * 60, Minutes: 50, Weeks: all},
			{Days: tth, Start: 9*60 + 30, Minutes: 75, Weeks: all},
		}},
		timetable.Section{ID: "MA111", Title: "Linear Algebra", Staff: []string{"S6"}, Cohorts: []string{"C3"}, Size: 10, Times: []timetable.TimeChoice{
			{Days: tth, Start: 10*60 + 30, Minutes: 75, Weeks: all},
			{Days: mwf, Start: 11 * 60, Minutes: 50, Weeks: all, Weight: 1},
		}},
		timetable.Section{ID: "PH120", Title: "Physics Laboratory", Staff: []string{"S5"}, Cohorts: []string{"C3"}, Size: 10, Needs: []string{"lab"}, Times: []timetable.TimeChoice{
			{Days: timetable.DaysOf(time.Tuesday), Start: 14 * 60, Minutes: 170, Weeks: odd},
			{Days: timetable.DaysOf(time.Tuesday), Start: 14 * 60, Minutes: 170, Weeks: all &^ odd},
		}},
		timetable.Section{ID: "EN130", Title: "Academic Writing (block course)", Staff: []string{"S6"}, Cohorts: []string{"C3"}, Size: 10, Times: []timetable.TimeChoice{
			{Days: timetable.DaysOf(time.Monday, time.Wednesday), Start: 13 * 60, Minutes: 75, Weeks: block},
		}},
	)
	s.Placements = append(s.Placements,
		timetable.Placement{Section: "MA110", Meeting: 1, Period: -1, Time: 1, Room: "A1"},
		timetable.Placement{Section: "MA111", Meeting: 1, Period: -1, Time: 1, Room: "A1"},
		timetable.Placement{Section: "PH120", Meeting: 1, Period: -1, Time: 1, Room: "L2"},
		timetable.Placement{Section: "EN130", Meeting: 1, Period: -1, Time: 1, Room: "R999"},
	)
	return t, s
}
