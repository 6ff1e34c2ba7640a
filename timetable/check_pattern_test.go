package timetable

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestOverlapRuleOnPatternPairs works the overlap rule by hand on pairs of
// meeting times taught by one staff member: two meetings clash when they
// share a minute of a common day in a common teaching week. The rule is
// the one of the ITC-2019 competition rules for two classes' times (start
// before the other's end both ways, a common day, a common week; recalled
// from memory) and of Occurrence.Overlaps.
func TestOverlapRuleOnPatternPairs(t *testing.T) {
	mwf := ptSec{ID: "A", Days: "Mon Wed Fri", Start: "09:00", Minutes: 50, Room: "R1", Staff: "S1"}
	cases := []struct {
		name  string
		a, b  ptSec
		clash string // expected message, "" = no clash
	}{
		// Wed 09:30–10:45 in odd weeks against Mon/Wed/Fri 09:00–09:50 every week: Wed 09:30–09:50, odd weeks.
		{"odd weeks against every week", mwf, ptSec{ID: "B", Days: "Wed", Start: "09:30", Minutes: 75, Weeks: ptOdd, Room: "R2", Staff: "S1"},
			"staff Dr Ana Petrović (S1) teaches A and B at Wed 09:30–09:50 in weeks 1, 3, 5, 7, 9 and 11 (Sections rows 2 and 3; Staff row 2)"},
		// A in odd weeks, B in even weeks: same day and hours, no common week.
		{"odd weeks against even weeks", ptSec{ID: "A", Days: "Mon Wed Fri", Start: "09:00", Minutes: 50, Weeks: ptOdd, Room: "R1", Staff: "S1"},
			ptSec{ID: "B", Days: "Wed", Start: "09:30", Minutes: 75, Weeks: ptEven, Room: "R2", Staff: "S1"}, ""},
		// 09:50 start right at A's end: no common minute.
		{"touching", mwf, ptSec{ID: "B", Days: "Wed", Start: "09:50", Minutes: 75, Room: "R2", Staff: "S1"}, ""},
		// 09:45 start: five minutes in common on Wednesday.
		{"five minutes", mwf, ptSec{ID: "B", Days: "Wed", Start: "09:45", Minutes: 75, Room: "R2", Staff: "S1"},
			"staff Dr Ana Petrović (S1) teaches A and B at Wed 09:45–09:50 (Sections rows 2 and 3; Staff row 2)"},
		// Tue/Thu against Mon/Wed/Fri at the same hours: no common day.
		{"other days", mwf, ptSec{ID: "B", Days: "Tue Thu", Start: "09:00", Minutes: 75, Room: "R2", Staff: "S1"}, ""},
		// a block course in weeks 3–6 on Fridays against weeks 6–12: week 6 only, reported once per pair.
		{"block weeks", ptSec{ID: "A", Days: "Mon Fri", Start: "13:00", Minutes: 120, Weeks: ptWeeks("3-6"), Room: "R1", Staff: "S1"},
			ptSec{ID: "B", Days: "Mon Fri", Start: "14:00", Minutes: 60, Weeks: ptWeeks("6-12"), Room: "R2", Staff: "S1"},
			"staff Dr Ana Petrović (S1) teaches A and B at Mon 14:00–15:00 in week 6 (Sections rows 2 and 3; Staff row 2)"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := ptTerm(tc.a, tc.b)
			vs := Check(tm, s)
			if tc.clash == "" {
				assert.Empty(t, vs)
				return
			}
			require.Len(t, vs, 1, "%v", vs)
			assert.Equal(t, RuleStaffClash, vs[0].Rule)
			assert.Equal(t, tc.clash, vs[0].Msg)
			assert.Equal(t, []int{0, 1}, vs[0].Placements)
		})
	}
}

