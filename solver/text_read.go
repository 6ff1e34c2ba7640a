package solver

import (
	"errors"
	"fmt"
	"io"
	"math"
	"sort"
	"strconv"
	"strings"
)

// ErrSyntax is the sentinel for errors in program text: errors.Is(err,
// ErrSyntax) holds for every *SyntaxError and for a SyntaxErrors list.
var ErrSyntax = errors.New("syntax error in program text")

// SyntaxError is one error in program text, at a 1-based line and column
// (counted in characters). Its text form is "file.lp:12:5: message".
type SyntaxError struct {
	File string
	Line int
	Col  int
	Msg  string
}

// Error gives "file:line:col: message".
func (e *SyntaxError) Error() string {
	return fmt.Sprintf("%s:%d:%d: %s", e.File, e.Line, e.Col, e.Msg)
}

// Is makes errors.Is(e, ErrSyntax) true.
func (e *SyntaxError) Is(target error) bool { return target == ErrSyntax }

// SyntaxErrors is every error found in one read, sorted by position.
type SyntaxErrors []*SyntaxError

// Error gives one error per line.
func (l SyntaxErrors) Error() string {
	parts := make([]string, len(l))
	for i, e := range l {
		parts[i] = e.Error()
	}
	return strings.Join(parts, "\n")
}

// Unwrap gives the single errors, for errors.Is and errors.As.
func (l SyntaxErrors) Unwrap() []error {
	errs := make([]error, len(l))
	for i, e := range l {
		errs[i] = e
	}
	return errs
}

// maxSyntaxErrors is how many errors one read reports before giving up.
const maxSyntaxErrors = 20

// ReadProgram reads a ground program in the standard rule syntax; name is
// used in error positions (for example the file name). Accepted statements:
//
//	a.                          fact
//	a :- b, not c.              normal rule
//	:- a, not b.                integrity constraint
//	{a; b; c} :- d.             choice rule (the body may be omitted)
//	1 {a; b} 2 :- c.            choice with bounds; also {a; b} = 1,
//	                            {a; b} <= 1, 1 <= {a; b}, {a; b} >= 1
//	:- 2 {a; b; c}, d.          bound: at most 1 of a, b, c when d
//	:- {a; b} 0, d.             bound: at least 1 of a, b when d
//	:- not 1 {a; not b} 2, d.   bound: 1 to 2 of the literals when d
//	:~ a, not b. [3@1]          weak constraint, weight 3 at level 1 ([3] is level 0)
//	#show a.                    atom of interest
//	#atoms a; b.                introduces atoms in this order (WriteProgram's header)
//
// Comments run from "%" to the end of the line, or from "%*" to "*%".
// Atoms are ground terms: p, start(s12,3), busy("R 204",mon); the name of
// an atom is its text without blanks outside quotes and with leading zeros
// of numbers removed, and equal names are one atom. Atoms are numbered in
// order of first occurrence. The reserved form _a17 denotes an anonymous
// atom (the form WriteProgram uses for atoms without a name).
//
// On bad input ReadProgram returns a nil program and a SyntaxErrors list
// (up to 20 errors, each with its position); reading goes on after an error
// at the next ".".
func ReadProgram(r io.Reader, name string) (*Program, error) {
	if name == "" {
		name = "input"
	}
	data, err := readBounded(r, name, MaxTextBytes)
	if err != nil {
		return nil, err
	}
	text := string(data)
	ps := &parser{file: name, prog: NewProgram(), atoms: make(map[string]Atom)}
	ps.sc = newScanner(text, ps.errorAt)
	ps.tok = ps.sc.next()
	ps.program()
	if len(ps.errs) > 0 {
		sort.SliceStable(ps.errs, func(i, j int) bool {
			a, b := ps.errs[i], ps.errs[j]
			return a.Line < b.Line || a.Line == b.Line && a.Col < b.Col
		})
		return nil, ps.errs
	}
	return ps.prog, nil
}

