package timetable

import (
	"encoding/csv"
	"math/rand"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// mt is a meeting for the comparison tests: section, number, day, start
// hour, room, weeks; staff S-<section> and cohort C1.
func mt(sec string, num int, day time.Weekday, hour int, room, weeks string) Meeting {
	return Meeting{Section: sec, Number: num, Day: day, Start: Clock(hour * 60), End: Clock(hour*60 + 60),
		Room: room, Weeks: weeks, Staff: []string{"S-" + sec}, Cohorts: []string{"C1"}}
}

// kinds is the comparison as "section kind what" lines, for hand-worked expectations.
func kinds(c *Comparison) []string {
	var out []string
	for _, ch := range c.Changes {
		s := ch.Section + " " + ch.Kind
		for _, w := range ch.What {
			s += " " + w
		}
		if ch.Old != nil {
			s += " old:" + DayName(ch.Old.Day) + ch.Old.Start.String() + ch.Old.Room
		}
		if ch.New != nil {
			s += " new:" + DayName(ch.New.Day) + ch.New.Start.String() + ch.New.Room
		}
		out = append(out, s)
	}
	return out
}

func TestCompare(t *testing.T) {
	M, Tu, W, Th := time.Monday, time.Tuesday, time.Wednesday, time.Thursday
	cases := []struct {
		name     string
		old, new []Meeting
		want     []string // worked out by hand
	}{
		{"identical", []Meeting{mt("A", 1, M, 9, "R1", "all")}, []Meeting{mt("A", 1, M, 9, "R1", "all")},
			[]string{"A unchanged old:Mon09:00R1 new:Mon09:00R1"}},
		{"one meeting of two moved to another day",
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("A", 2, W, 9, "R1", "all")},
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("A", 2, Th, 9, "R1", "all")},
			[]string{"A unchanged old:Mon09:00R1 new:Mon09:00R1", "A moved day old:Wed09:00R1 new:Thu09:00R1"}},
		{"meetings renumbered: nothing changed",
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("A", 2, W, 9, "R1", "all")},
			[]Meeting{mt("A", 1, W, 9, "R1", "all"), mt("A", 2, M, 9, "R1", "all")},
			[]string{"A unchanged old:Mon09:00R1 new:Mon09:00R1", "A unchanged old:Wed09:00R1 new:Wed09:00R1"}},
		{"swapped rooms",
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("B", 1, M, 9, "R2", "all")},
			[]Meeting{mt("A", 1, M, 9, "R2", "all"), mt("B", 1, M, 9, "R1", "all")},
			[]string{"A moved room old:Mon09:00R1 new:Mon09:00R2", "B moved room old:Mon09:00R2 new:Mon09:00R1"}},
		{"a section dropped and one added",
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("C", 1, Tu, 9, "R1", "all")},
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("D", 1, Tu, 9, "R1", "all")},
			[]string{"A unchanged old:Mon09:00R1 new:Mon09:00R1", "C dropped old:Tue09:00R1", "D added new:Tue09:00R1"}},
		{"weeks changed in place",
			[]Meeting{mt("A", 1, M, 9, "R1", "all")}, []Meeting{mt("A", 1, M, 9, "R1", "1-6")},
			[]string{"A moved weeks old:Mon09:00R1 new:Mon09:00R1"}},
		// Mon 9 -> Mon 11 (time, 4) with Wed 9 -> Thu 9 (day, 8) is 12;
		// the crossed pairing costs 8+4 twice, 24.
		{"a meeting that stays on its day pairs first",
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("A", 2, W, 9, "R1", "all")},
			[]Meeting{mt("A", 1, Th, 9, "R1", "all"), mt("A", 2, M, 11, "R1", "all")},
			[]string{"A moved time old:Mon09:00R1 new:Mon11:00R1", "A moved day old:Wed09:00R1 new:Thu09:00R1"}},
		{"one meeting fewer: the one that moved least stays paired",
			[]Meeting{mt("A", 1, M, 9, "R1", "all"), mt("A", 2, W, 9, "R1", "all")},
			[]Meeting{mt("A", 1, W, 9, "R2", "all")},
			[]string{"A dropped old:Mon09:00R1", "A moved room old:Wed09:00R1 new:Wed09:00R2"}},
		{"an identical meeting pairs before one at the same place in other weeks",
			[]Meeting{mt("A", 1, M, 9, "R1", "1-6"), mt("A", 2, M, 9, "R1", "7-12")},
			[]Meeting{mt("A", 1, M, 9, "R1", "7-12")},
			[]string{"A dropped old:Mon09:00R1", "A unchanged old:Mon09:00R1 new:Mon09:00R1"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			c := Compare(tc.old, tc.new)
			assert.Equal(t, tc.want, kinds(c))
			// Each meeting of both timetables appears exactly once.
			nOld, nNew := 0, 0
			for _, ch := range c.Changes {
				if ch.Old != nil {
					nOld++
				}
				if ch.New != nil {
					nNew++
				}
			}
			assert.Equal(t, len(tc.old), nOld)
			assert.Equal(t, len(tc.new), nNew)
		})
	}
}

