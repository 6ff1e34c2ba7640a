package encode

import (
	"fmt"
	"slices"
	"time"

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
	q     *solver.Program // the rest, over its own atoms
	orig  []solver.Atom   // orig[i]: the program's atom that atom i of q stands for
	fixed []solver.Atom   // the incumbent's true fixed atoms, sorted
}

// Statement kinds of a stmtIndex reference (the top two bits).
const (
	refRule uint32 = iota << 30
	refChoice
	refBound
	refWeak
	refMask = 3 << 30
)

// stmtIndex lists, for every atom of a program, the statements it occurs
// in, so that a step visits only what its free atoms touch.
type stmtIndex struct {
	mark   programMark
	byAtom [][]uint32 // atom -> kind|index of each statement mentioning it
	stamp  []uint32   // per statement kind and index: last visit (see gen)
	gen    uint32
	newID  []solver.Atom // per program atom: its atom in the step's program, 0 for none
}

// index returns the statement index of p, rebuilt when p has grown.
func (ix *stmtIndex) update(p *solver.Program) {
	if ix.byAtom != nil && ix.mark == markOf(p) {
		return
	}
	n := p.NumAtoms()
	ix.mark = markOf(p)
	ix.byAtom = make([][]uint32, n+1)
	ix.newID = make([]solver.Atom, n+1)
	add := func(a solver.Atom, ref uint32) {
		if l := ix.byAtom[a]; len(l) == 0 || l[len(l)-1] != ref {
			ix.byAtom[a] = append(l, ref)
		}
	}
	for i, r := range p.Rules {
		if r.Head != 0 {
			add(r.Head, refRule|uint32(i))
		}
		for _, l := range r.Body {
			add(l.Atom(), refRule|uint32(i))
		}
	}
	for i, ch := range p.Choices {
		for _, h := range ch.Heads {
			add(h, refChoice|uint32(i))
		}
		for _, l := range ch.Body {
			add(l.Atom(), refChoice|uint32(i))
		}
	}
	for i, b := range p.Bounds {
		for _, l := range b.Lits {
			add(l.Atom(), refBound|uint32(i))
		}
		for _, l := range b.Cond {
			add(l.Atom(), refBound|uint32(i))
		}
	}
	for i, w := range p.Weaks {
		for _, l := range w.Body {
			add(l.Atom(), refWeak|uint32(i))
		}
	}
	ix.stamp = make([]uint32, len(p.Rules)+len(p.Choices)+len(p.Bounds)+len(p.Weaks))
	ix.gen = 0
}

