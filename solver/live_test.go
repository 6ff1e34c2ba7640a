package solver_test

import (
	"context"
	"fmt"
	"math"
	"math/rand/v2"
	"slices"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/internal/testprog"
	"github.com/termwright/termwright/solver"
)

// liveModels enumerates every model of s projected onto project (nil: the
// program's atoms), checking each full model with Verify against p, which
// must be the program with the live additions written as rules.
func liveModels(t *testing.T, s *solver.Solver, p *solver.Program, project []solver.Atom) [][]solver.Atom {
	t.Helper()
	var out [][]solver.Atom
	_, complete := s.Enumerate(context.Background(), 0, project, func(m []solver.Atom) bool {
		if err := solver.Verify(p, s.Model(nil)); err != nil {
			t.Errorf("model %v fails Verify: %v", m, err)
		}
		out = append(out, m)
		return true
	})
	require.True(t, complete, "enumeration must finish")
	require.NoError(t, s.Err())
	return out
}

// freeCells returns a program with rows×cols atoms cell(r,c), each free
// (choice rule without bounds): the constraints come later.
func freeCells(rows, cols int) (*solver.Program, [][]solver.Atom) {
	p := solver.NewProgram()
	at := make([][]solver.Atom, rows)
	for r := range at {
		at[r] = make([]solver.Atom, cols)
		for c := range at[r] {
			at[r][c] = p.NewAtom(fmt.Sprintf("cell(%d,%d)", r, c))
		}
		p.AddChoice(at[r], solver.NoBound, solver.NoBound)
	}
	return p, at
}

func posLits(atoms []solver.Atom) []solver.Lit {
	out := make([]solver.Lit, len(atoms))
	for i, a := range atoms {
		out[i] = solver.Pos(a)
	}
	return out
}

// liveBound is a bound added both to a live solver and to the program that
// describes the result.
type liveBound struct {
	lits         []solver.Lit
	lower, upper int
	cond         []solver.Lit
}

// queensLines returns the constraints of n queens: exactly one queen per
// row, at most one per column and per diagonal.
func queensLines(at [][]solver.Atom) []liveBound {
	n := len(at)
	var out []liveBound
	for r := 0; r < n; r++ {
		out = append(out, liveBound{lits: posLits(at[r]), lower: 1, upper: 1})
	}
	for c := 0; c < n; c++ {
		var col []solver.Lit
		for r := 0; r < n; r++ {
			col = append(col, solver.Pos(at[r][c]))
		}
		out = append(out, liveBound{lits: col, lower: solver.NoBound, upper: 1})
	}
	for d := -(n - 1); d <= n-1; d++ {
		var down, up []solver.Lit
		for r := 0; r < n; r++ {
			if c := r + d; c >= 0 && c < n {
				down = append(down, solver.Pos(at[r][c]))
			}
			if c := n - 1 - r + d; c >= 0 && c < n {
				up = append(up, solver.Pos(at[r][c]))
			}
		}
		out = append(out, liveBound{lits: down, lower: solver.NoBound, upper: 1}, liveBound{lits: up, lower: solver.NoBound, upper: 1})
	}
	return out
}

// TestAddBoundQueens: n queens with every row, column and diagonal bound
// added to a live solver after New (first solved once without them) has
// 1, 0, 0, 2, 10, 4, 40, 92 solutions for n = 1..8 (OEIS A000170), each
// passing Verify, and the same models as New on the program with the
// bounds.
func TestAddBoundQueens(t *testing.T) {
	want := []int{1, 0, 0, 2, 10, 4, 40, 92} // OEIS A000170
	for n := 1; n <= 8; n++ {
		t.Run(fmt.Sprintf("n=%d", n), func(t *testing.T) {
			p, at := freeCells(n, n)
			s, err := solver.New(p, solver.DefaultOptions())
			require.NoError(t, err)
			require.Equal(t, solver.Satisfiable, s.Solve(context.Background()), "no constraints yet")
			full := *p
			full.Bounds = slices.Clone(p.Bounds)
			for _, b := range queensLines(at) {
				require.NoError(t, s.AddBound(b.lits, b.lower, b.upper, b.cond...))
				full.AddBound(b.lits, b.lower, b.upper, b.cond...)
			}
			got := liveModels(t, s, &full, nil)
			require.Len(t, got, want[n-1], "OEIS A000170")
			assertSameModels(t, "live vs New", modelsOfNew(t, &full, nil), got)
		})
	}
}