func TestCompareAffected(t *testing.T) {
	M := time.Monday
	old := []Meeting{mt("A", 1, M, 9, "R1", "all"), mt("B", 1, M, 9, "R2", "all")}
	new := []Meeting{mt("A", 1, M, 9, "R2", "all"), mt("B", 1, M, 9, "R1", "all")}
	new[1].Staff, new[1].StaffNames = []string{"S-X"}, []string{"Xena Quill"}
	c := Compare(old, new)
	got := map[string][]string{}
	for _, a := range c.Affected(map[string][]string{"A": {"st1"}}) {
		k := a.Kind + " " + a.ID
		if a.Name != "" {
			k += " (" + a.Name + ")"
		}
		for _, sc := range a.Changes {
			got[k] = append(got[k], sc.Kind+" "+c.Changes[sc.Change].Section)
		}
	}
	// Worked out by hand: A moved R1 -> R2, B moved R2 -> R1 and changed
	// teacher from S-B to S-X; cohort C1 attends both.
	assert.Equal(t, map[string][]string{
		"staff S-A":              {"moved A"},
		"staff S-B":              {"dropped B"},
		"staff S-X (Xena Quill)": {"added B"},
		"room R1":                {"dropped A", "added B"},
		"room R2":                {"added A", "dropped B"},
		"cohort C1":              {"moved A", "moved B"},
		"student st1":            {"moved A"},
	}, got)
}

func TestCompareRenumber(t *testing.T) {
	M, W, F := time.Monday, time.Wednesday, time.Friday
	old := []Meeting{mt("A", 1, M, 9, "R1", "all"), mt("A", 2, W, 9, "R1", "all")}
	new := []Meeting{mt("A", 1, W, 9, "R1", "all"), mt("A", 2, F, 9, "R1", "all"), mt("A", 3, M, 9, "R1", "all")}
	s := &Schedule{Placements: []Placement{{Section: "A", Meeting: 1}, {Section: "A", Meeting: 2}, {Section: "A", Meeting: 3}},
		Enrolments: []Enrolment{{Student: "st1", Section: "A"}}}
	got := Compare(old, new).Renumber(s)
	assert.Equal(t, s.Enrolments, got.Enrolments, "the sectioned students stay with the renumbered copy")
	// Wed keeps number 2, Mon keeps 1, the added Friday takes 3.
	assert.Equal(t, []int{2, 3, 1}, []int{got.Placements[0].Meeting, got.Placements[1].Meeting, got.Placements[2].Meeting})
	assert.Equal(t, 1, s.Placements[0].Meeting, "the schedule given is not changed")
}

