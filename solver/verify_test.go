package solver

import (
	"errors"
	"fmt"
	"math"
	"math/big"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// mustRead reads program text or fails the test.
func mustRead(t testing.TB, src string) *Program {
	t.Helper()
	p, err := ReadProgram(strings.NewReader(src), "t.lp")
	if err != nil {
		t.Fatal(err)
	}
	return p
}

// atomsNamed looks atoms up by name.
func atomsNamed(t testing.TB, p *Program, names ...string) []Atom {
	t.Helper()
	var out []Atom
	for _, n := range names {
		found := false
		for a := Atom(1); int(a) <= p.NumAtoms(); a++ {
			if p.Name(a) == n {
				out = append(out, a)
				found = true
				break
			}
		}
		if !found {
			t.Fatalf("no atom %s", n)
		}
	}
	return out
}

func TestVerify(t *testing.T) {
	tests := []struct {
		name  string
		src   string
		model []string
		kinds []ProblemKind // nil: a stable model
		msgs  []string      // a part of each problem's message
	}{
		// Gelfond & Lifschitz (1988): p :- p. has only the stable model {}.
		{"self loop empty", "p :- p.", nil, nil, nil},
		{"self loop unsupported", "p :- p.", []string{"p"}, []ProblemKind{Unsupported},
			[]string{"atom p is true but has no support in the reduct (no rule derives it: rule 0 `p :- p.` needs p"}},
		{"positive loop", "a :- b. b :- a. a :- not c. c :- not a.", []string{"a", "b"}, nil, nil},
		{"positive loop other", "a :- b. b :- a. a :- not c. c :- not a.", []string{"c"}, nil, nil},
		{"positive loop unfounded", "a :- b. b :- a. a :- not c. c :- not a.", []string{"a", "b", "c"},
			[]ProblemKind{Unsupported, Unsupported, Unsupported}, []string{"atom a is true", "atom b is true", "atom c is true"}},
		{"even loop both", "a :- not b. b :- not a.", []string{"a", "b"}, []ProblemKind{Unsupported, Unsupported},
			[]string{"blocked by a true negated atom: rule 0 `a :- not b.`", "atom b"}},
		{"even loop none", "a :- not b. b :- not a.", nil, []ProblemKind{Unwanted, Unwanted},
			[]string{"atom a is derived by rule 0 (`a :- not b.`) but false in the candidate", "atom b is derived by rule 1"}},
		{"non-minimal", "a :- b. b.", []string{"a", "b"}, nil, nil},
		{"atom without rules", "a. #show c.", []string{"a", "c"}, []ProblemKind{Unsupported}, []string{"atom c is true but has no support in the reduct (no rule has it as head)"}},
		{"fact missing", "a. b :- a.", []string{"a"}, []ProblemKind{Unwanted}, []string{"atom b is derived by rule 1 (`b :- a.`)"}},
		{"constraint", "a. b :- a. :- a, b.", []string{"a", "b"}, []ProblemKind{Violated},
			[]string{"constraint at rule 2 (`:- a, b.`) is violated"}},
		{"constraint with negation", "{a}. :- not a.", nil, []ProblemKind{Violated}, []string{"rule 0"}},
		{"constraint fine", "{a}. :- not a.", []string{"a"}, nil, nil},
		{"choice free", "{a; b} :- c. c.", []string{"c", "b"}, nil, nil},
		{"choice without body", "{a; b} :- c. {c}.", []string{"a"}, []ProblemKind{Unsupported},
			[]string{"choice 0 needs c"}},
		{"choice blocked", "{a} :- not c. c.", []string{"a", "c"}, []ProblemKind{Unsupported}, []string{"blocked by a true negated atom: choice 0"}},
		{"choice with loop", "{a}. b :- a. a :- b.", []string{"a", "b"}, nil, nil},
		{"choice upper", "{a; b; c} 1.", []string{"a", "b"}, []ProblemKind{OutOfBounds}, []string{"bound 0 has 2 true literals, more than 1"}},
		{"choice lower", "2 {a; b; c}.", []string{"a"}, []ProblemKind{OutOfBounds}, []string{"bound 0 has 1 true literal, fewer than 2"}},
		{"choice exactly", "{a; b; c} = 2.", []string{"a", "c"}, nil, nil},
		{"bound inactive", "{a; b; d}. :- 2 {a; b}, d.", []string{"a", "b"}, nil, nil},
		{"bound active", "{a; b; d}. :- 2 {a; b}, d.", []string{"a", "b", "d"}, []ProblemKind{OutOfBounds}, []string{"more than 1"}},
		{"bound negative literals", "{a; b}. :- not 1 {not a; not b} 1.", []string{"a"}, nil, nil},
		{"bound negative literals fail", "{a; b}. :- not 1 {not a; not b} 1.", nil, []ProblemKind{OutOfBounds}, []string{"2 true literals, more than 1"}},
		{"bound lower with cond", "{a; b; d}. :- {a; b} 0, d.", []string{"d"}, []ProblemKind{OutOfBounds}, []string{"fewer than 1"}},
		{"bound counts a set", "{a; b}. :- 2 {a; a; not b}.", []string{"a", "b"}, nil, nil},
		{"bound counts a set fail", "{a; b}. :- 2 {a; a; not b}.", []string{"a"}, []ProblemKind{OutOfBounds}, []string{"2 true literals"}},
		{"weak ignored", "{a}. :~ a. [3@1]", []string{"a"}, nil, nil},
		{"every problem", "a :- not b. {b}. c :- c. :- b.", []string{"b", "c"},
			[]ProblemKind{Unsupported, Violated}, []string{"atom c", "constraint at rule 2"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			p := mustRead(t, tc.src)
			err := Verify(p, atomsNamed(t, p, tc.model...))
			if tc.kinds == nil {
				require.NoError(t, err)
				return
			}
			var ve *VerifyError
			require.True(t, errors.As(err, &ve), "want a VerifyError, got %v", err)
			require.Len(t, ve.Problems, len(tc.kinds), err.Error())
			for i, pr := range ve.Problems {
				assert.Equal(t, tc.kinds[i], pr.Kind, pr.Msg)
				assert.Contains(t, pr.Msg, tc.msgs[i])
			}
			assert.Contains(t, err.Error(), ve.Problems[0].Msg)
		})
	}
}

func TestVerifyErrorSummary(t *testing.T) {
	p := mustRead(t, "a :- not b. b :- not a. c :- not a.")
	err := Verify(p, nil)
	require.Error(t, err)
	assert.Equal(t, "not a stable model: atom a is derived by rule 0 (`a :- not b.`) but false in the candidate (and 2 more problems)", err.Error())
}

func TestVerifyProblemFields(t *testing.T) {
	p := mustRead(t, "a. b :- a. :- a, b. {c} 0.")
	b, c := atomsNamed(t, p, "b", "c")[0], atomsNamed(t, p, "c")[0]
	err := Verify(p, []Atom{c, 1})
	var ve *VerifyError
	require.True(t, errors.As(err, &ve))
	assert.Equal(t, []Problem{
		{Kind: Unwanted, Atom: b, Index: 1, Msg: ve.Problems[0].Msg},
		{Kind: OutOfBounds, Index: 0, Msg: ve.Problems[1].Msg},
	}, ve.Problems)
}

func TestVerifyBadInput(t *testing.T) {
	p := mustRead(t, "a.")
	err := Verify(p, []Atom{1, 7, 0})
	var ve *VerifyError
	require.True(t, errors.As(err, &ve))
	require.Len(t, ve.Problems, 2)
	assert.Equal(t, BadAtom, ve.Problems[0].Kind)
	assert.Contains(t, ve.Problems[0].Msg, "atom 7 is not an atom of the program (atoms are 1..1)")

	bad := NewProgram()
	bad.NewAtom("a")
	bad.AddRule(1, Pos(4))
	err = Verify(bad, []Atom{1})
	require.Error(t, err)
	assert.False(t, errors.As(err, &ve))
	assert.Contains(t, err.Error(), "malformed program: rule 0 refers to atom 4 outside 1..1")
}

func TestVerifyModelOrderAndRepeats(t *testing.T) {
	p := mustRead(t, "a. b :- a. c :- b, not d.")
	assert.NoError(t, Verify(p, []Atom{3, 1, 2, 1, 3}))
}

func TestCostAndLevels(t *testing.T) {
	p := mustRead(t, `
		{a; b; c}.
		:~ a. [3@1]
		:~ a. [3@1]
		:~ b, not c. [5@2]
		:~ not a. [1@0]
		:~ c. [-2@1]
	`)
	assert.Equal(t, []int{2, 1, 0}, Levels(p))
	tests := []struct {
		model []string
		want  []int64
	}{
		{nil, []int64{0, 0, 1}},
		{[]string{"a"}, []int64{0, 6, 0}},
		{[]string{"a", "b"}, []int64{5, 6, 0}},
		{[]string{"a", "b", "c"}, []int64{0, 4, 0}},
	}
	for _, tc := range tests {
		t.Run(strings.Join(tc.model, ","), func(t *testing.T) {
			assert.Equal(t, tc.want, Cost(p, atomsNamed(t, p, tc.model...)))
		})
	}
	assert.Empty(t, Levels(mustRead(t, "a.")))
	assert.Empty(t, Cost(mustRead(t, "a."), []Atom{1}))
}

// chainProgram builds x(0). x(i) :- x(i-1), not y(i). {y(i)} :- x(i-1).
// with n atoms x and n-1 atoms y; its stable model with every y false makes
// every x true.
func chainProgram(n int) *Program {
	p := NewProgram()
	x := make([]Atom, n)
	for i := range x {
		x[i] = p.NewAtom(fmt.Sprintf("x(%d)", i))
	}
	p.AddFact(x[0])
	for i := 1; i < n; i++ {
		y := p.NewAtom(fmt.Sprintf("y(%d)", i))
		p.AddRule(x[i], Pos(x[i-1]), Neg(y))
		p.AddChoice([]Atom{y}, NoBound, NoBound, Pos(x[i-1]))
		p.AddBound([]Lit{Pos(x[i]), Pos(y)}, NoBound, 1, Pos(x[i-1]))
	}
	return p
}

func TestVerifyChain(t *testing.T) {
	const n = 1000
	p := chainProgram(n)
	model := make([]Atom, n)
	for i := range model {
		model[i] = Atom(i + 1)
	}
	require.NoError(t, Verify(p, model))
	// Dropping x(500): it is still derived.
	err := Verify(p, append(append([]Atom(nil), model[:500]...), model[501:]...))
	var ve *VerifyError
	require.True(t, errors.As(err, &ve))
	require.Len(t, ve.Problems, 1)
	assert.Equal(t, Problem{Kind: Unwanted, Atom: 501, Index: 500, Msg: ve.Problems[0].Msg}, ve.Problems[0])
	// Adding y(700) blocks x(700), so x(700..999) lose support, and the
	// bound at step 700 sees both x(700) and y(700).
	y700 := atomsNamed(t, p, "y(700)")[0]
	err = Verify(p, append(append([]Atom(nil), model...), y700))
	require.True(t, errors.As(err, &ve))
	require.Len(t, ve.Problems, n-700+1)
	assert.Equal(t, Unsupported, ve.Problems[0].Kind)
	assert.Equal(t, Atom(701), ve.Problems[0].Atom)
	assert.Equal(t, Problem{Kind: OutOfBounds, Index: 699, Msg: ve.Problems[n-700].Msg}, ve.Problems[n-700])
}

func BenchmarkVerifyChain(b *testing.B) {
	const n = 200000
	p := chainProgram(n)
	model := make([]Atom, n)
	for i := range model {
		model[i] = Atom(i + 1)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := Verify(p, model); err != nil {
			b.Fatal(err)
		}
	}
}

func TestProblemKindString(t *testing.T) {
	assert.Equal(t, "unsupported", Unsupported.String())
	assert.Equal(t, "unwanted", Unwanted.String())
	assert.Equal(t, "violated", Violated.String())
	assert.Equal(t, "out-of-bounds", OutOfBounds.String())
	assert.Equal(t, "bad-atom", BadAtom.String())
	assert.Equal(t, "unknown", ProblemKind(0).String())
}

// TestCheckedCostOverflow adds weights of 2^62 with an independent sum in
// math/big and expects the overflow to be reported, never a wrapped value.
func TestCheckedCostOverflow(t *testing.T) {
	for _, tc := range []struct {
		name    string
		weights []int64
	}{
		{"two of 2^62", []int64{1 << 62, 1 << 62}},
		{"fits exactly", []int64{1 << 62, 1<<62 - 1}},
		{"one past", []int64{1 << 62, 1<<62 - 1, 1}},
		{"negative past MinInt64", []int64{math.MinInt64, -1}},
		{"negative fits", []int64{math.MinInt64 + 1, -1}},
	} {
		t.Run(tc.name, func(t *testing.T) {
			p := NewProgram()
			a := p.NewAtom("a")
			p.AddChoice([]Atom{a}, NoBound, NoBound)
			for _, w := range tc.weights {
				p.AddWeak(w, 0, Pos(a))
			}
			want := new(big.Int)
			for _, w := range tc.weights {
				want.Add(want, big.NewInt(w))
			}
			cost, err := CheckedCost(p, []Atom{a})
			if want.IsInt64() {
				require.NoError(t, err)
				assert.Equal(t, want.Int64(), cost[0])
				return
			}
			require.ErrorIs(t, err, ErrCostOverflow)
			if want.Sign() > 0 {
				assert.Equal(t, int64(math.MaxInt64), Cost(p, []Atom{a})[0])
			} else {
				assert.Equal(t, int64(math.MinInt64), Cost(p, []Atom{a})[0])
			}
		})
	}
}
