package sectioning

import (
	"context"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// smallSpec is a term small enough for bruteForce.
func smallSpec(rng *rand.Rand) genSpec {
	return genSpec{
		students: 2 + rng.IntN(3), courses: 2 + rng.IntN(2), maxArrs: 2, maxParts: 2, maxSections: 2,
		perStudent: [2]int{1, 2}, slack: 0.5 + rng.Float64()*0.7, parents: rng.IntN(2) == 0,
		alternatives: true, priorities: rng.IntN(2) == 0, fixed: rng.IntN(3), dayHours: 2, meetings: 2,
		patterns: rng.IntN(3) == 0,
	}
}

// TestSectionMatchesExhaustiveSearch compares the sectioner with an
// exhaustive search over every seating (bruteForce) on small random
// terms: the same objective (fewest unplaced, then priorities, then
// alternatives, then clashes), both judged from their enrolments by the
// criteria's definitions (judge). Outside check: exhaustive search.
func TestSectionMatchesExhaustiveSearch(t *testing.T) {
	tried, heurSame := 0, 0
	for seed := uint64(1); tried < 150 && seed < 2000; seed++ {
		rng := rand.New(rand.NewPCG(seed, 11))
		term, sched := genTerm(rng, smallSpec(rng))
		if bruteLeaves(term) > exactLeaves {
			continue
		}
		tried++
		want := bruteForce(term, sched, nil)
		res, err := Section(context.Background(), term, sched, Options{Seed: int64(seed)})
		require.NoError(t, err)
		require.Empty(t, allSeatingErrors(term, sched, res), "seed %d", seed)
		require.Equal(t, want.String(), judge(term, sched, nil, res).String(), "seed %d", seed)
		heur, err := section(context.Background(), term, sched, Options{Seed: int64(seed)}, config{})
		require.NoError(t, err)
		got := judge(term, sched, nil, heur)
		require.False(t, got.less(want), "seed %d: the heuristic beats exhaustive search: %v < %v", seed, got, want)
		if got.String() == want.String() {
			heurSame++
		}
	}
	require.GreaterOrEqual(t, tried, 100)
	require.Positive(t, heurSame)
	t.Logf("%d small terms; the heuristic alone (no exhaustive phase) was optimal on %d", tried, heurSame)
}

// TestSectionWithKeepMatchesExhaustiveSearch is the same comparison after
// a change: the first sectioning is kept, every section's limit drops by
// one (not below its fixed students) and some meetings move; the objective now counts moved students
// (criterion "moved students", above clashes by default).
func TestSectionWithKeepMatchesExhaustiveSearch(t *testing.T) {
	tried, moved := 0, 0
	for seed := uint64(1); tried < 80 && seed < 2000; seed++ {
		rng := rand.New(rand.NewPCG(seed, 13))
		term, sched := genTerm(rng, smallSpec(rng))
		if bruteLeaves(term) > exactLeaves {
			continue
		}
		first, err := Section(context.Background(), term, sched, Options{Seed: 1})
		require.NoError(t, err)
		if len(first.Enrolments) == 0 {
			continue
		}
		tried++
		kept := &timetable.Schedule{Placements: sched.Placements, Enrolments: first.Enrolments}
		later := *term
		later.Sections = append([]timetable.Section(nil), term.Sections...)
		fixed := map[string]int{} // a limit stays at or above its fixed students (term data)
		for _, e := range term.Enrolments {
			fixed[e.Section]++
		}
		for i := range later.Sections {
			s := &later.Sections[i]
			s.Limit = max(1, s.Limit-1, fixed[s.ID])
		}
		changed := &timetable.Schedule{Placements: append([]timetable.Placement(nil), sched.Placements...)}
		for i := range changed.Placements {
			if changed.Placements[i].Period >= 0 && rng.IntN(3) == 0 {
				changed.Placements[i].Period = rng.IntN(len(term.Periods))
			}
		}
		want := bruteForce(&later, changed, kept)
		res, err := Section(context.Background(), &later, changed, Options{Seed: int64(seed), Keep: kept})
		require.NoError(t, err)
		require.Empty(t, allSeatingErrors(&later, changed, res), "seed %d", seed)
		require.Equal(t, want.String(), judge(&later, changed, kept, res).String(), "seed %d", seed)
		moved += want.moved
	}
	require.GreaterOrEqual(t, tried, 50)
	require.Positive(t, moved, "some changes should force moves")
}
