package solver

import (
	"bytes"
	"context"
	"fmt"
	"math/rand/v2"
	"slices"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// parseCNF reads the clauses of a written CNF with a scanner of its own.
func parseCNF(t testing.TB, text string) (vars int, clauses [][]int) {
	t.Helper()
	var cur []int
	header := false
	for _, line := range strings.Split(text, "\n") {
		if line == "" || line[0] == 'c' {
			continue
		}
		if strings.HasPrefix(line, "p cnf ") {
			f := strings.Fields(line)
			vars, _ = strconv.Atoi(f[2])
			n, _ := strconv.Atoi(f[3])
			clauses = make([][]int, 0, n)
			header = true
			continue
		}
		require.True(t, header, "clause before header")
		for _, tok := range strings.Fields(line) {
			v, err := strconv.Atoi(tok)
			require.NoError(t, err)
			if v == 0 {
				clauses = append(clauses, cur)
				cur = nil
				continue
			}
			require.LessOrEqual(t, max(v, -v), vars)
			cur = append(cur, v)
		}
	}
	require.Empty(t, cur, "unterminated clause")
	return vars, clauses
}

// cnfModels lists the assignments to atoms 1..n that extend to a model of
// the CNF, by fixing each of the 2^n assignments and asking gophersat (an
// outside SAT library) whether the rest is satisfiable.
func cnfModels(n, vars int, clauses [][]int) [][]Atom {
	var out [][]Atom
	for mask := 0; mask < 1<<n; mask++ {
		cls := slices.Clone(clauses)
		var m []Atom
		for a := 1; a <= n; a++ {
			if mask>>(a-1)&1 == 1 {
				cls = append(cls, []int{a})
				m = append(m, Atom(a))
			} else {
				cls = append(cls, []int{-a})
			}
		}
		if gophersatSolve(max(vars, 1), cls) {
			out = append(out, m)
		}
	}
	return out
}

// engineModels lists the engine's stable models over every atom.
func engineModels(t testing.TB, p *Program) [][]Atom {
	s, err := New(p, Options{Seed: 1})
	require.NoError(t, err)
	all := make([]Atom, p.NumAtoms())
	for i := range all {
		all[i] = Atom(i + 1)
	}
	var out [][]Atom
	_, complete := s.Enumerate(context.Background(), 0, all, func(m []Atom) bool {
		out = append(out, slices.Clone(m))
		return true
	})
	require.True(t, complete)
	return out
}

func sortModels(ms [][]Atom) []string {
	out := make([]string, len(ms))
	for i, m := range ms {
		s := slices.Clone(m)
		slices.Sort(s)
		out[i] = fmt.Sprint(s)
	}
	slices.Sort(out)
	return out
}

// randomBoundProgram is a program of free atoms under random cardinality
// bounds, some conditional, to exercise the counter encoding.
func randomBoundProgram(r *rand.Rand, n int) *Program {
	p := NewProgram()
	atoms := make([]Atom, n)
	for i := range atoms {
		atoms[i] = p.NewAtom(fmt.Sprintf("b%d", i+1))
	}
	p.AddChoice(atoms, NoBound, NoBound)
	for k := 1 + r.IntN(3); k > 0; k-- {
		var ls []Lit
		for _, i := range r.Perm(n)[:1+r.IntN(n)] {
			if r.IntN(3) == 0 {
				ls = append(ls, Neg(atoms[i]))
			} else {
				ls = append(ls, Pos(atoms[i]))
			}
		}
		lo, hi := NoBound, NoBound
		if r.IntN(2) == 0 {
			lo = r.IntN(len(ls) + 2)
		}
		if lo == NoBound || r.IntN(2) == 0 {
			hi = r.IntN(len(ls) + 1)
			if lo != NoBound && hi < lo {
				hi = lo
			}
		}
		var cond []Lit
		if r.IntN(3) == 0 {
			cond = append(cond, Pos(atoms[r.IntN(n)]))
		}
		p.AddBound(ls, lo, hi, cond...)
	}
	return p
}

// TestDIMACSModelsAreStableModels: for random small tight programs the
// models of the written CNF projected onto the atoms equal the engine's
// stable models; for tight programs the completion is exact (Fages 1994).
// Programs with a positive cycle must be refused with the cycle named.
func TestDIMACSModelsAreStableModels(t *testing.T) {
	count := 400
	if testing.Short() {
		count = 100
	}
	tight, loopy := 0, 0
	for seed := 0; seed < count; seed++ {
		r := rand.New(rand.NewPCG(uint64(seed), 7))
		n := 2 + r.IntN(6)
		var p *Program
		if seed%3 == 2 {
			p = randomBoundProgram(r, n)
		} else {
			p = engRandomProgram(r, n)
		}
		var buf bytes.Buffer
		err := WriteDIMACSWith(&buf, p, DIMACSOptions{Names: true})
		if err != nil {
			require.ErrorIs(t, err, ErrProgram)
			require.Contains(t, err.Error(), "positive cycle", "seed %d", seed)
			require.NotNil(t, positiveCycle(p))
			loopy++
			continue
		}
		tight++
		vars, clauses := parseCNF(t, buf.String())
		got := sortModels(cnfModels(p.NumAtoms(), vars, clauses))
		want := sortModels(engineModels(t, p))
		require.Equal(t, want, got, "seed %d\n%s", seed, buf.String())
	}
	require.Greater(t, tight, count/4)
	require.Greater(t, loopy, 0)
}

func TestDIMACSHeaderAndComments(t *testing.T) {
	p := NewProgram()
	a, b, c := p.NewAtom("a"), p.NewAtom("b"), p.NewAtom("")
	p.AddChoice([]Atom{a, b}, 1, 1)
	p.AddRule(c, Pos(a), Neg(b))
	p.AddWeak(3, 0, Pos(c))
	var buf bytes.Buffer
	require.NoError(t, WriteDIMACSWith(&buf, p, DIMACSOptions{Names: true}))
	out := buf.String()
	require.Contains(t, out, "c 1 weak constraints ignored")
	require.Contains(t, out, "c atom 1 a\n")
	require.Contains(t, out, "c atom 2 b\n")
	require.NotContains(t, out, "c atom 3")
	vars, clauses := parseCNF(t, out)
	require.Contains(t, out, fmt.Sprintf("p cnf %d %d\n", vars, len(clauses)))
	buf.Reset()
	require.NoError(t, WriteDIMACS(&buf, p))
	require.NotContains(t, buf.String(), "c atom")
}

func TestDIMACSRefusesCycle(t *testing.T) {
	p := NewProgram()
	a, b := p.NewAtom("p"), p.NewAtom("q")
	p.AddRule(a, Pos(b))
	p.AddRule(b, Pos(a))
	err := WriteDIMACS(&bytes.Buffer{}, p)
	require.ErrorIs(t, err, ErrProgram)
	require.Contains(t, err.Error(), "positive cycle")
	require.Regexp(t, `p -> q -> p|q -> p -> q`, err.Error())
}

// TestDIMACSBoundIsCompact: "exactly one of n" and "at most k of n" grow
// linearly in n (times k), never quadratically as pairwise clauses would.
func TestDIMACSBoundIsCompact(t *testing.T) {
	for _, n := range []int{100, 1000} {
		p := NewProgram()
		heads := make([]Atom, n)
		for i := range heads {
			heads[i] = p.NewAtom("")
		}
		p.AddChoice(heads, 1, 1)
		var buf bytes.Buffer
		require.NoError(t, WriteDIMACS(&buf, p))
		vars, clauses := parseCNF(t, buf.String())
		require.Less(t, vars, 4*n, "n=%d", n)
		require.Less(t, len(clauses), 10*n, "n=%d", n)
	}
}

func TestReadDIMACS(t *testing.T) {
	p, err := ReadDIMACS(strings.NewReader("c hello\np cnf 3 2\n1 -2 0\n2\n3 0\n%\n0\n"), "f.cnf")
	require.NoError(t, err)
	require.Equal(t, 3, p.NumAtoms())
	require.Equal(t, "x2", p.Name(2))
	require.Len(t, p.Rules, 2)
	ms := sortModels(engineModels(t, p))
	// (x1 or not x2) and (x2 or x3): 8 assignments minus those violating.
	var want [][]Atom
	for mask := 0; mask < 8; mask++ {
		x := func(i int) bool { return mask>>(i-1)&1 == 1 }
		if (x(1) || !x(2)) && (x(2) || x(3)) {
			var m []Atom
			for i := 1; i <= 3; i++ {
				if x(i) {
					m = append(m, Atom(i))
				}
			}
			want = append(want, m)
		}
	}
	require.Equal(t, sortModels(want), ms)
}

func TestReadDIMACSErrors(t *testing.T) {
	cases := []struct{ name, in, want string }{
		{"no header", "1 2 0\n", "f.cnf:1: clause before the header"},
		{"empty", "c only\n", "f.cnf:1: no header"},
		{"bad header", "p dnf 1 1\n", "f.cnf:1: header"},
		{"two headers", "p cnf 1 0\np cnf 1 0\n", "f.cnf:2: a second header"},
		{"not a number", "p cnf 2 1\n1 x 0\n", "f.cnf:2:3: \"x\" is not a whole number"},
		{"out of range", "p cnf 2 1\nc\n1 -3 0\n", "f.cnf:3:3: literal -3 refers to variable 3, but the header announces 2 variables"},
		{"most negative int64", "p cnf 2 1\n  -9223372036854775808 0\n", "f.cnf:2:3: literal -9223372036854775808 refers to variable 9223372036854775808, but the header announces 2 variables"},
		{"beyond int64", "p cnf 2 1\n1 99999999999999999999 0\n", "f.cnf:2:3: literal 99999999999999999999 refers to variable 99999999999999999999"},
		{"negative count", "p cnf 2 -1\n", "f.cnf:1:9: \"-1\" in the header is not a non-negative whole number"},
		// A 20-byte header announcing 2^28 variables would take gigabytes.
		{"header beyond the file", "p cnf 268435456 1\n1 0\n", "f.cnf:1:7: the header announces 268435456 variables, but the clauses use only 1; at most 65536 unused variables are accepted"},
		{"header beyond the reader", "p cnf 268435457 1\n", "f.cnf:1:7: the header announces 268435457 variables, more than the 268435456 this reader takes"},
		{"unused variables at the limit", "p cnf 65537 1\n1 0\n", ""},
		{"long token quoted short", "p cnf 2 1\n" + strings.Repeat("y", 1000) + " 0\n", `f.cnf:2:1: "yyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyyy…" (1000 characters) is not a whole number`},
		{"unterminated", "p cnf 2 1\n1\n2\n", "f.cnf:2: the last clause is not ended by 0"},
		{"too many", "p cnf 2 1\n1 0\n2 0\n", "f.cnf:3:3: more clauses"},
		{"too few", "p cnf 2 2\n1 0\n", "1 clauses, but the header announces 2"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			p, err := ReadDIMACS(strings.NewReader(c.in), "f.cnf")
			if c.want == "" {
				require.NoError(t, err)
				require.Equal(t, 65537, p.NumAtoms())
				return
			}
			require.Error(t, err)
			require.Contains(t, err.Error(), c.want)
		})
	}
}

