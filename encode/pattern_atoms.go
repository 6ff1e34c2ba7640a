package encode

import (
	"fmt"
	"strconv"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Pattern sections (Section.Times) are decided by two atom layers, made by
// the "pattern choices" part right after the grid's room sets:
//
//   - time(S,I): section S meets at its I-th acceptable meeting pattern
//     (1-based, as Placement.Time), one atom per candidate pattern and one
//     choice rule "exactly one" per section;
//   - in(S,R): section S meets in room R, one atom per candidate room and
//     one choice rule "exactly one" per section that takes a room.
//
// A section's time and room are chosen once for all its meetings. Other
// parts find the atoms through the catalog: Catalog.TimeAtom(s, i) and
// Catalog.RoomAtom(s, r) (0 when pruned: treat as false),
// Catalog.TimeCandidates(s) and Catalog.RoomCandidates(s), and
// Catalog.Pattern(s) for the section's occurrences per candidate. Inside
// the builder b.anyTime(s, idx) gives one literal "S meets at one of these
// patterns" (interned: the same set gives the same atom), the building
// block of every bound over pattern sections.
//
// Grid parts see a pattern section as one with no meetings, no start atoms
// and no room (secModel.meetings 0, takesRoom false), so they add nothing
// for it.

// patModel is what the catalog keeps of one pattern section.
type patModel struct {
	on    bool          // the section chooses among meeting patterns
	time  []solver.Atom // time[i]: atom time(S,i+1), 0 when pattern i is not a candidate
	times []int         // candidate pattern indexes (0-based), ascending
	rooms []int         // candidate room indexes into Term.Rooms, ascending
	roomW []int         // roomW[k]: preference penalty of rooms[k]
	room  []solver.Atom // room[k]: atom in(S,rooms[k])
	// roomAt[r]: position of room r in rooms, -1 when not a candidate;
	// nil for sections that take no room.
	roomAt []int
}

// Atom kinds of pattern sections.
const (
	AtomTime AtomKind = iota + 100 // time(S,I): section S meets at its I-th pattern
	AtomRoom                       // in(S,R): section S meets in room R
)

// isDecision reports whether atoms of kind k are decisions of a section:
// grid starts, pattern times and pattern rooms.
func isDecision(k AtomKind) bool { return k == AtomStart || k == AtomTime || k == AtomRoom }

// IsPattern reports whether section index s chooses among meeting patterns.
func (c *Catalog) IsPattern(s int) bool { return s >= 0 && s < len(c.pats) && c.pats[s].on }

// hasPatterns reports whether the term has pattern sections.
func (c *Catalog) hasPatterns() bool { return c.anyPat }

// TimeAtom returns the atom time(S,i+1) of section index s and 0-based
// pattern index i, or 0 when i is not a candidate (pruned or out of range).
func (c *Catalog) TimeAtom(s, i int) solver.Atom {
	if !c.IsPattern(s) || i < 0 || i >= len(c.pats[s].time) {
		return 0
	}
	return c.pats[s].time[i]
}

// TimeCandidates lists the candidate pattern indexes (0-based) of section
// index s, ascending; nil for grid sections.
func (c *Catalog) TimeCandidates(s int) []int {
	if !c.IsPattern(s) {
		return nil
	}
	return c.pats[s].times
}

// RoomAtom returns the atom in(S,R) of section index s and room index r, or
// 0 when r is not a candidate room of the pattern section.
func (c *Catalog) RoomAtom(s, r int) solver.Atom {
	if !c.IsPattern(s) || c.pats[s].roomAt == nil || r < 0 || r >= len(c.pats[s].roomAt) {
		return 0
	}
	if k := c.pats[s].roomAt[r]; k >= 0 {
		return c.pats[s].room[k]
	}
	return 0
}

// RoomCandidates lists the candidate room indexes of pattern section index
// s, ascending; nil for grid sections and sections that take no room.
func (c *Catalog) RoomCandidates(s int) []int {
	if !c.IsPattern(s) {
		return nil
	}
	return c.pats[s].rooms
}

// Pattern returns the occurrences (one per day, in week order) of 0-based
// pattern i of section index s.
func (c *Catalog) Pattern(s, i int) []timetable.Occurrence {
	return patternOccurrences(&c.term.Sections[s].Times[i])
}

func patternOccurrences(tc *timetable.TimeChoice) []timetable.Occurrence {
	days := tc.Days.List()
	out := make([]timetable.Occurrence, len(days))
	for k, d := range days {
		out[k] = timetable.Occurrence{Day: d, Start: tc.Start, End: tc.End(), Weeks: tc.Weeks}
	}
	return out
}

// compilePatternChoices makes the time and room atoms of every pattern
// section with their "exactly one" choices. Normally candidates are pruned:
// a pattern that meets during hard unavailability of the section, its staff
// or cohorts, or for which every candidate room is unavailable, is left
// out, and so is a room unavailable at every remaining pattern; a remaining
// (pattern, room) pair that clashes with the room's unavailability gets an
// integrity constraint. A section left with no pattern or no room is an
// input error naming its row.
func (b *builder) compilePatternChoices() {
	t := b.t
	for s := range t.Sections {
		sec := &t.Sections[s]
		pm := &b.c.pats[s]
		if !pm.on {
			continue
		}
		pm.time = make([]solver.Atom, len(sec.Times))
		rooms, weights := b.patternRooms(sec)
		if sec.TakesRoom() && len(rooms) == 0 {
			b.errorf(sec.Src, "section %s: no room is acceptable (check its room list, size and needed features against the Rooms sheet)", sec.ID)
			continue
		}
		// roomOK[k][i]: room rooms[k] is free at every meeting of pattern i.
		var times []int
		roomFree := make([][]bool, len(rooms))
		for k := range rooms {
			roomFree[k] = make([]bool, len(sec.Times))
		}
		for i := range sec.Times {
			if !b.opt.Explain && b.patternBlocked(s, i) {
				continue // Explain mode: explain_patterns.go states it with a selector
			}
			any := len(rooms) == 0
			for k, r := range rooms {
				if b.opt.Explain || !b.pat.roomBlocked(r, &sec.Times[i]) {
					roomFree[k][i] = true
					any = true
				}
			}
			if any {
				times = append(times, i)
			}
		}
		if len(times) == 0 {
			b.errorf(sec.Src, "section %s: none of its %d meeting times is possible (each meets during a hard unavailability of the section, its staff or cohorts, or when none of its rooms is free): add meeting times or relax the unavailability", sec.ID, len(sec.Times))
			continue
		}
		heads := make([]solver.Atom, 0, len(times))
		for _, i := range times {
			a := b.newAtom("time("+quote(sec.ID)+","+strconv.Itoa(i+1)+")",
				AtomInfo{Kind: AtomTime, Section: s, Period: -1, Staff: -1, Group: -1, Time: i + 1})
			pm.time[i] = a
			heads = append(heads, a)
		}
		pm.times = times
		b.in(-1, "meeting time")
		b.choice(heads, 1, 1, b.patSectionBody(s)...)
		if !sec.TakesRoom() {
			continue
		}
		pm.roomAt = make([]int, len(t.Rooms))
		for r := range pm.roomAt {
			pm.roomAt[r] = -1
		}
		var heads2 []solver.Atom
		var clash [][2]int // (room position, pattern) pairs to forbid
		for k, r := range rooms {
			free := 0
			for _, i := range times {
				if roomFree[k][i] {
					free++
				}
			}
			if free == 0 {
				continue
			}
			a := b.newAtom("in("+quote(sec.ID)+","+quote(t.Rooms[r].ID)+")",
				AtomInfo{Kind: AtomRoom, Section: s, Period: -1, Staff: -1, Group: -1, Room: r})
			pm.roomAt[r] = len(pm.rooms)
			pm.rooms = append(pm.rooms, r)
			pm.roomW = append(pm.roomW, weights[k])
			pm.room = append(pm.room, a)
			heads2 = append(heads2, a)
			if free < len(times) {
				for _, i := range times {
					if !roomFree[k][i] {
						clash = append(clash, [2]int{len(pm.rooms) - 1, i})
					}
				}
			}
		}
		b.in(-1, "meeting room")
		b.choice(heads2, 1, 1, b.patSectionBody(s)...)
		if len(clash) > 0 {
			b.in(-1, "room availability")
			for _, c := range clash {
				b.rule(0, solver.Pos(pm.time[c[1]]), solver.Pos(pm.room[c[0]]))
			}
		}
	}
}

// patternRooms lists the acceptable rooms of a pattern section with their
// preference penalties: RoomChoices when given, else Rooms, else every
// room; always only rooms with enough seats (unless capacity is soft) and
// every needed feature. Sorted by room index.
func (b *builder) patternRooms(sec *timetable.Section) (rooms, weights []int) {
	t := b.t
	if !sec.TakesRoom() {
		return nil, nil
	}
	w := make(map[int]int)
	switch {
	case len(sec.RoomChoices) > 0:
		for _, rc := range sec.RoomChoices {
			if r, ok := b.roomIdx[rc.Room]; ok {
				w[r] = rc.Weight
			}
		}
	case len(sec.Rooms) > 0:
		for _, id := range sec.Rooms {
			w[b.roomIdx[id]] = 0
		}
	default:
		for r := range t.Rooms {
			w[r] = 0
		}
	}
	for r := range t.Rooms {
		wt, ok := w[r]
		if !ok {
			continue
		}
		room := &t.Rooms[r]
		if !b.opt.Explain && !patternRoomFits(t, sec, room) {
			continue // Explain mode: explain_patterns.go states it with a selector
		}
		rooms = append(rooms, r)
		weights = append(weights, wt)
	}
	return rooms, weights
}

// anyTime returns one literal true exactly when pattern section s meets at
// one of the 0-based patterns idx (ascending, every one a candidate): the
// time atom itself for one pattern, else an atom any_time(S,K) defined by
// one rule per pattern, interned by (s, idx) so that staff, cohort, room
// and relation bounds share it. At most one of them holds, so it counts
// the section once.
func (b *builder) anyTime(s int, idx []int) solver.Lit {
	pm := &b.c.pats[s]
	if len(idx) == 1 {
		return solver.Pos(pm.time[idx[0]])
	}
	key := make([]byte, 0, 4+4*len(idx))
	key = strconv.AppendInt(key, int64(s), 10)
	for _, i := range idx {
		key = append(key, ',')
		key = strconv.AppendInt(key, int64(i), 10)
	}
	if a, ok := b.pat.anyTime[string(key)]; ok {
		return solver.Pos(a)
	}
	b.pat.nAny++
	a := b.newAtom(fmt.Sprintf("any_time(%s,%d)", quote(b.t.Sections[s].ID), b.pat.nAny),
		AtomInfo{Kind: AtomAux, Section: s, Period: -1, Staff: -1, Group: -1})
	b.pat.anyTime[string(key)] = a
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "any time")
	for _, i := range idx {
		b.rule(a, solver.Pos(pm.time[i]))
	}
	b.group, b.boundKind = saveG, saveK
	return solver.Pos(a)
}
