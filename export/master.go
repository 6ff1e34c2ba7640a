package export

import (
	"strconv"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// masterRow gives one meeting as the cells of the master timetable, in the
// order of timetable.TimetableColumns: Section, Title, Meeting, Day
// ("Tue"), Start ("10:00"), End, Room, Staff (comma list of staff IDs),
// Cohorts (comma list of cohort IDs).
func (v *view) masterRow(m *meeting) []string {
	room := ""
	if m.room != nil {
		room = m.room.ID
	}
	return []string{
		m.sec.ID,
		m.sec.Title,
		strconv.Itoa(m.num),
		timetable.DayName(m.day),
		m.from.String(),
		m.to.String(),
		room,
		strings.Join(m.sec.Staff, ", "),
		strings.Join(m.sec.Cohorts, ", "),
	}
}

// building is the building of a meeting's room, or "".
func (m *meeting) building() string {
	if m.room == nil {
		return ""
	}
	return m.room.Building
}

// weekNumbers lists the teaching weeks of a section within the term.
func (v *view) weekNumbers(sec *timetable.Section) []int {
	w := sec.Weeks & v.allWeeks
	if sec.Weeks == 0 {
		w = v.allWeeks
	}
	var out []int
	for n := 1; n <= 64; n++ {
		if w.Has(n) {
			out = append(out, n)
		}
	}
	return out
}
