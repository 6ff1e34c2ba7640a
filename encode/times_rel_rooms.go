package encode

import (
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// relState is the builder's working state for pattern relations and
// limits: interned auxiliary atoms, so that rows over the same sections
// share them.
type relState struct {
	or    map[string]solver.Atom  // disjunction atoms by key (relOr)
	units map[string][]solver.Lit // minute unit chains by items and step (units)
	count map[string][]solver.Lit // sequential counters by their literals (atLeast)
	n     int                     // auxiliary atoms made, for unique names
	// classOf[r], classRep[c]: travel classes of rooms (travelClasses).
	classOf, classRep []int
}

// relOr returns one literal that holds exactly when one of bodies holds:
// the literal itself for a one-literal body, else an atom named name(n)
// defined by one rule per body, interned by key ("" for no interning).
func (b *builder) relOr(key, name string, bodies [][]solver.Lit) solver.Lit {
	switch {
	case len(bodies) == 0:
		return 0
	case len(bodies) == 1 && len(bodies[0]) == 1:
		return bodies[0][0]
	}
	if b.rel.or == nil {
		b.rel.or = map[string]solver.Atom{}
	}
	if a, ok := b.rel.or[key]; ok && key != "" {
		return solver.Pos(a)
	}
	b.rel.n++
	a := b.newAtom(fmt.Sprintf("%s_%d", name, b.rel.n), aux(-1, -1))
	if key != "" {
		b.rel.or[key] = a
	}
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "pattern relation aux")
	for _, body := range bodies {
		b.rule(a, body...)
	}
	b.group, b.boundKind = saveG, saveK
	return solver.Pos(a)
}

// roomSecs keeps the sections of secs that take a room.
func (b *builder) roomSecs(secs []int) []int {
	var out []int
	for _, s := range secs {
		if len(b.c.RoomCandidates(s)) > 0 {
			out = append(out, s)
		}
	}
	return out
}

// sameRoomWays: "all meetings of all listed sections use one room" breaks
// when the first room-taking section is in room r and another is not.
// Sections that take no room have no room to share and are left out.
func (b *builder) sameRoomWays(secs []int) [][]solver.Lit {
	rs := b.roomSecs(secs)
	if len(rs) < 2 {
		return nil
	}
	var ways [][]solver.Lit
	first := rs[0]
	for _, o := range rs[1:] {
		for _, r := range b.c.RoomCandidates(first) {
			x := solver.Pos(b.c.RoomAtom(first, r))
			if y := b.c.RoomAtom(o, r); y != 0 {
				ways = append(ways, []solver.Lit{x, solver.Neg(y)})
			} else {
				ways = append(ways, []solver.Lit{x})
			}
		}
	}
	return ways
}

// roomUsers lists, per room used by two or more of secs, the literals
// "the section uses the room" (sectionRoomLit: room atoms, or for grid
// sections with known rooms their starts there).
func (b *builder) roomUsers(secs []int) [][]solver.Lit {
	var out [][]solver.Lit
	for r := range b.t.Rooms {
		var lits []solver.Lit
		for _, s := range secs {
			if l := b.sectionRoomLit(s, r); l != 0 {
				lits = append(lits, l)
			}
		}
		if len(lits) >= 2 {
			out = append(out, lits)
		}
	}
	return out
}

// hardDifferentRooms: each room is used by at most one of the sections
// (one bound per shared room).
func (b *builder) hardDifferentRooms(secs []int, sel solver.Lit) {
	for _, lits := range b.roomUsers(secs) {
		b.bound(b.distinct(lits), solver.NoBound, 1, sel)
	}
}

// differentRoomsWays: the row breaks when two of the sections are in one
// room.
func (b *builder) differentRoomsWays(secs []int) [][]solver.Lit {
	var ways [][]solver.Lit
	for _, lits := range b.roomUsers(secs) {
		for i := range lits {
			for j := i + 1; j < len(lits); j++ {
				ways = append(ways, []solver.Lit{lits[i], lits[j]})
			}
		}
	}
	return ways
}

// travelWays: the travel half of "same people". For each pair (A, B) and
// each travel time τ between a room of A and a room of B, an interned atom
// tight(A,B,τ) holds when their patterns meet on a common day in a common
// week with less than τ minutes from the end of the earlier to the start
// of the later (pattern groups as in pairWaysOf); the row breaks when
// tight(A,B,τ) holds with A and B in two rooms τ apart.
func (b *builder) travelWays(secs []int) [][]solver.Lit {
	if len(b.t.Travel) == 0 {
		return nil
	}
	var ways [][]solver.Lit
	rs := b.roomSecs(secs)
	for i, a := range rs {
		for _, c := range rs[i+1:] {
			if a == c {
				continue
			}
			type rp struct{ ra, rc int }
			byTau := map[int][]rp{}
			var taus []int
			for _, ra := range b.c.RoomCandidates(a) {
				for _, rc := range b.c.RoomCandidates(c) {
					tau := b.travelMinutes(ra, rc)
					if tau <= 0 {
						continue
					}
					if _, ok := byTau[tau]; !ok {
						taus = append(taus, tau)
					}
					byTau[tau] = append(byTau[tau], rp{ra, rc})
				}
			}
			slices.Sort(taus)
			for _, tau := range taus {
				bodies := b.pairWaysOf(nil, a, c, func(x, y *timetable.TimeChoice) bool {
					if x.Days&y.Days == 0 || !x.Weeks.Overlaps(y.Weeks) {
						return true
					}
					return max(x.Start, y.Start)-min(x.End(), y.End()) >= timetable.Clock(tau)
				})
				tight := b.relOr(fmt.Sprintf("tight:%d:%d:%d", a, c, tau), "tight", bodies)
				if tight == 0 {
					continue
				}
				for _, p := range byTau[tau] {
					ways = append(ways, []solver.Lit{tight, solver.Pos(b.c.RoomAtom(a, p.ra)), solver.Pos(b.c.RoomAtom(c, p.rc))})
				}
			}
		}
	}
	return ways
}
