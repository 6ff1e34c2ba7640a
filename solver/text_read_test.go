package solver

import (
	"errors"
	"fmt"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// printed reads src and prints the program back, for compact expectations.
func printed(t *testing.T, src string) string {
	t.Helper()
	p, err := ReadProgram(strings.NewReader(src), "t.lp")
	require.NoError(t, err)
	var b strings.Builder
	require.NoError(t, WriteProgram(&b, p))
	return b.String()
}

func TestReadProgramForms(t *testing.T) {
	tests := []struct {
		name, src, want string
	}{
		{"fact", "a.", "a.\n"},
		{"rule", "a :- b, not c.", "a :- b, not c.\n"},
		{"constraint", ":- a, b.", ":- a, b.\n"},
		{"empty constraint", ":- .", ":- .\n"},
		{"choice", "{a; b; c} :- d.", "{a; b; c} :- d.\n"},
		{"choice without body", "{a; b}.", "{a; b}.\n"},
		{"empty choice", "{}.", "{}.\n"},
		{"choice bounds", "1 {a; b} 2 :- c.", "1 {a; b} 2 :- c.\n"},
		{"choice exactly", "{a; b} = 1.", "{a; b} = 1.\n"},
		{"choice at most", "{a; b} <= 1.", "{a; b} 1.\n"},
		{"choice at least", "1 <= {a; b}.", "1 {a; b}.\n"},
		{"choice at least right", "{a; b} >= 1.", "1 {a; b}.\n"},
		{"choice strict", "0 < {a; b; c} < 3.", "1 {a; b; c} 2.\n"},
		{"choice zero lower", "0 {a; b}.", "{a; b}.\n"},
		{"choice zero lower with upper", "0 {a; b} 1.", "0 {a; b} 1.\n"},
		{"bound at most", ":- 2 {a; b; c}, d.", ":- 2 {a; b; c}, d.\n"},
		{"bound at least", ":- {a; b} 0, d.", ":- {a; b} 0, d.\n"},
		{"bound count after literals", ":- d, 2 {a; b; c}.", "#atoms d; a; b; c.\n:- 2 {a; b; c}, d.\n"},
		{"bound negated", ":- not 1 {a; not b} 2, d.", ":- not 1 {a; not b} 2, d.\n"},
		{"bound negated lower", ":- not 2 {a; b; c}.", ":- {a; b; c} 1.\n"},
		{"bound negated upper", ":- not {a; b; c} 1.", ":- 2 {a; b; c}.\n"},
		{"bound trivial", ":- not {a}.", ":- not {a}.\n"},
		{"bound zero lower", ":- not 0 {a}.", ":- not 0 {a}.\n"},
		{"weak", ":~ a, not b. [3@1]", ":~ a, not b. [3@1]\n"},
		{"weak default level", ":~ a. [3]", ":~ a. [3@0]\n"},
		{"weak negative", ":~ a. [-3@-2]", ":~ a. [-3@-2]\n"},
		{"weak empty body", ":~ . [1@0]", ":~ . [1@0]\n"},
		{"show", "a. #show a.", "a.\n#show a.\n"},
		{"terms", `start(s12,3) :- busy("R 204", mon).`, `start(s12,3) :- busy("R 204",mon).` + "\n"},
		{"nested terms", "p(f(g(1,-2)),\"x\\\"y\",(a,b)).", "p(f(g(1,-2)),\"x\\\"y\",(a,b)).\n"},
		{"leading zeros", "p(007, -0).", "p(7,0).\n"},
		{"primes and underscores", "a' :- b_c, _d.", "a' :- b_c, _d.\n"},
		{"comments", "% head\na. %* block\n over lines *% b :- a. % tail", "a.\nb :- a.\n"},
		{"anonymous", "_a7 :- _a3.", "_a1 :- _a2.\n"},
		{"same name one atom", "a :- b. b :- a.", "a :- b.\nb :- a.\n"},
		{"atoms header", "#atoms b; a. a :- b.", "#atoms b; a.\na :- b.\n"},
		{"header unused atom", "#atoms a; b. a.", "#atoms a; b.\na.\n"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			assert.Equal(t, tc.want, printed(t, tc.src))
		})
	}
}

func TestReadProgramStructure(t *testing.T) {
	p, err := ReadProgram(strings.NewReader(`
		q :- p, not r.
		1 {p; r} 1 :- s.
		:- 2 {p; q; not r}, s.
		:- {p; q} 0.
		:~ q. [5@2]
		s.
		#show q.`), "t.lp")
	require.NoError(t, err)
	q, pp, r, s := Atom(1), Atom(2), Atom(3), Atom(4)
	assert.Equal(t, 4, p.NumAtoms())
	assert.Equal(t, []string{"q", "p", "r", "s"}, []string{p.Name(1), p.Name(2), p.Name(3), p.Name(4)})
	assert.Equal(t, []Rule{{Head: q, Body: []Lit{Pos(pp), Neg(r)}}, {Head: s}}, p.Rules)
	assert.Equal(t, []Choice{{Heads: []Atom{pp, r}, Body: []Lit{Pos(s)}}}, p.Choices)
	assert.Equal(t, []Bound{
		{Lits: []Lit{Pos(pp), Pos(r)}, Lower: 1, Upper: 1, Cond: []Lit{Pos(s)}},
		{Lits: []Lit{Pos(pp), Pos(q), Neg(r)}, Lower: NoBound, Upper: 1, Cond: []Lit{Pos(s)}},
		{Lits: []Lit{Pos(pp), Pos(q)}, Lower: 1, Upper: NoBound},
	}, p.Bounds)
	assert.Equal(t, []Weak{{Body: []Lit{Pos(q)}, Weight: 5, Level: 2}}, p.Weaks)
	assert.Equal(t, []Atom{q}, p.Shows)
	assert.Equal(t, "", p.Name(0))
}

