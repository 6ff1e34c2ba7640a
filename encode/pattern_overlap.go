package encode

import (
	"fmt"
	"sort"
	"strconv"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// compilePatternNoOverlap states one meeting at a time for every staff
// member, cohort and room that has a pattern section: one bound "at most
// 1" per maximal clique of their candidate meetings (pattern_cliques.go),
// grid meetings included, under the same requirement groups as the grid's
// no-overlap (whose per-period bounds over the grid meetings stay; they
// are implied by these and cost little).
func (b *builder) compilePatternNoOverlap() {
	if !b.pat.any {
		if b.makeExplicitGrid(); b.c.gridRooms != nil {
			b.patternRoomOverlap() // grid sections with explicit rooms (travel)
		}
		return
	}
	t := b.t
	staffSecs, cohortSecs := b.peopleSections()
	staffPat, cohortPat := b.anyPattern(staffSecs), b.anyPattern(cohortSecs)
	for i, secs := range staffSecs {
		if len(secs) < 2 || !staffPat[i] {
			continue
		}
		st := &t.Staff[i]
		g := b.newGroup(KindStaffNoOverlap, []string{st.ID},
			fmt.Sprintf("staff %s teaches at most one meeting at a time (sections %s)", staffName(st), sectionList(t, secs)),
			[]timetable.Source{st.Src}, RelaxNoOverlap)
		b.cliqueBounds(b.occupantsOf(secs, true), -1, g, KindStaffNoOverlap)
	}
	for i, secs := range cohortSecs {
		if len(secs) < 2 || !cohortPat[i] {
			continue
		}
		co := &t.Cohorts[i]
		g := b.newGroup(KindCohortNoOverlap, []string{co.ID},
			fmt.Sprintf("cohort %s attends at most one meeting at a time (sections %s)", cohortName(co), sectionList(t, secs)),
			[]timetable.Source{co.Src}, RelaxNoOverlap)
		b.cliqueBounds(b.occupantsOf(secs, true), -1, g, KindCohortNoOverlap)
	}
	b.patternRoomOverlap()
}

// patternRoomOverlap: one meeting at a time in every room a pattern
// section, or a grid section with explicit rooms (rooms_grid.go), may use.
// Grid sections take part through their grid_in atoms, or their start
// atoms when the room is the meeting's only candidate.
func (b *builder) patternRoomOverlap() {
	t := b.t
	b.makeExplicitGrid()
	roomSecs := make([][]int, len(t.Rooms))
	for s := range t.Sections {
		for _, r := range b.c.pats[s].rooms {
			roomSecs[r] = append(roomSecs[r], s)
		}
	}
	watched := make([]bool, len(t.Rooms))
	for s := range t.Sections {
		for _, r := range b.c.pats[s].rooms {
			watched[r] = true
		}
		if gm, ok := b.c.gridRooms[s]; ok {
			for _, xs := range gm.rooms {
				for _, x := range xs {
					watched[x.r] = true
				}
			}
		}
	}
	var gridSecs [][]int
	for s := range t.Sections {
		m := &b.c.secs[s]
		if b.c.pats[s].on || !m.takesRoom || m.cand < 0 {
			continue
		}
		in := make([]bool, len(t.Rooms))
		for _, p := range m.starts {
			rooms, ok := b.gridItemRooms(s, p)
			if !ok {
				continue // matched after the search, in rooms no pattern or explicit section uses
			}
			for _, x := range rooms {
				in[x.r] = true
			}
		}
		for r := range in {
			if !in[r] || !watched[r] {
				continue
			}
			if gridSecs == nil {
				gridSecs = make([][]int, len(t.Rooms))
			}
			gridSecs[r] = append(gridSecs[r], s)
		}
	}
	type roomPlan struct {
		r       int
		secs    []int
		occ     []interval
		cliques [][]int
		cost    int // room_time literals its bounds would need (distinct per section)
	}
	var plans []roomPlan
	total := 0
	for r, secs := range roomSecs {
		if gridSecs != nil {
			secs = append(secs, gridSecs[r]...)
		}
		if len(secs) < 2 {
			continue
		}
		occ := b.occupantsOf(secs, true)
		cl := maximalCliques(occ, t.TeachingWeeks())
		plans = append(plans, roomPlan{r: r, secs: secs, occ: occ, cliques: cl, cost: roomTimeCost(occ, cl)})
		total += plans[len(plans)-1].cost
	}
	// Above the budget, the dearest rooms are checked lazily (Decode finds
	// their clashes, the search forbids them and goes on), the others get
	// their clique bounds.
	budget := lazyRoomBudget * len(t.Sections)
	if total > budget {
		order := make([]int, len(plans))
		for i := range order {
			order[i] = i
		}
		sort.SliceStable(order, func(i, j int) bool { return plans[order[i]].cost < plans[order[j]].cost })
		sum := 0
		for _, i := range order {
			if sum+plans[i].cost > budget && !b.roomHasGrid(gridSecs, plans[i].r) {
				b.c.lazyRoom(plans[i].r)
				continue
			}
			sum += plans[i].cost
		}
	}
	for _, pl := range plans {
		if b.c.isLazyRoom(pl.r) {
			continue
		}
		room := &t.Rooms[pl.r]
		g := b.newGroup(KindRoomSupply, []string{"pattern", room.ID},
			fmt.Sprintf("room %s holds at most one meeting at a time (sections %s)", room.ID, sectionList(t, pl.secs)),
			[]timetable.Source{room.Src}, RelaxRooms)
		b.cliqueBoundsOf(pl.occ, pl.cliques, pl.r, g, KindRoomSupply)
	}
}

// lazyRoomBudget is the number of room_time literals per section above
// which the rooms whose clique bounds cost most are checked lazily. No
// public ITC-2019 instance exceeds it (lums-spr18 needs about 1,500 per
// section): measured there (shared 2-core machine, lightly loaded), eager
// bounds gave a first timetable in 56 s with 806k atoms and 1.7 GiB, lazy
// rooms at 600 none in 5 minutes (401 rounds, 400k nogoods, 1.1 GiB), so
// lazy checking is kept for terms far beyond them.
var lazyRoomBudget = 2000

// roomHasGrid reports whether grid sections use room r (such rooms are
// never lazy: the grid's meetings are not checked by Decode).
func (b *builder) roomHasGrid(gridSecs [][]int, r int) bool {
	return gridSecs != nil && len(gridSecs[r]) > 0
}

// roomTimeCost counts the distinct (section, patterns) pairs of the
// cliques: the room_time atoms their bounds need.
func roomTimeCost(occ []interval, cliques [][]int) int {
	seen := map[string]bool{}
	var key []byte
	for _, c := range cliques {
		for k := 0; k < len(c); {
			s := occ[c[k]].s
			key = strconv.AppendInt(key[:0], int64(s), 10)
			for ; k < len(c) && occ[c[k]].s == s; k++ {
				key = append(key, ',')
				key = strconv.AppendInt(key, int64(occ[c[k]].idx), 10)
			}
			seen[string(key)] = true
		}
	}
	return len(seen)
}

// cliqueBounds states "at most 1" under group g's selector for every
// maximal clique of occ that involves two sections or more; room >= 0
// asks for the room literals of that room.
func (b *builder) cliqueBounds(occ []interval, room, g int, kind string) {
	b.cliqueBoundsOf(occ, maximalCliques(occ, b.t.TeachingWeeks()), room, g, kind)
}

// cliqueBoundsOf is cliqueBounds with the cliques given.
func (b *builder) cliqueBoundsOf(occ []interval, cliques [][]int, room, g int, kind string) {
	b.in(g, kind)
	sel := b.sel(g)
	var lits []solver.Lit
	for _, c := range cliques {
		var n int
		lits, n = b.cliqueLits(lits[:0], occ, c, room)
		if n >= 2 {
			b.bound(lits, solver.NoBound, 1, sel)
		}
	}
}

// anyPattern reports, per list of sections, whether one of them is a
// pattern section.
func (b *builder) anyPattern(lists [][]int) []bool {
	out := make([]bool, len(lists))
	for i, secs := range lists {
		for _, s := range secs {
			out[i] = out[i] || b.c.pats[s].on
		}
	}
	return out
}
