package solver

import (
	"context"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestUnfoundedLoop: a :- b. b :- a. a :- c. {c}. — without c, {a, b} is an
// unfounded set (Van Gelder, Ross & Schlipf 1991) and both must be false,
// although the completion alone would allow them true.
func TestUnfoundedLoop(t *testing.T) {
	p := NewProgram()
	a, b, c := p.NewAtom("a"), p.NewAtom("b"), p.NewAtom("c")
	p.AddRule(a, Pos(b))
	p.AddRule(b, Pos(a))
	p.AddRule(a, Pos(c))
	p.AddChoice([]Atom{c}, NoBound, NoBound)
	s := engNew(t, p)
	require.NotNil(t, s.ufs)
	require.NotZero(t, s.ufs.comp[a])
	require.Equal(t, s.ufs.comp[a], s.ufs.comp[b])
	require.Zero(t, s.ufs.comp[c])
	require.False(t, engDecide(s, Neg(c)))
	require.Equal(t, int8(-1), s.value(Pos(a)))
	require.Equal(t, int8(-1), s.value(Pos(b)))
	require.Positive(t, s.Stats().LoopFormulas)
	// The reason of not a is the loop formula not a ∨ c (the external body).
	r := s.reasonLits(uint32(a))
	require.Equal(t, []Lit{Neg(a), Pos(c)}, r)
	s.clearExplanations()
	s.cancelUntil(0)
	require.False(t, engDecide(s, Pos(c)))
	require.Equal(t, int8(1), s.value(Pos(a)))
	require.Equal(t, int8(1), s.value(Pos(b)))
}

// TestUnfoundedTrueAtomConflict: deciding a true first, then losing the
// external support, is a conflict learned from the loop formula.
func TestUnfoundedTrueAtomConflict(t *testing.T) {
	p := NewProgram()
	a, b, c, d := p.NewAtom("a"), p.NewAtom("b"), p.NewAtom("c"), p.NewAtom("d")
	p.AddRule(a, Pos(b))
	p.AddRule(b, Pos(a))
	p.AddRule(a, Pos(c), Pos(d))
	p.AddChoice([]Atom{c, d}, NoBound, NoBound)
	s := engNew(t, p)
	require.False(t, engDecide(s, Pos(a)))
	require.True(t, engDecide(s, Neg(d)), "{a, b} lost its only external body while a is true")
	require.Contains(t, s.conflict, Neg(a), "the loop formula of {a, b}")
	require.Equal(t, int32(1), s.level[a])
	require.True(t, s.handleConflict())
	require.False(t, s.propagate())
	require.Equal(t, int8(1), s.value(Pos(d)), "learned: a needs d")
	s.cancelUntil(0)
	require.False(t, engDecide(s, Neg(d)))
	require.Equal(t, int8(-1), s.value(Pos(a)))
	s.cancelUntil(0)
	require.Equal(t, Satisfiable, s.Solve(context.Background()))
}

// TestUnfoundedSourcesSurviveBacktracking: sources stay valid through many
// decisions and backjumps; every model of a loop-heavy program verifies.
func TestUnfoundedSourcesSurviveBacktracking(t *testing.T) {
	// A ring of n atoms each supporting the next, plus choice external
	// supports e_i for some; constraint: at least half of the ring true.
	n := 12
	p := NewProgram()
	ring := make([]Atom, n)
	for i := range ring {
		ring[i] = p.NewAtom("")
	}
	for i := 0; i < n; i += 4 {
		e := p.NewAtom("")
		p.AddChoice([]Atom{e}, NoBound, NoBound)
		p.AddRule(ring[i], Pos(e))
	}
	for i := range ring {
		p.AddChoice([]Atom{ring[(i+1)%n]}, NoBound, NoBound, Pos(ring[i]))
	}
	lits := make([]Lit, n)
	for i, a := range ring {
		lits[i] = Pos(a)
	}
	p.AddBound(lits, n/2, NoBound)
	want := engAllStable(p)
	got := engModels(t, p, DefaultOptions())
	require.Equal(t, want, got)
	require.NotEmpty(t, got)
}

// TestUnfoundedLoopyPrograms: on random programs made mostly of positive
// loops the engine's stable models equal those of the definition (Gelfond
// & Lifschitz 1988).
func TestUnfoundedLoopyPrograms(t *testing.T) {
	count, maxN := 400, 15
	if testing.Short() {
		count, maxN = 100, 10
	}
	r := rand.New(rand.NewPCG(21, 22))
	loops := int64(0)
	for i := 0; i < count; i++ {
		n := 3 + r.IntN(maxN-2)
		p := engLoopyProgram(r, n)
		want := engAllStable(p)
		opts := Options{Seed: int64(i)}
		if i%2 == 1 {
			opts.Restarts, opts.LubyUnit, opts.ReduceFirst = RestartLuby, 2, 5
		}
		got := engModels(t, p, opts)
		require.True(t, slices.EqualFunc(want, got, slices.Equal), "program %d:\n%s\nwant %v\ngot %v", i, engProgramText(p), want, got)
		s, err := New(p, opts)
		require.NoError(t, err)
		s.Enumerate(context.Background(), 0, nil, func([]Atom) bool { return true })
		loops += s.Stats().LoopFormulas
	}
	require.Positive(t, loops)
}

// TestUnfoundedPlantedHamiltonian: on larger graphs with a planted cycle the
// model verifies and its chosen arcs form one cycle through every vertex.
func TestUnfoundedPlantedHamiltonian(t *testing.T) {
	for _, n := range []int{30, 80, 150} {
		arcs := engPlantedArcs(n, 4, uint64(n))
		p, in := engHamiltonian(n, arcs)
		s, err := New(p, DefaultOptions())
		require.NoError(t, err)
		require.Equal(t, Satisfiable, s.Solve(context.Background()))
		require.NoError(t, Verify(p, s.Model(nil)))
		next := make([]int, n)
		for i := range next {
			next[i] = -1
		}
		for i, a := range arcs {
			if s.Value(in[i]) {
				require.Equal(t, -1, next[a[0]], "one arc leaves each vertex")
				next[a[0]] = a[1]
			}
		}
		v, steps := 0, 0
		for {
			v = next[v]
			steps++
			if v == 0 {
				break
			}
			require.Less(t, steps, n)
		}
		require.Equal(t, n, steps, "a single cycle through all %d vertices", n)
	}
}
