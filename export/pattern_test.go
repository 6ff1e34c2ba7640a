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

// TestPatternMasterRows checks the master sheet of a mixed term: one row
// per pattern placement with all its days, its meeting time's start and
// end and its weeks in the Sections sheet's form, worked out by hand from
// patternTerm's meeting times (09:00 + 50 min = 09:50, 10:30 + 75 min =
// 11:45, 14:00 + 170 min = 16:50, 13:00 + 75 min = 14:15); the grid
// sections' rows stay as they are.
func TestPatternMasterRows(t *testing.T) {
	term, s := patternTerm()
	f := openWorkbook(t, term, s, Options{Generated: fixedClock})
	rows, err := f.GetRows(timetable.TimetableSheet)
	require.NoError(t, err)
	// 7 grid meetings + 4 pattern placements (not 9 days of patterns)
	require.Len(t, rows, 1+7+4)
	bySection := map[string][]string{}
	for _, r := range rows[1:] {
		if strings.HasPrefix(r[0], "MA") || strings.HasPrefix(r[0], "PH") || strings.HasPrefix(r[0], "EN") {
			bySection[r[0]] = r[2:10]
		}
	}
	assert.Equal(t, map[string][]string{
		"MA110": {"1", "Mon Wed Fri", "09:00", "09:50", "A1", "S6", "C3", "all"},
		"MA111": {"1", "Tue Thu", "10:30", "11:45", "A1", "S6", "C3", "all"},
		"PH120": {"1", "Tue", "14:00", "16:50", "L2", "S5", "C3", "odd"},
		"EN130": {"1", "Mon Wed", "13:00", "14:15", "R999", "S6", "C3", "3-6"},
	}, bySection)
	_, grid := demoTerm()
	var demoRows int
	for _, r := range rows[1:] {
		if !strings.HasPrefix(r[0], "MA") && !strings.HasPrefix(r[0], "PH") && !strings.HasPrefix(r[0], "EN") {
			demoRows++
		}
	}
	assert.Equal(t, len(grid.Placements), demoRows)
}

// TestPatternGoldens pins the CSV, JSON and two calendars of the mixed term.
func TestPatternGoldens(t *testing.T) {
	term, s := patternTerm()
	var b bytes.Buffer
	require.NoError(t, WriteTimetableCSV(&b, term, s))
	golden(t, "pattern-timetable.csv", b.Bytes())
	b.Reset()
	require.NoError(t, WriteTimetableJSON(&b, term, s))
	golden(t, "pattern-timetable.json", b.Bytes())
	for _, id := range []string{"S5", "S6"} {
		b.Reset()
		require.NoError(t, WriteICS(&b, term, s, Subject{timetable.WhoStaff, id}, Options{Generated: fixedClock}))
		golden(t, "pattern-staff-"+id+".ics", b.Bytes())
	}
}

// TestPatternGridRows checks the rows of the weekly grids of the mixed
// term: the pieces between every clock time at which a period or a
// meeting starts or ends (the hourly periods 09:00-13:00 and 14:00-17:00
// with the pattern times 09:50, 10:30, 11:45, 13:00-14:15 and 16:50), the
// lunch hour included because the block course covers it.
func TestPatternGridRows(t *testing.T) {
	term, s := patternTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	var got []string
	for _, r := range v.rows {
		got = append(got, r.from.String()+"-"+r.to.String())
	}
	assert.Equal(t, []string{"09:00-09:50", "09:50-10:00", "10:00-10:30", "10:30-11:00", "11:00-11:45", "11:45-12:00",
		"12:00-13:00", "13:00-14:00", "14:00-14:15", "14:15-15:00", "15:00-16:00", "16:00-16:50", "16:50-17:00"}, got)
	for _, m := range v.meetings {
		assert.Equal(t, m.from, v.rows[m.r0].from, "%s starts at the top of its first row", m.sec.ID)
		assert.Equal(t, m.to, v.rows[m.r1].to, "%s ends at the bottom of its last row", m.sec.ID)
	}
	// A grid term keeps its grid: one row per distinct period time.
	dt, ds := demoTerm()
	dv, err := newView(dt, ds)
	require.NoError(t, err)
	assert.False(t, dv.minutes)
	assert.Len(t, dv.rows, 7)
}

