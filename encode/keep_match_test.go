package encode

import (
	"context"
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestMovesOneOfTwoMeetings is the case of issue 12 (item 3): a section
// meets Monday and Wednesday at 09:00; its Monday meeting moves to
// Thursday 09:00. Paired in start order (Wed 09↔Mon 09, Thu 09↔Wed 09)
// both meetings would look moved; only the Monday one did.
func TestMovesOneOfTwoMeetings(t *testing.T) {
	b := newTerm(4, 2).room("R1", 30)
	b.section("A", staffOf("T1"), meetings(2, 1))
	term := b.t
	weights(term, map[string]int{timetable.CritMoved: 1})
	mon09, wed09, thu09 := 0, 4, 6
	require.Equal(t, time.Wednesday, term.Periods[wed09].Day)
	kept := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "A", Meeting: 1, Period: mon09, Room: "R1"}, {Section: "A", Meeting: 2, Period: wed09, Room: "R1"},
	}}
	now := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "A", Meeting: 1, Period: wed09, Room: "R1"}, {Section: "A", Meeting: 2, Period: thu09, Room: "R1"},
	}}
	moves := Moves(term, kept, now)
	require.Len(t, moves, 1, "%+v", moves)
	assert.Equal(t, ChangeMoved, moves[0].Change)
	assert.Equal(t, mon09, moves[0].From.Period)
	assert.Equal(t, thu09, moves[0].To.Period)
	assert.Equal(t, int64(1), timetable.Cost(term, now, kept).Criterion(timetable.CritMoved).Count)
	// The engine's half agrees (the room never changes here).
	assert.Equal(t, int64(1), engineCostAt(t, term, kept, map[string][]int{"A": {wed09, thu09}})[timetable.CritMoved])
}

// movePairing is a pairing of kept meetings with new ones: pair[i] is the
// new meeting of kept meeting i, or -1.
type movePairing []int

// allPairings calls f with every pairing of na kept with nb new meetings
// that pairs min(na, nb) of them (every injection of the smaller side).
func allPairings(na, nb int, f func(movePairing)) {
	pair := make(movePairing, na)
	used := make([]bool, nb)
	var rec func(i, left int)
	rec = func(i, left int) {
		if i == na {
			if left == 0 {
				f(pair)
			}
			return
		}
		if na-i > left { // kept meeting i may stay unpaired
			pair[i] = -1
			rec(i+1, left)
		}
		for j := 0; j < nb; j++ {
			if !used[j] && left > 0 {
				used[j], pair[i] = true, j
				rec(i+1, left-1)
				used[j] = false
			}
		}
	}
	rec(0, min(na, nb))
}

// TestMovesMatchesMinimumPairing cross-checks Moves on small random
// sections against every pairing of kept with new meetings (brute force
// over all permutations): the moved and dropped meetings Moves reports are
// the fewest kept meetings any pairing leaves at another place or unpaired,
// and among such pairings Moves' pairs have the least total moveCost.
func TestMovesMatchesMinimumPairing(t *testing.T) {
	b := newTerm(2, 2).room("R1", 30).room("R2", 30)
	b.section("A", staffOf("T1"), meetings(2, 1))
	term := b.t
	rooms := []string{"R1", "R2"}
	rng := rand.New(rand.NewPCG(12, 3))
	random := func(n int) []timetable.Placement {
		ps := make([]timetable.Placement, n)
		for i := range ps {
			ps[i] = timetable.Placement{Section: "A", Meeting: i + 1, Period: rng.IntN(len(term.Periods)), Room: rooms[rng.IntN(2)]}
		}
		return ps
	}
	for c := 0; c < 400; c++ {
		old, cur := random(rng.IntN(5)), random(rng.IntN(5))
		if c%2 == 0 && len(old) > 0 && len(cur) > 0 { // make some meetings stay
			cur[0].Period, cur[0].Room = old[0].Period, old[0].Room
		}
		name := fmt.Sprintf("case %d: kept %v new %v", c, old, cur)
		bestN, bestCost := int64(1)<<40, int64(1)<<40
		allPairings(len(old), len(cur), func(pair movePairing) {
			var n, cost int64
			for i, j := range pair {
				if j < 0 {
					n++
				} else if old[i].Period != cur[j].Period || old[i].Room != cur[j].Room {
					n++
					cost += moveCost(term, old[i], cur[j])
				}
			}
			if n < bestN || (n == bestN && cost < bestCost) {
				bestN, bestCost = n, cost
			}
		})
		moves := Moves(term, &timetable.Schedule{Placements: old}, &timetable.Schedule{Placements: cur})
		var n, cost int64
		news, moved := 0, 0
		for _, mv := range moves {
			switch mv.Change {
			case ChangeMoved:
				n++
				moved++
				cost += moveCost(term, *mv.From, *mv.To)
			case ChangeDropped:
				n++
			case ChangeNew:
				news++
			}
		}
		require.Equal(t, bestN, n, name)
		require.Equal(t, bestCost, cost, name)
		require.Equal(t, len(cur)-(len(old)-int(n))-moved, news, "%s: every meeting is unchanged or in one move", name)
		sched := &timetable.Schedule{Placements: cur}
		require.Equal(t, n, timetable.Cost(term, sched, &timetable.Schedule{Placements: old}).Criterion(timetable.CritMoved).Count,
			"%s: timetable.Cost counts what Moves reports", name)
	}
}

