package encode

import (
	"fmt"
	"math/rand"
	"testing"
	"time"

	"github.com/termwright/termwright/timetable"
)

// patternTerm makes a seeded random pattern term: nSec sections, each with
// 2..maxTimes meeting patterns drawn from a few day sets, starts on a
// 30-minute raster and lengths of 50, 75 or 110 minutes, in all weeks or in
// odd/even weeks; a few staff and cohorts, nRooms rooms, some room choices
// with preferences and a few hard unavailability rows with weeks.
func patternTerm(seed int64, nSec, maxTimes, nRooms int) *timetable.Term {
	rng := rand.New(rand.NewSource(seed))
	t := &timetable.Term{
		Name:     "Random pattern term",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 10, 1, 0, 0, 0, 0, time.UTC), // 4 weeks
	}
	all := t.AllWeeks()
	odd, even := timetable.WeekSet(0b0101), timetable.WeekSet(0b1010)
	daySets := []timetable.DaySet{
		timetable.DaysOf(time.Monday, time.Wednesday),
		timetable.DaysOf(time.Tuesday, time.Thursday),
		timetable.DaysOf(time.Monday),
		timetable.DaysOf(time.Wednesday),
		timetable.DaysOf(time.Friday),
	}
	for r := 0; r < nRooms; r++ {
		t.Rooms = append(t.Rooms, timetable.Room{ID: fmt.Sprintf("R%d", r+1), Capacity: 20 + 10*rng.Intn(4),
			Src: timetable.Source{Sheet: "Rooms", Row: r + 2}})
	}
	nStaff := 1 + nSec/3
	for i := 0; i < nStaff; i++ {
		t.Staff = append(t.Staff, timetable.Staff{ID: fmt.Sprintf("T%d", i+1), Src: timetable.Source{Sheet: "Staff", Row: i + 2}})
	}
	nCoh := 1 + nSec/4
	for i := 0; i < nCoh; i++ {
		t.Cohorts = append(t.Cohorts, timetable.Cohort{ID: fmt.Sprintf("C%d", i+1), Src: timetable.Source{Sheet: "Cohorts", Row: i + 2}})
	}
	for s := 0; s < nSec; s++ {
		sec := timetable.Section{ID: fmt.Sprintf("S%02d", s+1), Meetings: 1, Size: 10 + rng.Intn(25),
			Src: timetable.Source{Sheet: "Sections", Row: s + 2}}
		sec.Staff = []string{t.Staff[rng.Intn(nStaff)].ID}
		if rng.Intn(3) > 0 {
			sec.Cohorts = []string{t.Cohorts[rng.Intn(nCoh)].ID}
		}
		n := 2 + rng.Intn(maxTimes-1)
		for i := 0; i < n; i++ {
			w := all
			switch rng.Intn(4) {
			case 0:
				w = odd
			case 1:
				w = even
			}
			sec.Times = append(sec.Times, timetable.TimeChoice{
				Days:    daySets[rng.Intn(len(daySets))],
				Start:   timetable.Clock(8*60 + 30*rng.Intn(8)),
				Minutes: []int{50, 75, 110}[rng.Intn(3)],
				Weeks:   w,
				Weight:  rng.Intn(3),
				Src:     timetable.Source{Sheet: "Meeting times", Row: s*10 + i + 2},
			})
		}
		switch rng.Intn(4) {
		case 0:
			sec.NoRoom = true
		case 1, 2:
			k := 1 + rng.Intn(3)
			for _, r := range rng.Perm(nRooms)[:min(k, nRooms)] {
				sec.RoomChoices = append(sec.RoomChoices, timetable.RoomChoice{Room: t.Rooms[r].ID, Weight: rng.Intn(3)})
			}
		}
		t.Sections = append(t.Sections, sec)
	}
	for i := 0; i < 1+nRooms/2; i++ {
		t.Unavailable = append(t.Unavailable, timetable.Unavailability{
			Who: t.Rooms[rng.Intn(nRooms)].ID, Kind: timetable.WhoRoom, Day: time.Weekday(1 + rng.Intn(5)),
			From: timetable.Clock(8*60 + 60*rng.Intn(4)), To: timetable.Clock(10*60 + 60*rng.Intn(4)), Hard: true,
			Weeks: []timetable.WeekSet{0, odd, even}[rng.Intn(3)], Src: timetable.Source{Sheet: "Unavailable", Row: i + 2}})
	}
	if seed%2 == 0 { // soft rows: "avoid times" for staff, rooms and sections
		t.Unavailable = append(t.Unavailable,
			timetable.Unavailability{Who: t.Staff[rng.Intn(nStaff)].ID, Kind: timetable.WhoStaff, Day: time.Monday,
				From: 8 * 60, To: 10 * 60, Weight: 2, Src: timetable.Source{Sheet: "Unavailable", Row: 41}},
			timetable.Unavailability{Who: t.Rooms[rng.Intn(nRooms)].ID, Kind: timetable.WhoRoom, Day: time.Tuesday,
				From: 9 * 60, To: 12 * 60, Weight: 3, Weeks: odd, Src: timetable.Source{Sheet: "Unavailable", Row: 42}},
			timetable.Unavailability{Who: t.Sections[rng.Intn(nSec)].ID, Kind: timetable.WhoSection, Day: time.Wednesday,
				From: 10 * 60, To: 11 * 60, Weight: 1, Src: timetable.Source{Sheet: "Unavailable", Row: 43}})
	}
	if seed%3 == 0 && nRooms > 1 { // two buildings with travel time between them
		for r := range t.Rooms {
			t.Rooms[r].Building = []string{"North", "South"}[r%2]
		}
		t.Travel = append(t.Travel, timetable.Travel{From: "North", To: "South", Minutes: 20 + 10*rng.Intn(3),
			Src: timetable.Source{Sheet: "Travel", Row: 2}})
	}
	if nStaff > 0 {
		t.Unavailable = append(t.Unavailable, timetable.Unavailability{
			Who: t.Staff[0].ID, Kind: timetable.WhoStaff, Day: time.Friday, From: 8 * 60, To: 12 * 60, Hard: true,
			Src: timetable.Source{Sheet: "Unavailable", Row: 40}})
	}
	return t
}

func TestPatternAtomsSmoke(t *testing.T) {
	tm := patternTerm(1, 6, 4, 3)
	p, cat, err := Compile(tm, Options{HardOnly: true})
	if err != nil {
		t.Fatal(err)
	}
	for s := range tm.Sections {
		if !cat.IsPattern(s) || len(cat.TimeCandidates(s)) == 0 {
			t.Fatalf("section %d: no time candidates", s)
		}
	}
	_ = p
}
