package solver

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// DIMACSError is a problem in a DIMACS CNF file, with its 1-based line.
type DIMACSError struct {
	Name string // file name, for the message
	Line int
	Msg  string
}

// Error reads "name:line: what is wrong".
func (e *DIMACSError) Error() string { return fmt.Sprintf("%s:%d: %s", e.Name, e.Line, e.Msg) }

// ReadDIMACS reads a CNF formula in the DIMACS format ("c" comment lines, a
// header "p cnf VARS CLAUSES", clauses as integers ended by 0, possibly
// spanning lines; a line "%" ends the input as in the SATLIB files) and
// returns the equivalent tight program: one choice rule making every
// variable free (atom v is variable v, named "xV") and, for each clause, the
// integrity constraint forbidding all its literals to be false. Its stable
// models are exactly the models of the formula. name is used in error
// messages, which are *DIMACSError values naming the line.
func ReadDIMACS(r io.Reader, name string) (*Program, error) {
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 64*1024), 1<<26)
	bad := func(line int, format string, args ...any) error {
		return &DIMACSError{Name: name, Line: line, Msg: fmt.Sprintf(format, args...)}
	}
	var p *Program
	vars, want, got := 0, 0, 0
	var clause []Lit
	line, clauseLine := 0, 0
	for sc.Scan() {
		line++
		text := strings.TrimSpace(sc.Text())
		if text == "" || text[0] == 'c' {
			continue
		}
		if text[0] == '%' {
			break
		}
		if text[0] == 'p' {
			if p != nil {
				return nil, bad(line, "a second header line; a DIMACS file has one \"p cnf VARS CLAUSES\" line")
			}
			f := strings.Fields(text)
			if len(f) != 4 || f[0] != "p" || f[1] != "cnf" {
				return nil, bad(line, "header %q is not \"p cnf VARS CLAUSES\"", text)
			}
			v, err1 := strconv.Atoi(f[2])
			c, err2 := strconv.Atoi(f[3])
			if err1 != nil || err2 != nil || v < 0 || c < 0 || v > 1<<28 {
				return nil, bad(line, "header %q needs two non-negative whole numbers (at most %d variables)", text, 1<<28)
			}
			vars, want = v, c
			p = NewProgram()
			heads := make([]Atom, vars)
			for i := range heads {
				heads[i] = p.NewAtom("x" + strconv.Itoa(i+1))
			}
			if vars > 0 {
				p.AddChoice(heads, NoBound, NoBound)
			}
			continue
		}
		if p == nil {
			return nil, bad(line, "clause before the header; start the file with \"p cnf VARS CLAUSES\"")
		}
		for _, tok := range strings.Fields(text) {
			v, err := strconv.Atoi(tok)
			if err != nil {
				return nil, bad(line, "%q is not a whole number; clauses are lists of non-zero integers ended by 0", tok)
			}
			if v == 0 {
				if got >= want {
					return nil, bad(line, "more clauses than the %d the header announces; correct the header", want)
				}
				p.AddConstraint(clause...)
				clause = clause[:0]
				got++
				continue
			}
			if len(clause) == 0 {
				clauseLine = line
			}
			a := v
			if a < 0 {
				a = -a
			}
			if a > vars {
				return nil, bad(line, "literal %d refers to variable %d, but the header announces %d variables", v, a, vars)
			}
			// The clause (l1 or ... or lk) forbids every li false.
			if v > 0 {
				clause = append(clause, Neg(Atom(a)))
			} else {
				clause = append(clause, Pos(Atom(a)))
			}
		}
	}
	if err := sc.Err(); err != nil {
		return nil, bad(line+1, "cannot read: %v", err)
	}
	if p == nil {
		return nil, bad(line, "no header; a DIMACS file needs a line \"p cnf VARS CLAUSES\"")
	}
	if len(clause) > 0 {
		return nil, bad(clauseLine, "the last clause is not ended by 0")
	}
	if got != want {
		return nil, bad(line, "%d clauses, but the header announces %d; correct the header", got, want)
	}
	return p, nil
}