// splitProgram partially evaluates p on the incumbent's values of the atoms
// not in reach, visiting only the statements that mention an atom in
// reach (every other statement holds in the incumbent, or is a constant
// weak constraint). keepWeak filters the weak constraints (by index). It
// returns false when the fixed atoms do not form a splitting set (a choice
// rule or a rule defining a fixed atom depends on a changeable one); the
// caller then builds from the whole program.
func splitProgram(p *solver.Program, ix *stmtIndex, reach []bool, incumbent []solver.Atom, keepWeak func(int) bool) (*splitStep, bool) {
	ix.update(p)
	n := p.NumAtoms()
	val := make([]bool, n+1)
	for _, a := range incumbent {
		val[a] = true
	}
	st := &splitStep{q: solver.NewProgram(), orig: []solver.Atom{0}}
	q := st.q
	defer func() {
		for _, a := range st.orig[1:] {
			ix.newID[a] = 0
		}
	}()
	for a := 1; a <= n; a++ {
		if reach[a] {
			ix.newID[a] = q.NewAtom("")
			st.orig = append(st.orig, solver.Atom(a))
		} else if val[a] {
			st.fixed = append(st.fixed, solver.Atom(a))
		}
	}
	// value reports whether literal l is fixed and then its value.
	value := func(l solver.Lit) (fixed, holds bool) {
		a := l.Atom()
		if reach[a] {
			return false, false
		}
		return true, val[a] != l.IsNeg()
	}
	mapLit := func(l solver.Lit) solver.Lit {
		if l.IsNeg() {
			return solver.Neg(ix.newID[l.Atom()])
		}
		return solver.Pos(ix.newID[l.Atom()])
	}
	// rest maps the changeable literals of a conjunction and drops the
	// fixed ones; ok is false when one of them is false (the conjunction
	// is).
	rest := func(body []solver.Lit) (out []solver.Lit, ok bool) {
		for _, l := range body {
			fixed, holds := value(l)
			if !fixed {
				out = append(out, mapLit(l))
				continue
			}
			if !holds {
				return nil, false
			}
		}
		return out, true
	}
	hasReach := func(lits []solver.Lit) bool {
		for _, l := range lits {
			if reach[l.Atom()] {
				return true
			}
		}
		return false
	}
	nr, nc, nb := uint32(len(p.Rules)), uint32(len(p.Choices)), uint32(len(p.Bounds))
	ix.gen++
	for _, a := range st.orig[1:] {
		for _, ref := range ix.byAtom[a] {
			i := ref &^ refMask
			slot := i
			switch ref & refMask {
			case refChoice:
				slot += nr
			case refBound:
				slot += nr + nc
			case refWeak:
				slot += nr + nc + nb
			}
			if ix.stamp[slot] == ix.gen {
				continue
			}
			ix.stamp[slot] = ix.gen
			switch ref & refMask {
			case refRule:
				r := p.Rules[i]
				if r.Head != 0 && !reach[r.Head] {
					return nil, false // a fixed atom defined from a changeable one
				}
				body, ok := rest(r.Body)
				if !ok {
					continue
				}
				h := solver.Atom(0)
				if r.Head != 0 {
					h = ix.newID[r.Head]
				}
				q.Rules = append(q.Rules, solver.Rule{Head: h, Body: body})
			case refChoice:
				ch := p.Choices[i]
				var heads []solver.Atom
				for _, h := range ch.Heads {
					if reach[h] {
						heads = append(heads, ix.newID[h])
					}
				}
				if len(heads) < len(ch.Heads) && hasReach(ch.Body) {
					return nil, false
				}
				if len(heads) == 0 {
					continue
				}
				body, ok := rest(ch.Body)
				if !ok {
					continue
				}
				q.Choices = append(q.Choices, solver.Choice{Heads: heads, Body: body})
			case refBound:
				splitBound(q, p.Bounds[i], value, mapLit, rest)
			case refWeak:
				w := p.Weaks[i]
				if !keepWeak(int(i)) {
					continue
				}
				body, ok := rest(w.Body)
				if !ok || len(body) == 0 {
					continue // never paid, or paid whatever the step does: a constant
				}
				q.Weaks = append(q.Weaks, solver.Weak{Body: body, Weight: w.Weight, Level: w.Level})
			}
		}
	}
	return st, true
}

// splitBound adds bound b evaluated on the fixed literals to q.
func splitBound(q *solver.Program, b solver.Bound, value func(solver.Lit) (bool, bool), mapLit func(solver.Lit) solver.Lit, rest func([]solver.Lit) ([]solver.Lit, bool)) {
	cond, ok := rest(b.Cond)
	if !ok {
		return
	}
	var lits []solver.Lit
	t := 0
	for _, l := range b.Lits {
		fixed, holds := value(l)
		switch {
		case !fixed:
			lits = append(lits, mapLit(l))
		case holds:
			t++
		}
	}
	lower, upper := b.Lower, b.Upper
	if lower != solver.NoBound {
		lower = max(lower-t, 0)
	}
	if upper != solver.NoBound {
		if upper -= t; upper < 0 {
			q.Rules = append(q.Rules, solver.Rule{Body: cond}) // broken whenever cond holds
			return
		}
	}
	if lower <= 0 && (upper == solver.NoBound || upper >= len(lits)) {
		return // can never be broken
	}
	q.Bounds = append(q.Bounds, solver.Bound{Lits: lits, Lower: lower, Upper: upper, Cond: cond})
}

