package encode

import (
	"context"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// engineCostAt compiles the term (with the kept timetable), fixes every
// section's starts (section ID -> start periods), and returns the engine's
// cost per criterion name (non-zero entries only), after checking that the
// model passes solver.Verify and the third gate.
func engineCostAt(t *testing.T, term *timetable.Term, kept *timetable.Schedule, starts map[string][]int) map[string]int64 {
	t.Helper()
	p, cat, err := Compile(term, Options{Keep: kept})
	require.NoError(t, err)
	s, err := solver.New(p, solver.DefaultOptions())
	require.NoError(t, err)
	idx := term.SectionIndex()
	for id, ps := range starts {
		for _, q := range ps {
			a := cat.StartAtom(idx[id], q)
			require.NotZero(t, a, "%s cannot start at period %d", id, q)
			s.Assume(solver.Pos(a))
		}
	}
	require.Equal(t, solver.Satisfiable, s.Solve(context.Background()))
	model := s.Model(nil)
	require.NoError(t, solver.Verify(p, model))
	sched, err := Decode(term, cat, model)
	require.NoError(t, err)
	require.NoError(t, cat.thirdGate(term, p, model, sched, kept))
	out := map[string]int64{}
	for k, c := range cat.EngineCost(p, model) {
		if c != 0 {
			out[timetable.Criteria[k].Name] = c
		}
	}
	return out
}

// weights switches every criterion off except the given ones (name ->
// weight, all at level 1).
func weights(t *timetable.Term, on map[string]int) {
	t.Weights = map[string]timetable.Weight{}
	for _, c := range timetable.Criteria {
		t.Weights[c.Name] = timetable.Weight{Weight: on[c.Name], Level: 1}
	}
}

func softRow(kind timetable.WhoKind, who string, day time.Weekday, from, to, w int) timetable.Unavailability {
	return timetable.Unavailability{Who: who, Kind: kind, Day: day, From: timetable.Clock(from * 60), To: timetable.Clock(to * 60), Weight: w,
		Src: timetable.Source{Sheet: "Unavailable", Row: 2}}
}

// TestSoftCriteriaByHand: each criterion on a small example whose cost is
// worked out from its written definition in timetable/criteria.go (the
// working is in the comment of each case). Periods are numbered from 0:
// newTerm(d, n) has n one-hour periods from 09:00 on each of d days.
func TestSoftCriteriaByHand(t *testing.T) {
	mon := time.Monday
	cases := []struct {
		name   string
		term   func() *timetable.Term
		kept   *timetable.Schedule
		starts map[string][]int
		want   map[string]int64
	}{
		{
			// Staff T1's row Mon 09-11 (weight 3) covers periods 0, 1: A
			// (periods 1-2) hits it once, B (period 0) once: 2 × 3. Cohort
			// Y's row 11-12 (weight 2) covers period 2: C there, 2. Section
			// D's row 12-13 (weight 4): D at period 3, 4. Sum 12, criterion
			// weight 2: 24.
			name: "avoid times",
			term: func() *timetable.Term {
				b := newTerm(1, 4).room("R1", 30).room("R2", 30).room("R3", 30)
				b.section("A", staffOf("T1"), meetings(1, 2)).section("B", staffOf("T1"))
				b.section("C", staffOf("T2"), cohortsOf("Y")).section("D", staffOf("T3"))
				b.t.Unavailable = append(b.t.Unavailable, softRow(timetable.WhoStaff, "T1", mon, 9, 11, 3),
					softRow(timetable.WhoCohort, "Y", mon, 11, 12, 2), softRow(timetable.WhoSection, "D", mon, 12, 13, 4))
				weights(b.t, map[string]int{timetable.CritAvoidTimes: 2})
				return b.t
			},
			starts: map[string][]int{"A": {1}, "B": {0}, "C": {2}, "D": {3}},
			want:   map[string]int64{timetable.CritAvoidTimes: 24},
		},
		{
			// T1 busy at 0 and 3 of five periods: 1 and 2 are gaps (2, weight
			// 3: 6). Cohort Y busy at 0 and 4: gaps 1, 2, 3 (3) and both
			// busy periods isolated (2).
			name: "gaps and isolated periods",
			term: func() *timetable.Term {
				b := newTerm(1, 5).room("R1", 30)
				b.section("A", staffOf("T1"), cohortsOf("Y")).section("B", staffOf("T1")).section("C", staffOf("T2"), cohortsOf("Y"))
				weights(b.t, map[string]int{timetable.CritStaffGaps: 3, timetable.CritCohortGaps: 1, timetable.CritCohortIsolated: 1})
				return b.t
			},
			starts: map[string][]int{"A": {0}, "B": {3}, "C": {4}},
			want:   map[string]int64{timetable.CritStaffGaps: 6, timetable.CritCohortGaps: 3, timetable.CritCohortIsolated: 2},
		},
		{
			// Y busy at 0, 1 and 3: 0 and 1 are neighbours, 3 is isolated
			// (1); the gap at 2 counts once.
			name: "isolated needs both neighbours free",
			term: func() *timetable.Term {
				b := newTerm(1, 4).room("R1", 30)
				b.section("A", staffOf("T1"), cohortsOf("Y")).section("B", staffOf("T2"), cohortsOf("Y")).section("C", staffOf("T3"), cohortsOf("Y"))
				weights(b.t, map[string]int{timetable.CritCohortGaps: 1, timetable.CritCohortIsolated: 1})
				return b.t
			},
			starts: map[string][]int{"A": {0}, "B": {1}, "C": {3}},
			want:   map[string]int64{timetable.CritCohortGaps: 1, timetable.CritCohortIsolated: 1},
		},
		{
			// T1 teaches on Monday (A) and Tuesday (B): 2 days.
			name: "staff days",
			term: func() *timetable.Term {
				b := newTerm(2, 2).room("R1", 30)
				b.section("A", staffOf("T1")).section("B", staffOf("T1"))
				weights(b.t, map[string]int{timetable.CritStaffDays: 1})
				return b.t
			},
			starts: map[string][]int{"A": {0}, "B": {3}},
			want:   map[string]int64{timetable.CritStaffDays: 2},
		},
		{
			// S wants 3 days but meets on Monday only: 3 - 1 = 2, weight 5.
			name: "spread days",
			term: func() *timetable.Term {
				b := newTerm(3, 3).room("R1", 30)
				b.section("S", staffOf("T1"), meetings(3, 1), sameDay, func(s *timetable.Section) { s.MinDays = 3 })
				weights(b.t, map[string]int{timetable.CritSpreadDays: 5})
				return b.t
			},
			starts: map[string][]int{"S": {0, 1, 2}},
			want:   map[string]int64{timetable.CritSpreadDays: 10},
		},
		{
			// S on Monday and Tuesday: 3 - 2 = 1.
			name: "spread days, two days",
			term: func() *timetable.Term {
				b := newTerm(3, 3).room("R1", 30)
				b.section("S", staffOf("T1"), meetings(3, 1), sameDay, func(s *timetable.Section) { s.MinDays = 3 })
				weights(b.t, map[string]int{timetable.CritSpreadDays: 5})
				return b.t
			},
			starts: map[string][]int{"S": {0, 1, 3}},
			want:   map[string]int64{timetable.CritSpreadDays: 5},
		},
		{
			// P1 and P2 take A (periods 0-1) and B (period 1): one common
			// period each, 2; P3 takes A and C, which never meet together.
			name: "student clashes",
			term: func() *timetable.Term {
				b := newTerm(1, 3).room("R1", 30).room("R2", 30)
				b.section("A", staffOf("T1"), meetings(1, 2)).section("B", staffOf("T2")).section("C", staffOf("T3"))
				for _, e := range [][2]string{{"P1", "A"}, {"P1", "B"}, {"P2", "A"}, {"P2", "B"}, {"P3", "A"}, {"P3", "C"}} {
					b.t.Enrolments = append(b.t.Enrolments, timetable.Enrolment{Student: e[0], Section: e[1]})
				}
				weights(b.t, map[string]int{timetable.CritStudentClash: 1})
				return b.t
			},
			starts: map[string][]int{"A": {0}, "B": {1}, "C": {2}},
			want:   map[string]int64{timetable.CritStudentClash: 2},
		},
		{
			// A and B share a period but not a week: no clash.
			name: "student clashes need common weeks",
			term: func() *timetable.Term {
				b := newTerm(1, 2).room("R1", 30).room("R2", 30)
				b.section("A", staffOf("T1"), weeks(0b0101)).section("B", staffOf("T2"), weeks(0b1010))
				b.t.Enrolments = append(b.t.Enrolments, timetable.Enrolment{Student: "P1", Section: "A"}, timetable.Enrolment{Student: "P1", Section: "B"})
				weights(b.t, map[string]int{timetable.CritStudentClash: 1})
				return b.t
			},
			starts: map[string][]int{"A": {0}, "B": {0}},
			want:   map[string]int64{},
		},
		{
			// A starts in the day's first period (early: 1 × 2); B occupies
			// periods 1-2, the last (late: 1 × 3).
			name: "early and late periods",
			term: func() *timetable.Term {
				b := newTerm(1, 3).room("R1", 30).room("R2", 30)
				b.section("A", staffOf("T1")).section("B", staffOf("T2"), meetings(1, 2))
				weights(b.t, map[string]int{timetable.CritEarly: 2, timetable.CritLate: 3})
				return b.t
			},
			starts: map[string][]int{"A": {0}, "B": {1}},
			want:   map[string]int64{timetable.CritEarly: 2, timetable.CritLate: 3},
		},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got := engineCostAt(t, tc.term(), tc.kept, tc.starts)
			assert.Equal(t, tc.want, got)
		})
	}
}

