package solver_test

import (
	"context"
	"fmt"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/internal/testprog"
	"github.com/termwright/termwright/solver"
)

// countModels enumerates every stable model of p (projected onto project
// when it is not nil), checks that each full model passes Verify and that
// no projection repeats, and returns how many there are.
func countModels(t *testing.T, p *solver.Program, project []solver.Atom) int {
	t.Helper()
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	seen := map[string]bool{}
	var full []solver.Atom
	n, complete := s.Enumerate(ctx, 0, project, func(m []solver.Atom) bool {
		k := fmt.Sprint(m)
		if seen[k] {
			t.Errorf("model %v returned twice", m)
			return false
		}
		seen[k] = true
		full = s.Model(full[:0])
		if err := solver.Verify(p, full); err != nil {
			t.Errorf("model %v fails Verify: %v", m, err)
			return false
		}
		return true
	})
	if !complete {
		t.Fatalf("enumeration stopped early after %d models", n)
	}
	return n
}

// TestQueensCounts: the number of ways to place n non-attacking queens on
// an n×n board is 1, 0, 0, 2, 10, 4, 40, 92, 352, 724 for n = 1..10 (OEIS
// A000170).
func TestQueensCounts(t *testing.T) {
	want := map[int]int{1: 1, 2: 0, 3: 0, 4: 2, 5: 10, 6: 4, 7: 40, 8: 92, 9: 352, 10: 724}
	sizes := []int{1, 2, 3, 4, 5, 6, 7, 8, 10}
	if testing.Short() {
		sizes = []int{4, 6, 8}
	}
	for _, n := range sizes {
		t.Run(fmt.Sprintf("n=%d", n), func(t *testing.T) {
			if got := countModels(t, testprog.Queens(n), nil); got != want[n] {
				t.Errorf("%d-queens: %d models, want %d (OEIS A000170)", n, got, want[n])
			}
		})
	}
}

// TestPigeonholeUnsatisfiable: n+1 pigeons do not fit into n holes one per
// hole (the pigeonhole principle), with the holes limited by bounds or by
// pairwise constraints; n pigeons into n holes fit in n! ways.
func TestPigeonholeUnsatisfiable(t *testing.T) {
	for _, tc := range []struct {
		pigeons, holes int
		pairwise       bool
	}{{8, 7, false}, {8, 7, true}, {5, 4, true}} {
		t.Run(fmt.Sprintf("%d into %d pairwise=%v", tc.pigeons, tc.holes, tc.pairwise), func(t *testing.T) {
			if testing.Short() && tc.pairwise && tc.holes == 7 {
				t.Skip("slow in -short mode")
			}
			p := testprog.Pigeonhole(tc.pigeons, tc.holes, tc.pairwise)
			s, err := solver.New(p, solver.DefaultOptions())
			if err != nil {
				t.Fatal(err)
			}
			if st := s.Solve(context.Background()); st != solver.Unsatisfiable {
				t.Errorf("Solve = %v, want unsatisfiable", st)
			}
		})
	}
	// 5 pigeons into 5 holes: the 5! = 120 permutations.
	if got := countModels(t, testprog.Pigeonhole(5, 5, false), nil); got != 120 {
		t.Errorf("5 into 5: %d models, want 120 (5!)", got)
	}
}

// TestHamiltonianCounts runs the non-tight reachability encoding: the
// complete digraph on n vertices has (n−1)! directed Hamiltonian cycles
// (n = 4: 6, n = 5: 24, n = 6: 120); the 3-cube graph Q3 has 6 undirected
// Hamiltonian cycles (OEIS A066037), that is 12 directed ones.
func TestHamiltonianCounts(t *testing.T) {
	tests := []struct {
		name string
		n    int
		arcs []testprog.Arc
		want int
	}{
		{"K4", 4, testprog.CompleteArcs(4), 6},
		{"K5", 5, testprog.CompleteArcs(5), 24},
		{"K6", 6, testprog.CompleteArcs(6), 120},
		{"Q3", 8, testprog.CubeArcs(3), 12},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p, cyc := testprog.Hamiltonian(tc.n, tc.arcs)
			if got := countModels(t, p, cyc); got != tc.want {
				t.Errorf("%s: %d directed Hamiltonian cycles, want %d", tc.name, got, tc.want)
			}
		})
	}
}