// modelsOfNew enumerates the models of p with a solver built by New.
func modelsOfNew(t *testing.T, p *solver.Program, project []solver.Atom) [][]solver.Atom {
	t.Helper()
	s, err := solver.New(p, solver.DefaultOptions())
	require.NoError(t, err)
	var out [][]solver.Atom
	_, complete := s.Enumerate(context.Background(), 0, project, func(m []solver.Atom) bool {
		out = append(out, m)
		return true
	})
	require.True(t, complete)
	return out
}

// TestLivePigeonhole: with every pigeon in exactly one hole and at most one
// pigeon per hole, added live as bounds or as weighted sums (the lower
// limit as a sum of weights -1 at most -1), n+1 pigeons have no placement
// (the pigeonhole principle) and n pigeons in n holes have n! (the
// bijections).
func TestLivePigeonhole(t *testing.T) {
	fact := []int{1, 1, 2, 6, 24, 120}
	for _, form := range []string{"bounds", "sums"} {
		for _, tc := range []struct{ pigeons, holes, want int }{
			{2, 1, 0}, {3, 2, 0}, {4, 3, 0}, {5, 4, 0}, {6, 5, 0},
			{1, 1, fact[1]}, {3, 3, fact[3]}, {5, 5, fact[5]},
		} {
			t.Run(fmt.Sprintf("%s/%d-into-%d", form, tc.pigeons, tc.holes), func(t *testing.T) {
				p, in := freeCells(tc.pigeons, tc.holes)
				s, err := solver.New(p, solver.DefaultOptions())
				require.NoError(t, err)
				full := *p
				for _, row := range in {
					lits := posLits(row)
					full.AddBound(lits, 1, 1)
					if form == "bounds" {
						require.NoError(t, s.AddBound(lits, 1, 1))
						continue
					}
					require.NoError(t, s.AddWeightSum(lits, ones(len(lits), 1), 1))
					require.NoError(t, s.AddWeightSum(lits, ones(len(lits), -1), -1))
				}
				for h := 0; h < tc.holes; h++ {
					var col []solver.Lit
					for i := range in {
						col = append(col, solver.Pos(in[i][h]))
					}
					full.AddBound(col, solver.NoBound, 1)
					if form == "bounds" {
						require.NoError(t, s.AddBound(col, solver.NoBound, 1))
					} else {
						require.NoError(t, s.AddWeightSum(col, ones(len(col), 1), 1))
					}
				}
				if tc.want == 0 {
					require.Equal(t, solver.Unsatisfiable, s.Solve(context.Background()), "pigeonhole principle")
					return
				}
				require.Len(t, liveModels(t, s, &full, nil), tc.want, "n! bijections")
			})
		}
	}
}

func ones(n int, w int64) []int64 {
	out := make([]int64, n)
	for i := range out {
		out[i] = w
	}
	return out
}

// liveAddition is one random addition, applied to the live solver and
// mirrored in a program (clauses as constraints, bounds as bounds) or in a
// filter (weighted sums, which programs cannot state).
type liveAddition struct {
	kind   string // "clause", "bound", "sum"
	lits   []solver.Lit
	w      []int64
	lower  int
	upper  int
	wupper int64
	cond   []solver.Lit
}

func randomAddition(r *rand.Rand, n int) liveAddition {
	lits := func(k int) []solver.Lit {
		out := make([]solver.Lit, k)
		for i := range out {
			out[i] = randomLit(r, n)
		}
		return out
	}
	a := liveAddition{cond: lits(r.IntN(3))}
	switch r.IntN(3) {
	case 0:
		a.kind, a.lits, a.cond = "clause", lits(1+r.IntN(3)), nil
	case 1:
		a.kind, a.lits = "bound", lits(1+r.IntN(4))
		a.lower, a.upper = r.IntN(len(a.lits)+1)-1, r.IntN(len(a.lits)+1)-1
		if a.lower != solver.NoBound && a.upper != solver.NoBound && a.lower > a.upper {
			a.lower, a.upper = a.upper, a.lower
		}
	default:
		a.kind, a.lits = "sum", lits(1+r.IntN(4))
		var total int64
		for range a.lits {
			w := int64(r.IntN(9) - 3)
			a.w = append(a.w, w)
			total += max(w, 0)
		}
		a.wupper = int64(r.IntN(int(total)+3)) - 1
	}
	return a
}

