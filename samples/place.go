package samples

import (
	"math"
	"slices"

	"github.com/termwright/termwright/timetable"
)

// The witness: a timetable built greedily, hardest sections first, that
// every later restriction is derived from.

type weekSet = timetable.WeekSet

// placeAll places every section in the witness. Some courses are chosen to
// have two parallel laboratory or tutorial groups at the same time, and some
// a tutorial straight after the plenary; those become relations when the
// witness manages them.
func (g *gen) placeAll() {
	g.occStaff = g.newOcc(len(g.staff))
	g.occCohort = g.newOcc(len(g.cohorts))
	g.occRoom = g.newOcc(len(g.rooms))
	g.choosePairs()
	followers := make([][]int, len(g.secs))
	var order []int
	for i, s := range g.secs {
		switch {
		case s.partner >= 0:
			followers[s.partner] = append(followers[s.partner], i)
		case s.follows >= 0:
			followers[s.follows] = append(followers[s.follows], i)
		default:
			order = append(order, i)
		}
	}
	g.rng.Shuffle(len(order), func(i, j int) { order[i], order[j] = order[j], order[i] })
	slices.SortStableFunc(order, func(a, b int) int { return g.difficulty(b) - g.difficulty(a) })
	for _, i := range order {
		g.placeSection(i)
		for _, f := range followers[i] {
			g.placeSection(f)
		}
	}
}

func (g *gen) newOcc(n int) [][]weekSet {
	flat := make([]weekSet, n*len(g.periods))
	out := make([][]weekSet, n)
	for i := range out {
		out[i] = flat[i*len(g.periods) : (i+1)*len(g.periods) : (i+1)*len(g.periods)]
	}
	return out
}

// difficulty orders placement: laboratories and rare needs first, then big
// and long sections, then sections with many people involved.
func (g *gen) difficulty(i int) int {
	s := &g.secs[i]
	d := s.load()*10 + s.size/10 + 5*(len(s.cohorts)+len(s.staff))
	if slices.Contains(s.needs, "lab") {
		d += 100
	}
	if slices.Contains(s.needs, "step-free") {
		d += 50
	}
	return d
}

// choosePairs marks about one course in 75 to hold two of its groups at the
// same time, and about as many to hold a tutorial right after the plenary.
func (g *gen) choosePairs() {
	want := max(1, int(math.Round(float64(len(g.secs))/75)))
	same, b2b := 0, 0
	for _, ci := range g.shuffled(len(g.courses)) {
		c := g.courses[ci]
		if len(c.groups) >= 2 && same < want {
			a, b := &g.secs[c.groups[0]], &g.secs[c.groups[1]]
			if a.meetings == b.meetings && a.length == b.length && !sharesAny(a.staff, b.staff) {
				b.partner = c.groups[0]
				same++
				continue
			}
		}
		if c.plenary >= 0 && len(c.groups) >= 1 && b2b < want {
			t := &g.secs[c.groups[len(c.groups)-1]]
			if t.kind == kindTutorial && t.partner < 0 && g.secs[c.plenary].kind == kindPlenary {
				t.follows = c.plenary
				b2b++
			}
		}
	}
}

func sharesAny(a, b []int) bool {
	for _, x := range a {
		if containsInt(b, x) {
			return true
		}
	}
	return false
}

// placeSection puts section i into the witness, repairing it when needed:
// first by adding a room when only rooms were short, then by simplifying the
// section step by step. The last step (one meeting of one period, its lead
// teacher only) always fits, because no one's load reaches the grid size.
func (g *gen) placeSection(i int) {
	s := &g.secs[i]
	relaxations := []func(){
		func() { // drop the pairing
			if s.partner >= 0 || s.follows >= 0 {
				g.stats.unpaired++
			}
			s.partner, s.follows = -1, -1
		},
		func() { s.sameDay, s.minDays = true, max(s.minDays, s.meetings) },
		func() { s.length = 1 },
		func() { s.meetings, s.sameDay, s.minDays = 1, false, 0 },
		func() { g.dropPeople(i, false) },
		func() { g.dropPeople(i, true) },
	}
	for step := 0; ; step++ {
		if g.tryPlace(i, true) {
			return
		}
		if !s.noRoom && g.tryPlace(i, false) {
			g.addRoomFor(s)
			if g.tryPlace(i, true) {
				return
			}
		}
		if step == len(relaxations) {
			panic("samples: witness could not place section " + s.id) // unreachable: see above
		}
		if step >= 1 {
			g.stats.relaxed++
		}
		relaxations[step]()
	}
}

