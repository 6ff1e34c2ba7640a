package improve

import (
	"fmt"
	"math/bits"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// shiftTerm is one day of five hourly periods (a break before the fourth
// when lunch is set), one room, and cohort C with section A (one meeting,
// its time fixed at period fixedAt) and sections B1 and B2 (one meeting
// each, placed at bAt[0] and bAt[1]), every criterion weighted 1 on one
// level. A is isolated; only moving B1 and B2 together beside it takes
// that away without breaking the pair B1–B2 apart.
func shiftTerm(fixedAt int, bAt [2]int, lunch bool) (*timetable.Term, *timetable.Schedule) {
	t := &timetable.Term{Name: "shift", Weights: map[string]timetable.Weight{}}
	for h := range 5 {
		start := timetable.Clock(540 + 60*h)
		if lunch && h >= 3 {
			start += 60
		}
		t.Periods = append(t.Periods, timetable.Period{Index: h, Day: time.Monday, Start: start, End: start + 60})
	}
	t.Rooms = []timetable.Room{{ID: "R1", Capacity: 20}}
	t.Staff = []timetable.Staff{{ID: "S1"}, {ID: "S2"}}
	t.Cohorts = []timetable.Cohort{{ID: "C"}}
	per := t.Periods[fixedAt]
	t.Sections = []timetable.Section{
		{ID: "A", Staff: []string{"S1"}, Cohorts: []string{"C"}, Size: 20, Meetings: 1, Length: 1, Weeks: 1,
			Fixed: []timetable.Fixed{{Day: per.Day, Start: per.Start}}},
		{ID: "B1", Staff: []string{"S2"}, Cohorts: []string{"C"}, Size: 20, Meetings: 1, Length: 1, Weeks: 1},
		{ID: "B2", Staff: []string{"S2"}, Cohorts: []string{"C"}, Size: 20, Meetings: 1, Length: 1, Weeks: 1},
	}
	for _, c := range timetable.Criteria {
		t.Weights[c.Name] = timetable.Weight{Weight: 1, Level: 1}
	}
	s := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "A", Meeting: 1, Period: fixedAt, Room: "R1"},
		{Section: "B1", Meeting: 1, Period: bAt[0], Room: "R1"},
		{Section: "B2", Meeting: 1, Period: bAt[1], Room: "R1"},
	}}
	return t, s
}

// TestShiftFindsCompactDay checks the run half of the shift move on hand-built days whose
// only isolated period is held by a meeting that may not move: the move
// brings the cohort's run of two meetings beside it, after which
// timetable.Cost (the project's independent evaluator) counts no isolated
// period and timetable.Check finds the timetable legal; across a break
// (periods not consecutive by timetable.Term.Consecutive) adjacency would
// not count, and no shift is proposed.
func TestShiftFindsCompactDay(t *testing.T) {
	cases := []struct {
		name    string
		fixedAt int
		bAt     [2]int
		lunch   bool
		moves   bool
	}{
		{"run after", 0, [2]int{3, 4}, false, true},
		{"run before", 4, [2]int{0, 1}, false, true},
		{"run after, one free period", 1, [2]int{3, 4}, false, true},
		{"break between", 0, [2]int{3, 4}, true, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			term, s := shiftTerm(tc.fixedAt, tc.bAt, tc.lunch)
			before := timetable.Cost(term, s, nil).Criterion(timetable.CritCohortIsolated).Count
			require.Equal(t, int64(1), before, "A should start isolated (by timetable.Cost)")
			x, err := New(term, s, nil)
			require.NoError(t, err)
			rng := rand.New(rand.NewPCG(1, 1))
			res := int32(x.nStaff) // cohort C
			proposed := x.shiftRun(0, res, 0, uint(tc.fixedAt), x.busyMask[res*int32(x.nDays)], rng)
			require.Equal(t, tc.moves, proposed)
			if !tc.moves {
				return
			}
			require.Len(t, x.chs, 2, "both meetings of the run move")
			require.True(t, x.apply(x.chs, rng, nil), "the shift is legal here")
			requireSameCost(t, x, nil, 1)
			after := timetable.Cost(term, x.Schedule(), nil)
			require.Zero(t, after.Criterion(timetable.CritCohortIsolated).Count, "the cohort's day is compact after the shift")
			require.Zero(t, after.Criterion(timetable.CritCohortGaps).Count, "and has no gap")
		})
	}
}

// TestShiftWalkKeepsCostAndLegality walks with shift moves only on
// generated terms that have isolated periods (accepting every legal one),
// checking the running cost against timetable.Cost and the timetable
// against timetable.Check after each accepted move.
func TestShiftWalkKeepsCostAndLegality(t *testing.T) {
	for _, cfg := range []samples.Config{samples.DemoConfig, {Sections: 40, Seed: 11}, {Sections: 30, Seed: 7, Days: 3, PeriodsPerDay: 6, Weeks: 2}} {
		t.Run(fmt.Sprint(cfg), func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(cfg)
			x, err := New(term, wit, nil)
			require.NoError(t, err)
			rng := rand.New(rand.NewPCG(6, 1))
			accepted := 0
			for step := 1; step <= 4000; step++ {
				if k := rng.IntN(nMoves); k != mvShift && k != mvAimed {
					// Other moves keep isolated periods coming.
					if x.propose(k, rng) {
						x.apply(x.chs, rng, nil)
					}
					continue
				}
				if !x.propose(mvShift, rng) {
					continue
				}
				if x.apply(x.chs, rng, nil) {
					accepted++
					requireSameCost(t, x, nil, step)
				}
			}
			require.True(t, threeInARow(x))
			t.Logf("%d shift moves accepted", accepted)
			require.Positive(t, accepted)
		})
	}
}