// errBail unwinds the parse of one statement after an error was recorded.
var errBail = errors.New("bail")

// parser is a recursive-descent parser with one token of lookahead.
type parser struct {
	file  string
	sc    *scanner
	tok   token // current token
	prog  *Program
	atoms map[string]Atom // name (or reserved _aN form) → atom
	errs  SyntaxErrors
	full  bool   // maxSyntaxErrors reached
	name  []byte // scratch: the canonical text of the term being parsed
	body  []Lit  // scratch: the body of the statement (Add methods copy it)
	elems []Lit  // scratch: the elements of a count
	heads []Atom // scratch: the heads of a choice
	// levelWeight is the total absolute weight of the weak constraints read
	// so far, by level; it stays at most MaxLevelWeight.
	levelWeight map[int]int64
}

// MaxLevelWeight bounds the total absolute weight of the weak constraints
// of one priority level in a program read from text, so that every cost
// and every difference of two costs fits an int64.
const MaxLevelWeight = 1 << 62

func (ps *parser) errorAt(line, col int, msg string) {
	if ps.full {
		return
	}
	if n := len(ps.errs); n > 0 && ps.errs[n-1].Line == line && ps.errs[n-1].Col == col {
		return // one error per position
	}
	if len(ps.errs) == maxSyntaxErrors {
		ps.errs = append(ps.errs, &SyntaxError{File: ps.file, Line: line, Col: col, Msg: "too many errors; fix these first"})
		ps.full = true
		return
	}
	ps.errs = append(ps.errs, &SyntaxError{File: ps.file, Line: line, Col: col, Msg: msg})
}

// fail records an error at token t and abandons the statement.
func (ps *parser) fail(t token, format string, args ...any) {
	ps.errorAt(t.line, t.col, fmt.Sprintf(format, args...))
	panic(errBail)
}

func (ps *parser) advance() token {
	t := ps.tok
	ps.tok = ps.sc.next()
	return t
}

func (ps *parser) is(text string) bool {
	return ps.tok.kind == tPunct && ps.tok.text == text
}

func (ps *parser) expect(text, what string) token {
	if !ps.is(text) {
		ps.fail(ps.tok, "expected %q %s, found %s", text, what, ps.tok.describe())
	}
	return ps.advance()
}

func (ps *parser) program() {
	for ps.tok.kind != tEOF && !ps.full {
		ps.statementSafe()
	}
}

// statementSafe parses one statement; after an error it skips to just past
// the next "." so that later statements are still checked.
func (ps *parser) statementSafe() {
	defer func() {
		if r := recover(); r != nil {
			if r != errBail {
				panic(r)
			}
			for ps.tok.kind != tEOF && !ps.is(".") {
				ps.advance()
			}
			if ps.is(".") {
				ps.advance()
			}
		}
	}()
	ps.statement()
}

func (ps *parser) statement() {
	t := ps.tok
	switch {
	case t.kind == tPunct && t.text == ":-":
		ps.advance()
		ps.constraint()
	case t.kind == tPunct && t.text == ":~":
		ps.advance()
		ps.weak()
	case t.kind == tDirective:
		ps.directive()
	case t.kind == tNum || t.kind == tPunct && t.text == "{":
		ps.choice()
	case t.kind == tIdent || t.kind == tVar:
		head := ps.atom()
		if ps.is(".") {
			ps.advance()
			ps.prog.AddFact(head)
			return
		}
		ps.expect(":-", "or \".\" after the head of a rule")
		body := ps.literals("rule body", false)
		ps.expect(".", "after rule body")
		ps.prog.AddRule(head, body...)
	default:
		ps.fail(t, "expected a rule, a constraint \":-\", a weak constraint \":~\" or a directive, found %s", t.describe())
	}
}

