package solver

import (
	"slices"
)

// An independent, exponential reference for the engine's tests: it tries
// every set of atoms and keeps those that are stable by the definition of
// Gelfond & Lifschitz (1988) — the least model of the reduct equals the set
// — and satisfy every constraint and bound (set semantics: each distinct
// literal of a bound counts once). For programs of at most about 14 atoms.

// engIsStable reports whether the set in (in[a] for atom a) is a stable
// model of p.
func engIsStable(p *Program, in []bool) bool {
	holds := func(body []Lit) bool {
		for _, l := range body {
			if in[l.Atom()] == l.IsNeg() {
				return false
			}
		}
		return true
	}
	n := p.NumAtoms()
	least := make([]bool, n+1)
	// Naive fixpoint of the reduct (quadratic, independent of the engine).
	for changed := true; changed; {
		changed = false
		fire := func(h Atom, body []Lit) {
			if least[h] {
				return
			}
			for _, l := range body {
				if l.IsNeg() {
					if in[l.Atom()] {
						return
					}
				} else if !least[l.Atom()] {
					return
				}
			}
			least[h] = true
			changed = true
		}
		for _, r := range p.Rules {
			if r.Head != 0 {
				fire(r.Head, r.Body)
			}
		}
		for _, c := range p.Choices {
			for _, h := range c.Heads {
				if in[h] {
					fire(h, c.Body)
				}
			}
		}
	}
	if !slices.Equal(least, in) {
		return false
	}
	for _, r := range p.Rules {
		if r.Head == 0 && holds(r.Body) {
			return false
		}
	}
	for _, b := range p.Bounds {
		if !holds(b.Cond) {
			continue
		}
		var lits []Lit
		for _, l := range b.Lits {
			if !slices.Contains(lits, l) {
				lits = append(lits, l)
			}
		}
		k := 0
		for _, l := range lits {
			if in[l.Atom()] != l.IsNeg() {
				k++
			}
		}
		if (b.Lower != NoBound && k < b.Lower) || (b.Upper != NoBound && k > b.Upper) {
			return false
		}
	}
	return true
}

// engAllStable returns every stable model of p as a sorted list of atoms,
// models in increasing order of their bit pattern.
func engAllStable(p *Program) [][]Atom {
	n := p.NumAtoms()
	in := make([]bool, n+1)
	var out [][]Atom
	for mask := 0; mask < 1<<n; mask++ {
		var m []Atom
		for a := 1; a <= n; a++ {
			in[a] = mask&(1<<(a-1)) != 0
			if in[a] {
				m = append(m, Atom(a))
			}
		}
		if engIsStable(p, in) {
			if m == nil {
				m = []Atom{}
			}
			out = append(out, m)
		}
	}
	return out
}

// engCost returns the cost per level (highest level first) of a model,
// counting each weak constraint whose body holds.
func engCost(p *Program, model []Atom) []int64 {
	in := make([]bool, p.NumAtoms()+1)
	for _, a := range model {
		in[a] = true
	}
	var levels []int
	for _, w := range p.Weaks {
		if !slices.Contains(levels, w.Level) {
			levels = append(levels, w.Level)
		}
	}
	slices.Sort(levels)
	slices.Reverse(levels)
	cost := make([]int64, len(levels))
	for _, w := range p.Weaks {
		holds := true
		for _, l := range w.Body {
			if in[l.Atom()] == l.IsNeg() {
				holds = false
				break
			}
		}
		if holds {
			cost[slices.Index(levels, w.Level)] += w.Weight
		}
	}
	return cost
}
