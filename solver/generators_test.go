package solver

import (
	"fmt"
	"math/rand/v2"
	"slices"
)

// Program generators shared by the engine's tests and benchmarks. Every
// generator is deterministic for a given seed.

// engRandom3SAT returns round(ratio*n) random clauses of three distinct
// variables over 1..n with random signs (DIMACS-style signed integers), the
// fixed-clause-length model of Mitchell, Selman & Levesque (1992).
func engRandom3SAT(n int, ratio float64, seed uint64) [][]int {
	r := rand.New(rand.NewPCG(seed, 3))
	m := int(ratio*float64(n) + 0.5)
	cls := make([][]int, m)
	for i := range cls {
		var c []int
		for len(c) < 3 {
			v := 1 + r.IntN(n)
			if slices.ContainsFunc(c, func(x int) bool { return x == v || x == -v }) {
				continue
			}
			if r.IntN(2) == 0 {
				v = -v
			}
			c = append(c, v)
		}
		cls[i] = c
	}
	return cls
}

// engSATProgram writes a CNF as a program: "{x}." for each variable and the
// integrity constraint ":- not l1', ..., not lk'." for each clause, where a
// positive literal x becomes "not x" and a negative one "x".
func engSATProgram(n int, clauses [][]int) *Program {
	p := NewProgram()
	for i := 1; i <= n; i++ {
		a := p.NewAtom(fmt.Sprintf("x%d", i))
		p.AddChoice([]Atom{a}, NoBound, NoBound)
	}
	for _, c := range clauses {
		body := make([]Lit, len(c))
		for i, x := range c {
			if x > 0 {
				body[i] = Neg(Atom(x))
			} else {
				body[i] = Pos(Atom(-x))
			}
		}
		p.AddConstraint(body...)
	}
	return p
}

// engPigeonhole puts each of pigeons pigeons in exactly one of holes holes,
// at most one pigeon per hole, with native bounds.
func engPigeonhole(pigeons, holes int) *Program {
	p := NewProgram()
	at := make([][]Atom, pigeons)
	for i := range at {
		at[i] = make([]Atom, holes)
		for j := range at[i] {
			at[i][j] = p.NewAtom(fmt.Sprintf("in(%d,%d)", i, j))
		}
		p.AddChoice(at[i], 1, 1)
	}
	for j := 0; j < holes; j++ {
		lits := make([]Lit, pigeons)
		for i := range lits {
			lits[i] = Pos(at[i][j])
		}
		p.AddBound(lits, NoBound, 1)
	}
	return p
}

// engQueens places n queens on an n×n board, one per row (choice with
// bound), at most one per column and diagonal.
func engQueens(n int) *Program {
	p := NewProgram()
	q := make([][]Atom, n)
	for r := range q {
		q[r] = make([]Atom, n)
		for c := range q[r] {
			q[r][c] = p.NewAtom(fmt.Sprintf("q(%d,%d)", r, c))
		}
		p.AddChoice(q[r], 1, 1)
	}
	line := func(cells [][2]int) {
		if len(cells) < 2 {
			return
		}
		lits := make([]Lit, len(cells))
		for i, rc := range cells {
			lits[i] = Pos(q[rc[0]][rc[1]])
		}
		p.AddBound(lits, NoBound, 1)
	}
	for c := 0; c < n; c++ {
		var cells [][2]int
		for r := 0; r < n; r++ {
			cells = append(cells, [2]int{r, c})
		}
		line(cells)
	}
	for d := -(n - 1); d <= n-1; d++ {
		var down, up [][2]int
		for r := 0; r < n; r++ {
			if c := r + d; c >= 0 && c < n {
				down = append(down, [2]int{r, c})
			}
			if c := n - 1 - r + d; c >= 0 && c < n {
				up = append(up, [2]int{r, c})
			}
		}
		line(down)
		line(up)
	}
	return p
}

