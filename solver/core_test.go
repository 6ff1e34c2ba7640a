package solver

import (
	"context"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
)

// engAssumptionsHold reports whether some stable model satisfies every
// assumption.
func engAssumptionsHold(models [][]Atom, assumps []Lit) bool {
	for _, m := range models {
		ok := true
		for _, l := range assumps {
			if slices.Contains(m, l.Atom()) == l.IsNeg() {
				ok = false
				break
			}
		}
		if ok {
			return true
		}
	}
	return false
}

// TestCoreRandomPrograms: under random assumptions the answer agrees with
// the definition; after Unsatisfiable the core is a subset of the
// assumptions and solving with only the core is Unsatisfiable again (the
// final-conflict analysis of Eén & Sörensson 2003).
func TestCoreRandomPrograms(t *testing.T) {
	count := 1500
	if testing.Short() {
		count = 300
	}
	r := rand.New(rand.NewPCG(5, 9))
	s0unsat := 0
	for i := 0; i < count; i++ {
		n := 2 + r.IntN(10)
		p := engRandomProgram(r, n)
		models := engAllStable(p)
		s, err := New(p, Options{Seed: int64(i)})
		require.NoError(t, err)
		for round := 0; round < 4; round++ {
			var assumps []Lit
			for k := r.IntN(n + 1); k > 0; k-- {
				a := Atom(1 + r.IntN(n))
				if r.IntN(2) == 0 {
					assumps = append(assumps, Neg(a))
				} else {
					assumps = append(assumps, Pos(a))
				}
			}
			s.Assume(assumps...)
			st := s.Solve(context.Background())
			want := engAssumptionsHold(models, assumps)
			require.Equal(t, want, st == Satisfiable, "program %d round %d assumptions %v:\n%s", i, round, assumps, engProgramText(p))
			if st == Satisfiable {
				m := s.Model(nil)
				require.NoError(t, Verify(p, m))
				require.True(t, engAssumptionsHold([][]Atom{m}, assumps))
				continue
			}
			core := s.Core(nil)
			for _, l := range core {
				require.Contains(t, assumps, l)
			}
			if len(models) == 0 {
				s0unsat++ // any subset of the assumptions is a core
			}
			require.False(t, engAssumptionsHold(models, core), "core %v of %v is satisfiable", core, assumps)
			s.Assume(core...)
			require.Equal(t, Unsatisfiable, s.Solve(context.Background()))
		}
	}
	require.Less(t, s0unsat, 4*count)
}

// TestCoreRandomSAT: cores of random 3-SAT instances under many assumptions
// are re-solved to confirm they are unsatisfiable by themselves.
func TestCoreRandomSAT(t *testing.T) {
	count := 200
	if testing.Short() {
		count = 40
	}
	cores := 0
	for i := 0; i < count; i++ {
		r := rand.New(rand.NewPCG(uint64(i), 77))
		n := 40 + r.IntN(40)
		cls := engRandom3SAT(n, 3.0, uint64(i))
		p := engSATProgram(n, cls)
		s, err := New(p, Options{Seed: int64(i)})
		require.NoError(t, err)
		var assumps []Lit
		for _, v := range r.Perm(n)[:n/2] {
			if r.IntN(2) == 0 {
				assumps = append(assumps, Neg(Atom(v+1)))
			} else {
				assumps = append(assumps, Pos(Atom(v+1)))
			}
		}
		s.Assume(assumps...)
		if s.Solve(context.Background()) != Unsatisfiable {
			continue
		}
		cores++
		core := s.Core(nil)
		require.NotEmpty(t, core)
		for _, l := range core {
			require.Contains(t, assumps, l)
		}
		// Re-solve from scratch with the core only.
		s2, err := New(p, DefaultOptions())
		require.NoError(t, err)
		s2.Assume(core...)
		require.Equal(t, Unsatisfiable, s2.Solve(context.Background()), "instance %d core %v", i, core)
		// Without assumptions the formula (ratio 3.0) is satisfiable.
		require.Equal(t, Satisfiable, s.Solve(context.Background()))
	}
	require.Greater(t, cores, count/4)
}

func TestCoreContradictoryAssumptions(t *testing.T) {
	p := NewProgram()
	a := p.NewAtom("a")
	b := p.NewAtom("b")
	p.AddChoice([]Atom{a, b}, NoBound, NoBound)
	s, err := New(p, DefaultOptions())
	require.NoError(t, err)
	s.Assume(Pos(b), Pos(a), Neg(a))
	require.Equal(t, Unsatisfiable, s.Solve(context.Background()))
	require.ElementsMatch(t, []Lit{Pos(a), Neg(a)}, s.Core(nil))
	// Assumptions are for one call only.
	require.Equal(t, Satisfiable, s.Solve(context.Background()))
	require.Empty(t, s.Core(nil))
}
