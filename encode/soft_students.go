package encode

import (
	"slices"
	"strconv"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Student clashes of pattern sections ("student clashes", criteria.go):
// one unit per student for a pair of their sections, one of them a
// pattern section, when some meetings of the two share a minute of a common
// day in a common week, or meet on a common day in a common week with less
// free time between them than the travel time between their rooms.
//
// The pairs come from the enrolments (students counted once per section,
// all of a pair's students together: weight k for k shared students).
// Each pair gets one weak constraint of weight k on an atom clash(A,B)
// (on the clash's only way when there is one), defined by one rule per way
// the two can clash, written without a rule per pair of clashing meeting
// times:
//
//   - two pattern sections a and b: the candidate times of a are grouped
//     by the set J of b's times they overlap; each group I gives the rule
//     "a meets at one of I and b at one of J" (any_time atoms, interned and
//     shared by every pair and every other part). Times of a that leave b's
//     times a gap g shorter than the longest travel time add, grouped the
//     same way per gap, "a at one of I, b at one of J, and their rooms more
//     than g minutes apart" (an atom far(A,B,g) defined by a's rooms and the
//     sets of b's rooms too far from each, any_room atoms interned);
//   - a grid section a and a pattern section b: b's candidate times are
//     grouped by the set P of a's start periods whose meeting overlaps them;
//     each group gives "b at one of J and a starts at one of P". Grid rooms
//     are assigned after the search, so travel plays no part here (the
//     engine's part of the cost counts grid meetings without rooms).
//
// Pairs that share a staff member or cohort are left out when both use
// patterns: the hard no-overlap and travel rules keep them from clashing.
// The program grows with the pairs times the distinct clash sets per
// section, not with the pairs of meeting times; the objective has one
// literal per pair.

// studentPair is a pair of section indexes, lower first, with the number
// of students enrolled in both.
type studentPair struct {
	a, b int
	n    int64
}

// studentPairs counts, per pair of distinct known sections at least one of
// which is a pattern section, the students enrolled in both (each student
// counted once per section), in order of first appearance.
func (sb *softBuilder) studentPairs() []studentPair {
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
	index := map[[2]int]int{}
	var out []studentPair
	for _, st := range students {
		secs := bySt[st]
		for x, a := range secs {
			for _, b := range secs[x+1:] {
				if !sb.c.pats[a].on && !sb.c.pats[b].on {
					continue
				}
				lo, hi := min(a, b), max(a, b)
				k := [2]int{lo, hi}
				i, ok := index[k]
				if !ok {
					i = len(out)
					index[k] = i
					out = append(out, studentPair{a: lo, b: hi})
				}
				out[i].n++
			}
		}
	}
	return out
}

// patternStudentClashes writes the student clashes of pairs with a
// pattern section (see above).
func (sb *softBuilder) patternStudentClashes() {
	if !sb.pat.any {
		return
	}
	if w, _ := sb.t.CriterionWeight(timetable.CritStudentClash); w == 0 || len(sb.t.Enrolments) == 0 {
		return
	}
	sc := &studentClasher{sb: sb, anyRoom: map[string]solver.Lit{}, orStarts: map[string]solver.Lit{}}
	if len(sb.t.Travel) > 0 {
		sc.maxTravel = sb.travelIndex().Most()
	}
	for _, pr := range sb.studentPairs() {
		w, l, ok := sb.weight(timetable.CritStudentClash, pr.n)
		if !ok {
			continue
		}
		pa, pb := sb.c.pats[pr.a].on, sb.c.pats[pr.b].on
		sc.bodies = sc.bodies[:0]
		switch {
		case pa && pb:
			if sb.shareSomeone(pr.a, pr.b) {
				continue
			}
			// The section with fewer candidate times is grouped.
			a, b := pr.a, pr.b
			if len(sb.c.pats[b].times) < len(sb.c.pats[a].times) {
				a, b = b, a
			}
			sc.patternPair(a, b)
		case pa:
			sc.gridPair(pr.b, pr.a)
		default:
			sc.gridPair(pr.a, pr.b)
		}
		sc.finish(pr, w, l)
	}
}

// body notes one way the pair being written can clash.
func (sc *studentClasher) body(lits ...solver.Lit) {
	sc.bodies = append(sc.bodies, append([]solver.Lit(nil), lits...))
}

// finish writes the pair's one weak constraint: on its only body, or on an
// atom clash(A,B) that each body implies (so the pair costs its weight
// once however many of its meetings clash).
func (sc *studentClasher) finish(pr studentPair, w int64, l int) {
	sb := sc.sb
	switch len(sc.bodies) {
	case 0:
		return
	case 1:
		sb.weak(timetable.CritStudentClash, w, l, sc.bodies[0]...)
		return
	}
	a := sb.newAtom("clash("+quote(sb.t.Sections[pr.a].ID)+","+quote(sb.t.Sections[pr.b].ID)+")", aux(pr.a, -1))
	for _, body := range sc.bodies {
		sb.rule(a, body...)
	}
	sb.weak(timetable.CritStudentClash, w, l, solver.Pos(a))
}

// studentClasher holds the interned atoms of the pattern student clashes.
type studentClasher struct {
	sb        *softBuilder
	maxTravel int                   // longest travel time of the term; 0 without travel rows
	anyRoom   map[string]solver.Lit // "s:k,k" -> any_room atom (positions in patModel.rooms)
	orStarts  map[string]solver.Lit // "s:p,p" -> or of start atoms
	nAny      int
	bodies    [][]solver.Lit // the ways the pair being written can clash
	table     []int32        // travel minutes between rooms x and y at x*len(Rooms)+y; nil until needed
}

// patternPair writes the clashes of pattern sections a and b.
func (sc *studentClasher) patternPair(a, b int) {
	sb := sc.sb
	t := sb.t
	pa, pb := &sb.c.pats[a], &sb.c.pats[b]
	sb.aboutSection(a)
	// groups: a's times by the set of b's times they overlap; travel[g]:
	// a's times by the set of b's times that leave them a gap of g minutes.
	var groups clashGroups
	travel := map[int]*clashGroups{}
	var gapOrder []int
	var js []int
	for _, i := range pa.times {
		ci := &t.Sections[a].Times[i]
		js = js[:0]
		var near map[int][]int
		for _, j := range pb.times {
			cj := &t.Sections[b].Times[j]
			if patternsOverlap(ci, cj) {
				js = append(js, j)
				continue
			}
			if sc.maxTravel == 0 || len(pa.rooms) == 0 || len(pb.rooms) == 0 {
				continue
			}
			if g, ok := patternGap(ci, cj); ok && g < sc.maxTravel {
				if near == nil {
					near = map[int][]int{}
				}
				near[g] = append(near[g], j)
			}
		}
		groups.add(i, js)
		for g, set := range near {
			cg := travel[g]
			if cg == nil {
				cg = &clashGroups{}
				travel[g] = cg
				gapOrder = append(gapOrder, g)
			}
			cg.add(i, set)
		}
	}
	for k, set := range groups.sets {
		sc.body(sb.anyTime(a, groups.members[k]), sb.anyTime(b, set))
	}
	slices.Sort(gapOrder)
	for _, g := range gapOrder {
		far := sc.far(a, b, g)
		if far == 0 {
			continue
		}
		cg := travel[g]
		for k, set := range cg.sets {
			sc.body(sb.anyTime(a, cg.members[k]), sb.anyTime(b, set), far)
		}
	}
}

// far returns an atom "the rooms of a and b are more than g minutes
// apart", 0 when no pair of their candidate rooms is.
func (sc *studentClasher) far(a, b, g int) solver.Lit {
	sb := sc.sb
	pa, pb := &sb.c.pats[a], &sb.c.pats[b]
	var byRoom clashGroups
	var ks []int
	for k1, r1 := range pa.rooms {
		ks = ks[:0]
		for k2, r2 := range pb.rooms {
			if sc.travel(r1, r2) > g {
				ks = append(ks, k2)
			}
		}
		byRoom.add(k1, ks)
	}
	if len(byRoom.sets) == 0 {
		return 0
	}
	sc.nAny++
	f := sb.newAtom("far("+quote(sb.t.Sections[a].ID)+","+quote(sb.t.Sections[b].ID)+","+strconv.Itoa(g)+")", aux(a, -1))
	for k, set := range byRoom.sets {
		sb.rule(f, sc.room(a, byRoom.members[k]), sc.room(b, set))
	}
	return solver.Pos(f)
}

// gridPair writes the clashes of grid section g and pattern section p.
func (sc *studentClasher) gridPair(g, p int) {
	sb := sc.sb
	t := sb.t
	gm, pm := &sb.c.secs[g], &sb.c.pats[p]
	if gm.meetings == 0 || len(gm.starts) == 0 {
		return
	}
	sec := &t.Sections[g]
	occ := make([]timetable.Occurrence, len(gm.starts))
	okAt := make([]bool, len(gm.starts))
	for k, st := range gm.starts {
		if o := t.SectionOccurrences(sec, timetable.Placement{Section: sec.ID, Meeting: 1, Period: st}); len(o) == 1 {
			occ[k], okAt[k] = o[0], true
		}
	}
	sb.aboutSection(p)
	var groups clashGroups
	var ks []int
	for _, j := range pm.times {
		ks = ks[:0]
		for _, m := range patternOccurrences(&t.Sections[p].Times[j]) {
			for k := range gm.starts {
				if okAt[k] && m.Overlaps(occ[k]) && !slices.Contains(ks, k) {
					ks = append(ks, k)
				}
			}
		}
		slices.Sort(ks)
		groups.add(j, ks)
	}
	for k, set := range groups.sets {
		sc.body(sb.anyTime(p, groups.members[k]), sc.starts(g, set))
	}
}
