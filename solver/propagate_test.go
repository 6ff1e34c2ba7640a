package solver

import (
	"testing"

	"github.com/stretchr/testify/require"
)

// engDecide opens a decision level, assigns p and propagates; it returns
// whether a conflict occurred.
func engDecide(s *Solver, p Lit) bool {
	s.newDecisionLevel()
	s.assign(p, 0)
	return s.propagate()
}

func engNew(t testing.TB, p *Program) *Solver {
	t.Helper()
	s, err := New(p, DefaultOptions())
	require.NoError(t, err)
	require.False(t, s.propagate(), "no conflict at level 0")
	return s
}

func TestPropagateClauses(t *testing.T) {
	// x1 -> x2 -> x3 (binary), x3 ∧ x4 -> x5 (ternary), as SAT program.
	p := engSATProgram(5, [][]int{{-1, 2}, {-2, 3}, {-3, -4, 5}})
	s := engNew(t, p)
	require.False(t, engDecide(s, Pos(4)))
	require.Equal(t, int8(0), s.value(Pos(5)))
	require.False(t, engDecide(s, Pos(1)))
	for _, a := range []Atom{1, 2, 3, 4, 5} {
		require.Equal(t, int8(1), s.value(Pos(a)), "atom %d", a)
	}
	require.Equal(t, int32(1), s.level[4])
	require.Equal(t, int32(2), s.level[5])
	// Reasons: x5 from the ternary clause, listing x3 and x4 false.
	r := s.reasonLits(5)
	require.Equal(t, Pos(5), r[0])
	require.ElementsMatch(t, []Lit{Neg(3), Neg(4)}, r[1:])
	s.clearExplanations()
	s.cancelUntil(1)
	require.Equal(t, int8(0), s.value(Pos(5)))
	require.Equal(t, int8(1), s.value(Pos(4)))
	// A conflict: x1 forces x5 but assume not x5 first.
	s.cancelUntil(0)
	require.False(t, engDecide(s, Neg(5)))
	require.False(t, engDecide(s, Pos(4)))
	require.Equal(t, int8(-1), s.value(Pos(3)), "x3 ∧ x4 -> x5 propagates backwards")
	require.Equal(t, int8(-1), s.value(Pos(1)))
	require.False(t, engDecide(s, Neg(2)))
}

func TestPropagateConflict(t *testing.T) {
	p := engSATProgram(3, [][]int{{-1, 2}, {-1, 3}, {-2, -3}})
	s := engNew(t, p)
	require.True(t, engDecide(s, Pos(1)))
	require.Len(t, s.conflict, 2)
	for _, q := range s.conflict {
		require.Equal(t, int8(-1), s.value(q))
	}
	bt, lbd := s.analyze()
	require.Equal(t, 0, bt)
	require.Equal(t, 1, lbd)
	require.Equal(t, []Lit{Neg(1)}, s.analyzeLearnt, "first UIP is the decision")
}

// TestPropagateAllocs: propagation allocates nothing once the watch lists
// and trail have their size (STYLE: hot loops allocate nothing).
func TestPropagateAllocs(t *testing.T) {
	cases := map[string]*Program{
		"clauses": engSATProgram(200, engRandom3SAT(200, 3.0, 4)),
		"cards":   engQueens(12),
	}
	hp, _ := engHamiltonian(7, engCompleteArcs(7))
	cases["unfounded"] = hp
	for name, p := range cases {
		t.Run(name, func(t *testing.T) {
			s := engNew(t, p)
			var decisions []Lit
			for v := 1; v <= s.numAtoms && len(decisions) < 6; v += 3 {
				decisions = append(decisions, Neg(Atom(v)))
			}
			run := func() {
				for _, d := range decisions {
					if s.value(d) != 0 {
						continue
					}
					if engDecide(s, d) {
						break
					}
				}
				s.cancelUntil(0)
			}
			run()
			require.Zero(t, testing.AllocsPerRun(100, run))
		})
	}
}

func BenchmarkPropagate(b *testing.B) {
	p := engSATProgram(250, engRandom3SAT(250, 4.26, 1))
	s := engNew(b, p)
	run := func() {
		for v := 1; v <= 40; v++ {
			if s.value(Pos(Atom(v))) != 0 {
				continue
			}
			if engDecide(s, Neg(Atom(v))) {
				break
			}
		}
		s.cancelUntil(0)
	}
	run() // watch lists reach their size
	b.ReportAllocs()
	for b.Loop() {
		run()
	}
}