// TestCheckMixedGridAndPattern: a grid meeting takes its section's weeks
// when compared with a meeting time (ckTerm grid: period 0 is Mon 09:00).
func TestCheckMixedGridAndPattern(t *testing.T) {
	tm, s := ckTerm(), ckSchedule()
	tm.Relations, tm.Unavailable = nil, nil
	tm.Sections[0].Weeks = ptOdd & tm.AllWeeks() // BIO-101 Mon 09:00–10:00, Wed 09:00–10:00 in odd weeks
	tm.Sections[0].Fixed = nil
	tm.Sections = append(tm.Sections, Section{ID: "PAT-1", Staff: []string{"S1"}, Size: 10, Meetings: 1, Length: 1, NoRoom: true,
		Weeks: tm.AllWeeks(), Src: Source{"Sections", 7},
		Times: []TimeChoice{{Days: ptDays("Wed"), Start: 9*60 + 30, Minutes: 50, Weeks: ptEven}, {Days: ptDays("Wed"), Start: 9*60 + 30, Minutes: 50, Weeks: ptOdd}}})
	s.Placements = append(s.Placements, Placement{Section: "PAT-1", Meeting: 1, Period: -1, Time: 1})
	assert.Empty(t, Check(tm, s), "even weeks against odd weeks")
	s.Placements[6].Time = 2
	vs := Check(tm, s)
	require.Len(t, vs, 1, "%v", vs)
	assert.Equal(t, "staff Dr Ana Petrović (S1) teaches BIO-101 and PAT-1 at Wed 09:30–10:00 in weeks 1, 3, 5, 7, 9 and 11 (Sections rows 2 and 7; Staff row 2)", vs[0].Msg)
	assert.Equal(t, []int{1, 6}, vs[0].Placements)
}

