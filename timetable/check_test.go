package timetable

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestCheckValidScheduleIsClean(t *testing.T) {
	vs := Check(ckTerm(), ckSchedule())
	assert.Empty(t, vs, "%v", vs)
}

// TestCheckMutations takes the valid ckSchedule, breaks exactly one
// requirement, and asserts that Check names exactly that.
func TestCheckMutations(t *testing.T) {
	cases := []struct {
		name   string
		mutate func(t *Term, s *Schedule)
		rules  []string
		hard   bool
		msg    string // expected message of the first violation ("" = not checked)
		pls    []int  // expected placements of the first violation (nil = not checked)
	}{
		{"staff clash", func(_ *Term, s *Schedule) { ckPlace(s, 3, 0, "R3") },
			[]string{RuleStaffClash}, true,
			"staff Dr Ana Petrović (S1) teaches BIO-101 and PHY-110 at Mon 09:00 (Sections rows 2 and 4; Staff row 2)", []int{0, 3}},
		{"cohort clash with a two-period meeting", func(_ *Term, s *Schedule) { ckPlace(s, 3, 6, "R3") },
			[]string{RuleCohortClash}, true,
			"cohort Year 1 Chemistry (C2) has CHE-210 and PHY-110 at Tue 10:00 (Cohorts row 3; Sections rows 3 and 4)", []int{2, 3}},
		{"room clash", func(_ *Term, s *Schedule) { ckPlace(s, 5, 1, "R3") },
			[]string{RuleRoomClash}, true, "room R3 holds PHY-110 and ART-120 at Mon 10:00 (Rooms row 4; Sections rows 4 and 6)", []int{3, 5}},
		{"disjoint weeks share staff freely", func(tm *Term, s *Schedule) {
			tm.Sections[0].Weeks = tm.AllWeeks() & 0x5555555555555555 // odd weeks
			tm.Sections[1].Weeks = tm.AllWeeks() &^ 0x5555555555555555
			tm.Sections[1].Staff = []string{"S1"}
			tm.Relations = nil
			ckPlace(s, 2, 10, "R2") // CHE-210 Wed 09:00–11:00 with BIO-101 m2 at Wed 09:00, both S1
		}, nil, true, "", nil},
		{"overlapping weeks clash", func(tm *Term, s *Schedule) {
			tm.Sections[0].Weeks = 0b0011
			tm.Sections[1].Weeks = 0b0110
			tm.Sections[1].Staff = []string{"S1"}
			tm.Relations = nil
			ckPlace(s, 2, 10, "R2")
		}, []string{RuleStaffClash}, true, "", []int{1, 2}},
		{"student clash is soft", func(_ *Term, s *Schedule) { ckPlace(s, 5, 0, "R3") },
			[]string{RuleStudentClash}, false,
			"2 students (st1 and st2) are enrolled in both BIO-101 and ART-120, which meet together at Mon 09:00 (Enrolments rows 2 and 4; Sections rows 2 and 6)",
			[]int{0, 5}},
		{"hard unavailability", func(_ *Term, s *Schedule) { ckPlace(s, 5, 14, "R3") },
			[]string{RuleUnavailable}, true,
			"staff Ben Okafor (S2) is unavailable Wed 13:00–15:00 [committee] but teaches ART-120 meeting 1 at Wed 14:00 (Sections row 6; Staff row 3; Unavailable row 2)",
			[]int{5}},
		{"soft unavailability is not a violation", func(tm *Term, _ *Schedule) { tm.Unavailable[0].Hard = false; tm.Unavailable[0].Weight = 2 },
			nil, true, "", nil},
		{"capacity broken", func(tm *Term, s *Schedule) { tm.Sections[0].Rooms = nil; s.Placements[1].Room = "R3" },
			[]string{RuleCapacity}, true, "BIO-101 meeting 2 expects 25 students but room R3 seats 20 (Rooms row 4; Sections row 2)", []int{1}},
		{"soft capacity is not checked", func(tm *Term, s *Schedule) {
			tm.Sections[0].Rooms = nil
			tm.SoftCapacity = true
			s.Placements[1].Room = "R3"
		}, nil, true, "", nil},
		{"features", func(_ *Term, s *Schedule) { s.Placements[2].Room = "R1" },
			[]string{RuleFeatures}, true, "CHE-210 meeting 1 needs lab but room R1 lacks lab (Rooms row 2; Sections row 3)", []int{2}},
		{"room not allowed", func(_ *Term, s *Schedule) { s.Placements[3].Room = "R1" },
			[]string{RuleRoomNotAllowed}, true, "PHY-110 meeting 1 is in R1 but the section may use only R3 (Rooms row 2; Sections row 4)", []int{3}},
		{"fixed meeting moved", func(_ *Term, s *Schedule) { ckPlace(s, 0, 4, "R1") },
			[]string{RuleFixed}, true,
			`BIO-101 is fixed at "Mon 09:00 R1" but the timetable has no meeting of it at Mon 09:00 in R1 (Sections row 2)`, nil},
		{"fixed meeting in another room", func(_ *Term, s *Schedule) { s.Placements[0].Room = "R2" },
			[]string{RuleFixed}, true, "", nil},
		{"fixed meeting matched by the other meeting number", func(_ *Term, s *Schedule) {
			s.Placements[0].Meeting, s.Placements[1].Meeting = 2, 1
		}, nil, true, "", nil},
		{"missing meeting", func(_ *Term, s *Schedule) { s.Placements = append(s.Placements[:1], s.Placements[2:]...) },
			[]string{RuleMeetings}, true, "BIO-101 meets 2 times a week but meeting 2 is not in the timetable (Sections row 2)", nil},
		{"repeated meeting number", func(_ *Term, s *Schedule) { s.Placements[1].Meeting = 1 },
			[]string{RuleMeetings, RuleMeetings}, true, "BIO-101 meets 2 times a week but meeting 2 is not in the timetable (Sections row 2)", nil},
		{"meeting number out of range", func(tm *Term, s *Schedule) {
			tm.Relations = nil
			s.Placements = append(s.Placements, Placement{Section: "BIO-101", Meeting: 3, Period: 8, Room: "R1"})
		}, []string{RuleMeetings}, true, "BIO-101 has a meeting numbered 3 but meets 2 times a week; number meetings 1 to 2 (Sections row 2)", []int{6}},
		{"meeting across the lunch break", func(_ *Term, s *Schedule) { ckPlace(s, 2, 2, "R2") },
			[]string{RuleLength}, true,
			"CHE-210 meeting 1 needs 2 consecutive periods from Mon 11:00, but the periods there break or end before that (Sections row 3)", []int{2}},
		{"meeting past the end of the day", func(_ *Term, s *Schedule) { ckPlace(s, 2, 4, "R2") },
			[]string{RuleLength}, true, "", []int{2}},
		{"outside grid", func(_ *Term, s *Schedule) { s.Placements[5].Period = 15 },
			[]string{RuleOutsideGrid}, true, "ART-120 meeting 1 starts at a time that is not in the Periods sheet (Sections row 6)", []int{5}},
		{"unknown section", func(_ *Term, s *Schedule) {
			s.Placements = append(s.Placements, Placement{Section: "XYZ-999", Meeting: 1, Period: 0, Room: "R1"})
		}, []string{RuleUnknownSection}, true, `section "XYZ-999" is not in the Sections sheet; add it there or remove this meeting`, []int{6}},
		{"unknown room", func(_ *Term, s *Schedule) { s.Placements[1].Room = "R9" },
			[]string{RuleUnknownRoom}, true, `BIO-101 meeting 2 is in room "R9", which is not in the Rooms sheet (Sections row 2)`, []int{1}},
		{"room missing", func(_ *Term, s *Schedule) { s.Placements[1].Room = "" },
			[]string{RuleNoRoom}, true, "BIO-101 meeting 2 has no room (Sections row 2)", []int{1}},
		{"no-room section given a room", func(_ *Term, s *Schedule) { s.Placements[4].Room = "R1" },
			[]string{RuleNoRoom}, true, "ONL-100 takes no room (online or off-site) but ONL-100 meeting 1 is in R1 (Sections row 5)", []int{4}},
		{"same day", func(_ *Term, s *Schedule) { ckPlace(s, 1, 4, "R1") },
			[]string{RuleSameDay}, true, "BIO-101 meets 2 times on Mon (meetings 1 and 2); its meetings must fall on different days (Sections row 2)", []int{0, 1}},
		{"same day allowed", func(tm *Term, s *Schedule) { tm.Sections[0].SameDay = true; ckPlace(s, 1, 4, "R1") },
			nil, true, "", nil},
		{"section overlapping itself", func(tm *Term, s *Schedule) { tm.Sections[0].SameDay = true; ckPlace(s, 1, 0, "R1") },
			[]string{RuleSelfOverlap}, true, "BIO-101 meetings 1 and 2 overlap at Mon 09:00 (Sections row 2)", []int{0, 1}},
		{"max per day", func(_ *Term, s *Schedule) { ckPlace(s, 4, 8, ""); ckPlace(s, 5, 9, "R3") },
			[]string{RuleMaxPerDay}, true, "staff Ben Okafor (S2) teaches 4 periods on Tue; the limit is 3 a day (Staff row 3)", []int{2, 4, 5}},
		{"max consecutive", func(_ *Term, s *Schedule) { ckPlace(s, 5, 7, "R3") },
			[]string{RuleMaxConsecutive}, true,
			"staff Ben Okafor (S2) teaches 3 periods in a row, Tue 09:00–12:00; the limit is 2 (Staff row 3)", []int{2, 5}},
		{"consecutive count stops at the lunch break", func(tm *Term, s *Schedule) {
			tm.Staff[1].MaxPerDay = 0
			ckPlace(s, 4, 8, "") // Tue 13:00 after CHE-210 09:00–11:00: runs of 2 and 2
			ckPlace(s, 5, 9, "R3")
		}, nil, true, "", nil},
		{"hard relation", func(_ *Term, s *Schedule) { ckPlace(s, 2, 11, "R2") },
			[]string{RuleRelation}, true,
			"BIO-101 and CHE-210 must meet on different days, but BIO-101 and CHE-210 both meet on Wed (Relations row 2; Sections rows 2 and 3)", []int{1, 2}},
		{"soft relation is not a violation", func(tm *Term, s *Schedule) { tm.Relations[0].Hard = false; ckPlace(s, 2, 11, "R2") },
			nil, true, "", nil},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := ckTerm(), ckSchedule()
			tc.mutate(tm, s)
			vs := Check(tm, s)
			if tc.rules == nil {
				assert.Empty(t, vs, "%v", vs)
				return
			}
			require.Equal(t, tc.rules, ckRules(vs), "%v", vs)
			for _, v := range vs {
				assert.Equal(t, tc.hard, v.Hard)
			}
			if tc.msg != "" {
				assert.Equal(t, tc.msg, vs[0].Msg)
			}
			if tc.pls != nil {
				assert.Equal(t, tc.pls, vs[0].Placements)
			}
		})
	}
}

