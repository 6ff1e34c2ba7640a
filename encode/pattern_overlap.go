package encode

import (
	"fmt"

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
		return
	}
	t := b.t
	staffSecs := make([][]int, len(t.Staff))
	cohortSecs := make([][]int, len(t.Cohorts))
	staffPat := make([]bool, len(t.Staff))
	cohortPat := make([]bool, len(t.Cohorts))
	for s, sec := range t.Sections {
		on := b.c.pats[s].on
		for _, id := range uniq(sec.Staff) {
			i := b.staffIdx[id]
			staffSecs[i] = append(staffSecs[i], s)
			staffPat[i] = staffPat[i] || on
		}
		for _, id := range uniq(sec.Cohorts) {
			i := b.cohortIdx[id]
			cohortSecs[i] = append(cohortSecs[i], s)
			cohortPat[i] = cohortPat[i] || on
		}
	}
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
// section may use. Grid sections whose only candidate room it is take
// part (their start means that room); a grid section that may use it
// among others is an input error, since the grid's rooms are counted, not
// chosen (see the package documentation).
func (b *builder) patternRoomOverlap() {
	t := b.t
	roomSecs := make([][]int, len(t.Rooms))
	for s := range t.Sections {
		for _, r := range b.c.pats[s].rooms {
			roomSecs[r] = append(roomSecs[r], s)
		}
	}
	var gridSecs [][]int
	for s := range t.Sections {
		m := &b.c.secs[s]
		if b.c.pats[s].on || !m.takesRoom || m.cand < 0 {
			continue
		}
		set := b.c.rooms.sets.sets[m.cand]
		members := set.members()
		for _, r := range members {
			if len(roomSecs[r]) == 0 {
				continue
			}
			if len(members) > 1 || len(m.fixedCand) > 0 {
				b.errorf(t.Sections[s].Src, "section %s may use room %s, which sections with meeting times also use: give it that room alone or other rooms (mixing the two kinds of section in rooms with several candidates is not supported yet)", t.Sections[s].ID, t.Rooms[r].ID)
				continue
			}
			if gridSecs == nil {
				gridSecs = make([][]int, len(t.Rooms))
			}
			gridSecs[r] = append(gridSecs[r], s)
		}
	}
	for r, secs := range roomSecs {
		if gridSecs != nil {
			secs = append(secs, gridSecs[r]...)
		}
		if len(secs) < 2 {
			continue
		}
		room := &t.Rooms[r]
		g := b.newGroup(KindRoomSupply, []string{"pattern", room.ID},
			fmt.Sprintf("room %s holds at most one meeting at a time (sections %s)", room.ID, sectionList(t, secs)),
			[]timetable.Source{room.Src}, RelaxRooms)
		b.cliqueBounds(b.occupantsOf(secs, true), r, g, KindRoomSupply)
	}
}

// cliqueBounds states "at most 1" under group g's selector for every
// maximal clique of occ that involves two sections or more; room >= 0
// asks for the room literals of that room.
func (b *builder) cliqueBounds(occ []interval, room, g int, kind string) {
	cliques := maximalCliques(occ, b.t.TeachingWeeks())
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
