package solver

import (
	"bufio"
	"encoding/binary"
	"errors"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// Statement kinds passed to the comment function of WriteProgramComments:
// the name of the Program slice the statement comes from.
const (
	KindRule   = "rule"   // Program.Rules (facts, rules, integrity constraints)
	KindChoice = "choice" // Program.Choices (with its bounds, when printed together)
	KindBound  = "bound"  // Program.Bounds printed as a constraint of their own
	KindWeak   = "weak"   // Program.Weaks
	KindShow   = "show"   // Program.Shows
)

// atomsPerHeaderLine is how many atoms one "#atoms" statement lists.
const atomsPerHeaderLine = 8

// WriteProgram prints p in the text form that ReadProgram reads, so that
// reading the output gives the same program: the same atoms in the same
// order, and the same rules, choices, bounds, weak constraints and shows in
// the same order. Printing that program again gives identical bytes.
//
// The output lists Rules, then Choices and standalone Bounds (a choice rule
// and the Bound that AddChoice made for it print as one statement such as
// "1 {a; b} 2 :- c."), then Weaks, then Shows. When the order in which atoms
// first occur would differ from their numbering, or an atom occurs nowhere,
// a header of "#atoms a; b; c." statements introduces every atom first.
// Anonymous atoms print as _a17 (the reserved form for atom 17).
//
// WriteProgram fails, writing nothing, when an atom name is not a ground
// term of the text form, uses the reserved form, or is shared by two atoms:
// the printed text would then mean another program.
func WriteProgram(w io.Writer, p *Program) error {
	return WriteProgramComments(w, p, nil)
}

// WriteProgramComments is WriteProgram with comments: before each statement
// it calls comment(kind, index), where kind is one of KindRule, KindChoice,
// KindBound, KindWeak and KindShow and index is the position in the
// corresponding Program slice, and prints the returned text as "% " comment
// lines (one per line of the text; "" prints nothing). A choice printed
// together with its bound is asked for as KindChoice only. comment may be
// nil. Comments are not read back, so output with comments reads as the same
// program but prints again without them.
func WriteProgramComments(w io.Writer, p *Program, comment func(kind string, index int) string) error {
	names, err := printNames(p)
	if err != nil {
		return err
	}
	if err := checkLimits(p); err != nil {
		return err
	}
	pr := &printer{p: p, names: names, w: bufio.NewWriterSize(w, 64<<10), comment: comment}
	pr.program(pairChoiceBounds(p))
	return pr.w.Flush()
}

// printer writes one program; errors of w are collected by bufio.Writer and
// reported by Flush.
type printer struct {
	p       *Program
	names   []string // names[a] is the printed form of atom a
	w       *bufio.Writer
	comment func(kind string, index int) string
	buf     []byte // scratch for one statement
}

func (pr *printer) program(pairs []int) {
	if needsHeader(pr.p, pairs) {
		pr.header()
	}
	p := pr.p
	walkStatements(p, pairs, func(kind string, i, bound int) {
		pr.note(kind, i)
		buf := pr.buf[:0]
		switch kind {
		case KindRule:
			buf = appendRule(buf, pr.name, p.Rules[i])
		case KindChoice:
			var bd *Bound
			if bound >= 0 {
				bd = &p.Bounds[bound]
			}
			buf = appendChoice(buf, pr.name, p.Choices[i], bd)
		case KindBound:
			buf = appendBound(buf, pr.name, p.Bounds[i])
		case KindWeak:
			buf = appendWeak(buf, pr.name, p.Weaks[i])
		case KindShow:
			buf = append(append(append(buf, "#show "...), pr.names[p.Shows[i]]...), '.')
		}
		pr.buf = buf
		pr.flush()
	})
}

// walkStatements calls fn for every statement in printing order: Rules,
// then Choices merged with standalone Bounds (both in their own order), then
// Weaks, then Shows. pairs is pairChoiceBounds(p). For a choice, bound is
// the index of the Bound printed with it, or -1; it is -1 for every other
// kind.
func walkStatements(p *Program, pairs []int, fn func(kind string, index, bound int)) {
	for i := range p.Rules {
		fn(KindRule, i, -1)
	}
	paired := make([]bool, len(p.Bounds))
	for _, b := range pairs {
		if b >= 0 {
			paired[b] = true
		}
	}
	next := 0 // next bound not yet printed
	boundsUpTo := func(end int) {
		for ; next < end; next++ {
			if !paired[next] {
				fn(KindBound, next, -1)
			}
		}
	}
	for i := range p.Choices {
		if b := pairs[i]; b >= 0 {
			boundsUpTo(b)
			next = b + 1
		}
		fn(KindChoice, i, pairs[i])
	}
	boundsUpTo(len(p.Bounds))
	for i := range p.Weaks {
		fn(KindWeak, i, -1)
	}
	for i := range p.Shows {
		fn(KindShow, i, -1)
	}
}

func (pr *printer) header() {
	n := pr.p.NumAtoms()
	for a := 1; a <= n; a += atomsPerHeaderLine {
		pr.buf = append(pr.buf[:0], "#atoms "...)
		for b := a; b < a+atomsPerHeaderLine && b <= n; b++ {
			if b > a {
				pr.buf = append(pr.buf, "; "...)
			}
			pr.buf = append(pr.buf, pr.names[b]...)
		}
		pr.buf = append(pr.buf, '.')
		pr.flush()
	}
}

// name is the printed form of atom a.
func (pr *printer) name(a Atom) string { return pr.names[a] }

func (pr *printer) note(kind string, index int) {
	if pr.comment == nil {
		return
	}
	text := pr.comment(kind, index)
	if text == "" {
		return
	}
	for _, line := range strings.Split(text, "\n") {
		pr.w.WriteString(strings.TrimRight("% "+line, " "))
		pr.w.WriteByte('\n')
	}
}

func (pr *printer) flush() {
	pr.w.Write(pr.buf)
	pr.w.WriteByte('\n')
}

// anonName is the reserved printed form of an anonymous atom.
func anonName(a Atom) string { return "_a" + strconv.FormatUint(uint64(a), 10) }

// atomText is the printed form of a, without checking that its name is valid.
func atomText(p *Program, a Atom) string {
	if n := p.Name(a); n != "" {
		return n
	}
	return anonName(a)
}

// printNames gives the printed form of every atom, or an error naming the
// atoms whose names cannot be printed faithfully.
func printNames(p *Program) ([]string, error) {
	n := p.NumAtoms()
	names := make([]string, n+1)
	seen := make(map[string]Atom, n)
	var problems []string
	for a := Atom(1); int(a) <= n; a++ {
		name := p.Name(a)
		if name == "" {
			names[a] = anonName(a)
			continue
		}
		if msg := checkName(name); msg != "" {
			problems = append(problems, fmt.Sprintf("atom %d is named %q: %s", a, name, msg))
		} else if b, dup := seen[name]; dup {
			problems = append(problems, fmt.Sprintf("atoms %d and %d are both named %s: the text form reads equal names as one atom; give them different names", b, a, name))
		}
		seen[name] = a
		names[a] = name
	}
	if len(problems) > 0 {
		const most = 10
		if len(problems) > most {
			problems = append(problems[:most], fmt.Sprintf("and %d more", len(problems)-most))
		}
		return nil, errors.New("cannot print program: " + strings.Join(problems, "; "))
	}
	return names, nil
}

// checkLimits rejects bounds and references the reader could not read back.
func checkLimits(p *Program) error {
	n := Atom(p.NumAtoms())
	bad := func(l Lit) bool { return l.Atom() == 0 || l.Atom() > n }
	badLits := func(ls []Lit) bool {
		for _, l := range ls {
			if bad(l) {
				return true
			}
		}
		return false
	}
	for i, r := range p.Rules {
		if r.Head > n || badLits(r.Body) {
			return fmt.Errorf("cannot print program: rule %d refers to an atom outside 1..%d", i, n)
		}
	}
	for i, c := range p.Choices {
		for _, h := range c.Heads {
			if h == 0 || h > n {
				return fmt.Errorf("cannot print program: choice %d refers to an atom outside 1..%d", i, n)
			}
		}
		if badLits(c.Body) {
			return fmt.Errorf("cannot print program: choice %d refers to an atom outside 1..%d", i, n)
		}
	}
	for i, b := range p.Bounds {
		if b.Lower < NoBound || b.Upper < NoBound {
			return fmt.Errorf("cannot print program: bound %d has a negative limit (use NoBound for none)", i)
		}
		if badLits(b.Lits) || badLits(b.Cond) {
			return fmt.Errorf("cannot print program: bound %d refers to an atom outside 1..%d", i, n)
		}
	}
	for i, w := range p.Weaks {
		if badLits(w.Body) {
			return fmt.Errorf("cannot print program: weak constraint %d refers to an atom outside 1..%d", i, n)
		}
	}
	for i, a := range p.Shows {
		if a == 0 || a > n {
			return fmt.Errorf("cannot print program: show %d refers to an atom outside 1..%d", i, n)
		}
	}
	return nil
}

// pairChoiceBounds finds, for each choice, the Bound that AddChoice made for
// it (same heads as positive literals, same body as condition, and a limit
// that AddChoice would have stored), or -1: the first such bound after the
// previous pair. Pairs are increasing in both indexes, so printing each
// pair as one statement keeps both orders. Linear in the program size.
func pairChoiceBounds(p *Program) []int {
	pairs := make([]int, len(p.Choices))
	// Candidate bounds by the key of their literals and condition, each list
	// increasing, with a read position that only moves forward.
	byKey := map[string][]int{}
	var key []byte
	for b, bd := range p.Bounds {
		if bd.Lower > 0 || bd.Upper != NoBound {
			key = boundKey(key[:0], bd.Lits, bd.Cond)
			byKey[string(key)] = append(byKey[string(key)], b)
		}
	}
	next := 0
	heads := []Lit(nil)
	for i, c := range p.Choices {
		pairs[i] = -1
		heads = heads[:0]
		for _, h := range c.Heads {
			heads = append(heads, Pos(h))
		}
		key = boundKey(key[:0], heads, c.Body)
		list := byKey[string(key)]
		for len(list) > 0 && list[0] < next {
			list = list[1:]
		}
		if len(list) > 0 {
			pairs[i] = list[0]
			next = list[0] + 1
			list = list[1:]
		}
		if _, ok := byKey[string(key)]; ok {
			byKey[string(key)] = list
		}
	}
	return pairs
}

// boundKey encodes a literal list and a condition as map key bytes.
func boundKey(buf []byte, lits, cond []Lit) []byte {
	for _, l := range lits {
		buf = binary.AppendUvarint(buf, uint64(l)+1)
	}
	buf = append(buf, 0)
	for _, l := range cond {
		buf = binary.AppendUvarint(buf, uint64(l)+1)
	}
	return buf
}

// needsHeader reports whether reading the printed statements alone would
// number the atoms differently: some atom occurs nowhere, or atoms first
// occur out of order. pairs is pairChoiceBounds(p).
func needsHeader(p *Program, pairs []int) bool {
	n := p.NumAtoms()
	seen := make([]bool, n+1)
	next := Atom(1) // the atom that must occur first next
	ok := true
	see := func(a Atom) {
		if !ok || a == 0 || int(a) > n || seen[a] {
			return
		}
		if a != next {
			ok = false
			return
		}
		seen[a] = true
		next++
	}
	seeLits := func(ls []Lit) {
		for _, l := range ls {
			see(l.Atom())
		}
	}
	walkStatements(p, pairs, func(kind string, i, _ int) {
		switch kind {
		case KindRule:
			see(p.Rules[i].Head)
			seeLits(p.Rules[i].Body)
		case KindChoice:
			for _, h := range p.Choices[i].Heads {
				see(h)
			}
			seeLits(p.Choices[i].Body)
		case KindBound:
			seeLits(p.Bounds[i].Lits)
			seeLits(p.Bounds[i].Cond)
		case KindWeak:
			seeLits(p.Weaks[i].Body)
		case KindShow:
			see(p.Shows[i])
		}
	})
	return !ok || int(next) != n+1
}

func appendLits(buf []byte, name func(Atom) string, lits []Lit, sep string) []byte {
	for i, l := range lits {
		if i > 0 {
			buf = append(buf, sep...)
		}
		if l.IsNeg() {
			buf = append(buf, "not "...)
		}
		buf = append(buf, name(l.Atom())...)
	}
	return buf
}

func appendRule(buf []byte, name func(Atom) string, r Rule) []byte {
	if r.Head != 0 {
		buf = append(buf, name(r.Head)...)
		if len(r.Body) == 0 {
			return append(buf, '.')
		}
		buf = append(buf, ' ')
	}
	buf = append(buf, ":-"...)
	if len(r.Body) > 0 {
		buf = append(buf, ' ')
		buf = appendLits(buf, name, r.Body, ", ")
	} else {
		buf = append(buf, ' ')
	}
	return append(buf, '.')
}

func appendChoice(buf []byte, name func(Atom) string, c Choice, b *Bound) []byte {
	lower, upper := NoBound, NoBound
	if b != nil {
		lower, upper = b.Lower, b.Upper
	}
	if lower != NoBound && lower != upper {
		buf = strconv.AppendInt(buf, int64(lower), 10)
		buf = append(buf, ' ')
	}
	buf = append(buf, '{')
	for i, h := range c.Heads {
		if i > 0 {
			buf = append(buf, "; "...)
		}
		buf = append(buf, name(h)...)
	}
	buf = append(buf, '}')
	switch {
	case lower != NoBound && lower == upper:
		buf = append(buf, " = "...)
		buf = strconv.AppendInt(buf, int64(upper), 10)
	case upper != NoBound:
		buf = append(buf, ' ')
		buf = strconv.AppendInt(buf, int64(upper), 10)
	}
	if len(c.Body) > 0 {
		buf = append(buf, " :- "...)
		buf = appendLits(buf, name, c.Body, ", ")
	}
	return append(buf, '.')
}

// appendBound prints a standalone Bound as an integrity constraint:
// ":- U+1 {L}, Cond." for an upper limit only, ":- {L} L-1, Cond." for a
// lower limit (>= 1) only, and ":- not L {L} U, Cond." otherwise.
func appendBound(buf []byte, name func(Atom) string, b Bound) []byte {
	buf = append(buf, ":- "...)
	elems := func(buf []byte) []byte {
		buf = append(buf, '{')
		buf = appendLits(buf, name, b.Lits, "; ")
		return append(buf, '}')
	}
	switch {
	case b.Lower == NoBound && b.Upper != NoBound:
		buf = strconv.AppendInt(buf, int64(b.Upper)+1, 10)
		buf = append(buf, ' ')
		buf = elems(buf)
	case b.Upper == NoBound && b.Lower >= 1:
		buf = elems(buf)
		buf = append(buf, ' ')
		buf = strconv.AppendInt(buf, int64(b.Lower)-1, 10)
	default:
		buf = append(buf, "not "...)
		if b.Lower != NoBound {
			buf = strconv.AppendInt(buf, int64(b.Lower), 10)
			buf = append(buf, ' ')
		}
		buf = elems(buf)
		if b.Upper != NoBound {
			buf = append(buf, ' ')
			buf = strconv.AppendInt(buf, int64(b.Upper), 10)
		}
	}
	if len(b.Cond) > 0 {
		buf = append(buf, ", "...)
		buf = appendLits(buf, name, b.Cond, ", ")
	}
	return append(buf, '.')
}

func appendWeak(buf []byte, name func(Atom) string, w Weak) []byte {
	buf = append(buf, ":~ "...)
	buf = appendLits(buf, name, w.Body, ", ")
	buf = append(buf, ". ["...)
	buf = strconv.AppendInt(buf, w.Weight, 10)
	buf = append(buf, '@')
	buf = strconv.AppendInt(buf, int64(w.Level), 10)
	return append(buf, ']')
}

// ruleText is the printed form of one rule, for messages.
func ruleText(p *Program, r Rule) string {
	return string(appendRule(nil, func(a Atom) string { return atomText(p, a) }, r))
}
