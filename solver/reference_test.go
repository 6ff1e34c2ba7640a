package solver_test

import (
	"bytes"
	"context"
	"fmt"
	"math/rand/v2"
	"slices"
	"strings"
	"testing"

	"github.com/termwright/termwright/internal/testprog"
	"github.com/termwright/termwright/solver"
)

// This file checks the engine and the verifier against the definition of
// stable models itself (Gelfond & Lifschitz 1988): X is a stable model of P
// iff X is the least model of the reduct P^X, and X satisfies every
// integrity constraint and bound. For a choice rule {H} :- B the reduct
// keeps h :- B+ for each h in H ∩ X whose rule has B- disjoint from X (the
// standard reduct of choice rules). On programs of at most 12 atoms every
// one of the 2^n candidate sets is tried. The least model here is a naive
// fixpoint iteration, written separately from solver.Verify (which uses
// counters and a queue), so that the two checks are independent.

// refLeastModel computes the least model of the reduct of p by x by
// applying every reduct rule until nothing changes.
func refLeastModel(p *solver.Program, x []bool) []bool {
	lm := make([]bool, len(x))
	applies := func(body []solver.Lit) bool {
		for _, l := range body {
			if l.IsNeg() {
				if x[l.Atom()] {
					return false // removed from the reduct
				}
			} else if !lm[l.Atom()] {
				return false
			}
		}
		return true
	}
	for changed := true; changed; {
		changed = false
		for _, r := range p.Rules {
			if r.Head != 0 && !lm[r.Head] && applies(r.Body) {
				lm[r.Head], changed = true, true
			}
		}
		for _, c := range p.Choices {
			for _, h := range c.Heads {
				if x[h] && !lm[h] && applies(c.Body) {
					lm[h], changed = true, true
				}
			}
		}
	}
	return lm
}

// refStable applies the definition to the candidate x (x[a] for atom a).
func refStable(p *solver.Program, x []bool) bool {
	if !slices.Equal(refLeastModel(p, x), x) {
		return false
	}
	truth := func(l solver.Lit) bool { return x[l.Atom()] != l.IsNeg() }
	all := func(body []solver.Lit) bool {
		for _, l := range body {
			if !truth(l) {
				return false
			}
		}
		return true
	}
	for _, r := range p.Rules {
		if r.Head == 0 && all(r.Body) {
			return false
		}
	}
	for _, b := range p.Bounds {
		if !all(b.Cond) {
			continue
		}
		// The elements of a count form a set: a repeated literal counts once.
		var distinct []solver.Lit
		for _, l := range b.Lits {
			if truth(l) && !slices.Contains(distinct, l) {
				distinct = append(distinct, l)
			}
		}
		k := len(distinct)
		if b.Lower != solver.NoBound && k < b.Lower || b.Upper != solver.NoBound && k > b.Upper {
			return false
		}
	}
	return true
}

// refModels returns every stable model of p, each as its true atoms in
// increasing order, in increasing order of the candidate's bit pattern.
func refModels(p *solver.Program) [][]solver.Atom {
	n := p.NumAtoms()
	x := make([]bool, n+1)
	var out [][]solver.Atom
	for mask := uint64(0); mask < 1<<n; mask++ {
		for a := 1; a <= n; a++ {
			x[a] = mask>>(a-1)&1 == 1
		}
		if refStable(p, x) {
			out = append(out, trueAtoms(x))
		}
	}
	return out
}

func trueAtoms(x []bool) []solver.Atom {
	m := []solver.Atom{}
	for a := 1; a < len(x); a++ {
		if x[a] {
			m = append(m, solver.Atom(a))
		}
	}
	return m
}

// key is a model's text form, for sets of models.
func key(m []solver.Atom) string { return fmt.Sprint(m) }

// programText prints p for failure messages.
func programText(p *solver.Program) string {
	var b bytes.Buffer
	if err := solver.WriteProgram(&b, p); err != nil {
		return err.Error()
	}
	return b.String()
}

// referenceCases gives the seeds and sizes of the random programs.
func referenceCases() (count, smallMax, bigN, bigCount int) {
	if testing.Short() {
		return 400, 8, 11, 10
	}
	return 2000, 10, 12, 30
}

