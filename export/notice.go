package export

import (
	"bufio"
	"fmt"
	"io"
	"strings"
	"time"

	"github.com/termwright/termwright/timetable"
)

// NoticeSubject is the Subject whose notice and calendar an affected
// entry of a comparison gets: staff members, cohorts and students do;
// rooms (ok false) do not, they have no one to write to.
func NoticeSubject(a timetable.Affected) (who Subject, ok bool) {
	switch a.Kind {
	case timetable.SubjectStaff:
		return Subject{Kind: timetable.WhoStaff, ID: a.ID}, true
	case timetable.SubjectCohort:
		return Subject{Kind: timetable.WhoCohort, ID: a.ID}, true
	case timetable.SubjectStudent:
		return Subject{Kind: WhoStudent, ID: a.ID}, true
	}
	return Subject{}, false
}

// WriteNotice writes the change notice of one affected staff member,
// cohort or student as plain text ready to paste into an e-mail: a
// subject line, a greeting with their name, then per changed meeting what
// it was and what it is now, in the term's wording (weekdays, 24-hour
// times, rooms with their building, weeks when not every week, and the
// first and last date a new or moved meeting takes place), and a closing
// paragraph that names calendarFile (the updated calendar, "" when none is
// sent). s is the new timetable for t, c the comparison whose new meetings
// were read from it, a one entry of c.Affected.
func WriteNotice(w io.Writer, t *timetable.Term, s *timetable.Schedule, c *timetable.Comparison, a timetable.Affected, calendarFile string) error {
	who, ok := NoticeSubject(a)
	if !ok {
		return fmt.Errorf("change notices go to staff, cohorts and students, not to a %s", a.Kind)
	}
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	cal, err := v.termDays()
	if err != nil {
		return err
	}
	term := t.Name
	if term == "" {
		term = "the term"
	}
	bw := bufio.NewWriter(w)
	fmt.Fprintf(bw, "Subject: Timetable change for %s — %s\n\n", v.title(who), term)
	fmt.Fprintf(bw, "%s\n\n", v.greeting(who))
	fmt.Fprintf(bw, "%s for %s (%s) has changed:\n", v.whose(who), term, termDates(t))
	dropped := false
	for _, sc := range a.Changes {
		ch := c.Changes[sc.Change]
		m := ch.New
		if m == nil {
			m = ch.Old
		}
		head := map[string]string{timetable.ChangeMoved: "changed", timetable.ChangeAdded: "new", timetable.ChangeDropped: "cancelled"}[sc.Kind]
		fmt.Fprintf(bw, "\n%s %s (%s)\n", m.Section, m.Title, head)
		if sc.Kind != timetable.ChangeAdded && ch.Old != nil {
			fmt.Fprintf(bw, "  was: %s\n", v.noticePlace(ch.Old))
		}
		if sc.Kind != timetable.ChangeDropped && ch.New != nil {
			fmt.Fprintf(bw, "  now: %s%s\n", v.noticePlace(ch.New), v.noticeDates(cal, ch.New))
		}
		if sc.Kind == timetable.ChangeDropped {
			dropped = true
		}
	}
	fmt.Fprintln(bw, "\nEverything else stays as it was.")
	if calendarFile != "" {
		fmt.Fprintf(bw, "\nThe attached calendar file %s holds the whole updated timetable. Importing it updates\n"+
			"the events of an earlier termwright calendar in place (same event identifiers, a higher\n"+
			"sequence number).", calendarFile)
		if dropped {
			fmt.Fprint(bw, " A cancelled meeting is in it as cancelled; if your calendar\nprogram still shows it, delete that meeting's events by hand.")
		}
		fmt.Fprintln(bw)
	}
	return bw.Flush()
}

// greeting is "Dear Dana Pell,", "Dear members of Year one (C1)," or
// "Dear student P1,".
func (v *view) greeting(who Subject) string {
	switch who.Kind {
	case timetable.WhoStaff:
		if s := v.staff[who.ID]; s != nil && s.Name != "" {
			return "Dear " + s.Name + ","
		}
	case timetable.WhoCohort:
		return "Dear members of " + v.title(who) + ","
	case WhoStudent:
		return "Dear student " + who.ID + ","
	}
	return "Dear " + who.ID + ","
}

// whose is "Your timetable" or, for a cohort, "The timetable of Year one (C1)".
func (v *view) whose(who Subject) string {
	if who.Kind == timetable.WhoCohort {
		return "The timetable of " + v.title(who)
	}
	return "Your timetable"
}

// noticePlace is "Wednesdays 09:00–10:00 in R2, Annexe, weeks 1-6".
func (v *view) noticePlace(m *timetable.Meeting) string {
	s := m.Day.String() + "s " + m.Start.String()
	if m.End != 0 {
		s += "–" + m.End.String()
	}
	switch r := v.rooms[m.Room]; {
	case r != nil:
		s += " in " + roomText(r)
	case m.Room != "":
		s += " in " + m.Room
	default:
		s += ", online or off-site"
	}
	if m.Weeks != "" && m.Weeks != "all" {
		s += ", weeks " + m.Weeks
	}
	return s
}

// noticeDates is ", from 13 Jan 2028 to 30 Mar 2028" (", on 13 Jan 2028"
// for a single date): the dates the new meeting m takes place, holidays
// and weeks outside its section's weeks left out; "" when the term has no
// dates or the timetable does not hold m.
func (v *view) noticeDates(cal *calendarInfo, m *timetable.Meeting) string {
	for i := range v.meetings {
		vm := &v.meetings[i]
		if vm.sec.ID != m.Section || vm.num != m.Number || vm.day != m.Day || vm.from != m.Start {
			continue
		}
		on, _ := v.occurrences(cal, vm)
		switch len(on) {
		case 0:
			return " (no date of the term falls on it)"
		case 1:
			return ", on " + noticeDate(on[0])
		}
		return ", from " + noticeDate(on[0]) + " to " + noticeDate(on[len(on)-1])
	}
	return ""
}

// noticeDate is "Thu 13 Jan 2028".
func noticeDate(d time.Time) string { return strings.TrimSpace(d.Format("Mon 2 Jan 2006")) }
