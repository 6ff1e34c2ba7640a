package export

import (
	"bytes"
	"fmt"
	"sort"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	ics "github.com/arran4/golang-ical"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func allSubjects(v *view) []Subject {
	var out []Subject
	for _, s := range v.t.Staff {
		out = append(out, Subject{timetable.WhoStaff, s.ID})
	}
	for _, r := range v.t.Rooms {
		out = append(out, Subject{timetable.WhoRoom, r.ID})
	}
	for _, c := range v.t.Cohorts {
		out = append(out, Subject{timetable.WhoCohort, c.ID})
	}
	for _, s := range v.students {
		out = append(out, Subject{WhoStudent, s})
	}
	return out
}

func writeICS(t *testing.T, term *timetable.Term, s *timetable.Schedule, who Subject) []byte {
	t.Helper()
	var buf bytes.Buffer
	require.NoError(t, WriteICS(&buf, term, s, who, Options{Generated: fixedClock}))
	return buf.Bytes()
}

func TestICSGolden(t *testing.T) {
	term, s := demoTerm()
	golden(t, "staff-S1.ics", writeICS(t, term, s, Subject{timetable.WhoStaff, "S1"}))
	golden(t, "cohort-C2.ics", writeICS(t, term, s, Subject{timetable.WhoCohort, "C2"}))
}

// TestICSLines checks RFC 5545 §3.1: every content line ends in CRLF, no
// physical line exceeds 75 octets, folding never splits a UTF-8 sequence,
// and a continuation line starts with one space.
func TestICSLines(t *testing.T) {
	term, s := demoTerm()
	term.Sections[2].Title = strings.Repeat("Ωμέγα ", 40) // long multi-byte text forces folding
	v, err := newView(term, s)
	require.NoError(t, err)
	for _, who := range allSubjects(v) {
		t.Run(kindWord(who.Kind)+"/"+who.ID, func(t *testing.T) {
			out := writeICS(t, term, s, who)
			require.True(t, bytes.HasSuffix(out, []byte("END:VCALENDAR\r\n")))
			lines := strings.Split(strings.TrimSuffix(string(out), "\r\n"), "\r\n")
			for i, l := range lines {
				assert.LessOrEqual(t, len(l), 75, "line %d", i+1)
				assert.NotContains(t, l, "\n", "bare LF in line %d", i+1)
				assert.NotContains(t, l, "\r", "bare CR in line %d", i+1)
				assert.True(t, utf8.ValidString(l), "line %d splits a UTF-8 sequence", i+1)
			}
		})
	}
}

func TestICSFolding(t *testing.T) {
	for _, n := range []int{0, 74, 75, 76, 150, 151, 400} {
		for _, unit := range []string{"a", "é", "€", "😀"} {
			s := "X:" + strings.Repeat(unit, n)
			var buf bytes.Buffer
			w := newICSWriter(&buf)
			w.line(s)
			require.NoError(t, w.flush())
			// RFC 5545 §3.1: unfolding removes every CRLF followed by one space.
			unfolded := strings.ReplaceAll(strings.TrimSuffix(buf.String(), "\r\n"), "\r\n ", "")
			assert.Equal(t, s, unfolded, "n=%d unit=%q", n, unit)
			for _, l := range strings.Split(strings.TrimSuffix(buf.String(), "\r\n"), "\r\n") {
				assert.LessOrEqual(t, len(l), 75)
				assert.True(t, utf8.ValidString(strings.TrimPrefix(l, " ")))
			}
		}
	}
}

// TestICSText checks TEXT escaping, RFC 5545 §3.3.11: "\\" for backslash,
// "\;" and "\," for semicolon and comma, "\n" for a line break.
func TestICSText(t *testing.T) {
	tests := []struct{ in, want string }{
		{"plain", "plain"},
		{`a\b`, `a\\b`},
		{"a;b,c", `a\;b\,c`},
		{"line1\nline2", `line1\nline2`},
		{"crlf\r\nend", `crlf\nend`},
		{"bell\x07tab\t", "belltab\t"},
		{"Zoë: ok", "Zoë: ok"}, // a colon needs no escape in TEXT
	}
	for _, tc := range tests {
		t.Run(tc.in, func(t *testing.T) {
			assert.Equal(t, tc.want, icsText(tc.in))
			assert.Equal(t, strings.ReplaceAll(strings.ReplaceAll(tc.in, "\r\n", "\n"), "\x07", ""), ics.FromText(icsText(tc.in)))
		})
	}
}

// TestICSParses reads every calendar back with a general-purpose iCalendar
// library (github.com/arran4/golang-ical) and checks its events.
func TestICSParses(t *testing.T) {
	term, s := demoTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	uids := map[string]bool{}
	for _, who := range allSubjects(v) {
		t.Run(kindWord(who.Kind)+"/"+who.ID, func(t *testing.T) {
			cal, err := ics.ParseCalendar(bytes.NewReader(writeICS(t, term, s, who)))
			require.NoError(t, err)
			items, _ := v.of(who)
			require.Len(t, cal.Events(), len(items))
			require.Len(t, cal.Timezones(), 1)
			for k, e := range cal.Events() {
				m := &v.meetings[items[k]]
				uid := e.GetProperty(ics.ComponentPropertyUniqueId).Value
				assert.False(t, uids[uid], "UID %s repeated", uid)
				uids[uid] = true
				assert.Equal(t, m.sec.ID+" "+m.sec.Title, e.GetProperty(ics.ComponentPropertySummary).Value)
				dt := e.GetProperty(ics.ComponentPropertyDtStart)
				assert.Equal(t, []string{"Europe/Dublin"}, dt.ICalParameters["TZID"])
				if m.room != nil {
					assert.Equal(t, roomText(m.room), e.GetProperty(ics.ComponentPropertyLocation).Value)
				} else {
					assert.Nil(t, e.GetProperty(ics.ComponentPropertyLocation))
				}
				desc := e.GetProperty(ics.ComponentPropertyDescription).Value
				assert.Contains(t, desc, m.sec.Title)
				for _, n := range v.staffNames(m.sec) {
					assert.Contains(t, desc, n)
				}
			}
		})
	}
}

func TestICSStableUIDs(t *testing.T) {
	term, s := demoTerm()
	a := writeICS(t, term, s, Subject{timetable.WhoStaff, "S1"})
	// Publishing again later, with a meeting moved, keeps the UIDs and raises SEQUENCE.
	s.Placements[0].Period = term.PeriodAt(time.Monday, 14*60)
	var buf bytes.Buffer
	require.NoError(t, WriteICS(&buf, term, s, Subject{timetable.WhoStaff, "S1"}, Options{Generated: fixedClock.Add(48 * time.Hour)}))
	uidsOf := func(b []byte) []string {
		cal, err := ics.ParseCalendar(bytes.NewReader(b))
		require.NoError(t, err)
		var out []string
		for _, e := range cal.Events() {
			out = append(out, e.GetProperty(ics.ComponentPropertyUniqueId).Value)
		}
		sort.Strings(out)
		return out
	}
	assert.Equal(t, uidsOf(a), uidsOf(buf.Bytes()))
	// Seconds from 2020-01-01 to 2027-08-30 14:05 UTC: (2798 days (2020 and
	// 2024 are leap years) * 1440 + 845 minutes) * 60.
	assert.Contains(t, string(a), "SEQUENCE:241797900\r\n")
	assert.Contains(t, buf.String(), "SEQUENCE:241970700\r\n")
	assert.NotEqual(t, eventUID("T", "A", 1, Subject{timetable.WhoStaff, "x"}), eventUID("T", "A", 1, Subject{timetable.WhoRoom, "x"}))
}

// TestICSSequenceWithinAMinute: two publications in the same minute, one
// second apart, must not share a SEQUENCE, or a client that already has
// the first keeps it (RFC 5545 §3.8.7.4: the organizer increments SEQUENCE
// on each significant revision); SEQUENCE stays an INTEGER (§3.3.8, at most
// 2147483647) even far in the future.
func TestICSSequenceWithinAMinute(t *testing.T) {
	term, s := demoTerm()
	seqOf := func(gen time.Time) string {
		var buf bytes.Buffer
		require.NoError(t, WriteICS(&buf, term, s, Subject{timetable.WhoStaff, "S1"}, Options{Generated: gen}))
		cal, err := ics.ParseCalendar(bytes.NewReader(buf.Bytes()))
		require.NoError(t, err)
		require.NotEmpty(t, cal.Events())
		return cal.Events()[0].GetProperty(ics.ComponentPropertySequence).Value
	}
	first := seqOf(fixedClock.Add(10 * time.Second))
	second := seqOf(fixedClock.Add(11 * time.Second))
	assert.NotEqual(t, first, second)
	assert.Less(t, len(first), len(second)+1)
	assert.Less(t, first, second) // same length, so text order is number order
	assert.Equal(t, "2147483647", seqOf(time.Date(2200, 1, 1, 0, 0, 0, 0, time.UTC)))
	assert.Equal(t, "0", seqOf(time.Date(2019, 1, 1, 0, 0, 0, 0, time.UTC)))
}

// tzRule is one observance of a parsed VTIMEZONE.
type tzRule struct {
	onset time.Time // UTC instant the observance starts
	to    int       // UTC offset in seconds from then on
}

func parseOffset(t *testing.T, s string) int {
	var h, m int
	_, err := fmt.Sscanf(s[1:], "%02d%02d", &h, &m)
	require.NoError(t, err, s)
	off := h*3600 + m*60
	if s[0] == '-' {
		off = -off
	}
	return off
}

// vtimezoneRules reads the observances of the calendar's VTIMEZONE.
func vtimezoneRules(t *testing.T, cal *ics.Calendar) []tzRule {
	var rules []tzRule
	for _, c := range cal.Timezones()[0].Components {
		var cb *ics.ComponentBase
		switch o := c.(type) {
		case *ics.Standard:
			cb = &o.ComponentBase
		case *ics.Daylight:
			cb = &o.ComponentBase
		default:
			continue
		}
		local, err := time.Parse("20060102T150405", cb.GetProperty(ics.ComponentPropertyDtStart).Value)
		require.NoError(t, err)
		from := parseOffset(t, cb.GetProperty(ics.ComponentProperty(ics.PropertyTzoffsetfrom)).Value)
		to := parseOffset(t, cb.GetProperty(ics.ComponentProperty(ics.PropertyTzoffsetto)).Value)
		rules = append(rules, tzRule{onset: local.Add(-time.Duration(from) * time.Second), to: to})
	}
	sort.Slice(rules, func(i, j int) bool { return rules[i].onset.Before(rules[j].onset) })
	return rules
}

// toUTC resolves a local wall time with the VTIMEZONE rules alone (RFC 5545
// §3.6.5: the observance in effect is the latest onset not after the time).
func toUTC(rules []tzRule, local time.Time) time.Time {
	off := rules[0].to
	for _, r := range rules {
		if !local.Add(-time.Duration(r.to) * time.Second).Before(r.onset) {
			off = r.to
		}
	}
	return local.Add(-time.Duration(off) * time.Second)
}

// expand is an independent expansion of a FREQ=WEEKLY;UNTIL rule with
// EXDATEs (RFC 5545 §3.3.10, §3.8.5.1), returning the occurrences in UTC.
func expand(t *testing.T, e *ics.VEvent, rules []tzRule) []time.Time {
	start, err := time.Parse("20060102T150405", e.GetProperty(ics.ComponentPropertyDtStart).Value)
	require.NoError(t, err)
	rrule := e.GetProperty(ics.ComponentPropertyRrule).Value
	require.True(t, strings.HasPrefix(rrule, "FREQ=WEEKLY;UNTIL="), rrule)
	until, err := time.Parse("20060102T150405Z", strings.TrimPrefix(rrule, "FREQ=WEEKLY;UNTIL="))
	require.NoError(t, err)
	ex := map[time.Time]bool{}
	if p := e.GetProperty(ics.ComponentPropertyExdate); p != nil {
		for _, d := range strings.Split(p.Value, ",") {
			l, err := time.Parse("20060102T150405", d)
			require.NoError(t, err)
			ex[l] = true
		}
	}
	var out []time.Time
	for l := start; !toUTC(rules, l).After(until); l = l.AddDate(0, 0, 7) {
		if !ex[l] {
			out = append(out, toUTC(rules, l))
		}
	}
	return out
}

func utcTimes(t *testing.T, ss ...string) []time.Time {
	var out []time.Time
	for _, s := range ss {
		u, err := time.Parse("2006-01-02 15:04", s)
		require.NoError(t, err)
		out = append(out, u)
	}
	return out
}

// TestICSExpansion expands each weekly rule independently and compares the
// occurrences with dates worked out by hand from the 2027 calendar. Term:
// Mon 13 Sep – Fri 10 Dec 2027, holiday Mon 25 Oct 2027, zone
// Europe/Dublin. Irish Standard Time (UTC+1) ends at 01:00 UTC on the last
// Sunday of October (Directive 2000/84/EC, art. 2-3), 31 Oct 2027, after
// which Dublin is on UTC+0; 2027 dates from the Gregorian calendar.
func TestICSExpansion(t *testing.T) {
	term, s := demoTerm()
	want := map[string][]time.Time{
		// Monday 09:00 local, all weeks, 25 Oct left out.
		"CS101#1": utcTimes(t, "2027-09-13 08:00", "2027-09-20 08:00", "2027-09-27 08:00", "2027-10-04 08:00",
			"2027-10-11 08:00", "2027-10-18 08:00", "2027-11-01 09:00", "2027-11-08 09:00", "2027-11-15 09:00",
			"2027-11-22 09:00", "2027-11-29 09:00", "2027-12-06 09:00"),
		// Thursday 14:00 local, weeks 1-6.
		"CH201#1": utcTimes(t, "2027-09-16 13:00", "2027-09-23 13:00", "2027-09-30 13:00", "2027-10-07 13:00",
			"2027-10-14 13:00", "2027-10-21 13:00"),
		// Thursday 14:00 local, weeks 7-13 (week 7 is 25-31 Oct).
		"CH202#1": utcTimes(t, "2027-10-28 13:00", "2027-11-04 14:00", "2027-11-11 14:00", "2027-11-18 14:00",
			"2027-11-25 14:00", "2027-12-02 14:00", "2027-12-09 14:00"),
		// Wednesday 10:00 local, all weeks.
		"CS101#2": utcTimes(t, "2027-09-15 09:00", "2027-09-22 09:00", "2027-09-29 09:00", "2027-10-06 09:00",
			"2027-10-13 09:00", "2027-10-20 09:00", "2027-10-27 09:00", "2027-11-03 10:00", "2027-11-10 10:00",
			"2027-11-17 10:00", "2027-11-24 10:00", "2027-12-01 10:00", "2027-12-08 10:00"),
	}
	for _, who := range []Subject{{timetable.WhoStaff, "S1"}, {timetable.WhoRoom, "L2"}, {WhoStudent, "st-002"}} {
		cal, err := ics.ParseCalendar(bytes.NewReader(writeICS(t, term, s, who)))
		require.NoError(t, err)
		rules := vtimezoneRules(t, cal)
		for _, e := range cal.Events() {
			desc := e.GetProperty(ics.ComponentPropertyDescription).Value
			var sec string
			var num, of int
			_, err := fmt.Sscanf(desc, "Section %s meeting %d of %d", &sec, &num, &of)
			require.NoError(t, err, desc)
			key := fmt.Sprintf("%s#%d", strings.TrimSuffix(sec, ","), num)
			got := expand(t, e, rules)
			if w, ok := want[key]; ok {
				assert.Equal(t, w, got, "%s in %s's calendar", key, who.ID)
			}
			// Whatever the event, every occurrence agrees with Go's own zone data.
			loc, _ := time.LoadLocation("Europe/Dublin")
			for _, u := range got {
				assert.Equal(t, u.In(loc).Format("15:04"), e.GetProperty(ics.ComponentPropertyDtStart).Value[9:11]+":"+e.GetProperty(ics.ComponentPropertyDtStart).Value[11:13])
			}
		}
	}
}

func TestObservances(t *testing.T) {
	// Europe/Dublin: IST (+0100) from 01:00 UTC on the last Sunday of
	// March, GMT (+0000) from 01:00 UTC on the last Sunday of October
	// (Directive 2000/84/EC); 2027: 28 March and 31 October.
	dublin, _ := time.LoadLocation("Europe/Dublin")
	obs := observances(dublin, date(2027, 9, 1), date(2027, 12, 1))
	require.Len(t, obs, 3)
	assert.Equal(t, observance{daylight: true, start: "20270328T010000", from: 0, to: 3600, name: "IST"}, obs[1])
	assert.Equal(t, observance{daylight: false, start: "20271031T020000", from: 3600, to: 0, name: "GMT"}, obs[2])
	assert.False(t, obs[0].daylight)

	// America/New_York: EDT from 2 a.m. on the second Sunday of March, EST
	// from 2 a.m. on the first Sunday of November (Energy Policy Act of
	// 2005, §110); 2028: 12 March and 5 November.
	ny, _ := time.LoadLocation("America/New_York")
	obs = observances(ny, date(2028, 1, 10), date(2028, 5, 1))
	require.Len(t, obs, 3)
	assert.Equal(t, "20280312T020000", obs[1].start)
	assert.Equal(t, "20281105T020000", obs[2].start)
	assert.Equal(t, -4*3600, obs[1].to)

	obs = observances(time.UTC, date(2028, 1, 10), date(2028, 5, 1))
	assert.Equal(t, []observance{{start: "19700101T000000", name: "UTC"}}, obs)
	assert.Equal(t, "+0000", offsetText(0))
	assert.Equal(t, "-0330", offsetText(-3*3600-30*60))
	assert.Equal(t, "+0545", offsetText(5*3600+45*60))
	assert.Equal(t, "+003430", offsetText(34*60+30))
}

func TestICSErrors(t *testing.T) {
	term, s := demoTerm()
	term.TimeZone = "Mars/Olympus"
	err := WriteICS(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "S1"}, Options{})
	require.Error(t, err)
	assert.Contains(t, err.Error(), "Time zone")
	term.TimeZone = "UTC"
	err = WriteICS(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "nobody"}, Options{})
	assert.ErrorContains(t, err, `"nobody"`)
}

