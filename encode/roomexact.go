package encode

import (
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// roomEffort limits the exact room searches of Decode's repair.
type roomEffort struct {
	localHops          int   // how far local repair widens the set of meetings it moves; 0: no local repair
	isolatedHops       int   // how far isolatedCore widens the failed meetings
	maxIsolated        int   // larger neighbourhoods are not solved on their own
	maxComponent       int   // larger components are not searched whole
	localConflicts     int64 // engine conflicts of local repair and isolated proofs
	eachConflicts      int64 // engine conflicts of repairing one failed meeting (repairEach)
	componentConflicts int64 // engine conflicts of a whole component, the last resort
	maxFamily          int   // families with more meetings of their own are not re-solved whole
	familyConflicts    int64 // engine conflicts of a room family's own meetings (familyRepair); 0: no family repair
	pressurePass       bool  // when the fast assignment fails, run it again ranking rooms by pressure
}

// defaultRoomEffort is the effort of Decode.
var defaultRoomEffort = roomEffort{
	localHops: 3, isolatedHops: 4, maxIsolated: 800, maxComponent: 1500,
	localConflicts: 20000, eachConflicts: 1000, componentConflicts: 50000, maxFamily: 1500, familyConflicts: 50000,
	pressurePass: true,
}

// exact assigns rooms to a set of unplaced meetings, the others keeping
// their rooms, by solving a small program with explicit room atoms: x(i,r) for each meeting i and each room
// r it may use in all its periods; exactly one per meeting (while the
// meeting's own switch atom is assumed), at most one meeting per room,
// period and week scope, one room per same-room group. Preferred rooms are
// the initial phases. When there is no assignment, the engine's core names
// meetings that cannot all be roomed together. ok reports success; proved
// is false when the search ran out of budget.
//
// With isolated, the meetings outside comp are ignored (as if absent) and
// nothing is placed: a core found then is a conflict of comp on its own.
func (a *roomAssigner) exact(comp []int, limit int64, isolated bool) (core []int, proved, ok bool) {
	d := a.d
	p := solver.NewProgram()
	sw := make([]solver.Atom, len(comp))
	rooms := make([][]int, len(comp))
	x := make([]map[int]solver.Atom, len(comp))
	for k, mi := range comp {
		m := &d.ms[mi]
		sw[k] = p.NewAtom("")
		p.AddChoice([]solver.Atom{sw[k]}, solver.NoBound, solver.NoBound)
		x[k] = map[int]solver.Atom{}
		var heads []solver.Atom
		for _, r := range d.setMembers(m.cand) {
			if (isolated && a.availableAll(r, mi)) || (!isolated && a.free(r, mi)) {
				a := p.NewAtom("")
				x[k][r] = a
				heads = append(heads, a)
				rooms[k] = append(rooms[k], r)
			}
		}
		if len(heads) > 0 {
			p.AddChoice(heads, solver.NoBound, solver.NoBound)
		}
		lits := make([]solver.Lit, len(heads))
		for i, h := range heads {
			lits[i] = solver.Pos(h)
		}
		p.AddBound(lits, 1, 1, solver.Pos(sw[k]))
	}
	// Room clashes: bucket meetings by (room, period).
	nP := len(d.t.Periods)
	bucket := map[int][]int{}
	var keys []int
	for k, mi := range comp {
		m := &d.ms[mi]
		for _, r := range rooms[k] {
			for q := m.start; q <= m.end; q++ {
				key := r*nP + q
				if _, ok := bucket[key]; !ok {
					keys = append(keys, key)
				}
				bucket[key] = append(bucket[key], k)
			}
		}
	}
	for _, key := range keys {
		ks := bucket[key]
		if len(ks) < 2 {
			continue
		}
		r := key / nP
		weeks := make([]timetable.WeekSet, len(ks))
		for i, k := range ks {
			weeks[i] = d.ms[comp[k]].weeks
		}
		for _, scope := range weekScopes(weeks) {
			if len(scope) < 2 {
				continue
			}
			lits := make([]solver.Lit, len(scope))
			for i, j := range scope {
				lits[i] = solver.Pos(x[ks[j]][r])
			}
			p.AddBound(lits, solver.NoBound, 1)
		}
	}
	// Same-room groups: every meeting of a group in the room of the first.
	first := map[int]int{}
	for k, mi := range comp {
		g := d.ms[mi].group
		if g < 0 {
			continue
		}
		f, seen := first[g]
		if !seen {
			first[g] = k
			continue
		}
		for r, xa := range x[f] {
			if xb := x[k][r]; xb != 0 {
				p.AddConstraint(solver.Pos(xa), solver.Neg(xb), solver.Pos(sw[f]), solver.Pos(sw[k]))
				p.AddConstraint(solver.Pos(xb), solver.Neg(xa), solver.Pos(sw[f]), solver.Pos(sw[k]))
			} else {
				p.AddConstraint(solver.Pos(xa), solver.Pos(sw[f]), solver.Pos(sw[k]))
			}
		}
		for r, xb := range x[k] {
			if x[f][r] == 0 {
				p.AddConstraint(solver.Pos(xb), solver.Pos(sw[f]), solver.Pos(sw[k]))
			}
		}
	}
	opts := solver.DefaultOptions()
	opts.ConflictLimit = limit
	s, err := solver.New(p, opts)
	if err != nil {
		return comp, false, false
	}
	for k, mi := range comp {
		pr := append([]int(nil), rooms[k]...)
		a.prefer(mi, pr)
		if len(pr) > 0 {
			s.SetPhase(x[k][pr[0]], true)
		}
		s.SetPhase(sw[k], true)
	}
	assume := make([]solver.Lit, len(comp))
	for k := range comp {
		assume[k] = solver.Pos(sw[k])
	}
	s.Assume(assume...)
	switch s.Solve(d.ctx) {
	case solver.Satisfiable:
		if isolated {
			return nil, true, true
		}
		for k, mi := range comp {
			for _, r := range rooms[k] {
				if s.Value(x[k][r]) {
					a.place(mi, r)
					break
				}
			}
		}
		return nil, true, true
	case solver.Unsatisfiable:
		idx := map[solver.Atom]int{}
		for k := range comp {
			idx[sw[k]] = k
		}
		for _, l := range s.Core(nil) {
			if k, ok := idx[l.Atom()]; ok {
				core = append(core, comp[k])
			}
		}
		if len(core) == 0 {
			core = comp
		}
		return core, true, false
	}
	return comp, false, false
}

// availableAll reports whether room r is available in every period of
// meeting mi (whoever else holds it).
func (a *roomAssigner) availableAll(r, mi int) bool {
	m := &a.d.ms[mi]
	for q := m.start; q <= m.end; q++ {
		if a.d.blocked(r, q) {
			return false
		}
	}
	return true
}
