package encode

import (
	"fmt"
	"strconv"

	"github.com/termwright/termwright/solver"
)

// itemRoom is one way an item of a relation or a person's meetings can be
// held: in room r (index into Term.Rooms) when lit holds (0: the item's
// room is known, no literal needed).
type itemRoom struct {
	r   int
	lit solver.Lit
}

// itemRooms lists the rooms an item can be held in: a pattern section's
// candidate rooms with their room atoms, a grid start's known room
// (gridRoomOf; none when unknown, which callers refuse beforehand, or when
// the section takes no room).
func (b *builder) itemRooms(it *relItem) []itemRoom {
	if it.grid {
		rooms, _ := b.gridItemRooms(it.s, it.i)
		return rooms
	}
	var out []itemRoom
	for _, r := range b.c.RoomCandidates(it.s) {
		out = append(out, itemRoom{r, solver.Pos(b.c.RoomAtom(it.s, r))})
	}
	return out
}

// sectionRoomLit is a literal "section s uses room r" (0: never): the room
// atom of a pattern section; for a grid section with known rooms the
// disjunction of its starts held in r, or the constant true when all are.
func (b *builder) sectionRoomLit(s, r int) solver.Lit {
	if b.c.IsPattern(s) {
		if a := b.c.RoomAtom(s, r); a != 0 {
			return solver.Pos(a)
		}
		return 0
	}
	items := b.gridItems(s)
	var in []int
	var bodies [][]solver.Lit
	for k := range items {
		if l := b.gridRoomLit(s, items[k].i, r); l != 0 {
			in = append(in, k)
			bodies = append(bodies, []solver.Lit{l})
		}
	}
	switch {
	case len(in) == 0:
		return 0
	case len(in) == len(items) && !b.explicitGrid(s):
		return b.relTrue()
	}
	return b.relOr(itemsKey("in_room", items, in, r), "uses_room", bodies)
}

// travelClasses puts rooms with the same travel time to every room in one
// class (rooms of one building, usually): within a class travel is 0
// (travel(r, r') = travel(r', r') for two rooms of one class), and between
// two classes it is one number, so travel is stated per pair of classes.
// It returns each room's class and a representative room per class.
func (b *builder) travelClasses() (classOf, rep []int) {
	if b.rel.classOf != nil {
		return b.rel.classOf, b.rel.classRep
	}
	n := len(b.t.Rooms)
	classOf = make([]int, n)
	at := map[string]int{}
	var key []byte
	for r := range n {
		key = key[:0]
		for q := range n {
			key = strconv.AppendInt(key, int64(b.travelMinutes(r, q)), 10)
			key = append(key, ',')
		}
		c, ok := at[string(key)]
		if !ok {
			c = len(rep)
			at[string(key)] = c
			rep = append(rep, r)
		}
		classOf[r] = c
	}
	b.rel.classOf, b.rel.classRep = classOf, rep
	return classOf, rep
}

// itemPlaces is itemRooms merged by travel class: per class the item can
// be held in, its representative room and the literal "in one of the
// class's rooms" (0 when known).
func (b *builder) itemPlaces(it *relItem) []itemRoom {
	if it.grid && b.explicitGrid(it.s) {
		if pl := b.c.gridRooms[it.s].places[it.i]; pl != nil {
			return pl // the class atoms grid_at (rooms_grid.go)
		}
	}
	rooms := b.itemRooms(it)
	if len(rooms) <= 1 {
		return rooms
	}
	classOf, rep := b.travelClasses()
	by := map[int][][]solver.Lit{}
	var order []int
	for _, x := range rooms {
		c := classOf[x.r]
		if _, ok := by[c]; !ok {
			order = append(order, c)
		}
		by[c] = append(by[c], []solver.Lit{x.lit})
	}
	if len(order) == 1 {
		// Every room of the item is in one class: exactly one of its room
		// literals holds whenever the item does, so none is needed.
		return []itemRoom{{rep[order[0]], 0}}
	}
	out := make([]itemRoom, 0, len(order))
	for _, c := range order {
		key := fmt.Sprintf("place:%d:%d:%d:%d", it.s, it.i, btoi(it.grid), c)
		out = append(out, itemRoom{rep[c], b.relOr(key, "in_place", by[c])})
	}
	return out
}

