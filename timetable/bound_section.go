package timetable

import (
	"math"
	"slices"
	"strings"
)

// The per-meeting criteria, as the values a bound place carries.
const (
	bvAvoidN = iota // avoid times: covered periods (grid) or days (pattern)
	bvAvoidW        // the same, each times its row's weight
	bvEarly
	bvLate
	bvOver   // students over the room's capacity (SoftCapacity only)
	bvWaste  // empty seats
	bvChoice // room choice weight
	bvTime   // time choice weight (pattern sections)
	bvCount
)

// bvCriterion names the criterion of each value; avoid times appears twice
// (units, then row-weighted units) and is added by hand.
var bvCriterion = [bvCount]string{"", "", CritEarly, CritLate, CritOverCapacity, CritWastedSeats, CritRoomChoice, CritTimeChoice}

type bvals [bvCount]int64

const bvInf = math.MaxInt64 / 4

// boundMarkedRooms is the most rooms with rows newGridPlaces judges start
// by start in a section's set that also has rooms without rows (a
// variable for the tests of the relaxed path).
var boundMarkedRooms = 16

func bvAll(v int64) bvals {
	var out bvals
	for i := range out {
		out[i] = v
	}
	return out
}

// minWith lowers each value of v to the matching one of o.
func (v *bvals) minWith(o bvals) {
	for i := range v {
		v[i] = min(v[i], o[i])
	}
}

// secBound is what the per-section pass leaves for the later bounds.
type secBound struct {
	ok        bool  // the section's legal places were found (else every bound of it is 0)
	over      int64 // its per-meeting bound on room over capacity
	wide      bool  // it may use every room: it joins the slot bound of bound_rooms.go
	fixedOver int64 // over capacity of its meetings fixed in a room
	free      int   // its meetings not fixed in a room
}

// candRoom is one room a section may use and its room-only costs.
type candRoom struct {
	room   int // index in Term.Rooms
	static bvals
	hard   []bool  // marked rooms: periods a hard row of the room blocks
	softN  []int64 // marked rooms: rows covering each period
	softW  []int64 // marked rooms: their weights
}

// normFeature is a feature as Check compares it (case and spaces ignored).
func normFeature(s string) string { return strings.ToLower(strings.TrimSpace(s)) }

// sectionWeeks is a grid section's week set, zero read as every week (as
// Check reads it).
func sectionWeeks(sec *Section) WeekSet {
	if sec.Weeks == 0 {
		return ^WeekSet(0)
	}
	return sec.Weeks
}

// peopleRows lists the Unavailable rows of a section, its staff and its
// cohorts (each named once, as Check indexes them).
func (b *bounder) peopleRows(sec *Section) []int {
	out := slices.Clone(b.rowsOf[rowKey{WhoSection, sec.ID}])
	for _, id := range occUnique(sec.Staff) {
		out = append(out, b.rowsOf[rowKey{WhoStaff, id}]...)
	}
	for _, id := range occUnique(sec.Cohorts) {
		out = append(out, b.rowsOf[rowKey{WhoCohort, id}]...)
	}
	return out
}

// sections bounds every section's own criteria.
func (b *bounder) sections() {
	for si := range b.t.Sections {
		sec := &b.t.Sections[si]
		if sec.UsesTimes() {
			b.patternSection(si, sec)
		} else {
			b.gridSection(si, sec)
		}
	}
}

// gridPlaces is the analysis of one grid section: the values of the best
// room at each legal start, and enough to judge a start with a given room.
type gridPlaces struct {
	b       *bounder
	sec     *Section
	length  int
	hard    []bool // periods blocked for the section's people
	softN   []int64
	softW   []int64
	rooms   roomSet
	legal   []bool // start period -> some legal place starts there
	touched []bool // periods some row of a marked room of the set covers
	val     []bvals
}

