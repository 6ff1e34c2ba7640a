package solver

import (
	"context"
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// engModels enumerates every stable model of p with the engine, checking
// each with Verify, and returns them sorted like engAllStable.
func engModels(t testing.TB, p *Program, opts Options) [][]Atom {
	t.Helper()
	s, err := New(p, opts)
	require.NoError(t, err)
	var got [][]Atom
	_, complete := s.Enumerate(context.Background(), 0, nil, func(m []Atom) bool {
		if err := Verify(p, m); err != nil {
			t.Fatalf("engine model %v fails Verify: %v", m, err)
		}
		got = append(got, m)
		return true
	})
	require.True(t, complete)
	engSortModels(got)
	return got
}

func engSortModels(ms [][]Atom) {
	key := func(m []Atom) uint64 {
		var k uint64
		for _, a := range m {
			k |= 1 << (a - 1)
		}
		return k
	}
	slices.SortFunc(ms, func(a, b []Atom) int {
		ka, kb := key(a), key(b)
		switch {
		case ka < kb:
			return -1
		case ka > kb:
			return 1
		}
		return 0
	})
}

func engProgramText(p *Program) string {
	var b strings.Builder
	_ = WriteProgram(&b, p)
	return b.String()
}

// TestEnumerateMatchesDefinition compares the engine's set of stable models
// with the definition (Gelfond & Lifschitz 1988) applied to every candidate
// set, on random programs of up to 12 atoms with negation, positive loops,
// choices, constraints and bounds.
func TestEnumerateMatchesDefinition(t *testing.T) {
	count := 3000
	if testing.Short() {
		count = 400
	}
	r := rand.New(rand.NewPCG(1, 2))
	for i := 0; i < count; i++ {
		n := 1 + r.IntN(12)
		p := engRandomProgram(r, n)
		want := engAllStable(p)
		opts := DefaultOptions()
		opts.Seed = int64(i)
		if i%2 == 1 {
			opts.Restarts = RestartLuby
			opts.LubyUnit = 1
		}
		got := engModels(t, p, opts)
		if !slices.EqualFunc(want, got, slices.Equal) {
			t.Fatalf("program %d:\n%s\nwant models %v\ngot %v", i, engProgramText(p), want, got)
		}
	}
}

func TestEnumerateLimitAndStop(t *testing.T) {
	p := engQueens(6) // 4 solutions (OEIS A000170)
	s, err := New(p, DefaultOptions())
	require.NoError(t, err)
	n, complete := s.Enumerate(context.Background(), 2, nil, func([]Atom) bool { return true })
	require.Equal(t, 2, n)
	require.False(t, complete)
	n, complete = s.Enumerate(context.Background(), 0, nil, func([]Atom) bool { return n < 2 })
	require.Equal(t, 1, n)
	require.False(t, complete)
	// The solver is unchanged by enumeration: all 4 are found again.
	n, complete = s.Enumerate(context.Background(), 0, nil, func([]Atom) bool { return true })
	require.Equal(t, 4, n)
	require.True(t, complete)
	require.Equal(t, Satisfiable, s.Solve(context.Background()))
}

// TestEnumerateProjection: projected models are distinct on the projection
// and are exactly the projections of all models.
func TestEnumerateProjection(t *testing.T) {
	r := rand.New(rand.NewPCG(7, 7))
	for i := 0; i < 300; i++ {
		n := 1 + r.IntN(10)
		p := engRandomProgram(r, n)
		var proj []Atom
		for a := 1; a <= n; a++ {
			if r.IntN(2) == 0 {
				proj = append(proj, Atom(a))
			}
		}
		want := map[string]bool{}
		for _, m := range engAllStable(p) {
			var pm []Atom
			for _, a := range m {
				if slices.Contains(proj, a) {
					pm = append(pm, a)
				}
			}
			want[fmt.Sprint(pm)] = true
		}
		s, err := New(p, DefaultOptions())
		require.NoError(t, err)
		got := map[string]bool{}
		if proj == nil {
			proj = []Atom{}
		}
		_, complete := s.Enumerate(context.Background(), 0, proj, func(m []Atom) bool {
			k := fmt.Sprint(m)
			if len(m) == 0 {
				k = fmt.Sprint([]Atom(nil))
			}
			require.False(t, got[k], "duplicate projection %v", m)
			got[k] = true
			return true
		})
		require.True(t, complete)
		require.Equal(t, want, got, "program %d:\n%s projection %v", i, engProgramText(p), proj)
	}
}

// TestEnumerateQueens: 92 solutions for n = 8 and 724 for n = 10 (OEIS
// A000170), all verified and distinct.
func TestEnumerateQueens(t *testing.T) {
	for _, tc := range []struct{ n, want int }{{4, 2}, {6, 4}, {8, 92}, {10, 724}} {
		t.Run(fmt.Sprint(tc.n), func(t *testing.T) {
			if tc.n == 10 && testing.Short() {
				t.Skip("short")
			}
			p := engQueens(tc.n)
			s, err := New(p, DefaultOptions())
			require.NoError(t, err)
			seen := map[string]bool{}
			n, complete := s.Enumerate(context.Background(), 0, nil, func(m []Atom) bool {
				require.NoError(t, Verify(p, m))
				k := fmt.Sprint(m)
				require.False(t, seen[k])
				seen[k] = true
				return true
			})
			require.True(t, complete)
			require.Equal(t, tc.want, n)
		})
	}
}

// TestEnumerateHamiltonian counts Hamiltonian cycles with a non-tight
// encoding: the complete directed graph on n vertices has (n-1)! directed
// Hamiltonian cycles (a cycle is a cyclic order of the other n-1 vertices
// after vertex 0); the 3-cube graph has 6 undirected ones (OEIS A066037),
// 12 directed.
func TestEnumerateHamiltonian(t *testing.T) {
	cases := []struct {
		name string
		n    int
		arcs [][2]int
		want int
	}{
		{"K4", 4, engCompleteArcs(4), 6},
		{"K5", 5, engCompleteArcs(5), 24},
		{"K6", 6, engCompleteArcs(6), 120},
		{"cube", 8, engCubeArcs(), 12},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			p, arcs := engHamiltonian(tc.n, tc.arcs)
			s, err := New(p, DefaultOptions())
			require.NoError(t, err)
			require.NotNil(t, s.ufs, "the encoding is not tight")
			seen := map[string]bool{}
			n, complete := s.Enumerate(context.Background(), 0, arcs, func(m []Atom) bool {
				k := fmt.Sprint(m)
				require.False(t, seen[k])
				seen[k] = true
				require.Len(t, m, tc.n)
				return true
			})
			require.True(t, complete)
			require.Equal(t, tc.want, n)
			// Full models verify too.
			s.Enumerate(context.Background(), 0, nil, func(m []Atom) bool {
				require.NoError(t, Verify(p, m))
				return true
			})
		})
	}
}