func forEachRandomProgram(t *testing.T, fn func(t *testing.T, seed uint64, p *solver.Program)) {
	count, smallMax, bigN, bigCount := referenceCases()
	for i := 0; i < count+bigCount; i++ {
		seed := uint64(i)
		n := 1 + i%smallMax
		if i >= count {
			n = bigN
		}
		p := testprog.RandomProgram(seed, n)
		fn(t, seed, p)
		if t.Failed() {
			t.Logf("seed %d, %d atoms:\n%s", seed, n, programText(p))
			return
		}
	}
}

// TestVerifyMatchesDefinition: Verify accepts exactly the stable models by
// the definition (Gelfond & Lifschitz 1988), on thousands of random
// programs: on every candidate of programs with up to 8 atoms, and on
// larger ones on the stable models, every candidate one atom away from
// them, and 200 random candidates.
func TestVerifyMatchesDefinition(t *testing.T) {
	stable, checked := 0, 0
	forEachRandomProgram(t, func(t *testing.T, seed uint64, p *solver.Program) {
		n := p.NumAtoms()
		x := make([]bool, n+1)
		setMask := func(mask uint64) {
			for a := 1; a <= n; a++ {
				x[a] = mask>>(a-1)&1 == 1
			}
		}
		check := func(mask uint64) bool {
			setMask(mask)
			want := refStable(p, x)
			err := solver.Verify(p, trueAtoms(x))
			checked++
			if want {
				stable++
			}
			if want != (err == nil) {
				t.Errorf("seed %d, candidate %v: definition says stable=%v, Verify says %v", seed, trueAtoms(x), want, err)
				return false
			}
			return true
		}
		if n <= 8 {
			for mask := uint64(0); mask < 1<<n; mask++ {
				if !check(mask) {
					return
				}
			}
			return
		}
		r := rand.New(rand.NewPCG(seed, 7))
		for mask := uint64(0); mask < 1<<n; mask++ {
			setMask(mask)
			if !refStable(p, x) {
				continue
			}
			for a := 0; a <= n; a++ {
				m := mask
				if a > 0 {
					m ^= 1 << (a - 1)
				}
				if !check(m) {
					return
				}
			}
		}
		for range 200 {
			if !check(r.Uint64N(1 << n)) {
				return
			}
		}
	})
	t.Logf("%d candidates checked, %d stable", checked, stable)
	if stable == 0 || stable == checked {
		t.Fatal("random programs do not discriminate: adjust the generator")
	}
}

// TestEngineMatchesDefinition: the engine's Enumerate returns exactly the
// stable models found by brute force, each once, and each passes Verify.
func TestEngineMatchesDefinition(t *testing.T) {
	ctx := context.Background()
	withModels := 0
	forEachRandomProgram(t, func(t *testing.T, seed uint64, p *solver.Program) {
		want := refModels(p)
		if len(want) > 0 {
			withModels++
		}
		s, err := solver.New(p, solver.Options{Seed: int64(seed)})
		if err != nil {
			t.Fatalf("seed %d: New: %v", seed, err)
		}
		var got [][]solver.Atom
		n, complete := s.Enumerate(ctx, 0, nil, func(m []solver.Atom) bool {
			if err := solver.Verify(p, m); err != nil {
				t.Errorf("seed %d: engine model %v fails Verify: %v", seed, m, err)
			}
			got = append(got, slices.Clone(m))
			return true
		})
		if !complete || n != len(got) {
			t.Errorf("seed %d: Enumerate returned n=%d complete=%v after %d models", seed, n, complete, len(got))
		}
		assertSameModels(t, fmt.Sprintf("seed %d", seed), want, got)

		// Solve agrees on whether a model exists.
		s2, _ := solver.New(p, solver.Options{Seed: int64(seed) + 1})
		st := s2.Solve(ctx)
		if (st == solver.Satisfiable) != (len(want) > 0) || st == solver.Unknown {
			t.Errorf("seed %d: Solve says %v, definition has %d models", seed, st, len(want))
		}
		if st == solver.Satisfiable {
			if err := solver.Verify(p, s2.Model(nil)); err != nil {
				t.Errorf("seed %d: Solve's model fails Verify: %v", seed, err)
			}
		}
	})
	if withModels == 0 {
		t.Fatal("no random program has a model: adjust the generator")
	}
}

