package encode

import (
	"fmt"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Explicit rooms for grid sections. The grid's rooms are counted during
// the search (Hall bounds) and matched to meetings by Decode; that cannot
// see rooms held by pattern sections, nor the distance between rooms that
// travel times need. So a grid section that may meet in several rooms gets
// explicit room atoms grid_in(S,P,R) — its meeting starting at P is held in
// room R — one choice "exactly one room" per candidate start, when
//
//   - one of its candidate rooms is a candidate room of a pattern section,
//     or of a grid section that has explicit rooms already (closure: the
//     matching after the search must never compete for a room the search
//     assigned), or it is listed in a hard room relation (same room with a
//     pattern section, different rooms, same people), or
//   - the term has travel times and the section is one of two or more
//     room-taking sections of a staff member or cohort (or may meet twice a
//     day): travel needs its rooms.
//
// Such sections then take part, through their grid_in atoms, in the
// one-meeting-at-a-time bounds of every room (patternRoomOverlap), in
// travel (compilePatternTravel) and in the room kinds of relations; grid
// sections with one candidate room per meeting take part through their
// start atoms. With travel the room is chosen by travel class first
// (grid_at(S,P,C), gridStartRooms). Decode reads the chosen room (a
// one-room candidate set) in place of matching. Atoms: candidate starts ×
// candidate rooms (plus travel classes), for these sections only.

// gridRoomModel is what the catalog keeps of one grid section with
// explicit rooms.
type gridRoomModel struct {
	rooms map[int][]gridRoomAtom // rooms[p]: the candidate rooms of the meeting starting at p
	lits  map[int][]itemRoom     // lits[p]: the same as rooms and literals (gridItemRooms), read-only
	// places[p]: per travel class of its rooms, a representative room and
	// the class atom grid_at (nil when the rooms are in one class or the
	// term has no travel), read-only.
	places map[int][]itemRoom
}

// gridRoomAtom is one candidate room of one grid meeting.
type gridRoomAtom struct {
	r    int         // index into Term.Rooms
	atom solver.Atom // grid_in(S,P,R)
	one  int         // id of the room set {r} (rooms.sets), for Decode
}

// explicitGrid reports whether grid section s has explicit room atoms,
// deciding (and making the atoms of) every such section on first use.
func (b *builder) explicitGrid(s int) bool {
	b.makeExplicitGrid()
	_, ok := b.c.gridRooms[s]
	return ok
}

// makeExplicitGrid chooses the grid sections with explicit rooms and
// makes their atoms, once per compilation (after the start atoms).
func (b *builder) makeExplicitGrid() {
	if b.gridRoomsDone {
		return
	}
	b.gridRoomsDone = true
	t := b.t
	rm := &b.c.rooms
	multi := func(s int) bool {
		m := &b.c.secs[s]
		if b.c.IsPattern(s) || !m.takesRoom {
			return false
		}
		for _, p := range m.starts {
			if id := m.candAt(p); id >= 0 && rm.sets.sets[id].count() > 1 {
				return true
			}
		}
		return false
	}
	watched := newRoomSet(rm.n)
	for s := range t.Sections {
		for _, r := range b.c.pats[s].rooms {
			watched.add(r)
		}
	}
	explicit := map[int]bool{}
	if len(t.Travel) > 0 && b.travelIndex().Most() > 0 {
		bySt, byCo := b.peopleSections()
		for _, lists := range [][][]int{bySt, byCo} {
			for _, secs := range lists {
				n := 0
				for _, s := range secs {
					if b.c.secs[s].takesRoom || b.c.IsPattern(s) && len(b.c.pats[s].rooms) > 0 {
						n++
					}
				}
				for _, s := range secs {
					if multi(s) && (n >= 2 || t.Sections[s].SameDay) {
						explicit[s] = true
					}
				}
			}
		}
	}
	cands := func(s int) roomSet {
		m := &b.c.secs[s]
		u := newRoomSet(rm.n)
		for _, p := range m.starts {
			if id := m.candAt(p); id >= 0 {
				u = u.union(rm.sets.sets[id])
			}
		}
		return u
	}
	// Room rows that list a grid section beside a pattern section, or
	// compare rooms in a kind of pattern terms.
	for _, rel := range t.Relations {
		k := rel.Kind
		if !rel.Hard || k != timetable.SameRoom && k != timetable.DifferentRooms && k != timetable.SamePeople {
			continue // soft rows read grid rooms as blank (softRoomSecs)
		}
		var secs []int
		pat := false
		for _, id := range rel.Sections {
			if s, ok := b.secIdx[id]; ok {
				secs = append(secs, s)
				pat = pat || b.c.IsPattern(s)
			}
		}
		if k == timetable.SameRoom && !pat {
			continue // the grid's own same-room groups
		}
		for _, s := range secs {
			if multi(s) {
				explicit[s] = true
			}
		}
	}
	for s := range explicit {
		watched = watched.union(cands(s))
	}
	if watched.count() == 0 {
		return // no pattern room, no seed: the grid's rooms stay matched
	}
	for grew := true; grew; {
		grew = false
		for s := range t.Sections {
			if explicit[s] || !multi(s) {
				continue
			}
			if u := cands(s); u.intersects(watched) {
				explicit[s] = true
				watched = watched.union(u)
				grew = true
			}
		}
	}
	if len(explicit) == 0 {
		return
	}
	if b.opt.Explain {
		// The explicit grid rooms carry no selectors yet, so an
		// explanation over them could name the wrong reasons: refuse.
		for s := range t.Sections {
			if explicit[s] {
				b.errorf(t.Sections[s].Src, "explanations do not yet cover grid section %q, which shares rooms with meeting-pattern sections or travel times", t.Sections[s].ID)
				return
			}
		}
	}
	b.c.gridRooms = map[int]*gridRoomModel{}
	travel := len(t.Travel) > 0 && b.travelIndex().Most() > 0
	saveG, saveK := b.group, b.boundKind
	defer func() { b.group, b.boundKind = saveG, saveK }()
	b.in(-1, "grid room")
	for s := range t.Sections {
		if !explicit[s] {
			continue
		}
		m := &b.c.secs[s]
		gm := &gridRoomModel{rooms: map[int][]gridRoomAtom{}, lits: map[int][]itemRoom{}, places: map[int][]itemRoom{}}
		b.c.gridRooms[s] = gm
		for _, p := range m.starts {
			b.gridStartRooms(s, p, gm, travel)
		}
	}
	// A hard same-room group of the grid (rooms.sameRoom) with explicit
	// rooms: its meetings use one room. Its members share one candidate
	// set, so they are all explicit or none is.
	for g := range rm.sameRoom {
		gr := &rm.sameRoom[g]
		if !explicit[gr.sections[0]] {
			continue
		}
		b.bound(b.usedRooms(gr.sections), solver.NoBound, 1)
	}
}

// gridStartRooms makes the grid_in atoms of the meeting of section s
// starting at p: "exactly one of them" when it starts. With travel (and
// rooms in two travel classes or more) the room is chosen in two steps,
// the class first — grid_at(S,P,C), exactly one when it starts, then
// exactly one room of that class — so that travel is stated on the class
// atoms (itemPlaces) without a disjunction per class.
func (b *builder) gridStartRooms(s, p int, gm *gridRoomModel, travel bool) {
	t := b.t
	rm := &b.c.rooms
	m := &b.c.secs[s]
	sec := &t.Sections[s]
	var rooms []int
	for _, r := range rm.sets.sets[m.candAt(p)].members() {
		if !b.roomBlockedFor(r, p, m.length) {
			rooms = append(rooms, r)
		}
	}
	start := solver.Pos(m.start[p])
	if len(rooms) == 0 {
		b.rule(0, start) // every candidate room is away then
		return
	}
	byClass := map[int][]int{}
	var classes []int
	if travel {
		classOf, _ := b.travelClasses()
		for _, r := range rooms {
			c := classOf[r]
			if _, ok := byClass[c]; !ok {
				classes = append(classes, c)
			}
			byClass[c] = append(byClass[c], r)
		}
	}
	if len(classes) < 2 {
		classes, byClass = []int{-1}, map[int][]int{-1: rooms}
	}
	var atHeads []solver.Atom
	for _, c := range classes {
		cond := start
		if c >= 0 {
			_, rep := b.travelClasses()
			at := b.newAtom(fmt.Sprintf("grid_at(%s,%s,%d)", quote(sec.ID), periodName(t.Periods[p]), c),
				AtomInfo{Kind: AtomAux, Section: s, Period: p, Staff: -1, Group: -1, Room: rep[c]})
			atHeads = append(atHeads, at)
			gm.places[p] = append(gm.places[p], itemRoom{rep[c], solver.Pos(at)})
			cond = solver.Pos(at)
		}
		var heads []solver.Atom
		for _, r := range byClass[c] {
			one := newRoomSet(rm.n)
			one.add(r)
			a := b.newAtom(fmt.Sprintf("grid_in(%s,%s,%s)", quote(sec.ID), periodName(t.Periods[p]), quote(t.Rooms[r].ID)),
				AtomInfo{Kind: AtomAux, Section: s, Period: p, Staff: -1, Group: -1, Room: r})
			gm.rooms[p] = append(gm.rooms[p], gridRoomAtom{r: r, atom: a, one: rm.sets.intern(one)})
			gm.lits[p] = append(gm.lits[p], itemRoom{r, solver.Pos(a)})
			heads = append(heads, a)
		}
		b.choice(heads, 1, 1, cond)
	}
	if len(atHeads) > 0 {
		b.choice(atHeads, 1, 1, start)
	}
}

// roomBlockedFor reports whether room r is unavailable at some period of a
// grid meeting of length periods starting at p.
func (b *builder) roomBlockedFor(r, p, length int) bool {
	bl := b.c.rooms.blocked[r]
	if bl == nil {
		return false
	}
	for q := p; q < p+max(length, 1); q++ {
		if bl[q] {
			return true
		}
	}
	return false
}

// gridItemRooms lists the rooms the grid meeting of section s starting at
// p can be held in, with the literal that says so (0 when the room is
// known): explicit rooms with their grid_in atoms, or the one candidate
// room; none for a section that takes no room; false when the meeting's
// room is matched after the search (several candidates, no explicit atoms).
func (b *builder) gridItemRooms(s, p int) ([]itemRoom, bool) {
	if b.explicitGrid(s) {
		return b.c.gridRooms[s].lits[p], true
	}
	r, ok := b.gridRoomOf(s, p)
	if !ok {
		return nil, false
	}
	if r < 0 {
		return nil, true
	}
	return []itemRoom{{r, 0}}, true
}

// gridRoomLit is the literal "the grid meeting of s starting at p is held
// in room r" (0: never): its grid_in atom, or its start atom when r is its
// one candidate room.
func (b *builder) gridRoomLit(s, p, r int) solver.Lit {
	rooms, _ := b.gridItemRooms(s, p)
	for _, x := range rooms {
		if x.r == r {
			if x.lit == 0 {
				return solver.Pos(b.c.secs[s].start[p])
			}
			return x.lit
		}
	}
	return 0
}

// explicitCand is, for Decode, the one-room candidate set of the meeting of
// grid section s starting at p when the section has explicit rooms (the
// room whose grid_in atom the model holds, in marks the model's atoms);
// false otherwise.
func (c *Catalog) explicitCand(s, p int, in []bool) (int, bool) {
	gm, ok := c.gridRooms[s]
	if !ok {
		return 0, false
	}
	for _, x := range gm.rooms[p] {
		if int(x.atom) < len(in) && in[x.atom] {
			return x.one, true
		}
	}
	return 0, false
}

// modelMarks marks the atoms of model (made once per decoder; nil when the
// term has no grid section with explicit rooms).
func (d *decoder) modelMarks(model []solver.Atom) []bool {
	if d.c.gridRooms == nil {
		return nil
	}
	if d.marks == nil {
		d.marks = make([]bool, len(d.c.atoms))
		for _, a := range model {
			if int(a) < len(d.marks) {
				d.marks[a] = true
			}
		}
	}
	return d.marks
}

// explicitRooms reports whether grid section s has explicit room atoms:
// its rooms were chosen by the search against pattern meetings and travel,
// so the room improvement after the search leaves them alone.
func (c *Catalog) explicitRooms(s int) bool {
	_, ok := c.gridRooms[s]
	return ok
}
