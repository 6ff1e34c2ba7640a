package timetable

// Impossible returns the errors of Validate that prove by counting alone
// that no timetable exists — a staff member, cohort or the rooms needed
// for more periods than they have, staff whose sections need more minutes
// a week than their weekly limit, fixed meetings that clash or outnumber
// the rooms — with the same messages (positions without column letters).
// The term is otherwise assumed readable; solve reports these as "no
// timetable exists" instead of as mistakes to fix.
func Impossible(t *Term) Problems {
	v := &validator{t: t, staff: t.StaffIndex(), rooms: t.RoomIndex(), cohorts: t.CohortIndex(), sections: t.SectionIndex()}
	v.buildHard()
	v.checkLoads()
	v.checkWeekMinutes()
	v.checkFixedTogether()
	ps := v.ps.Errors()
	ps.Sort()
	return ps
}