// TestEngineProjectionAndAssumptions: projected enumeration gives each
// distinct projection of the stable models once; enumeration under an
// assumption gives the models where it holds; an unsatisfiable assumption
// set yields a core that is itself unsatisfiable.
func TestEngineProjectionAndAssumptions(t *testing.T) {
	ctx := context.Background()
	forEachRandomProgram(t, func(t *testing.T, seed uint64, p *solver.Program) {
		all := refModels(p)
		n := p.NumAtoms()
		r := rand.New(rand.NewPCG(seed, 99))

		// Projection onto a random subset of atoms.
		var project []solver.Atom
		for a := 1; a <= n; a++ {
			if r.IntN(2) == 0 {
				project = append(project, solver.Atom(a))
			}
		}
		if project == nil {
			project = []solver.Atom{}
		}
		seen := map[string]bool{}
		var want [][]solver.Atom
		for _, m := range all {
			pm := []solver.Atom{}
			for _, a := range m {
				if slices.Contains(project, a) {
					pm = append(pm, a)
				}
			}
			if !seen[key(pm)] {
				seen[key(pm)] = true
				want = append(want, pm)
			}
		}
		s, err := solver.New(p, solver.Options{Seed: int64(seed)})
		if err != nil {
			t.Fatal(err)
		}
		var got [][]solver.Atom
		s.Enumerate(ctx, 0, project, func(m []solver.Atom) bool {
			if err := solver.Verify(p, s.Model(nil)); err != nil {
				t.Errorf("seed %d: full model behind a projection fails Verify: %v", seed, err)
			}
			got = append(got, slices.Clone(m))
			return true
		})
		assertSameModels(t, fmt.Sprintf("seed %d, projection on %v", seed, project), want, got)

		// Assumptions: two random literals.
		assume := []solver.Lit{randomLit(r, n), randomLit(r, n)}
		want = nil
		for _, m := range all {
			if holdsIn(m, assume) {
				want = append(want, m)
			}
		}
		s.Assume(assume...)
		got = nil
		s.Enumerate(ctx, 0, nil, func(m []solver.Atom) bool {
			got = append(got, slices.Clone(m))
			return true
		})
		assertSameModels(t, fmt.Sprintf("seed %d, assuming %v", seed, assume), want, got)

		s.Assume(assume...)
		st := s.Solve(ctx)
		if (st == solver.Satisfiable) != (len(want) > 0) {
			t.Errorf("seed %d: Solve under %v says %v, definition has %d models", seed, assume, st, len(want))
			return
		}
		if st != solver.Unsatisfiable {
			return
		}
		core := s.Core(nil)
		for _, l := range core {
			if !slices.Contains(assume, l) {
				t.Errorf("seed %d: core %v is not a subset of the assumptions %v", seed, core, assume)
			}
		}
		for _, m := range all {
			if holdsIn(m, core) {
				t.Errorf("seed %d: core %v holds in the stable model %v", seed, core, m)
			}
		}
	})
}

func randomLit(r *rand.Rand, n int) solver.Lit {
	a := solver.Atom(1 + r.IntN(n))
	if r.IntN(2) == 0 {
		return solver.Neg(a)
	}
	return solver.Pos(a)
}

// holdsIn reports whether every literal holds in the model (sorted atoms).
func holdsIn(m []solver.Atom, lits []solver.Lit) bool {
	for _, l := range lits {
		_, in := slices.BinarySearch(m, l.Atom())
		if in == l.IsNeg() {
			return false
		}
	}
	return true
}

// assertSameModels compares two lists of models as sets and reports
// duplicates in got.
func assertSameModels(t *testing.T, what string, want, got [][]solver.Atom) {
	t.Helper()
	w := map[string]bool{}
	for _, m := range want {
		w[key(m)] = true
	}
	g := map[string]bool{}
	for _, m := range got {
		if g[key(m)] {
			t.Errorf("%s: model %v returned twice", what, m)
		}
		g[key(m)] = true
	}
	var missing, extra []string
	for k := range w {
		if !g[k] {
			missing = append(missing, k)
		}
	}
	for k := range g {
		if !w[k] {
			extra = append(extra, k)
		}
	}
	if len(missing)+len(extra) > 0 {
		slices.Sort(missing)
		slices.Sort(extra)
		t.Errorf("%s: engine misses %s and returns non-models %s", what, strings.Join(missing, " "), strings.Join(extra, " "))
	}
}
