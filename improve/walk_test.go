package improve

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// requireSameCost compares the running cost with timetable.Cost recomputed
// from scratch (the project's independent evaluator), criterion by
// criterion and level by level, and the schedule with timetable.Check.
func requireSameCost(t *testing.T, x *State, kept *timetable.Schedule, step int) {
	t.Helper()
	s := x.Schedule()
	hv := timetable.HardViolations(timetable.Check(x.t, s))
	require.Empty(t, hv, "step %d: the timetable breaks a hard requirement", step)
	want := timetable.Cost(x.t, s, kept)
	got := x.Cost()
	for i, c := range want.Criteria {
		require.Equal(t, c.Count, got.Criteria[i].Count, "step %d: %s units", step, c.Name)
		require.Equal(t, c.Cost, got.Criteria[i].Cost, "step %d: %s cost", step, c.Name)
	}
	require.Equal(t, want.ByLevel, got.ByLevel, "step %d: cost by level", step)
}

// TestWalkKeepsCostAndLegality applies random moves, accepting every legal
// one, and after each accepted move compares the running cost with
// timetable.Cost and the timetable with timetable.Check.
func TestWalkKeepsCostAndLegality(t *testing.T) {
	cases := []struct {
		name string
		cfg  samples.Config
		keep bool
	}{
		{"demo", samples.DemoConfig, false},
		{"demo kept", samples.DemoConfig, true},
		{"small 1", samples.Config{Sections: 12, Seed: 1}, false},
		{"small 2", samples.Config{Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4}, true},
		{"small 3", samples.Config{Sections: 40, Seed: 11}, false},
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
			require.True(t, x.useMasks)
			requireSameCost(t, x, kept, 0)
			rng := rand.New(rand.NewPCG(1, 2))
			accepted := [nMoves]int{}
			for step := 1; step <= 3000; step++ {
				k := rng.IntN(nMoves)
				if !x.propose(k, rng) {
					continue
				}
				if x.apply(x.chs, rng, nil) {
					accepted[k]++
					requireSameCost(t, x, kept, step)
				}
			}
			t.Logf("accepted per kind %v", accepted)
			for k, n := range accepted {
				// A shift needs a day with three consecutive periods
				// (a run of one beside a free period beside the
				// isolated one); small 2's days have a break mid-day.
				if (k != mvSectionRoom || len(x.roomy) > 0) && (k != mvShift || threeInARow(x)) {
					require.Positive(t, n, "no %s move was ever accepted", moveNames[k])
				}
			}
		})
	}
}

// TestWalkScanning repeats the walk on the path for days of more than 64
// periods (or more than 64 days), where person-days are scanned instead
// of read from busy masks; the generator keeps days short, so the state
// is switched to that path after New (the masks are then left alone).
func TestWalkScanning(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.Config{Sections: 30, Seed: 4, Days: 3, PeriodsPerDay: 6})
	x, err := New(term, wit, wit)
	require.NoError(t, err)
	x.useMasks = false
	rng := rand.New(rand.NewPCG(4, 4))
	n := 0
	for step := 1; step <= 1500; step++ {
		if x.propose(rng.IntN(nMoves), rng) && x.apply(x.chs, rng, nil) {
			n++
			requireSameCost(t, x, wit, step)
		}
	}
	require.Positive(t, n)
}

// TestWalkManySmallTerms repeats the walk on generated terms of many
// shapes (grids, week counts, sizes), 600 moves each.
func TestWalkManySmallTerms(t *testing.T) {
	for seed := uint64(1); seed <= 12; seed++ {
		cfg := samples.Config{Sections: 6 + int(seed*3), Seed: seed, Days: 3 + int(seed%3), PeriodsPerDay: 4 + int(seed%5), Weeks: 1 + int(seed%4)}
		t.Run(fmt.Sprint(cfg), func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(cfg)
			x, err := New(term, wit, nil)
			require.NoError(t, err)
			rng := rand.New(rand.NewPCG(seed, 3))
			n := 0
			for step := 1; step <= 600; step++ {
				if x.propose(rng.IntN(nMoves), rng) && x.apply(x.chs, rng, nil) {
					n++
					requireSameCost(t, x, nil, step)
				}
			}
			require.Positive(t, n)
		})
	}
}

// TestSameTimeGroupsMove checks that sections tied by a hard same-time
// relation do move (together) and that the relation still holds by
// timetable.Check after each such move.
func TestSameTimeGroupsMove(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.DemoConfig)
	x, err := New(term, wit, nil)
	require.NoError(t, err)
	rng := rand.New(rand.NewPCG(8, 8))
	grouped := 0
	for step := 1; step <= 20000 && grouped < 5; step++ {
		if !x.propose(mvRelocate, rng) || len(x.secs[x.mt[x.chs[0].m].sec].sameAs) == 0 || x.chs[0].p == x.mt[x.chs[0].m].p {
			continue // not a change of time of a grouped section
		}
		if x.apply(x.chs, rng, nil) {
			grouped++
			requireSameCost(t, x, nil, step)
		}
	}
	require.Positive(t, grouped, "no section of a same-time group ever moved")
}

