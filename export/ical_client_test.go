package export

import (
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	ics "github.com/arran4/golang-ical"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestPublishedCalendarsParse publishes the demo and the busy term (with
// students) and reads every calendar file Publish wrote with an independent
// iCalendar library (github.com/arran4/golang-ical). Each has what RFC 5545
// requires (§3.6: VERSION 2.0 and PRODID; §3.6.1: UID and DTSTAMP in every
// VEVENT; §3.3.8: SEQUENCE an INTEGER), one VTIMEZONE, unique UIDs, and an
// event per meeting of its subject that takes place. Every occurrence,
// expanded independently from DTSTART, RRULE and EXDATE with the
// VTIMEZONE's own rules, falls on a date in the term that is not a holiday
// and lies in one of the section's weeks (week 1 is the week of the first
// day, Monday to Sunday); for a section placed by a meeting pattern, in
// one of its chosen meeting time's weeks and on one of its days (one event
// per day of the pattern).
func TestPublishedCalendarsParse(t *testing.T) {
	for name, build := range map[string]func() (*timetable.Term, *timetable.Schedule){"demo": demoTerm, "busy": busyTerm, "pattern": patternTerm, "sectioned": sectionedTerm} {
		t.Run(name, func(t *testing.T) {
			term, s := build()
			dir := filepath.Join(t.TempDir(), "out")
			m, err := Publish(dir, term, s, Options{Generated: fixedClock, Students: true})
			require.NoError(t, err)
			v, err := newView(term, s)
			require.NoError(t, err)
			info, err := v.calendar()
			require.NoError(t, err)
			loc, err := time.LoadLocation(term.TimeZone)
			require.NoError(t, err)
			holidays := map[string]bool{}
			for _, h := range term.Holidays {
				holidays[h.Format("2006-01-02")] = true
			}
			first := civil(term.FirstDay)
			monday := first.AddDate(0, 0, -timetable.WeekOrder(first.Weekday()))
			calendars := 0
			for _, f := range m.Files {
				if f.Format != "ics" {
					continue
				}
				calendars++
				kind := map[string]timetable.WhoKind{"staff": timetable.WhoStaff, "room": timetable.WhoRoom, "cohort": timetable.WhoCohort, "student": WhoStudent}[f.Kind]
				who := Subject{kind, f.ID}
				t.Run(f.Path, func(t *testing.T) {
					fh, err := os.Open(filepath.Join(dir, filepath.FromSlash(f.Path)))
					require.NoError(t, err)
					defer fh.Close()
					cal, err := ics.ParseCalendar(fh)
					require.NoError(t, err)
					props := map[string]string{}
					for _, p := range cal.CalendarProperties {
						props[p.IANAToken] = p.Value
					}
					assert.Equal(t, "2.0", props["VERSION"])
					assert.NotEmpty(t, props["PRODID"])
					require.Len(t, cal.Timezones(), 1)
					rules := vtimezoneRules(t, cal)
					items, err := v.of(who)
					require.NoError(t, err)
					want := 0
					for _, i := range items {
						if on, _ := v.occurrences(info, &v.meetings[i]); len(on) > 0 {
							want++
						}
					}
					require.Len(t, cal.Events(), want)
					uids := map[string]bool{}
					for _, e := range cal.Events() {
						uid := e.GetProperty(ics.ComponentPropertyUniqueId)
						require.NotNil(t, uid)
						assert.False(t, uids[uid.Value], "UID repeated")
						uids[uid.Value] = true
						stamp := e.GetProperty(ics.ComponentPropertyDtstamp)
						require.NotNil(t, stamp)
						_, err := time.Parse("20060102T150405Z", stamp.Value)
						assert.NoError(t, err, "DTSTAMP in UTC form")
						seq, err := strconv.ParseInt(e.GetProperty(ics.ComponentPropertySequence).Value, 10, 32)
						assert.NoError(t, err)
						assert.Positive(t, seq)
						id, _, _ := strings.Cut(e.GetProperty(ics.ComponentPropertySummary).Value, " ")
						sec := &term.Sections[term.SectionIndex()[id]]
						weeks, days := sec.Weeks, timetable.DaySet(0x7f)
						for _, p := range s.Placements {
							if p.Section == id && sec.UsesTimes() {
								weeks, days = sec.Times[p.Time-1].Weeks, sec.Times[p.Time-1].Days
							}
						}
						if weeks == 0 {
							weeks = term.AllWeeks()
						}
						occ := expand(t, e, rules)
						require.NotEmpty(t, occ)
						for _, u := range occ {
							local := u.In(loc)
							day := time.Date(local.Year(), local.Month(), local.Day(), 0, 0, 0, 0, time.UTC)
							assert.False(t, day.Before(first) || day.After(civil(term.LastDay)), "%s on %s: outside the term", id, day.Format("2006-01-02"))
							assert.False(t, holidays[day.Format("2006-01-02")], "%s on holiday %s", id, day.Format("2006-01-02"))
							week := int(day.Sub(monday).Hours()/24)/7 + 1
							assert.True(t, weeks.Has(week), "%s on %s: week %d is not one of its weeks", id, day.Format("2006-01-02"), week)
							assert.True(t, days.Has(day.Weekday()), "%s on %s: not one of its days", id, day.Format("2006-01-02"))
						}
					}
				})
			}
			assert.Equal(t, len(term.Staff)+len(term.Rooms)+len(term.Cohorts)+len(v.students), calendars)
		})
	}
}

// TestSectionedStudentCalendars publishes the sectioned term with
// students and reads two students' calendars with the independent
// iCalendar library: st-010, only sectioned (MA110-L1 on Tuesdays at
// 10:00, MA110-T2 on Wednesdays at 14:00, as the fixture places them), has
// exactly those two events, and every occurrence of each falls on that
// weekday and time; st-001, with fixed CS101 (two meetings) and CS102 and
// sectioned MA110-L1 and MA110-T1, has all five.
func TestSectionedStudentCalendars(t *testing.T) {
	term, s := sectionedTerm()
	dir := filepath.Join(t.TempDir(), "out")
	_, err := Publish(dir, term, s, Options{Generated: fixedClock, Students: true})
	require.NoError(t, err)
	loc, err := time.LoadLocation(term.TimeZone)
	require.NoError(t, err)
	read := func(student string) *ics.Calendar {
		fh, err := os.Open(filepath.Join(dir, "calendar", "students", student+".ics"))
		require.NoError(t, err)
		defer fh.Close()
		cal, err := ics.ParseCalendar(fh)
		require.NoError(t, err)
		return cal
	}
	cal := read("st-010")
	rules := vtimezoneRules(t, cal)
	want := map[string]struct {
		day  time.Weekday
		hour int
	}{"MA110-L1": {time.Tuesday, 10}, "MA110-T2": {time.Wednesday, 14}}
	got := map[string]bool{}
	for _, e := range cal.Events() {
		id, _, _ := strings.Cut(e.GetProperty(ics.ComponentPropertySummary).Value, " ")
		w, ok := want[id]
		require.True(t, ok, "st-010 has no section %s", id)
		got[id] = true
		occ := expand(t, e, rules)
		require.NotEmpty(t, occ)
		for _, u := range occ {
			local := u.In(loc)
			assert.Equal(t, w.day, local.Weekday(), id)
			assert.Equal(t, w.hour, local.Hour(), id)
		}
	}
	assert.Len(t, got, 2)

	var ids []string
	for _, e := range read("st-001").Events() {
		id, _, _ := strings.Cut(e.GetProperty(ics.ComponentPropertySummary).Value, " ")
		ids = append(ids, id)
	}
	assert.ElementsMatch(t, []string{"CS101", "CS101", "CS102", "MA110-L1", "MA110-T1"}, ids)
}