// TestCheckPatternRules breaks one pattern-term rule at a time.
func TestCheckPatternRules(t *testing.T) {
	base := func() (*Term, *Schedule) {
		return ptTerm(
			ptSec{ID: "A", Days: "Mon Wed", Start: "09:00", Minutes: 50, Room: "R1", Staff: "S1", Cohort: "C1"},
			ptSec{ID: "B", Days: "Mon", Start: "11:00", Minutes: 75, Room: "R2", Staff: "S1", Cohort: "C1"})
	}
	cases := []struct {
		name   string
		mutate func(t *Term, s *Schedule)
		rules  []string
		msg    string
	}{
		{"valid", func(*Term, *Schedule) {}, nil, ""},
		{"no time", func(_ *Term, s *Schedule) { s.Placements[0].Time = 0 }, []string{RuleTimeChoice},
			"A meeting 1 names no meeting time; A meets at its one meeting time (Sections row 2)"},
		{"unknown time", func(_ *Term, s *Schedule) { s.Placements[0].Time = 2 }, []string{RuleTimeChoice},
			"A meeting 1 names meeting time 2, but A has meeting times 1 to 1 (Sections row 2)"},
		{"grid period on a pattern section", func(_ *Term, s *Schedule) { s.Placements[0].Period = 3 }, []string{RuleTimeChoice}, ""},
		{"two placements", func(_ *Term, s *Schedule) { s.Placements = append(s.Placements, s.Placements[0]) },
			[]string{RuleMeetings}, "A meeting 1 appears 2 times; keep one (Sections row 2)"},
		{"missing", func(_ *Term, s *Schedule) { s.Placements = s.Placements[1:] },
			[]string{RuleMeetings}, "A meets at one of its meeting times (one placement) but meeting 1 is not in the timetable (Sections row 2)"},
		{"room choices are the exact list", func(tm *Term, _ *Schedule) {
			tm.Sections[0].Rooms = []string{"R1"}
			tm.Sections[0].RoomChoices = []RoomChoice{{Room: "R3", Src: Source{"Rooms", 4}}, {Room: "R2", Weight: 2}}
		}, []string{RuleRoomNotAllowed}, "A meeting 1 is in R1 but the section may use only R3 and R2 (Rooms rows 2 and 4; Sections row 2)"},
		{"room choices keep capacity", func(tm *Term, s *Schedule) {
			tm.Sections[0].RoomChoices = []RoomChoice{{Room: "R3"}}
			tm.Sections[0].Size = 30
			s.Placements[0].Room = "R3"
		}, []string{RuleCapacity}, ""},
		{"no-room section in a room", func(tm *Term, _ *Schedule) { tm.Sections[0].NoRoom = true }, []string{RuleNoRoom}, ""},
		{"unavailable in named weeks", func(tm *Term, _ *Schedule) {
			tm.Unavailable = []Unavailability{{Who: "C1", Kind: WhoCohort, Day: 3, From: 9*60 + 40, To: 12 * 60, Hard: true, Weeks: ptWeeks("5-6"), Src: Source{"Unavailable", 2}}}
		}, []string{RuleUnavailable}, "cohort Year 1 Biology (C1) is unavailable Wed 09:40–12:00 in weeks 5–6 but has A meeting 1 at Wed 09:00–09:50 (Cohorts row 2; Sections row 2; Unavailable row 2)"},
		{"unavailable in other weeks", func(tm *Term, _ *Schedule) {
			tm.Sections[0].Times[0].Weeks = ptOdd
			tm.Unavailable = []Unavailability{{Who: "A", Kind: WhoSection, Day: 3, From: 9 * 60, To: 12 * 60, Hard: true, Weeks: ptEven}}
		}, nil, ""},
		{"fixed day of the meeting time", func(tm *Term, _ *Schedule) {
			tm.Sections[0].Fixed = []Fixed{{Day: 3, Start: 9 * 60, Room: "R1"}}
		}, nil, ""},
		{"fixed elsewhere", func(tm *Term, _ *Schedule) {
			tm.Sections[0].Fixed = []Fixed{{Day: 2, Start: 9 * 60, Text: "Tue 9:00"}}
		}, []string{RuleFixed}, `A is fixed at "Tue 9:00" but its meeting time in the timetable does not meet at Tue 09:00 (Sections row 2)`},
		{"travel too short", func(tm *Term, _ *Schedule) {
			tm.Sections[1].Times[0].Start = 10 * 60 // B Mon 10:00, 10 minutes after A in North; B in South
			tm.Travel = []Travel{{From: "R1", To: "South", Minutes: 11}}
		}, []string{RuleTravel, RuleTravel},
			"cohort Year 1 Biology (C1) has A in R1 until Mon 09:50 and B in R2 from 10:00, 10 minutes apart, but getting from R1 to R2 takes 11 minutes (Cohorts row 2; Sections rows 2 and 3)"},
		{"travel just enough", func(tm *Term, _ *Schedule) {
			tm.Sections[1].Times[0].Start = 10 * 60
			tm.Travel = []Travel{{From: "R1", To: "South", Minutes: 10}}
		}, nil, ""},
		{"weekly minutes", func(tm *Term, _ *Schedule) { tm.Staff[0].MaxWeekMinutes = 174 }, // 50 + 50 + 75 = 175
			[]string{RuleWeekLimit}, "staff Dr Ana Petrović (S1) teaches 175 minutes in week 1 (12 weeks are over the limit); the limit is 174 a week (Staff row 2)"},
		{"weekly minutes at the limit", func(tm *Term, _ *Schedule) { tm.Staff[0].MaxWeekMinutes = 175 }, nil, ""},
		{"weekly days", func(tm *Term, _ *Schedule) { tm.Staff[0].MaxWeekDays = 1 }, // Mon and Wed
			[]string{RuleWeekLimit}, ""},
		{"weekly days in some weeks", func(tm *Term, _ *Schedule) {
			tm.Staff[0].MaxWeekDays = 1
			tm.Sections[0].Times[0].Days = ptDays("Mon")
			tm.Sections[1].Times[0].Days = ptDays("Tue")
			tm.Sections[1].Times[0].Weeks = ptWeeks("3 4")
		}, []string{RuleWeekLimit}, "staff Dr Ana Petrović (S1) teaches 2 days in week 3 (2 weeks are over the limit); the limit is 1 a week (Staff row 2)"},
		{"lunch kept", func(tm *Term, _ *Schedule) {
			tm.Cohorts[0].Lunch = LunchBreak{From: 11 * 60, To: 14 * 60, Minutes: 105} // B 11:00–12:15 leaves 12:15–14:00 = 105
		}, nil, ""},
		{"lunch broken", func(tm *Term, _ *Schedule) {
			tm.Cohorts[0].Lunch = LunchBreak{From: 11 * 60, To: 14 * 60, Minutes: 106}
		}, []string{RuleLunch}, "cohort Year 1 Biology (C1) has no free 106 minutes between 11:00 and 14:00 on Mon (the longest free time there is 105 minutes) (Cohorts row 2)"},
		{"lunch only on days with a meeting", func(tm *Term, _ *Schedule) {
			tm.Sections[1].Times[0].Days = ptDays("Tue")
			tm.Sections[1].Times[0].Weeks = ptOdd
			tm.Cohorts[0].Lunch = LunchBreak{From: 11 * 60, To: 12 * 60, Minutes: 60}
		}, []string{RuleLunch}, "cohort Year 1 Biology (C1) has no free 60 minutes between 11:00 and 12:00 on Tue in weeks 1, 3, 5, 7, 9 and 11 (the longest free time there is 0 minutes) (Cohorts row 2)"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := base()
			tc.mutate(tm, s)
			vs := Check(tm, s)
			if tc.rules == nil {
				assert.Empty(t, vs, "%v", vs)
				return
			}
			require.Equal(t, tc.rules, ckRules(vs), "%v", vs)
			if tc.msg != "" {
				assert.Equal(t, tc.msg, vs[0].Msg)
			}
		})
	}
}

