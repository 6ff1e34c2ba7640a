package encode

import (
	"fmt"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// travelMinutes is the travel time between rooms a and c (indexes into
// Term.Rooms).
func (b *builder) travelMinutes(a, c int) int {
	return b.travelIndex().Between(b.t.Rooms[a].ID, b.t.Rooms[c].ID)
}

// travelIndex is the term's travel index, built on first use.
func (b *builder) travelIndex() *timetable.TravelIndex {
	if b.travel == nil {
		b.travel = timetable.NewTravelIndex(b.t)
	}
	return b.travel
}

// compilePatternTravel: a staff member or cohort never has two meetings on
// a common day in a common week with less free time between them than the
// travel time between their rooms (Term.Travel, hard). For each pair of
// their pattern sections, each pair of candidate patterns that leave a gap
// shorter than the longest travel time, and each pair of candidate rooms
// too far apart for that gap, one integrity constraint forbids the four
// choices together. Grid sections take part when the room of each of their
// candidate meetings is known before the search (one candidate room:
// gridRoomOf), through their start atoms (travelPairWays); the travel
// scope part refuses the others. Only terms with travel rows pay for it.
func (b *builder) compilePatternTravel() {
	t := b.t
	if len(t.Travel) == 0 {
		return
	}
	maxT := b.travelIndex().Most()
	if maxT <= 0 {
		return
	}
	travel := b.travelMinutes
	people := func(kind string, id string, src timetable.Source, name string, secs []int) {
		var pats, grid []int
		for _, s := range secs {
			switch {
			case b.c.pats[s].on && len(b.c.pats[s].rooms) > 0:
				pats = append(pats, s)
			case !b.c.pats[s].on && b.c.secs[s].takesRoom && b.gridRoomsKnown(s):
				grid = append(grid, s)
			}
		}
		if len(pats)+len(grid) < 2 && !(len(grid) == 1 && t.Sections[grid[0]].SameDay) {
			return
		}
		g := -1
		forbid := func(body ...solver.Lit) {
			if g < 0 {
				g = b.newGroup(kind, []string{id},
					fmt.Sprintf("%s has enough time to travel between the rooms of consecutive meetings", name),
					[]timetable.Source{src}, RelaxNoOverlap)
				b.in(g, kind)
			}
			b.rule(0, append(body, b.sel(g))...)
		}
		for x := 0; x < len(pats); x++ {
			for y := x + 1; y < len(pats); y++ {
				s1, s2 := pats[x], pats[y]
				p1, p2 := &b.c.pats[s1], &b.c.pats[s2]
				for _, i := range p1.times {
					c1 := &t.Sections[s1].Times[i]
					for _, j := range p2.times {
						c2 := &t.Sections[s2].Times[j]
						gap, ok := patternGap(c1, c2)
						if !ok || gap >= maxT {
							continue
						}
						for k1, r1 := range p1.rooms {
							for k2, r2 := range p2.rooms {
								if travel(r1, r2) <= gap {
									continue
								}
								forbid(solver.Pos(p1.time[i]), solver.Pos(p2.time[j]),
									solver.Pos(p1.room[k1]), solver.Pos(p2.room[k2]))
							}
						}
					}
				}
			}
		}
		// Pairs with a grid section, and a grid section's own meetings
		// when they may share a day (each meeting its own room).
		var ways [][]solver.Lit
		for x, s1 := range grid {
			items := b.relItems([]int{s1})
			if t.Sections[s1].SameDay {
				ways = b.travelPairWays(ways, items, items, true, maxT)
			}
			for _, s2 := range grid[x+1:] {
				ways = b.travelPairWays(ways, items, b.relItems([]int{s2}), false, maxT)
			}
			for _, s2 := range pats {
				ways = b.travelPairWays(ways, items, b.relItems([]int{s2}), false, maxT)
			}
		}
		for _, w := range ways {
			forbid(w...)
		}
	}
	staffSecs, cohortSecs := b.peopleSections()
	for i, secs := range staffSecs {
		st := &t.Staff[i]
		people(KindStaffTravel, st.ID, st.Src, "staff "+staffName(st), secs)
	}
	for i, secs := range cohortSecs {
		co := &t.Cohorts[i]
		people(KindCohortTravel, co.ID, co.Src, "cohort "+cohortName(co), secs)
	}
}

// patternGap is the free time between meetings of two patterns that share
// a day and a teaching week and do not overlap: the later start minus the
// earlier end; false when they share no day and week, or overlap.
func patternGap(a, c *timetable.TimeChoice) (int, bool) {
	if a.Days&c.Days == 0 || !a.Weeks.Overlaps(c.Weeks) {
		return 0, false
	}
	switch {
	case a.End() <= c.Start:
		return int(c.Start - a.End()), true
	case c.End() <= a.Start:
		return int(a.Start - c.End()), true
	}
	return 0, false
}