// TestMovedCountsAgree: on random kept timetables (some with two meetings
// at one period, some longer or shorter than the section) and random
// starts of a three-meeting section that takes no room, the engine's
// weak constraints, timetable.Cost and Moves count the same moved
// meetings.
func TestMovedCountsAgree(t *testing.T) {
	rng := rand.New(rand.NewPCG(31, 4))
	for c := 0; c < 40; c++ {
		b := newTerm(2, 3)
		b.section("S", staffOf("T1"), noRoom, meetings(3, 1), sameDay)
		weights(b.t, map[string]int{timetable.CritMoved: 1})
		kept := &timetable.Schedule{}
		for i := 0; i < 1+rng.IntN(4); i++ {
			kept.Placements = append(kept.Placements, timetable.Placement{Section: "S", Meeting: i + 1, Period: rng.IntN(6)})
		}
		starts := rng.Perm(6)[:3]
		now := &timetable.Schedule{}
		for i, p := range starts {
			now.Placements = append(now.Placements, timetable.Placement{Section: "S", Meeting: i + 1, Period: p})
		}
		engine := engineCostAt(t, b.t, kept, map[string][]int{"S": starts})[timetable.CritMoved]
		cost := timetable.Cost(b.t, now, kept).Criterion(timetable.CritMoved).Count
		var report int64
		for _, mv := range Moves(b.t, kept, now) {
			if mv.Change != ChangeNew {
				report++
			}
		}
		require.Equal(t, cost, engine, "kept %v, starts %v", kept.Placements, starts)
		require.Equal(t, cost, report, "kept %v, starts %v", kept.Placements, starts)
	}
}

// randomKept makes a kept timetable for t that no solve produced: every
// section's meetings at random periods and rooms of the term (some in no
// room, some repeated, one meeting more or fewer now and then), so that
// kept meetings clash, leave the candidates, or pair in no start order.
func randomKept(rng *rand.Rand, t *timetable.Term) *timetable.Schedule {
	s := &timetable.Schedule{}
	for _, sec := range t.Sections {
		n := sec.Meetings + rng.IntN(3) - 1
		for k := 0; k < n; k++ {
			room := ""
			if !sec.NoRoom && len(t.Rooms) > 0 && rng.IntN(5) > 0 {
				room = t.Rooms[rng.IntN(len(t.Rooms))].ID
			}
			s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: k + 1, Period: rng.IntN(len(t.Periods)), Room: room})
		}
	}
	return s
}

// TestKeepBoundAgainstBruteForce: with a kept timetable of random places
// and "moved meetings" on the highest level, the optimiser's bound never
// exceeds the least cost over every timetable of the term (brute force,
// timetable.Cost with the matching definition), its timetable never
// beats that least cost, and a proven result equals it.
func TestKeepBoundAgainstBruteForce(t *testing.T) {
	n := 24
	if testing.Short() {
		n = 8
	}
	rng := newRand(bruteSoftSeed + 7)
	proven := 0
	for i := 0; i < n; i++ {
		term := randomSoftTerm(rng, i%2 == 0)
		term.Weights[timetable.CritMoved] = timetable.Weight{Weight: 1 + rng.IntN(2), Level: 3}
		kept := randomKept(rng, term)
		want, feasible := bruteOptimum(term, kept)
		res, err := Optimize(context.Background(), term, OptimizeOptions{Seed: 1, Keep: kept, MaxSteps: 30})
		require.NoError(t, err, "instance %d\n%s", i, describeTerm(term))
		if !feasible {
			require.Equal(t, solver.Unsatisfiable, res.Status, "instance %d", i)
			continue
		}
		checkOptimized(t, term, kept, res)
		require.LessOrEqual(t, slices.Compare(res.Bound, want), 0, "instance %d: bound %v above the optimum %v, kept %v\n%s", i, res.Bound, want, kept.Placements, describeTerm(term))
		require.GreaterOrEqual(t, slices.Compare(res.Total, want), 0, "instance %d: cost %v below the optimum %v", i, res.Total, want)
		if res.Proven {
			proven++
			require.Equal(t, want, res.Total, "instance %d: proven but not optimal", i)
		}
	}
	t.Logf("%d of %d proven optimal", proven, n)
}