func btoi(x bool) int {
	if x {
		return 1
	}
	return 0
}

// travelPairWays appends the bodies that hold exactly when an item x of A
// and an item y of C (two sections, or one grid section's two starts when
// same) meet on a common day in a common week without overlapping, with
// less free time between them than the travel time between their rooms.
// Pairs whose gap reaches maxT never need it and are skipped.
func (b *builder) travelPairWays(ways [][]solver.Lit, A, C []relItem, same bool, maxT int) [][]solver.Lit {
	cls := make([][]itemRoom, len(C))
	for j := range C {
		cls[j] = b.itemPlaces(&C[j])
	}
	for i := range A {
		x := &A[i]
		ra := b.itemPlaces(x)
		if len(ra) == 0 {
			continue
		}
		for j := range C {
			y := &C[j]
			if same && (j <= i || x.grp == y.grp) {
				continue
			}
			gap, ok := patternGap(x.tc, y.tc)
			if !ok || gap >= maxT {
				continue
			}
			for _, p := range ra {
				for _, q := range cls[j] {
					if b.travelMinutes(p.r, q.r) <= gap {
						continue
					}
					body := []solver.Lit{x.lit, y.lit}
					if p.lit != 0 {
						body = append(body, p.lit)
					}
					if q.lit != 0 {
						body = append(body, q.lit)
					}
					ways = append(ways, body)
				}
			}
		}
	}
	return ways
}

// itemTravelWays is the travel half of "same people" for a pair of
// sections of a row with grid sections.
func (b *builder) itemTravelWays(A, C []relItem) [][]solver.Lit {
	if len(b.t.Travel) == 0 {
		return nil
	}
	most := b.travelIndex().Most()
	if most <= 0 {
		return nil
	}
	return b.travelPairWays(nil, A, C, false, most)
}

// relTravelWays is the travel half of a "same people" row: travelWays for
// pattern sections, itemTravelWays per pair when grid sections take part.
func (b *builder) relTravelWays(secs []int) [][]solver.Lit {
	if !b.hasGrid(secs) {
		return b.travelWays(secs)
	}
	var ways [][]solver.Lit
	for i, a := range secs {
		for _, c := range secs[i+1:] {
			ways = append(ways, b.itemTravelWays(b.relItems([]int{a}), b.relItems([]int{c}))...)
		}
	}
	return ways
}

// usedRooms returns, per room some of secs may use, the literal "one of
// secs holds a meeting there" (sectionRoomLit), made distinct for bounds.
func (b *builder) usedRooms(secs []int) []solver.Lit {
	var used []solver.Lit
	for r := range b.t.Rooms {
		var bodies [][]solver.Lit
		for _, s := range secs {
			if l := b.sectionRoomLit(s, r); l != 0 {
				bodies = append(bodies, []solver.Lit{l})
			}
		}
		if l := b.relOr("", "room_used", bodies); l != 0 {
			used = append(used, l)
		}
	}
	return b.distinct(used)
}

// mixedSameRoomWays: "all meetings of all listed sections use one room"
// breaks when two rooms are used (timetable.Check: the listed sections'
// meetings with a room use one room; sections that take none are left
// out).
func (b *builder) mixedSameRoomWays(secs []int) [][]solver.Lit {
	used := b.usedRooms(secs)
	var ways [][]solver.Lit
	for i := range used {
		for j := i + 1; j < len(used); j++ {
			ways = append(ways, []solver.Lit{used[i], used[j]})
		}
	}
	return ways
}
