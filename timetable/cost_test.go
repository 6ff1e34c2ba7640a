package timetable

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// Every expected number below is worked out by hand from the definitions in
// criteria.go on the ckTerm grid (Mon 0–4, Tue 5–9, Wed 10–14; each day
// 09, 10, 11 | lunch | 13, 14) and the ckSchedule placements:
//
//	BIO-101 (S1, C1, 25) Mon 09 R1 (p0), Wed 09 R1 (p10)
//	CHE-210 (S2, C2, 50) Tue 09–11 R2 (p5, p6)
//	PHY-110 (S1, C2, 18) Mon 10 R3 (p1)
//	ONL-100 (S2, C1, no room) Mon 13 (p3)
//	ART-120 (S2, 10) Tue 14 R3 (p9)
//
// Rooms: R1 60 seats North, R2 60 South, R3 20 North.

func TestCostOfTheFixture(t *testing.T) {
	r := Cost(ckTerm(), ckSchedule(), nil)
	want := map[string][2]int64{ // criterion -> {count, cost}
		CritMoved:        {0, 0}, // no kept timetable
		CritStudentClash: {0, 0}, // st1, st2 take BIO-101 (p0, p10) and ART-120 (p9): no common period
		// soft row S1 Mon 09:00–10:00 weight 3 covers BIO-101 m1 at p0: 1 hit; cost 1 (criterion) × 3 (row) × 1 = 3
		CritAvoidTimes: {1, 3},
		// S1: Mon busy p0, p1 → 0; Wed p10 → 0. S2: Mon p3 → 0; Tue busy p5, p6, p9:
		// first p5, last p9 → 5 periods, 3 busy → 2 (Tue 11:00 and 13:00). Total 2, weight 1.
		CritStaffGaps: {2, 2},
		// S1 Mon, Wed = 2; S2 Mon, Tue = 2; default weight 0.
		CritStaffDays: {4, 0},
		// C1: Mon busy p0 (BIO), p3 (ONL): 4 periods p0..p3, 2 busy → 2; Wed p10 → 0. C2: Mon p1 → 0; Tue p5, p6 → 0.
		CritCohortGaps: {2, 2},
		// C1: p0 (p1 not C1's), p3 (p2→p3 is not consecutive: lunch; p4 free), p10 → 3.
		// C2: p1 (p0, p2 not C2's) → 1; p5, p6 neighbour each other → 0. Total 4.
		CritCohortIsolated: {4, 4},
		CritSpreadDays:     {0, 0}, // no section has SameDay with MinDays
		CritRoomStability:  {0, 0}, // BIO-101 uses R1 twice
		CritOverCapacity:   {0, 0}, // capacity is hard in this term
		// BIO-101 2 × (60 − 25) = 70; CHE-210 60 − 50 = 10; PHY-110 20 − 18 = 2; ART-120 20 − 10 = 10 → 92; weight 0.
		CritWastedSeats: {92, 0},
		CritTravel:      {0, 0}, // the only back-to-back pair, S1's p0 (R1 North) → p1 (R3 North), stays in North
		// first period of a day: BIO-101 at p0 and p10, CHE-210 at p5 → 3; weight 0.
		CritEarly: {3, 0},
		// last period of a day (p4, p9, p14): ART-120 at p9 → 1; weight 0.
		CritLate:          {1, 0},
		CritSoftRelations: {0, 0},
		CritTimeChoice:    {0, 0}, // no section uses meeting patterns
		CritRoomChoice:    {0, 0}, // no section has room choices
		CritUnplaced:      {0, 0}, // the fixture has no course requests
		CritMovedStudents: {0, 0}, // no kept timetable (and nobody sectioned)
	}
	require.Len(t, r.Criteria, len(Criteria))
	for i, c := range r.Criteria {
		assert.Equal(t, Criteria[i].Name, c.Name, "criteria in contract order")
		w, ok := want[c.Name]
		require.True(t, ok, c.Name)
		assert.Equal(t, w, [2]int64{c.Count, c.Cost}, c.Name)
	}
	// Level 1 holds avoid 3 + staff gaps 2 + cohort gaps 2 + isolated 4 = 11;
	// levels 2 (student clashes) and 3 (moved meetings) have weight 1 and
	// cost 0; the sectioning criteria (unplaced requests at 4, moved
	// students at 3) weigh 0 without requests (Term.CriterionApplies), so
	// level 4 has no entry, nor do the level 0 criteria (weight 0).
	assert.Equal(t, map[int]int64{1: 11, 2: 0, 3: 0}, r.ByLevel)
	assert.Equal(t, []int{3, 2, 1}, r.Levels())
	// S1: avoid 3; S2: gaps 2. C1: gaps 2 + isolated 3; C2: isolated 1.
	assert.Equal(t, map[string]int64{"S1": 3, "S2": 2}, r.PerStaff)
	assert.Equal(t, map[string]int64{"C1": 5, "C2": 1}, r.PerCohort)
	assert.Empty(t, r.PerSection)
	assert.Empty(t, r.PerRoom)
}

