package encode

import (
	"sort"

	"github.com/termwright/termwright/solver"
)

// roomAssigner gives every meeting of a decoded model a room.
type roomAssigner struct {
	d        *decoder
	occ      [][][]int32 // occ[r][p]: meetings holding room r at period p
	secRooms map[int][]int
	failed   []int // meetings left without a room
	pressure []int // per room, when rooms are ranked by the demand on them (roomPressure)
}

// assignRooms assigns rooms to all meetings that take one: first meetings
// with one candidate room (fixed rooms), then same-room groups, then the
// rest batch by batch in grid order. When some meeting is left without a
// room, it does it all again keeping the rooms in demand free (room
// pressure), and when that fails too the failed meetings are repaired
// (repair).
func (d *decoder) assignRooms() error {
	a := &roomAssigner{d: d}
	if a.fastAssign(nil); len(a.failed) == 0 {
		return nil
	}
	// A second pass that keeps rooms many meetings depend on for them
	// (roomPressure); the first pass's rooms stand wherever it succeeds.
	if d.effort.pressurePass {
		if a.fastAssign(d.roomPressure()); len(a.failed) == 0 {
			return nil
		}
	}
	return a.repair()
}

// fastAssign assigns rooms from scratch: fixed rooms, same-room groups,
// then batch by batch in grid order, ranking rooms by pressure when given
// (prefer). Meetings it cannot place are left in a.failed.
func (a *roomAssigner) fastAssign(pressure []int) {
	d := a.d
	nP := len(d.t.Periods)
	a.pressure, a.failed, a.secRooms = pressure, nil, map[int][]int{}
	a.occ = make([][][]int32, d.c.rooms.n)
	for r := range a.occ {
		a.occ[r] = make([][]int32, nP)
	}
	for i := range d.ms {
		if d.ms[i].cand >= 0 {
			d.ms[i].room = -1
		}
	}
	a.preassignSingles()
	a.preassignGroups()
	byStart := make([][]int, nP)
	for i, m := range d.ms {
		if m.cand >= 0 && m.room == -1 {
			byStart[m.start] = append(byStart[m.start], i)
		}
	}
	for p := 0; p < nP; p++ {
		if len(byStart[p]) > 0 {
			a.batch(byStart[p])
		}
	}
}

// roomPressure is, per room, how much of the term's demand can go
// nowhere else: the sum over meetings of their periods divided by their
// number of candidate rooms (scaled to integers). A meeting that can use
// a room of low pressure leaves the rooms others depend on (laboratories
// for the meetings that need one) free.
func (d *decoder) roomPressure() []int {
	pr := make([]float64, d.c.rooms.n)
	for i := range d.ms {
		m := &d.ms[i]
		if m.cand < 0 {
			continue
		}
		rooms := d.setMembers(m.cand)
		w := float64(m.end-m.start+1) * float64(m.weeks.Count()) / float64(len(rooms))
		for _, r := range rooms {
			pr[r] += w
		}
	}
	out := make([]int, len(pr))
	for r, v := range pr {
		out[r] = int(v * 16)
	}
	return out
}

// free reports whether room r can take meeting mi given the meetings
// placed so far: available in every period of the meeting, and not held
// there by a meeting in overlapping weeks.
func (a *roomAssigner) free(r, mi int) bool {
	m := &a.d.ms[mi]
	for q := m.start; q <= m.end; q++ {
		if a.d.blocked(r, q) {
			return false
		}
		for _, j := range a.occ[r][q] {
			if a.d.ms[j].weeks&m.weeks != 0 {
				return false
			}
		}
	}
	return true
}

func (a *roomAssigner) place(mi, r int) {
	m := &a.d.ms[mi]
	m.room = r
	for q := m.start; q <= m.end; q++ {
		a.occ[r][q] = append(a.occ[r][q], int32(mi))
	}
	for _, x := range a.secRooms[m.sec] {
		if x == r {
			return
		}
	}
	a.secRooms[m.sec] = append(a.secRooms[m.sec], r)
}

func (a *roomAssigner) unplace(mi int) {
	m := &a.d.ms[mi]
	if m.room < 0 {
		return
	}
	r := m.room
	for q := m.start; q <= m.end; q++ {
		l := a.occ[r][q]
		for k, j := range l {
			if int(j) == mi {
				a.occ[r][q] = append(l[:k], l[k+1:]...)
				break
			}
		}
	}
	m.room = -1
}