// literals parses "l1, l2, ..." up to (not including) the "." that ends
// the statement; empty is allowed when allowEmpty.
// The result is the parser's scratch slice, valid until the next statement.
func (ps *parser) literals(what string, allowEmpty bool) []Lit {
	lits := ps.body[:0]
	defer func() { ps.body = lits[:0] }()
	if allowEmpty && ps.is(".") {
		return nil
	}
	for {
		lits = append(lits, ps.literal(what))
		if !ps.is(",") {
			return lits
		}
		ps.advance()
	}
}

func (ps *parser) literal(what string) Lit {
	if ps.tok.kind == tNot {
		ps.advance()
		if ps.tok.kind == tNum || ps.is("{") {
			ps.fail(ps.tok, "a count \"{...}\" may appear only in the body of a constraint \":- ...\"")
		}
		return Neg(ps.atom())
	}
	if ps.tok.kind == tNum || ps.is("{") {
		ps.fail(ps.tok, "a count \"{...}\" may appear only in the body of a constraint \":- ...\"")
	}
	if ps.tok.kind != tIdent && ps.tok.kind != tVar {
		ps.fail(ps.tok, "expected an atom or \"not\" in the %s, found %s", what, ps.tok.describe())
	}
	return Pos(ps.atom())
}

// constraint parses the rest of ":- body." where the body may hold one count.
func (ps *parser) constraint() {
	cond := ps.body[:0]
	defer func() { ps.body = cond[:0] }()
	var agg *aggregate
	var aggTok token
	var negated bool
	if !ps.is(".") {
		for {
			t := ps.tok
			neg := false
			if t.kind == tNot {
				ps.advance()
				neg = true
			}
			if ps.tok.kind == tNum || ps.is("{") {
				if agg != nil {
					ps.fail(t, "a constraint may hold only one count \"{...}\"; split it into several constraints")
				}
				agg, aggTok, negated = ps.aggregate(false), t, neg
			} else if neg {
				cond = append(cond, Neg(ps.atom()))
			} else {
				cond = append(cond, ps.literal("constraint body"))
			}
			if !ps.is(",") {
				break
			}
			ps.advance()
		}
	}
	ps.expect(".", "after constraint body")
	if agg == nil {
		ps.prog.AddConstraint(cond...)
		return
	}
	lower, upper := agg.lower, agg.upper
	if !negated {
		// ":- L {S}, c." forbids count >= L; ":- {S} U, c." forbids count <= U.
		switch {
		case lower != NoBound && upper != NoBound:
			ps.fail(aggTok, "a constraint cannot forbid a count between two limits; to require %d to %d write \":- not %d {...} %d, ...\"", lower, upper, lower, upper)
		case upper != NoBound:
			if upper == math.MaxInt32 {
				ps.fail(aggTok, "limit %d is too large", upper)
			}
			lower, upper = upper+1, NoBound
		case lower >= 1:
			lower, upper = NoBound, lower-1
		default:
			ps.fail(aggTok, "a count of at least 0 always holds, so this constraint forbids its other literals outright; write \":- ...\" without the count")
		}
	}
	ps.prog.AddBound(agg.lits, lower, upper, cond...)
}

// aggregate is a parsed "L {elements} U" with NoBound for missing limits.
type aggregate struct {
	lits         []Lit
	lower, upper int
}