// TestHamiltonianProjectionIsExact: the reach atoms are determined by the
// chosen arcs, so enumerating without projection gives the same count.
func TestHamiltonianProjectionIsExact(t *testing.T) {
	p, _ := testprog.Hamiltonian(5, testprog.CompleteArcs(5))
	if got := countModels(t, p, nil); got != 24 {
		t.Errorf("K5 without projection: %d models, want 24", got)
	}
}

// TestLatinSquareCounts: there are 576 Latin squares of order 4 (OEIS
// A002860) and 56 reduced Latin squares of order 5 (OEIS A000315); also 12
// of order 3 (A002860) and 4 reduced of order 4 (A000315).
func TestLatinSquareCounts(t *testing.T) {
	tests := []struct {
		n       int
		reduced bool
		want    int
		source  string
	}{
		{3, false, 12, "OEIS A002860"},
		{4, false, 576, "OEIS A002860"},
		{4, true, 4, "OEIS A000315"},
		{5, true, 56, "OEIS A000315"},
	}
	for _, tc := range tests {
		t.Run(fmt.Sprintf("n=%d reduced=%v", tc.n, tc.reduced), func(t *testing.T) {
			if got := countModels(t, testprog.LatinSquare(tc.n, tc.reduced), nil); got != tc.want {
				t.Errorf("%d models, want %d (%s)", got, tc.want, tc.source)
			}
		})
	}
}

// TestVerifyRejectsNonMinimalAndUnsupported: a stable model is the least
// model of its reduct (Gelfond & Lifschitz 1988), so a candidate that is a
// model of the program but not minimal, or holds an atom that only a
// positive loop supports, is rejected with the atom named.
func TestVerifyRejectsNonMinimalAndUnsupported(t *testing.T) {
	tests := []struct {
		name, src string
		stable    [][]string
		rejected  []string
		reason    string
	}{
		{"self loop", "p :- p.", [][]string{{}}, []string{"p"}, "atom p is true but has no support"},
		{"two-atom loop", "p :- q. q :- p. r :- not p.", [][]string{{"r"}}, []string{"p", "q"}, "atom p is true but has no support"},
		{"loop with exit", "p :- q. q :- p. p :- not s. s :- not p.", [][]string{{"p", "q"}, {"s"}}, []string{"p", "q", "s"}, "no support"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p, err := solver.ReadProgram(strings.NewReader(tc.src), tc.name)
			if err != nil {
				t.Fatal(err)
			}
			byName := map[string]solver.Atom{}
			for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
				byName[p.Name(a)] = a
			}
			atoms := func(names []string) []solver.Atom {
				var out []solver.Atom
				for _, n := range names {
					out = append(out, byName[n])
				}
				return out
			}
			for _, m := range tc.stable {
				if err := solver.Verify(p, atoms(m)); err != nil {
					t.Errorf("%v is stable: %v", m, err)
				}
			}
			err = solver.Verify(p, atoms(tc.rejected))
			if err == nil || !strings.Contains(err.Error(), tc.reason) {
				t.Errorf("%v must be rejected with %q, got %v", tc.rejected, tc.reason, err)
			}
		})
	}
}

// BenchmarkVerifyLatin30 verifies the cyclic Latin square of order 30 (27,000
// atoms, 900 choice rules with bounds and 1,800 more bounds).
func BenchmarkVerifyLatin30(b *testing.B) {
	const n = 30
	p := testprog.LatinSquare(n, false)
	var model []solver.Atom
	for r := 0; r < n; r++ {
		for c := 0; c < n; c++ {
			v := (r + c) % n
			model = append(model, solver.Atom(r*n*n+c*n+v+1)) // x(r,c,v) in creation order
		}
	}
	if err := solver.Verify(p, model); err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := solver.Verify(p, model); err != nil {
			b.Fatal(err)
		}
	}
}