// TestDIMACSRoundTrip: a CNF read as a program and written again has the
// same models over the original variables.
func TestDIMACSRoundTrip(t *testing.T) {
	for seed := uint64(0); seed < 30; seed++ {
		n := 6
		cls := engRandom3SAT(n, 3.0, seed)
		var in strings.Builder
		fmt.Fprintf(&in, "p cnf %d %d\n", n, len(cls))
		for _, c := range cls {
			for _, l := range c {
				fmt.Fprintf(&in, "%d ", l)
			}
			in.WriteString("0\n")
		}
		p, err := ReadDIMACS(strings.NewReader(in.String()), "r.cnf")
		require.NoError(t, err)
		var out bytes.Buffer
		require.NoError(t, WriteDIMACS(&out, p))
		vars, clauses := parseCNF(t, out.String())
		require.Equal(t, sortModels(cnfModels(n, n, cls)), sortModels(cnfModels(n, vars, clauses)), "seed %d", seed)
	}
}

func FuzzReadDIMACS(f *testing.F) {
	for _, s := range []string{
		"p cnf 3 2\n1 -2 0\n2 3 0\n",
		"c x\np cnf 0 0\n",
		"p cnf 2 1\n1\n-2 0\n%\n",
		"p cnf 1 1\n0\n",
		"p cnf 2 1\n1 x 0\n",
		"p cnf 268435456 1\n",
		"p cnf 2 1\n-9223372036854775808 0\n",
	} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, in string) {
		p, err := ReadDIMACS(strings.NewReader(in), "fuzz.cnf")
		if err != nil {
			require.Contains(t, err.Error(), "fuzz.cnf:")
			return
		}
		// Memory follows the input: at most 65,536 atoms beyond the
		// variables that appear in it, each of which takes two bytes or more.
		require.LessOrEqual(t, p.NumAtoms(), dimacsFreeVars+len(in)/2)
		var out bytes.Buffer
		require.NoError(t, WriteDIMACS(&out, p))
		q, err := ReadDIMACS(&out, "again.cnf")
		require.NoError(t, err)
		require.GreaterOrEqual(t, q.NumAtoms(), p.NumAtoms())
	})
}