// prefer sorts rooms by preference for meeting mi: rooms where it joins
// meetings of other weeks (sharing saves a room for meetings that need all
// weeks), then rooms the section already uses, then rooms that fit, then
// rooms too small (only possible under SoftCapacity); among those, the
// rooms of least pressure when ranked by it (fastAssign's second pass),
// then the fewest empty seats (fewest students over).
func (a *roomAssigner) prefer(mi int, rooms []int) {
	m := &a.d.ms[mi]
	size := a.d.t.Sections[m.sec].Size
	used := a.secRooms[m.sec]
	type key [5]int
	keyOf := func(r int) key {
		var k key
		for q := m.start; q <= m.end; q++ {
			if len(a.occ[r][q]) == 0 {
				k[0]++ // periods this meeting would have the room to itself
			}
		}
		k[1] = 1
		for _, x := range used {
			if x == r {
				k[1] = 0
			}
		}
		if c := a.d.t.Rooms[r].Capacity; c >= size {
			k[4] = c - size
		} else {
			k[2], k[4] = 1, size-c
		}
		if a.pressure != nil {
			k[3] = a.pressure[r]
		}
		return k
	}
	keys := make(map[int]key, len(rooms))
	for _, r := range rooms {
		keys[r] = keyOf(r)
	}
	sort.SliceStable(rooms, func(i, j int) bool {
		ki, kj := keys[rooms[i]], keys[rooms[j]]
		for x := range ki {
			if ki[x] != kj[x] {
				return ki[x] < kj[x]
			}
		}
		return false
	})
}

// preassignGroups gives each same-room group one room that is free for all
// its meetings, preferring the best fit for its largest section.
func (a *roomAssigner) preassignGroups() {
	d := a.d
	groups := map[int][]int{}
	var order []int
	for i, m := range d.ms {
		if m.group >= 0 && m.cand >= 0 {
			if _, ok := groups[m.group]; !ok {
				order = append(order, m.group)
			}
			groups[m.group] = append(groups[m.group], i)
		}
	}
	for _, g := range order {
		ms := groups[g]
		rooms := append([]int(nil), d.setMembers(d.ms[ms[0]].cand)...)
		var open []int // meetings of the group not placed yet
		for _, mi := range ms {
			if r := d.ms[mi].room; r >= 0 {
				rooms = []int{r} // a fixed room decides the group's room
			} else if r == -1 {
				open = append(open, mi)
			}
		}
		if len(open) == 0 {
			continue
		}
		big := open[0]
		for _, mi := range open {
			if d.t.Sections[d.ms[mi].sec].Size > d.t.Sections[d.ms[big].sec].Size {
				big = mi
			}
		}
		a.prefer(big, rooms)
		done := false
		for _, r := range rooms {
			ok := true
			for _, mi := range open {
				if !a.free(r, mi) {
					ok = false
					break
				}
			}
			if ok {
				for _, mi := range open {
					a.place(mi, r)
				}
				done = true
				break
			}
		}
		if !done {
			for _, mi := range open {
				d.ms[mi].room = -2 // left for repair
				a.failed = append(a.failed, mi)
			}
		}
	}
}

// preassignSingles places meetings that have exactly one candidate room.
func (a *roomAssigner) preassignSingles() {
	d := a.d
	for i := range d.ms {
		m := &d.ms[i]
		if m.cand < 0 || m.room != -1 {
			continue
		}
		rooms := d.setMembers(m.cand)
		if len(rooms) != 1 {
			continue
		}
		if a.free(rooms[0], i) {
			a.place(i, rooms[0])
		} else {
			m.room = -2
			a.failed = append(a.failed, i)
		}
	}
}

// batch places the meetings that start in one period: a maximum matching
// by augmenting paths (Kuhn's method) in which each meeting tries its rooms
// in order of preference, most constrained meetings first; meetings left
// over then try rooms shared with meetings in other weeks.
func (a *roomAssigner) batch(ms []int) {
	d := a.d
	pref := make(map[int][]int, len(ms))
	for _, mi := range ms {
		var rooms []int
		for _, r := range d.setMembers(d.ms[mi].cand) {
			if a.free(r, mi) {
				rooms = append(rooms, r)
			}
		}
		a.prefer(mi, rooms)
		pref[mi] = rooms
	}
	order := append([]int(nil), ms...)
	sort.SliceStable(order, func(i, j int) bool { return len(pref[order[i]]) < len(pref[order[j]]) })
	holder := map[int]int{}
	assign := map[int]int{}
	var try func(mi int, seen map[int]bool) bool
	try = func(mi int, seen map[int]bool) bool {
		for _, r := range pref[mi] {
			if seen[r] {
				continue
			}
			seen[r] = true
			h, taken := holder[r]
			if !taken || try(h, seen) {
				holder[r] = mi
				assign[mi] = r
				return true
			}
		}
		return false
	}
	for _, mi := range order {
		try(mi, map[int]bool{})
	}
	var left []int
	for _, mi := range order {
		if r, ok := assign[mi]; ok {
			a.place(mi, r)
		} else {
			left = append(left, mi)
		}
	}
	for _, mi := range left {
		placed := false
		for _, r := range pref[mi] {
			if a.free(r, mi) {
				a.place(mi, r)
				placed = true
				break
			}
		}
		if !placed {
			d.ms[mi].room = -2
			a.failed = append(a.failed, mi)
		}
	}
}