func (a liveAddition) apply(s *solver.Solver) error {
	switch a.kind {
	case "clause":
		return s.AddClause(a.lits...)
	case "bound":
		return s.AddBound(a.lits, a.lower, a.upper, a.cond...)
	}
	return s.AddWeightSum(a.lits, a.w, a.wupper, a.cond...)
}

// mirror writes a clause or bound into p.
func (a liveAddition) mirror(p *solver.Program) {
	switch a.kind {
	case "clause":
		neg := make([]solver.Lit, len(a.lits))
		for i, l := range a.lits {
			neg[i] = l.Not()
		}
		p.AddConstraint(neg...)
	case "bound":
		p.AddBound(a.lits, a.lower, a.upper, a.cond...)
	}
}

// holds reports whether a weighted sum holds in model m (sorted atoms),
// computed from the definition.
func (a liveAddition) holds(m []solver.Atom) bool {
	if a.kind != "sum" || !holdsIn(m, a.cond) {
		return true
	}
	var sum int64
	for i, l := range a.lits {
		if holdsIn(m, []solver.Lit{l}) {
			sum += a.w[i]
		}
	}
	return sum <= a.wupper
}

// TestLiveMatchesDefinition: on random programs, a live solver that was
// solved, then given random clauses, bounds and weighted sums (in rounds,
// solving between them) has exactly the stable models, by brute force
// over the definition (Gelfond & Lifschitz 1988), of the program with the
// clauses and bounds added that also satisfy the sums; after clauses and
// bounds only, it also agrees with New on that program. A clone made
// before the last round and given the same round agrees too, and Optimize
// on both finds the least cost among those models (brute force).
func TestLiveMatchesDefinition(t *testing.T) {
	count := 600
	if testing.Short() {
		count = 150
	}
	for seed := range uint64(count) {
		n := 2 + int(seed%8)
		p := testprog.RandomProgram(seed, n)
		r := rand.New(rand.NewPCG(seed, 0x11fe))
		s, err := solver.New(p, solver.DefaultOptions())
		require.NoError(t, err)
		full := *p
		full.Rules, full.Bounds = slices.Clone(p.Rules), slices.Clone(p.Bounds)
		var sums []liveAddition
		var clone *solver.Solver
		for round := range 3 {
			s.Solve(context.Background())
			if round == 2 {
				clone = s.Clone()
			}
			var adds []liveAddition
			for range 1 + r.IntN(3) {
				adds = append(adds, randomAddition(r, n))
			}
			for _, a := range adds {
				require.NoError(t, a.apply(s))
				if clone != nil {
					require.NoError(t, a.apply(clone))
				}
				a.mirror(&full)
				if a.kind == "sum" {
					sums = append(sums, a)
				}
			}
		}
		var want [][]solver.Atom
		for _, m := range refModels(&full) {
			ok := true
			for _, a := range sums {
				ok = ok && a.holds(m)
			}
			if ok {
				want = append(want, m)
			}
		}
		what := fmt.Sprintf("seed %d", seed)
		assertSameModels(t, what+" live", want, liveModels(t, s, &full, nil))
		assertSameModels(t, what+" clone", want, liveModels(t, clone, &full, nil))
		if len(sums) == 0 {
			assertSameModels(t, what+" New", want, modelsOfNew(t, &full, nil))
		}
		var best []int64 // least cost by brute force, lexicographic from the highest level
		for _, m := range want {
			if c := solver.Cost(&full, m); best == nil || slices.Compare(c, best) < 0 {
				best = c
			}
		}
		for name, x := range map[string]*solver.Solver{"live": s, "clone": clone} {
			st, cost, err := x.Optimize(context.Background(), nil)
			require.NoError(t, err)
			if len(want) == 0 {
				require.Equal(t, solver.Unsatisfiable, st, "%s %s Optimize", what, name)
				continue
			}
			require.Equal(t, solver.Satisfiable, st, "%s %s Optimize", what, name)
			require.True(t, x.Proven())
			require.Equal(t, best, cost, "%s %s: optimum by brute force", what, name)
			require.NoError(t, solver.Verify(&full, x.Model(nil)))
			require.Contains(t, want, x.Model([]solver.Atom{}), "%s %s: the optimum satisfies the sums", what, name)
		}
		if t.Failed() {
			t.Logf("%s, program before additions:\n%s", what, programText(p))
			return
		}
	}
}