// TestDIMACSAdderBoundsAgree: with every bound forced onto the adder
// network, the CNF's models still equal the engine's stable models.
func TestDIMACSAdderBoundsAgree(t *testing.T) {
	oldW, oldL := dimacsCounterWidth, dimacsCounterLimit
	dimacsCounterWidth, dimacsCounterLimit = 0, 0
	defer func() { dimacsCounterWidth, dimacsCounterLimit = oldW, oldL }()
	for seed := 0; seed < 150; seed++ {
		r := rand.New(rand.NewPCG(uint64(seed), 11))
		p := randomBoundProgram(r, 2+r.IntN(7))
		var buf bytes.Buffer
		require.NoError(t, WriteDIMACS(&buf, p))
		vars, clauses := parseCNF(t, buf.String())
		got := sortModels(cnfModels(p.NumAtoms(), vars, clauses))
		want := sortModels(engineModels(t, p))
		require.Equal(t, want, got, "seed %d\n%s", seed, buf.String())
	}
}

// BenchmarkWriteDIMACS: the completion of a synthetic timetabling program
// as CNF.
func BenchmarkWriteDIMACS(b *testing.B) {
	p := engTimetableLike(400, 40, 120, 1, false)
	b.ReportAllocs()
	for b.Loop() {
		var buf bytes.Buffer
		if err := WriteDIMACS(&buf, p); err != nil {
			b.Fatal(err)
		}
	}
}
