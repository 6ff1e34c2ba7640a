package improve

import (
	"fmt"

	"github.com/termwright/termwright/timetable"
)

// Unsupported says why the annealer cannot work on term t, or "" when it
// can. It moves grid meetings on the period grid and counts the criteria of
// grid terms; the parts of the term model for meeting patterns (pattern
// sections, room choices with preferences, travel times, weekly limits,
// lunch breaks, unavailability limited to some weeks and the relation kinds
// after "same room") are judged by timetable.Check and the engine only.
// Refusing them keeps every timetable it returns exact under timetable.Cost.
func Unsupported(t *timetable.Term) string {
	for i := range t.Sections {
		s := &t.Sections[i]
		switch {
		case s.UsesTimes():
			return fmt.Sprintf("section %q chooses among meeting times", s.ID)
		case len(s.RoomChoices) > 0:
			return fmt.Sprintf("section %q has room choices", s.ID)
		}
	}
	if len(t.Travel) > 0 {
		return "the term has travel times"
	}
	for i := range t.Staff {
		st := &t.Staff[i]
		if st.MaxWeekPeriods > 0 || st.MaxWeekMinutes > 0 || st.MaxWeekDays > 0 || st.Lunch.Set() {
			return fmt.Sprintf("staff %q has weekly limits or a lunch break", st.ID)
		}
	}
	for i := range t.Cohorts {
		if t.Cohorts[i].Lunch.Set() {
			return fmt.Sprintf("cohort %q has a lunch break", t.Cohorts[i].ID)
		}
	}
	all := t.AllWeeks()
	for _, u := range t.Unavailable {
		if u.Weeks != 0 && u.Weeks&all != all {
			return "an unavailable time holds in some teaching weeks only"
		}
	}
	for _, r := range t.Relations {
		if !r.Kind.OnGrid() {
			return fmt.Sprintf("the term has %q relations", r.Kind)
		}
	}
	return ""
}
