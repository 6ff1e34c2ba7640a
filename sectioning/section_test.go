package sectioning

import (
	"context"
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestSectionKeepsTheSeatingRule runs the sectioner on random terms of
// every shape the generator makes and checks each result against the
// seating rule as timetable.Course's doc comment states it
// (seatingErrors, written from that comment).
func TestSectionKeepsTheSeatingRule(t *testing.T) {
	cases := []struct {
		name string
		g    genSpec
	}{
		{"one part", genSpec{students: 60, courses: 6, maxArrs: 1, maxParts: 1, maxSections: 3, perStudent: [2]int{1, 3}, slack: 1.1}},
		{"parts and parents", genSpec{students: 80, courses: 8, maxArrs: 2, maxParts: 4, maxSections: 4, perStudent: [2]int{2, 4}, slack: 1.1, parents: true}},
		{"tight limits", genSpec{students: 80, courses: 5, maxArrs: 2, maxParts: 3, maxSections: 3, perStudent: [2]int{2, 4}, slack: 0.8, parents: true, alternatives: true, priorities: true}},
		{"fixed enrolments", genSpec{students: 50, courses: 6, maxArrs: 2, maxParts: 3, maxSections: 3, perStudent: [2]int{1, 3}, slack: 1.0, parents: true, fixed: 40}},
		{"patterns and travel", genSpec{students: 60, courses: 6, maxArrs: 1, maxParts: 3, maxSections: 3, perStudent: [2]int{2, 4}, slack: 1.2, patterns: true, parents: true}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			for seed := uint64(1); seed <= 5; seed++ {
				term, sched := genTerm(rand.New(rand.NewPCG(seed, 7)), tc.g)
				res, err := Section(context.Background(), term, sched, Options{Seed: int64(seed)})
				require.NoError(t, err)
				require.Empty(t, allSeatingErrors(term, sched, res), "seed %d", seed)
			}
		})
	}
}