// spanOK reports whether a meeting starting at p fits one run of periods.
func (g *gridPlaces) spanOK(p int) bool {
	return p >= 0 && p < len(g.b.run) && g.b.run[p] >= g.length
}

// peopleOK reports whether no hard row of the section, its staff or its
// cohorts covers the meeting starting at p (which fits the grid).
func (g *gridPlaces) peopleOK(p int) bool {
	for q := p; q < p+g.length; q++ {
		if g.hard[q] {
			return false
		}
	}
	return true
}

// roomAt gives the values of room c for a meeting at p, false when a hard
// row of the room covers it.
func (g *gridPlaces) roomAt(c *candRoom, p int) (bvals, bool) {
	v := c.static
	if c.hard == nil {
		return v, true
	}
	for q := p; q < p+g.length; q++ {
		if c.hard[q] {
			return v, false
		}
		v[bvAvoidN] += c.softN[q]
		v[bvAvoidW] += c.softW[q]
	}
	return v, true
}

// newGridPlaces (reusing one set of arrays: the result lives until the
// next call) finds the legal starts of section sec and the least value
// of each criterion over the legal rooms at each: a start is legal when
// the meeting fits one run of periods, no hard row of the section, its
// staff or cohorts covers it (a row naming weeks only when they meet the
// section's), and some allowed room is free of hard rows there. The
// values add the soft rows of the people to the cheapest room's.
func (b *bounder) newGridPlaces(sec *Section) *gridPlaces {
	n := len(b.t.Periods)
	g := b.scratch
	if g == nil {
		g = &gridPlaces{b: b, hard: make([]bool, n), softN: make([]int64, n), softW: make([]int64, n),
			legal: make([]bool, n), val: make([]bvals, n), touched: make([]bool, n)}
		b.scratch = g
	}
	g.sec, g.length = sec, occLength(sec)
	clear(g.hard)
	clear(g.softN)
	clear(g.softW)
	clear(g.legal)
	weeks := sectionWeeks(sec)
	b.applyRows(b.peopleRows(sec), weeks, g.hard, g.softN, g.softW)
	g.rooms = b.roomSetOf(sec, weeks)
	// Each marked room is judged at each start, unless there are many and
	// a plain room is in the set: then every start the people allow has a
	// free room without rows, and the least room values at a start are at
	// least the least over the whole set (a relaxation: the cheapest room
	// may be blocked there), which keeps the work linear in the term.
	plainMin := g.rooms.plainMin
	marked := g.rooms.marked
	if g.rooms.plainRep >= 0 && len(marked) > boundMarkedRooms {
		plainMin, marked = g.rooms.allMin, nil
	}
	// Where no row of a marked room covers a start's periods, the room is
	// free there at its static values: those starts take quick, and only
	// the others judge the marked rooms one by one.
	quick := plainMin
	clear(g.touched)
	for k := range marked {
		v := marked[k].static
		v[bvAvoidN], v[bvAvoidW] = 0, 0
		quick.minWith(v)
		for _, q := range b.roomTouch[marked[k].room] {
			g.touched[q] = true
		}
	}
	for p := 0; p < n; p++ {
		if !g.spanOK(p) || !g.peopleOK(p) {
			continue
		}
		v := bvals{}
		if !sec.NoRoom {
			v = quick
			if slices.Contains(g.touched[p:p+g.length], true) {
				v = plainMin
				for k := range marked {
					if rv, ok := g.roomAt(&marked[k], p); ok {
						v.minWith(rv)
					}
				}
			}
			if v[bvAvoidN] >= bvInf {
				continue // no room may hold it
			}
		}
		for q := p; q < p+g.length; q++ {
			v[bvAvoidN] += g.softN[q]
			v[bvAvoidW] += g.softW[q]
		}
		if p == b.dayFirst[p] {
			v[bvEarly] = 1
		}
		if p+g.length-1 == b.dayLast[p] {
			v[bvLate] = 1
		}
		g.legal[p], g.val[p] = true, v
	}
	return g
}

