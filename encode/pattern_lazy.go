package encode

import (
	"sort"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Lazy rooms. On terms where the rooms' clique bounds would need more
// than lazyRoomBudget room_time atoms per section, the rooms whose bounds
// cost most get none. Decode then checks them: when two pattern sections
// meet in such a room at overlapping times, it returns a
// *RoomConflictError whose nogoods forbid each of the two sections, at its
// chosen pattern in that room, the other in that room at any pattern that
// overlaps it (integrity constraints over time and room atoms: the live
// engine takes them as clauses, no rebuild), and the search goes on. A
// forbidden clash cannot come back.

// lazyRoom marks room r as checked lazily.
func (c *Catalog) lazyRoom(r int) {
	if c.lazy == nil {
		c.lazy = make([]bool, len(c.term.Rooms))
	}
	c.lazy[r] = true
}

// isLazyRoom reports whether room r is checked lazily.
func (c *Catalog) isLazyRoom(r int) bool { return c.lazy != nil && c.lazy[r] }

// LazyRooms is the number of rooms checked lazily.
func (c *Catalog) LazyRooms() int {
	n := 0
	for _, l := range c.lazy {
		if l {
			n++
		}
	}
	return n
}

// lazyRoomClashes finds the clashes of pattern placements in lazy rooms
// and returns them as a *RoomConflictError, or nil.
func (d *decoder) lazyRoomClashes() error {
	c := d.c
	if c.lazy == nil || len(d.pats) == 0 {
		return nil
	}
	t := d.t
	secIdx := t.SectionIndex()
	roomIdx := t.RoomIndex()
	type placed struct {
		s, i int
		tc   *timetable.TimeChoice
	}
	byRoom := map[int][]placed{}
	for _, pl := range d.pats {
		if pl.Room == "" {
			continue
		}
		r := roomIdx[pl.Room]
		if !c.lazy[r] {
			continue
		}
		s := secIdx[pl.Section]
		byRoom[r] = append(byRoom[r], placed{s, pl.Time - 1, &t.Sections[s].Times[pl.Time-1]})
	}
	rooms := make([]int, 0, len(byRoom))
	for r := range byRoom {
		rooms = append(rooms, r)
	}
	sort.Ints(rooms)
	rerr := &RoomConflictError{}
	seen := map[string]bool{}
	for _, r := range rooms {
		ps := byRoom[r]
		for x := 0; x < len(ps); x++ {
			for y := x + 1; y < len(ps); y++ {
				if !patternsOverlap(ps[x].tc, ps[y].tc) {
					continue
				}
				rerr.Sections = append(rerr.Sections, t.Sections[ps[x].s].ID, t.Sections[ps[y].s].ID)
				rerr.nogoods = append(rerr.nogoods, c.roomPairNogoods(ps[x].s, ps[x].i, ps[y].s, r)...)
				rerr.nogoods = append(rerr.nogoods, c.roomPairNogoods(ps[y].s, ps[y].i, ps[x].s, r)...)
			}
		}
	}
	if len(rerr.nogoods) == 0 {
		return nil
	}
	sort.Strings(rerr.Sections)
	out := rerr.Sections[:0]
	for _, id := range rerr.Sections {
		if !seen[id] {
			seen[id] = true
			out = append(out, id)
		}
	}
	rerr.Sections = out
	return rerr
}

// roomPairNogoods forbids section s1 at its pattern i in room r together
// with section s2 in room r at any of its candidate patterns that overlap
// pattern i: one nogood per such pattern (linear in s2's patterns; all
// pairs of patterns would be quadratic, and cost millions of clauses on
// the largest public instances).
func (c *Catalog) roomPairNogoods(s1, i, s2, r int) [][]solver.Lit {
	t := c.term
	a1, a2 := c.RoomAtom(s1, r), c.RoomAtom(s2, r)
	var out [][]solver.Lit
	for _, j := range c.pats[s2].times {
		if patternsOverlap(&t.Sections[s1].Times[i], &t.Sections[s2].Times[j]) {
			out = append(out, []solver.Lit{solver.Neg(c.pats[s1].time[i]), solver.Neg(a1),
				solver.Neg(c.pats[s2].time[j]), solver.Neg(a2)})
		}
	}
	return out
}

// patternsOverlap reports whether meetings of two patterns share a minute
// of a common day in a common teaching week.
func patternsOverlap(a, b *timetable.TimeChoice) bool {
	return a.Days&b.Days != 0 && a.Weeks.Overlaps(b.Weeks) && a.Start < b.End() && b.Start < a.End()
}