// threeInARow reports whether some day of x has three consecutive periods
// by its consecutive flags (the least a shift needs).
func threeInARow(x *State) bool {
	for _, c := range x.dayCons {
		if c&(c<<1) != 0 {
			return true
		}
	}
	return false
}

// TestPullFindsCompactDay checks the pull half of the shift move on a
// hand-built week: cohort C has section A alone on Monday (its time fixed,
// so isolated) and B1, B2, B3 on Tuesday's first three periods. Each pull
// brings one of the B meetings just beside A (by timetable.Term.Consecutive),
// the timetable stays legal by timetable.Check with the running cost equal
// to timetable.Cost, and pulling B1 or B3 leaves no isolated period at all
// by timetable.Cost.
func TestPullFindsCompactDay(t *testing.T) {
	term := &timetable.Term{Name: "pull", Weights: map[string]timetable.Weight{}}
	for d, day := range []time.Weekday{time.Monday, time.Tuesday} {
		for h := range 5 {
			start := timetable.Clock(540 + 60*h)
			term.Periods = append(term.Periods, timetable.Period{Index: 5*d + h, Day: day, Start: start, End: start + 60})
		}
	}
	term.Rooms = []timetable.Room{{ID: "R1", Capacity: 20}}
	term.Staff = []timetable.Staff{{ID: "S1"}, {ID: "S2"}}
	term.Cohorts = []timetable.Cohort{{ID: "C"}}
	term.Sections = []timetable.Section{{ID: "A", Staff: []string{"S1"}, Cohorts: []string{"C"}, Size: 20, Meetings: 1, Length: 1, Weeks: 1,
		Fixed: []timetable.Fixed{{Day: time.Monday, Start: 540}}}}
	s := &timetable.Schedule{Placements: []timetable.Placement{{Section: "A", Meeting: 1, Period: 0, Room: "R1"}}}
	for i := 1; i <= 3; i++ {
		id := fmt.Sprintf("B%d", i)
		term.Sections = append(term.Sections, timetable.Section{ID: id, Staff: []string{"S2"}, Cohorts: []string{"C"}, Size: 20, Meetings: 1, Length: 1, Weeks: 1})
		s.Placements = append(s.Placements, timetable.Placement{Section: id, Meeting: 1, Period: 4 + i, Room: "R1"})
	}
	for _, c := range timetable.Criteria {
		term.Weights[c.Name] = timetable.Weight{Weight: 1, Level: 1}
	}
	require.Equal(t, int64(1), timetable.Cost(term, s, nil).Criterion(timetable.CritCohortIsolated).Count)
	rng := rand.New(rand.NewPCG(3, 3))
	pulled, compact := 0, 0
	for range 40 {
		x, err := New(term, s, nil)
		require.NoError(t, err)
		res := int32(x.nStaff)
		if !x.pullTo(0, res, 0, 0, x.busyMask[res*int32(x.nDays)], rng) {
			continue
		}
		o := x.chs[0].m
		require.True(t, x.apply(x.chs, rng, nil), "the pull is legal here")
		pulled++
		requireSameCost(t, x, nil, pulled)
		require.True(t, term.Consecutive(0, int(x.mt[o].p)), "meeting %d was pulled to period %d, not beside A", o, x.mt[o].p)
		if timetable.Cost(term, x.Schedule(), nil).Criterion(timetable.CritCohortIsolated).Count == 0 {
			compact++
		}
	}
	t.Logf("%d pulls, %d leave no isolated period", pulled, compact)
	require.Positive(t, pulled)
	require.Positive(t, compact)
}

// TestFindShortFindsSpreadCost checks the spread aim's search against the
// term's own definitions: after a random walk that leaves sections on too
// few days (timetable.Cost counts spread days), every meeting findShort
// returns belongs to a section meeting on fewer distinct days
// (timetable.Period.Day) than its MinDays, shares its day with another
// meeting of that section and may move, and the day mask returned is the
// section's days.
func TestFindShortFindsSpreadCost(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.DemoConfig)
	x, err := New(term, wit, nil)
	require.NoError(t, err)
	rng := rand.New(rand.NewPCG(4, 2))
	for step := 0; step < 3000; step++ {
		if x.propose(rng.IntN(mvAimed), rng) {
			x.apply(x.chs, rng, nil)
		}
	}
	s := x.Schedule()
	require.Positive(t, timetable.Cost(term, s, nil).Criterion(timetable.CritSpreadDays).Count, "the walk left no section on too few days")
	found := 0
	for range 200 {
		m, days := x.findShort(rng)
		if m < 0 {
			continue
		}
		found++
		pl := s.Placements[m]
		sec := term.Sections[term.SectionIndex()[pl.Section]]
		seen := map[time.Weekday]int{}
		for _, o := range s.Placements {
			if o.Section == pl.Section {
				seen[term.Periods[o.Period].Day]++
			}
		}
		require.Less(t, len(seen), sec.MinDays, "section %s is not short of days", sec.ID)
		require.GreaterOrEqual(t, seen[term.Periods[pl.Period].Day], 2, "meeting %d does not share its day", m)
		require.Len(t, seen, bits.OnesCount64(days))
		require.True(t, x.movableAt(m))
	}
	require.Positive(t, found)
}
