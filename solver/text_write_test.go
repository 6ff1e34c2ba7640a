package solver

import (
	"bytes"
	"flag"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// The -update flag rewrites golden files; another test file may define it.
func init() {
	if flag.Lookup("update") == nil {
		flag.Bool("update", false, "rewrite golden files in testdata")
	}
}

func updateGolden() bool {
	f := flag.Lookup("update")
	return f != nil && f.Value.String() == "true"
}

// roundTrip prints p, reads it back, checks that the program is the same
// and that printing again gives the same bytes; it returns the text.
func roundTrip(t *testing.T, p *Program) string {
	t.Helper()
	var first bytes.Buffer
	require.NoError(t, WriteProgram(&first, p))
	q, err := ReadProgram(bytes.NewReader(first.Bytes()), "round.lp")
	require.NoError(t, err, first.String())
	assertSameProgram(t, p, q)
	var second bytes.Buffer
	require.NoError(t, WriteProgram(&second, q))
	require.Equal(t, first.String(), second.String())
	return first.String()
}

// assertSameProgram compares two programs field by field, treating nil and
// empty slices alike.
func assertSameProgram(t *testing.T, want, got *Program) {
	t.Helper()
	require.Equal(t, want.NumAtoms(), got.NumAtoms(), "number of atoms")
	for a := Atom(1); int(a) <= want.NumAtoms(); a++ {
		require.Equal(t, want.Name(a), got.Name(a), "name of atom %d", a)
	}
	norm := func(p *Program) string {
		var b strings.Builder
		for _, r := range p.Rules {
			fmt.Fprintf(&b, "R%d%v;", r.Head, r.Body)
		}
		for _, c := range p.Choices {
			fmt.Fprintf(&b, "C%v%v;", c.Heads, c.Body)
		}
		for _, d := range p.Bounds {
			fmt.Fprintf(&b, "B%v%d,%d%v;", d.Lits, d.Lower, d.Upper, d.Cond)
		}
		for _, w := range p.Weaks {
			fmt.Fprintf(&b, "W%v%d@%d;", w.Body, w.Weight, w.Level)
		}
		fmt.Fprintf(&b, "S%v", p.Shows)
		return b.String()
	}
	require.Equal(t, norm(want), norm(got))
}

func TestWriteProgramRoundTrip(t *testing.T) {
	tests := []struct {
		name  string
		build func(p *Program)
	}{
		{"empty", func(p *Program) {}},
		{"unused atoms", func(p *Program) {
			a := p.NewAtom("a")
			p.NewAtom("b")
			p.NewAtom("")
			p.AddFact(a)
		}},
		{"atoms out of order", func(p *Program) {
			a, b := p.NewAtom("a"), p.NewAtom("b")
			p.AddRule(b, Pos(a))
		}},
		{"anonymous atoms", func(p *Program) {
			a, b, c := p.NewAtom(""), p.NewAtom(""), p.NewAtom("c")
			p.AddRule(a, Pos(b), Neg(c))
			p.AddChoice([]Atom{b, c}, 1, NoBound)
			p.Show(a)
		}},
		{"every kind", func(p *Program) {
			a, b, c := p.NewAtom("a"), p.NewAtom(`busy("R 204",mon)`), p.NewAtom("start(s12,3)")
			p.AddFact(a)
			p.AddRule(b, Pos(a), Neg(c))
			p.AddConstraint(Pos(b), Pos(c))
			p.AddConstraint()
			p.AddChoice([]Atom{b, c}, NoBound, NoBound, Pos(a))
			p.AddChoice([]Atom{c}, 0, 1)
			p.AddChoice(nil, NoBound, NoBound)
			p.AddBound([]Lit{Pos(a), Neg(b)}, 1, 2, Pos(c))
			p.AddBound([]Lit{Pos(a)}, NoBound, 0)
			p.AddBound([]Lit{Pos(a)}, 3, NoBound)
			p.AddBound([]Lit{Pos(a)}, 0, NoBound)
			p.AddBound(nil, NoBound, NoBound)
			p.AddWeak(-7, -1, Pos(a), Neg(c))
			p.AddWeak(1<<40, 1<<20)
			p.Show(c, a)
		}},
		{"standalone bounds between choices", func(p *Program) {
			a, b, c := p.NewAtom("a"), p.NewAtom("b"), p.NewAtom("c")
			p.AddBound([]Lit{Pos(a), Pos(b)}, NoBound, 1)
			p.AddChoice([]Atom{a, b}, 1, 1, Pos(c))
			p.AddBound([]Lit{Pos(c)}, 1, NoBound)
			p.AddChoice([]Atom{c}, NoBound, NoBound)
			p.AddChoice([]Atom{a, c}, 2, 2)
			p.AddBound([]Lit{Pos(b)}, 0, 0)
		}},
		{"bound that looks like a choice's", func(p *Program) {
			a, b := p.NewAtom("a"), p.NewAtom("b")
			p.AddChoice([]Atom{a, b}, NoBound, NoBound)
			p.AddBound([]Lit{Pos(b)}, 1, NoBound)
			p.AddBound([]Lit{Pos(a), Pos(b)}, 1, 1)
		}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := NewProgram()
			tc.build(p)
			roundTrip(t, p)
		})
	}
}

