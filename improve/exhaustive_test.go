package improve

import (
	"context"
	"fmt"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// tinyTerm makes a random term small enough to enumerate: two days of
// three periods, two rooms in two buildings, two staff, two cohorts,
// three sections with four meetings in all, a few students, one soft and
// one hard unavailability, and one soft relation. Every criterion that
// can apply has weight 1 on level 1, student clashes on level 2.
func tinyTerm(rng *rand.Rand) *timetable.Term {
	t := &timetable.Term{Name: "tiny", SoftCapacity: rng.IntN(2) == 0, Weights: map[string]timetable.Weight{}}
	for d, day := range []time.Weekday{time.Monday, time.Tuesday} {
		for h := range 3 {
			start := timetable.Clock(540 + 60*h)
			t.Periods = append(t.Periods, timetable.Period{Index: 3*d + h, Day: day, Start: start, End: start + 60})
		}
	}
	t.Rooms = []timetable.Room{
		{ID: "A1", Capacity: 10 + rng.IntN(30), Building: "North"},
		{ID: "B1", Capacity: 10 + rng.IntN(30), Building: "South"},
	}
	t.Staff = []timetable.Staff{{ID: "S1", MaxPerDay: 2}, {ID: "S2"}}
	t.Cohorts = []timetable.Cohort{{ID: "C1"}, {ID: "C2"}}
	meetings := []int{2, 1, 1}
	rng.Shuffle(3, func(i, j int) { meetings[i], meetings[j] = meetings[j], meetings[i] })
	for i := range 3 {
		sec := timetable.Section{
			ID: fmt.Sprintf("X%d", i+1), Staff: []string{t.Staff[rng.IntN(2)].ID},
			Cohorts: []string{t.Cohorts[rng.IntN(2)].ID}, Size: 5 + rng.IntN(30),
			Meetings: meetings[i], Length: 1, Weeks: 1,
		}
		if sec.Meetings == 2 && rng.IntN(2) == 0 {
			sec.SameDay, sec.MinDays = true, 2
		}
		if !t.SoftCapacity {
			sec.Size = 5
		}
		t.Sections = append(t.Sections, sec)
	}
	for s := range 4 {
		for _, sec := range t.Sections {
			if rng.IntN(2) == 0 {
				t.Enrolments = append(t.Enrolments, timetable.Enrolment{Student: fmt.Sprintf("P%d", s), Section: sec.ID})
			}
		}
	}
	t.Unavailable = []timetable.Unavailability{
		{Who: "S2", Kind: timetable.WhoStaff, Day: time.Monday, From: 540, To: 600, Hard: true},
		{Who: "C1", Kind: timetable.WhoCohort, Day: time.Tuesday, From: 600, To: 720, Weight: 2},
	}
	t.Relations = []timetable.Relation{{Kind: timetable.DifferentDays, Sections: []string{"X1", "X2"}, Weight: 3}}
	for _, c := range timetable.Criteria {
		t.Weights[c.Name] = timetable.Weight{Weight: 1, Level: 1}
	}
	t.Weights[timetable.CritStudentClash] = timetable.Weight{Weight: 1, Level: 2}
	return t
}

// enumerate returns the lexicographically best legal timetable cost of t
// by trying every start and room for every meeting, judged only by
// timetable.Check and timetable.Cost, and one legal timetable.
func enumerate(t *timetable.Term) (map[int]int64, *timetable.Schedule) {
	var pls []timetable.Placement
	for _, sec := range t.Sections {
		for m := 1; m <= sec.Meetings; m++ {
			pls = append(pls, timetable.Placement{Section: sec.ID, Meeting: m})
		}
	}
	var best map[int]int64
	var first *timetable.Schedule
	var rec func(i int)
	rec = func(i int) {
		if i == len(pls) {
			s := &timetable.Schedule{Placements: append([]timetable.Placement(nil), pls...)}
			if len(timetable.HardViolations(timetable.Check(t, s))) > 0 {
				return
			}
			c := timetable.Cost(t, s, nil).ByLevel
			if first == nil {
				first = s
			}
			if best == nil || lexLess(c, best) {
				best = c
			}
			return
		}
		for p := range t.Periods {
			for _, r := range t.Rooms {
				pls[i].Period, pls[i].Room = p, r.ID
				rec(i + 1)
			}
		}
	}
	rec(0)
	return best, first
}

// TestRunReachesExhaustiveOptimum compares the annealer's best with the
// optimum found by enumerating every timetable of random tiny terms, with
// one worker and with two.
func TestRunReachesExhaustiveOptimum(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 5))
	tried := 0
	for n := 0; tried < 6 && n < 40; n++ {
		term := tinyTerm(rng)
		opt, start := enumerate(term)
		if start == nil {
			continue // no legal timetable for this draw
		}
		tried++
		for _, workers := range []int{1, 2} {
			t.Run(fmt.Sprintf("term %d workers %d", n, workers), func(t *testing.T) {
				// With two workers the leader also applies every move the
				// helper keeps, which MaxMoves does not bound: checking each
				// of those took a minute a term, so one in 97 is checked.
				accepted := 0
				check := func(x *State) {
					if accepted++; workers == 1 || accepted%97 == 0 {
						requireSameCost(t, x, nil, accepted)
					}
				}
				res, err := Run(context.Background(), term, start, nil, Options{Seed: uint64(n + 1), MaxMoves: 20000, StepsPerTemp: 300, Workers: workers,
					onAccept: check})
				require.NoError(t, err)
				t.Logf("start %v optimum %v found %v", timetable.Cost(term, start, nil).ByLevel, opt, res.Cost.ByLevel)
				require.Equal(t, opt, res.Cost.ByLevel)
				require.Zero(t, res.Stats.Resyncs)
			})
		}
	}
	require.Equal(t, 6, tried, "too few tiny terms had a legal timetable")
}
