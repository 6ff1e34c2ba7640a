package timetable

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// TestRelationKinds checks every relation kind, hard (Check) and soft
// (Cost), on hand-computed examples. The definitions are the doc comments
// of the kinds in term.go; for the kinds that correspond to distribution
// constraints of the ITC-2019 competition rules (Müller, Rudová, Müllerová,
// "University course timetabling and International Timetabling
// Competition 2019", PATAT 2018; formulas recalled from memory, minutes in
// place of 5-minute slots) the examples follow those formulas too, and the
// counted kinds multiply by the weight, then divide by the teaching weeks
// (12 here) and round down, as those rules do (the cost of the three
// per-week kinds is penalty × excess / weeks with the integer division
// last in the competition organisers' published evaluator, UniTime
// cpsolver ItcMaxBreaksConstraint). Each row's comment has the arithmetic.
func TestRelationKinds(t *testing.T) {
	a := func(days, start string, mins int, weeks WeekSet, room string) ptSec {
		return ptSec{ID: "A", Days: days, Start: start, Minutes: mins, Weeks: weeks, Room: room}
	}
	b := func(days, start string, mins int, weeks WeekSet, room string) ptSec {
		return ptSec{ID: "B", Days: days, Start: start, Minutes: mins, Weeks: weeks, Room: room}
	}
	c := func(id, days, start string, mins int, weeks WeekSet) ptSec {
		return ptSec{ID: id, Days: days, Start: start, Minutes: mins, Weeks: weeks, Room: "R1"}
	}
	all := WeekSet(0)
	w1 := ptWeeks("1")
	cases := []struct {
		name   string
		kind   RelationKind
		n, m   int
		secs   []ptSec
		travel []Travel
		broken bool
		weight int
		cost   int64 // soft relations cost with the row's weight (criterion weight 1)
	}{
		// same time: start sets {Mon 9:00, Wed 9:00, Fri 9:00} both → holds.
		{"same time holds", SameTime, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Mon Wed Fri", "09:00", 50, ptOdd, "R2")}, nil, false, 2, 0},
		// {Mon, Wed, Fri 9:00} vs {Mon, Wed 9:00} differ → broken, cost 2 once.
		{"same time broken", SameTime, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Mon Wed", "09:00", 50, all, "R2")}, nil, true, 2, 2},
		// Mon 9:00–9:50 (odd) and Mon 9:30 (even) share Mon 9:30–9:50; weeks are ignored → broken.
		{"not same time ignores weeks", NotSameTime, 0, 0, []ptSec{a("Mon", "09:00", 50, ptOdd, "R1"), b("Mon", "09:30", 50, ptEven, "R2")}, nil, true, 3, 3},
		// Mon 9:00–9:50 and Mon 9:50–10:40 touch without a common minute → holds.
		{"not same time touching holds", NotSameTime, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "09:50", 50, all, "R2")}, nil, false, 3, 0},
		// {Mon, Wed, Fri} ∩ {Tue, Thu} = ∅ → holds.
		{"different days holds", DifferentDays, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Tue Thu", "09:00", 75, all, "R2")}, nil, false, 1, 0},
		// {Mon, Wed, Fri} ∩ {Fri} = {Fri} → broken.
		{"different days broken", DifferentDays, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Fri", "14:00", 50, all, "R2")}, nil, true, 1, 1},
		// {Mon, Wed, Fri} = {Mon, Wed, Fri} at other hours → holds.
		{"same day holds", SameDayRel, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Mon Wed Fri", "14:00", 50, all, "R2")}, nil, false, 1, 0},
		// {Mon, Wed, Fri} ≠ {Mon, Wed} → broken.
		{"same day broken", SameDayRel, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Mon Wed", "14:00", 50, all, "R2")}, nil, true, 1, 1},
		// A's last (Mon, 9:50) ≤ B's first (Mon, 9:50) → holds.
		{"before holds", Before, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "09:50", 50, all, "R1")}, nil, false, 1, 0},
		// A's last (Fri, 9:50) is after B's first (Tue, 10:00) → broken.
		{"before broken", Before, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Tue", "10:00", 50, all, "R1")}, nil, true, 4, 4},
		// B Tue 10:15 starts when A Tue 9:00–10:15 ends → holds.
		{"back to back holds", BackToBack, 0, 0, []ptSec{a("Tue", "09:00", 75, all, "R1"), b("Tue", "10:15", 75, all, "R1")}, nil, false, 1, 0},
		// B starts 10:20, five minutes after A ends → broken.
		{"back to back broken", BackToBack, 0, 0, []ptSec{a("Tue", "09:00", 75, all, "R1"), b("Tue", "10:20", 75, all, "R1")}, nil, true, 1, 1},
		// R1 and R1 → holds; R1 and R2 → broken.
		{"same room holds", SameRoom, 0, 0, []ptSec{a("Tue", "09:00", 75, all, "R1"), b("Wed", "10:00", 75, all, "R1")}, nil, false, 1, 0},
		{"same room broken", SameRoom, 0, 0, []ptSec{a("Tue", "09:00", 75, all, "R1"), b("Wed", "10:00", 75, all, "R2")}, nil, true, 2, 2},
		// starts 9:00 and 9:00 on different days and lengths → holds.
		{"same start holds", SameStart, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Tue Thu", "09:00", 75, all, "R2")}, nil, false, 1, 0},
		// 9:00 vs 9:30 → broken.
		{"same start broken", SameStart, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Tue Thu", "09:30", 75, all, "R2")}, nil, true, 1, 1},
		// B 9:30–10:00 lies within A 9:00–10:15 (days ignored) → holds.
		{"within hours holds", WithinHours, 0, 0, []ptSec{a("Mon", "09:00", 75, all, "R1"), b("Tue", "09:30", 30, all, "R2")}, nil, false, 1, 0},
		// B 9:30–10:30 ends after A's 10:15 and starts after A's 9:00 → broken.
		{"within hours broken", WithinHours, 0, 0, []ptSec{a("Mon", "09:00", 75, all, "R1"), b("Tue", "09:30", 60, all, "R2")}, nil, true, 1, 1},
		// Mon 9:00–9:50 and Tue 9:30–10:20 share hours although days differ → broken.
		{"different hours broken across days", DifferentHours, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Tue", "09:30", 50, all, "R2")}, nil, true, 1, 1},
		// 9:00–9:50 and 9:50–10:40 → holds.
		{"different hours holds", DifferentHours, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Tue", "09:50", 50, all, "R2")}, nil, false, 1, 0},
		// {Mon, Wed} ⊆ {Mon, Wed, Fri} → holds.
		{"days within holds", DaysWithin, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Mon Wed", "11:00", 75, all, "R2")}, nil, false, 1, 0},
		// {Mon, Wed} and {Tue, Wed}: neither within the other → broken.
		{"days within broken", DaysWithin, 0, 0, []ptSec{a("Mon Wed", "09:00", 50, all, "R1"), b("Tue Wed", "11:00", 75, all, "R2")}, nil, true, 1, 1},
		// odd weeks ⊆ weeks 1–12 → holds.
		{"weeks within holds", WeeksWithin, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "11:00", 50, ptOdd, "R2")}, nil, false, 1, 0},
		// weeks 1–6 and 4–9: neither within the other → broken.
		{"weeks within broken", WeeksWithin, 0, 0, []ptSec{a("Mon", "09:00", 50, ptWeeks("1-6"), "R1"), b("Mon", "11:00", 50, ptWeeks("4-9"), "R2")}, nil, true, 1, 1},
		// odd ∩ even = ∅ → holds; 1–6 ∩ 6–12 = {6} → broken.
		{"different weeks holds", DifferentWeeks, 0, 0, []ptSec{a("Mon", "09:00", 50, ptOdd, "R1"), b("Mon", "09:00", 50, ptEven, "R1")}, nil, false, 1, 0},
		{"different weeks broken", DifferentWeeks, 0, 0, []ptSec{a("Mon", "09:00", 50, ptWeeks("1-6"), "R1"), b("Tue", "09:00", 50, ptWeeks("6-12"), "R1")}, nil, true, 1, 1},
		// Mon/Wed/Fri 9:00–9:50 every week and Wed 9:30–10:45 odd weeks share Wed 9:30–9:50 in odd weeks → overlap holds.
		{"overlap holds", OverlapRel, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Wed", "09:30", 75, ptOdd, "R2")}, nil, false, 1, 0},
		// the same times in odd weeks against even weeks never share a week → overlap broken.
		{"overlap broken by weeks", OverlapRel, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, ptOdd, "R1"), b("Wed", "09:30", 75, ptEven, "R2")}, nil, true, 1, 1},
		// no overlap: the reverse of the two rows above.
		{"no overlap broken", NoOverlap, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Wed", "09:30", 75, ptOdd, "R2")}, nil, true, 5, 5},
		{"no overlap holds by weeks", NoOverlap, 0, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, ptOdd, "R1"), b("Wed", "09:30", 75, ptEven, "R2")}, nil, false, 5, 0},
		// R1 vs R2 → holds; R1 vs R1 → broken.
		{"different rooms holds", DifferentRooms, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Tue", "09:00", 50, all, "R2")}, nil, false, 1, 0},
		{"different rooms broken", DifferentRooms, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Tue", "09:00", 50, all, "R1")}, nil, true, 1, 1},
		// A ends 9:50 in R1 (North), B starts 10:00 in R2 (South): 10 free minutes < 15 travel → broken.
		{"same people short of travel", SamePeople, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2")},
			[]Travel{{From: "North", To: "South", Minutes: 15}}, true, 1, 1},
		// 10 free minutes = 10 travel → holds.
		{"same people with just enough travel", SamePeople, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2")},
			[]Travel{{From: "South", To: "North", Minutes: 10}}, false, 1, 0},
		// the same pair in odd and even weeks never meets in a common week → holds.
		{"same people in different weeks", SamePeople, 0, 0, []ptSec{a("Mon", "09:00", 50, ptOdd, "R1"), b("Mon", "09:10", 50, ptEven, "R2")},
			[]Travel{{From: "North", To: "South", Minutes: 15}}, false, 1, 0},
		// overlap on Mon 9:30–9:50 → broken.
		{"same people overlapping", SamePeople, 0, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "09:30", 50, all, "R3")}, nil, true, 1, 1},
		// first weeks 2 and 1: A is later → broken.
		{"first before by week", FirstBefore, 0, 0, []ptSec{a("Mon", "09:00", 50, ptWeeks("2-12"), "R1"), b("Mon", "09:00", 50, all, "R2")}, nil, true, 1, 1},
		// week 1 both; first days Tue (A) and Mon (B) → broken.
		{"first before by day", FirstBefore, 0, 0, []ptSec{a("Tue Thu", "09:00", 75, w1, "R1"), b("Mon", "14:00", 50, w1, "R1")}, nil, true, 1, 1},
		// week 1, Mon both; A ends 9:50 ≤ B starts 9:50 → holds.
		{"first before by time", FirstBefore, 0, 0, []ptSec{a("Mon Wed", "09:00", 50, w1, "R1"), b("Mon", "09:50", 50, w1, "R1")}, nil, false, 1, 0},
		// week 1, Mon both; A ends 10:00 > B starts 9:30 → broken.
		{"first before by time broken", FirstBefore, 0, 0, []ptSec{a("Mon", "09:00", 60, w1, "R1"), b("Mon", "09:30", 50, w1, "R2")}, nil, true, 1, 1},
		// week 1 before week 2 whatever the days → holds.
		{"first before earlier week", FirstBefore, 0, 0, []ptSec{a("Fri", "15:00", 50, w1, "R1"), b("Mon", "08:00", 50, ptWeeks("2"), "R1")}, nil, false, 1, 0},
		// Mon 9:00 to 13:15 = 255 minutes > 240 → broken; with N = 255 → holds.
		{"day span broken", DaySpan, 240, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "12:00", 75, all, "R2")}, nil, true, 1, 1},
		{"day span holds", DaySpan, 255, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "12:00", 75, all, "R2")}, nil, false, 1, 0},
		// days Mon and Tue: no common day → holds at any span.
		{"day span other days", DaySpan, 60, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Tue", "15:00", 75, all, "R2")}, nil, false, 1, 0},
		// 9:50 to 10:00 = 10 free minutes < 15 → broken; N = 10 → holds.
		{"minimum gap broken", MinGap, 15, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2")}, nil, true, 1, 1},
		{"minimum gap holds", MinGap, 10, 0, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2")}, nil, false, 1, 0},
		// {Mon, Wed, Fri} ∪ {Mon, Wed} = 3 days, N = 3 → holds.
		{"at most days holds", MaxDays, 3, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Mon Wed", "11:00", 50, all, "R2")}, nil, false, 3, 0},
		// {Mon, Wed, Fri} ∪ {Tue, Thu} = 5 days, N = 2 → 3 over; soft 3 × 3 = 9.
		{"at most days broken", MaxDays, 2, 0, []ptSec{a("Mon Wed Fri", "09:00", 50, all, "R1"), b("Tue Thu", "11:00", 75, all, "R2")}, nil, true, 3, 9},
		// Mon: A 75 min weeks 1–12, B 75 min weeks 1–6. Weeks 1–6: 150 − 120 = 30 over, × 6 = 180
		// minutes = 36 five-minute steps; weeks 7–12: 75 ≤ 120. Soft 2 × 36 ÷ 12 weeks = 6.
		{"at most minutes a day", MaxDayMinutes, 120, 0, []ptSec{a("Mon", "09:00", 75, all, "R1"), b("Mon", "10:30", 75, ptWeeks("1-6"), "R2")}, nil, true, 2, 6},
		// the same in week 1 only: 30 minutes over = 6 steps, soft 2 × 6 ÷ 12 = 1; with N = 140:
		// 10 minutes = 2 steps, 2 × 2 ÷ 12 = 0.33 → 0: hard broken, soft cost 0; with N = 143:
		// 7 minutes = 1 step (rounded down), weight 12: 12 × 1 ÷ 12 = 1.
		{"at most minutes a day in one week", MaxDayMinutes, 120, 0, []ptSec{a("Mon", "09:00", 75, w1, "R1"), b("Mon", "10:30", 75, w1, "R2")}, nil, true, 2, 1},
		{"at most minutes a day in whole steps", MaxDayMinutes, 143, 0, []ptSec{a("Mon", "09:00", 75, w1, "R1"), b("Mon", "10:30", 75, w1, "R2")}, nil, true, 12, 1},
		{"at most minutes a day rounds down", MaxDayMinutes, 140, 0, []ptSec{a("Mon", "09:00", 75, w1, "R1"), b("Mon", "10:30", 75, w1, "R2")}, nil, true, 2, 0},
		// Mon, every week: A 9:00–9:50, B 10:00–10:50 (10-minute gap ≤ M = 10 joins), C 13:00, D 15:00
		// → 3 blocks, N + 1 = 2 allowed → 1 over × 12 weeks ÷ 12 = 1; soft 5 × 1 = 5.
		{"at most breaks", MaxBreaks, 1, 10, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2"),
			c("C", "Mon", "13:00", 50, all), c("D", "Mon", "15:00", 50, all)}, nil, true, 5, 5},
		// with M = 5 the 10-minute gap is a break too: 4 blocks, 2 over × 12 ÷ 12 = 2; soft 5 × 2 = 10.
		{"at most breaks with a short M", MaxBreaks, 1, 5, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2"),
			c("C", "Mon", "13:00", 50, all), c("D", "Mon", "15:00", 50, all)}, nil, true, 5, 10},
		// 2 blocks ≤ N + 1 = 2 → holds.
		{"at most breaks holds", MaxBreaks, 1, 10, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "13:00", 50, all, "R2")}, nil, false, 5, 0},
		// A 9:00–9:50 and B 10:00–10:50 join (gap 10 ≤ 10): block 110 minutes > 100, every week:
		// 12 ÷ 12 = 1; soft 4 × 1 = 4.
		{"longest block", MaxBlock, 100, 10, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, all, "R2")}, nil, true, 4, 4},
		// B in odd weeks only: 6 long blocks; weight 1: 1 × 6 ÷ 12 = 0 → hard broken, soft 0;
		// weight 4: 4 × 6 ÷ 12 = 2 (the division last, as the competition rules divide).
		{"longest block rounds down", MaxBlock, 100, 10, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, ptOdd, "R2")}, nil, true, 1, 0},
		{"longest block divides last", MaxBlock, 100, 10, []ptSec{a("Mon", "09:00", 50, all, "R1"), b("Mon", "10:00", 50, ptOdd, "R2")}, nil, true, 4, 2},
		// one meeting of 120 minutes alone is no block of two → holds.
		{"longest block of one meeting", MaxBlock, 100, 10, []ptSec{a("Mon", "09:00", 120, all, "R1"), b("Tue", "10:00", 50, all, "R2")}, nil, false, 4, 0},
	}
	seen := map[RelationKind]bool{}
	for _, tc := range cases {
		seen[tc.kind] = true
		t.Run(tc.name, func(t *testing.T) {
			tm, s := ptTerm(tc.secs...)
			require.Equal(t, 12, tm.TeachingWeeks())
			tm.Travel = tc.travel
			var ids []string
			for _, p := range tc.secs {
				ids = append(ids, p.ID)
			}
			rel := Relation{Kind: tc.kind, Sections: ids, Hard: true, N: tc.n, M: tc.m, Src: Source{"Relations", 9}}
			tm.Relations = []Relation{rel}
			var got []Violation
			for _, v := range Check(tm, s) {
				require.Equal(t, RuleRelation, v.Rule, "only the relation is at stake: %v", v)
				got = append(got, v)
			}
			if tc.broken {
				require.Len(t, got, 1)
				assert.Contains(t, got[0].Msg, "(Relations row 9; Sections rows 2")
				assert.NotEmpty(t, got[0].Placements)
			} else {
				assert.Empty(t, got)
			}
			rel.Hard, rel.Weight = false, tc.weight
			tm.Relations = []Relation{rel}
			assert.Empty(t, Check(tm, s), "a soft relation is no violation")
			assert.Equal(t, tc.cost, Cost(tm, s, nil).Criterion(CritSoftRelations).Cost)
		})
	}
	for _, k := range RelationKinds {
		assert.True(t, seen[k.Kind], "kind %q has a row", k.Name)
	}
}