func TestWriteProgramLarge(t *testing.T) {
	// A chain with atoms created before the rules that use them in reverse,
	// so that the printer must write the atoms header.
	p := NewProgram()
	const n = 2000
	atoms := make([]Atom, n)
	for i := range atoms {
		atoms[i] = p.NewAtom(fmt.Sprintf("x(%d)", i))
	}
	for i := n - 1; i > 0; i-- {
		p.AddRule(atoms[i], Pos(atoms[i-1]), Neg(atoms[(i*7)%n]))
	}
	text := roundTrip(t, p)
	assert.True(t, strings.HasPrefix(text, "#atoms x(0); x(1);"))
}

func TestWriteProgramRejectsNames(t *testing.T) {
	tests := []struct {
		name  string
		names []string
		want  string
	}{
		{"not a term", []string{"R 204"}, `atom 1 is named "R 204": not a ground term`},
		{"reserved", []string{"_a1"}, "reserved for anonymous atoms"},
		{"blank", []string{"p(1, 2)"}, "would read back as p(1,2)"},
		{"duplicate", []string{"a", "b", "a"}, "atoms 1 and 3 are both named a"},
		{"keyword", []string{"not"}, "not a ground term"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := NewProgram()
			for _, n := range tc.names {
				p.AddFact(p.NewAtom(n))
			}
			var b bytes.Buffer
			err := WriteProgram(&b, p)
			require.Error(t, err)
			assert.Contains(t, err.Error(), tc.want)
			assert.Zero(t, b.Len(), "nothing is written on error")
		})
	}
}

func TestWriteProgramRejectsBadReferences(t *testing.T) {
	tests := []struct {
		name  string
		build func(p *Program)
		want  string
	}{
		{"rule head", func(p *Program) { p.AddRule(5) }, "rule 0 refers to an atom outside 1..1"},
		{"choice head", func(p *Program) { p.AddChoice([]Atom{0}, NoBound, NoBound) }, "choice 0"},
		{"bound limit", func(p *Program) { p.AddBound([]Lit{Pos(1)}, -3, NoBound) }, "negative limit"},
		{"bound literal", func(p *Program) { p.AddBound([]Lit{Pos(9)}, 1, NoBound) }, "bound 0 refers"},
		{"weak", func(p *Program) { p.AddWeak(1, 0, Neg(2)) }, "weak constraint 0"},
		{"show", func(p *Program) { p.Show(3) }, "show 0"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := NewProgram()
			p.NewAtom("a")
			tc.build(p)
			err := WriteProgram(&bytes.Buffer{}, p)
			require.Error(t, err)
			assert.Contains(t, err.Error(), tc.want)
		})
	}
}

// goldenProgram is a small program with every statement kind, as an
// encoder might build it.
func goldenProgram() *Program {
	p := NewProgram()
	s1, s2 := p.NewAtom("start(s1,mon1)"), p.NewAtom("start(s1,tue1)")
	b1, b2 := p.NewAtom(`busy("R 204",mon1)`), p.NewAtom(`busy("R 204",tue1)`)
	on := p.NewAtom("group(3)")
	p.AddFact(on)
	p.AddChoice([]Atom{s1, s2}, 1, 1)
	p.AddRule(b1, Pos(s1))
	p.AddRule(b2, Pos(s2))
	p.AddConstraint(Pos(b1), Pos(on))
	p.AddBound([]Lit{Pos(b1), Pos(b2)}, NoBound, 1, Pos(on))
	p.AddWeak(2, 1, Pos(s2))
	p.Show(s1, s2)
	return p
}

func TestWriteProgramCommentsGolden(t *testing.T) {
	p := goldenProgram()
	var b bytes.Buffer
	err := WriteProgramComments(&b, p, func(kind string, i int) string {
		switch {
		case kind == KindRule && i == 3:
			return "requirement group 3: room R 204 is closed on Monday morning\nsee Rooms!B7"
		case kind == KindBound:
			return fmt.Sprintf("bound %d: one meeting in R 204 at a time", i)
		case kind == KindChoice:
			return "section s1 meets once a week"
		}
		return ""
	})
	require.NoError(t, err)
	golden := filepath.Join("testdata", "comments.golden.lp")
	if updateGolden() {
		require.NoError(t, os.MkdirAll("testdata", 0o755))
		require.NoError(t, os.WriteFile(golden, b.Bytes(), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test -run Golden -update to create it")
	assert.Equal(t, string(want), b.String())

	// Comments are not read back: the program is the same.
	q, err := ReadProgram(bytes.NewReader(b.Bytes()), golden)
	require.NoError(t, err)
	assertSameProgram(t, p, q)
}

type failWriter struct{}

func (failWriter) Write([]byte) (int, error) { return 0, fmt.Errorf("disk full") }

func TestWriteProgramReportsWriteErrors(t *testing.T) {
	err := WriteProgram(failWriter{}, goldenProgram())
	require.Error(t, err)
	assert.Contains(t, err.Error(), "disk full")
}

func BenchmarkWriteProgram(b *testing.B) {
	p := chainProgram(200000)
	b.ReportAllocs()
	for b.Loop() {
		if err := WriteProgram(&bytes.Buffer{}, p); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkReadProgram(b *testing.B) {
	var buf bytes.Buffer
	if err := WriteProgram(&buf, chainProgram(200000)); err != nil {
		b.Fatal(err)
	}
	b.SetBytes(int64(buf.Len()))
	b.ReportAllocs()
	for b.Loop() {
		if _, err := ReadProgram(bytes.NewReader(buf.Bytes()), "chain.lp"); err != nil {
			b.Fatal(err)
		}
	}
}