// component returns the meetings connected to the failed ones: meetings
// that share a period with a common candidate room, or a same-room group,
// transitively. Rooms of other meetings never interact with these.
func (a *roomAssigner) components() [][]int {
	d := a.d
	n := len(d.ms)
	parent := make([]int, n)
	for i := range parent {
		parent[i] = i
	}
	find := func(x int) int {
		for parent[x] != x {
			parent[x] = parent[parent[x]]
			x = parent[x]
		}
		return x
	}
	union := func(x, y int) { parent[find(x)] = find(y) }
	nP := len(d.t.Periods)
	rep := make([]int, d.c.rooms.n)
	groupRep := map[int]int{}
	byPeriod := make([][]int, nP)
	for i, m := range d.ms {
		if m.cand < 0 {
			continue
		}
		for q := m.start; q <= m.end; q++ {
			byPeriod[q] = append(byPeriod[q], i)
		}
		if m.group >= 0 {
			if g, ok := groupRep[m.group]; ok {
				union(i, g)
			} else {
				groupRep[m.group] = i
			}
		}
	}
	for p := 0; p < nP; p++ {
		for r := range rep {
			rep[r] = -1
		}
		for _, i := range byPeriod[p] {
			for _, r := range d.setMembers(d.ms[i].cand) {
				if rep[r] < 0 {
					rep[r] = i
				} else {
					union(i, rep[r])
				}
			}
		}
	}
	want := map[int]bool{}
	for _, i := range a.failed {
		want[find(i)] = true
	}
	byRoot := map[int][]int{}
	var roots []int
	for i, m := range d.ms {
		if m.cand < 0 {
			continue
		}
		r := find(i)
		if !want[r] {
			continue
		}
		if _, ok := byRoot[r]; !ok {
			roots = append(roots, r)
		}
		byRoot[r] = append(byRoot[r], i)
	}
	out := make([][]int, len(roots))
	for k, r := range roots {
		out[k] = byRoot[r]
	}
	return out
}

// repair places the meetings the fast assignment left over. First it
// re-solves each exactly with the meetings that block it from its rooms
// (repairEach), then their room family whole (familyRepair, which may
// prove a conflict), then the rest together with the meetings that block them
// (widening a few times), everything else staying where it is. If
// that fails, it looks for a proof that the failed meetings cannot be
// roomed: a growing neighbourhood of them, solved on its own (others
// ignored); an unsatisfiable one yields its core as a nogood over starts.
// (The smallest such neighbourhood is tried before the repair of all
// failed meetings together: when it is unsatisfiable, so is every repair.)
// As a last resort each whole component is solved (only when small enough);
// when nothing is proved within the effort limits, the nogood over the last
// neighbourhood is returned marked Incomplete.
func (a *roomAssigner) repair() error {
	if a.d.effort.localHops > 0 {
		if a.repairEach(); len(a.failed) == 0 {
			return nil
		}
	}
	rerr := &RoomConflictError{}
	// The failed meetings' own room family solved whole: a proved conflict
	// of meetings that can use no other room, or rooms for all of them
	// with the others placed around them.
	if core, conflict := a.familyRepair(); conflict {
		a.addNogood(rerr, core)
		return rerr
	} else if len(a.failed) == 0 {
		return nil
	} else if a.d.effort.localHops > 0 {
		a.repairEach() // the meetings moved out of the family's rooms
		if len(a.failed) == 0 {
			return nil
		}
	}
	// A conflict of the failed meetings and their direct neighbours on
	// their own is cheap to prove, and no local repair can undo it: look
	// for it first (the result is the same as after a failed repair).
	iso := &isolation{}
	if a.d.effort.isolatedHops > 0 {
		if core, ok := a.isolatedCore(iso, 1); ok {
			a.addNogood(rerr, core)
			return rerr
		}
	}
	if a.localRepair() {
		return nil
	}
	if err := a.d.ctx.Err(); err != nil {
		return err // out of time: no conflict was proved
	}
	if core, ok := a.isolatedCore(iso, a.d.effort.isolatedHops); ok {
		a.addNogood(rerr, core)
		return rerr
	}
	for _, comp := range a.components() {
		if err := a.d.ctx.Err(); err != nil {
			return err
		}
		if len(comp) > a.d.effort.maxComponent {
			rerr.Incomplete = true
			a.addNogood(rerr, a.neighbourhood(comp))
			continue
		}
		for _, mi := range comp {
			a.unplace(mi)
		}
		core, proved, ok := a.exact(comp, a.d.effort.componentConflicts, false)
		if ok {
			continue
		}
		if err := a.d.ctx.Err(); err != nil {
			return err
		}
		if !proved {
			rerr.Incomplete = true
		}
		a.addNogood(rerr, core)
	}
	if len(rerr.nogoods) > 0 {
		return rerr
	}
	return nil
}