// aggregate parses "[L [op]] { e; e; ... } [[op] U]"; atomsOnly rejects
// "not" elements (choice heads).
func (ps *parser) aggregate(atomsOnly bool) *aggregate {
	agg := &aggregate{lits: ps.elems[:0], lower: NoBound, upper: NoBound}
	defer func() { ps.elems = agg.lits[:0] }()
	if ps.tok.kind == tNum {
		t := ps.tok
		v := ps.number()
		op := "<="
		if ps.tok.kind == tPunct && isCompare(ps.tok.text) {
			op = ps.advance().text
		}
		ps.limit(agg, t, flipCompare(op), v)
	}
	ps.expect("{", "to open the elements of a count")
	if !ps.is("}") {
		for {
			if ps.tok.kind == tNot {
				if atomsOnly {
					ps.fail(ps.tok, "the elements of a choice rule must be atoms, without \"not\"")
				}
				ps.advance()
				agg.lits = append(agg.lits, Neg(ps.atom()))
			} else {
				if ps.tok.kind != tIdent && ps.tok.kind != tVar {
					ps.fail(ps.tok, "expected an atom in \"{...}\", found %s", ps.tok.describe())
				}
				agg.lits = append(agg.lits, Pos(ps.atom()))
			}
			if !ps.is(";") {
				break
			}
			ps.advance()
		}
	}
	ps.expect("}", "to close the elements (separate elements with \";\")")
	op := ""
	if ps.tok.kind == tPunct && isCompare(ps.tok.text) {
		op = ps.advance().text
		if ps.tok.kind != tNum {
			ps.fail(ps.tok, "expected a number after %q, found %s", op, ps.tok.describe())
		}
	}
	if ps.tok.kind == tNum {
		t := ps.tok
		v := ps.number()
		if op == "" {
			op = "<="
		}
		ps.limit(agg, t, op, v)
	}
	return agg
}

func isCompare(s string) bool {
	switch s {
	case "<=", "<", ">=", ">", "=":
		return true
	}
	return false
}

// flipCompare turns "v op count" into "count op' v".
func flipCompare(op string) string {
	switch op {
	case "<=":
		return ">="
	case "<":
		return ">"
	case ">=":
		return "<="
	case ">":
		return "<"
	}
	return op
}

// limit applies "count op v" to agg.
func (ps *parser) limit(agg *aggregate, t token, op string, v int) {
	setLower := func(l int) {
		if agg.lower != NoBound {
			ps.fail(t, "the count already has a lower limit")
		}
		agg.lower = l
	}
	setUpper := func(u int) {
		if agg.upper != NoBound {
			ps.fail(t, "the count already has an upper limit")
		}
		if u < 0 {
			ps.fail(t, "no count is below 0; use a limit of 0 or more")
		}
		agg.upper = u
	}
	switch op {
	case ">=":
		setLower(v)
	case ">":
		if v == math.MaxInt32 {
			ps.fail(t, "limit %d is too large", v)
		}
		setLower(v + 1)
	case "<=":
		setUpper(v)
	case "<":
		setUpper(v - 1)
	case "=":
		setLower(v)
		setUpper(v)
	default:
		ps.fail(t, "comparison %q is not supported in a count; use <=, <, >=, > or =", op)
	}
}

// number parses an unsigned integer that fits a limit.
func (ps *parser) number() int {
	t := ps.advance()
	v, err := strconv.ParseInt(t.text, 10, 32)
	if err != nil {
		ps.fail(t, "number %s is too large (at most %d)", shortText(t.text), math.MaxInt32)
	}
	return int(v)
}

// signed parses an optionally negative integer of the given bit size.
func (ps *parser) signed(bits int, what string) int64 {
	t := ps.tok
	text := ""
	if ps.is("-") {
		ps.advance()
		text = "-"
	}
	if ps.tok.kind != tNum {
		ps.fail(ps.tok, "expected the %s (an integer), found %s", what, ps.tok.describe())
	}
	text += ps.advance().text
	v, err := strconv.ParseInt(text, 10, bits)
	if err != nil {
		ps.fail(t, "%s %s is out of range", what, shortText(text))
	}
	return v
}

func (ps *parser) choice() {
	agg := ps.aggregate(true)
	heads := ps.heads[:0]
	for _, l := range agg.lits {
		heads = append(heads, l.Atom())
	}
	ps.heads = heads[:0]
	var body []Lit
	if ps.is(":-") {
		ps.advance()
		body = ps.literals("body of the choice rule", false)
	}
	ps.expect(".", "after choice rule")
	ps.prog.AddChoice(heads, agg.lower, agg.upper, body...)
}