// FuzzEngineMatchesDefinition: for any generator seed, the engine's stable
// models equal those of the definition (Gelfond & Lifschitz 1988), and
// optimisation finds the least cost.
func FuzzEngineMatchesDefinition(f *testing.F) {
	for i := uint64(0); i < 8; i++ {
		f.Add(i, uint8(i*3), int64(i))
	}
	f.Fuzz(func(t *testing.T, seed uint64, size uint8, solverSeed int64) {
		r := rand.New(rand.NewPCG(seed, uint64(size)))
		n := 1 + int(size)%12
		p := engWeakProgram(r, n)
		want := engAllStable(p)
		opts := Options{Seed: solverSeed}
		if solverSeed%2 != 0 {
			opts.Restarts, opts.LubyUnit, opts.ReduceFirst = RestartLuby, 1, 1
		}
		got := engModels(t, p, opts)
		if !slices.EqualFunc(want, got, slices.Equal) {
			t.Fatalf("program:\n%s\nwant models %v\ngot %v", engProgramText(p), want, got)
		}
		s, err := New(p, opts)
		require.NoError(t, err)
		st, cost, err := s.Optimize(context.Background(), nil)
		require.NoError(t, err)
		if len(want) == 0 {
			require.Equal(t, Unsatisfiable, st)
			return
		}
		require.Equal(t, Satisfiable, st)
		require.Equal(t, engOptimum(p, want, nil), cost)
	})
}