// TestRelationKindsOnGridSections checks that the newer kinds read grid
// meetings as occurrences with their section's weeks, next to a pattern
// section in one term (mixed), on the ckTerm grid.
func TestRelationKindsOnGridSections(t *testing.T) {
	tm, s := ckTerm(), ckSchedule()
	tm.Relations = nil
	tm.Unavailable = nil
	tm.Sections = append(tm.Sections, Section{ID: "PAT-1", Size: 10, Meetings: 1, Length: 1, Weeks: tm.AllWeeks(), NoRoom: true,
		Times: []TimeChoice{{Days: DaysOf(1), Start: 9*60 + 30, Minutes: 50, Weeks: tm.AllWeeks()}}, Src: Source{"Sections", 7}})
	s.Placements = append(s.Placements, Placement{Section: "PAT-1", Meeting: 1, Period: -1, Time: 1})
	cases := []struct {
		kind   RelationKind
		secs   []string
		broken bool
	}{
		// BIO-101 Mon 09:00–10:00 and PAT-1 Mon 09:30–10:20 share Mon 09:30–10:00.
		{NoOverlap, []string{"BIO-101", "PAT-1"}, true},
		{OverlapRel, []string{"BIO-101", "PAT-1"}, false},
		// CHE-210 Tue 09:00–11:00 never meets Monday.
		{NoOverlap, []string{"CHE-210", "PAT-1"}, false},
		// the old kinds on a mixed list: BIO-101 meets Mon and Wed, PAT-1 Mon.
		{DifferentDays, []string{"BIO-101", "PAT-1"}, true},
		{NotSameTime, []string{"PHY-110", "PAT-1"}, true}, // PHY-110 Mon 10:00–11:00 vs 09:30–10:20
		{Before, []string{"PAT-1", "ART-120"}, false},     // Mon 10:20 before Tue 14:00
		{Before, []string{"ART-120", "PAT-1"}, true},
		{SameStart, []string{"BIO-101", "CHE-210"}, false}, // 09:00, 09:00 and 09:00
		{MaxDays, []string{"BIO-101", "CHE-210", "PAT-1"}, false},
	}
	for _, tc := range cases {
		rel := Relation{Kind: tc.kind, Sections: tc.secs, Hard: true, N: 3, Src: Source{"Relations", 2}}
		if tc.kind == MaxDays {
			rel.N = 3 // Mon, Tue, Wed
		}
		tm.Relations = []Relation{rel}
		n := 0
		for _, v := range Check(tm, s) {
			if v.Rule == RuleRelation {
				n++
			}
		}
		assert.Equal(t, tc.broken, n == 1, "%s %v", tc.kind, tc.secs)
	}
}