func (ps *parser) weak() {
	body := ps.literals("weak constraint body", true)
	ps.expect(".", "after weak constraint body")
	ps.expect("[", "to open the weight, as in [3@1]")
	wTok := ps.tok
	w := ps.signed(64, "weight")
	level := int64(0)
	if ps.is("@") {
		ps.advance()
		level = ps.signed(32, "level")
	}
	if ps.levelWeight == nil {
		ps.levelWeight = map[int]int64{}
	}
	abs := w
	if abs < 0 {
		abs = -abs // stays negative only for math.MinInt64, refused below
	}
	if abs < 0 || abs > MaxLevelWeight-ps.levelWeight[int(level)] {
		ps.fail(wTok, "weight %d makes the weak constraints of level %d weigh more than %d in total, too much to add up safely — scale the weights down", w, level, int64(MaxLevelWeight))
	}
	ps.levelWeight[int(level)] += abs
	if ps.is(",") {
		ps.fail(ps.tok, "terms after the weight are not supported: write only [weight@level]")
	}
	ps.expect("]", "to close the weight, as in [3@1]")
	ps.prog.AddWeak(w, int(level), body...)
}

func (ps *parser) directive() {
	t := ps.advance()
	switch t.text {
	case "#show":
		if ps.tok.kind != tIdent {
			ps.fail(ps.tok, "expected an atom after #show (only \"#show atom.\" is supported), found %s", ps.tok.describe())
		}
		a := ps.atom()
		ps.expect(".", "after #show atom")
		ps.prog.Show(a)
	case "#atoms":
		for {
			if ps.tok.kind != tIdent {
				ps.fail(ps.tok, "expected an atom in #atoms, found %s", ps.tok.describe())
			}
			ps.atom()
			if !ps.is(";") {
				break
			}
			ps.advance()
		}
		ps.expect(".", "after the atoms of #atoms (separate them with \";\")")
	default:
		ps.fail(t, "unknown directive %s: only #show and #atoms are supported", shortText(t.text))
	}
}

// atom parses a ground atom and returns its number, creating it on first
// occurrence.
func (ps *parser) atom() Atom {
	if ps.tok.kind == tVar {
		ps.term(nil, 0) // reports the variable
	}
	if ps.tok.kind != tIdent {
		ps.fail(ps.tok, "expected an atom, found %s", ps.tok.describe())
	}
	ps.name = ps.term(ps.name[:0], 0)
	if a, ok := ps.atoms[string(ps.name)]; ok {
		return a
	}
	name := string(ps.name)
	var a Atom
	if isAnonName(name) {
		a = ps.prog.NewAtom("")
	} else {
		a = ps.prog.NewAtom(name)
	}
	ps.atoms[name] = a
	return a
}

// maxTermDepth limits nesting so that hostile input cannot exhaust the stack.
const maxTermDepth = 100

// term parses a ground term and appends its canonical form to b.
func (ps *parser) term(b []byte, depth int) []byte {
	t := ps.tok
	if depth > maxTermDepth {
		ps.fail(t, "term is nested more than %d deep", maxTermDepth)
	}
	switch t.kind {
	case tIdent:
		ps.advance()
		b = append(b, t.text...)
		if ps.is("(") {
			b = ps.args(b, depth)
		}
	case tNum:
		ps.advance()
		b = append(b, canonicalNumber(t.text)...)
	case tString:
		ps.advance()
		b = append(b, t.text...)
	case tPunct:
		switch t.text {
		case "-":
			ps.advance()
			if ps.tok.kind != tNum {
				ps.fail(ps.tok, "expected a number after \"-\", found %s", ps.tok.describe())
			}
			n := canonicalNumber(ps.advance().text)
			if n != "0" {
				b = append(b, '-')
			}
			b = append(b, n...)
		case "(":
			b = ps.args(b, depth)
		default:
			ps.fail(t, "expected a term, found %s", t.describe())
		}
	case tVar:
		ps.fail(t, "%s is a variable (it starts with an upper-case letter or \"_\"); the program must be ground: write constants in lower case or in quotes", shortText(t.text))
	default:
		ps.fail(t, "expected a term, found %s", t.describe())
	}
	return b
}

