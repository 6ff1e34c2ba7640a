package sectioning

import (
	"context"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
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
		require.Empty(t, seatingErrors(term, res), "seed %d", seed)
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
	t.Logf("%d small terms; the heuristic alone (no exhaustive phase) was optimal on %d", tried, heurSame)
}
