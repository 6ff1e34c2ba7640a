package encode

import (
	"fmt"
	"math/bits"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// countCap bounds the size (atoms) of the unary counter of a counted soft
// row whose sum is divided by the teaching weeks; beyond it softCounted
// counts in binary.
var countCap int64 = 4000

// compileTimesSoftRelations writes the soft relation rows over pattern
// sections ("soft relations" criterion): a non-counted row costs its weight
// once, through an atom broken(relation,R) with one rule per way it breaks
// (relWays); a counted row costs its weight times its count (softCounted).
// Its statements join the soft criteria's (HardProgram leaves them out)
// when they directly follow them.
func (b *builder) compileTimesSoftRelations() {
	m := b.c.soft
	if m == nil {
		return
	}
	p := b.p
	joined := m.rules[1] == len(p.Rules) && m.choices[1] == len(p.Choices) && m.bounds[1] == len(p.Bounds)
	sb := &softBuilder{builder: b, m: m, occ: map[int][]solver.Lit{}, attends: map[int][]solver.Lit{}, subject: noSubject}
	t := b.t
	for ri := range t.Relations {
		rel := &t.Relations[ri]
		if rel.Hard || !b.timesRelation(rel) {
			continue
		}
		secs, ok := b.relSecs(rel, false)
		if !ok || len(secs) == 0 {
			continue
		}
		w, l, on := sb.weight(timetable.CritSoftRelations, int64(rel.Weight))
		if !on {
			continue
		}
		sb.aboutSection(secs[0])
		if rel.Kind.Counted() {
			sb.softCounted(ri, rel, secs, w, l)
			continue
		}
		if len(secs) < 2 {
			continue
		}
		ways := b.relWays(rel, secs)
		if len(ways) == 0 {
			continue
		}
		a := b.newAtom("broken(relation,"+quote(relKey(rel, ri))+")", aux(-1, -1))
		for _, body := range ways {
			b.rule(a, body...)
		}
		sb.weak(timetable.CritSoftRelations, w, l, solver.Pos(a))
	}
	if joined {
		m.rules[1], m.choices[1], m.bounds[1] = len(p.Rules), len(p.Choices), len(p.Bounds)
	}
}

// softCounted writes a counted row of weight w: weak constraints whose
// total is w · floor(sum of its terms / divisor), exactly. When every
// term's units are a multiple of the divisor (always for "at most days",
// and when the items meet in every teaching week) each term is one weak
// constraint; otherwise a unary weighted counter gives an atom per
// multiple of the divisor reached, or, when that would exceed countCap
// atoms, the sum is built in binary and divided by the divisor
// (times_rel_binary.go) and each quotient bit j weighs w·2^j.
func (sb *softBuilder) softCounted(ri int, rel *timetable.Relation, secs []int, w int64, l int) {
	terms, div := sb.countedTerms(rel, secs)
	terms = mergeTerms(terms)
	if len(terms) == 0 {
		return
	}
	multiple := true
	for _, tm := range terms {
		multiple = multiple && tm.units%div == 0
	}
	if multiple {
		for _, tm := range terms {
			sb.weak(timetable.CritSoftRelations, w*(tm.units/div), l, tm.lit)
		}
		return
	}
	if reach := sb.floorCounter(rel, ri, terms, div); reach != nil {
		for _, lit := range reach {
			sb.weak(timetable.CritSoftRelations, w, l, lit)
		}
		return
	}
	var total int64
	for _, tm := range terms {
		total += tm.units
	}
	// The quotient is at most total/div: its higher bits are always false.
	q := sb.divBits(sb.sumBits(terms), div)
	q = q[:min(len(q), bits.Len64(uint64(total/div)))]
	for j, lit := range q {
		if lit != 0 {
			sb.weak(timetable.CritSoftRelations, w<<j, l, lit)
		}
	}
}

// mergeTerms adds up the units of terms with the same literal.
func mergeTerms(terms []countTerm) []countTerm {
	at := map[solver.Lit]int{}
	var out []countTerm
	for _, tm := range terms {
		if k, ok := at[tm.lit]; ok {
			out[k].units += tm.units
			continue
		}
		at[tm.lit] = len(out)
		out = append(out, tm)
	}
	return out
}

// floorCounter returns literals r[q-1] (q = 1 .. Q) holding exactly when
// the terms' sum reaches q·div, Q = floor(total / div): a sequential
// weighted counter s(i,v) "the first i terms sum to at least v" over v up
// to Q·div (in steps of the gcd of the units and div), with
// s(i,v) :- s(i-1,v) and s(i,v) :- l_i, s(i-1,v-u_i). It returns nil when
// that would take more than countCap atoms (or the quotient is 0).
func (sb *softBuilder) floorCounter(rel *timetable.Relation, ri int, terms []countTerm, div int64) []solver.Lit {
	g := div
	var total int64
	for _, tm := range terms {
		g = gcd64(g, tm.units)
		total += tm.units
	}
	d := div / g
	q := total / g / d
	if q == 0 {
		return []solver.Lit{} // the count is always 0
	}
	top := q * d
	var size, prefix int64
	for _, tm := range terms {
		prefix += tm.units / g
		size += min(prefix, top)
	}
	if size > countCap {
		return nil
	}
	saveG, saveK := sb.group, sb.boundKind
	sb.in(-1, "pattern relation aux")
	defer func() { sb.group, sb.boundKind = saveG, saveK }()
	var prev []solver.Lit // prev[v-1]: the terms so far sum to at least v (steps of g)
	prefix = 0
	for i, tm := range terms {
		u := tm.units / g
		prefix += u
		cur := make([]solver.Lit, min(prefix, top))
		for v := int64(1); v <= int64(len(cur)); v++ {
			a := sb.newAtom(fmt.Sprintf("sum(relation,%s,%d,%d)", quote(relKey(rel, ri)), i+1, v*g), aux(-1, -1))
			if v <= int64(len(prev)) {
				sb.rule(a, prev[v-1])
			}
			switch {
			case v <= u:
				sb.rule(a, tm.lit)
			case v-u <= int64(len(prev)):
				sb.rule(a, tm.lit, prev[v-u-1])
			}
			cur[v-1] = solver.Pos(a)
		}
		prev = cur
	}
	out := make([]solver.Lit, q)
	for k := int64(1); k <= q; k++ {
		out[k-1] = prev[k*d-1]
	}
	return out
}

func gcd64(a, b int64) int64 {
	for b != 0 {
		a, b = b, a%b
	}
	if a < 0 {
		return -a
	}
	return a
}