// addNogood records that the meetings of core cannot all have their starts.
func (a *roomAssigner) addNogood(rerr *RoomConflictError, core []int) {
	clause := make([]solver.Lit, 0, len(core))
	seen := map[int]bool{}
	for _, s := range rerr.Sections {
		seen[a.d.secIndex(s)] = true
	}
	for _, mi := range core {
		m := &a.d.ms[mi]
		clause = append(clause, solver.Neg(m.atom))
		if !seen[m.sec] {
			seen[m.sec] = true
			rerr.Sections = append(rerr.Sections, a.d.t.Sections[m.sec].ID)
		}
	}
	rerr.nogoods = append(rerr.nogoods, clause)
}

// neighbourhood returns the failed meetings of comp and the meetings that
// share a period (in overlapping weeks) and a candidate room with them.
func (a *roomAssigner) neighbourhood(comp []int) []int {
	failed := map[int]bool{}
	for _, mi := range a.failed {
		failed[mi] = true
	}
	var out []int
	for _, mi := range comp {
		if failed[mi] {
			out = append(out, mi)
		}
	}
	return a.widen(out, 1)
}

// widen adds, hops times, every meeting that shares a period in overlapping
// weeks and a candidate room with a meeting of the set (and whole same-room
// groups).
func (a *roomAssigner) widen(set []int, hops int) []int {
	d := a.d
	in := map[int]bool{}
	for _, mi := range set {
		in[mi] = true
	}
	byPeriod := make([][]int, len(d.t.Periods))
	for i, m := range d.ms {
		if m.cand < 0 {
			continue
		}
		for q := m.start; q <= m.end; q++ {
			byPeriod[q] = append(byPeriod[q], i)
		}
	}
	add := func(j int) {
		if in[j] {
			return
		}
		in[j] = true
		set = append(set, j)
		if g := d.ms[j].group; g >= 0 {
			for k := range d.ms {
				if d.ms[k].group == g && !in[k] {
					in[k] = true
					set = append(set, k)
				}
			}
		}
	}
	for h := 0; h < hops; h++ {
		for _, mi := range append([]int(nil), set...) {
			m := &d.ms[mi]
			cand := d.c.rooms.sets.sets[m.cand]
			for q := m.start; q <= m.end; q++ {
				for _, j := range byPeriod[q] {
					o := &d.ms[j]
					if !in[j] && o.weeks&m.weeks != 0 && d.c.rooms.sets.sets[o.cand].intersects(cand) {
						add(j)
					}
				}
			}
		}
	}
	return set
}

// isolation is the state of the search for an isolated core: the set
// solved on its own so far and how far it was widened.
type isolation struct {
	set  []int // the failed meetings widened hop times
	hop  int
	done bool // a neighbourhood was too large or ran out of budget: stop looking
}

// isolatedCore looks, widening up to hops times in all, for a set of
// meetings around the failed ones that cannot be roomed even on their own;
// it returns the engine's core. It resumes where an earlier call with the
// same iso stopped.
func (a *roomAssigner) isolatedCore(iso *isolation, hops int) ([]int, bool) {
	if iso.set == nil {
		iso.set = append([]int(nil), a.failed...)
	}
	for !iso.done && iso.hop < hops {
		iso.hop++
		iso.set = a.widen(iso.set, 1)
		if len(iso.set) > a.d.effort.maxIsolated {
			iso.done = true
			return nil, false
		}
		core, proved, ok := a.exact(iso.set, a.d.effort.localConflicts, true)
		switch {
		case ok:
			continue // roomable on its own: look wider
		case proved:
			return core, true
		default:
			iso.done = true
			return nil, false
		}
	}
	return nil, false
}

