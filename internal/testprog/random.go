package testprog

import (
	"fmt"
	"math/rand/v2"

	"github.com/termwright/termwright/solver"
)

// RandomProgram builds a small random program over n atoms a(1)..a(n) that
// mixes every construct: normal rules with negation (positive loops arise
// often), choice rules with and without bounds, integrity constraints,
// standalone bounds with conditions and negative or repeated literals, and
// weak constraints. Meant for n ≤ 12, where every candidate set can be
// checked by brute force. Lower limits never exceed upper limits (the
// engine rejects such bounds). The same seed gives the same program.
func RandomProgram(seed uint64, n int) *solver.Program {
	r := rand.New(rand.NewPCG(seed, 0x7e57))
	p := solver.NewProgram()
	for i := 1; i <= n; i++ {
		p.NewAtom(fmt.Sprintf("a(%d)", i))
	}
	atom := func() solver.Atom { return solver.Atom(1 + r.IntN(n)) }
	lit := func(negShare int) solver.Lit {
		if r.IntN(100) < negShare {
			return solver.Neg(atom())
		}
		return solver.Pos(atom())
	}
	body := func(most, negShare int) []solver.Lit {
		b := make([]solver.Lit, r.IntN(most+1))
		for i := range b {
			b[i] = lit(negShare)
		}
		return b
	}
	limit := func(k int) int {
		if r.IntN(3) == 0 {
			return solver.NoBound
		}
		return r.IntN(k + 1)
	}
	for range n/2 + r.IntN(n+1) {
		p.AddRule(atom(), body(3, 35)...)
	}
	for range r.IntN(4) {
		heads := make([]solver.Atom, 1+r.IntN(3))
		for i := range heads {
			heads[i] = atom()
		}
		lower, upper := solver.NoBound, solver.NoBound
		if r.IntN(2) == 0 {
			lower, upper = limit(len(heads)), limit(len(heads))
			if upper != solver.NoBound && lower > upper {
				lower, upper = upper, lower
			}
		}
		p.AddChoice(heads, lower, upper, body(2, 30)...)
	}
	for range r.IntN(3) {
		b := body(3, 40)
		if len(b) > 0 {
			p.AddConstraint(b...)
		}
	}
	for range r.IntN(3) {
		ls := body(4, 30)
		lower, upper := limit(len(ls)), limit(len(ls))
		if upper != solver.NoBound && lower > upper {
			lower, upper = upper, lower
		}
		p.AddBound(ls, lower, upper, body(2, 30)...)
	}
	for range r.IntN(3) {
		p.AddWeak(int64(1+r.IntN(5)), r.IntN(2), body(2, 30)...)
	}
	return p
}

// Random3SAT draws m clauses of three distinct variables over 1..n, each
// negated with probability 1/2, as signed variable numbers (DIMACS style:
// -3 is "not x3"). At m/n ≈ 4.26 about half of the instances are
// satisfiable (the satisfiability threshold; Mitchell, Selman & Levesque
// 1992, Crawford & Auton 1996).
func Random3SAT(seed uint64, n, m int) [][]int {
	r := rand.New(rand.NewPCG(seed, 0x3547))
	clauses := make([][]int, m)
	for i := range clauses {
		c := make([]int, 0, 3)
		for len(c) < 3 {
			v := 1 + r.IntN(n)
			dup := false
			for _, u := range c {
				dup = dup || u == v || u == -v
			}
			if dup {
				continue
			}
			if r.IntN(2) == 0 {
				v = -v
			}
			c = append(c, v)
		}
		clauses[i] = c
	}
	return clauses
}

// SATProgram writes a CNF formula over variables 1..n as a program: a
// choice rule {x(1); ...; x(n)} and, per clause, the integrity constraint
// whose body is the negation of the clause. Its stable models are the
// formula's models (x(i) true for the variables set true).
func SATProgram(n int, clauses [][]int) *solver.Program {
	p := solver.NewProgram()
	x := make([]solver.Atom, n+1)
	for i := 1; i <= n; i++ {
		x[i] = p.NewAtom(fmt.Sprintf("x(%d)", i))
	}
	p.AddChoice(x[1:], solver.NoBound, solver.NoBound)
	body := make([]solver.Lit, 0, 3)
	for _, c := range clauses {
		body = body[:0]
		for _, v := range c {
			if v > 0 {
				body = append(body, solver.Neg(x[v]))
			} else {
				body = append(body, solver.Pos(x[-v]))
			}
		}
		p.AddConstraint(body...)
	}
	return p
}
