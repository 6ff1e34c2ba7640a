package solver

import (
	"bufio"
	"bytes"
	"fmt"
	"io"
	"slices"
	"strconv"
	"strings"
	"unicode"
	"unicode/utf8"
)

// Limits of ReadDIMACS, which bound its memory by what the file holds.
const (
	// MaxDIMACSBytes is the largest DIMACS input read.
	MaxDIMACSBytes = 1 << 30
	// dimacsFreeVars is how many variables a header may announce that no
	// clause uses: each used variable appears in the input, so with this
	// bound the atoms made follow what the file holds.
	dimacsFreeVars = 1 << 16
	// dimacsMaxVars bounds the announced variables outright.
	dimacsMaxVars = 1 << 28
)

// DIMACSError is a problem in a DIMACS CNF file, with its 1-based line and,
// where it concerns one number, its 1-based column.
type DIMACSError struct {
	Name string // file name, for the message
	Line int
	Col  int // 0 when the problem concerns the whole line
	Msg  string
}

// Error reads "name:line: what is wrong", or "name:line:col: what is
// wrong" when the column is known.
func (e *DIMACSError) Error() string {
	if e.Col > 0 {
		return fmt.Sprintf("%s:%d:%d: %s", e.Name, e.Line, e.Col, e.Msg)
	}
	return fmt.Sprintf("%s:%d: %s", e.Name, e.Line, e.Msg)
}

// ReadDIMACS reads a CNF formula in the DIMACS format ("c" comment lines, a
// header "p cnf VARS CLAUSES", clauses as integers ended by 0, possibly
// spanning lines; a line "%" ends the input as in the SATLIB files) and
// returns the equivalent tight program: one choice rule making every
// variable free (atom v is variable v, named "xV") and, for each clause, the
// integrity constraint forbidding all its literals to be false. Its stable
// models are exactly the models of the formula. name is used in error
// messages, which are *DIMACSError values naming the line (and column).
// Memory is bounded by the input: at most MaxDIMACSBytes are read, and a
// header may announce at most 65,536 variables that no clause uses.
func ReadDIMACS(r io.Reader, name string) (*Program, error) {
	data, err := io.ReadAll(io.LimitReader(r, MaxDIMACSBytes+1))
	if err != nil {
		return nil, &DIMACSError{Name: name, Line: 1, Msg: fmt.Sprintf("cannot read: %v", err)}
	}
	if len(data) > MaxDIMACSBytes {
		return nil, &DIMACSError{Name: name, Line: 1, Msg: fmt.Sprintf("the input is larger than %d MB, the most read — split the formula", MaxDIMACSBytes>>20)}
	}
	sc := bufio.NewScanner(bytes.NewReader(data))
	sc.Buffer(make([]byte, 64*1024), 1<<26)
	line := 0
	bad := func(col int, format string, args ...any) error {
		return &DIMACSError{Name: name, Line: line, Col: col, Msg: fmt.Sprintf(format, args...)}
	}
	header := false
	vars, want, headerLine, varsCol := 0, 0, 0, 0
	var lits []Lit // every clause's forbidding literals, clause after clause
	var ends []int // ends[i] is the end of clause i in lits
	clauseLine, inClause := 0, false
	for sc.Scan() {
		line++
		raw := sc.Text()
		text := strings.TrimSpace(raw)
		if text == "" || text[0] == 'c' {
			continue
		}
		if text[0] == '%' {
			break
		}
		toks := fieldsAt(raw)
		if text[0] == 'p' {
			if header {
				return nil, bad(0, "a second header line; a DIMACS file has one \"p cnf VARS CLAUSES\" line")
			}
			if len(toks) != 4 || toks[0].text != "p" || toks[1].text != "cnf" {
				return nil, bad(0, "header %s is not \"p cnf VARS CLAUSES\"", shortQuote(text))
			}
			for _, tk := range toks[2:] {
				if v, err := strconv.Atoi(tk.text); err != nil || v < 0 {
					return nil, bad(tk.col, "%s in the header is not a non-negative whole number", shortQuote(tk.text))
				}
			}
			vars, _ = strconv.Atoi(toks[2].text)
			want, _ = strconv.Atoi(toks[3].text)
			if vars > dimacsMaxVars {
				return nil, bad(toks[2].col, "the header announces %d variables, more than the %d this reader takes — correct the header", vars, dimacsMaxVars)
			}
			header, headerLine, varsCol = true, line, toks[2].col
			continue
		}
		if !header {
			return nil, bad(0, "clause before the header; start the file with \"p cnf VARS CLAUSES\"")
		}
		for _, tk := range toks {
			v, err := strconv.ParseInt(tk.text, 10, 64)
			if err != nil && !isDigits(tk.text) {
				return nil, bad(tk.col, "%s is not a whole number; clauses are lists of non-zero integers ended by 0", shortQuote(tk.text))
			}
			if err != nil || v < -int64(vars) || v > int64(vars) {
				return nil, bad(tk.col, "literal %s refers to variable %s, but the header announces %d variables, so literals lie between -%d and %d", shortText(tk.text), shortText(strings.TrimPrefix(tk.text, "-")), vars, vars, vars)
			}
			if v == 0 {
				if len(ends) >= want {
					return nil, bad(tk.col, "more clauses than the %d the header announces; correct the header", want)
				}
				ends, inClause = append(ends, len(lits)), false
				continue
			}
			if !inClause {
				clauseLine, inClause = line, true
			}
			// The clause (l1 or ... or lk) forbids every li false.
			if v > 0 {
				lits = append(lits, Neg(Atom(v)))
			} else {
				lits = append(lits, Pos(Atom(-v)))
			}
		}
	}
	if err := sc.Err(); err != nil {
		line++
		return nil, bad(0, "cannot read: %v", err)
	}
	if !header {
		return nil, bad(0, "no header; a DIMACS file needs a line \"p cnf VARS CLAUSES\"")
	}
	if inClause {
		line = clauseLine
		return nil, bad(0, "the last clause is not ended by 0")
	}
	if len(ends) != want {
		return nil, bad(0, "%d clauses, but the header announces %d; correct the header", len(ends), want)
	}
	if used := distinctAtoms(lits); vars-used > dimacsFreeVars {
		line = headerLine
		return nil, bad(varsCol, "the header announces %d variables, but the clauses use only %d; at most %d unused variables are accepted — correct the header", vars, used, dimacsFreeVars)
	}
	p := NewProgram()
	heads := make([]Atom, vars)
	for i := range heads {
		heads[i] = p.NewAtom("x" + strconv.Itoa(i+1))
	}
	if vars > 0 {
		p.AddChoice(heads, NoBound, NoBound)
	}
	start := 0
	for _, end := range ends {
		p.AddConstraint(lits[start:end]...)
		start = end
	}
	return p, nil
}