// dropPeople takes the extra cohorts and staff off section i (all cohorts
// when all is set), keeping sizes and loads in step.
func (g *gen) dropPeople(i int, all bool) {
	s := &g.secs[i]
	keep := 1
	if all {
		keep = 0
	}
	for len(s.cohorts) > keep {
		c := s.cohorts[len(s.cohorts)-1]
		s.cohorts = s.cohorts[:len(s.cohorts)-1]
		co := &g.cohorts[c]
		co.secs = slices.DeleteFunc(co.secs, func(x int) bool { return x == i })
		co.load -= s.load()
		s.size -= co.size
	}
	s.size = max(s.size, 1)
	for len(s.staff) > 1 {
		p := s.staff[len(s.staff)-1]
		s.staff = s.staff[:len(s.staff)-1]
		st := &g.staff[p]
		st.secs = slices.DeleteFunc(st.secs, func(x int) bool { return x == i })
		st.load -= s.load()
	}
}

// tryPlace looks for start periods (and, when withRooms, rooms) for every
// meeting of section i and commits them to the witness when all are found.
// Without rooms it only reports whether people and days allow a placement.
func (g *gen) tryPlace(i int, withRooms bool) bool {
	s := &g.secs[i]
	cands := g.startCandidates(s)
	roomCands := g.fittingRooms(s)
	var starts, rooms []int
	var usedDays uint8
	for _, p := range cands {
		if len(starts) == s.meetings {
			break
		}
		span, ok := g.span(p, s.length)
		if !ok {
			continue
		}
		day := uint8(1) << uint(g.periods[p].Day)
		if !s.sameDay && usedDays&day != 0 || g.overlapsOwn(starts, s.length, span) || !g.peopleFree(s, span) {
			continue
		}
		r := -1
		if withRooms && !s.noRoom {
			if r = g.freeRoom(s, roomCands, rooms, span); r < 0 {
				continue
			}
		}
		starts = append(starts, p)
		rooms = append(rooms, r)
		usedDays |= day
	}
	if len(starts) < s.meetings {
		return false
	}
	if !withRooms && !s.noRoom {
		return true
	}
	order := make([]int, len(starts))
	for k := range order {
		order[k] = k
	}
	slices.SortFunc(order, func(a, b int) int { return starts[a] - starts[b] })
	s.starts, s.rooms = s.starts[:0], s.rooms[:0]
	for _, k := range order {
		s.starts = append(s.starts, starts[k])
		s.rooms = append(s.rooms, rooms[k])
		g.occupy(s, starts[k], rooms[k])
	}
	return true
}

// startCandidates lists the start periods to try, in order: the partner's
// starts for a same-time pair, the periods right after the predecessor's
// meetings for a back-to-back pair, otherwise every period in random order.
func (g *gen) startCandidates(s *sec) []int {
	switch {
	case s.partner >= 0:
		return slices.Clone(g.secs[s.partner].starts)
	case s.follows >= 0:
		pre := &g.secs[s.follows]
		var out []int
		for _, st := range pre.starts {
			last := st + pre.length - 1
			if last+1 < len(g.periods) && g.consecutive(last, last+1) {
				out = append(out, last+1)
			}
		}
		return out
	}
	return g.shuffled(len(g.periods))
}

func (g *gen) consecutive(a, b int) bool {
	pa, pb := g.periods[a], g.periods[b]
	return pa.Day == pb.Day && pa.End == pb.Start
}

// overlapsOwn reports whether span meets a meeting already chosen.
func (g *gen) overlapsOwn(starts []int, length int, span []int) bool {
	for _, st := range starts {
		if span[0] < st+length && st <= span[len(span)-1] {
			return true
		}
	}
	return false
}

// peopleFree reports whether the staff and cohorts of s are free in its
// weeks over span.
func (g *gen) peopleFree(s *sec, span []int) bool {
	for _, p := range span {
		for _, st := range s.staff {
			if g.occStaff[st][p]&s.weeks != 0 {
				return false
			}
		}
		for _, c := range s.cohorts {
			if g.occCohort[c][p]&s.weeks != 0 {
				return false
			}
		}
	}
	return true
}

// freeRoom returns a room for s free over span: one already used by this
// section when possible, else the first free candidate; -1 when none is.
func (g *gen) freeRoom(s *sec, cands, used []int, span []int) int {
	free := func(r int) bool {
		for _, p := range span {
			if g.occRoom[r][p]&s.weeks != 0 {
				return false
			}
		}
		return true
	}
	for _, r := range used {
		if free(r) {
			return r
		}
	}
	for _, r := range cands {
		if free(r) {
			return r
		}
	}
	return -1
}

// occupy marks one meeting of s in the witness occupancy.
func (g *gen) occupy(s *sec, start, r int) {
	for p := start; p < start+s.length; p++ {
		for _, st := range s.staff {
			g.occStaff[st][p] |= s.weeks
		}
		for _, c := range s.cohorts {
			g.occCohort[c][p] |= s.weeks
		}
		if r >= 0 {
			g.occRoom[r][p] |= s.weeks
		}
	}
}
