package solver_test

import (
	"context"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/internal/testprog"
	"github.com/termwright/termwright/solver"
)

// TestCloneDiverges: a clone answers like its original; adding to the
// clone (a clause, a bound, a sum, new atoms) leaves the original's
// answers unchanged, and adding to the original leaves the clone's. The
// counts are n-queens numbers (OEIS A000170: 6 queens have 4 solutions,
// 8 queens 92) minus the solutions each addition removes, counted by New
// on the program with the same addition.
func TestCloneDiverges(t *testing.T) {
	ctx := context.Background()
	for _, tc := range []struct {
		name string
		n    int
		add  func(s *solver.Solver, p *solver.Program, at [][]solver.Atom) error // to both s and p
	}{
		{"clause", 6, func(s *solver.Solver, p *solver.Program, at [][]solver.Atom) error {
			p.AddConstraint(solver.Pos(at[0][1]))
			return s.AddClause(solver.Neg(at[0][1]))
		}},
		{"bound", 8, func(s *solver.Solver, p *solver.Program, at [][]solver.Atom) error {
			lits := []solver.Lit{solver.Pos(at[0][0]), solver.Pos(at[0][1]), solver.Pos(at[0][2])}
			p.AddBound(lits, 1, solver.NoBound)
			return s.AddBound(lits, 1, solver.NoBound)
		}},
		{"conditional bound", 8, func(s *solver.Solver, p *solver.Program, at [][]solver.Atom) error {
			lits := posLits(at[1][:6])
			p.AddBound(lits, solver.NoBound, 0, solver.Pos(at[0][0]), solver.Neg(at[7][7]))
			return s.AddBound(lits, solver.NoBound, 0, solver.Pos(at[0][0]), solver.Neg(at[7][7]))
		}},
		{"sum", 8, func(s *solver.Solver, p *solver.Program, at [][]solver.Atom) error {
			// 2·q(0,0) + 2·q(0,1) + q(1,3) <= 2 forbids exactly q(0,0) ∧ q(1,3) and q(0,1) ∧ q(1,3).
			p.AddConstraint(solver.Pos(at[0][0]), solver.Pos(at[1][3]))
			p.AddConstraint(solver.Pos(at[0][1]), solver.Pos(at[1][3]))
			return s.AddWeightSum([]solver.Lit{solver.Pos(at[0][0]), solver.Pos(at[0][1]), solver.Pos(at[1][3])}, []int64{2, 2, 1}, 2)
		}},
		{"activation atom", 6, func(s *solver.Solver, p *solver.Program, at [][]solver.Atom) error {
			act := s.AddAtoms(1)
			if err := s.AddClause(solver.Neg(act), solver.Pos(at[0][1])); err != nil {
				return err
			}
			p.AddConstraint(solver.Neg(at[0][1])) // act is assumed below
			s.Assume(solver.Pos(act))
			return nil
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p, at := freeCells(tc.n, tc.n)
			orig, err := solver.New(p, solver.DefaultOptions())
			require.NoError(t, err)
			full := *p
			for _, b := range queensLines(at) {
				require.NoError(t, orig.AddBound(b.lits, b.lower, b.upper))
				full.AddBound(b.lits, b.lower, b.upper)
			}
			require.Equal(t, solver.Satisfiable, orig.Solve(ctx))
			base := len(modelsOfNew(t, &full, nil))
			require.Equal(t, map[int]int{6: 4, 8: 92}[tc.n], base, "OEIS A000170")

			clone := orig.Clone()
			require.Equal(t, base, len(liveModels(t, clone, &full, nil)), "a clone answers like its original")
			changed := full
			changed.Rules, changed.Bounds = slices.Clone(full.Rules), slices.Clone(full.Bounds)
			require.NoError(t, tc.add(clone, &changed, at))
			want := modelsOfNew(t, &changed, nil)
			require.Less(t, len(want), base, "the addition removes solutions")
			assertSameModels(t, "clone after the addition", want, liveModels(t, clone, &changed, nil))
			require.Equal(t, base, len(liveModels(t, orig, &full, nil)), "the original is unchanged")

			// The other way round: a fresh clone, then the addition to the original.
			clone = orig.Clone()
			require.NoError(t, tc.add(orig, &solver.Program{}, at))
			assertSameModels(t, "original after the addition", want, liveModels(t, orig, &changed, nil))
			require.Equal(t, base, len(liveModels(t, clone, &full, nil)), "the clone is unchanged")
		})
	}
}

// TestCloneConcurrent: a solver and its clones search at the same time
// from different goroutines (run with -race to check that they share no
// mutable state) and each finds the 92 solutions of 8 queens (OEIS
// A000170), each passing Verify.
func TestCloneConcurrent(t *testing.T) {
	p := testprog.Queens(8)
	s, err := solver.New(p, solver.DefaultOptions())
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, s.Solve(context.Background()))
	solvers := []*solver.Solver{s, s.Clone(), s.Clone(), s.Clone()}
	counts := make(chan int, len(solvers))
	for _, x := range solvers {
		go func() {
			n, _ := x.Enumerate(context.Background(), 0, nil, func(m []solver.Atom) bool {
				return solver.Verify(p, m) == nil
			})
			counts <- n
		}()
	}
	for range solvers {
		require.Equal(t, 92, <-counts)
	}
}

// TestCloneStats: a clone's counters start at zero and count its own work
// only.
func TestCloneStats(t *testing.T) {
	s, err := solver.New(testprog.Queens(8), solver.DefaultOptions())
	require.NoError(t, err)
	modelsOf(t, s)
	before := s.Stats()
	require.Positive(t, before.Decisions)
	c := s.Clone()
	require.Equal(t, solver.Stats{}, c.Stats())
	modelsOf(t, c)
	require.Positive(t, c.Stats().Decisions)
	require.Equal(t, before, s.Stats(), "the original did no work")
}

// TestCloneSearchesAlike: a clone made in the middle of a search (after
// a search stopped by its conflict budget) repeats its original's next
// search exactly (same status, model and work), since it copies
// activities, phases, learned clauses and the random state; models pass
// Verify.
func TestCloneSearchesAlike(t *testing.T) {
	for _, seed := range []uint64{0, 1, 3} { // instances that need over 100 conflicts
		p := testprog.SATProgram(150, testprog.Random3SAT(seed, 150, 620))
		opts := solver.DefaultOptions()
		opts.Seed, opts.RandomFreq, opts.ConflictLimit = int64(seed)+1, 0.02, 100
		s, err := solver.New(p, opts)
		require.NoError(t, err)
		require.Equal(t, solver.Unknown, s.Solve(context.Background()), "seed %d: the budget stops the first search", seed)
		c := s.Clone()
		s.SetConflictLimit(0)
		c.SetConflictLimit(0)
		before := s.Stats()
		st := s.Solve(context.Background())
		require.Equal(t, st, c.Solve(context.Background()), "seed %d", seed)
		require.Equal(t, s.Model(nil), c.Model(nil), "seed %d", seed)
		require.Equal(t, s.Stats().Since(before), c.Stats(), "seed %d", seed)
		require.Positive(t, c.Stats().Conflicts, "seed %d: the compared search does work", seed)
		if st == solver.Satisfiable {
			require.NoError(t, solver.Verify(p, c.Model(nil)))
		}
	}
}