// repairEach re-solves the failed meetings one at a time, each with the
// meetings that hold one of its candidate rooms during its periods in
// overlapping weeks (and their whole same-room groups); every other
// meeting keeps its room. It leaves in a.failed the meetings it could not
// place. On a large term the failed meetings are scattered, and solving
// them together with all their blockers (localRepair) means solving most
// of the term's rooms at once.
func (a *roomAssigner) repairEach() {
	d := a.d
	groups := map[int][]int{}
	for j := range d.ms {
		if g := d.ms[j].group; g >= 0 && d.ms[j].cand >= 0 {
			groups[g] = append(groups[g], j)
		}
	}
	var left []int
	for _, mi := range a.failed {
		if d.ctx.Err() != nil {
			left = append(left, mi)
			continue
		}
		in := map[int]bool{}
		var set []int
		add := func(j int) {
			if in[j] {
				return
			}
			in[j] = true
			set = append(set, j)
			if g := d.ms[j].group; g >= 0 {
				for _, k := range groups[g] {
					if !in[k] {
						in[k] = true
						set = append(set, k)
					}
				}
			}
		}
		add(mi)
		m := &d.ms[mi]
		for _, r := range d.setMembers(m.cand) {
			for q := m.start; q <= m.end; q++ {
				for _, j := range a.occ[r][q] {
					if d.ms[j].weeks&m.weeks != 0 {
						add(int(j))
					}
				}
			}
		}
		if len(set) > d.effort.maxIsolated {
			left = append(left, mi)
			continue
		}
		prev := make([]int, len(set))
		for k, j := range set {
			prev[k] = d.ms[j].room
			a.unplace(j)
			d.ms[j].room = -1
		}
		if _, _, ok := a.exact(set, d.effort.eachConflicts, false); ok {
			continue
		}
		for k, j := range set {
			if prev[k] >= 0 {
				a.place(j, prev[k])
			} else {
				d.ms[j].room = prev[k]
			}
		}
		left = append(left, mi)
	}
	a.failed = left
}

// localRepair tries to place the failed meetings by moving only meetings
// near them: those holding, in an overlapping period and week, a room the
// failed meetings could use (and, widening, their own blockers). Meetings
// outside the set keep their rooms. It reports success; on failure every
// meeting is back where it was (failed ones unplaced).
func (a *roomAssigner) localRepair() bool {
	d := a.d
	groups := map[int][]int{}
	for j := range d.ms {
		if g := d.ms[j].group; g >= 0 && d.ms[j].cand >= 0 {
			groups[g] = append(groups[g], j)
		}
	}
	in := map[int]bool{}
	set := make([]int, 0, len(a.failed))
	add := func(j int) {
		if in[j] {
			return
		}
		in[j] = true
		set = append(set, j)
		// A same-room group moves as a whole.
		if g := d.ms[j].group; g >= 0 {
			for _, k := range groups[g] {
				if !in[k] {
					in[k] = true
					set = append(set, k)
				}
			}
		}
	}
	for _, mi := range a.failed {
		d.ms[mi].room = -1
		add(mi)
	}
	for hop := 0; hop < a.d.effort.localHops && a.d.ctx.Err() == nil; hop++ {
		// Widen by the blockers of every meeting in the set.
		for _, mi := range append([]int(nil), set...) {
			m := &d.ms[mi]
			for _, r := range d.setMembers(m.cand) {
				for q := m.start; q <= m.end; q++ {
					for _, j := range a.occ[r][q] {
						if d.ms[j].weeks&m.weeks != 0 {
							add(int(j))
						}
					}
				}
			}
		}
		if len(set) > d.effort.maxComponent {
			break // most of a large term's rooms at once: not solved within the budget
		}
		prev := make([]int, len(set))
		for k, mi := range set {
			prev[k] = d.ms[mi].room
			a.unplace(mi)
		}
		if _, _, ok := a.exact(set, a.d.effort.localConflicts, false); ok {
			return true
		}
		for k, mi := range set {
			if prev[k] >= 0 {
				a.place(mi, prev[k])
			}
		}
	}
	for _, mi := range a.failed {
		d.ms[mi].room = -2
	}
	return false
}
