package timetable

import (
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// pm is a meeting of a meeting pattern for the comparison tests: days,
// start hour and minutes, length, room, weeks.
func pm(sec string, days DaySet, start Clock, minutes int, room, weeks string) Meeting {
	first, _ := days.First()
	return Meeting{Section: sec, Number: 1, Day: first, Days: days, Start: start, End: start + Clock(minutes),
		Room: room, Weeks: weeks, Staff: []string{"S-" + sec}, Cohorts: []string{"C1"}}
}

// TestComparePatterns pairs placements of pattern sections, worked out by
// hand: the same meeting time and room is unchanged; another meeting time
// is a move that names what differs (days, times, weeks); the same meeting
// time in another room is a move of room; a pattern that keeps its first
// day but not the others has moved day.
func TestComparePatterns(t *testing.T) {
	mwf := DaysOf(time.Monday, time.Wednesday, time.Friday)
	mw := DaysOf(time.Monday, time.Wednesday)
	tth := DaysOf(time.Tuesday, time.Thursday)
	cases := []struct {
		name     string
		old, new Meeting
		kind     string
		what     []string
	}{
		{"same meeting time", pm("A", mwf, 540, 50, "R1", "all"), pm("A", mwf, 540, 50, "R1", "all"), ChangeUnchanged, nil},
		{"other days and times", pm("A", mwf, 540, 50, "R1", "all"), pm("A", tth, 570, 75, "R1", "all"), ChangeMoved, []string{ChangedDay, ChangedTime}},
		{"other room", pm("A", mwf, 540, 50, "R1", "all"), pm("A", mwf, 540, 50, "R2", "all"), ChangeMoved, []string{ChangedRoom}},
		{"other weeks", pm("A", mw, 540, 50, "R1", "all"), pm("A", mw, 540, 50, "R1", "odd"), ChangeMoved, []string{ChangedWeeks}},
		{"fewer days, same first day", pm("A", mwf, 540, 50, "R1", "all"), pm("A", mw, 540, 50, "R1", "all"), ChangeMoved, []string{ChangedDay}},
		{"same start, longer", pm("A", tth, 570, 50, "R1", "all"), pm("A", tth, 570, 75, "R1", "all"), ChangeMoved, []string{ChangedTime}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := Compare([]Meeting{tc.old}, []Meeting{tc.new})
			require.Len(t, c.Changes, 1)
			assert.Equal(t, tc.kind, c.Changes[0].Kind)
			assert.Equal(t, tc.what, c.Changes[0].What)
		})
	}
	// A grid meeting on Monday and a pattern on Monday only are the same place.
	one := pm("A", DaysOf(time.Monday), 540, 60, "R1", "all")
	assert.Equal(t, ChangeUnchanged, Compare([]Meeting{mt("A", 1, time.Monday, 9, "R1", "all")}, []Meeting{one}).Changes[0].Kind)
}

// TestReadMeetingsPattern reads a timetable with pattern rows with and
// without the term: without it the Day cell's days and the End and Weeks
// cells give the meeting; with it the chosen meeting time does (a stale
// End cell is overruled by the term).
func TestReadMeetingsPattern(t *testing.T) {
	tm := srTerm()
	p := filepath.Join(t.TempDir(), "tt.csv")
	csv := "Section,Title,Meeting,Day,Start,End,Room,Staff,Cohorts,Weeks\n" +
		"MTH-200,Calculus,1,Mon Wed,09:00,09:50,R1,S2,,odd\n" +
		"LAB-300,Lab,1,Wed,13:00,,R2,S1,,7-13\n"
	require.NoError(t, os.WriteFile(p, []byte(csv), 0o644))
	alone, s, ps, err := ReadMeetings(p, nil)
	require.NoError(t, err)
	require.Empty(t, ps.Errors(), ps.String())
	assert.Nil(t, s)
	require.Len(t, alone, 2)
	assert.Equal(t, DaysOf(time.Monday, time.Wednesday), alone[0].Days)
	assert.Equal(t, time.Monday, alone[0].Day)
	assert.Equal(t, "Mon Wed", alone[0].DayText())
	assert.Equal(t, Clock(590), alone[0].End)
	assert.Equal(t, "odd", alone[0].Weeks)
	assert.Equal(t, DaySet(0), alone[1].Days, "one day: no pattern days")

	with, s, ps, err := ReadMeetings(p, tm)
	require.NoError(t, err)
	require.Empty(t, ps.Errors(), ps.String())
	require.Len(t, with, 2)
	assert.Equal(t, []Placement{
		{Section: "MTH-200", Meeting: 1, Period: -1, Time: 2, Room: "R1"},
		{Section: "LAB-300", Meeting: 1, Period: -1, Time: 2, Room: "R2"},
	}, ckBare(s))
	assert.Equal(t, Meeting{Section: "MTH-200", Number: 1, Title: "Calculus", Day: time.Monday, Days: DaysOf(time.Monday, time.Wednesday),
		Start: 540, End: 590, Room: "R1", Weeks: "odd", Staff: []string{"S2"}, StaffNames: []string{"Ben Okafor"}, Src: Source{Sheet: "tt", Row: 2}}, with[0])
	assert.Equal(t, Clock(14*60+50), with[1].End, "the term gives the end")
	assert.Equal(t, "7-13", with[1].Weeks)

	// The in-memory form agrees with the file read with the term.
	mem := MeetingsOf(tm, s)
	for i := range mem {
		mem[i].Src = with[i].Src
	}
	assert.Equal(t, with, mem)
}