// TestAddAtomsActivation: atoms made by AddAtoms are free atoms (the
// models equal, by brute force over the definition, those of the program
// with one choice rule "{x}." per added atom and the same constraints) and
// serve as activation literals: a bound guarded by act holds only while
// act is assumed, and "not act" retires it.
func TestAddAtomsActivation(t *testing.T) {
	for seed := range uint64(200) {
		n := 2 + int(seed%6)
		p := testprog.RandomProgram(seed, n)
		r := rand.New(rand.NewPCG(seed, 0xadd))
		s, err := solver.New(p, solver.DefaultOptions())
		require.NoError(t, err)
		s.Solve(context.Background())
		k := 1 + r.IntN(2)
		first := s.AddAtoms(k)
		require.Greater(t, int(first), n, "added atoms follow the program's")
		full := *p
		full.Rules, full.Bounds, full.Choices = slices.Clone(p.Rules), slices.Clone(p.Bounds), slices.Clone(p.Choices)
		for range k {
			full.AddChoice([]solver.Atom{full.NewAtom("")}, solver.NoBound, solver.NoBound)
		}
		toFull := func(l solver.Lit) solver.Lit { // live literal -> literal of full
			if int(l.Atom()) <= n {
				return l
			}
			a := solver.Atom(n+1) + l.Atom() - first
			if l.IsNeg() {
				return solver.Neg(a)
			}
			return solver.Pos(a)
		}
		randLit := func() solver.Lit {
			if r.IntN(2) == 0 {
				return solver.Pos(first + solver.Atom(r.IntN(k)))
			}
			return randomLit(r, n)
		}
		for range 3 {
			lits := []solver.Lit{randLit(), randLit(), randLit()}
			lower, upper := r.IntN(3)-1, r.IntN(3)+1
			cond := []solver.Lit{randLit()}
			require.NoError(t, s.AddBound(lits, lower, upper, cond...))
			var fl []solver.Lit
			for _, l := range lits {
				fl = append(fl, toFull(l))
			}
			full.AddBound(fl, lower, upper, toFull(cond[0]))
		}
		project := make([]solver.Atom, 0, n+k)
		for a := 1; a <= n; a++ {
			project = append(project, solver.Atom(a))
		}
		for i := range k {
			project = append(project, first+solver.Atom(i))
		}
		var got [][]solver.Atom
		_, complete := s.Enumerate(context.Background(), 0, project, func(m []solver.Atom) bool {
			fm := make([]solver.Atom, len(m))
			for i, a := range m {
				fm[i] = toFull(solver.Pos(a)).Atom()
			}
			got = append(got, fm)
			if err := solver.Verify(&full, fm); err != nil {
				t.Errorf("model %v fails Verify: %v", fm, err)
			}
			return true
		})
		require.True(t, complete)
		assertSameModels(t, fmt.Sprintf("seed %d", seed), refModels(&full), got)
		if t.Failed() {
			t.Logf("program:\n%s", programText(&full))
			return
		}
	}
}