// args parses "(t1,...,tn)" and appends it to b.
func (ps *parser) args(b []byte, depth int) []byte {
	ps.advance() // "("
	b = append(b, '(')
	if ps.is(")") {
		ps.fail(ps.tok, "empty argument list \"()\": leave out the parentheses")
	}
	for {
		b = ps.term(b, depth+1)
		if !ps.is(",") {
			break
		}
		ps.advance()
		b = append(b, ',')
	}
	ps.expect(")", "to close the arguments")
	return append(b, ')')
}

// canonicalNumber removes leading zeros.
func canonicalNumber(s string) string {
	t := strings.TrimLeft(s, "0")
	if t == "" {
		return "0"
	}
	return t
}

// isAnonName reports whether name is the reserved form _a<digits> with no
// leading zero.
func isAnonName(name string) bool {
	if len(name) < 3 || name[:2] != "_a" || name[2] == '0' {
		return false
	}
	for i := 2; i < len(name); i++ {
		if !isDigit(name[i]) {
			return false
		}
	}
	return true
}

// checkName says why name cannot be printed as an atom, or "" when it can:
// it must read back as exactly itself.
func checkName(name string) string {
	if fastName(name) {
		return ""
	}
	return slowCheckName(name)
}

// fastName reports names that certainly read back as themselves.
func fastName(name string) bool {
	rest, ok := canonicalTerm(name, 0, true)
	return ok && rest == "" && !isAnonName(name)
}

// slowCheckName is checkName through the reader itself.
func slowCheckName(name string) string {
	if isAnonName(name) {
		return "names of the form _a<number> are reserved for anonymous atoms"
	}
	var msg string
	ps := &parser{file: "name"}
	ps.sc = newScanner(name, func(_, _ int, m string) {
		if msg == "" {
			msg = m
		}
	})
	ps.tok = ps.sc.next()
	var b []byte
	func() {
		defer func() {
			if r := recover(); r != nil {
				if r != errBail {
					panic(r)
				}
				if msg == "" && len(ps.errs) > 0 {
					msg = ps.errs[0].Msg
				}
			}
		}()
		if ps.tok.kind != tIdent {
			ps.fail(ps.tok, "an atom must start with a lower-case letter")
		}
		b = ps.term(nil, 0)
	}()
	switch {
	case msg != "":
		return "not a ground term of the text form (" + msg + ")"
	case ps.tok.kind != tEOF:
		return "not a ground term of the text form (unexpected " + ps.tok.describe() + ")"
	case string(b) != name:
		return "would read back as " + string(b) + " (write terms without blanks and numbers without leading zeros)"
	}
	return ""
}

// canonicalTerm is the allocation-free check behind checkName: it consumes
// one term in canonical form (as the reader would write it) from the start
// of s and returns the rest. atom requires a name rather than a number,
// string or tuple. Reports false where the slow path must decide.
func canonicalTerm(s string, depth int, atom bool) (string, bool) {
	if s == "" || depth > maxTermDepth {
		return s, false
	}
	switch c := s[0]; {
	case c == '_' || isLower(c):
		i := 0
		for i < len(s) && s[i] == '_' {
			i++
		}
		if i == len(s) || !isLower(s[i]) {
			return s, false
		}
		for i < len(s) && isIdent(s[i]) {
			i++
		}
		if s[:i] == "not" {
			return s, false
		}
		s = s[i:]
		if s != "" && s[0] == '(' {
			return canonicalArgs(s, depth)
		}
		return s, true
	case atom:
		return s, false
	case c == '-' || isDigit(c):
		i := 0
		if c == '-' {
			i++
		}
		if i == len(s) || !isDigit(s[i]) || s[i] == '0' && (i > 0 || i+1 < len(s) && isDigit(s[i+1])) {
			return s, false
		}
		for i < len(s) && isDigit(s[i]) {
			i++
		}
		return s[i:], true
	case c == '"':
		for i := 1; i < len(s); i++ {
			switch s[i] {
			case '\\':
				if i+1 < len(s) && s[i+1] != '\n' {
					i++
				}
			case '\n':
				return s, false
			case '"':
				return s[i+1:], true
			}
		}
		return s, false
	case c == '(':
		return canonicalArgs(s, depth)
	}
	return s, false
}