// TestLeastCostPairs checks the assignment against brute force over every
// injection (the definition of a minimum-cost assignment).
func TestLeastCostPairs(t *testing.T) {
	rng := rand.New(rand.NewSource(7))
	for trial := 0; trial < 300; trial++ {
		n, m := 1+rng.Intn(4), 1+rng.Intn(4)
		cost := make([][]int64, n)
		for i := range cost {
			cost[i] = make([]int64, m)
			for j := range cost[i] {
				cost[i][j] = int64(rng.Intn(16))
			}
		}
		got := LeastCostPairs(cost)
		require.Len(t, got, n)
		var sum int64
		seen := map[int]bool{}
		for i, j := range got {
			if j >= 0 {
				require.False(t, seen[j], "column used twice")
				seen[j] = true
				sum += cost[i][j]
			}
		}
		require.Equal(t, min(n, m), len(seen))
		require.Equal(t, bruteAssign(cost, 0, map[int]bool{}, min(n, m)), sum, "cost %v", cost)
	}
}

// bruteAssign is the least sum over injections of k rows from row i on
// into unused columns (rows may stay unpaired when n > m).
func bruteAssign(cost [][]int64, i int, used map[int]bool, k int) int64 {
	const inf = int64(1) << 60
	if k == 0 {
		return 0
	}
	if len(cost)-i < k {
		return inf
	}
	best := bruteAssign(cost, i+1, used, k) // row i unpaired
	for j := range cost[i] {
		if !used[j] {
			used[j] = true
			if v := bruteAssign(cost, i+1, used, k-1); v < inf {
				best = min(best, cost[i][j]+v)
			}
			used[j] = false
		}
	}
	return best
}

func TestReadMeetingsAlone(t *testing.T) {
	dir := t.TempDir()
	p := filepath.Join(dir, "tt.csv")
	csv := "Section,Title,Meeting,Day,Start,End,Room,Staff,Cohorts,Weeks,Staff names\n" +
		"A,Algebra,,Mon,09:00,10:00,R1,S1,C1,\"1,2,3,5\",Ann Bell\n" +
		"A,Algebra,1,Wed,09:00,10:00,R1,S1,C1,all,Ann Bell\n" +
		"B,Botany,1,Funday,09:00,10:00,R2,S2,C1,,Bo Dunn\n"
	require.NoError(t, os.WriteFile(p, []byte(csv), 0o644))
	ms, _, ps, err := ReadMeetings(p, nil)
	require.NoError(t, err)
	require.Len(t, ps.Errors(), 1)
	assert.Equal(t, "tt!D4", ps.Errors()[0].Pos.String())
	assert.Nil(t, ms, "no meetings when a row could not be read")
	require.NoError(t, os.WriteFile(p, []byte(strings.Replace(csv, "Funday", "Fri", 1)), 0o644))
	ms, s, ps, err := ReadMeetings(p, nil)
	require.NoError(t, err)
	require.Empty(t, ps)
	assert.Nil(t, s, "no schedule without a term")
	require.Len(t, ms, 3)
	assert.Equal(t, 2, ms[0].Number, "a blank meeting takes the lowest number left, as ReadSchedule does")
	assert.Equal(t, "1-3, 5", ms[0].Weeks)
	assert.Equal(t, "all", ms[1].Weeks)
	assert.Equal(t, []string{"Ann Bell"}, ms[0].StaffNames)
	assert.Equal(t, Clock(600), ms[0].End)
}

