package encode

import (
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// avoidTimes writes "avoid times" for the soft Unavailable rows of staff,
// cohorts and sections: the row's weight (times the criterion's) for every
// period a meeting involving them occupies inside the row's time. Rows of
// rooms depend on room assignment and are left to it. Weights of rows that
// hit the same section and period are added into one weak constraint.
func (sb *softBuilder) avoidTimes() {
	t := sb.t
	if w, _ := t.CriterionWeight(timetable.CritAvoidTimes); w == 0 {
		return
	}
	type hit struct{ s, p int }
	sum := map[hit]int64{}
	var order []hit
	for _, u := range t.Unavailable {
		if u.Hard || u.Weight <= 0 {
			continue
		}
		var secs []int
		switch u.Kind {
		case timetable.WhoStaff:
			secs = sb.sectionsWith(func(sec *timetable.Section) bool { return slices.Contains(sec.Staff, u.Who) })
		case timetable.WhoCohort:
			secs = sb.sectionsWith(func(sec *timetable.Section) bool { return slices.Contains(sec.Cohorts, u.Who) })
		case timetable.WhoSection:
			if s, ok := sb.secIdx[u.Who]; ok {
				secs = []int{s}
			}
		}
		for _, s := range secs {
			if u.Weeks != 0 && !u.Weeks.Overlaps(sb.c.secs[s].weeks) {
				continue // the row's weeks miss the section's
			}
			for p, per := range t.Periods {
				if !u.Covers(per) || sb.occupies(s, p) == 0 {
					continue
				}
				h := hit{s, p}
				if _, ok := sum[h]; !ok {
					order = append(order, h)
				}
				sum[h] += int64(u.Weight)
			}
		}
	}
	for _, h := range order {
		if w, l, ok := sb.weight(timetable.CritAvoidTimes, sum[h]); ok {
			sb.aboutSection(h.s)
			sb.weak(timetable.CritAvoidTimes, w, l, sb.occupies(h.s, h.p))
		}
	}
}

// sectionsWith lists the sections for which keep holds.
func (sb *softBuilder) sectionsWith(keep func(*timetable.Section) bool) []int {
	var out []int
	for s := range sb.t.Sections {
		if keep(&sb.t.Sections[s]) {
			out = append(out, s)
		}
	}
	return out
}

// earlyLate writes "early periods" and "late periods": one unit per
// meeting that starts in the first period of its day or ends in the last.
func (sb *softBuilder) earlyLate() {
	ew, el, early := sb.weight(timetable.CritEarly, 1)
	lw, ll, late := sb.weight(timetable.CritLate, 1)
	if !early && !late {
		return
	}
	first := make([]int, len(sb.t.Periods))
	last := make([]int, len(sb.t.Periods))
	for _, day := range sb.days {
		for _, p := range day {
			first[p], last[p] = day[0], day[len(day)-1]
		}
	}
	for s := range sb.t.Sections {
		m := &sb.c.secs[s]
		sb.aboutSection(s)
		for _, p := range m.starts {
			if early && p == first[p] {
				sb.weak(timetable.CritEarly, ew, el, solver.Pos(m.start[p]))
			}
			if late && p+m.length-1 == last[p] {
				sb.weak(timetable.CritLate, lw, ll, solver.Pos(m.start[p]))
			}
		}
	}
}

// spreadDays writes "spread days" for sections that may share days and
// want MinDays distinct days: MinDays minus the days used, when positive,
// as the sum over k = 1..MinDays of [fewer than k days]. Each
// short(S,k) atom is free and pinned to its meaning by two bounds over the
// section's meets(S,D) atoms: short → at most k-1 days, not short → at
// least k days.
func (sb *softBuilder) spreadDays() {
	w, l, on := sb.weight(timetable.CritSpreadDays, 1)
	if !on {
		return
	}
	for s := range sb.t.Sections {
		sec := &sb.t.Sections[s]
		if !sec.SameDay || sec.MinDays <= 0 {
			continue
		}
		sb.aboutSection(s)
		var days []solver.Lit
		for _, a := range sb.meetsAtoms(s) {
			if a != 0 {
				days = append(days, solver.Pos(a))
			}
		}
		for k := 1; k <= sec.MinDays; k++ {
			switch {
			case k == 1 && len(days) > 0:
				continue // every section meets on at least one day
			case len(days) < k:
				sb.weak(timetable.CritSpreadDays, w, l) // always short
				continue
			}
			a := sb.newAtom(fmt.Sprintf("short_of_days(%s,%d)", quote(sec.ID), k), aux(s, -1))
			sb.choice([]solver.Atom{a}, solver.NoBound, solver.NoBound)
			sb.bound(days, solver.NoBound, k-1, solver.Pos(a))
			sb.bound(days, k, solver.NoBound, solver.Neg(a))
			sb.weak(timetable.CritSpreadDays, w, l, solver.Pos(a))
		}
	}
}

// studentClashes writes "student clashes": per student, per pair of their
// sections with overlapping weeks, one unit for every period both occupy.
//
// Students with the same set of sections are taken together (weight = how
// many). Their sections fall into blocks whose members can never meet at
// once (each pair shares a staff member or cohort and overlapping weeks, so
// a no-overlap constraint keeps them apart); when every pair across blocks
// has overlapping weeks, the group's clashes at p are the pairs of blocks
// both occupied at p, so one weak constraint per pair of blocks and period
// suffices: "block X busy at p and block Y busy at p". Otherwise each pair
// of sections gets its own. Equal bodies from different groups are merged
// by adding their weights.
func (sb *softBuilder) studentClashes() {
	t := sb.t
	if w, _ := t.CriterionWeight(timetable.CritStudentClash); w == 0 || len(t.Enrolments) == 0 {
		return
	}
	groups, weights := sb.enrolmentGroups()
	type body struct{ x, y solver.Lit }
	sum := map[body]int64{}
	rep := map[body]int{}
	var order []body
	add := func(x, y solver.Lit, n int64, s int) {
		if x == 0 || y == 0 {
			return
		}
		if x > y {
			x, y = y, x
		}
		k := body{x, y}
		if _, ok := sum[k]; !ok {
			order = append(order, k)
			rep[k] = s
		}
		sum[k] += n
	}
	for g, secs := range groups {
		n := weights[g]
		blocks, ok := sb.clashBlocks(secs)
		if ok {
			rows := make([][]solver.Lit, len(blocks))
			for i, bl := range blocks {
				rows[i] = sb.blockBusy(bl)
			}
			for i := range rows {
				for j := i + 1; j < len(rows); j++ {
					for p := range t.Periods {
						add(rows[i][p], rows[j][p], n, blocks[i][0])
					}
				}
			}
			continue
		}
		for i, a := range secs {
			for _, b := range secs[i+1:] {
				if sb.c.secs[a].weeks&sb.c.secs[b].weeks == 0 || sb.exclusive(a, b) {
					continue
				}
				for p := range t.Periods {
					add(sb.occupies(a, p), sb.occupies(b, p), n, a)
				}
			}
		}
	}
	for _, k := range order {
		if w, l, ok := sb.weight(timetable.CritStudentClash, sum[k]); ok {
			sb.aboutSection(rep[k])
			sb.weak(timetable.CritStudentClash, w, l, k.x, k.y)
		}
	}
}

// enrolmentGroups groups the students by their set of known sections
// (sorted, each once), in order of first appearance, with the number of
// students per group; students with fewer than two sections are left out.
func (sb *softBuilder) enrolmentGroups() ([][]int, []int64) {
	bySt := map[string][]int{}
	var students []string
	for _, e := range sb.t.Enrolments {
		s, ok := sb.secIdx[e.Section]
		if !ok {
			continue
		}
		if _, seen := bySt[e.Student]; !seen {
			students = append(students, e.Student)
		}
		if !slices.Contains(bySt[e.Student], s) {
			bySt[e.Student] = append(bySt[e.Student], s)
		}
	}
	index := map[string]int{}
	var groups [][]int
	var weights []int64
	for _, st := range students {
		secs := bySt[st]
		if len(secs) < 2 {
			continue
		}
		slices.Sort(secs)
		k := fmt.Sprint(secs)
		g, ok := index[k]
		if !ok {
			g = len(groups)
			index[k] = g
			groups = append(groups, secs)
			weights = append(weights, 0)
		}
		weights[g]++
	}
	return groups, weights
}

// exclusive reports whether sections a and b can never occupy one period:
// they share a staff member or cohort and their weeks overlap.
func (sb *softBuilder) exclusive(a, b int) bool {
	return sb.c.secs[a].weeks&sb.c.secs[b].weeks != 0 && sb.shareSomeone(a, b)
}

// clashBlocks splits secs greedily into blocks of mutually exclusive
// sections and reports whether every pair across blocks has overlapping
// weeks (so that counting busy blocks counts clashing pairs exactly).
func (sb *softBuilder) clashBlocks(secs []int) ([][]int, bool) {
	var blocks [][]int
	for _, s := range secs {
		placed := false
		for i, bl := range blocks {
			all := true
			for _, m := range bl {
				if !sb.exclusive(s, m) {
					all = false
					break
				}
			}
			if all {
				blocks[i] = append(bl, s)
				placed = true
				break
			}
		}
		if !placed {
			blocks = append(blocks, []int{s})
		}
	}
	for i := range blocks {
		for j := i + 1; j < len(blocks); j++ {
			for _, a := range blocks[i] {
				for _, b := range blocks[j] {
					if sb.c.secs[a].weeks&sb.c.secs[b].weeks == 0 {
						return nil, false
					}
				}
			}
		}
	}
	return blocks, true
}

// blockBusy returns per period "some section of the block occupies p",
// made once per distinct block: the occupancy literal for a block of one,
// else busy_block(N,P) atoms.
func (sb *softBuilder) blockBusy(block []int) []solver.Lit {
	if len(block) == 1 {
		return sb.occRow(block[0])
	}
	if sb.blocks == nil {
		sb.blocks = map[string][]solver.Lit{}
	}
	k := fmt.Sprint(block)
	if row, ok := sb.blocks[k]; ok {
		return row
	}
	n := len(sb.blocks) + 1
	row := sb.union(block, func(p int) string {
		return fmt.Sprintf("busy_block(%d,%s)", n, periodName(sb.t.Periods[p]))
	})
	sb.blocks[k] = row
	return row
}

// shareSomeone reports whether sections a and b share a staff member or a
// cohort.
func (sb *softBuilder) shareSomeone(a, b int) bool {
	x, y := &sb.t.Sections[a], &sb.t.Sections[b]
	for _, id := range x.Staff {
		if slices.Contains(y.Staff, id) {
			return true
		}
	}
	for _, id := range x.Cohorts {
		if slices.Contains(y.Cohorts, id) {
			return true
		}
	}
	return false
}
