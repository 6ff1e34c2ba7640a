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
// (relWays); a counted row costs what its definition says (softCounted).
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
			critW, _ := t.CriterionWeight(timetable.CritSoftRelations)
			sb.softCounted(ri, rel, secs, int64(critW), l)
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

// softCounted writes a counted row as weak constraints whose total is
// exactly what timetable/term.go charges: with critW the criterion's
// weight, rowW the row's, S the sum of the terms and W the divisor (1 for
// "at most days", the teaching weeks otherwise), critW · floor(rowW ·
// floor(S/q) / W), where q is 5 for "at most minutes a day" (minutes over
// count in whole 5-minute steps) and 1 otherwise. When every term's share
// is whole (q divides its units and W divides rowW times its steps) each
// term is one weak constraint; otherwise the cost is a sum of indicators
// "S reaches threshold T_k", T_k = q · ceil(k·W / rowW), written by a unary
// weighted counter, or, when that would exceed countCap atoms, S is built
// in binary, divided by q, multiplied by rowW and divided by W
// (times_rel_binary.go) and each bit j of the result weighs critW·2^j.
func (sb *softBuilder) softCounted(ri int, rel *timetable.Relation, secs []int, critW int64, l int) {
	terms, div := sb.countedTerms(rel, secs)
	terms = mergeTerms(terms)
	if len(terms) == 0 {
		return
	}
	q := int64(1)
	if rel.Kind == timetable.MaxDayMinutes {
		q = 5
	}
	rowW := int64(rel.Weight)
	whole := true
	var total int64
	for _, tm := range terms {
		whole = whole && tm.units%q == 0 && rowW*(tm.units/q)%div == 0
		total += tm.units
	}
	if whole {
		for _, tm := range terms {
			sb.weak(timetable.CritSoftRelations, critW*rowW*(tm.units/q)/div, l, tm.lit)
		}
		return
	}
	top := rowW * (total / q) / div // the largest cost (before critW)
	if top == 0 {
		return
	}
	// Thresholds of S, each with the number of cost units it adds.
	var thr []int64
	add := map[int64]int64{}
	for k := int64(1); k <= top; k++ {
		t := q * ((k*div + rowW - 1) / rowW)
		if add[t] == 0 {
			thr = append(thr, t)
		}
		add[t]++
	}
	if reach := sb.thresholdCounter(rel, ri, terms, thr); reach != nil {
		for k, lit := range reach {
			sb.weak(timetable.CritSoftRelations, critW*add[thr[k]], l, lit)
		}
		return
	}
	s := sb.sumBits(terms)
	if q > 1 {
		s = sb.divBits(s, q)
	}
	r := sb.divBits(sb.mulBits(s, rowW), div)
	r = r[:min(len(r), bits.Len64(uint64(top)))] // higher bits are always false
	for j, lit := range r {
		if lit != 0 {
			sb.weak(timetable.CritSoftRelations, critW<<j, l, lit)
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

// thresholdCounter returns literals r[k] holding exactly when the terms'
// sum reaches thr[k] (ascending): a sequential weighted counter s(i,v)
// "the first i terms sum to at least v" over v up to the last threshold
// (in steps of the gcd of the units and thresholds), with s(i,v) :-
// s(i-1,v) and s(i,v) :- l_i, s(i-1,v-u_i). It returns nil when that would
// take more than countCap atoms.
func (sb *softBuilder) thresholdCounter(rel *timetable.Relation, ri int, terms []countTerm, thr []int64) []solver.Lit {
	g := int64(0)
	for _, tm := range terms {
		g = gcd64(g, tm.units)
	}
	for _, t := range thr {
		g = gcd64(g, t)
	}
	top := thr[len(thr)-1] / g
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
	var prev []solver.Lit // prev[v-1]: the terms so far sum to at least v·g
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
	out := make([]solver.Lit, len(thr))
	for k, t := range thr {
		if v := t / g; v <= int64(len(prev)) {
			out[k] = prev[v-1]
		}
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