// TestReadMeetingsWithTerm reads a CSV timetable for a term built here:
// title, end, staff and cohorts come from the term; the Weeks cell wins
// when filled in (a timetable published before the weeks changed), the
// term's weeks when blank; a section the term lacks keeps its own cells.
func TestReadMeetingsWithTerm(t *testing.T) {
	term := &Term{
		Name:     "T",
		FirstDay: time.Date(2028, 1, 10, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2028, 3, 31, 0, 0, 0, 0, time.UTC),
		Periods: []Period{{Index: 0, Day: time.Monday, Start: 540, End: 600}, {Index: 1, Day: time.Monday, Start: 600, End: 660}},
		Rooms:   []Room{{ID: "R1", Capacity: 30}},
		Staff:   []Staff{{ID: "S1", Name: "Ann Bell"}},
		Cohorts: []Cohort{{ID: "C1", Name: "Year one"}},
	}
	term.Sections = []Section{{ID: "A", Title: "Algebra", Staff: []string{"S1"}, Cohorts: []string{"C1"}, Meetings: 2, Length: 2, Weeks: 0b111}}
	dir := t.TempDir()
	p := filepath.Join(dir, "tt.csv")
	csv := "Section,Title,Meeting,Day,Start,End,Room,Staff,Cohorts,Weeks\n" +
		"A,Old title,1,Mon,09:00,,R1,,,all\n" +
		"A,,2,Mon,09:00,,R1,,,\n" +
		"Z,Zoology,1,Mon,10:00,11:00,R1,S9,C1,1-2\n"
	require.NoError(t, os.WriteFile(p, []byte(csv), 0o644))
	ms, s, ps, err := ReadMeetings(p, term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors(), ps.String())
	want, wantPs, err := ReadSchedule(p, term)
	require.NoError(t, err)
	assert.Equal(t, want, s, "the schedule is ReadSchedule's")
	assert.Equal(t, wantPs, ps, "the problems are ReadSchedule's")
	require.Len(t, ms, 3)
	assert.Equal(t, Meeting{Section: "A", Number: 1, Title: "Algebra", Day: time.Monday, Start: 540, End: 660, Room: "R1",
		Weeks: "all", Staff: []string{"S1"}, StaffNames: []string{"Ann Bell"}, Cohorts: []string{"C1"}, Src: Source{Sheet: "tt", Row: 2}}, ms[0])
	assert.Equal(t, "1-3", ms[1].Weeks, "blank Weeks: the term's")
	assert.Equal(t, "Zoology", ms[2].Title)
	assert.Equal(t, []string{"S9"}, ms[2].Staff)
	assert.Equal(t, "1-2", ms[2].Weeks)

	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("Section,Meeting,Day,Start,Room\nA,1,Tue,09:00,R1\n"), 0o644))
	ms, _, ps, err = ReadMeetings(bad, term)
	require.NoError(t, err)
	assert.Nil(t, ms)
	require.Len(t, ps.Errors(), 1)
	assert.Equal(t, "bad!C2", ps.Errors()[0].Pos.String(), "a day the grid lacks does not fit the term")
}

// FuzzReadMeetingsRoundTrip writes one meeting as a CSV row and reads it
// back without a term: every field comes back as written.
func FuzzReadMeetingsRoundTrip(f *testing.F) {
	f.Add(uint8(1), uint16(540), uint16(60), "R1", uint64(0b1011), "A-1", 2)
	f.Add(uint8(0), uint16(0), uint16(1), "", uint64(0), "x", 1)
	f.Fuzz(func(t *testing.T, day uint8, start, length uint16, room string, weeks uint64, sec string, num int) {
		d := time.Weekday(day % 7)
		st := Clock(start % (24 * 60))
		end := st + Clock(1+length%120)
		if end > 24*60 || num < 1 || num > 1000 {
			return
		}
		clean := func(s string) string { // keep what a plain cell holds: no control, list or quote characters
			return strings.Map(func(r rune) rune {
				if r < ' ' || r == 0x7f || r == utf8.RuneError || strings.ContainsRune(",;\"'", r) {
					return -1
				}
				return r
			}, s)
		}
		sec, room = strings.TrimSpace(clean(sec)), strings.TrimSpace(clean(room))
		if sec == "" || !utf8.ValidString(sec+room) {
			return
		}
		wk := "all"
		if w := WeekSet(weeks); w != 0 {
			wk = w.Ranges()
		}
		row := []string{sec, strconv.Itoa(num), DayName(d), st.String(), end.String(), room, wk}
		var b strings.Builder
		cw := csv.NewWriter(&b)
		require.NoError(t, cw.WriteAll([][]string{{"Section", "Meeting", "Day", "Start", "End", "Room", "Weeks"}, row}))
		p := filepath.Join(t.TempDir(), "f.csv")
		require.NoError(t, os.WriteFile(p, []byte(b.String()), 0o644))
		ms, _, ps, err := ReadMeetings(p, nil)
		require.NoError(t, err)
		require.Empty(t, ps, "%s", row)
		require.Len(t, ms, 1)
		m := ms[0]
		assert.Equal(t, []any{sec, num, d, st, end, room, wk}, []any{m.Section, m.Number, m.Day, m.Start, m.End, m.Room, m.Weeks})
	})
}
