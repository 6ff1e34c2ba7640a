package timetable

import (
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

// tightTerm is a small term to build forced costs on: days Mon–Wed with
// two touching periods each (09:00, 10:00), rooms R0 (10 seats) and R1
// (30 seats), staff S0, cohorts C0 and C1, every criterion weighted 1 at
// level 1.
func tightTerm(days int) *Term {
	t := &Term{Name: "tight", Weights: map[string]Weight{}}
	for d := 0; d < days; d++ {
		for k := 0; k < 2; k++ {
			start := Clock(540 + 60*k)
			t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: time.Weekday(1 + d), Start: start, End: start + 60})
		}
	}
	t.Rooms = []Room{{ID: "R0", Capacity: 10}, {ID: "R1", Capacity: 30}}
	t.Staff = []Staff{{ID: "S0"}}
	t.Cohorts = []Cohort{{ID: "C0"}, {ID: "C1"}}
	for _, c := range Criteria {
		t.Weights[c.Name] = Weight{Weight: 1, Level: 1}
	}
	return t
}

func sec(id string, meetings int, edit func(*Section)) Section {
	s := Section{ID: id, Size: 10, Meetings: meetings, Length: 1}
	if edit != nil {
		edit(&s)
	}
	return s
}

// TestCountingBoundTight: on terms built to force a cost, the bound of the
// criterion equals the least cost found by exhaustive search (brute force,
// as in TestCountingBoundBruteForce) and the count worked out by hand in
// each case's comment.
func TestCountingBoundTight(t *testing.T) {
	cases := []struct {
		name  string
		crit  string
		want  int64 // units of the bound and of the exhaustive least
		least int64 // the exhaustive least when the bound is knowingly lower (0: want)
		build func() (*Term, *Schedule)
	}{
		{"spread days: fewer meetings than MinDays", CritSpreadDays, 1, 0, func() (*Term, *Schedule) {
			// 2 meetings can use at most 2 days: 3 − 2 = 1.
			t := tightTerm(3)
			t.Sections = []Section{sec("A", 2, func(s *Section) { s.SameDay, s.MinDays = true, 3 })}
			return t, nil
		}},
		{"spread days: a day closed by the staff's hard row", CritSpreadDays, 1, 0, func() (*Term, *Schedule) {
			// Wednesday is closed to S0, so 3 meetings use at most Mon and Tue: 3 − 2 = 1.
			t := tightTerm(3)
			t.Sections = []Section{sec("A", 3, func(s *Section) { s.SameDay, s.MinDays, s.Staff = true, 3, []string{"S0"} })}
			t.Unavailable = []Unavailability{{Who: "S0", Kind: WhoStaff, Day: time.Wednesday, From: 540, To: 720, Hard: true}}
			return t, nil
		}},
		{"spread days: pattern section", CritSpreadDays, 1, 3, func() (*Term, *Schedule) {
			// Its meeting times meet on at most 2 days: 3 − 2 = 1. Cost counts the days of grid
			// meetings only, so it charges 3; the bound stays valid under either reading.
			t := tightTerm(3)
			t.Sections = []Section{sec("P", 1, func(s *Section) {
				s.SameDay, s.MinDays = true, 3
				s.Times = []TimeChoice{{Days: DaysOf(time.Monday, time.Wednesday), Start: 540, Minutes: 50, Weeks: 1}, {Days: DaysOf(time.Tuesday), Start: 600, Minutes: 50, Weeks: 1}}
			})}
			return t, nil
		}},
		{"early and late: two-period meetings fill the day", CritEarly, 2, 0, func() (*Term, *Schedule) {
			// Each of 2 meetings of 2 periods fills a 2-period day: 2 early, 2 late.
			t := tightTerm(2)
			t.Sections = []Section{sec("A", 2, func(s *Section) { s.Length = 2 })}
			return t, nil
		}},
		{"avoid times: different days each with a soft row", CritAvoidTimes, 1, 0, func() (*Term, *Schedule) {
			// C0 prefers not Mon 09–11 (weight 3) nor Tue 09:00–09:30 (weight 2): the 2
			// meetings are on different days, so one is on Monday and meets the first row
			// (1 unit, cost 3); the other can take Tue 10:00.
			t := tightTerm(2)
			t.Sections = []Section{sec("A", 2, func(s *Section) { s.Cohorts = []string{"C0"} })}
			t.Unavailable = []Unavailability{
				{Who: "C0", Kind: WhoCohort, Day: time.Monday, From: 540, To: 660, Weight: 3},
				{Who: "C0", Kind: WhoCohort, Day: time.Tuesday, From: 540, To: 570, Weight: 2},
			}
			return t, nil
		}},
		{"time choice: every time weighted", CritTimeChoice, 2, 0, func() (*Term, *Schedule) {
			// The cheaper time that the section's hard row leaves costs 2 (the time of weight 1 is closed).
			t := tightTerm(2)
			t.Sections = []Section{sec("P", 1, func(s *Section) {
				s.Times = []TimeChoice{{Days: DaysOf(time.Monday), Start: 540, Minutes: 50, Weeks: 1, Weight: 1},
					{Days: DaysOf(time.Tuesday), Start: 540, Minutes: 50, Weeks: 1, Weight: 2},
					{Days: DaysOf(time.Tuesday), Start: 600, Minutes: 50, Weeks: 1, Weight: 4}}
			})}
			t.Unavailable = []Unavailability{{Who: "P", Kind: WhoSection, Day: time.Monday, From: 540, To: 600, Hard: true}}
			return t, nil
		}},
		{"room choice: the cheap room is closed", CritRoomChoice, 6, 0, func() (*Term, *Schedule) {
			// R0 (weight 1) is closed all week, so both meetings use R1 (weight 3): 6.
			t := tightTerm(2)
			t.Sections = []Section{sec("A", 2, func(s *Section) { s.RoomChoices = []RoomChoice{{Room: "R0", Weight: 1}, {Room: "R1", Weight: 3}} })}
			t.Unavailable = []Unavailability{
				{Who: "R0", Kind: WhoRoom, Day: time.Monday, From: 540, To: 720, Hard: true},
				{Who: "R0", Kind: WhoRoom, Day: time.Tuesday, From: 540, To: 720, Hard: true},
			}
			return t, nil
		}},
		{"over capacity: two large sections, one large room, one period", CritOverCapacity, 20, 0, func() (*Term, *Schedule) {
			// One period and two rooms: one of the two 30-student sections sits in R0: 30 − 10 = 20.
			t := tightTerm(1)
			t.Periods = t.Periods[:1]
			t.SoftCapacity = true
			t.Sections = []Section{sec("A", 1, func(s *Section) { s.Size = 30 }), sec("B", 1, func(s *Section) { s.Size = 30 })}
			return t, nil
		}},
		{"room stability: fixed in two rooms", CritRoomStability, 1, 0, func() (*Term, *Schedule) {
			// Its two meetings are fixed in R0 and R1: 2 − 1 = 1.
			t := tightTerm(2)
			t.Sections = []Section{sec("A", 2, func(s *Section) {
				s.Fixed = []Fixed{{Day: time.Monday, Start: 540, Room: "R0"}, {Day: time.Tuesday, Start: 540, Room: "R1"}}
			})}
			return t, nil
		}},
		{"room stability: each room closed one day", CritRoomStability, 1, 0, func() (*Term, *Schedule) {
			// Meetings on Mon and Tue; R0 is closed Tuesday, R1 Monday: two rooms.
			t := tightTerm(2)
			t.Sections = []Section{sec("A", 2, nil)}
			t.Unavailable = []Unavailability{
				{Who: "R0", Kind: WhoRoom, Day: time.Tuesday, From: 540, To: 720, Hard: true},
				{Who: "R1", Kind: WhoRoom, Day: time.Monday, From: 540, To: 720, Hard: true},
			}
			return t, nil
		}},
		{"cohort isolated: one section on different days", CritCohortIsolated, 2, 0, func() (*Term, *Schedule) {
			// C0's only sections: A (3 meetings, different days) and B (1 meeting): 3 − 1 = 2 isolated.
			t := tightTerm(3)
			t.Sections = []Section{sec("A", 3, func(s *Section) { s.Cohorts = []string{"C0"}; s.NoRoom = true }),
				sec("B", 1, func(s *Section) { s.Cohorts = []string{"C0"}; s.NoRoom = true })}
			return t, nil
		}},
		{"staff days: meetings on different days", CritStaffDays, 3, 0, func() (*Term, *Schedule) {
			t := tightTerm(3)
			t.Sections = []Section{sec("A", 3, func(s *Section) { s.Staff = []string{"S0"}; s.NoRoom = true })}
			return t, nil
		}},
		{"moved meetings: a closed place and one day", CritMoved, 2, 0, func() (*Term, *Schedule) {
			// Kept: A at Mon 09:00 (now closed to A), Tue 09:00 and Tue 10:00; A's meetings
			// fall on different days, so only one Tuesday place can be held: 2 moved (the
			// section that is gone does not count).
			t := tightTerm(3)
			t.Sections = []Section{sec("A", 2, func(s *Section) { s.NoRoom = true })}
			t.Unavailable = []Unavailability{{Who: "A", Kind: WhoSection, Day: time.Monday, From: 540, To: 600, Hard: true}}
			kept := &Schedule{Placements: []Placement{{Section: "A", Meeting: 1, Period: 0}, {Section: "A", Meeting: 2, Period: 2}, {Section: "A", Meeting: 3, Period: 3}, {Section: "GONE", Meeting: 1, Period: 1}}}
			return t, kept
		}},
		{"unplaced requests: a course nobody teaches", CritUnplaced, 1, 0, func() (*Term, *Schedule) {
			t := tightTerm(1)
			t.Sections = []Section{sec("A", 1, nil)}
			t.Requests = []Request{{Student: "st", Course: "NOPE"}}
			return t, nil
		}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			term, kept := c.build()
			least, legal, ok := bruteLeast(term, kept, 200000)
			require.True(t, ok)
			require.Positive(t, legal, "the built term has no legal timetable")
			got := CountingBound(term, kept).Criterion(c.crit)
			want := least.Criterion(c.crit)
			if c.least == 0 {
				require.Equal(t, c.want, want.Count, "exhaustive least of %s", c.crit)
				require.Equal(t, want.Cost, got.Cost, "bound cost of %s", c.crit)
			} else {
				require.Equal(t, c.least, want.Count, "exhaustive least of %s", c.crit)
			}
			require.Equal(t, c.want, got.Count, "bound of %s", c.crit)
		})
	}
}

