package export

import (
	"strconv"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// masterRow gives one meeting (one row of the master sheet: a grid
// meeting, or a whole pattern placement with all its days) as the cells of the master timetable, in the
// order of timetable.TimetableColumns: Section, Title, Meeting, Day
// ("Tue"), Start ("10:00"), End, Room, Staff (comma list of staff IDs),
// Cohorts (comma list of cohort IDs), Weeks (the teaching weeks in the
// term workbook's form: "all", "odd", "even" or "1-6, 9"; so that two
// sections in one room at one hour in disjoint weeks do not look like a
// double booking) and Staff names (comma list, in the order of Staff).
func (v *view) masterRow(m *meeting) []string {
	room := ""
	if m.room != nil {
		room = m.room.ID
	}
	return []string{
		m.sec.ID,
		m.sec.Title,
		strconv.Itoa(m.num),
		v.dayText(m),
		m.from.String(),
		m.to.String(),
		room,
		strings.Join(m.sec.Staff, ", "),
		strings.Join(m.sec.Cohorts, ", "),
		v.t.WeeksText(v.meetingWeeks(m)),
		strings.Join(v.staffNames(m.sec), ", "),
	}
}

// meetingWeeks is the set of teaching weeks a meeting takes place in
// within the term (a section without weeks meets in all of them).
func (v *view) meetingWeeks(m *meeting) timetable.WeekSet {
	if m.weeks == 0 {
		return v.allWeeks
	}
	return m.weeks & v.allWeeks
}

// dayText is the Day cell of a meeting: "Tue", or all the days of a
// pattern placement, "Mon Wed Fri".
func (v *view) dayText(m *meeting) string {
	if m.pattern() {
		return m.days.String()
	}
	return timetable.DayName(m.day)
}

// building is the building of a meeting's room, or "".
func (m *meeting) building() string {
	if m.room == nil {
		return ""
	}
	return m.room.Building
}

// weekNumbers lists the teaching weeks of a meeting within the term.
func (v *view) weekNumbers(m *meeting) []int {
	w := v.meetingWeeks(m)
	var out []int
	for n := 1; n <= 64; n++ {
		if w.Has(n) {
			out = append(out, n)
		}
	}
	return out
}
