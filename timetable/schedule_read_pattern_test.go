package timetable

import (
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// srTerm is ckTerm with two sections placed by meeting patterns: MTH-200
// on Mon Wed at 09:00 for 50 minutes in every week or in odd weeks, or on
// Tue at 09:00 for 50 or for 75 minutes; LAB-300 on Wed 13:00 for 110
// minutes in weeks 1-6 or weeks 7-13.
func srTerm() *Term {
	t := ckTerm()
	all := t.AllWeeks()
	odd := WeekSet(0x5555) & all
	t.Sections = append(t.Sections,
		Section{ID: "MTH-200", Title: "Calculus", Staff: []string{"S2"}, Size: 20, Src: Source{"Sections", 20}, Times: []TimeChoice{
			{Days: DaysOf(time.Monday, time.Wednesday), Start: 540, Minutes: 50, Weeks: all},
			{Days: DaysOf(time.Monday, time.Wednesday), Start: 540, Minutes: 50, Weeks: odd},
			{Days: DaysOf(time.Tuesday), Start: 540, Minutes: 50, Weeks: all},
			{Days: DaysOf(time.Tuesday), Start: 540, Minutes: 75, Weeks: all},
		}},
		Section{ID: "LAB-300", Title: "Lab", Staff: []string{"S1"}, Size: 20, Src: Source{"Sections", 21}, Times: []TimeChoice{
			{Days: DaysOf(time.Wednesday), Start: 13 * 60, Minutes: 110, Weeks: WeekSet(1<<6 - 1)},
			{Days: DaysOf(time.Wednesday), Start: 13 * 60, Minutes: 110, Weeks: all &^ WeekSet(1<<6-1)},
		}},
	)
	return t
}

// srRows are timetable rows (header first) for placements of srTerm's
// pattern sections, written as the export package writes them.
func srRows(t *Term, ps []Placement) [][]string {
	rows := [][]string{append([]string(nil), TimetableColumns...)}
	secs := t.SectionIndex()
	for _, p := range ps {
		sec := &t.Sections[secs[p.Section]]
		c := sec.Times[p.Time-1]
		rows = append(rows, []string{sec.ID, sec.Title, strconv.Itoa(p.Meeting), c.Days.String(), c.Start.String(), c.End().String(),
			p.Room, strings.Join(sec.Staff, ", "), "", t.WeeksText(c.Weeks & t.AllWeeks()), ""})
	}
	return rows
}

// TestReadSchedulePatternRows reads every meeting time of srTerm back from
// its row (days, start, end and weeks as written), in both file forms.
func TestReadSchedulePatternRows(t *testing.T) {
	tm := srTerm()
	var want []Placement
	for _, id := range []string{"MTH-200", "LAB-300"} {
		sec := &tm.Sections[tm.SectionIndex()[id]]
		for i := range sec.Times {
			want = append(want, Placement{Section: id, Meeting: i + 1, Period: -1, Time: i + 1, Room: "R1"})
		}
	}
	rows := srRows(tm, want)
	for name, path := range map[string]string{
		"csv":  ckWrite(t, "t.csv", ckCSV(rows)),
		"xlsx": ckWrite(t, "t.xlsx", ckXLSX(t, TimetableSheet, rows, nil)),
	} {
		t.Run(name, func(t *testing.T) {
			got, ps, err := ReadSchedule(path, tm)
			require.NoError(t, err)
			assert.Empty(t, ps)
			assert.Equal(t, want, ckBare(got))
		})
	}
}

// TestReadSchedulePatternProblems marks, with a leading "!", the cell each
// error is expected at: the first of Day, Start, End and Weeks that no
// meeting time of the section fits; a row that fits several (End and
// Weeks left blank) is an error at its Day cell.
func TestReadSchedulePatternProblems(t *testing.T) {
	header := []string{"Section", "Meeting", "Day", "Start", "End", "Room", "Weeks"}
	cases := []struct {
		name string
		row  []string
		time int // the meeting time read, 0 for none
	}{
		{"all cells", []string{"MTH-200", "1", "Mon Wed", "09:00", "09:50", "R1", "odd"}, 2},
		{"days in another order and form", []string{"MTH-200", "1", "wed, mon", "9:00", "09:50", "R1", "all"}, 1},
		{"end and weeks blank but one fits", []string{"LAB-300", "1", "Wed", "13:00", "", "R1", "7-13"}, 2},
		{"end alone picks", []string{"MTH-200", "1", "Tue", "09:00", "10:15", "R1", ""}, 4},
		{"days fit none", []string{"MTH-200", "1", "!Mon Fri", "09:00", "09:50", "R1", "all"}, 0},
		{"day unreadable", []string{"MTH-200", "1", "!Mon Funday", "09:00", "09:50", "R1", "all"}, 0},
		{"day twice", []string{"MTH-200", "1", "!Mon Mon", "09:00", "09:50", "R1", "all"}, 0},
		{"start fits none", []string{"MTH-200", "1", "Mon Wed", "!10:00", "10:50", "R1", "all"}, 0},
		{"end fits none", []string{"MTH-200", "1", "Mon Wed", "09:00", "!10:00", "R1", "all"}, 0},
		{"weeks fit none", []string{"MTH-200", "1", "Mon Wed", "09:00", "09:50", "R1", "!even"}, 0},
		{"weeks unreadable", []string{"MTH-200", "1", "Mon Wed", "09:00", "09:50", "R1", "!fortnightly"}, 0},
		{"several fit", []string{"MTH-200", "1", "!Mon Wed", "09:00", "", "R1", ""}, 0},
		{"start blank", []string{"MTH-200", "1", "Mon Wed", "!", "09:50", "R1", "all"}, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			var want []string
			row := make([]string, len(tc.row))
			for c, v := range tc.row {
				if strings.HasPrefix(v, "!") {
					want = append(want, TimetableSheet+"!"+colLetter(c)+"2")
					v = v[1:]
				}
				row[c] = v
			}
			s, ps, err := ReadSchedule(ckWrite(t, "t.xlsx", ckXLSX(t, TimetableSheet, [][]string{header, row}, nil)), srTerm())
			require.NoError(t, err)
			var got []string
			for _, p := range ps {
				got = append(got, p.Pos.String())
				assert.Equal(t, "error", p.Severity.String(), p.String())
			}
			assert.Equal(t, want, got, "%v", ps)
			if tc.time == 0 {
				assert.Empty(t, s.Placements)
				return
			}
			require.Len(t, s.Placements, 1)
			assert.Equal(t, tc.time, s.Placements[0].Time)
			assert.Equal(t, -1, s.Placements[0].Period)
		})
	}
}

