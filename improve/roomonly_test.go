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
// twin states of one term: through apply (commitRooms) and through the
// general path (commitAll), with one move in three refused by the
// annealing rule. Both must agree on legality, on the cost difference
// handed to the rule and on the timetable and running cost after it; at
// the end the running cost must equal timetable.Cost. Rooms lose their
// buildings, since travel makes a move take the general path. Each term
// runs with its relations (commitRooms decides the moves of related
// sections) and without them (peekRooms decides every move).
func TestRoomOnlyMatchesFullCommit(t *testing.T) {
	for _, tc := range []struct {
		cfg       samples.Config
		relations bool
	}{
		{samples.DemoConfig, true}, {samples.DemoConfig, false},
		{samples.Config{Sections: 40, Seed: 11}, true}, {samples.Config{Sections: 40, Seed: 11}, false},
		{samples.Config{Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4, Weeks: 2}, true},
		{samples.Config{Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4, Weeks: 2}, false},
	} {
		t.Run(fmt.Sprint(tc.cfg, tc.relations), func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(tc.cfg)
			for i := range term.Rooms {
				term.Rooms[i].Building = ""
			}
			if !tc.relations {
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
		})
	}
}