// engHamiltonian encodes directed Hamiltonian cycles of the graph with arcs
// arcs on vertices 0..n-1 with reachability rules, a non-tight program:
// choose arcs, exactly one chosen arc leaves and one enters each vertex,
// reach(v) :- in(0,v). reach(v) :- reach(u), in(u,v). :- not reach(v).
// It returns the program and the arc atoms.
func engHamiltonian(n int, arcs [][2]int) (*Program, []Atom) {
	p := NewProgram()
	in := make([]Atom, len(arcs))
	for i, a := range arcs {
		in[i] = p.NewAtom(fmt.Sprintf("in(%d,%d)", a[0], a[1]))
	}
	p.AddChoice(in, NoBound, NoBound)
	reach := make([]Atom, n)
	for v := range reach {
		reach[v] = p.NewAtom(fmt.Sprintf("reach(%d)", v))
	}
	for v := 0; v < n; v++ {
		var out, inc []Lit
		for i, a := range arcs {
			if a[0] == v {
				out = append(out, Pos(in[i]))
			}
			if a[1] == v {
				inc = append(inc, Pos(in[i]))
			}
		}
		p.AddBound(out, 1, 1)
		p.AddBound(inc, 1, 1)
	}
	for i, a := range arcs {
		if a[0] == 0 {
			p.AddRule(reach[a[1]], Pos(in[i]))
		} else {
			p.AddRule(reach[a[1]], Pos(reach[a[0]]), Pos(in[i]))
		}
	}
	for v := 0; v < n; v++ {
		p.AddConstraint(Neg(reach[v]))
	}
	return p, in
}

// engCompleteArcs returns every arc u->v (u != v) on n vertices.
func engCompleteArcs(n int) [][2]int {
	var arcs [][2]int
	for u := 0; u < n; u++ {
		for v := 0; v < n; v++ {
			if u != v {
				arcs = append(arcs, [2]int{u, v})
			}
		}
	}
	return arcs
}

// engCubeArcs returns both directions of every edge of the 3-cube graph
// (vertices 0..7, edges between numbers differing in one bit).
func engCubeArcs() [][2]int {
	var arcs [][2]int
	for u := 0; u < 8; u++ {
		for b := 0; b < 3; b++ {
			arcs = append(arcs, [2]int{u, u ^ 1<<b})
		}
	}
	return arcs
}

// engRandomProgram builds a random program over n atoms mixing facts,
// normal rules with negation and positive loops, choice rules (some with
// bounds), integrity constraints, conditional bounds and weak constraints.
func engRandomProgram(r *rand.Rand, n int) *Program {
	p := NewProgram()
	atoms := make([]Atom, n)
	for i := range atoms {
		atoms[i] = p.NewAtom(fmt.Sprintf("a%d", i+1))
	}
	lit := func() Lit {
		a := atoms[r.IntN(n)]
		if r.IntN(3) == 0 {
			return Neg(a)
		}
		return Pos(a)
	}
	body := func(max int) []Lit {
		b := make([]Lit, r.IntN(max+1))
		for i := range b {
			b[i] = lit()
		}
		return b
	}
	rules := n + r.IntN(2*n)
	for i := 0; i < rules; i++ {
		switch k := r.IntN(20); {
		case k < 11:
			b := body(3)
			if len(b) == 0 && r.IntN(3) != 0 {
				b = append(b, lit())
			}
			p.AddRule(atoms[r.IntN(n)], b...)
		case k < 15:
			var heads []Atom // distinct: bounds count each literal once
			for j := 1 + r.IntN(3); j > 0; j-- {
				if a := atoms[r.IntN(n)]; !slices.Contains(heads, a) {
					heads = append(heads, a)
				}
			}
			lo, hi := NoBound, NoBound
			if r.IntN(3) == 0 {
				lo = r.IntN(2)
			}
			if r.IntN(3) == 0 {
				hi = r.IntN(3)
				if lo != NoBound && hi < lo {
					hi = lo
				}
			}
			p.AddChoice(heads, lo, hi, body(2)...)
		case k < 18:
			b := body(3)
			if len(b) == 0 {
				b = append(b, lit())
			}
			p.AddConstraint(b...)
		default:
			var ls []Lit
			for _, l := range body(4) {
				if !slices.Contains(ls, l) {
					ls = append(ls, l)
				}
			}
			lo, hi := NoBound, NoBound
			if r.IntN(2) == 0 {
				lo = r.IntN(3)
			}
			if lo == NoBound || r.IntN(2) == 0 {
				hi = r.IntN(4)
				if lo != NoBound && hi < lo {
					hi = lo
				}
			}
			p.AddBound(ls, lo, hi, body(2)...)
		}
	}
	for i := r.IntN(4); i > 0; i-- {
		p.AddWeak(int64(1+r.IntN(5)), r.IntN(2), body(2)...)
	}
	return p
}

