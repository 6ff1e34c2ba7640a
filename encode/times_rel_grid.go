package encode

import (
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Relation rows that list grid sections (Meetings × Length on
// Term.Periods) beside pattern sections, or give a new kind to grid
// sections, are stated over relItems: each candidate start of a grid
// section is an item of one day, from its start period's clock to its last
// period's end, in the section's weeks, with the start atom as literal
// (timetable.Check reads a grid meeting the same way: Term.Occurrences).
// A pattern section holds exactly one of its items, a grid section
// Meetings of them, so every way a row breaks is said as "these items
// hold" (never "that one does not", which only an exclusive section can
// afford):
//
//   - kinds defined on every pair of meetings (not same time, different
//     days and hours, within hours, before, weeks within, different weeks,
//     no overlap, day span, minimum gap, the overlap half of same people)
//     break when some item of A and some item of B hold that break the pair
//     (itemPairWays);
//   - kinds defined on a section's whole set of meetings (same time, same
//     day, same start, days within, overlap, back to back, first before)
//     get literals per key (a day, a (day, start), a start time, a first
//     week) that say "the section has a meeting with that key", and break
//     on the keys (mixedWays);
//   - the counted kinds reuse times_rel_days.go on the items, each grid
//     start its own exclusive group;
//   - rooms (same room, different rooms, the travel half of same people,
//     travel times) are known for a grid section when each of its
//     candidate starts has one candidate room (gridRoomOf), or chosen by
//     explicit grid_in atoms (rooms_grid.go), which these rows ask for.

// gridItems lists the candidate starts of grid section s as items.
func (b *builder) gridItems(s int) []relItem {
	t := b.t
	m := &b.c.secs[s]
	out := make([]relItem, 0, len(m.starts))
	for _, p := range m.starts {
		first, last := t.Periods[p], t.Periods[p+max(m.length, 1)-1]
		tc := &timetable.TimeChoice{Days: timetable.DaysOf(first.Day), Start: first.Start,
			Minutes: int(last.End - first.Start), Weeks: m.weeks}
		out = append(out, relItem{s: s, i: p, tc: tc, grp: len(t.Sections) + s*len(t.Periods) + p,
			lit: solver.Pos(m.start[p]), grid: true})
	}
	return out
}

// hasGrid reports whether one of secs is a grid section.
func (b *builder) hasGrid(secs []int) bool {
	return slices.ContainsFunc(secs, func(s int) bool { return !b.c.IsPattern(s) })
}

// gridRoomOf returns the room (index into Term.Rooms) a grid meeting of
// section s starting at p is held in when that is known before the search:
// -1 for a section that takes no room, the one member of its candidate set
// when there is one; false when the meeting has several candidate rooms.
func (b *builder) gridRoomOf(s, p int) (int, bool) {
	m := &b.c.secs[s]
	if !m.takesRoom {
		return -1, true
	}
	id := m.candAt(p)
	if id < 0 {
		return -1, true
	}
	members := b.c.rooms.sets.sets[id].members()
	if len(members) != 1 {
		return -1, false
	}
	return members[0], true
}

// gridRoomsKnown reports whether the room of every candidate meeting of
// grid section s is known or chosen during the search (gridItemRooms).
func (b *builder) gridRoomsKnown(s int) bool {
	for _, p := range b.c.secs[s].starts {
		if _, ok := b.gridItemRooms(s, p); !ok {
			return false
		}
	}
	return true
}

// mixedRefusal says why a row with grid sections cannot be stated ("" when
// it can): a hard row of the room kinds needs every listed grid section's
// rooms known or explicit (rooms_grid.go makes them explicit for these
// rows, so this is a safeguard). Soft rows read grid rooms as blank
// (softRoomSecs).
func (b *builder) mixedRefusal(rel *timetable.Relation, secs []int) string {
	if !rel.Hard {
		return ""
	}
	switch rel.Kind {
	case timetable.SameRoom, timetable.DifferentRooms, timetable.SamePeople:
		for _, s := range secs {
			if !b.c.IsPattern(s) && !b.gridRoomsKnown(s) {
				return fmt.Sprintf("relation %q needs the rooms of grid section %s, which may meet in any of several rooms: give it one room (or meeting times), or use another kind", rel.Kind, b.t.Sections[s].ID)
			}
		}
	}
	return ""
}

// itemsOr is one literal "one of the items idx holds" (0 when idx is
// empty): a group's literal (groupLit), or an interned disjunction.
func (b *builder) itemsOr(items []relItem, idx []int) solver.Lit {
	bodies := b.anyOf(items, idx, func(*relItem) bool { return true })
	return b.relOr(itemsKey("one_of", items, idx), "one_of", bodies)
}

// itemPairWays appends the bodies that hold exactly when an item x of A
// and an item y of C both hold with !ok(x, y) (x in A's role). same says A
// and C are one section (listed twice in an ordered row): then x and y may
// be one item, or two of a grid section's starts.
func (b *builder) itemPairWays(ways [][]solver.Lit, A, C []relItem, same bool, ok func(x, y *relItem) bool) [][]solver.Lit {
	if same {
		for i := range A {
			for j := range A {
				switch {
				case ok(&A[i], &A[j]):
				case i == j:
					ways = append(ways, []solver.Lit{A[i].lit})
				case A[i].grp != A[j].grp:
					ways = append(ways, []solver.Lit{A[i].lit, A[j].lit})
				}
			}
		}
		return ways
	}
	groups := groupByRefused(upTo(len(A)), upTo(len(C)), func(i, j int) bool { return !ok(&A[i], &C[j]) })
	for _, g := range groups {
		ways = append(ways, []solver.Lit{b.itemsOr(A, g.rows), b.itemsOr(C, g.bad)})
	}
	return ways
}

// keyLits returns, per key (ascending), the literal "one of items has a
// meeting with that key", keys giving the keys of an item's meetings.
func (b *builder) keyLits(items []relItem, keys func(*relItem) []int) map[int]solver.Lit {
	by := map[int][]int{}
	for k := range items {
		for _, key := range keys(&items[k]) {
			if l := by[key]; len(l) == 0 || l[len(l)-1] != k {
				by[key] = append(by[key], k)
			}
		}
	}
	out := make(map[int]solver.Lit, len(by))
	for key, idx := range by {
		out[key] = b.itemsOr(items, idx)
	}
	return out
}

// litKeys lists the keys of two key maps, ascending, each once.
func litKeys(x, y map[int]solver.Lit) []int {
	var out []int
	for k := range x {
		out = append(out, k)
	}
	for k := range y {
		if _, ok := x[k]; !ok {
			out = append(out, k)
		}
	}
	slices.Sort(out)
	return out
}

// xorWays are the bodies "x and not y" and "y and not x" (0 is false).
func xorWays(ways [][]solver.Lit, x, y solver.Lit) [][]solver.Lit {
	switch {
	case x != 0 && y != 0:
		return append(ways, []solver.Lit{x, y.Not()}, []solver.Lit{y, x.Not()})
	case x != 0:
		return append(ways, []solver.Lit{x})
	case y != 0:
		return append(ways, []solver.Lit{y})
	}
	return ways
}

// dayKeys are an item's days in week order; timeKeys its (day, start)
// pairs.
func dayKeys(it *relItem) []int {
	var out []int
	for _, d := range it.tc.Days.List() {
		out = append(out, dayRank(int(d)))
	}
	return out
}

func timeKeys(it *relItem) []int {
	var out []int
	for _, d := range it.tc.Days.List() {
		out = append(out, dayRank(int(d))*24*60+int(it.tc.Start))
	}
	return out
}

// mixedWays lists the ways a non-counted row with grid sections breaks
// (timetable/term.go definitions, on the items).
func (b *builder) mixedWays(rel *timetable.Relation, secs []int) [][]solver.Lit {
	k := rel.Kind
	per := map[int][]relItem{}
	for _, s := range secs {
		if _, ok := per[s]; !ok {
			per[s] = b.relItems([]int{s})
		}
	}
	var ways [][]solver.Lit
	switch k {
	case timetable.SameStart:
		return b.sameStartWays(secs, per)
	case timetable.DifferentRooms:
		return b.differentRoomsWays(b.softRoomSecs(rel, secs))
	case timetable.SameRoom:
		return b.mixedSameRoomWays(b.softRoomSecs(rel, secs))
	}
	for _, pr := range relPairs(k, secs) {
		A, C := per[pr[0]], per[pr[1]]
		same := pr[0] == pr[1]
		switch k {
		case timetable.SameTime, timetable.SameDayRel:
			keys := dayKeys
			if k == timetable.SameTime {
				keys = timeKeys
			}
			ka, kc := b.keyLits(A, keys), b.keyLits(C, keys)
			for _, key := range litKeys(ka, kc) {
				ways = xorWays(ways, ka[key], kc[key])
			}
		case timetable.DaysWithin:
			ka, kc := b.keyLits(A, dayKeys), b.keyLits(C, dayKeys)
			x, y := b.notWithin(ka, kc), b.notWithin(kc, ka)
			if x != 0 && y != 0 {
				ways = append(ways, []solver.Lit{x, y})
			}
		case timetable.OverlapRel:
			bodies := b.itemPairWays(nil, A, C, false, func(x, y *relItem) bool { return !pairOK(timetable.OverlapRel, 0, x.tc, y.tc) })
			if ov := b.relOr("", "overlaps", bodies); ov != 0 {
				ways = append(ways, []solver.Lit{ov.Not()})
			} else {
				ways = append(ways, []solver.Lit{})
			}
		case timetable.BackToBack:
			ways = b.backToBackWays(ways, A, C)
		case timetable.FirstBefore:
			ways = b.firstBeforeWays(ways, A, C)
		case timetable.SamePeople:
			ways = b.itemPairWays(ways, A, C, same, func(x, y *relItem) bool { return pairOK(timetable.NoOverlap, 0, x.tc, y.tc) })
			if rel.Hard || b.c.IsPattern(pr[0]) && b.c.IsPattern(pr[1]) {
				ways = append(ways, b.itemTravelWays(A, C)...)
			}
		default:
			n := rel.N
			ways = b.itemPairWays(ways, A, C, same, func(x, y *relItem) bool { return pairOK(k, n, x.tc, y.tc) })
		}
	}
	return ways
}

// softRoomSecs keeps, for a soft row, the pattern sections of secs: the
// engine's objective reads grid meetings without rooms (their rooms'
// criteria are judged after the search, as for grid terms: the third gate
// compares with timetable.Cost of the timetable with grid rooms left out,
// optimize_gate.go), so a grid section uses no room in a soft room row.
// A hard row keeps every section.
func (b *builder) softRoomSecs(rel *timetable.Relation, secs []int) []int {
	if rel.Hard {
		return secs
	}
	var out []int
	for _, s := range secs {
		if b.c.IsPattern(s) {
			out = append(out, s)
		}
	}
	return out
}

// notWithin is a literal "some key of x is not a key of y" (0: never).
func (b *builder) notWithin(x, y map[int]solver.Lit) solver.Lit {
	var bodies [][]solver.Lit
	for _, key := range litKeys(x, nil) {
		if l := y[key]; l != 0 {
			bodies = append(bodies, []solver.Lit{x[key], l.Not()})
		} else {
			bodies = append(bodies, []solver.Lit{x[key]})
		}
	}
	return b.relOr("", "not_within", bodies)
}

// sameStartWays: "all meetings of all listed sections start at one time of
// day" breaks when two start times are used (every section has a meeting).
func (b *builder) sameStartWays(secs []int, per map[int][]relItem) [][]solver.Lit {
	by := map[int][][]solver.Lit{}
	var starts []int
	for _, s := range secs {
		ks := b.keyLits(per[s], func(it *relItem) []int { return []int{int(it.tc.Start)} })
		for t, l := range ks {
			if _, ok := by[t]; !ok {
				starts = append(starts, t)
			}
			by[t] = append(by[t], []solver.Lit{l})
		}
	}
	slices.Sort(starts)
	lits := make([]solver.Lit, len(starts))
	for i, t := range starts {
		lits[i] = b.relOr("", "starts_at", by[t])
	}
	var ways [][]solver.Lit
	for i := range lits {
		for j := i + 1; j < len(lits); j++ {
			ways = append(ways, []solver.Lit{lits[i], lits[j]})
		}
	}
	return ways
}

// backToBackWays: every meeting of C starts on a day when a meeting of A
// ends right then; it breaks at an item of C and a day of it with no such
// item of A holding.
func (b *builder) backToBackWays(ways [][]solver.Lit, A, C []relItem) [][]solver.Lit {
	for j := range C {
		y := &C[j]
		for _, d := range y.tc.Days.List() {
			var match []int
			for i := range A {
				if A[i].tc.Days.Has(d) && A[i].tc.End() == y.tc.Start {
					match = append(match, i)
				}
			}
			if m := b.itemsOr(A, match); m != 0 {
				ways = append(ways, []solver.Lit{y.lit, m.Not()})
			} else {
				ways = append(ways, []solver.Lit{y.lit})
			}
		}
	}
	return ways
}

// firstBeforeWays: A's first week is earlier than C's; or equal and A's
// first day (week order) earlier; or equal too and A's meetings that day
// end no later than C's meetings that day start. Literals: the first week
// of each section, its first day, and its items on that day.
func (b *builder) firstBeforeWays(ways [][]solver.Lit, A, C []relItem) [][]solver.Lit {
	fwA, fwC := b.keyLits(A, firstWeekKey), b.keyLits(C, firstWeekKey)
	onA, onC := b.keyLits(A, dayKeys), b.keyLits(C, dayKeys)
	fdA, fdC := b.firstDays(onA), b.firstDays(onC)
	for _, wa := range litKeys(fwA, nil) {
		for _, wc := range litKeys(fwC, nil) {
			la, lc := fwA[wa], fwC[wc]
			if wa > wc {
				ways = append(ways, []solver.Lit{la, lc})
			}
			if wa != wc {
				continue
			}
			for _, da := range litKeys(fdA, nil) {
				for _, dc := range litKeys(fdC, nil) {
					base := []solver.Lit{la, lc, fdA[da], fdC[dc]}
					if da > dc {
						ways = append(ways, base)
					}
					if da != dc {
						continue
					}
					// The day's meetings of A must end before C's start.
					onDayA := func(it *relItem) bool { return it.tc.Days.Has(weekdays[da]) }
					for i := range A {
						if !onDayA(&A[i]) {
							continue
						}
						var bad []int
						for j := range C {
							if onDayA(&C[j]) && C[j].tc.Start < A[i].tc.End() {
								bad = append(bad, j)
							}
						}
						if len(bad) == 0 {
							continue
						}
						ways = append(ways, append(slices.Clone(base), A[i].lit, b.itemsOr(C, bad)))
					}
				}
			}
		}
	}
	return ways
}

// firstWeekKey is an item's first teaching week.
func firstWeekKey(it *relItem) []int { return []int{it.tc.Weeks.First()} }

// firstDays returns, per day rank, the literal "the first day (week order)
// on which the section meets is this one", from its day literals.
func (b *builder) firstDays(on map[int]solver.Lit) map[int]solver.Lit {
	out := map[int]solver.Lit{}
	days := litKeys(on, nil)
	for k, d := range days {
		body := []solver.Lit{on[d]}
		for _, e := range days[:k] {
			body = append(body, on[e].Not())
		}
		out[d] = b.relOr("", "first_day", [][]solver.Lit{body})
	}
	return out
}