// TestBlockedIsSound checks the cheap refusal against the full check: no
// move that blocked refuses is legal when applied without it (apply's
// lifting, insertion and rule checks; brute force over random moves of
// every kind), and blocked does refuse some moves.
func TestBlockedIsSound(t *testing.T) {
	for _, cfg := range []samples.Config{samples.DemoConfig, {Sections: 40, Seed: 11}, {Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4, Weeks: 2}} {
		t.Run(fmt.Sprint(cfg), func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(cfg)
			x, err := New(term, wit, nil)
			require.NoError(t, err)
			rng := rand.New(rand.NewPCG(5, 6))
			refused, legal := 0, 0
			for step := 1; step <= 4000; step++ {
				if !x.propose(rng.IntN(nMoves), rng) {
					continue
				}
				x.nextStamp()
				b := x.blocked(x.chs)
				ok := false
				x.nextStamp()
				x.commit(x.chs, rng, func(*tally) bool { ok = true; return step%3 == 0 })
				if b {
					refused++
					require.False(t, ok, "step %d: blocked refused a legal move %v", step, x.chs)
				} else if ok {
					legal++
				}
			}
			require.Positive(t, refused)
			require.Positive(t, legal)
			requireSameCost(t, x, nil, 0)
		})
	}
}

// TestAimedMovesKeepCostAndLegality walks with aimed moves only (accepting
// every legal one, so cost of every aim appears), checking the running cost
// against timetable.Cost and the timetable against timetable.Check after
// each accepted move; aimed moves that change times and aimed moves that
// change rooms are both accepted.
func TestAimedMovesKeepCostAndLegality(t *testing.T) {
	for _, cfg := range []samples.Config{samples.DemoConfig, {Sections: 40, Seed: 11}, {Sections: 25, Seed: 7, Days: 3, PeriodsPerDay: 4, Weeks: 2}} {
		t.Run(fmt.Sprint(cfg), func(t *testing.T) {
			term, wit := samples.GenerateWithWitness(cfg)
			x, err := New(term, wit, nil)
			require.NoError(t, err)
			rng := rand.New(rand.NewPCG(3, 9))
			accepted, timeMoves, roomMoves := 0, 0, 0
			for step := 1; step <= 3000; step++ {
				if !x.propose(mvAimed, rng) {
					continue
				}
				m := x.chs[0].m
				oldP, oldR := x.mt[m].p, x.mt[m].r
				if !x.apply(x.chs, rng, nil) {
					continue
				}
				accepted++
				if x.mt[m].p != oldP {
					timeMoves++
				}
				if x.mt[m].r != oldR {
					roomMoves++
				}
				requireSameCost(t, x, nil, step)
			}
			t.Logf("%d aimed moves accepted, %d changed the time, %d the room", accepted, timeMoves, roomMoves)
			require.Positive(t, timeMoves)
			require.Positive(t, roomMoves)
		})
	}
}

// TestAimedMovesFindCost checks the compactness aim against the term's own
// definitions (timetable.Term.Span and Consecutive, independent of the
// busy masks of this package): after a random walk that leaves isolated
// periods on the demo, the meeting the aim moves has a cohort with no
// other meeting on consecutive periods beside it, and its target start has
// a cohort of its section with a meeting just before or after it.
func TestAimedMovesFindCost(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.DemoConfig)
	x, err := New(term, wit, nil)
	require.NoError(t, err)
	rng := rand.New(rand.NewPCG(2, 2))
	for step := 0; step < 2000; step++ {
		if x.propose(rng.IntN(mvAimed), rng) {
			x.apply(x.chs, rng, nil)
		}
	}
	require.Positive(t, timetable.Cost(term, x.Schedule(), nil).Criterion(timetable.CritCohortIsolated).Count, "the walk left no isolated period to aim at")
	secIdx := term.SectionIndex()
	// touches reports whether a meeting of cohort c other than m sits on a
	// period consecutive with the span of m's section started at p.
	touches := func(s *timetable.Schedule, m int, p int, c string) bool {
		span, ok := term.Span(p, max(term.Sections[secIdx[s.Placements[m].Section]].Length, 1))
		require.True(t, ok)
		for o, pl := range s.Placements {
			sec := &term.Sections[secIdx[pl.Section]]
			if o == m || !slices.Contains(sec.Cohorts, c) {
				continue
			}
			other, _ := term.Span(pl.Period, max(sec.Length, 1))
			for _, q := range other {
				if term.Consecutive(q, span[0]) || term.Consecutive(span[len(span)-1], q) {
					return true
				}
			}
		}
		return false
	}
	checked := 0
	for range 300 {
		if !x.aimIsolated(rng) {
			continue
		}
		m := int(x.chs[0].m)
		s := x.Schedule()
		cohorts := term.Sections[secIdx[s.Placements[m].Section]].Cohorts
		require.True(t, slices.ContainsFunc(cohorts, func(c string) bool { return !touches(s, m, s.Placements[m].Period, c) }),
			"the aimed meeting %d is not isolated for any of its cohorts", m)
		require.True(t, slices.ContainsFunc(cohorts, func(c string) bool { return touches(s, m, int(x.chs[0].p), c) }),
			"the aimed start %d of meeting %d is beside no meeting of its cohorts", x.chs[0].p, m)
		checked++
	}
	require.Positive(t, checked)
}