// TestPatternBlocksToScale checks that on a PDF page of the mixed term
// every meeting's block sits at its real clock time: the grid is drawn to
// scale, so the block's top lies (start - 09:00) minutes below the grid's
// top and its height is its length, at one scale for the whole page
// (blocks are inset by 0.5 mm on each side).
func TestPatternBlocksToScale(t *testing.T) {
	term, s := patternTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	d, err := v.newPDF(Options{Generated: fixedClock}, "test")
	require.NoError(t, err)
	g := d.geo()
	require.NotNil(t, g.ys)
	top := g.ys[0]
	perMin := (g.ys[len(g.ys)-1] - top) / float64(17*60-9*60)
	for _, who := range []Subject{{timetable.WhoStaff, "S6"}, {timetable.WhoRoom, "L2"}, {timetable.WhoCohort, "C3"}} {
		items, err := v.of(who)
		require.NoError(t, err)
		for _, cl := range v.clusters(items) {
			for _, b := range v.boxes(cl) {
				m := &v.meetings[b.item]
				_, y, _, h := d.boxRect(g, b)
				if len(cl.items) > 1 { // stacked: the area is shared
					continue
				}
				assert.InDelta(t, float64(m.from-9*60)*perMin, y-0.5-top, 1e-6, "%s top", m.sec.ID)
				assert.InDelta(t, float64(m.to-m.from)*perMin, h+1, 1e-6, "%s height", m.sec.ID)
			}
		}
	}
}

// TestPatternReadsBack writes the mixed term's timetable workbook and CSV
// and reads both back with timetable.ReadSchedule: the pattern placements
// come back with their meeting time (Time) and Period -1, the grid ones as
// before, with no problem reported.
func TestPatternReadsBack(t *testing.T) {
	term, s := patternTerm()
	xlsx, csvPath := writeTimetableFiles(t, t.TempDir(), term, s)
	assertReadsBack(t, term, s, xlsx, csvPath)
}

// TestPatternCalendarDates parses the calendars of S5 (the odd-week lab)
// and S6 (a Mon Wed Fri class, a Tue Thu class and a block course) with an
// independent library (github.com/arran4/golang-ical) and checks the dates
// worked out by hand:
//
//   - The term starts on Monday 13 Sep 2027, so week 3 starts on Monday
//     27 Sep and week 6 on Monday 18 Oct. EN130 (Mon Wed 13:00-14:15,
//     weeks 3-6) is two events: Mondays from 27 Sep to 18 Oct and
//     Wednesdays from 29 Sep to 20 Oct. Ireland keeps summer time (UTC+1)
//     until the last Sunday of October (31 Oct 2027; EU Directive
//     2000/84/EC), so UNTIL is 12:00 UTC (RFC 5545 §3.3.10: UNTIL in UTC
//     with a TZID start); no EXDATE (no holiday in those weeks).
//   - PH120 (Tue 14:00-16:50, odd weeks of 13) meets on Tue 14 Sep (week
//     1), 28 Sep, 12 Oct, 26 Oct, 9 Nov, 23 Nov and 7 Dec (week 13); the
//     even-week Tuesdays in between, 21 Sep, 5 Oct, 19 Oct, 2 Nov, 16 Nov
//     and 30 Nov, are EXDATEs (§3.8.5.1). 7 Dec is winter time (UTC+0):
//     UNTIL 14:00 UTC.
//   - MA110 (Mon Wed Fri 09:00-09:50, every week) is three events; the
//     Monday one skips the holiday Mon 25 Oct with an EXDATE and ends on
//     Mon 6 Dec; the Friday one ends on Fri 10 Dec, the term's last day.
//
// The weekdays of these dates are checked with Go's time package.
func TestPatternCalendarDates(t *testing.T) {
	term, s := patternTerm()
	require.Equal(t, time.Monday, term.FirstDay.Weekday())
	type ev struct{ start, end, until, exdate string }
	want := map[string][]ev{
		"S6": {
			{"20270913T090000", "20270913T095000", "20271206T090000Z", "20271025T090000"},
			{"20270927T130000", "20270927T141500", "20271018T120000Z", ""},
			{"20270914T103000", "20270914T114500", "20271207T103000Z", ""},
			{"20270915T090000", "20270915T095000", "20271208T090000Z", ""},
			{"20270929T130000", "20270929T141500", "20271020T120000Z", ""},
			{"20270916T103000", "20270916T114500", "20271209T103000Z", ""},
			{"20270917T090000", "20270917T095000", "20271210T090000Z", ""},
		},
		"S5": {
			{"20270914T140000", "20270914T165000", "20271207T140000Z",
				"20270921T140000,20271005T140000,20271019T140000,20271102T140000,20271116T140000,20271130T140000"},
		},
	}
	for id, events := range want {
		var b bytes.Buffer
		require.NoError(t, WriteICS(&b, term, s, Subject{timetable.WhoStaff, id}, Options{Generated: fixedClock}))
		cal, err := ics.ParseCalendar(&b)
		require.NoError(t, err)
		var got []ev
		for _, e := range cal.Events() {
			x := ev{start: e.GetProperty(ics.ComponentPropertyDtStart).Value, end: e.GetProperty(ics.ComponentPropertyDtEnd).Value}
			if !strings.HasPrefix(e.GetProperty(ics.ComponentPropertySummary).Value, "MA") &&
				!strings.HasPrefix(e.GetProperty(ics.ComponentPropertySummary).Value, "EN") &&
				!strings.HasPrefix(e.GetProperty(ics.ComponentPropertySummary).Value, "PH") {
				continue
			}
			rule := e.GetProperty(ics.ComponentPropertyRrule).Value
			_, x.until, _ = strings.Cut(rule, "UNTIL=")
			require.True(t, strings.HasPrefix(rule, "FREQ=WEEKLY;"), rule)
			if p := e.GetProperty(ics.ComponentPropertyExdate); p != nil {
				x.exdate = p.Value
			}
			got = append(got, x)
		}
		assert.Equal(t, events, got, id)
	}
	for _, d := range []string{"2027-09-27", "2027-10-18", "2027-12-06"} {
		day, _ := time.Parse("2006-01-02", d)
		assert.Equal(t, time.Monday, day.Weekday(), d)
	}
	for _, d := range []string{"2027-09-14", "2027-12-07", "2027-09-21", "2027-11-30"} {
		day, _ := time.Parse("2006-01-02", d)
		assert.Equal(t, time.Tuesday, day.Weekday(), d)
	}
}