// fixedAt gives the start of fixed entry f and its values (with its room
// when it names one); ok is false when no legal place matches it.
func (g *gridPlaces) fixedAt(f Fixed) (int, bvals, bool) {
	p := g.b.periodAt(f.Day, f.Start)
	if p < 0 || !g.legal[p] {
		return p, bvals{}, false
	}
	if f.Room == "" {
		return p, g.val[p], true
	}
	c, ok := g.rooms.byID(g.b, f.Room)
	if !ok {
		return p, bvals{}, false
	}
	v, ok := g.roomAt(&c, p)
	if !ok {
		return p, bvals{}, false
	}
	for q := p; q < p+g.length; q++ {
		v[bvAvoidN] += g.softN[q]
		v[bvAvoidW] += g.softW[q]
	}
	v[bvEarly], v[bvLate] = g.val[p][bvEarly], g.val[p][bvLate]
	return p, v, true
}

// gridSection bounds one grid section. Its meetings are Meetings places
// (Check: meetings 1..Meetings once each); the Fixed entries take distinct
// meetings at their places (Check matches them one to one), and each
// other meeting sits at a legal start. Per-meeting criteria then cost at
// least the fixed meetings' values plus, for the others, the least value
// over legal starts; when the meetings must fall on different days, the
// sum of the least values of as many distinct days (none of them a fixed
// meeting's day), which is the least sum over any choice of days.
func (b *bounder) gridSection(si int, sec *Section) {
	g := b.newGridPlaces(sec)
	want := max(1, sec.Meetings)
	b.movedGrid(sec, g, want)
	var sum bvals
	fixedDays := map[int]bool{}
	fixedStarts := map[int]bool{}
	var fixedRooms []string
	for _, f := range sec.Fixed {
		p, v, ok := g.fixedAt(f)
		if !ok {
			return // no legal timetable: bound 0
		}
		if !sec.SameDay && fixedDays[b.dayFirst[p]] {
			return
		}
		fixedDays[b.dayFirst[p]] = true
		fixedStarts[p] = true
		for i := range sum {
			sum[i] += v[i]
		}
		if f.Room != "" && !slices.Contains(fixedRooms, f.Room) {
			fixedRooms = append(fixedRooms, f.Room)
		}
	}
	rest := want - len(sec.Fixed)
	if rest < 0 {
		return
	}
	// The least value per day (days as their first period) over legal
	// starts, leaving out the fixed meetings' days when days must differ.
	dayMin := map[int]bvals{}
	var days []int
	for p, ok := range g.legal {
		if !ok {
			continue
		}
		d := b.dayFirst[p]
		m, seen := dayMin[d]
		if !seen {
			m = bvAll(bvInf)
			days = append(days, d)
		}
		m.minWith(g.val[p])
		dayMin[d] = m
	}
	if rest > 0 {
		if sec.SameDay {
			if len(days) == 0 {
				return
			}
			least := bvAll(bvInf)
			for _, d := range days {
				least.minWith(dayMin[d])
			}
			for i := range sum {
				sum[i] += int64(rest) * least[i]
			}
		} else {
			var free []int
			for _, d := range days {
				if !fixedDays[d] {
					free = append(free, d)
				}
			}
			if len(free) < rest {
				return
			}
			col := make([]int64, len(free))
			for i := range sum {
				for k, d := range free {
					col[k] = dayMin[d][i]
				}
				slices.Sort(col)
				for _, v := range col[:rest] {
					sum[i] += v
				}
			}
		}
	}
	b.addValues(si, sum)
	b.sec[si].ok = true
	fixedOver := int64(0)
	for _, f := range sec.Fixed {
		if f.Room != "" {
			_, v, _ := g.fixedAt(f)
			fixedOver += v[bvOver]
		}
	}
	b.sec[si].fixedOver = fixedOver
	b.sec[si].free = want - b.fixedInRoom(sec)
	b.sec[si].wide = !sec.NoRoom && g.rooms.count == len(b.rooms)

	// Spread days: the meetings use at most the fixed meetings' days plus
	// one new day per other meeting, and new days only among the days with
	// a legal start.
	if sec.SameDay && sec.MinDays > 0 {
		newDays := 0
		for _, d := range days {
			if !fixedDays[d] {
				newDays++
			}
		}
		most := len(fixedDays) + min(rest, newDays)
		if short := int64(sec.MinDays - most); short > 0 {
			b.add(CritSpreadDays, short, short)
		}
	}
	b.stability(sec, g, want, fixedRooms, fixedDays, fixedStarts)
}

