package testprog

import (
	"bytes"
	"fmt"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/solver"
)

// named returns the atoms with the given names.
func named(t *testing.T, p *solver.Program, names ...string) []solver.Atom {
	t.Helper()
	index := map[string]solver.Atom{}
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		index[p.Name(a)] = a
	}
	out := make([]solver.Atom, len(names))
	for i, n := range names {
		a, ok := index[n]
		require.True(t, ok, "no atom %s", n)
		out[i] = a
	}
	return out
}

func TestQueensKnownSolution(t *testing.T) {
	p := Queens(8)
	assert.Equal(t, 64, p.NumAtoms())
	// A solution of the eight queens puzzle (from memory; checked by Verify).
	cols := []int{1, 5, 8, 6, 3, 7, 2, 4}
	var names []string
	for r, c := range cols {
		names = append(names, fmt.Sprintf("q(%d,%d)", r+1, c))
	}
	assert.NoError(t, solver.Verify(p, named(t, p, names...)))
	// Queens in rows 1 and 2 at columns 1 and 2 share a diagonal.
	names[0], names[1] = "q(1,1)", "q(2,2)"
	assert.Error(t, solver.Verify(p, named(t, p, names...)))
}

func TestLatinSquareCyclic(t *testing.T) {
	for _, tc := range []struct {
		n       int
		reduced bool
	}{{4, false}, {5, true}} {
		t.Run(fmt.Sprint(tc.n, tc.reduced), func(t *testing.T) {
			p := LatinSquare(tc.n, tc.reduced)
			var names []string
			for r := 0; r < tc.n; r++ {
				for c := 0; c < tc.n; c++ {
					names = append(names, fmt.Sprintf("x(%d,%d,%d)", r+1, c+1, (r+c)%tc.n+1))
				}
			}
			model := named(t, p, names...)
			assert.NoError(t, solver.Verify(p, model))
			// Exchanging the symbols of two cells in one row breaks both columns.
			model[0], model[1] = named(t, p, "x(1,1,2)")[0], named(t, p, "x(1,2,1)")[0]
			assert.Error(t, solver.Verify(p, model))
		})
	}
}

func TestHamiltonianNeedsOneCycle(t *testing.T) {
	p, cyc := Hamiltonian(4, CompleteArcs(4))
	assert.Len(t, cyc, 12)
	reach := []string{"reach(1)", "reach(2)", "reach(3)", "reach(4)"}
	one := named(t, p, append([]string{"cyc(1,2)", "cyc(2,3)", "cyc(3,4)", "cyc(4,1)"}, reach...)...)
	assert.NoError(t, solver.Verify(p, one))
	// Two 2-cycles satisfy the completion when reach(3) and reach(4) support
	// each other, but that support is a positive loop: not stable.
	two := named(t, p, append([]string{"cyc(1,2)", "cyc(2,1)", "cyc(3,4)", "cyc(4,3)"}, reach...)...)
	err := solver.Verify(p, two)
	require.Error(t, err)
	assert.Contains(t, err.Error(), "atom reach(3) is true but has no support")
}

func TestCubeArcs(t *testing.T) {
	arcs := CubeArcs(3)
	assert.Len(t, arcs, 24) // 12 edges of the cube, both directions
	seen := map[Arc]bool{}
	for _, a := range arcs {
		assert.False(t, seen[a])
		seen[a] = true
		assert.NotEqual(t, a.From, a.To)
	}
	for _, a := range arcs {
		assert.True(t, seen[Arc{a.To, a.From}], "reverse of %v", a)
	}
}

func TestPigeonholeHasNoModelBySize(t *testing.T) {
	for _, pairwise := range []bool{false, true} {
		p := Pigeonhole(3, 2, pairwise)
		assert.Equal(t, 6, p.NumAtoms())
		// Every pigeon in one hole: two pigeons share a hole.
		model := named(t, p, "in(1,1)", "in(2,2)", "in(3,1)")
		assert.Error(t, solver.Verify(p, model))
	}
}

func TestSATProgram(t *testing.T) {
	clauses := [][]int{{1, -2, 3}, {-1, 2, 3}, {-3, -1, -2}}
	p := SATProgram(3, clauses)
	// x3 true, x1 x2 false satisfies every clause.
	assert.NoError(t, solver.Verify(p, named(t, p, "x(3)")))
	// x1 x2 x3 true falsifies the third clause.
	assert.Error(t, solver.Verify(p, named(t, p, "x(1)", "x(2)", "x(3)")))
}

func TestRandom3SAT(t *testing.T) {
	a, b := Random3SAT(7, 50, 213), Random3SAT(7, 50, 213)
	assert.Equal(t, a, b, "same seed, same formula")
	assert.NotEqual(t, a, Random3SAT(8, 50, 213))
	for _, c := range a {
		require.Len(t, c, 3)
		for i, v := range c {
			assert.True(t, v != 0 && v >= -50 && v <= 50)
			for _, u := range c[:i] {
				assert.NotEqual(t, u*u, v*v, "distinct variables")
			}
		}
	}
}

func TestGeneratorsPrintAndReadBack(t *testing.T) {
	ham, _ := Hamiltonian(5, CompleteArcs(5))
	programs := map[string]*solver.Program{
		"queens":  Queens(5),
		"pigeons": Pigeonhole(4, 3, true),
		"ham":     ham,
		"latin":   LatinSquare(3, true),
		"sat":     SATProgram(20, Random3SAT(1, 20, 85)),
		"random":  RandomProgram(3, 10),
	}
	for name, p := range programs {
		t.Run(name, func(t *testing.T) {
			var first, second bytes.Buffer
			require.NoError(t, solver.WriteProgram(&first, p))
			q, err := solver.ReadProgram(bytes.NewReader(first.Bytes()), name)
			require.NoError(t, err)
			require.NoError(t, solver.WriteProgram(&second, q))
			assert.Equal(t, first.String(), second.String())
		})
	}
}

func TestRandomProgramDeterministic(t *testing.T) {
	for seed := uint64(0); seed < 50; seed++ {
		var a, b bytes.Buffer
		require.NoError(t, solver.WriteProgram(&a, RandomProgram(seed, 8)))
		require.NoError(t, solver.WriteProgram(&b, RandomProgram(seed, 8)))
		require.Equal(t, a.String(), b.String())
		assert.Equal(t, 8, RandomProgram(seed, 8).NumAtoms())
	}
}
