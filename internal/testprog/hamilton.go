package testprog

import (
	"fmt"

	"github.com/termwright/termwright/solver"
)

// Arc is a directed edge between vertices numbered from 1.
type Arc struct{ From, To int }

// Hamiltonian encodes directed Hamiltonian cycles of the graph with n
// vertices and the given arcs: a choice of arcs cyc(u,v), exactly one
// chosen arc out of and into every vertex, and reachability from vertex 1
// along chosen arcs,
//
//	reach(v) :- cyc(1,v).
//	reach(v) :- reach(u), cyc(u,v).   (u ≠ 1)
//	:- not reach(v).                  (every vertex, 1 included)
//
// The reach rules form positive loops, so the program is not tight: its
// completion also has models made of several disjoint cycles, which only
// unfounded-set reasoning rules out. It returns the program and the cyc
// atoms, onto which models project one to one with cycles. Known counts:
// the complete digraph on n vertices has (n−1)! directed Hamiltonian cycles
// (choose the order of the other n−1 vertices after vertex 1); the 3-cube
// graph has 6 undirected ones (OEIS A066037), 12 directed.
func Hamiltonian(n int, arcs []Arc) (*solver.Program, []solver.Atom) {
	p := solver.NewProgram()
	out := make([][]solver.Atom, n+1)
	into := make([][]solver.Atom, n+1)
	cyc := make([]solver.Atom, len(arcs))
	for i, e := range arcs {
		a := p.NewAtom(fmt.Sprintf("cyc(%d,%d)", e.From, e.To))
		cyc[i] = a
		out[e.From] = append(out[e.From], a)
		into[e.To] = append(into[e.To], a)
	}
	p.AddChoice(cyc, solver.NoBound, solver.NoBound)
	for v := 1; v <= n; v++ {
		p.AddBound(lits(out[v]), 1, 1)
		p.AddBound(lits(into[v]), 1, 1)
	}
	reach := make([]solver.Atom, n+1)
	for v := 1; v <= n; v++ {
		reach[v] = p.NewAtom(fmt.Sprintf("reach(%d)", v))
	}
	for i, e := range arcs {
		if e.From == 1 {
			p.AddRule(reach[e.To], solver.Pos(cyc[i]))
		} else {
			p.AddRule(reach[e.To], solver.Pos(reach[e.From]), solver.Pos(cyc[i]))
		}
	}
	for v := 1; v <= n; v++ {
		p.AddConstraint(solver.Neg(reach[v]))
	}
	p.Show(cyc...)
	return p, cyc
}

// CompleteArcs lists the arcs of the complete digraph on n vertices (every
// ordered pair of distinct vertices).
func CompleteArcs(n int) []Arc {
	var arcs []Arc
	for u := 1; u <= n; u++ {
		for v := 1; v <= n; v++ {
			if u != v {
				arcs = append(arcs, Arc{u, v})
			}
		}
	}
	return arcs
}

// CubeArcs lists the arcs of the d-dimensional hypercube graph: vertices
// 1..2^d stand for the bit strings 0..2^d−1, joined when they differ in one
// bit, each edge in both directions.
func CubeArcs(d int) []Arc {
	var arcs []Arc
	for u := 0; u < 1<<d; u++ {
		for b := 0; b < d; b++ {
			arcs = append(arcs, Arc{u + 1, u ^ (1 << b) + 1})
		}
	}
	return arcs
}

func lits(atoms []solver.Atom) []solver.Lit {
	out := make([]solver.Lit, len(atoms))
	for i, a := range atoms {
		out[i] = solver.Pos(a)
	}
	return out
}
