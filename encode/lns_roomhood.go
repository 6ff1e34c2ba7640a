package encode

import (
	"slices"

	"github.com/termwright/termwright/timetable"
)

// Room neighbourhoods. The engine does not see the room criteria (room
// stability, over capacity, wasted seats, travel): when the incumbent
// pays some of them, a step that frees sections chosen for their time cost
// rarely helps. A room neighbourhood frees a section that pays room cost
// (heavier shares more often) with the sections that use its rooms in the
// incumbent, the ones it competes with, so that the engine can move their
// times apart; the step's engine must then return times different from the
// incumbent's (forbidIncumbent), which room assignment judges.

// roomHood returns a room neighbourhood of ls.size sections (more when
// the chosen section has more competitors): the chosen section and its
// competitors, then sections related to those (breadth first); and the
// sections of which one must move (the competitors, or the chosen section
// when it has none). It returns nil when the incumbent pays no room cost.
func (o *optRun) roomHood(ls *lnsState) (secs, mustMove []int) {
	offenders, shares := o.roomOffenders()
	if len(offenders) == 0 {
		return nil, nil
	}
	var total int64
	for _, c := range shares {
		total += c
	}
	r := ls.rng.Int64N(total)
	pick := offenders[len(offenders)-1]
	for i, c := range shares {
		if r -= c; r < 0 {
			pick = offenders[i]
			break
		}
	}
	mates, nComp := o.roomMates(pick)
	seed := mates[:1+nComp]
	secs = ls.grow(seed, max(ls.size, len(seed)))
	mustMove = seed[1:]
	if nComp == 0 {
		mustMove = seed[:1]
	}
	return secs, slices.Clone(mustMove)
}

// roomOffenders lists the sections whose cost in the incumbent lies
// partly in the rooms (the cost beyond its engine-seen part), with that
// part, in section order; cached per incumbent.
func (o *optRun) roomOffenders() ([]int, []int64) {
	if o.roomCache.of == o.best {
		return o.roomCache.secs, o.roomCache.cost
	}
	o.roomCache.of, o.roomCache.secs, o.roomCache.cost = o.best, nil, nil
	timePart := TimeCost(o.t, o.best.sched, o.opt.Keep)
	for s, sec := range o.t.Sections {
		if d := o.best.cost.PerSection[sec.ID] - timePart.PerSection[sec.ID]; d > 0 {
			o.roomCache.secs = append(o.roomCache.secs, s)
			o.roomCache.cost = append(o.roomCache.cost, d)
		}
	}
	return o.roomCache.secs, o.roomCache.cost
}

// roomMates lists section s first, then its competitors: the sections
// that occupy one of s's rooms, in the incumbent, during a meeting of s
// held in another room (one of them must leave for s to keep one room);
// then the other sections that use s's rooms; each part in section order.
func (o *optRun) roomMates(s int) (mates []int, competitors int) {
	t := o.t
	id := t.Sections[s].ID
	var rooms []string
	var own []timetable.Placement
	for _, pl := range o.best.sched.Placements {
		if pl.Section == id {
			own = append(own, pl)
			if pl.Room != "" && !slices.Contains(rooms, pl.Room) {
				rooms = append(rooms, pl.Room)
			}
		}
	}
	idx := t.SectionIndex()
	overlaps := func(a timetable.Placement, la int, b timetable.Placement, lb int) bool {
		return a.Period >= 0 && b.Period >= 0 && a.Period < b.Period+lb && b.Period < a.Period+la
	}
	var comp, others []int
	for _, pl := range o.best.sched.Placements {
		j, ok := idx[pl.Section]
		if !ok || j == s || !slices.Contains(rooms, pl.Room) {
			continue
		}
		competes := false
		for _, m := range own {
			if m.Room != pl.Room && overlaps(m, t.Sections[s].Length, pl, t.Sections[j].Length) {
				competes = true
			}
		}
		switch {
		case competes && !slices.Contains(comp, j):
			comp = append(comp, j)
		case !competes && !slices.Contains(others, j):
			others = append(others, j)
		}
	}
	slices.Sort(comp)
	others = slices.DeleteFunc(others, func(j int) bool { return slices.Contains(comp, j) })
	slices.Sort(others)
	return append(append([]int{s}, comp...), others...), len(comp)
}

// roomCache holds roomOffenders' answer for one incumbent.
type roomCache struct {
	of   *candidate
	secs []int
	cost []int64
}
