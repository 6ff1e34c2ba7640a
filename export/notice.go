package export

import (
	"bufio"
	"fmt"
	"io"
	"slices"
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

// Notices writes the change notices of one comparison: per affected staff
// member, cohort or student a text (Text) and an updated calendar
// (Calendar). It resolves the timetable once for all of them.
type Notices struct {
	c    *timetable.Comparison
	cur  *view               // the new timetable as read: meeting numbers as in c's new meetings
	cal  *view               // the same renumbered (Comparison.Renumber): numbers, so UIDs, of the old timetable
	at   map[noticeKey][]int // section and meeting number -> indexes into cur.meetings (one per day of a meeting pattern)
	days *calendarInfo       // the term's dates
	// moves are the students' changes of section (SetSectionChanges), by student
	moves map[string][]SectionChange
}

// SetSectionChanges gives the notices the students' changes of section
// between the two timetables (SectionChanges): a student's Text lists
// them, with the times of the section left and of the section joined, and
// their Calendar cancels the events of the sections they left.
func (n *Notices) SetSectionChanges(changes []SectionChange) {
	n.moves = map[string][]SectionChange{}
	for _, c := range changes {
		n.moves[c.Student] = append(n.moves[c.Student], c)
	}
}

// noticeKey names a meeting of the new timetable.
type noticeKey struct {
	sec string
	num int
}

// NewNotices prepares the notices for comparison c of an earlier
// timetable with s, the new timetable for t (c's new meetings must have
// been read from s). The calendars use c.Renumber(s), so that a meeting
// keeps the UID an earlier calendar gave it. It fails when s does not fit
// t or the term has no dates.
func NewNotices(t *timetable.Term, s *timetable.Schedule, c *timetable.Comparison) (*Notices, error) {
	cur, err := newView(t, s)
	if err != nil {
		return nil, err
	}
	cal, err := newView(t, c.Renumber(s))
	if err != nil {
		return nil, err
	}
	days, err := cur.termDays()
	if err != nil {
		return nil, err
	}
	n := &Notices{c: c, cur: cur, cal: cal, days: days, at: make(map[noticeKey][]int, len(cur.meetings))}
	for i, m := range cur.meetings {
		k := noticeKey{m.sec.ID, m.num}
		n.at[k] = append(n.at[k], i)
	}
	return n, nil
}

// Text writes the change notice of a, one entry of the comparison's
// Affected (a staff member, cohort or student), as plain text ready to
// paste into an e-mail: a subject line, a greeting with their name, then
// per changed meeting what it was and what it is now, in the term's
// wording (weekdays, 24-hour times, rooms with their building, weeks when
// not every week, and the first and last date a new or moved meeting
// takes place), and a closing paragraph that names calendarFile (the
// updated calendar; "" when none is sent).
func (n *Notices) Text(w io.Writer, a timetable.Affected, calendarFile string) error {
	who, ok := NoticeSubject(a)
	if !ok {
		return fmt.Errorf("change notices go to staff, cohorts and students, not to a %s", a.Kind)
	}
	v, t := n.cur, n.cur.t
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
		ch := n.c.Changes[sc.Change]
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
			fmt.Fprintf(bw, "  now: %s%s\n", v.noticePlace(ch.New), n.dates(ch.New))
		}
		if sc.Kind == timetable.ChangeDropped {
			dropped = true
		}
	}
	if who.Kind == WhoStudent {
		for _, mv := range n.moves[who.ID] {
			n.sectionChangeText(bw, mv)
			if mv.From != "" {
				dropped = true
			}
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

// sectionChangeText writes one change of section: the course and part,
// the section left with its earlier meetings, the one joined with its
// meetings and dates.
func (n *Notices) sectionChangeText(w io.Writer, mv SectionChange) {
	what := mv.Course
	if mv.Part != "" {
		what += " " + mv.Part
	}
	switch {
	case mv.From != "" && mv.To != "":
		fmt.Fprintf(w, "\n%s: your section is now %s instead of %s\n", what, mv.To, mv.From)
	case mv.To != "":
		fmt.Fprintf(w, "\n%s: you are now in section %s\n", what, mv.To)
	default:
		fmt.Fprintf(w, "\n%s: you are no longer in section %s\n", what, mv.From)
	}
	for _, m := range n.oldMeetings(mv.From) {
		fmt.Fprintf(w, "  was: %s meeting %d, %s\n", m.Section, m.Number, n.cur.noticePlace(m))
	}
	for _, m := range n.newMeetings(mv.To) {
		fmt.Fprintf(w, "  now: %s meeting %d, %s%s\n", m.Section, m.Number, n.cur.noticePlace(m), n.dates(m))
	}
}

// oldMeetings are the earlier timetable's meetings of the sections in
// list (a SectionChange's From: IDs joined by ", "), in comparison order.
func (n *Notices) oldMeetings(list string) []*timetable.Meeting {
	return n.meetingsOf(list, func(ch *timetable.Change) *timetable.Meeting { return ch.Old })
}

// newMeetings are the new timetable's meetings of the sections in list.
func (n *Notices) newMeetings(list string) []*timetable.Meeting {
	return n.meetingsOf(list, func(ch *timetable.Change) *timetable.Meeting { return ch.New })
}

func (n *Notices) meetingsOf(list string, side func(*timetable.Change) *timetable.Meeting) []*timetable.Meeting {
	if list == "" {
		return nil
	}
	secs := strings.Split(list, ", ")
	var out []*timetable.Meeting
	for i := range n.c.Changes {
		if m := side(&n.c.Changes[i]); m != nil && slices.Contains(secs, m.Section) {
			out = append(out, m)
		}
	}
	return out
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

// noticePlace is "Wednesdays 09:00–10:00 in R2, Annexe, weeks 1-6", or
// for a meeting pattern "Mondays, Wednesdays and Fridays 09:00–09:50 ...".
func (v *view) noticePlace(m *timetable.Meeting) string {
	s := weekdaysText(m.AllDays()) + " " + m.Start.String()
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

// dates is ", from Thu 13 Jan 2028 to Thu 30 Mar 2028" (", on ..." for a
// single date): the dates the new meeting m takes place, holidays and
// weeks outside its section's weeks left out; "" when the timetable does
// not hold m.
func (n *Notices) dates(m *timetable.Meeting) string {
	items, ok := n.at[noticeKey{m.Section, m.Number}]
	if !ok {
		return ""
	}
	var on []time.Time
	for _, i := range items {
		o, _ := n.cur.occurrences(n.days, &n.cur.meetings[i])
		on = append(on, o...)
	}
	slices.SortFunc(on, func(a, b time.Time) int { return a.Compare(b) })
	switch len(on) {
	case 0:
		return " (no date of the term falls on it)"
	case 1:
		return ", on " + noticeDate(on[0])
	}
	return ", from " + noticeDate(on[0]) + " to " + noticeDate(on[len(on)-1])
}

// weekdaysText names days in plain words: "Wednesdays", "Tuesdays and
// Thursdays", "Mondays, Wednesdays and Fridays".
func weekdaysText(days timetable.DaySet) string {
	var names []string
	for _, d := range days.List() {
		names = append(names, d.String()+"s")
	}
	switch n := len(names); n {
	case 0:
		return ""
	case 1:
		return names[0]
	default:
		return strings.Join(names[:n-1], ", ") + " and " + names[n-1]
	}
}

// noticeDate is "Thu 13 Jan 2028".
func noticeDate(d time.Time) string { return strings.TrimSpace(d.Format("Mon 2 Jan 2006")) }