// FuzzICSTitle writes a calendar whose section title is arbitrary text and
// reads it back: it always parses, keeps every line within 75 octets
// (RFC 5545 §3.1), and the SUMMARY unescapes (§3.3.11) to the title with
// only control characters removed and line breaks kept.
func FuzzICSTitle(f *testing.F) {
	for _, s := range []string{"", "a;b,c\\d", "line\nbreak", "Ωμέγα ✓ 😀", strings.Repeat("é", 80), "\x00\x7f\r\n"} {
		f.Add(s)
	}
	term, s := demoTerm()
	f.Fuzz(func(t *testing.T, title string) {
		if !utf8.ValidString(title) {
			title = strings.ToValidUTF8(title, "\uFFFD")
		}
		term.Sections[0].Title = title
		var buf bytes.Buffer
		require.NoError(t, WriteICS(&buf, term, s, Subject{timetable.WhoStaff, "S1"}, Options{Generated: fixedClock}))
		for _, l := range strings.Split(strings.TrimSuffix(buf.String(), "\r\n"), "\r\n") {
			if len(l) > 75 || !utf8.ValidString(l) {
				t.Fatalf("bad line %q", l)
			}
		}
		cal, err := ics.ParseCalendar(bytes.NewReader(buf.Bytes()))
		require.NoError(t, err)
		want := strings.ReplaceAll(title, "\r\n", "\n")
		want = strings.Map(func(r rune) rune {
			if r == '\r' {
				return '\n'
			}
			if (r < 0x20 && r != '\n' && r != '\t') || r == 0x7f {
				return -1
			}
			return r
		}, want)
		got := cal.Events()[0].GetProperty(ics.ComponentPropertySummary).Value
		if got != "CS101 "+want {
			t.Fatalf("SUMMARY %q, want %q", got, "CS101 "+want)
		}
	})
}