// TestSoftRelationsByHand: each relation kind, soft with weight 4, broken
// and kept, on two sections of different staff in a grid of two days of
// three periods (Monday 0-2, Tuesday 3-5).
func TestSoftRelationsByHand(t *testing.T) {
	cases := []struct {
		kind   timetable.RelationKind
		a, b   int // start periods of A and B
		broken bool
	}{
		{timetable.SameTime, 0, 0, false},
		{timetable.SameTime, 0, 1, true},
		{timetable.NotSameTime, 1, 1, true},
		{timetable.NotSameTime, 1, 2, false},
		{timetable.DifferentDays, 0, 2, true},
		{timetable.DifferentDays, 0, 3, false},
		{timetable.SameDayRel, 0, 2, false},
		{timetable.SameDayRel, 0, 3, true},
		{timetable.Before, 0, 1, false},
		{timetable.Before, 1, 1, true},
		{timetable.Before, 2, 0, true},
		{timetable.BackToBack, 0, 1, false},
		{timetable.BackToBack, 0, 2, true},
		{timetable.BackToBack, 2, 3, true}, // Tuesday 09:00 does not follow Monday 11:00
	}
	for _, tc := range cases {
		t.Run(tc.kind.String(), func(t *testing.T) {
			b := newTerm(2, 3).room("R1", 30).room("R2", 30)
			b.section("A", staffOf("T1")).section("B", staffOf("T2"))
			b.t.Relations = append(b.t.Relations, timetable.Relation{Kind: tc.kind, Sections: []string{"A", "B"}, Weight: 4,
				Src: timetable.Source{Sheet: "Relations", Row: 2}})
			weights(b.t, map[string]int{timetable.CritSoftRelations: 1})
			got := engineCostAt(t, b.t, nil, map[string][]int{"A": {tc.a}, "B": {tc.b}})
			want := map[string]int64{}
			if tc.broken {
				want[timetable.CritSoftRelations] = 4
			}
			assert.Equal(t, want, got, "A at %d, B at %d", tc.a, tc.b)
		})
	}
}

