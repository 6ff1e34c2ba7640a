package encode

import (
	"context"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Exact room choice. With the times of a timetable fixed, choosing rooms to
// minimise the room-dependent criteria is a small optimisation problem of
// its own, which the engine solves exactly when it is small enough: an atom
// in(i,r) for each meeting i and each room r it may use, exactly one per
// meeting, at most one meeting per room, period and week scope, and weak
// constraints for every room-dependent criterion with its weight and
// level. Times being fixed, travel is known pair by pair of consecutive
// meetings, so the encoding is exact.

// Limits of exactRooms.
const (
	exactRoomAtoms     = 40_000 // larger room programs are left to the local search
	exactRoomConflicts = 20_000 // conflict budget of one exact room search
)

// exactRooms returns s with rooms chosen by the engine to minimise the
// room-dependent criteria, starting from the rooms s has, and whether the
// choice is proven optimal for these times. It returns s unchanged (and
// false) when the room program would be too large or the engine finds
// nothing better within its budget.
func exactRooms(ctx context.Context, t *timetable.Term, c *Catalog, s, kept *timetable.Schedule, seed int64) (*timetable.Schedule, bool) {
	rs := newRoomSearch(t, c, s, kept)
	if rs == nil {
		return s, true // no room criterion is on, or no meeting takes a room
	}
	size := 0
	for _, m := range rs.ms {
		size += len(m.cands)
	}
	if size > exactRoomAtoms {
		return s, false
	}
	ep := &exactProgram{rs: rs, p: solver.NewProgram(), x: make([]map[int]solver.Atom, len(rs.ms)), rooms: make([][]int, len(rs.ms))}
	ep.build()
	opts := solver.DefaultOptions()
	opts.Seed = seed
	opts.ConflictLimit = exactRoomConflicts
	eng, err := solver.New(ep.p, opts)
	if err != nil {
		return s, false
	}
	for i, m := range rs.ms {
		for _, r := range ep.rooms[i] {
			eng.SetPhase(ep.x[i][r], r == m.room)
		}
	}
	st, _, err := eng.Optimize(ctx, nil)
	if err != nil || st != solver.Satisfiable {
		return s, false
	}
	out := &timetable.Schedule{Placements: slices.Clone(s.Placements)}
	for i, m := range rs.ms {
		for _, r := range ep.rooms[i] {
			if eng.Value(ep.x[i][r]) {
				out.Placements[m.pl].Room = t.Rooms[r].ID
			}
		}
	}
	return out, eng.Proven()
}

// exactProgram builds the room program of exactRooms.
type exactProgram struct {
	rs    *roomSearch
	p     *solver.Program
	x     []map[int]solver.Atom // x[i][r]: meeting i in room r
	rooms [][]int               // rooms[i]: the rooms of x[i], ascending
}

func (ep *exactProgram) build() {
	rs, p := ep.rs, ep.p
	for i, m := range rs.ms {
		ep.x[i] = map[int]solver.Atom{}
		rooms := m.cands
		if !m.movable {
			rooms = []int{m.room} // same-room groups and single candidates keep their rooms
		}
		var heads []solver.Atom
		for _, r := range rooms {
			if r != m.room && !rs.availableAll(r, i) {
				continue
			}
			a := p.NewAtom("")
			ep.x[i][r] = a
			ep.rooms[i] = append(ep.rooms[i], r)
			heads = append(heads, a)
			ep.perMeeting(i, r, a)
		}
		p.AddChoice(heads, 1, 1)
	}
	ep.clashes()
	ep.stability()
	ep.travel()
	ep.relations()
}

// weak adds a weak constraint of criterion k (an rc... index) of weight
// units times the criterion weight, when the criterion is on.
func (ep *exactProgram) weak(k int, units int64, body ...solver.Lit) {
	rs := ep.rs
	if lvl := rs.lvl[k]; lvl >= 0 && units != 0 {
		w := units
		if k != rcAvoid { // avoid rows are weighted already
			w *= rs.w[k]
		}
		ep.p.AddWeak(w, rs.levels[lvl], body...)
	}
}

// perMeeting states the criteria of one meeting in one room: over
// capacity or wasted seats, soft room rows, and the kept room.
func (ep *exactProgram) perMeeting(i, r int, a solver.Atom) {
	rs := ep.rs
	m := &rs.ms[i]
	size, capa := rs.t.Sections[m.sec].Size, rs.t.Rooms[r].Capacity
	if size > capa {
		ep.weak(rcOverCapacity, int64(size-capa), solver.Pos(a))
	} else {
		ep.weak(rcWastedSeats, int64(capa-size), solver.Pos(a))
	}
	if row := rs.avoid[r]; row != nil {
		var sum int64
		for q := m.start; q <= m.end; q++ {
			sum += row[q]
		}
		ep.weak(rcAvoid, sum, solver.Pos(a))
	}
	if m.oldRooms != nil && !slices.Contains(m.oldRooms, r) {
		ep.weak(rcMoved, 1, solver.Pos(a))
	}
}

// clashes: at most one meeting per room, period and week scope.
func (ep *exactProgram) clashes() {
	rs := ep.rs
	nP := len(rs.t.Periods)
	for r := range rs.t.Rooms {
		for q := 0; q < nP; q++ {
			var who []int
			var weeks []timetable.WeekSet
			for i, m := range rs.ms {
				if _, ok := ep.x[i][r]; ok && m.start <= q && q <= m.end {
					who = append(who, i)
					weeks = append(weeks, m.weeks)
				}
			}
			if len(who) < 2 {
				continue
			}
			for _, scope := range weekScopes(weeks) {
				if len(scope) < 2 {
					continue
				}
				lits := make([]solver.Lit, len(scope))
				for k, w := range scope {
					lits[k] = solver.Pos(ep.x[who[w]][r])
				}
				ep.p.AddBound(lits, solver.NoBound, 1)
			}
		}
	}
}

// uses returns atoms "some meeting of ms is in room r", in order of first
// use.
func (ep *exactProgram) uses(ms []int) []solver.Atom {
	at := map[int]solver.Atom{}
	var out []solver.Atom
	for _, i := range ms {
		for _, r := range ep.rooms[i] {
			u, ok := at[r]
			if !ok {
				u = ep.p.NewAtom("")
				at[r] = u
				out = append(out, u)
			}
			ep.p.AddRule(u, solver.Pos(ep.x[i][r]))
		}
	}
	return out
}

// stability: every room a section uses beyond its first costs one unit
// (the constant of the first room is left out: it changes nothing).
func (ep *exactProgram) stability() {
	rs := ep.rs
	if rs.lvl[rcStability] < 0 {
		return
	}
	for _, ms := range rs.bySec {
		if len(ms) < 2 {
			continue
		}
		for _, u := range ep.uses(ms) {
			ep.weak(rcStability, 1, solver.Pos(u))
		}
	}
}

// travel: for each person and each pair of their meetings where one
// starts right after the other ends, one unit per pair of different
// buildings the two may be in.
func (ep *exactProgram) travel() {
	rs := ep.rs
	t := rs.t
	if rs.lvl[rcTravel] < 0 {
		return
	}
	type pair struct{ a, b int }
	count := map[pair]int64{}
	var order []pair
	for k := range rs.byWho {
		for _, a := range rs.byWho[k] {
			ma := &rs.ms[a]
			if ma.end+1 >= len(t.Periods) || !t.Consecutive(ma.end, ma.end+1) {
				continue
			}
			for _, b := range rs.startAt[k][ma.end+1] {
				pr := pair{a, b}
				if _, ok := count[pr]; !ok {
					order = append(order, pr)
				}
				count[pr]++
			}
		}
	}
	type inBuilding struct {
		name string
		lit  solver.Lit // "the meeting is in a room of this building"
	}
	in := map[int][]inBuilding{}
	building := func(i int) []inBuilding {
		if l, ok := in[i]; ok {
			return l
		}
		var names []string // in the order of the meeting's rooms
		lits := map[string][]solver.Lit{}
		for _, r := range ep.rooms[i] {
			b := t.Rooms[r].Building
			if b == "" {
				continue
			}
			if _, ok := lits[b]; !ok {
				names = append(names, b)
			}
			lits[b] = append(lits[b], solver.Pos(ep.x[i][r]))
		}
		out := make([]inBuilding, 0, len(names))
		for _, b := range names {
			l := lits[b]
			if len(l) == 1 {
				out = append(out, inBuilding{b, l[0]})
				continue
			}
			u := ep.p.NewAtom("")
			for _, x := range l {
				ep.p.AddRule(u, x)
			}
			out = append(out, inBuilding{b, solver.Pos(u)})
		}
		in[i] = out
		return out
	}
	for _, pr := range order {
		for _, x := range building(pr.a) {
			for _, y := range building(pr.b) {
				if x.name != y.name {
					ep.weak(rcTravel, count[pr], x.lit, y.lit)
				}
			}
		}
	}
}

// relations: a soft same-room row is broken when its meetings use two
// rooms or more: broken(R) is free and pinned by two bounds over the
// rooms used.
func (ep *exactProgram) relations() {
	rs := ep.rs
	if rs.lvl[rcRelations] < 0 {
		return
	}
	for ri, secs := range rs.relSec {
		var ms []int
		for _, sec := range secs {
			ms = append(ms, rs.bySec[sec]...)
		}
		if len(ms) < 2 {
			continue
		}
		used := ep.uses(ms)
		lits := make([]solver.Lit, 0, len(used))
		for _, u := range used {
			lits = append(lits, solver.Pos(u))
		}
		b := ep.p.NewAtom("")
		ep.p.AddChoice([]solver.Atom{b}, solver.NoBound, solver.NoBound)
		ep.p.AddBound(lits, solver.NoBound, 1, solver.Neg(b))
		ep.p.AddBound(lits, 2, solver.NoBound, solver.Pos(b))
		ep.weak(rcRelations, int64(rs.t.Relations[ri].Weight), solver.Pos(b))
	}
}

// availableAll reports whether room r is available (not blocked) in every
// period of meeting i.
func (rs *roomSearch) availableAll(r, i int) bool {
	blocked := rs.c.rooms.blocked[r]
	if blocked == nil {
		return true
	}
	m := &rs.ms[i]
	for q := m.start; q <= m.end; q++ {
		if blocked[q] {
			return false
		}
	}
	return true
}
