package encode

import (
	"fmt"
	"sort"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// roomModel is the aggregated room model: candidate room sets and the room
// families whose Hall constraints the program states.
type roomModel struct {
	n        int             // number of rooms
	sets     setTable        // interned candidate sets and family sets
	blocker  []int           // blocker[r]: group of room r's availability, -1 when always available
	blocked  [][]bool        // blocked[r][p]: room r is unavailable at p (nil row: never)
	families []family        // room families with Hall constraints
	famByset map[int]int     // family index by set id
	sameRoom []sameRoomGroup // sections tied by hard same-room relations
	secOf    map[int]int     // section -> same-room group (also in secModel.sameRoom)
	fitGroup map[int]int     // section -> its "room fit" group, when some meeting has no candidate room
}

// family is a set of rooms U with the Hall constraints "at each period, the
// meetings whose candidate rooms all lie in U number at most |U| minus the
// rooms of U that are unavailable then".
type family struct {
	set   int // room set id
	group int // its "room supply" group
	lazy  bool
}

// sameRoomGroup is a set of sections that must all use one room.
type sameRoomGroup struct {
	sections  []int
	relations []int // indexes into Term.Relations
	cand      int   // the rooms all of them may use
}

// compileRoomSets computes each section's candidate rooms: the allowed list
// (or every room), with every needed feature, and (unless SoftCapacity)
// enough seats. Sections tied by a hard same-room relation share the
// intersection of their sets (narrowed further by any fixed room among
// them); a fixed meeting with a room may use only that room.
func (b *builder) compileRoomSets() {
	t := b.t
	rm := &b.c.rooms
	rm.n = len(t.Rooms)
	rm.famByset = map[int]int{}
	rm.secOf = map[int]int{}
	rm.fitGroup = map[int]int{}
	rm.blocker = make([]int, rm.n)
	rm.blocked = make([][]bool, rm.n)
	for r := range t.Rooms {
		rm.blocker[r] = -1
		rm.blocked[r] = b.unavail.room[r].periods
	}
	base := make([]roomSet, len(t.Sections))
	for s := range t.Sections {
		sec := &t.Sections[s]
		m := &b.c.secs[s]
		m.cand, m.sameRoom = -1, -1
		if !m.takesRoom {
			continue
		}
		base[s] = b.baseRooms(sec)
	}
	b.sameRoomGroups(base)
	for s := range t.Sections {
		m := &b.c.secs[s]
		if !m.takesRoom {
			continue
		}
		set := base[s]
		if g, ok := rm.secOf[s]; ok {
			set = rm.sets.sets[rm.sameRoom[g].cand]
			m.sameRoom = g
		}
		m.cand = rm.sets.intern(set)
		for _, f := range t.Sections[s].Fixed {
			p := t.PeriodAt(f.Day, f.Start)
			if f.Room == "" || p < 0 {
				continue
			}
			one := newRoomSet(rm.n)
			one.add(b.roomIdx[f.Room])
			if m.fixedCand == nil {
				m.fixedCand = map[int]int{}
			}
			m.fixedCand[p] = rm.sets.intern(one.intersect(set))
		}
	}
}

// baseRooms is the candidate room set of one section on its own.
func (b *builder) baseRooms(sec *timetable.Section) roomSet {
	t := b.t
	set := newRoomSet(len(t.Rooms))
	allowed := func(r int) bool { return true }
	if len(sec.Rooms) > 0 {
		ok := map[int]bool{}
		for _, id := range sec.Rooms {
			ok[b.roomIdx[id]] = true
		}
		allowed = func(r int) bool { return ok[r] }
	}
	for r := range t.Rooms {
		room := &t.Rooms[r]
		if !allowed(r) || (!t.SoftCapacity && room.Capacity < sec.Size) || !room.HasFeatures(sec.Needs) {
			continue
		}
		set.add(r)
	}
	return set
}

// sameRoomGroups merges the sections of hard same-room relations (sections
// that take no room are left out: they use none) and intersects their
// candidate sets, including fixed rooms.
func (b *builder) sameRoomGroups(base []roomSet) {
	t := b.t
	rm := &b.c.rooms
	parent := map[int]int{}
	var find func(x int) int
	find = func(x int) int {
		if parent[x] == x {
			return x
		}
		parent[x] = find(parent[x])
		return parent[x]
	}
	var rels []int
	for ri, rel := range t.Relations {
		if rel.Kind != timetable.SameRoom || !rel.Hard {
			continue
		}
		rels = append(rels, ri)
		first := -1
		for _, id := range rel.Sections {
			s := b.secIdx[id]
			if !b.c.secs[s].takesRoom {
				continue
			}
			if _, ok := parent[s]; !ok {
				parent[s] = s
			}
			if first < 0 {
				first = s
			} else {
				parent[find(s)] = find(first)
			}
		}
	}
	groupOf := map[int]int{}
	for s := range t.Sections {
		if _, ok := parent[s]; !ok {
			continue
		}
		r := find(s)
		g, ok := groupOf[r]
		if !ok {
			g = len(rm.sameRoom)
			groupOf[r] = g
			rm.sameRoom = append(rm.sameRoom, sameRoomGroup{})
		}
		rm.sameRoom[g].sections = append(rm.sameRoom[g].sections, s)
		rm.secOf[s] = g
	}
	for _, ri := range rels {
		for _, id := range t.Relations[ri].Sections {
			if g, ok := rm.secOf[b.secIdx[id]]; ok {
				gr := &rm.sameRoom[g]
				if len(gr.relations) == 0 || gr.relations[len(gr.relations)-1] != ri {
					gr.relations = append(gr.relations, ri)
				}
				break
			}
		}
	}
	for g := range rm.sameRoom {
		gr := &rm.sameRoom[g]
		set := base[gr.sections[0]].clone()
		for _, s := range gr.sections {
			set = set.intersect(base[s])
			for _, f := range t.Sections[s].Fixed {
				if f.Room != "" {
					one := newRoomSet(rm.n)
					one.add(b.roomIdx[f.Room])
					set = set.intersect(one)
				}
			}
		}
		gr.cand = rm.sets.intern(set)
	}
}

// compileRoomSupply states the room requirements on start atoms:
//   - a meeting with no candidate room at all cannot be placed ("room fit");
//   - for each room family U (every distinct candidate set, the union of
//     each connected component of sets, and unions of pairs of overlapping
//     sets, at most maxFamilies per component) and each period p and week
//     scope: the meetings occupying p whose candidate set lies inside U,
//     plus the rooms of U unavailable at p, number at most |U|.
//
// By Hall's theorem these conditions (over every U) are exactly what a
// per-period room assignment needs; the families stated here catch the
// usual cases and Decode finds any missing U, which Solve then adds.
func (b *builder) compileRoomSupply() {
	rm := &b.c.rooms
	for r := range b.t.Rooms {
		if rm.blocked[r] != nil {
			room := &b.t.Rooms[r]
			rm.blocker[r] = b.newGroup(KindRoomAvailability, []string{room.ID},
				fmt.Sprintf("room %s is not available at the times on its Unavailable rows", room.ID),
				append([]timetable.Source{room.Src}, b.unavail.room[r].src...), RelaxAvailability)
		}
	}
	b.compileRoomFit()
	for _, set := range b.initialFamilies() {
		if b.lightlyLoaded(set) {
			continue // left for Decode to find, should it ever run short
		}
		b.addFamily(set, false)
	}
	b.compileSameRoomOverlap()
}

// compileRoomFit forbids meetings that have no candidate room.
func (b *builder) compileRoomFit() {
	rm := &b.c.rooms
	for s := range b.t.Sections {
		m := &b.c.secs[s]
		if !m.takesRoom {
			continue
		}
		for _, p := range m.starts {
			if rm.sets.sets[m.candAt(p)].count() > 0 {
				continue
			}
			g, ok := rm.fitGroup[s]
			if !ok {
				sec := &b.t.Sections[s]
				g = b.newGroup(KindRoomFit, []string{sec.ID}, b.roomFitSentence(s), []timetable.Source{sec.Src}, RelaxRooms)
				rm.fitGroup[s] = g
			}
			b.in(g, KindRoomFit)
			b.rule(0, solver.Pos(m.start[p]), b.sel(g))
		}
	}
}

func (b *builder) roomFitSentence(s int) string {
	sec := &b.t.Sections[s]
	var want []string
	if !b.t.SoftCapacity {
		want = append(want, fmt.Sprintf("%d seats", sec.Size))
	}
	if len(sec.Needs) > 0 {
		want = append(want, "features "+strings.Join(sec.Needs, ", "))
	}
	if len(sec.Rooms) > 0 {
		want = append(want, "one of the rooms "+strings.Join(sec.Rooms, ", "))
	}
	if g := b.c.secs[s].sameRoom; g >= 0 {
		want = append(want, "the one room shared by its same-room relation")
	}
	for _, f := range sec.Fixed {
		if f.Room != "" {
			want = append(want, "room "+f.Room+" for its fixed meeting "+f.Text)
		}
	}
	return fmt.Sprintf("section %s needs a room with %s", sec.ID, strings.Join(want, " and "))
}

// maxFamilies caps the pairwise unions added per connected component of
// candidate sets.
const maxFamilies = 64

// initialFamilies lists the room sets that get Hall constraints up front.
func (b *builder) initialFamilies() []roomSet {
	rm := &b.c.rooms
	used := map[int]bool{}
	for s := range b.t.Sections {
		m := &b.c.secs[s]
		if !m.takesRoom {
			continue
		}
		for _, p := range m.starts {
			if id := m.candAt(p); rm.sets.sets[id].count() > 0 {
				used[id] = true
			}
		}
	}
	ids := make([]int, 0, len(used))
	for id := range used {
		ids = append(ids, id)
	}
	sort.Ints(ids)
	// Connected components of sets that share rooms.
	comp := make([]int, len(ids))
	for i := range comp {
		comp[i] = i
	}
	find := func(x int) int {
		for comp[x] != x {
			comp[x] = comp[comp[x]]
			x = comp[x]
		}
		return x
	}
	owner := make([]int, rm.n)
	for r := range owner {
		owner[r] = -1
	}
	for i, id := range ids {
		rm.sets.sets[id].each(func(r int) {
			if owner[r] < 0 {
				owner[r] = i
			} else {
				comp[find(i)] = find(owner[r])
			}
		})
	}
	byComp := map[int][]int{}
	var roots []int
	for i := range ids {
		r := find(i)
		if _, ok := byComp[r]; !ok {
			roots = append(roots, r)
		}
		byComp[r] = append(byComp[r], ids[i])
	}
	var out []roomSet
	seen := map[string]bool{}
	addSet := func(s roomSet) bool {
		k := s.key()
		if seen[k] {
			return false
		}
		seen[k] = true
		out = append(out, s)
		return true
	}
	for _, r := range roots {
		members := byComp[r]
		union := newRoomSet(rm.n)
		for _, id := range members {
			addSet(rm.sets.sets[id])
			union = union.union(rm.sets.sets[id])
		}
		addSet(union)
		// Unions of pairs of crossing sets, smallest first.
		var cands []roomSet
		for i := 0; i < len(members) && len(cands) < 4*maxFamilies; i++ {
			for j := i + 1; j < len(members); j++ {
				a, c := rm.sets.sets[members[i]], rm.sets.sets[members[j]]
				if !a.intersects(c) || a.subsetOf(c) || c.subsetOf(a) {
					continue
				}
				cands = append(cands, a.union(c))
			}
		}
		sort.SliceStable(cands, func(i, j int) bool { return cands[i].count() < cands[j].count() })
		added := 0
		for _, u := range cands {
			if added >= maxFamilies {
				break
			}
			if addSet(u) {
				added++
			}
		}
	}
	return out
}

// Families of more than lazyMinRooms rooms whose weekly demand is under
// lazyLoad of their room-periods are not stated up front: such a set is
// rarely short in any period, and if it is, Decode finds it and Search.Cut adds
// it. This keeps the largest bounds (the most literals) out of most
// programs.
const (
	lazyMinRooms = 8
	lazyLoad     = 0.4
)

// lightlyLoaded reports whether family U may be left to lazy addition.
func (b *builder) lightlyLoaded(U roomSet) bool {
	size := U.count()
	if size <= lazyMinRooms {
		return false
	}
	rm := &b.c.rooms
	demand := 0
	for s := range b.t.Sections {
		m := &b.c.secs[s]
		if !m.takesRoom {
			continue
		}
		if set := rm.sets.sets[m.cand]; set.count() > 0 && set.subsetOf(U) {
			demand += m.meetings * m.length
		}
	}
	supply := 0
	U.each(func(r int) {
		for p := range b.t.Periods {
			if rm.blocked[r] == nil || !rm.blocked[r][p] {
				supply++
			}
		}
	})
	return float64(demand) < lazyLoad*float64(supply)
}

// addFamily adds room family U with its Hall constraints over every period
// and week scope; it returns the family index and false when U was there.
func (b *builder) addFamily(set roomSet, lazy bool) (int, bool) {
	rm := &b.c.rooms
	id := rm.sets.intern(set)
	if f, ok := rm.famByset[id]; ok {
		return f, false
	}
	g := b.newGroup(KindRoomSupply, []string{fmt.Sprint(len(rm.families) + 1)}, b.supplySentence(set), b.roomSources(set), RelaxRooms)
	f := len(rm.families)
	rm.families = append(rm.families, family{set: id, group: g, lazy: lazy})
	rm.famByset[id] = f
	b.hallBounds(f)
	return f, true
}

func (b *builder) supplySentence(set roomSet) string {
	ids := set.members()
	names := make([]string, 0, 6)
	for i, r := range ids {
		if i == 5 && len(ids) > 6 {
			names = append(names, fmt.Sprintf("and %d more", len(ids)-5))
			break
		}
		names = append(names, b.t.Rooms[r].ID)
	}
	if len(ids) == 1 {
		return fmt.Sprintf("room %s holds one meeting at a time: at most 1 meeting that can use no other room may meet in any period (none while it is unavailable)", names[0])
	}
	return fmt.Sprintf("the %d rooms %s hold one meeting each at a time: at most %d meetings that can use no other rooms may meet in any period (fewer while some are unavailable)",
		len(ids), strings.Join(names, ", "), len(ids))
}

func (b *builder) roomSources(set roomSet) []timetable.Source {
	var src []timetable.Source
	set.each(func(r int) {
		if len(src) < 12 {
			src = append(src, b.t.Rooms[r].Src)
		}
	})
	return src
}

// roomItem is one candidate meeting that takes a room: a section and a
// start, with its start literal.
type roomItem struct {
	s, p int32
	lit  solver.Lit
}

// roomItemsBySet groups every candidate meeting that takes a room by its
// candidate set id (made once per builder).
func (b *builder) roomItemsBySet() map[int][]roomItem {
	if b.itemsBySet != nil {
		return b.itemsBySet
	}
	b.itemsBySet = map[int][]roomItem{}
	for s := range b.t.Sections {
		m := &b.c.secs[s]
		if !m.takesRoom {
			continue
		}
		for _, p := range m.starts {
			id := m.candAt(p)
			b.itemsBySet[id] = append(b.itemsBySet[id], roomItem{int32(s), int32(p), solver.Pos(m.start[p])})
		}
	}
	return b.itemsBySet
}

// hallBounds states family f's Hall constraints: at each period and week
// scope, the candidate meetings there whose candidate set lies inside U,
// plus U's rooms unavailable then, number at most |U|. Bounds that can never
// be exceeded (no more distinct sections than rooms) are left out.
func (b *builder) hallBounds(f int) {
	rm := &b.c.rooms
	fam := rm.families[f]
	U := rm.sets.sets[fam.set]
	size := U.count()
	nP := len(b.t.Periods)
	bySet := b.roomItemsBySet()
	ids := make([]int, 0, len(bySet))
	for id := range bySet {
		if set := rm.sets.sets[id]; set.count() > 0 && set.subsetOf(U) {
			ids = append(ids, id)
		}
	}
	sort.Ints(ids)
	// Bucket the items by the periods they occupy (counting sort).
	start := make([]int, nP+1)
	total := 0
	for _, id := range ids {
		for _, it := range bySet[id] {
			for q := it.p; q < it.p+int32(b.c.secs[it.s].length); q++ {
				start[q+1]++
				total++
			}
		}
	}
	if total == 0 {
		return
	}
	for p := 0; p < nP; p++ {
		start[p+1] += start[p]
	}
	flat := make([]roomItem, total)
	fill := append([]int(nil), start[:nP]...)
	var secs []int
	inFam := map[int32]bool{}
	for _, id := range ids {
		for _, it := range bySet[id] {
			for q := it.p; q < it.p+int32(b.c.secs[it.s].length); q++ {
				flat[fill[q]] = it
				fill[q]++
			}
			if !inFam[it.s] {
				inFam[it.s] = true
				secs = append(secs, int(it.s))
			}
		}
	}
	// Week scopes over the sections involved.
	sort.Ints(secs)
	weekSets := make([]timetable.WeekSet, len(secs))
	for i, s := range secs {
		weekSets[i] = b.c.secs[s].weeks
	}
	scopes := weekScopes(weekSets)
	var inScope []map[int32]bool // nil when there is a single scope
	if len(scopes) > 1 {
		inScope = make([]map[int32]bool, len(scopes))
		for k, sc := range scopes {
			inScope[k] = map[int32]bool{}
			for _, i := range sc {
				inScope[k][int32(secs[i])] = true
			}
		}
	}
	b.in(fam.group, KindRoomSupply)
	sel := b.sel(fam.group)
	if len(b.stamp) < len(b.t.Sections) {
		b.stamp = make([]int32, len(b.t.Sections))
	}
	var lits []solver.Lit
	for p := 0; p < nP; p++ {
		here := flat[start[p]:start[p+1]]
		if len(here) == 0 {
			continue
		}
		var blockers []solver.Lit
		U.each(func(r int) {
			if rm.blocked[r] != nil && rm.blocked[r][p] {
				blockers = append(blockers, b.sel(rm.blocker[r]))
			}
		})
		for k := range scopes {
			lits = lits[:0]
			b.stampGen++
			distinct := 0
			for _, it := range here {
				if inScope != nil && !inScope[k][it.s] {
					continue
				}
				lits = append(lits, it.lit)
				if b.stamp[it.s] != b.stampGen {
					b.stamp[it.s] = b.stampGen
					distinct++
				}
			}
			if distinct == 0 || distinct+len(blockers) <= size {
				continue
			}
			lits = append(lits, blockers...)
			b.bound(lits, solver.NoBound, size, sel)
		}
	}
}

// compileSameRoomOverlap: two sections that must share one room cannot
// meet at the same time in overlapping weeks.
func (b *builder) compileSameRoomOverlap() {
	rm := &b.c.rooms
	for g := range rm.sameRoom {
		gr := &rm.sameRoom[g]
		var src []timetable.Source
		var ids []string
		for _, ri := range gr.relations {
			src = append(src, b.t.Relations[ri].Src)
		}
		for _, s := range gr.sections {
			ids = append(ids, b.t.Sections[s].ID)
		}
		key := []string{fmt.Sprint(gr.relations[0] + 1)}
		if src[0].Row > 0 {
			key = []string{fmt.Sprint(src[0].Row)}
		}
		grp := b.newGroup(KindRelation, key,
			fmt.Sprintf("sections %s use one room for all their meetings", strings.Join(ids, ", ")), src, RelaxRelation)
		if rm.sets.sets[gr.cand].count() == 0 {
			b.in(grp, KindRelation)
			b.rule(0, b.sel(grp))
			continue
		}
		b.noOverlap(gr.sections, grp, KindRelation)
	}
}