// TestReadSchedulePatternMessage pins the wording of the error at a cell
// no meeting time fits: what was asked and the section's meeting times.
func TestReadSchedulePatternMessage(t *testing.T) {
	rows := [][]string{{"Section", "Day", "Start", "Room"}, {"LAB-300", "Wed", "14:00", "R1"}}
	_, ps, err := ReadSchedule(ckWrite(t, "t.csv", ckCSV(rows)), srTerm())
	require.NoError(t, err)
	require.Len(t, ps, 1)
	assert.Equal(t, "t!C2: LAB-300 has no meeting time on Wed, starting at 14:00 — use one of its meeting times "+
		"(Wed 13:00–14:50 weeks 1-6; Wed 13:00–14:50 weeks 7-13), or add this one to the section's rows of the meeting times sheet", ps[0].String())
}

// TestReadSchedulePatternOnGridSection: a row with the days of a meeting
// pattern for a section of the period grid says so at its Day cell.
func TestReadSchedulePatternOnGridSection(t *testing.T) {
	rows := [][]string{{"Section", "Day", "Start", "Room"}, {"BIO-101", "Mon Wed", "09:00", "R1"}}
	_, ps, err := ReadSchedule(ckWrite(t, "t.csv", ckCSV(rows)), srTerm())
	require.NoError(t, err)
	require.Len(t, ps, 1)
	assert.Equal(t, "t!B2", ps[0].Pos.String())
	assert.Contains(t, ps[0].Msg, "names the days of a meeting pattern, but BIO-101 meets on the period grid")
}

// FuzzReadSchedulePatternCSV reads arbitrary bytes as a timetable CSV for
// a term with pattern sections: never a panic, every placement of a
// pattern section names one of its meeting times (Period -1), and what
// reads without errors prints and reads back to the same placements.
func FuzzReadSchedulePatternCSV(f *testing.F) {
	tm := srTerm()
	f.Add(ckCSV(srRows(tm, []Placement{{Section: "MTH-200", Meeting: 1, Time: 2, Room: "R1"}, {Section: "LAB-300", Meeting: 1, Time: 1}})))
	f.Add([]byte("Section,Day,Start,End,Weeks,Room\nMTH-200,Tue,09:00,10:15,,R2\nBIO-101,Mon,09:00,,,R1\n"))
	f.Add([]byte("Section,Day,Start,Room\nMTH-200,Mon/Wed,9:00,R1\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		s, ps, err := ReadSchedule(ckWrite(t, "t.csv", data), tm)
		if err != nil {
			return
		}
		secs := tm.SectionIndex()
		for _, p := range s.Placements {
			if si, ok := secs[p.Section]; ok && tm.Sections[si].UsesTimes() {
				require.Equal(t, -1, p.Period)
				require.True(t, p.Time >= 1 && p.Time <= len(tm.Sections[si].Times))
			}
		}
		if len(ps.Errors()) > 0 {
			return
		}
		var pattern []Placement
		for _, p := range s.Placements {
			if si, ok := secs[p.Section]; ok && tm.Sections[si].UsesTimes() && !strings.ContainsRune(p.Room, '\r') {
				pattern = append(pattern, p)
			}
		}
		again, ps2, err := ReadSchedule(ckWrite(t, "u.csv", ckCSV(srRows(tm, pattern))), tm)
		require.NoError(t, err)
		require.Empty(t, ps2.Errors())
		want := &Schedule{Placements: pattern}
		require.Equal(t, ckBare(want), ckBare(again))
	})
}

// FuzzDayCell reads arbitrary text as a Day cell: what reads prints
// (DaySet.String) and reads back to the same days, and every non-empty set
// of days reads back from its printed form.
func FuzzDayCell(f *testing.F) {
	f.Add("Mon Wed Fri", uint8(0b0101010))
	f.Add("tue, thu", uint8(1))
	f.Add("Sat/Sun", uint8(0x7f))
	f.Add("Mon Mon", uint8(0))
	f.Fuzz(func(t *testing.T, s string, bits uint8) {
		if days, ok := parseDaySet(s); ok {
			require.NotZero(t, days)
			again, ok := parseDaySet(days.String())
			require.True(t, ok, days.String())
			require.Equal(t, days, again)
		}
		set := DaySet(bits & 0x7f)
		if set == 0 {
			return
		}
		got, ok := parseDaySet(set.String())
		require.True(t, ok, set.String())
		require.Equal(t, set, got)
	})
}