// TestLiveUnsatisfiable: additions to a solver whose program already has a
// level-0 conflict are accepted and change nothing; an addition that
// contradicts a satisfiable program makes every later search
// Unsatisfiable; a contradiction under a condition only forces the
// condition false.
func TestLiveUnsatisfiable(t *testing.T) {
	ctx := context.Background()
	p := solver.NewProgram()
	a, b := p.NewAtom("a"), p.NewAtom("b")
	p.AddChoice([]solver.Atom{a, b}, solver.NoBound, solver.NoBound)
	broken := *p
	broken.Rules = nil
	broken.AddConstraint() // ":- ." holds in no model
	for _, tc := range []struct {
		name    string
		p       *solver.Program
		add     func(*solver.Solver) error
		want    solver.Status
		assumeA bool // solve under the assumption a
	}{
		{"conflict/bound", &broken, func(s *solver.Solver) error { return s.AddBound(posLits([]solver.Atom{a, b}), 1, 1) }, solver.Unsatisfiable, false},
		{"conflict/sum", &broken, func(s *solver.Solver) error {
			return s.AddWeightSum([]solver.Lit{solver.Pos(a)}, []int64{5}, 2, solver.Pos(b))
		}, solver.Unsatisfiable, false},
		{"conflict/clause", &broken, func(s *solver.Solver) error { return s.AddClause(solver.Pos(a)) }, solver.Unsatisfiable, false},
		{"conflict/atoms", &broken, func(s *solver.Solver) error { s.AddAtoms(3); return nil }, solver.Unsatisfiable, false},
		{"bound lower above size", p, func(s *solver.Solver) error { return s.AddBound([]solver.Lit{solver.Pos(a)}, 2, solver.NoBound) }, solver.Unsatisfiable, false},
		{"bound both ways", p, func(s *solver.Solver) error {
			if err := s.AddBound(posLits([]solver.Atom{a, b}), 2, 2); err != nil {
				return err
			}
			return s.AddBound([]solver.Lit{solver.Neg(a), solver.Neg(b)}, 1, solver.NoBound)
		}, solver.Unsatisfiable, false},
		{"sum below zero", p, func(s *solver.Solver) error { return s.AddWeightSum(nil, nil, -1) }, solver.Unsatisfiable, false},
		{"sum negative weights", p, func(s *solver.Solver) error {
			// -a - b <= -3 needs three true literals out of two.
			return s.AddWeightSum(posLits([]solver.Atom{a, b}), []int64{-1, -1}, -3)
		}, solver.Unsatisfiable, false},
		{"sum under condition", p, func(s *solver.Solver) error { return s.AddWeightSum(nil, nil, -1, solver.Pos(a)) }, solver.Satisfiable, false},
		{"sum under condition, assumed", p, func(s *solver.Solver) error { return s.AddWeightSum(nil, nil, -1, solver.Pos(a)) }, solver.Unsatisfiable, true},
		{"bounds under conjunctions, assumed", p, func(s *solver.Solver) error {
			// a ∧ not b -> b and a ∧ b -> not b leave only not a.
			if err := s.AddBound([]solver.Lit{solver.Pos(b)}, 1, solver.NoBound, solver.Pos(a), solver.Neg(b)); err != nil {
				return err
			}
			return s.AddBound([]solver.Lit{solver.Pos(b)}, solver.NoBound, 0, solver.Pos(a), solver.Pos(b), solver.Pos(a))
		}, solver.Unsatisfiable, true},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s, err := solver.New(tc.p, solver.DefaultOptions())
			require.NoError(t, err)
			s.Solve(ctx)
			require.NoError(t, tc.add(s))
			for range 2 { // later searches too
				if tc.assumeA {
					s.Assume(solver.Pos(a))
				}
				require.Equal(t, tc.want, s.Solve(ctx))
				if tc.want == solver.Satisfiable {
					require.NoError(t, solver.Verify(tc.p, s.Model(nil)))
				}
			}
			if tc.assumeA {
				require.Equal(t, []solver.Lit{solver.Pos(a)}, s.Core(nil), "the assumption alone is refuted")
			}
		})
	}
}

// TestLiveErrors: a literal naming no atom (0, past the program, or an
// internal variable of the engine), impossible limits, mismatched or
// overflowing weights are errors wrapping ErrProgram, and nothing is added.
func TestLiveErrors(t *testing.T) {
	p := solver.NewProgram()
	a, b, c := p.NewAtom("a"), p.NewAtom("b"), p.NewAtom("c")
	p.AddChoice([]solver.Atom{a, b, c}, solver.NoBound, solver.NoBound)
	p.AddRule(c, solver.Pos(a), solver.Pos(b)) // a body variable follows the atoms
	internal := solver.Pos(solver.Atom(p.NumAtoms() + 1))
	past := solver.Pos(solver.Atom(100))
	for _, tc := range []struct {
		name string
		add  func(*solver.Solver) error
	}{
		{"clause/atom 0", func(s *solver.Solver) error { return s.AddClause(solver.Lit(0)) }},
		{"clause/internal", func(s *solver.Solver) error { return s.AddClause(internal) }},
		{"bound/element past", func(s *solver.Solver) error { return s.AddBound([]solver.Lit{solver.Pos(a), past}, 0, 0) }},
		{"bound/condition internal", func(s *solver.Solver) error { return s.AddBound([]solver.Lit{solver.Pos(a)}, 1, 1, internal) }},
		{"bound/lower above upper", func(s *solver.Solver) error { return s.AddBound([]solver.Lit{solver.Pos(a)}, 1, 0) }},
		{"bound/limit below NoBound", func(s *solver.Solver) error { return s.AddBound([]solver.Lit{solver.Pos(a)}, -2, 0) }},
		{"sum/element internal", func(s *solver.Solver) error { return s.AddWeightSum([]solver.Lit{internal}, []int64{1}, 0) }},
		{"sum/condition past", func(s *solver.Solver) error { return s.AddWeightSum([]solver.Lit{solver.Pos(a)}, []int64{1}, 0, past) }},
		{"sum/lengths", func(s *solver.Solver) error { return s.AddWeightSum([]solver.Lit{solver.Pos(a)}, []int64{1, 2}, 0) }},
		{"sum/overflow", func(s *solver.Solver) error {
			return s.AddWeightSum(posLits([]solver.Atom{a, b}), []int64{math.MaxInt64, 1}, 0)
		}},
		{"sum/min weight", func(s *solver.Solver) error {
			return s.AddWeightSum([]solver.Lit{solver.Pos(a)}, []int64{math.MinInt64}, 0)
		}},
		{"sum/negative overflow", func(s *solver.Solver) error {
			return s.AddWeightSum([]solver.Lit{solver.Pos(a)}, []int64{-2}, math.MaxInt64-1)
		}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			s, err := solver.New(p, solver.DefaultOptions())
			require.NoError(t, err)
			before := modelsOf(t, s)
			err = tc.add(s)
			require.ErrorIs(t, err, solver.ErrProgram)
			require.Equal(t, before, modelsOf(t, s), "a rejected addition changes nothing")
		})
	}
}