func TestCheckRelations(t *testing.T) {
	cases := []struct {
		name   string
		kind   RelationKind
		secs   []string
		mutate func(s *Schedule)
		broken bool
	}{
		{"same time broken", SameTime, []string{"PHY-110", "ART-120"}, nil, true},
		{"same time holds", SameTime, []string{"PHY-110", "ART-120"}, func(s *Schedule) { ckPlace(s, 5, 1, "R1") }, false},
		{"not same time holds", NotSameTime, []string{"BIO-101", "CHE-210"}, nil, false},
		{"not same time broken", NotSameTime, []string{"BIO-101", "CHE-210"}, func(s *Schedule) { ckPlace(s, 2, 0, "R2") }, true},
		{"not same time counts every period of a meeting", NotSameTime, []string{"CHE-210", "ART-120"},
			func(s *Schedule) { ckPlace(s, 5, 6, "R3") }, true},
		{"not same time ignores weeks", NotSameTime, []string{"BIO-101", "CHE-210"},
			func(s *Schedule) { ckPlace(s, 2, 0, "R2") }, true},
		{"different days holds", DifferentDays, []string{"BIO-101", "CHE-210"}, nil, false},
		{"different days broken", DifferentDays, []string{"PHY-110", "ONL-100"}, nil, true},
		{"same day broken", SameDayRel, []string{"BIO-101", "ONL-100"}, nil, true},
		{"same day holds", SameDayRel, []string{"PHY-110", "ONL-100"}, nil, false},
		{"before holds", Before, []string{"PHY-110", "ART-120"}, nil, false},
		{"before broken", Before, []string{"ART-120", "PHY-110"}, nil, true},
		{"before needs every occupied period earlier", Before, []string{"CHE-210", "ART-120"}, func(s *Schedule) { ckPlace(s, 5, 6, "R3") }, true},
		{"before right after the last period", Before, []string{"CHE-210", "ART-120"}, func(s *Schedule) { ckPlace(s, 5, 7, "R3") }, false},
		{"before on a chain of three", Before, []string{"PHY-110", "CHE-210", "ART-120"}, func(s *Schedule) { ckPlace(s, 5, 5, "R3") }, true},
		{"back to back holds", BackToBack, []string{"CHE-210", "ART-120"}, func(s *Schedule) { ckPlace(s, 5, 7, "R3") }, false},
		{"back to back broken", BackToBack, []string{"CHE-210", "ART-120"}, func(s *Schedule) { ckPlace(s, 5, 8, "R3") }, true},
		{"back to back across lunch is broken", BackToBack, []string{"PHY-110", "ONL-100"}, func(s *Schedule) { ckPlace(s, 3, 2, "R3") }, true},
		{"back to back needs every meeting of B", BackToBack, []string{"ONL-100", "BIO-101"}, func(s *Schedule) { ckPlace(s, 4, 14, "") }, true},
		{"same room broken", SameRoom, []string{"BIO-101", "PHY-110"}, nil, true},
		{"same room holds", SameRoom, []string{"PHY-110", "ART-120"}, nil, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := ckTerm(), ckSchedule()
			tm.Relations = []Relation{{Kind: tc.kind, Sections: tc.secs, Hard: true, Src: Source{"Relations", 7}}}
			if tc.mutate != nil {
				tc.mutate(s)
			}
			var rel []Violation
			for _, v := range Check(tm, s) {
				if v.Rule == RuleRelation {
					rel = append(rel, v)
				}
			}
			if !tc.broken {
				assert.Empty(t, rel)
				return
			}
			require.Len(t, rel, 1)
			assert.Contains(t, rel[0].Msg, "(Relations row 7;")
			assert.Contains(t, rel[0].Sources, Source{"Relations", 7})
		})
	}
}

