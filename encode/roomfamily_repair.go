package encode

// familyRepair re-solves the rooms of a whole room family at once: U is
// the union of the failed meetings' candidate rooms, and the meetings
// whose candidate rooms all lie in U (the family's own meetings, which can
// use no other room) are solved exactly together, while every other
// meeting is moved out of U's rooms and placed again around them, batch by
// batch. On a large term the failed meetings are typically laboratories:
// per-period counting (hallCheck) holds, but meetings of several periods
// and alternate weeks do not fit, and the fast assignment filled the
// laboratories with meetings that could have used ordinary rooms. The
// meetings outside the family do not take part in the exact search, so
// when it finds no assignment the core is a proved conflict of the
// family's own meetings (Hall 1935: they can use no other room).
//
// It reports a proved conflict (core, true); otherwise rooms are placed
// as far as it got and a.failed holds the meetings still without a room
// (all of them placed: empty).
func (a *roomAssigner) familyRepair() (core []int, conflict bool) {
	d := a.d
	if len(a.failed) == 0 || d.effort.familyConflicts <= 0 {
		return nil, false
	}
	sets := d.c.rooms.sets.sets
	u := newRoomSet(d.c.rooms.n)
	for _, mi := range a.failed {
		u = u.union(sets[d.ms[mi].cand])
	}
	var own, others []int
	for i := range d.ms {
		m := &d.ms[i]
		switch {
		case m.cand < 0:
		case sets[m.cand].subsetOf(u):
			own = append(own, i)
		case m.room >= 0 && u.has(m.room):
			others = append(others, i)
		}
	}
	if len(own) > d.effort.maxFamily {
		return nil, false
	}
	prev := make(map[int]int, len(own)+len(others))
	for _, set := range [][]int{own, others} {
		for _, mi := range set {
			prev[mi] = d.ms[mi].room
			a.unplace(mi)
			d.ms[mi].room = -1
		}
	}
	c, proved, ok := a.exact(own, d.effort.familyConflicts, false)
	if !ok {
		// Put everything back as it was.
		for _, set := range [][]int{own, others} {
			for _, mi := range set {
				if r := prev[mi]; r >= 0 {
					a.place(mi, r)
				} else {
					d.ms[mi].room = r
				}
			}
		}
		if proved {
			return c, true
		}
		return nil, false
	}
	// The family's meetings have rooms; the others go around them, in
	// grid order like the fast assignment.
	a.failed = a.failed[:0]
	byStart := make([][]int, len(d.t.Periods))
	for _, mi := range others {
		byStart[d.ms[mi].start] = append(byStart[d.ms[mi].start], mi)
	}
	for _, ms := range byStart {
		if len(ms) > 0 {
			a.batch(ms)
		}
	}
	return nil, false
}