// TestCostCriteria checks each criterion on a small change of the fixture;
// the comment beside each case shows the arithmetic from its definition.
func TestCostCriteria(t *testing.T) {
	cases := []struct {
		name   string
		mutate func(t *Term, s *Schedule)
		kept   func(s *Schedule) // changes a copy of ckSchedule used as the kept timetable; nil = no kept
		crit   string
		count  int64
		cost   int64
	}{
		// ART-120 to Mon 09:00: st1 and st2 have BIO-101 and ART-120 both at p0 → 2 students × 1 period = 2.
		{"student clash", func(_ *Term, s *Schedule) { ckPlace(s, 5, 0, "R3") }, nil, CritStudentClash, 2, 2},
		// st3 in CHE-210 (p5, p6) and ART-120 moved to Tue 10:00 (p6) → 1 student × 1 common period = 1,
		// plus st1, st2 (BIO-101/ART-120: no common period) → 1.
		{"student clash with a two-period meeting", func(tm *Term, s *Schedule) {
			tm.Enrolments = append(tm.Enrolments, Enrolment{Student: "st3", Section: "CHE-210"}, Enrolment{Student: "st3", Section: "ART-120"})
			ckPlace(s, 5, 6, "R3")
		}, nil, CritStudentClash, 1, 1},
		// Same as the first case but BIO-101 in odd weeks and ART-120 in even weeks: week sets disjoint → 0.
		{"student clash in disjoint weeks", func(tm *Term, s *Schedule) {
			tm.Sections[0].Weeks = tm.AllWeeks() & 0x5555555555555555
			tm.Sections[4].Weeks = tm.AllWeeks() &^ 0x5555555555555555
			ckPlace(s, 5, 0, "R3")
		}, nil, CritStudentClash, 0, 0},
		// A student enrolled twice in one section counts once: still 2 students × 1 period.
		{"student enrolled twice", func(tm *Term, s *Schedule) {
			tm.Enrolments = append(tm.Enrolments, Enrolment{Student: "st1", Section: "BIO-101"})
			ckPlace(s, 5, 0, "R3")
		}, nil, CritStudentClash, 2, 2},
		// Soft row for cohort C2 on Tue 10:00–11:00, weight 2, criterion weight 3 (Weights sheet):
		// CHE-210 occupies p5, p6; p6 (Tue 10:00) is covered → 1 hit; plus the fixture's S1 row: 1 hit × 3.
		// Count 2; cost 3 × (2 × 1 + 3 × 1) = 15.
		{"avoid times weighted", func(tm *Term, _ *Schedule) {
			tm.Unavailable = append(tm.Unavailable, Unavailability{Who: "C2", Kind: WhoCohort, Day: time.Tuesday, From: 600, To: 660, Weight: 2})
			tm.Weights = map[string]Weight{CritAvoidTimes: {Weight: 3, Level: 1}}
		}, nil, CritAvoidTimes, 2, 15},
		// Room row R3 all day Mon weight 4: PHY-110 at p1 in R3 → 1 hit; + S1 row 1 hit × 3 → count 2, cost 4 + 3 = 7.
		{"avoid times on a room", func(tm *Term, _ *Schedule) {
			tm.Unavailable = append(tm.Unavailable, Unavailability{Who: "R3", Kind: WhoRoom, Day: time.Monday, From: 0, To: 1440, Weight: 4})
		}, nil, CritAvoidTimes, 2, 7},
		// Staff days weight 2: S1 (Mon, Wed) + S2 (Mon, Tue) = 4 days → cost 8.
		{"staff days", func(tm *Term, _ *Schedule) { tm.Weights = map[string]Weight{CritStaffDays: {Weight: 2, Level: 1}} },
			nil, CritStaffDays, 4, 8},
		// ART-120 to Tue 11:00 (p7): S2 Tue busy p5, p6, p7 → no gap; Mon p3 → 0. Total 0.
		{"staff gaps closed", func(_ *Term, s *Schedule) { ckPlace(s, 5, 7, "R3") }, nil, CritStaffGaps, 0, 0},
		// ONL-100 (C1) to Mon 10:00 (p1): C1 Mon busy p0, p1 → no gap, neither isolated; Wed p10 isolated → 1;
		// C2 still has p1 (PHY-110) isolated → total 2.
		{"cohort isolated", func(_ *Term, s *Schedule) { ckPlace(s, 4, 1, "") }, nil, CritCohortIsolated, 2, 2},
		// BIO-101 with SameDay, MinDays 3, weight 5: meetings on Mon and Wed → 3 − 2 = 1 → cost 5.
		{"spread days", func(tm *Term, _ *Schedule) { tm.Sections[0].SameDay = true; tm.Sections[0].MinDays = 3 },
			nil, CritSpreadDays, 1, 5},
		// MinDays 2 already met by 2 days → 0.
		{"spread days met", func(tm *Term, _ *Schedule) { tm.Sections[0].SameDay = true; tm.Sections[0].MinDays = 2 },
			nil, CritSpreadDays, 0, 0},
		// BIO-101 m2 in R2: rooms {R1, R2} → 2 − 1 = 1.
		{"room stability", func(_ *Term, s *Schedule) { s.Placements[1].Room = "R2" }, nil, CritRoomStability, 1, 1},
		// SoftCapacity; BIO-101 m2 (25 students) in R3 (20 seats) → 5 over.
		{"over capacity", func(tm *Term, s *Schedule) { tm.SoftCapacity = true; s.Placements[1].Room = "R3" },
			nil, CritOverCapacity, 5, 5},
		// Without SoftCapacity the same is a hard violation and costs nothing here.
		{"over capacity only when soft", func(_ *Term, s *Schedule) { s.Placements[1].Room = "R3" }, nil, CritOverCapacity, 0, 0},
		// R3 moved to building South: S1 has BIO-101 p0 in R1 (North) then PHY-110 p1 in R3 (South) → 1.
		{"travel", func(tm *Term, _ *Schedule) { tm.Rooms[2].Building = "South" }, nil, CritTravel, 1, 1},
		// R3 with no building: nothing to compare → 0.
		{"travel needs buildings", func(tm *Term, _ *Schedule) { tm.Rooms[0].Building = "" }, nil, CritTravel, 0, 0},
		// Travel counts staff and cohorts separately: PHY-110 given cohort C1 too and R3 in South →
		// S1 (p0 R1 → p1 R3) 1 + C1 (BIO-101 p0 → PHY-110 p1) 1 = 2.
		{"travel for staff and cohort", func(tm *Term, _ *Schedule) {
			tm.Rooms[2].Building = "South"
			tm.Sections[2].Cohorts = []string{"C2", "C1"}
		}, nil, CritTravel, 2, 2},
		// Early weight 2: BIO-101 p0, p10 and CHE-210 p5 → 3 × 2 = 6.
		{"early periods", func(tm *Term, _ *Schedule) { tm.Weights = map[string]Weight{CritEarly: {Weight: 2}} }, nil, CritEarly, 3, 6},
		// Late: CHE-210 moved to Wed 13:00 (p13, p14) touches the last period; plus ART-120 p9 → 2.
		{"late periods", func(tm *Term, s *Schedule) {
			tm.Weights = map[string]Weight{CritLate: {Weight: 1}}
			ckPlace(s, 2, 13, "R2")
		},
			nil, CritLate, 2, 2},
		// Soft "same room" BIO-101 (R1) and PHY-110 (R3), weight 4 → 1 broken row, cost 4.
		{"soft relation", func(tm *Term, _ *Schedule) {
			tm.Relations = append(tm.Relations, Relation{Kind: SameRoom, Sections: []string{"BIO-101", "PHY-110"}, Weight: 4})
		}, nil, CritSoftRelations, 1, 4},
		// The fixture's hard relation is not a soft cost even when broken.
		{"hard relation costs nothing", func(_ *Term, s *Schedule) { ckPlace(s, 2, 11, "R2") }, nil, CritSoftRelations, 0, 0},
		// Kept equals the new timetable → 0 moved.
		{"moved none", func(*Term, *Schedule) {}, func(*Schedule) {}, CritMoved, 0, 0},
		// BIO-101's meeting numbers swapped in the kept file: both meetings still sit at their day, time and room → 0.
		{"moved ignores meeting numbers", func(*Term, *Schedule) {}, func(k *Schedule) {
			k.Placements[0].Meeting, k.Placements[1].Meeting = 2, 1
		}, CritMoved, 0, 0},
		// CHE-210 to Tue 10:00 (period differs) and PHY-110 to R1 (room differs) → 2.
		{"moved", func(_ *Term, s *Schedule) { ckPlace(s, 2, 6, "R2"); s.Placements[3].Room = "R1" }, func(*Schedule) {}, CritMoved, 2, 2},
		// BIO-101 m2 from Wed 09:00 to Mon 14:00: kept p10 has no meeting any more, kept p0 still has → 1.
		{"moved one of two", func(_ *Term, s *Schedule) { ckPlace(s, 1, 4, "R1") }, func(*Schedule) {}, CritMoved, 1, 1},
		// Issue 12 item 3: BIO-101 m1 from Mon 09:00 to Wed 13:00 (p13); the Wed 09:00 meeting (p10) stays.
		// Paired in start order (p10↔p0, p13↔p10) both would differ; by the definition only the Monday one moved → 1.
		{"moved the earlier of two", func(_ *Term, s *Schedule) { ckPlace(s, 0, 13, "R1") }, func(*Schedule) {}, CritMoved, 1, 1},
		// The kept file lists BIO-101 three times; the section meets twice, both at kept places → the third moved: 1.
		{"moved kept meeting the section no longer has", func(*Term, *Schedule) {}, func(k *Schedule) {
			k.Placements = append(k.Placements, Placement{Section: "BIO-101", Meeting: 3, Period: 2, Room: "R1"})
		}, CritMoved, 1, 1},
		// A section absent from the kept timetable moves nothing.
		{"moved new section", func(*Term, *Schedule) {}, func(k *Schedule) { k.Placements = k.Placements[:5] }, CritMoved, 0, 0},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			tm, s := ckTerm(), ckSchedule()
			tc.mutate(tm, s)
			var kept *Schedule
			if tc.kept != nil {
				kept = ckSchedule()
				tc.kept(kept)
			}
			got := Cost(tm, s, kept).Criterion(tc.crit)
			assert.Equal(t, tc.crit, got.Name)
			assert.Equal(t, tc.count, got.Count, "count")
			assert.Equal(t, tc.cost, got.Cost, "cost")
		})
	}
}