// errMark marks, in test inputs, the position where an error is expected.
const errMark = "¦"

// markedPositions strips the marks from src and returns the 1-based
// line:col of each mark (columns in characters).
func markedPositions(src string) (string, []string) {
	var out strings.Builder
	var pos []string
	line, col := 1, 1
	for len(src) > 0 {
		if strings.HasPrefix(src, errMark) {
			pos = append(pos, fmt.Sprintf("%d:%d", line, col))
			src = src[len(errMark):]
			continue
		}
		r := []rune(src)[0]
		out.WriteRune(r)
		src = src[len(string(r)):]
		if r == '\n' {
			line, col = line+1, 1
		} else {
			col++
		}
	}
	return out.String(), pos
}

func TestReadProgramErrors(t *testing.T) {
	tests := []struct {
		name, src string
		msgs      []string // a part of each message, in order
	}{
		{"missing dot", "a :- b ¦c.", []string{`expected "." after rule body`}},
		{"missing dot at end", "a :- b¦", []string{`expected "." after rule body, found end of input`}},
		{"head then junk", "a ¦b.", []string{`expected ":-" or "." after the head`}},
		{"variable", "p(¦X) :- q.", []string{"X is a variable"}},
		{"variable head", "¦X.", []string{"X is a variable"}},
		{"underscore", "a :- ¦_.", []string{"_ is a variable"}},
		{"count in rule body", "a :- ¦2 {b; c}.", []string{"only in the body of a constraint"}},
		{"two counts", ":- 1 {a}, ¦2 {b}.", []string{"only one count"}},
		{"two-sided positive count", ":- ¦1 {a; b} 2.", []string{"cannot forbid a count between two limits"}},
		{"zero count", ":- ¦0 {a; b}, c.", []string{"always holds"}},
		{"not in choice", "{a; ¦not b}.", []string{"must be atoms"}},
		{"missing semicolon", "{a ¦b}.", []string{`expected "}" to close`}},
		{"negative upper", "{a} < ¦0.", []string{"no count is below 0"}},
		{"two lower limits", "1 {a} >= ¦2.", []string{"already has a lower limit"}},
		{"big number", "{a} ¦99999999999.", []string{"too large"}},
		{"weak without weight", ":~ a. ¦b.", []string{`expected "[" to open the weight`}},
		{"weak terms", ":~ a. [1@0¦, x]", []string{"terms after the weight"}},
		{"weak weight range", ":~ a. [¦99999999999999999999@1]", []string{"weight 99999999999999999999 is out of range"}},
		{"weights adding past int64", ":~ a. [4611686018427387904@1]\n:~ b. [¦4611686018427387904@1]", []string{"weigh more than 4611686018427387904 in total"}},
		{"negative weights adding past int64", ":~ a. [-4611686018427387904]\n:~ b. [¦-1]", []string{"weigh more than"}},
		{"most negative weight", ":~ a. [¦-9223372036854775808@0]", []string{"weight -9223372036854775808 makes"}},
		{"long number shortened", "{a} ¦" + strings.Repeat("9", 1000) + ".", []string{`number 9999999999999999999999999999999999999999… (1000 characters) is too large`}},
		{"unknown directive", "¦#const n = 3.", []string{"unknown directive #const"}},
		{"show signature", "#show p¦/1.", []string{`expected "." after #show atom`}},
		{"unclosed string", "p(¦\"abc) :- q.\nr.", []string{"string is not closed"}},
		{"unclosed block", "a. ¦%* never closed", []string{"block comment"}},
		{"stray character", "a :- ¦$b.", []string{`expected an atom or "not"`}},
		{"empty args", "p(¦).", []string{"empty argument list"}},
		{"several errors", "a :- b ¦c.\nd.\ne :- ¦.\n:- f ¦g.", []string{`expected "." after rule body`, `expected an atom or "not"`, `expected "." after constraint body`}},
		{"unicode columns", "p(\"é\") :- ¦€.", []string{`expected an atom or "not"`}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src, pos := markedPositions(tc.src)
			p, err := ReadProgram(strings.NewReader(src), "t.lp")
			require.Error(t, err)
			assert.Nil(t, p)
			assert.True(t, errors.Is(err, ErrSyntax))
			var list SyntaxErrors
			require.True(t, errors.As(err, &list))
			if tc.msgs == nil {
				return
			}
			got := make([]string, len(list))
			for i, e := range list {
				got[i] = fmt.Sprintf("%d:%d", e.Line, e.Col)
				assert.True(t, strings.HasPrefix(e.Error(), "t.lp:"+got[i]+": "), e.Error())
			}
			if len(tc.msgs) > 0 {
				require.Equal(t, pos, got, err.Error())
				for i, m := range tc.msgs {
					assert.Contains(t, list[i].Msg, m)
				}
			}
		})
	}
}