// TestCostOnPatternTerms checks the criteria that pattern placements touch,
// with the arithmetic of their definitions (criteria.go) in the comments.
func TestCostOnPatternTerms(t *testing.T) {
	tm, s := ptTerm(
		ptSec{ID: "A", Days: "Mon Wed Fri", Start: "09:00", Minutes: 50, Room: "R1", Staff: "S1", Cohort: "C1"},
		ptSec{ID: "B", Days: "Wed", Start: "09:30", Minutes: 75, Weeks: ptOdd, Room: "R2", Staff: "S2", Cohort: "C2"})
	tm.Sections[0].Times = append(tm.Sections[0].Times, TimeChoice{Days: ptDays("Tue Thu"), Start: 16 * 60, Minutes: 75, Weeks: tm.AllWeeks(), Weight: 4})
	tm.Sections[1].RoomChoices = []RoomChoice{{Room: "R2", Weight: 3}, {Room: "R3"}}
	tm.Enrolments = []Enrolment{{Student: "st1", Section: "A"}, {Student: "st1", Section: "B"}, {Student: "st2", Section: "A"}}
	tm.Unavailable = []Unavailability{{Who: "S1", Kind: WhoStaff, Day: 1, From: 9 * 60, To: 12 * 60, Weight: 2},
		{Who: "S1", Kind: WhoStaff, Day: 3, From: 9 * 60, To: 12 * 60, Weight: 5, Weeks: ptWeeks("13")}}
	s.Placements[0].Time = 2 // A at Tue Thu 16:00, weight 4
	r := Cost(tm, s, nil)
	assert.Equal(t, int64(4), r.Criterion(CritTimeChoice).Cost, "A's chosen time weighs 4")
	assert.Equal(t, int64(3), r.Criterion(CritRoomChoice).Cost, "B in R2 weighs 3")
	assert.Equal(t, int64(0), r.Criterion(CritAvoidTimes).Cost, "A meets Tue Thu: no row's day")
	assert.Equal(t, int64(0), r.Criterion(CritStudentClash).Cost)
	assert.Equal(t, int64(7), r.PerSection["A"]+r.PerSection["B"])

	s.Placements[0].Time = 1 // A at Mon Wed Fri 09:00–09:50, weight 0
	s.Placements[1].Room = "R3"
	r = Cost(tm, s, nil)
	assert.Equal(t, int64(0), r.Criterion(CritTimeChoice).Cost)
	assert.Equal(t, int64(0), r.Criterion(CritRoomChoice).Cost, "R3 weighs 0")
	// the Mon row (weight 2) covers A's Monday meeting: 1 unit × 2; the Wed row names week 13,
	// which this 12-week term's meetings never reach: 0.
	assert.Equal(t, [2]int64{1, 2}, [2]int64{r.Criterion(CritAvoidTimes).Count, r.Criterion(CritAvoidTimes).Cost})
	// st1 takes A and B, which share Wed 09:30–09:50 in odd weeks: 1 student × 1 pair.
	assert.Equal(t, [2]int64{1, 1}, [2]int64{r.Criterion(CritStudentClash).Count, r.Criterion(CritStudentClash).Cost})
	vs := Check(tm, s)
	require.Len(t, vs, 1, "%v", vs)
	assert.Equal(t, "student st1 is enrolled in both A and B, which meet together at Wed 09:30–09:50 in weeks 1, 3, 5, 7, 9 and 11 (Sections rows 2 and 3)", vs[0].Msg)
	assert.False(t, vs[0].Hard)
	// moved meetings: the kept timetable had A at time 2; A now at time 1 → 1 moved; B kept in R3 → 0.
	kept := &Schedule{Placements: []Placement{{Section: "A", Meeting: 1, Period: -1, Time: 2, Room: "R1"}, {Section: "B", Meeting: 1, Period: -1, Time: 1, Room: "R3"}}}
	assert.Equal(t, int64(1), Cost(tm, s, kept).Criterion(CritMoved).Count)
	// period-based criteria see no pattern meeting.
	for _, name := range []string{CritStaffGaps, CritCohortGaps, CritCohortIsolated, CritTravel, CritEarly, CritLate, CritStaffDays} {
		assert.Zero(t, r.Criterion(name).Count, name)
	}
}