// canonicalArgs consumes "(t1,...,tn)" in canonical form.
func canonicalArgs(s string, depth int) (string, bool) {
	s = s[1:]
	for {
		var ok bool
		if s, ok = canonicalTerm(s, depth+1, false); !ok {
			return s, false
		}
		if s == "" {
			return s, false
		}
		if s[0] == ')' {
			return s[1:], true
		}
		if s[0] != ',' {
			return s, false
		}
		s = s[1:]
	}
}

// ReadModel reads a list of atoms of p, for example a candidate model to
// Verify: ground atoms separated by blanks, commas or semicolons (commas
// inside an atom's arguments belong to the atom), with "%" comments
// allowed. Names are compared in the canonical form ReadProgram uses, so
// "start(s12, 3)" names the atom start(s12,3); _a17 names atom 17 when it
// is anonymous. name is used in error positions. Every unknown atom and
// every syntax error is reported, as a SyntaxErrors list.
func ReadModel(r io.Reader, p *Program, name string) ([]Atom, error) {
	if name == "" {
		name = "input"
	}
	data, err := readBounded(r, name, MaxTextBytes)
	if err != nil {
		return nil, err
	}
	index := make(map[string]Atom, p.NumAtoms())
	for a := Atom(p.NumAtoms()); a >= 1; a-- { // the first atom of a name wins
		if n := p.Name(a); n != "" {
			index[n] = a
		} else {
			index[anonName(a)] = a
		}
	}
	ps := &parser{file: name, prog: NewProgram(), atoms: make(map[string]Atom)}
	ps.sc = newScanner(string(data), ps.errorAt)
	ps.tok = ps.sc.next()
	var model []Atom
	for ps.tok.kind != tEOF && !ps.full {
		func() {
			defer func() {
				if r := recover(); r != nil {
					if r != errBail {
						panic(r)
					}
					// Skip to the next separator.
					for ps.tok.kind != tEOF && !ps.is(",") && !ps.is(";") {
						ps.advance()
					}
				}
			}()
			if ps.is(",") || ps.is(";") || ps.is(".") {
				ps.advance()
				return
			}
			t := ps.tok
			if t.kind != tIdent && t.kind != tVar {
				ps.fail(t, "expected an atom, found %s", t.describe())
			}
			ps.name = ps.term(ps.name[:0], 0)
			a, ok := index[string(ps.name)]
			if !ok {
				ps.fail(t, "%s is not an atom of the program: check the spelling", ps.name)
			}
			model = append(model, a)
		}()
	}
	if len(ps.errs) > 0 {
		return nil, ps.errs
	}
	return model, nil
}

// MaxTextBytes is the largest program or model text read.
const MaxTextBytes = 1 << 30

// readBounded reads at most limit bytes; a longer input is a syntax error
// at its first position, so that a device or an endless pipe cannot
// exhaust memory.
func readBounded(r io.Reader, name string, limit int) ([]byte, error) {
	data, err := io.ReadAll(io.LimitReader(r, int64(limit)+1))
	if err != nil {
		return nil, fmt.Errorf("reading %s: %w", name, err)
	}
	if len(data) > limit {
		return nil, SyntaxErrors{{File: name, Line: 1, Col: 1, Msg: fmt.Sprintf("the input is larger than %s, the most read — split it or check that this is the right file", byteSize(limit))}}
	}
	return data, nil
}

// byteSize writes a limit in MB, or in bytes below one MB.
func byteSize(n int) string {
	if n >= 1<<20 {
		return fmt.Sprintf("%d MB", n>>20)
	}
	return fmt.Sprintf("%d bytes", n)
}