// fixedInRoom counts the Fixed entries of sec that name a room.
func (b *bounder) fixedInRoom(sec *Section) int {
	n := 0
	for _, f := range sec.Fixed {
		if f.Room != "" {
			n++
		}
	}
	return n
}

// addValues adds a section's per-meeting bounds; over capacity waits for
// overCapacity, which may raise it.
func (b *bounder) addValues(si int, v bvals) {
	b.add(CritAvoidTimes, v[bvAvoidN], v[bvAvoidW])
	for i := bvEarly; i < bvCount; i++ {
		if i == bvOver {
			b.sec[si].over = v[i]
			continue
		}
		b.add(bvCriterion[i], v[i], v[i])
	}
}

// stability bounds room stability (distinct rooms minus 1) of a grid
// section: the rooms named by its Fixed entries are all used; and when
// no single allowed room can hold every meeting (at the fixed places, and
// enough other legal starts, on other days when days must differ, where
// the room has no hard row), it uses at least two.
func (b *bounder) stability(sec *Section, g *gridPlaces, want int, fixedRooms []string, fixedDays, fixedStarts map[int]bool) {
	if sec.NoRoom || want < 2 {
		return
	}
	if len(fixedRooms) >= 2 {
		n := int64(len(fixedRooms) - 1)
		b.add(CritRoomStability, n, n)
		return
	}
	rest := want - len(sec.Fixed)
	holds := func(c *candRoom) bool {
		if len(fixedRooms) == 1 && b.t.Rooms[c.room].ID != fixedRooms[0] {
			return false
		}
		for _, f := range sec.Fixed {
			p := b.periodAt(f.Day, f.Start)
			if _, ok := g.roomAt(c, p); !ok {
				return false
			}
		}
		seen := map[int]bool{}
		n := 0
		for p, ok := range g.legal {
			if !ok || fixedStarts[p] {
				continue
			}
			if _, free := g.roomAt(c, p); !free {
				continue
			}
			key := p
			if !sec.SameDay {
				key = b.dayFirst[p]
				if fixedDays[key] {
					continue
				}
			}
			if !seen[key] {
				seen[key] = true
				n++
			}
		}
		return n >= rest
	}
	// Rooms without rows are alike, and free at every start a marked
	// room is free at: when there is one, the representative plain room
	// holds every meeting if any room does.
	try := g.rooms.marked
	if g.rooms.plainRep >= 0 {
		try = []candRoom{g.rooms.plainRoom()}
	}
	if len(fixedRooms) == 1 {
		c, ok := g.rooms.byID(b, fixedRooms[0])
		if !ok {
			return
		}
		try = []candRoom{c}
	}
	for k := range try {
		if holds(&try[k]) {
			return
		}
	}
	b.add(CritRoomStability, 1, 1)
}