func TestCostAttribution(t *testing.T) {
	tm, s := ckTerm(), ckSchedule()
	tm.Rooms[2].Building = "South"
	s.Placements[1].Room = "R2"
	tm.Weights = map[string]Weight{CritWastedSeats: {Weight: 1}}
	r := Cost(tm, s, nil)
	// S1: avoid 3 + travel 1 (p0 R1 North → p1 R3 South) = 4; S2: gaps 2.
	assert.Equal(t, map[string]int64{"S1": 4, "S2": 2}, r.PerStaff)
	// BIO-101: stability 1 + wasted (60−25)+(60−25) = 71; CHE-210 wasted 10; PHY-110 2; ART-120 10.
	assert.Equal(t, map[string]int64{"BIO-101": 71, "CHE-210": 10, "PHY-110": 2, "ART-120": 10}, r.PerSection)
	// Level 0 now has weight: wasted 92. Level 1: 11 + travel 1 + stability 1 = 13.
	// Levels 2 and 3 have weight and cost 0 (no clashes, nothing kept); no
	// requests, so no level 4 (Term.CriterionApplies).
	assert.Equal(t, map[int]int64{0: 92, 1: 13, 2: 0, 3: 0}, r.ByLevel)
}

func TestCostZeroWeightSwitchesOff(t *testing.T) {
	tm := ckTerm()
	tm.Weights = map[string]Weight{CritStaffGaps: {Weight: 0, Level: 1}}
	c := Cost(tm, ckSchedule(), nil).Criterion(CritStaffGaps)
	assert.Equal(t, CriterionCost{Name: CritStaffGaps, Level: 1, Weight: 0, Count: 2, Cost: 0}, c)
}

func TestCostNilSchedule(t *testing.T) {
	r := Cost(ckTerm(), nil, nil)
	for _, c := range r.Criteria {
		assert.Zero(t, c.Cost, c.Name)
	}
}
