package solver

import (
	"errors"
	"fmt"
	"math/rand/v2"
	"slices"
)

// ErrProgram is wrapped by every error New returns for an invalid program.
var ErrProgram = errors.New("invalid program")

// New builds a solver for p: it checks p, translates it by Clark completion
// (Clark 1978) into clauses over the atoms and one variable per distinct rule
// body of two or more literals, adds a counting propagator per bound and,
// when the positive dependency graph has cycles, the unfounded-set checker.
// p is not retained. An error wrapping ErrOptions or ErrProgram names what is
// wrong. A program with no stable model is not an error: Solve reports it.
func New(p *Program, opts Options) (*Solver, error) {
	o, err := opts.withDefaults()
	if err != nil {
		return nil, err
	}
	if err := checkProgram(p); err != nil {
		return nil, err
	}
	s := &Solver{opts: o, ok: true}
	s.rng = rand.New(rand.NewPCG(uint64(o.Seed), 0x9e3779b97f4a7c15))
	s.initTables()
	s.numAtoms = p.NumAtoms()
	for i := 0; i < s.numAtoms; i++ {
		s.newVar()
	}
	b := completion{s: s, p: p, index: map[uint64][]uint32{}}
	b.build()
	s.nextReduce = int64(o.ReduceFirst)
	s.reduceIncr = int64(o.ReduceInc)
	s.lbdQueue = make([]int, o.GlucoseWindow)
	return s, nil
}

// checkProgram reports the first reference to a missing atom or an
// impossible bound.
func checkProgram(p *Program) error {
	n := p.NumAtoms()
	atom := func(a Atom) bool { return a >= 1 && int(a) <= n }
	lits := func(ls []Lit) (Lit, bool) {
		for _, l := range ls {
			if !atom(l.Atom()) {
				return l, false
			}
		}
		return 0, true
	}
	bad := func(what string, i int, format string, args ...any) error {
		return fmt.Errorf("%w: %s %d: %s (the program has %d atoms; create atoms with NewAtom before using them)",
			ErrProgram, what, i+1, fmt.Sprintf(format, args...), n)
	}
	for i, r := range p.Rules {
		if r.Head != 0 && !atom(r.Head) {
			return bad("rule", i, "head is atom %d", r.Head)
		}
		if l, ok := lits(r.Body); !ok {
			return bad("rule", i, "body literal refers to atom %d", l.Atom())
		}
	}
	for i, c := range p.Choices {
		for _, h := range c.Heads {
			if !atom(h) {
				return bad("choice rule", i, "head is atom %d", h)
			}
		}
		if l, ok := lits(c.Body); !ok {
			return bad("choice rule", i, "body literal refers to atom %d", l.Atom())
		}
	}
	for i, b := range p.Bounds {
		if l, ok := lits(b.Lits); !ok {
			return bad("bound", i, "element refers to atom %d", l.Atom())
		}
		if l, ok := lits(b.Cond); !ok {
			return bad("bound", i, "condition refers to atom %d", l.Atom())
		}
		if b.Lower < NoBound || b.Upper < NoBound {
			return fmt.Errorf("%w: bound %d: limits %d..%d; a limit is NoBound (-1) or at least 0", ErrProgram, i+1, b.Lower, b.Upper)
		}
		if b.Lower != NoBound && b.Upper != NoBound && b.Lower > b.Upper {
			return fmt.Errorf("%w: bound %d: lower limit %d exceeds upper limit %d; swap or correct them", ErrProgram, i+1, b.Lower, b.Upper)
		}
	}
	for i, w := range p.Weaks {
		if l, ok := lits(w.Body); !ok {
			return bad("weak constraint", i, "body literal refers to atom %d", l.Atom())
		}
	}
	for i, a := range p.Shows {
		if !atom(a) {
			return bad("show", i, "atom %d", a)
		}
	}
	return nil
}

// completion translates a Program into the solver's clauses and
// constraints; it lives only during New.
type completion struct {
	s       *Solver
	p       *Program
	index   map[uint64][]uint32 // hash of a normalised body -> body ids with that hash
	bodies  [][]Lit             // per body id: normalised literals; id 0 is the empty body
	lits    []Lit               // per body id: literal true iff the body holds (0 for the empty body)
	support [][]uint32          // per atom: body ids of its rules and choice rules
	always  []bool              // per atom: has a rule or choice rule with an empty body
	scratch []Lit               // clause being built
}

