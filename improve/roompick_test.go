package improve

import (
	"math/rand/v2"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// pickTerm is one day of three hourly periods, rooms R20, R35, R40 and
// R100 (their capacities), section A of 30 seats with two meetings that
// may share a day (the first at period 0 in R100, the second at period 2
// in R40) and section X of 10 seats holding R40 at period 1. Only the
// criteria in weights count.
func pickTerm(weights map[string]timetable.Weight, soft bool) (*timetable.Term, *timetable.Schedule) {
	t := &timetable.Term{Name: "pick", Weights: map[string]timetable.Weight{}, SoftCapacity: soft}
	for h := range 3 {
		start := timetable.Clock(540 + 60*h)
		t.Periods = append(t.Periods, timetable.Period{Index: h, Day: time.Monday, Start: start, End: start + 60})
	}
	t.Rooms = []timetable.Room{{ID: "R20", Capacity: 20}, {ID: "R35", Capacity: 35}, {ID: "R40", Capacity: 40}, {ID: "R100", Capacity: 100}}
	t.Staff = []timetable.Staff{{ID: "S1"}, {ID: "S2"}}
	t.Cohorts = []timetable.Cohort{{ID: "C1"}, {ID: "C2"}}
	t.Sections = []timetable.Section{
		{ID: "A", Staff: []string{"S1"}, Cohorts: []string{"C1"}, Size: 30, Meetings: 2, Length: 1, Weeks: 1, SameDay: true},
		{ID: "X", Staff: []string{"S2"}, Cohorts: []string{"C2"}, Size: 10, Meetings: 1, Length: 1, Weeks: 1},
	}
	for _, c := range timetable.Criteria {
		t.Weights[c.Name] = timetable.Weight{Weight: 0, Level: 1}
	}
	for name, w := range weights {
		t.Weights[name] = w
	}
	s := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "A", Meeting: 1, Period: 0, Room: "R100"},
		{Section: "A", Meeting: 2, Period: 2, Room: "R40"},
		{Section: "X", Meeting: 1, Period: 1, Room: "R40"},
	}}
	return t, s
}

// TestPickRoomTakesTheBestFreeRoom checks that a meeting whose room is
// held at its new start takes the free room its criteria like best, level
// by level: the section's other room when stability weighs more than the
// seats, the closest fit when only seats count or when they weigh on a
// higher level, and a small room over capacity when capacity is a
// preference that costs nothing. Every seed (random offset) gives the
// same room, since the best is unique in each case.
func TestPickRoomTakesTheBestFreeRoom(t *testing.T) {
	w := func(weight, level int) timetable.Weight { return timetable.Weight{Weight: weight, Level: level} }
	cases := []struct {
		name    string
		weights map[string]timetable.Weight
		soft    bool
		want    string
	}{
		{"stability over seats", map[string]timetable.Weight{timetable.CritWastedSeats: w(1, 1), timetable.CritRoomStability: w(100, 1)}, false, "R100"},
		{"seats only", map[string]timetable.Weight{timetable.CritWastedSeats: w(1, 1)}, false, "R35"},
		{"seats on the higher level", map[string]timetable.Weight{timetable.CritWastedSeats: w(1, 2), timetable.CritRoomStability: w(100, 1)}, false, "R35"},
		{"over capacity costs more than waste", map[string]timetable.Weight{timetable.CritWastedSeats: w(1, 1), timetable.CritOverCapacity: w(10, 1)}, true, "R35"},
		{"over capacity free", map[string]timetable.Weight{timetable.CritWastedSeats: w(1, 1)}, true, "R20"},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			term, s := pickTerm(tc.weights, tc.soft)
			x, err := New(term, s, nil)
			require.NoError(t, err)
			m, old := int32(1), x.mt[1].r // A's second meeting, in R40
			for seed := range uint64(8) {
				x.remove(m)
				r, checked := x.pickRoom(m, 1, old, rand.New(rand.NewPCG(seed, 1)))
				require.True(t, checked, "a free room at period 1")
				require.GreaterOrEqual(t, r, int32(0))
				require.Equal(t, tc.want, term.Rooms[r].ID, "seed %d", seed)
				x.insert(m, 2, old)
			}
		})
	}
}

// TestPickRoomKeepsAFreeOldRoom checks that a meeting keeps its room when
// that room is free at the new start, whatever the other rooms offer.
func TestPickRoomKeepsAFreeOldRoom(t *testing.T) {
	term, s := pickTerm(map[string]timetable.Weight{timetable.CritWastedSeats: {Weight: 1, Level: 1}}, false)
	x, err := New(term, s, nil)
	require.NoError(t, err)
	m, old := int32(1), x.mt[1].r
	x.remove(m)
	r, checked := x.pickRoom(m, 2, old, rand.New(rand.NewPCG(1, 1)))
	require.True(t, checked)
	require.Equal(t, old, r)
}
