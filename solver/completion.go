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
	s.pcg = rand.NewPCG(uint64(o.Seed), 0x9e3779b97f4a7c15)
	s.rng = rand.New(s.pcg)
	s.initTables()
	s.numAtoms = p.NumAtoms()
	s.reserve(s.numAtoms + len(p.Rules) + len(p.Choices) + len(p.Bounds) + len(p.Weaks) + 2)
	for i := 0; i < s.numAtoms; i++ {
		s.newVar()
	}
	b := completion{s: s, p: p, index: map[uint64]uint32{}}
	s.building = true
	b.build()
	s.building = false
	s.rebuildWatches()
	s.indexCards()
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
// constraints; it lives only during New. Bodies are stored flat; body id 0
// is the empty body.
type completion struct {
	s         *Solver
	p         *Program
	index     map[uint64]uint32 // hash of a normalised body of 2+ literals -> latest body id with that hash
	chain     []uint32          // per body id: previous body id with the same hash (0 = none)
	single    []uint32          // per literal l: id of the body {l}, 0 = none yet
	bodyStart []uint32          // body id's literals are bodyFlat[bodyStart[id]:bodyStart[id+1]]
	bodyFlat  []Lit             // normalised literals of all bodies
	lits      []Lit             // per body id: literal true iff the body holds (0 for the empty body)
	heads     []headBody        // (atom, body id) for every rule and choice head
	always    []bool            // per atom: has a rule or choice rule with an empty body
	scratch   []Lit             // clause being built
}

// headBody records that body supports atom.
type headBody struct{ atom, body uint32 }

func (b *completion) bodyLits(id uint32) []Lit { return b.bodyFlat[b.bodyStart[id]:b.bodyStart[id+1]] }

// body returns the id of the body with literals ls (normalised, shared with
// equal bodies) and false when ls contains a literal and its complement.
func (b *completion) body(ls []Lit) (uint32, bool) {
	if len(ls) == 1 {
		if id := b.single[ls[0]]; id != 0 {
			return id, true
		}
	}
	norm, taut := normalize(append(b.scratch[:0], ls...))
	b.scratch = norm
	if taut {
		return 0, false
	}
	if len(norm) == 0 {
		return 0, true
	}
	if len(norm) == 1 {
		if id := b.single[norm[0]]; id != 0 {
			return id, true
		}
		id := b.newBody(norm, norm[0])
		b.single[norm[0]] = id
		return id, true
	}
	h := uint64(14695981039346656037)
	for _, l := range norm {
		h = (h ^ uint64(l)) * 1099511628211
	}
	first, ok := b.index[h]
	for id := first; ok && id != 0; id = b.chain[id] {
		if slices.Equal(b.bodyLits(id), norm) {
			return id, true
		}
	}
	v := Pos(Atom(b.s.newVar()))
	id := b.newBody(norm, v)
	if ok {
		b.chain[id] = first
	}
	b.index[h] = id
	// v <-> l1 ∧ ... ∧ lm
	lits := b.bodyLits(id)
	var pair [2]Lit
	for _, l := range lits {
		pair[0], pair[1] = v^1, l
		b.s.addClauseLevel0(pair[:])
	}
	c := append(b.scratch[:0], v)
	for _, l := range lits {
		c = append(c, l^1)
	}
	b.scratch = c
	b.s.addClauseLevel0(c)
	return id, true
}

// newBody stores a body with the literal that stands for it.
func (b *completion) newBody(norm []Lit, lit Lit) uint32 {
	id := uint32(len(b.lits))
	b.bodyFlat = append(b.bodyFlat, norm...)
	b.bodyStart = append(b.bodyStart, uint32(len(b.bodyFlat)))
	b.lits = append(b.lits, lit)
	b.chain = append(b.chain, 0)
	return id
}