// body returns the id of the body with literals ls (normalised, shared with
// equal bodies) and false when ls contains a literal and its complement.
func (b *completion) body(ls []Lit) (uint32, bool) {
	norm, taut := normalize(append(b.scratch[:0], ls...))
	if taut {
		return 0, false
	}
	if len(norm) == 0 {
		return 0, true
	}
	h := uint64(14695981039346656037)
	for _, l := range norm {
		h = (h ^ uint64(l)) * 1099511628211
	}
	for _, id := range b.index[h] {
		if slices.Equal(b.bodies[id], norm) {
			return id, true
		}
	}
	id := uint32(len(b.bodies))
	lits := append([]Lit(nil), norm...)
	b.bodies = append(b.bodies, lits)
	b.index[h] = append(b.index[h], id)
	if len(lits) == 1 {
		b.lits = append(b.lits, lits[0])
		return id, true
	}
	v := Pos(Atom(b.s.newVar()))
	b.lits = append(b.lits, v)
	// v <-> l1 ∧ ... ∧ lm
	for _, l := range lits {
		b.s.addClauseLevel0(append(b.scratch[:0], v^1, l))
	}
	c := append(b.scratch[:0], v)
	for _, l := range lits {
		c = append(c, l^1)
	}
	b.s.addClauseLevel0(c)
	return id, true
}

func (b *completion) build() {
	s, p := b.s, b.p
	n := s.numAtoms
	b.bodies = [][]Lit{nil}
	b.lits = []Lit{0}
	b.support = make([][]uint32, n+1)
	b.always = make([]bool, n+1)
	for _, r := range p.Rules {
		if r.Head == 0 {
			c := b.scratch[:0]
			for _, l := range r.Body {
				c = append(c, l^1)
			}
			s.addClauseLevel0(c)
			continue
		}
		id, ok := b.body(r.Body)
		if !ok {
			continue
		}
		h := Pos(r.Head)
		if id == 0 {
			b.always[r.Head] = true
			s.addClauseLevel0(append(b.scratch[:0], h))
			continue
		}
		s.addClauseLevel0(append(b.scratch[:0], b.lits[id]^1, h))
		b.support[r.Head] = append(b.support[r.Head], id)
	}
	for _, c := range p.Choices {
		id, ok := b.body(c.Body)
		if !ok {
			continue
		}
		for _, h := range c.Heads {
			if id == 0 {
				b.always[h] = true
			} else {
				b.support[h] = append(b.support[h], id)
			}
		}
	}
	for a := 1; a <= n; a++ {
		slices.Sort(b.support[a])
		b.support[a] = slices.Compact(b.support[a])
		if b.always[a] {
			continue
		}
		c := append(b.scratch[:0], Neg(Atom(a)))
		for _, id := range b.support[a] {
			c = append(c, b.lits[id])
		}
		s.addClauseLevel0(c)
	}
	for _, bd := range p.Bounds {
		id, ok := b.body(bd.Cond)
		if !ok {
			continue
		}
		s.addCard(bd.Lits, bd.Lower, bd.Upper, b.lits[id])
	}
	for _, w := range p.Weaks {
		if !slices.Contains(s.levels, w.Level) {
			s.levels = append(s.levels, w.Level)
		}
		id, ok := b.body(w.Body)
		if !ok || w.Weight == 0 {
			continue
		}
		s.weaks = append(s.weaks, weakLit{lit: b.lits[id], weight: w.Weight, level: w.Level})
	}
	slices.Sort(s.levels)
	slices.Reverse(s.levels)
	b.unfoundedSets()
}

// unfoundedSets finds the cycles of the positive dependency graph (edge from
// a head to each positive atom of its rule bodies) and, if any, installs the
// unfounded-set checker; without cycles the completion is exact (Fages 1994).
func (b *completion) unfoundedSets() {
	s := b.s
	n := s.numAtoms
	pos := make([][]uint32, len(b.bodies))
	for id, ls := range b.bodies {
		for _, l := range ls {
			if !l.IsNeg() && int(l.Atom()) <= n {
				pos[id] = append(pos[id], uint32(l.Atom()))
			}
		}
	}
	adjStart := make([]uint32, n+2)
	var adj []uint32
	for a := 1; a <= n; a++ {
		adjStart[a] = uint32(len(adj))
		for _, id := range b.support[a] {
			adj = append(adj, pos[id]...)
		}
	}
	adjStart[n+1] = uint32(len(adj))
	comp, k := cyclicComponents(n, adjStart, adj)
	if k == 0 {
		return
	}
	lits := b.lits
	if b.anyAlways(comp) {
		t := Pos(Atom(s.newVar()))
		s.addClauseLevel0([]Lit{t})
		s.trueLit = t
		lits = append([]Lit(nil), b.lits...)
		lits[0] = t
	}
	support := b.support
	for a := 1; a <= n; a++ {
		if comp[a] != 0 && b.always[a] {
			support[a] = append([]uint32{0}, support[a]...)
		}
	}
	s.ufs = newUnfounded(n, len(s.vals), comp, ufsSupport{support: support, bodyLit: lits, bodyPos: pos})
}

func (b *completion) anyAlways(comp []uint32) bool {
	for a, c := range comp {
		if c != 0 && b.always[a] {
			return true
		}
	}
	return false
}
