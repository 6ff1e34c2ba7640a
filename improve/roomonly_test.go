package improve

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
)

// TestRoomOnlyMatchesFullCommit applies every room-only move two ways, on
// twin states of one term: through apply (peekRooms or commitRooms) and
// through the general path (commitAll), with one move in three refused by
// the annealing rule. Both must agree on legality, on the cost difference
// handed to the rule and on the timetable and running cost after it; at
// the end the running cost must equal timetable.Cost. Each term runs with
// and without its relations (commitRooms decides the moves of related
// sections, peekRooms the others) and with and without its rooms'
// buildings (travel then reads the rooms of the people's days).
func TestRoomOnlyMatchesFullCommit(t *testing.T) {
	cfgs := []samples.Config{samples.DemoConfig, {Sections: 40, Seed: 11}, {Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4, Weeks: 2}}
	for _, cfg := range cfgs {
		for _, relations := range []bool{true, false} {
			for _, buildings := range []bool{true, false} {
				t.Run(fmt.Sprint(cfg, relations, buildings), func(t *testing.T) {
					roomOnlyMatches(t, cfg, relations, buildings)
				})
			}
		}
	}
}

// roomOnlyMatches is one case of TestRoomOnlyMatchesFullCommit.
func roomOnlyMatches(t *testing.T, cfg samples.Config, relations, buildings bool) {
	term, wit := samples.GenerateWithWitness(cfg)
	if !buildings {
		for i := range term.Rooms {
			term.Rooms[i].Building = ""
		}
	}
	if !relations {
		term.Relations = nil
	}
	a, err := New(term, wit, nil)
	require.NoError(t, err)
	b, err := New(term, wit, nil)
	require.NoError(t, err)
	rng := rand.New(rand.NewPCG(8, 9))
	kinds := []int{mvRoom, mvSectionRoom, mvAimed}
	fast, kept := 0, 0
	for step := 1; step <= 6000; step++ {
		if !a.propose(kinds[rng.IntN(len(kinds))], rng) || !a.roomOnly(a.chs) {
			continue
		}
		fast++
		chs := slices.Clone(a.chs)
		var da, db *tally
		keep := step%3 != 0
		okA := a.apply(chs, rng, func(d *tally) bool { c := *d; da = &c; return keep })
		b.nextStamp()
		okB := !b.blocked(chs) && b.commitAll(chs, rng, func(d *tally) bool { c := *d; db = &c; return keep })
		require.Equal(t, okB, okA, "step %d: %v", step, chs)
		require.Equal(t, db, da, "step %d: cost difference", step)
		require.Equal(t, b.cur, a.cur, "step %d: running cost", step)
		require.Equal(t, b.Schedule(), a.Schedule(), "step %d: timetable", step)
		if okA {
			kept++
		}
	}
	require.Positive(t, fast, "no room-only move was drawn")
	require.Positive(t, kept, "no room-only move was kept")
	requireSameCost(t, a, nil, 0)
}