func (b *completion) build() {
	s, p := b.s, b.p
	n := s.numAtoms
	b.bodyStart = []uint32{0, 0}
	b.lits = []Lit{0}
	b.chain = []uint32{0}
	b.single = make([]uint32, 2*n+2)
	b.always = make([]bool, n+1)
	b.heads = make([]headBody, 0, len(p.Rules))
	for _, r := range p.Rules {
		if r.Head == 0 {
			c := b.scratch[:0]
			for _, l := range r.Body {
				c = append(c, l^1)
			}
			b.scratch = c
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
		b.heads = append(b.heads, headBody{uint32(r.Head), id})
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
				b.heads = append(b.heads, headBody{uint32(h), id})
			}
		}
	}
	supStart, sup := b.supports()
	for a := 1; a <= n; a++ {
		if b.always[a] {
			continue
		}
		c := append(b.scratch[:0], Neg(Atom(a)))
		for _, id := range sup[supStart[a]:supStart[a+1]] {
			c = append(c, b.lits[id])
		}
		b.scratch = c
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
	b.unfoundedSets(supStart, sup)
}

// supports groups the bodies of every atom's rules (counting sort by atom,
// duplicates removed): atom a's bodies are sup[start[a]:start[a+1]].
func (b *completion) supports() (start, sup []uint32) {
	n := b.s.numAtoms
	start = make([]uint32, n+2)
	for _, hb := range b.heads {
		start[hb.atom+1]++
	}
	for a := 1; a <= n+1; a++ {
		start[a] += start[a-1]
	}
	sup = make([]uint32, len(b.heads))
	fill := slices.Clone(start)
	for _, hb := range b.heads {
		sup[fill[hb.atom]] = hb.body
		fill[hb.atom]++
	}
	// Remove duplicate bodies per atom, compacting in place.
	out := uint32(0)
	for a := 1; a <= n; a++ {
		from, to := start[a], start[a+1]
		start[a] = out
		list := sup[from:to]
		slices.Sort(list)
		for i, id := range list {
			if i > 0 && list[i-1] == id {
				continue
			}
			sup[out] = id
			out++
		}
	}
	start[n+1] = out
	return start, sup[:out]
}

// unfoundedSets finds the cycles of the positive dependency graph (edge from
// a head to each positive atom of its rule bodies) and, if any, installs the
// unfounded-set checker; without cycles the completion is exact (Fages 1994).
func (b *completion) unfoundedSets(supStart, sup []uint32) {
	s := b.s
	n := s.numAtoms
	posAtoms := func(id uint32, dst []uint32) []uint32 {
		for _, l := range b.bodyLits(id) {
			if !l.IsNeg() {
				dst = append(dst, uint32(l.Atom()))
			}
		}
		return dst
	}
	adjStart := make([]uint32, n+2)
	var adj []uint32
	for a := 1; a <= n; a++ {
		adjStart[a] = uint32(len(adj))
		for _, id := range sup[supStart[a]:supStart[a+1]] {
			adj = posAtoms(id, adj)
		}
	}
	adjStart[n+1] = uint32(len(adj))
	comp, k := cyclicComponents(n, adjStart, adj)
	if k == 0 {
		return
	}
	in := ufsSupport{support: make([][]uint32, n+1), bodyLit: b.lits, bodyPos: make([][]uint32, len(b.lits))}
	for a := 1; a <= n; a++ {
		if comp[a] == 0 {
			continue
		}
		list := sup[supStart[a]:supStart[a+1]]
		if b.always[a] {
			if s.trueLit == 0 {
				s.trueLit = Pos(Atom(s.newVar()))
				s.addClauseLevel0([]Lit{s.trueLit})
			}
			list = append([]uint32{0}, list...)
		}
		in.support[a] = list
		for _, id := range list {
			if id != 0 && in.bodyPos[id] == nil {
				in.bodyPos[id] = posAtoms(id, []uint32{})
			}
		}
	}
	if s.trueLit != 0 {
		in.bodyLit = slices.Clone(b.lits)
		in.bodyLit[0] = s.trueLit
	}
	s.ufs = newUnfounded(n, len(s.vals), comp, in)
}
