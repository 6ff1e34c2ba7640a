package encode

import (
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// The four counted kinds (timetable/term.go: at most days, at most minutes
// a day, at most breaks, longest block). Hard rows are bounds per class of
// weeks and day; soft rows are "terms": literals each worth a number of
// units, whose weighted sum (divided by the teaching weeks for the three
// kinds that say so) is the row's count (countTerms, times_rel_soft.go).

// dayLits returns, per weekday in week order, a literal "some of the items
// meets that day" (weeks ignored), 0 for days none can meet.
func (b *builder) dayLits(items []relItem) []solver.Lit {
	all := make([]int, len(items))
	for k := range all {
		all[k] = k
	}
	out := make([]solver.Lit, 0, len(weekdays))
	for _, d := range weekdays {
		idx := onDay(items, all, d)
		if len(idx) == 0 {
			continue
		}
		out = append(out, b.relOr(itemsKey("day", items, idx, int(d)), "meets_day", b.anyOf(items, idx, func(*relItem) bool { return true })))
	}
	return out
}

// hardMaxDays: at most n of the day literals hold.
func (b *builder) hardMaxDays(secs []int, n int, sel solver.Lit) {
	days := b.dayLits(b.relItems(secs))
	if len(days) > n {
		b.bound(b.distinct(days), solver.NoBound, n, sel)
	}
}

// classDays calls fn for each class of weeks and day with meeting items,
// once per distinct item set (the first class and day that has it), with
// the number of weeks of every class and day that has the same set.
func classDays(items []relItem, fn func(idx []int, weeks int)) {
	type entry struct {
		idx   []int
		weeks int
	}
	var order []string
	seen := map[string]*entry{}
	for _, c := range weekClasses(items) {
		for _, d := range weekdays {
			idx := onDay(items, c.items, d)
			if len(idx) == 0 {
				continue
			}
			key := itemsKey("", items, idx)
			if e, ok := seen[key]; ok {
				e.weeks += c.n
				continue
			}
			seen[key] = &entry{idx: idx, weeks: c.n}
			order = append(order, key)
		}
	}
	for _, k := range order {
		fn(seen[k].idx, seen[k].weeks)
	}
}

// minuteUnits returns the unit literals of every section of items idx (one
// class and day) with step g: the number of true ones times g is the day's
// minutes.
func (b *builder) minuteUnits(items []relItem, idx []int, g int) []solver.Lit {
	var lits []solver.Lit
	for _, part := range bySection(items, idx) {
		lits = append(lits, b.units(items, part, g)...)
	}
	return lits
}

// hardDayKind states a hard "at most minutes a day", "at most breaks" or
// "longest block" row per class of weeks and day.
func (b *builder) hardDayKind(rel *timetable.Relation, secs []int, sel solver.Lit) {
	items := b.relItems(secs)
	g := minuteStep(items)
	classDays(items, func(idx []int, _ int) {
		switch rel.Kind {
		case timetable.MaxDayMinutes:
			most := 0
			for _, part := range bySection(items, idx) {
				top := 0
				for _, k := range part {
					top = max(top, items[k].tc.Minutes)
				}
				most += top
			}
			if most <= rel.N {
				return
			}
			b.bound(b.distinct(b.minuteUnits(items, idx, g)), solver.NoBound, max(rel.N, 0)/g, sel)
		case timetable.MaxBreaks:
			o := b.blocks(items, idx, rel.M)
			if len(o.brk) > rel.N+1 {
				b.bound(b.distinct(o.brk), solver.NoBound, max(rel.N+1, 0), sel)
			}
		case timetable.MaxBlock:
			o := b.blocks(items, idx, rel.M)
			for _, ways := range b.longBlockWays(items, o, rel.N) {
				for _, w := range ways {
					b.rule(0, append(w, sel)...)
				}
			}
		}
	})
}

// countTerm is a literal worth units of a counted row's sum.
type countTerm struct {
	lit   solver.Lit
	units int64
}

// countedTerms returns the terms of a soft counted row and the divisor of
// their sum (1 for "at most days", the teaching weeks otherwise): the row's
// count is floor(sum / divisor), as timetable/term.go defines it.
func (b *builder) countedTerms(rel *timetable.Relation, secs []int) ([]countTerm, int64) {
	items := b.relItems(secs)
	var terms []countTerm
	if rel.Kind == timetable.MaxDays {
		days := b.dayLits(items)
		if len(days) <= rel.N {
			return nil, 1
		}
		c := b.atLeast(days)
		for k := max(rel.N, 0) + 1; k <= len(days); k++ {
			terms = append(terms, countTerm{c[k-1], 1})
		}
		return terms, 1
	}
	classDays(items, func(idx []int, weeks int) {
		n := int64(weeks)
		switch rel.Kind {
		case timetable.MaxDayMinutes:
			vals, ge := b.dayTotals(items, idx)
			prev := 0
			for k, v := range vals {
				if inc := v - max(prev, rel.N); inc > 0 {
					terms = append(terms, countTerm{ge[k], n * int64(inc)})
				}
				prev = v
			}
		case timetable.MaxBreaks:
			o := b.blocks(items, idx, rel.M)
			if len(o.brk) <= rel.N+1 {
				return
			}
			c := b.atLeast(o.brk)
			for k := max(rel.N+1, 0) + 1; k <= len(o.brk); k++ {
				terms = append(terms, countTerm{c[k-1], n})
			}
		case timetable.MaxBlock:
			o := b.blocks(items, idx, rel.M)
			for _, ways := range b.longBlockWays(items, o, rel.N) {
				if v := b.relOr("", "long_block", ways); v != 0 {
					terms = append(terms, countTerm{v, n})
				}
			}
		}
	})
	return terms, int64(b.t.TeachingWeeks())
}

// dayTotals returns the distinct positive totals the items idx (one class
// and day) can add up to, ascending, with literals ge[k] holding exactly
// when the day's minutes are at least vals[k]: a dynamic programme over
// the sections (at most one pattern each), on the partial sums they can
// reach: "the first i sections reach v" :- "the first i-1 reach v", and
// :- "section i meets for u minutes", "the first i-1 reach v-u".
func (b *builder) dayTotals(items []relItem, idx []int) ([]int, []solver.Lit) {
	sums := []int{0}                            // reachable partial sums, ascending
	ge := []solver.Lit{0}                       // ge[k]: the partial sum is at least sums[k] (ge[0] unused: always)
	atLeast := func(v int) (solver.Lit, bool) { // the literal for "at least v" among sums, true when v <= 0
		if v <= 0 {
			return 0, true
		}
		k, _ := slices.BinarySearch(sums, v)
		if k == len(sums) {
			return 0, false
		}
		return ge[k], true
	}
	for stage, part := range bySection(items, idx) {
		next := slices.Clone(sums)
		for _, s := range sums {
			for _, k := range part {
				next = append(next, s+items[k].tc.Minutes)
			}
		}
		slices.Sort(next)
		next = slices.Compact(next)
		nge := make([]solver.Lit, len(next))
		for n, v := range next {
			if v == 0 {
				continue
			}
			var bodies [][]solver.Lit
			if l, ok := atLeast(v); ok {
				bodies = append(bodies, []solver.Lit{l})
			}
			for _, k := range part {
				x := items[k].lit
				if l, ok := atLeast(v - items[k].tc.Minutes); ok && l == 0 {
					bodies = append(bodies, []solver.Lit{x})
				} else if ok {
					bodies = append(bodies, []solver.Lit{x, l})
				}
			}
			nge[n] = b.relOr(itemsKey("total", items, idx, stage, v), "day_minutes", bodies)
		}
		sums, ge = next, nge
	}
	return sums[1:], ge[1:]
}