// distinctAtoms counts the distinct atoms of lits, in memory proportional
// to len(lits).
func distinctAtoms(lits []Lit) int {
	atoms := make([]Atom, len(lits))
	for i, l := range lits {
		atoms[i] = l.Atom()
	}
	slices.Sort(atoms)
	return len(slices.Compact(atoms))
}

// dimacsField is a white-space separated field with its 1-based column.
type dimacsField struct {
	text string
	col  int
}

// fieldsAt splits a line like strings.Fields, keeping each field's column
// (counted in characters).
func fieldsAt(s string) []dimacsField {
	var out []dimacsField
	col, start, startCol := 0, -1, 0
	for i, r := range s {
		col++
		if unicode.IsSpace(r) {
			if start >= 0 {
				out = append(out, dimacsField{s[start:i], startCol})
				start = -1
			}
			continue
		}
		if start < 0 {
			start, startCol = i, col
		}
	}
	if start >= 0 {
		out = append(out, dimacsField{s[start:], startCol})
	}
	return out
}

// isDigits reports whether s is an optionally signed run of decimal digits
// (a whole number, perhaps too large for int64).
func isDigits(s string) bool {
	s = strings.TrimPrefix(strings.TrimPrefix(s, "-"), "+")
	if s == "" {
		return false
	}
	for _, c := range s {
		if c < '0' || c > '9' {
			return false
		}
	}
	return true
}

// shortText keeps at most 40 characters of a value for a message.
func shortText(s string) string {
	if utf8.RuneCountInString(s) <= 60 {
		return s
	}
	r := []rune(s)
	return string(r[:40]) + "… (" + strconv.Itoa(len(r)) + " characters)"
}

// shortQuote quotes a value for a message, shortened like shortText.
func shortQuote(s string) string {
	if utf8.RuneCountInString(s) <= 60 {
		return strconv.Quote(s)
	}
	r := []rune(s)
	return strconv.Quote(string(r[:40])+"…") + " (" + strconv.Itoa(len(r)) + " characters)"
}