// model joins a model of the step's program with the fixed part: a model
// of the whole program, sorted.
func (st *splitStep) model(m []solver.Atom) []solver.Atom {
	out := make([]solver.Atom, 0, len(m)+len(st.fixed))
	out = append(out, st.fixed...)
	for _, a := range m {
		out = append(out, st.orig[a])
	}
	slices.Sort(out)
	return out
}

// Derived is an engine for one neighbourhood step (see Search.Derive).
type Derived struct {
	s     *solver.Solver
	split *splitStep // nil: the engine holds the whole program
}

// Proven reports whether the engine's last optimisation call proved the
// neighbourhood's optimum.
func (d *Derived) Proven() bool { return d.s.Proven() }

// whole turns a model of the derived engine into a model of the program.
func (d *Derived) whole(model []solver.Atom) []solver.Atom {
	if d.split == nil {
		return model
	}
	return d.split.model(model)
}

// Derive returns an engine for one neighbourhood step: the program with
// every atom outside reach (the start atoms of the sections that stay, and
// what depends on them alone) at its value in the incumbent, and only the
// weak constraints keepWeak accepts, seeded with seed and trying the
// incumbent's starts first. Normally the engine holds only the part of the
// program that can change (splitProgram), so building it costs what the
// neighbourhood touches; when the fixed atoms are no splitting set, it
// holds the whole program with the fixed starts as facts. Either way they
// are decided at level 0 and its models, read through Improve, are models
// of the program.
//
// Measured against a clone of the live engine with the fixed starts as
// unit clauses (solver.Solver.Clone; BenchmarkNeighbourhoodSteps, 2,000
// sections, shared machine): 1.19 steps/s with 1.4 % of the time building
// engines here, 0.58 steps/s and 7.6 % with clones, which copy the whole
// term's tables and keep every weak constraint.
func (x *Search) Derive(reach []bool, keepWeak func(i int) bool, seed int64, incumbent []solver.Atom) (*Derived, error) {
	t0 := time.Now()
	defer func() {
		x.tally.Timings.Solve += time.Since(t0)
		x.tally.Timings.Derive += time.Since(t0)
	}()
	d := &Derived{}
	var q *solver.Program
	if split, ok := splitProgram(x.p, &x.index, reach, incumbent, keepWeak); ok {
		d.split, q = split, split.q
	} else {
		w := *x.p
		w.Rules = x.p.Rules[:len(x.p.Rules):len(x.p.Rules)]
		for _, a := range incumbent {
			if !reach[a] && isDecision(x.cat.AtomInfo(a).Kind) {
				w.Rules = append(w.Rules, solver.Rule{Head: a})
			}
		}
		w.Weaks = nil
		for i, wk := range x.p.Weaks {
			if keepWeak(i) {
				w.Weaks = append(w.Weaks, wk)
			}
		}
		q = &w
	}
	opts := x.opts
	opts.Seed = seed
	s, err := solver.New(q, opts)
	if err != nil {
		return nil, fmt.Errorf("internal error: the engine rejects a neighbourhood program: %w", err)
	}
	x.builds++
	if x.progress != nil {
		s.SetProgress(x.progress)
	}
	if d.split == nil {
		setStartPhases(s, x.cat, x.p.NumAtoms(), incumbent)
	} else {
		in := make(map[solver.Atom]bool, len(incumbent))
		for _, a := range incumbent {
			in[a] = true
		}
		for i, a := range d.split.orig[1:] {
			if isDecision(x.cat.AtomInfo(a).Kind) {
				s.SetPhase(solver.Atom(i+1), in[a])
			}
		}
	}
	d.s = s
	return d, nil
}
