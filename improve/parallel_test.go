package improve

import (
	"context"
	"runtime"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// TestWorkersKeepOneTimetable runs two and three workers on generated
// terms and checks, after every move the leader keeps (its own or one a
// helper sent), that the leader's running cost equals timetable.Cost
// recomputed from scratch and that its timetable passes timetable.Check;
// then, once the helpers have applied what was left in their inboxes,
// that every replica holds the leader's timetable at the leader's cost:
// the workers went through the same timetables in the same order.
func TestWorkersKeepOneTimetable(t *testing.T) {
	cases := []struct {
		name    string
		cfg     samples.Config
		keep    bool
		workers int
		moves   int64 // enough that a helper's move reaches the leader on a loaded machine
	}{
		{"demo", samples.DemoConfig, false, 2, 10_000},
		// Few moves are kept on a kept timetable (about one in 600), so a
		// short run may end before any helper's move is kept.
		{"demo kept", samples.DemoConfig, true, 2, 60_000},
		{"small", samples.Config{Sections: 40, Seed: 11}, false, 2, 10_000},
		{"small three", samples.Config{Sections: 40, Seed: 3}, false, 3, 10_000},
		{"tight", samples.Config{Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4}, true, 2, 10_000},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(tc.cfg)
			var kept *timetable.Schedule
			if tc.keep {
				kept = wit
			}
			x, err := New(term, wit, kept)
			require.NoError(t, err)
			checks := 0
			a := newAnnealer(x, Options{Seed: 3, MaxMoves: tc.moves, StepsPerTemp: 500, Workers: tc.workers,
				onAccept: func(x *State) {
					runtime.Gosched() // let the helpers run, even on one core or a loaded machine
					if checks++; checks%50 == 0 {
						requireSameCost(t, x, kept, checks)
					}
				}})
			tm, err := newTeam(a, term, wit, kept, tc.workers)
			require.NoError(t, err)
			a.run(context.Background())
			require.Equal(t, tc.workers, a.st.Workers)
			if runtime.GOMAXPROCS(0) > 1 { // on one core a short run may end before a helper's turn
				require.Positive(t, a.st.Shared, "no helper's move reached the leader")
			}
			require.Zero(t, a.st.Resyncs, "a replica could not apply a move another kept")
			var acc int
			a.catchUp(&acc)
			requireSameCost(t, a.x, kept, -1)
			want := a.x.Schedule().Placements
			for _, h := range tm.helpers {
				h.catchUp(&acc)
				require.Zero(t, h.st.Resyncs)
				require.Equal(t, want, h.x.Schedule().Placements, "helper %d holds another timetable", h.id)
				require.Equal(t, a.x.cur, h.x.cur, "helper %d has another running cost", h.id)
			}
			t.Logf("tried %d, shared %d, stale %d, checks %d", a.st.Tried, a.st.Shared, a.st.Stale, checks)
		})
	}
}