// TestMovedMeetingsByHand: a kept meeting counts as moved when the section
// no longer starts at its period (the sections take no room, so rooms
// never differ), whatever order the meetings are numbered in.
func TestMovedMeetingsByHand(t *testing.T) {
	keptAt := func(periods ...int) *timetable.Schedule {
		s := &timetable.Schedule{}
		for i, p := range periods {
			s.Placements = append(s.Placements, timetable.Placement{Section: "S", Meeting: i + 1, Period: p})
		}
		return s
	}
	cases := []struct {
		name  string
		kept  *timetable.Schedule
		start []int
		want  int64
	}{
		{"unchanged", keptAt(0, 2, 4), []int{0, 2, 4}, 0},
		{"first moved", keptAt(0, 2, 4), []int{1, 2, 4}, 1},
		// Periods 1 and 3 are still used: only the meeting at 0 moved (a
		// pairing in start order would count all three).
		{"shifted", keptAt(0, 1, 3), []int{1, 3, 4}, 1},
		{"kept in another order", keptAt(4, 0, 2), []int{0, 2, 4}, 0},
		// Only two kept meetings, both still held: the third is new.
		{"fewer kept", keptAt(2, 4), []int{0, 2, 4}, 0},
		// A kept start that is no candidate any more (period 5 is
		// unavailable): that meeting must move.
		{"kept start gone", keptAt(0, 2, 5), []int{0, 2, 4}, 1},
		// Two kept meetings at one period (an edited file): the section
		// starts there once, so one of them moved.
		{"kept twice at one period", keptAt(0, 0, 2), []int{0, 2, 4}, 1},
		// Four kept meetings for three: at least one is gone.
		{"more kept", keptAt(0, 1, 2, 4), []int{0, 2, 4}, 1},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			b := newTerm(2, 3)
			b.section("S", staffOf("T1"), noRoom, meetings(3, 1), sameDay)
			b.t.Unavailable = append(b.t.Unavailable, timetable.Unavailability{Who: "S", Kind: timetable.WhoSection, Day: time.Tuesday,
				From: 11 * 60, To: 12 * 60, Hard: true, Src: timetable.Source{Sheet: "Unavailable", Row: 2}})
			weights(b.t, map[string]int{timetable.CritMoved: 1})
			got := engineCostAt(t, b.t, tc.kept, map[string][]int{"S": tc.start})
			assert.Equal(t, tc.want, got[timetable.CritMoved])
		})
	}
}