// engTimetableLike builds a synthetic weekly-timetabling program: each of
// sections sections picks exactly one of periods periods through a choice
// rule with bounds; each uses two of resources resources (an instructor and
// a cohort), and each resource has at most one section per period; busy
// atoms "busy(r,p) :- start(s,p)" for the sections of r carry the
// cardinality. When weak is set, three quarters of the start atoms carry a
// weak constraint of weight 1..4 at level 0 or 1 (disliked periods).
func engTimetableLike(sections, periods, resources int, seed uint64, weak bool) *Program {
	r := rand.New(rand.NewPCG(seed, 5))
	p := NewProgram()
	start := make([][]Atom, sections)
	uses := make([][]int, resources)
	for s := range start {
		start[s] = make([]Atom, periods)
		for t := range start[s] {
			start[s][t] = p.NewAtom(fmt.Sprintf("start(%d,%d)", s, t))
		}
		p.AddChoice(start[s], 1, 1)
		a, b := r.IntN(resources), r.IntN(resources)
		uses[a] = append(uses[a], s)
		if b != a {
			uses[b] = append(uses[b], s)
		}
	}
	for res, ss := range uses {
		if len(ss) < 2 {
			continue
		}
		for t := 0; t < periods; t++ {
			lits := make([]Lit, len(ss))
			for i, s := range ss {
				b := p.NewAtom(fmt.Sprintf("busy(%d,%d,%d)", res, s, t))
				p.AddRule(b, Pos(start[s][t]))
				lits[i] = Pos(b)
			}
			p.AddBound(lits, NoBound, 1)
		}
	}
	if weak {
		for _, row := range start {
			for _, a := range row {
				if r.IntN(4) != 0 {
					p.AddWeak(int64(1+r.IntN(4)), r.IntN(2), Pos(a))
				}
			}
		}
	}
	return p
}

// engLoopyProgram builds a random program dominated by positive
// dependencies (many positive loops through normal and choice rules), with a
// few negative literals, constraints and bounds: hard cases for unfounded
// sets.
func engLoopyProgram(r *rand.Rand, n int) *Program {
	p := NewProgram()
	atoms := make([]Atom, n)
	for i := range atoms {
		atoms[i] = p.NewAtom(fmt.Sprintf("a%d", i+1))
	}
	pick := func() Atom { return atoms[r.IntN(n)] }
	for i := 0; i < n/3+1; i++ {
		p.AddChoice([]Atom{pick()}, NoBound, NoBound) // external supports
	}
	for i := 0; i < 2*n; i++ {
		body := []Lit{Pos(pick())}
		if r.IntN(2) == 0 {
			body = append(body, Pos(pick()))
		}
		if r.IntN(5) == 0 {
			body = append(body, Neg(pick()))
		}
		if r.IntN(4) == 0 {
			p.AddChoice([]Atom{pick()}, NoBound, NoBound, body...)
		} else {
			p.AddRule(pick(), body...)
		}
	}
	for i := r.IntN(3); i > 0; i-- {
		p.AddConstraint(Neg(pick()), Pos(pick()))
	}
	if r.IntN(2) == 0 {
		var lits []Lit
		for _, a := range atoms[:n/2] {
			lits = append(lits, Pos(a))
		}
		p.AddBound(lits, 1+r.IntN(n/4+1), NoBound)
	}
	return p
}

// engPlantedArcs returns a random directed graph on n vertices containing a
// hidden Hamiltonian cycle, with extra random arcs up to degree arcs per
// vertex on average, in a deterministic order.
func engPlantedArcs(n, degree int, seed uint64) [][2]int {
	r := rand.New(rand.NewPCG(seed, 17))
	perm := r.Perm(n)
	seen := map[[2]int]bool{}
	var arcs [][2]int
	add := func(u, v int) {
		if u != v && !seen[[2]int{u, v}] {
			seen[[2]int{u, v}] = true
			arcs = append(arcs, [2]int{u, v})
		}
	}
	for i := range perm {
		add(perm[i], perm[(i+1)%n])
	}
	for len(arcs) < degree*n {
		add(r.IntN(n), r.IntN(n))
	}
	return arcs
}