// TestPatternEventUIDs: the first day of a pattern placement keeps the
// UID a grid meeting of the same number would have (so a section that
// moves from the grid to a pattern keeps updating its event); the other
// days get UIDs of their own, all distinct.
func TestPatternEventUIDs(t *testing.T) {
	term, s := patternTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	who := Subject{timetable.WhoStaff, "S6"}
	seen := map[string]bool{}
	for _, i := range v.byStaff["S6"] {
		m := &v.meetings[i]
		uid := v.meetingUID(m, who)
		assert.False(t, seen[uid], "UID repeated")
		seen[uid] = true
		if m.part == 0 {
			assert.Equal(t, eventUID(term.Name, m.sec.ID, m.num, who), uid)
		}
	}
	assert.Len(t, seen, 3+2+2)
}

// TestPatternLoadInHours checks the Load figures of the mixed term, in
// hours, worked out by hand. S6 teaches MA110 (Mon Wed Fri 50 min), MA111
// (Tue Thu 75 min) and EN130 (Mon Wed 75 min, weeks 3-6): 150 + 150 + 150
// = 450 minutes a week (7.5 h); the busiest days, Mon and Wed, 50 + 75 =
// 125 minutes (2.08 h). Over the 13 weeks from Mon 13 Sep to Fri 10 Dec
// 2027 with the holiday Mon 25 Oct (week 7): MA110 12 Mondays + 13
// Wednesdays + 13 Fridays = 38 x 50 = 1900 min, MA111 26 x 75 = 1950 min,
// EN130 4 Mondays + 4 Wednesdays = 8 x 75 = 600 min; 4450 min = 74.17 h.
// Room A1 holds CS102 (Tue 60 min), MA110 (150) and MA111 (150), 1 + 3 + 2
// = 6 meetings, busy 6 h of
// the grid's 5 days x 8 h (09:00-17:00) = 40 h, 15 %.
func TestPatternLoadInHours(t *testing.T) {
	term, s := patternTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	days, err := v.termDays()
	require.NoError(t, err)
	assert.Equal(t, []any{"S6", "Ines Valcárcel", 3, 7, 7.5, 2.08, "", 74.17}, v.staffLoadHours("S6", "Ines Valcárcel", 0, days))
	assert.Equal(t, []any{"A1", "Aula", 120, 35, 6, 6.0, 40.0, 0.15}, v.roomLoadHours("A1"))
	f := openWorkbook(t, term, s, Options{Generated: fixedClock})
	rows, err := f.GetRows(LoadSheet)
	require.NoError(t, err)
	assert.Equal(t, loadStaffHourColumns, rows[1])
}

// TestPatternScheduleIsValid guards the fixture: the mixed term's
// timetable breaks no hard requirement according to the independent
// domain checker.
func TestPatternScheduleIsValid(t *testing.T) {
	term, s := patternTerm()
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, s)))
}

// TestPatternUnavailableWeeks: on a grid of the mixed term an unavailable
// time that holds only in some weeks is shaded over exactly its minutes
// (the grid is cut at its start and end) and labelled with its weeks.
func TestPatternUnavailableWeeks(t *testing.T) {
	term, s := patternTerm()
	term.Unavailable = []timetable.Unavailability{{Who: "S6", Kind: timetable.WhoStaff, Day: time.Friday,
		From: 14*60 + 30, To: 17 * 60, Hard: true, Reason: "conference", Weeks: timetable.WeekSet(0b11 << 8)}} // weeks 9-10
	v, err := newView(term, s)
	require.NoError(t, err)
	level, reason := v.unavailableCells(Subject{timetable.WhoStaff, "S6"})
	fri := v.dayCol[time.Friday]
	var shaded []string
	for r, row := range v.rows {
		if level[r][fri] == unavailHard {
			shaded = append(shaded, row.from.String()+"-"+row.to.String())
			assert.Equal(t, "conference, wks 9-10", reason[r][fri])
		}
	}
	assert.Equal(t, []string{"14:30-15:00", "15:00-16:00", "16:00-16:50", "16:50-17:00"}, shaded)
}