// modelsOf counts the models of s.
func modelsOf(t *testing.T, s *solver.Solver) int {
	n, complete := s.Enumerate(context.Background(), 0, nil, func([]solver.Atom) bool { return true })
	require.True(t, complete)
	return n
}

// TestAssumptionNamingNoAtom: Solve, Enumerate and Optimize treat an
// assumption naming no atom alike: no search (Unknown, no model), Err
// wraps ErrProgram (Optimize also returns it), the previous model is
// forgotten, and the next call without the misuse clears Err.
func TestAssumptionNamingNoAtom(t *testing.T) {
	ctx := context.Background()
	p := solver.NewProgram()
	a := p.NewAtom("a")
	p.AddChoice([]solver.Atom{a}, solver.NoBound, solver.NoBound)
	p.AddWeak(1, 0, solver.Pos(a))
	bad := []solver.Lit{solver.Lit(0), solver.Pos(5), solver.Neg(2)}
	for _, call := range []string{"Solve", "Enumerate", "Optimize"} {
		for _, l := range bad {
			t.Run(fmt.Sprintf("%s/%d", call, l), func(t *testing.T) {
				s, err := solver.New(p, solver.DefaultOptions())
				require.NoError(t, err)
				s.Assume(solver.Pos(a))
				require.Equal(t, solver.Satisfiable, s.Solve(ctx))
				require.Equal(t, []solver.Atom{a}, s.Model(nil))
				s.Assume(solver.Pos(a), l)
				switch call {
				case "Solve":
					require.Equal(t, solver.Unknown, s.Solve(ctx))
				case "Enumerate":
					n, complete := s.Enumerate(ctx, 0, nil, func([]solver.Atom) bool { return true })
					require.Zero(t, n)
					require.False(t, complete)
				case "Optimize":
					st, cost, err := s.Optimize(ctx, nil)
					require.Equal(t, solver.Unknown, st)
					require.Nil(t, cost)
					require.ErrorIs(t, err, solver.ErrProgram)
					require.Equal(t, err, s.Err())
				}
				require.ErrorIs(t, s.Err(), solver.ErrProgram)
				require.Contains(t, s.Err().Error(), call)
				require.Empty(t, s.Model(nil), "no model after a refused call")
				require.False(t, s.Value(a))
				s.Assume(solver.Neg(a))
				require.Equal(t, solver.Satisfiable, s.Solve(ctx), "the bad assumption was consumed")
				require.NoError(t, s.Err())
			})
		}
	}
	t.Run("added atom is an atom", func(t *testing.T) {
		s, err := solver.New(p, solver.DefaultOptions())
		require.NoError(t, err)
		x := s.AddAtoms(1)
		s.Assume(solver.Pos(x))
		require.Equal(t, solver.Satisfiable, s.Solve(ctx))
		require.NoError(t, s.Err())
		require.True(t, s.Value(x))
		require.NoError(t, solver.Verify(p, s.Model(nil)))
	})
}