// TestCountingBoundDegenerate: terms without periods, rooms or sections
// (which have no legal timetable, or only the empty one) give a report of
// every criterion without panicking, and 0 where the empty timetable is
// legal (Cost of the empty schedule, itself 0 there).
func TestCountingBoundDegenerate(t *testing.T) {
	empty := &Term{}
	r := CountingBound(empty, nil)
	require.Len(t, r.Criteria, len(Criteria))
	require.Equal(t, Cost(empty, &Schedule{}, nil).ByLevel, r.ByLevel)

	noGrid := &Term{Rooms: []Room{{ID: "R"}}, Sections: []Section{{ID: "A", Meetings: 2, Length: 1, Fixed: []Fixed{{Day: time.Monday, Start: 540}}}}}
	require.NotPanics(t, func() { CountingBound(noGrid, &Schedule{Placements: []Placement{{Section: "A", Period: 7}}}) })

	noRooms := tightTerm(2)
	noRooms.Rooms = nil
	noRooms.SoftCapacity = true
	noRooms.Sections = []Section{sec("A", 2, nil), sec("P", 1, func(s *Section) {
		s.Times = []TimeChoice{{Days: DaysOf(time.Monday), Start: 540, Minutes: 50, Weeks: 1}}
	})}
	require.NotPanics(t, func() { CountingBound(noRooms, nil) })
}