func TestCheckTimetableRowsInMessages(t *testing.T) {
	tm, s := ckTerm(), ckSchedule()
	for i := range s.Placements {
		s.Placements[i].Src = Source{Sheet: TimetableSheet, Row: i + 2}
	}
	ckPlace(s, 3, 0, "R3")
	vs := Check(tm, s)
	require.Len(t, vs, 1)
	assert.Equal(t, "Timetable rows 2 and 5: staff Dr Ana Petrović (S1) teaches BIO-101 and PHY-110 at Mon 09:00 (Sections rows 2 and 4; Staff row 2)", vs[0].Msg)
}

func TestCheckOrderAndHardViolations(t *testing.T) {
	tm, s := ckTerm(), ckSchedule()
	ckPlace(s, 5, 0, "R3")        // student clash (soft) with BIO-101
	s.Placements[1].Room = "R9"   // unknown room
	s.Placements[2].Meeting = 2   // CHE-210 meeting 2 of 1, and meeting 1 missing
	tm.Unavailable[1].Hard = true // S1 may not teach Mon 09:00–10:00
	tm.Unavailable[1].Day = time.Monday
	vs := Check(tm, s)
	assert.Equal(t, []string{RuleMeetings, RuleUnavailable, RuleUnknownRoom, RuleMeetings, RuleStudentClash}, ckRules(vs), "%v", vs)
	hard := HardViolations(vs)
	assert.Len(t, hard, 4)
	for _, v := range hard {
		assert.True(t, v.Hard)
	}
	assert.Equal(t, vs, Check(tm, s), "Check is deterministic")
}

func TestCheckNilAndEmpty(t *testing.T) {
	tm := ckTerm()
	vs := Check(tm, nil)
	assert.Equal(t, []string{RuleFixed, RuleMeetings, RuleMeetings, RuleMeetings, RuleMeetings, RuleMeetings}, ckRules(vs),
		"every section misses its meetings, and the fixed meeting is not there")
	assert.Empty(t, Check(&Term{}, &Schedule{}))
}

func TestCheckZeroWeeksMeansAllWeeks(t *testing.T) {
	tm, s := ckTerm(), ckSchedule()
	for i := range tm.Sections {
		tm.Sections[i].Weeks = 0
	}
	ckPlace(s, 3, 0, "R3")
	assert.Equal(t, []string{RuleStaffClash}, ckRules(Check(tm, s)))
}
