package encode

import (
	"fmt"
	"slices"
	"strconv"
	"strings"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// relItem is one candidate meeting decision of a section in a relation
// row: a candidate pattern of a pattern section (exactly one of a
// section's holds), or a candidate start of a grid section, seen as a
// pattern of one day from the start period's clock to the last period's
// end in the section's weeks (Meetings of a section's hold:
// times_rel_grid.go).
type relItem struct {
	s, i int                   // section index; 0-based pattern index, or the start period of a grid item
	tc   *timetable.TimeChoice // the pattern (for a grid item, made from Term.Periods)
	grp  int                   // items of one group exclude each other: the section for patterns, one group per grid start
	lit  solver.Lit            // the time or start literal
	grid bool                  // a grid start
}

// weekClass is a set of teaching weeks in which the same items meet.
type weekClass struct {
	n     int   // number of weeks in the class
	items []int // indexes into the item list of the items meeting in these weeks
}

// relItems lists the candidate patterns and grid starts of secs.
func (b *builder) relItems(secs []int) []relItem {
	var out []relItem
	for _, s := range secs {
		if !b.c.IsPattern(s) {
			out = append(out, b.gridItems(s)...)
			continue
		}
		for _, i := range b.c.TimeCandidates(s) {
			out = append(out, relItem{s: s, i: i, tc: &b.t.Sections[s].Times[i], grp: s, lit: solver.Pos(b.c.TimeAtom(s, i))})
		}
	}
	return out
}

// weekClasses splits the weeks in which some item meets into classes of
// weeks with the same meeting items. Weeks with no item are left out.
func weekClasses(items []relItem) []weekClass {
	var classes []weekClass
	at := map[string]int{}
	var key strings.Builder
	for w := 1; w <= 64; w++ {
		key.Reset()
		var in []int
		for k, it := range items {
			if it.tc.Weeks.Has(w) {
				in = append(in, k)
				key.WriteString(strconv.Itoa(k))
				key.WriteByte(',')
			}
		}
		if len(in) == 0 {
			continue
		}
		if c, ok := at[key.String()]; ok {
			classes[c].n++
			continue
		}
		at[key.String()] = len(classes)
		classes = append(classes, weekClass{n: 1, items: in})
	}
	return classes
}

// onDay keeps the items of idx that meet on day d.
func onDay(items []relItem, idx []int, d time.Weekday) []int {
	var out []int
	for _, k := range idx {
		if items[k].tc.Days.Has(d) {
			out = append(out, k)
		}
	}
	return out
}

// weekdays lists the seven weekdays in week order.
var weekdays = []time.Weekday{time.Monday, time.Tuesday, time.Wednesday, time.Thursday, time.Friday, time.Saturday, time.Sunday}

// anyOf returns, per section, the one-literal body "the section meets at
// one of its items of idx that satisfy keep" (interned any_time literals),
// as bodies for relOr. Items of one section are adjacent in idx.
func (b *builder) anyOf(items []relItem, idx []int, keep func(*relItem) bool) [][]solver.Lit {
	var bodies [][]solver.Lit
	grp := -1
	var cur []int
	flush := func() {
		if len(cur) > 0 {
			bodies = append(bodies, []solver.Lit{b.groupLit(items, cur)})
		}
		cur = nil
	}
	for _, k := range idx {
		it := &items[k]
		if !keep(it) {
			continue
		}
		if it.grp != grp {
			flush()
			grp = it.grp
		}
		cur = append(cur, k)
	}
	flush()
	return bodies
}

// itemsKey is an interning key for a list of items.
func itemsKey(prefix string, items []relItem, idx []int, extra ...int) string {
	var sb strings.Builder
	sb.WriteString(prefix)
	for _, x := range extra {
		sb.WriteByte(':')
		sb.WriteString(strconv.Itoa(x))
	}
	for _, k := range idx {
		sb.WriteByte(';')
		sb.WriteString(strconv.Itoa(items[k].grp))
		sb.WriteByte('.')
		sb.WriteString(strconv.Itoa(items[k].i))
	}
	return sb.String()
}

// dayOrder is the state of the block structure of one class and day: the
// distinct start times of its items, which of them start a block, and
// which starts are connected (no block start between them).
type dayOrder struct {
	starts []timetable.Clock // distinct start times, ascending
	at     [][]int           // at[a]: items starting at starts[a]
	begun  []solver.Lit      // begun[a]: some item starts at starts[a]
	brk    []solver.Lit      // brk[a]: a block starts at starts[a] (0: never)
}

// blocks builds the block structure of the items idx (one class, one day)
// with joining gap m: a block starts at time t when some meeting starts at
// t and no meeting starting before t ends m minutes or less before t (or
// later); the day's blocks are the block starts (timetable/term.go,
// "at most breaks").
func (b *builder) blocks(items []relItem, idx []int, m int) *dayOrder {
	o := &dayOrder{}
	for _, k := range idx {
		o.starts = append(o.starts, items[k].tc.Start)
	}
	slices.Sort(o.starts)
	o.starts = slices.Compact(o.starts)
	o.at = make([][]int, len(o.starts))
	for _, k := range idx {
		a, _ := slices.BinarySearch(o.starts, items[k].tc.Start)
		o.at[a] = append(o.at[a], k)
	}
	o.begun = make([]solver.Lit, len(o.starts))
	o.brk = make([]solver.Lit, len(o.starts))
	for a, t := range o.starts {
		o.begun[a] = b.relOr(itemsKey("begun", items, o.at[a]), "begun", b.anyOf(items, o.at[a], func(*relItem) bool { return true }))
		cov := b.relOr(itemsKey("covered", items, idx, int(t), m), "covered", b.anyOf(items, idx, func(it *relItem) bool {
			return it.tc.Start < t && t <= it.tc.End()+timetable.Clock(m)
		}))
		if cov == 0 {
			o.brk[a] = o.begun[a]
			continue
		}
		o.brk[a] = b.relOr(itemsKey("block", items, idx, int(t), m), "block_start", [][]solver.Lit{{o.begun[a], cov.Not()}})
	}
	return o
}

// conn returns, for start a, literals conn[c] (c > a) that hold when no
// block starts in (starts[a], starts[c]]: the meetings starting at a and at
// c are in one block.
func (b *builder) conn(o *dayOrder, a int) []solver.Lit {
	out := make([]solver.Lit, len(o.starts))
	var prev solver.Lit
	for c := a + 1; c < len(o.starts); c++ {
		body := []solver.Lit{o.brk[c].Not()}
		if prev != 0 {
			body = append(body, prev)
		}
		b.rel.n++
		x := b.newAtom(fmt.Sprintf("joined_%d", b.rel.n), aux(-1, -1))
		saveG, saveK := b.group, b.boundKind
		b.in(-1, "pattern relation aux")
		b.rule(x, body...)
		b.group, b.boundKind = saveG, saveK
		out[c] = solver.Pos(x)
		prev = out[c]
	}
	return out
}

// longBlockWays lists, per block start a, the bodies that hold exactly when
// the block starting at starts[a] has two or more meetings and lasts more
// than n minutes from first start to last end (timetable/term.go, "longest
// block"): two meetings starting at a, one of them long; or a long meeting
// at a and the block going on to a later start; or a meeting at a later
// start of the block ending more than n minutes after starts[a].
func (b *builder) longBlockWays(items []relItem, o *dayOrder, n int) [][][]solver.Lit {
	out := make([][][]solver.Lit, len(o.starts))
	for a, t := range o.starts {
		limit := t + timetable.Clock(n)
		long := func(it *relItem) bool { return it.tc.End() > limit }
		var ways [][]solver.Lit
		// Two meetings at a (different sections), one of them long.
		secsAt := map[int][]int{} // by exclusive group
		var order []int
		for _, k := range o.at[a] {
			s := items[k].grp
			if _, ok := secsAt[s]; !ok {
				order = append(order, s)
			}
			secsAt[s] = append(secsAt[s], k)
		}
		for _, s := range order {
			l := b.relOr(itemsKey("long", items, secsAt[s], int(limit)), "long", b.anyOf(items, secsAt[s], long))
			if l == 0 {
				continue
			}
			for _, s2 := range order {
				if s2 != s {
					ways = append(ways, []solver.Lit{o.brk[a], l, b.groupLit(items, secsAt[s2])})
				}
			}
		}
		if a+1 < len(o.starts) {
			cn := b.conn(o, a)
			la := b.relOr(itemsKey("long", items, o.at[a], int(limit)), "long", b.anyOf(items, o.at[a], long))
			for c := a + 1; c < len(o.starts); c++ {
				if la != 0 {
					ways = append(ways, []solver.Lit{o.brk[a], la, cn[c], o.begun[c]})
				}
				if lc := b.relOr(itemsKey("long", items, o.at[c], int(limit)), "long", b.anyOf(items, o.at[c], long)); lc != 0 {
					ways = append(ways, []solver.Lit{o.brk[a], cn[c], lc})
				}
			}
		}
		out[a] = ways
	}
	return out
}

// groupLit is one literal "one of the items idx (one exclusive group)
// holds": an interned any_time literal for a pattern section's patterns,
// the start literal for a grid start.
func (b *builder) groupLit(items []relItem, idx []int) solver.Lit {
	if items[idx[0]].grid {
		return items[idx[0]].lit
	}
	pats := make([]int, len(idx))
	for k, x := range idx {
		pats[k] = items[x].i
	}
	slices.Sort(pats)
	return b.anyTime(items[idx[0]].s, pats)
}

// units returns, for the items idx of one section meeting on one class and
// day, unit literals (unitChain) whose true count times g is the minutes of
// the section's meeting that day.
func (b *builder) units(items []relItem, idx []int, g int) []solver.Lit {
	vals := make([]litVal, len(idx))
	for k, x := range idx {
		vals[k] = litVal{items[x].lit, items[x].tc.Minutes / g}
	}
	return b.unitChain(vals)
}

// bySection splits items idx by exclusive group (a pattern section's
// patterns; each grid start alone), in order.
func bySection(items []relItem, idx []int) [][]int {
	var out [][]int
	for _, k := range idx {
		if len(out) == 0 || items[out[len(out)-1][0]].grp != items[k].grp {
			out = append(out, nil)
		}
		out[len(out)-1] = append(out[len(out)-1], k)
	}
	return out
}

// minuteStep is the largest step that divides every item's minutes.
func minuteStep(items []relItem) int {
	g := 0
	for _, it := range items {
		g = gcd(g, it.tc.Minutes)
	}
	return max(g, 1)
}

func gcd(a, b int) int {
	for b != 0 {
		a, b = b, a%b
	}
	if a < 0 {
		return -a
	}
	return a
}

// atLeast returns literals c[k-1] holding exactly when at least k of lits
// hold (k = 1 .. len(lits)), by a sequential counter: c(i,k) :- c(i-1,k);
// c(i,k) :- c(i-1,k-1), l_i. It makes O(len(lits)²/2) atoms, interned by
// the list of literals.
func (b *builder) atLeast(lits []solver.Lit) []solver.Lit {
	var kb strings.Builder
	for _, l := range lits {
		kb.WriteString(strconv.FormatUint(uint64(l), 10))
		kb.WriteByte(',')
	}
	key := kb.String()
	if c, ok := b.rel.count[key]; ok {
		return c
	}
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "pattern relation aux")
	var prev []solver.Lit // prev[k-1]: at least k of the first i-1
	for i, l := range lits {
		cur := make([]solver.Lit, i+1)
		for k := 1; k <= i+1; k++ {
			b.rel.n++
			a := b.newAtom(fmt.Sprintf("at_least_%d(%d)", b.rel.n, k), aux(-1, -1))
			if k <= len(prev) {
				b.rule(a, prev[k-1])
			}
			if k == 1 {
				b.rule(a, l)
			} else {
				b.rule(a, prev[k-2], l)
			}
			cur[k-1] = solver.Pos(a)
		}
		prev = cur
	}
	b.group, b.boundKind = saveG, saveK
	if b.rel.count == nil {
		b.rel.count = map[string][]solver.Lit{}
	}
	b.rel.count[key] = prev
	return prev
}
