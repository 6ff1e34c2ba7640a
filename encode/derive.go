package encode

import (
	"slices"

	"github.com/termwright/termwright/solver"
)

// A neighbourhood step's program, cut down to the part that can change.
//
// The atoms that cannot change when only the free sections move (fixed:
// the start atoms of the other sections and every atom whose rules depend
// only on such atoms) form a splitting set of the program (Lifschitz and
// Turner 1994): no rule with a head among them has a body atom outside
// them. So the stable models of the program that agree with the incumbent
// on the fixed atoms are exactly the incumbent's fixed part joined with
// the stable models of the rest of the program partially evaluated on that
// part: every fixed literal replaced by its value in the incumbent. The
// engine is built from that rest alone, so its construction costs what the
// neighbourhood touches, not the whole term.

// splitStep is the program of one neighbourhood step and how to read its
// models back.
type splitStep struct {
	q     *solver.Program // the rest, atoms numbered as in the whole program
	fixed []solver.Atom   // the incumbent's true fixed atoms, sorted
}

// splitProgram partially evaluates p on the incumbent's values of the atoms
// not in reach. keepWeak filters the weak constraints (by index). It
// returns false when the fixed atoms do not form a splitting set (a choice
// rule or a rule defining a fixed atom depends on a changeable one); the
// caller then builds from the whole program.
func splitProgram(p *solver.Program, reach []bool, incumbent []solver.Atom, keepWeak func(int) bool) (*splitStep, bool) {
	n := p.NumAtoms()
	val := make([]bool, n+1)
	for _, a := range incumbent {
		val[a] = true
	}
	st := &splitStep{q: &solver.Program{}}
	// value reports whether literal l is fixed and then its value.
	value := func(l solver.Lit) (fixed, holds bool) {
		a := l.Atom()
		if reach[a] {
			return false, false
		}
		return true, val[a] != l.IsNeg()
	}
	// rest drops the fixed literals of a conjunction; ok is false when one
	// of them is false (the conjunction is).
	var scratch []solver.Lit
	rest := func(body []solver.Lit) (out []solver.Lit, ok bool) {
		scratch = scratch[:0]
		for _, l := range body {
			fixed, holds := value(l)
			if !fixed {
				scratch = append(scratch, l)
				continue
			}
			if !holds {
				return nil, false
			}
		}
		return slices.Clone(scratch), true
	}
	q := st.q
	*q = *solver.NewProgram()
	for a := 1; a <= n; a++ {
		q.NewAtom(p.Name(solver.Atom(a)))
	}
	for _, r := range p.Rules {
		if r.Head != 0 && !reach[r.Head] {
			for _, l := range r.Body {
				if reach[l.Atom()] {
					return nil, false
				}
			}
			continue // defines a fixed atom: the bottom part
		}
		body, ok := rest(r.Body)
		if !ok {
			continue
		}
		q.Rules = append(q.Rules, solver.Rule{Head: r.Head, Body: body})
	}
	for _, ch := range p.Choices {
		var heads []solver.Atom
		for _, h := range ch.Heads {
			if reach[h] {
				heads = append(heads, h)
			}
		}
		if len(heads) < len(ch.Heads) {
			for _, l := range ch.Body {
				if reach[l.Atom()] {
					return nil, false
				}
			}
		}
		if len(heads) == 0 {
			continue
		}
		body, ok := rest(ch.Body)
		if !ok {
			continue
		}
		q.Choices = append(q.Choices, solver.Choice{Heads: heads, Body: body})
	}
	for _, b := range p.Bounds {
		cond, ok := rest(b.Cond)
		if !ok {
			continue
		}
		var lits []solver.Lit
		t := 0
		for _, l := range b.Lits {
			fixed, holds := value(l)
			switch {
			case !fixed:
				lits = append(lits, l)
			case holds:
				t++
			}
		}
		lower, upper := b.Lower, b.Upper
		if lower != solver.NoBound {
			lower = max(lower-t, 0)
		}
		if upper != solver.NoBound {
			upper -= t
			if upper < 0 {
				// The incumbent breaks it: impossible for a model, but
				// keep the program honest rather than drop the bound.
				q.Rules = append(q.Rules, solver.Rule{Body: cond})
				continue
			}
		}
		if len(lits) == 0 && lower <= 0 {
			continue
		}
		if (lower == solver.NoBound || lower == 0) && (upper == solver.NoBound || upper >= len(lits)) {
			continue // can never be broken
		}
		q.Bounds = append(q.Bounds, solver.Bound{Lits: lits, Lower: lower, Upper: upper, Cond: cond})
	}
	for i, w := range p.Weaks {
		if !keepWeak(i) {
			continue
		}
		body, ok := rest(w.Body)
		if !ok || len(body) == 0 {
			continue // never paid, or paid whatever the step does: a constant
		}
		q.Weaks = append(q.Weaks, solver.Weak{Body: body, Weight: w.Weight, Level: w.Level})
	}
	for a := 1; a <= n; a++ {
		if !reach[a] && val[a] {
			st.fixed = append(st.fixed, solver.Atom(a))
		}
	}
	return st, true
}

// model joins a model of the step's program with the fixed part: a model
// of the whole program, sorted.
func (st *splitStep) model(m []solver.Atom) []solver.Atom {
	out := make([]solver.Atom, 0, len(m)+len(st.fixed))
	out = append(out, st.fixed...)
	out = append(out, m...)
	slices.Sort(out)
	return slices.Compact(out)
}