// patternSection bounds one pattern section: its one placement takes a
// meeting time that matches every Fixed entry (a day of it at the entry's
// start), that no hard row of the section, its staff or cohorts covers (by
// minute, on a common week when the row names weeks), in an allowed room
// (the Fixed entries' room when they name one) that no hard row covers.
// Each per-placement criterion costs at least its least value over such
// (time, room) pairs.
func (b *bounder) patternSection(si int, sec *Section) {
	rows := b.peopleRows(sec)
	rooms := b.roomSetOf(sec, 0)
	var fixedRoom string
	for _, f := range sec.Fixed {
		if f.Room != "" {
			if fixedRoom != "" && fixedRoom != f.Room {
				b.movedPattern(sec, nil, nil)
				return
			}
			fixedRoom = f.Room
		}
	}
	// roomFor gives the least room values for meeting time c over the
	// allowed rooms free of hard rows at it (the fixed room alone when one
	// is named), bvInf when none is.
	roomFor := func(c TimeChoice) bvals {
		if sec.NoRoom {
			return bvals{}
		}
		if fixedRoom != "" {
			cr, ok := rooms.byID(b, fixedRoom)
			if !ok {
				return bvAll(bvInf)
			}
			return b.patternRoom(cr, c)
		}
		v := rooms.plainMin
		for _, cr := range rooms.marked {
			v.minWith(b.patternRoom(cr, c))
		}
		return v
	}
	legal := make([]bool, len(sec.Times))
	best := bvAll(bvInf)
	mostDays := -1
	for ci, c := range sec.Times {
		pv, ok := b.patternRows(rows, c)
		if !ok {
			continue
		}
		v := roomFor(c)
		if v[bvAvoidN] >= bvInf {
			continue
		}
		legal[ci] = true
		matches := true
		for _, f := range sec.Fixed {
			if !c.Days.Has(f.Day) || c.Start != f.Start {
				matches = false
			}
		}
		if !matches {
			continue
		}
		v[bvAvoidN] += pv[bvAvoidN]
		v[bvAvoidW] += pv[bvAvoidW]
		v[bvTime] = int64(c.Weight)
		best.minWith(v)
		mostDays = max(mostDays, c.Days.Count())
	}
	b.movedPattern(sec, legal, func(ci int, room string) bool {
		if sec.NoRoom {
			return room == ""
		}
		cr, ok := rooms.byID(b, room)
		return ok && b.patternRoom(cr, sec.Times[ci])[bvAvoidN] < bvInf
	})
	if mostDays < 0 {
		return // no legal placement: bound 0
	}
	b.addValues(si, best)
	b.sec[si].ok = true
	// Spread days: the one placement meets on the days of its meeting
	// time, so at most on the most days of a matching legal time.
	if sec.SameDay && sec.MinDays > 0 {
		if short := int64(sec.MinDays - mostDays); short > 0 {
			b.add(CritSpreadDays, short, short)
		}
	}
}

// patternRoom gives the values of room cr for meeting time c: its static
// values and its soft rows hit, bvInf when a hard row of it hits c.
func (b *bounder) patternRoom(cr candRoom, c TimeChoice) bvals {
	if !b.roomMarked[cr.room] {
		return cr.static
	}
	rv, free := b.patternRows(b.rowsOf[rowKey{WhoRoom, b.t.Rooms[cr.room].ID}], c)
	if !free {
		return bvAll(bvInf)
	}
	rv[bvOver], rv[bvWaste], rv[bvChoice] = cr.static[bvOver], cr.static[bvWaste], cr.static[bvChoice]
	return rv
}

// patternRows judges meeting time c against Unavailable rows: the number
// of (row, day) hits of the soft rows and their weights, and false when a
// hard row hits a day of it (both as Check and Cost read rows: a common
// minute on the day, and a common week when the row names weeks).
func (b *bounder) patternRows(rows []int, c TimeChoice) (bvals, bool) {
	var v bvals
	for _, i := range rows {
		u := &b.t.Unavailable[i]
		if u.Weeks != 0 && !c.Weeks.Overlaps(u.Weeks) {
			continue
		}
		if !c.Days.Has(u.Day) || !(c.Start < u.To && u.From < c.End()) {
			continue
		}
		if u.Hard {
			return v, false
		}
		v[bvAvoidN]++
		v[bvAvoidW] += int64(u.Weight)
	}
	return v, true
}