func TestReadProgramErrorLimit(t *testing.T) {
	src := strings.Repeat("a :- .\n", 50)
	_, err := ReadProgram(strings.NewReader(src), "many.lp")
	var list SyntaxErrors
	require.True(t, errors.As(err, &list))
	assert.Len(t, list, maxSyntaxErrors+1)
	assert.Contains(t, list[maxSyntaxErrors].Msg, "too many errors")
}

func TestReadProgramDeepNesting(t *testing.T) {
	src := "p" + strings.Repeat("(f", 500) + strings.Repeat(")", 500) + "."
	_, err := ReadProgram(strings.NewReader(src), "deep.lp")
	require.Error(t, err)
	assert.Contains(t, err.Error(), "nested more than")
}

func TestReadProgramUnnamedInput(t *testing.T) {
	_, err := ReadProgram(strings.NewReader("a :- ."), "")
	require.Error(t, err)
	assert.True(t, strings.HasPrefix(err.Error(), "input:1:6: "), err.Error())
}

func TestCheckName(t *testing.T) {
	tests := []struct {
		name string
		ok   bool
	}{
		{"p", true},
		{"start(s12,3)", true},
		{`busy("R 204",mon)`, true},
		{"p(-3)", true},
		{"p((a,b))", true},
		{"_x", true},
		{"", false},
		{"P", false},
		{"not", false},
		{"p(3, 4)", false},
		{"p(03)", false},
		{"p.", false},
		{"_a17", false},
		{"_a0", true},
		{"p(0,-1,\"a\\\"b\")", true},
		{"p(-0)", false},
		{"p(a,)", false},
		{"p(a))", false},
		{"_", false},
		{"__b", true},
		{"R 204", false},
		{"p(", false},
		{`p("x)`, false},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			msg := checkName(tc.name)
			assert.Equal(t, tc.ok, msg == "", msg)
			assert.Equal(t, tc.ok, slowCheckName(tc.name) == "", "slow path")
		})
	}
}

func TestReadModel(t *testing.T) {
	p := mustRead(t, `start(s12,3) :- not b. b :- not start(s12,3). c(-1,"x y"). #atoms _a9.`)
	tests := []struct {
		name, src string
		want      []Atom
		errs      []string // "line:col message part"
	}{
		{"blanks", "b c(-1,\"x y\")", []Atom{2, 3}, nil},
		{"commas", "start(s12, 03), b,c(-1,\"x y\").", []Atom{1, 2, 3}, nil},
		{"semicolons and lines", "b;\n% note\nstart(s12,3)", []Atom{2, 1}, nil},
		{"anonymous", "_a4", []Atom{4}, nil},
		{"empty", "  ", nil, nil},
		{"unknown", "b, ¦d, ¦start(s12,4)", nil, []string{"d is not an atom of the program", "start(s12,4) is not an atom"}},
		{"syntax", "b ¦) c", nil, []string{"expected an atom, found \")\""}},
		{"variable", "¦X", nil, []string{"X is a variable"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src, pos := markedPositions(tc.src)
			got, err := ReadModel(strings.NewReader(src), p, "m.txt")
			if tc.errs == nil {
				require.NoError(t, err)
				assert.Equal(t, tc.want, got)
				return
			}
			var list SyntaxErrors
			require.True(t, errors.As(err, &list), "%v", err)
			require.Len(t, list, len(tc.errs), err.Error())
			for i, e := range list {
				assert.Equal(t, pos[i], fmt.Sprintf("%d:%d", e.Line, e.Col))
				assert.Contains(t, e.Msg, tc.errs[i])
				assert.True(t, strings.HasPrefix(e.Error(), "m.txt:"))
			}
		})
	}
}

// endless is a reader that never ends, like /dev/zero.
type endless struct{}

func (endless) Read(p []byte) (int, error) {
	for i := range p {
		p[i] = 'a'
	}
	return len(p), nil
}

// TestReadBoundedEndless: an endless input stops at the limit with a
// positioned syntax error instead of exhausting memory.
func TestReadBoundedEndless(t *testing.T) {
	_, err := readBounded(endless{}, "zero.lp", 1000)
	require.Error(t, err)
	assert.True(t, errors.Is(err, ErrSyntax))
	assert.Contains(t, err.Error(), "zero.lp:1:1: the input is larger than 1000 bytes")
	data, err := readBounded(strings.NewReader("a."), "small.lp", 1000)
	require.NoError(t, err)
	assert.Equal(t, "a.", string(data))
}
