package solver

import (
	"context"
	"testing"

	gsat "github.com/crillab/gophersat/solver"
	"github.com/stretchr/testify/require"
)

// gophersatSolve decides a CNF with github.com/crillab/gophersat, a
// general-purpose SAT library used here only as an outside reference.
func gophersatSolve(n int, clauses [][]int) bool {
	pb := gsat.ParseSliceNb(clauses, n)
	return gsat.New(pb).Solve() == gsat.Sat
}

// TestRandom3SATAgainstGophersat: random 3-SAT at clause/variable ratio 4.26
// (near the satisfiability threshold, Mitchell, Selman & Levesque 1992),
// n = 50..150, written as programs. Satisfiable/unsatisfiable must agree
// with gophersat and every model must satisfy every clause (and pass
// Verify).
func TestRandom3SATAgainstGophersat(t *testing.T) {
	instances := 240
	if testing.Short() {
		instances = 60
	}
	sat, unsat := 0, 0
	for i := 0; i < instances; i++ {
		n := 50 + (i*37)%101 // 50..150
		cls := engRandom3SAT(n, 4.26, uint64(1000+i))
		p := engSATProgram(n, cls)
		s, err := New(p, Options{Seed: int64(i)})
		require.NoError(t, err)
		got := s.Solve(context.Background())
		want := gophersatSolve(n, cls)
		require.Equal(t, want, got == Satisfiable, "instance %d (n=%d)", i, n)
		if got != Satisfiable {
			unsat++
			continue
		}
		sat++
		model := s.Model(nil)
		require.NoError(t, Verify(p, model))
		for ci, c := range cls {
			ok := false
			for _, x := range c {
				if (x > 0) == s.Value(Atom(max(x, -x))) {
					ok = true
				}
			}
			require.True(t, ok, "instance %d: clause %d %v false in the model", i, ci, c)
		}
	}
	t.Logf("%d satisfiable, %d unsatisfiable", sat, unsat)
	require.NotZero(t, sat)
	require.NotZero(t, unsat)
}
