package export

import (
	"bytes"
	"strings"
	"testing"
	"time"

	ics "github.com/arran4/golang-ical"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// noticeTerm is a one-section invented term: Mon and Tue 09:00–10:00,
// 10 Jan – 21 Jan 2028 (two teaching weeks), staff S1 and room R1.
func noticeTerm() (*timetable.Term, *timetable.Schedule) {
	t := &timetable.Term{
		Name: "Short 2028", TimeZone: "Europe/Dublin",
		FirstDay: time.Date(2028, 1, 10, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2028, 1, 21, 0, 0, 0, 0, time.UTC),
		Periods: []timetable.Period{{Index: 0, Day: time.Monday, Start: 540, End: 600}, {Index: 1, Day: time.Tuesday, Start: 540, End: 600}},
		Rooms:   []timetable.Room{{ID: "R1", Capacity: 10}},
		Staff:   []timetable.Staff{{ID: "S1", Name: "Ines Karr"}},
	}
	t.Sections = []timetable.Section{{ID: "A", Title: "Acoustics", Staff: []string{"S1"}, Meetings: 1, Length: 1, Size: 5, Weeks: t.AllWeeks()}}
	return t, &timetable.Schedule{Placements: []timetable.Placement{{Section: "A", Meeting: 1, Period: 1, Room: "R1"}}}
}

func TestNoticeSubject(t *testing.T) {
	for _, tc := range []struct {
		kind string
		want timetable.WhoKind
		ok   bool
	}{
		{timetable.SubjectStaff, timetable.WhoStaff, true},
		{timetable.SubjectCohort, timetable.WhoCohort, true},
		{timetable.SubjectStudent, WhoStudent, true},
		{timetable.SubjectRoom, 0, false},
	} {
		who, ok := NoticeSubject(timetable.Affected{Kind: tc.kind, ID: "X"})
		assert.Equal(t, tc.ok, ok, tc.kind)
		assert.Equal(t, tc.want, who.Kind, tc.kind)
	}
	term, s := noticeTerm()
	n, err := NewNotices(term, s, &timetable.Comparison{})
	require.NoError(t, err)
	assert.ErrorContains(t, n.Text(&bytes.Buffer{}, timetable.Affected{Kind: timetable.SubjectRoom, ID: "R1"}, ""), "not to a room")
	term.FirstDay = time.Time{}
	_, err = NewNotices(term, s, &timetable.Comparison{})
	assert.ErrorContains(t, err, "First day", "dates are needed")
}

// TestWriteNoticeMoved checks one moved meeting's notice, worked out by
// hand: Mon → Tue, two Tuesdays in the term (11 and 18 Jan 2028).
func TestWriteNoticeMoved(t *testing.T) {
	term, s := noticeTerm()
	old := timetable.Meeting{Section: "A", Number: 1, Title: "Acoustics", Day: time.Monday, Start: 540, End: 600, Room: "R1", Weeks: "all", Staff: []string{"S1"}}
	cur := old
	cur.Day = time.Tuesday
	c := timetable.Compare([]timetable.Meeting{old}, []timetable.Meeting{cur})
	aff := c.Affected(nil)
	require.Len(t, aff, 2) // S1 and R1
	var b bytes.Buffer
	n, err := NewNotices(term, s, c)
	require.NoError(t, err)
	require.NoError(t, n.Text(&b, aff[0], ""))
	assert.Equal(t, "Subject: Timetable change for Ines Karr (S1) — Short 2028\n\n"+
		"Dear Ines Karr,\n\n"+
		"Your timetable for Short 2028 (10 Jan 2028 – 21 Jan 2028) has changed:\n\n"+
		"A Acoustics (changed)\n"+
		"  was: Mondays 09:00–10:00 in R1\n"+
		"  now: Tuesdays 09:00–10:00 in R1, from Tue 11 Jan 2028 to Tue 18 Jan 2028\n\n"+
		"Everything else stays as it was.\n", b.String())
}

// TestWriteNoticeICSCancelled parses the calendar with the independent
// library github.com/arran4/golang-ical: the live event and the cancelled
// one (RFC 5545 §3.8.1.11 STATUS:CANCELLED) under the UID the earlier
// meeting had; a cancelled meeting without an end has no DTEND (§3.8.2.2
// wants DTEND after DTSTART; §3.6.1 lets it be left out).
func TestWriteNoticeICSCancelled(t *testing.T) {
	term, s := noticeTerm()
	who := Subject{Kind: timetable.WhoStaff, ID: "S1"}
	gone := timetable.Meeting{Section: "Z", Number: 2, Title: "Zoology", Day: time.Wednesday, Start: 600}
	var b bytes.Buffer
	n, err := NewNotices(term, s, &timetable.Comparison{})
	require.NoError(t, err)
	require.NoError(t, n.Calendar(&b, who, []timetable.Meeting{gone}, Options{Generated: time.Date(2028, 1, 5, 8, 0, 0, 0, time.UTC)}))
	cal, err := ics.ParseCalendar(bytes.NewReader(b.Bytes()))
	require.NoError(t, err)
	evs := cal.Events()
	require.Len(t, evs, 2)
	assert.Equal(t, eventUID("Short 2028", "A", 1, who), evs[0].GetProperty(ics.ComponentPropertyUniqueId).Value)
	assert.Nil(t, evs[0].GetProperty(ics.ComponentPropertyStatus))
	c := evs[1]
	assert.Equal(t, eventUID("Short 2028", "Z", 2, who), c.GetProperty(ics.ComponentPropertyUniqueId).Value)
	assert.Equal(t, "CANCELLED", c.GetProperty(ics.ComponentPropertyStatus).Value)
	assert.Equal(t, "20280112T100000", c.GetProperty(ics.ComponentPropertyDtStart).Value, "the term's first Wednesday")
	assert.Nil(t, c.GetProperty(ics.ComponentPropertyDtEnd))
	assert.Equal(t, evs[0].GetProperty(ics.ComponentPropertySequence).Value, c.GetProperty(ics.ComponentPropertySequence).Value)
	// The rest of the file is WriteICS's: the same bytes up to the cancelled event.
	var plain bytes.Buffer
	require.NoError(t, WriteICS(&plain, term, s, who, Options{Generated: time.Date(2028, 1, 5, 8, 0, 0, 0, time.UTC)}))
	head, _, _ := strings.Cut(b.String(), "BEGIN:VEVENT\r\nUID:"+eventUID("Short 2028", "Z", 2, who))
	assert.Equal(t, strings.TrimSuffix(plain.String(), "END:VCALENDAR\r\n"), head)
}
