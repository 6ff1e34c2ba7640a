package timetable

import (
	"slices"
	"sort"
	"strings"
)

// roomSet is the set of rooms one section may use, kept small: the rooms
// that Unavailable rows name (marked) one by one, and the others (plain,
// alike for legality, free of rows) only by their least room-only values
// and one representative.
type roomSet struct {
	marked   []candRoom
	plainMin bvals // least static values over the plain rooms (avoid times 0); bvInf when none
	allMin   bvals // least static values over every room of the set (avoid times 0 when a plain room is in it)
	plainRep int   // a plain room (index in Term.Rooms), -1 when none
	count    int   // rooms in the set
	member   func(r int) (bvals, bool)
}

// byID finds room id in the set with its arrays (nil for a plain room).
func (s *roomSet) byID(b *bounder, id string) (candRoom, bool) {
	r, ok := b.roomIdx[id]
	if !ok || id == "" {
		return candRoom{}, false
	}
	static, ok := s.member(r)
	if !ok {
		return candRoom{}, false
	}
	for _, c := range s.marked {
		if c.room == r {
			return c, true
		}
	}
	return candRoom{room: r, static: static}, true
}

// plainRoom is the representative plain room as a candidate.
func (s *roomSet) plainRoom() candRoom {
	return candRoom{room: s.plainRep, static: s.plainMin}
}

// needsRooms is the rooms with one set of needed features (every room
// for none), the plain ones sorted by capacity.
type needsRooms struct {
	caps   []int // plain rooms' capacities, increasing
	plain  []int // the plain rooms in that order
	marked []int
}

// roomsFor lists (once per set of needs) the rooms that have every needed
// feature.
func (b *bounder) roomsFor(needs []string) *needsRooms {
	norm := make([]string, 0, len(needs))
	for _, f := range needs {
		norm = append(norm, normFeature(f))
	}
	slices.Sort(norm)
	key := strings.Join(slices.Compact(norm), "\x00")
	if nr, ok := b.byNeeds[key]; ok {
		return nr
	}
	nr := &needsRooms{}
	for _, r := range b.rooms {
		if !b.hasAll(r, norm) {
			continue
		}
		if b.roomMarked[r] {
			nr.marked = append(nr.marked, r)
		} else {
			nr.plain = append(nr.plain, r)
		}
	}
	sort.SliceStable(nr.plain, func(i, j int) bool { return b.t.Rooms[nr.plain[i]].Capacity < b.t.Rooms[nr.plain[j]].Capacity })
	for _, r := range nr.plain {
		nr.caps = append(nr.caps, b.t.Rooms[r].Capacity)
	}
	b.byNeeds[key] = nr
	return nr
}

// hasAll reports whether room r has every feature of norm (normalised).
func (b *bounder) hasAll(r int, norm []string) bool {
	for _, f := range norm {
		if !b.roomFeat[r][f] {
			return false
		}
	}
	return true
}

// staticOf is the room-only values of room r for section sec with room
// choice weight w.
func (b *bounder) staticOf(sec *Section, r, w int) bvals {
	var v bvals
	capa := b.t.Rooms[r].Capacity
	if b.t.SoftCapacity {
		v[bvOver] = int64(max(0, sec.Size-capa))
	}
	v[bvWaste] = int64(max(0, capa-sec.Size))
	v[bvChoice] = int64(w)
	return v
}

// roomSetOf gives the rooms section sec may use in a timetable passing
// Check: its room choices (the exact list) or else its room list or else
// every room, keeping those with every needed feature and, unless
// capacity is soft, enough seats. Empty for a section that takes no room.
// weeks are the weeks whose rows apply (a row naming weeks applies only
// when they meet these); pattern sections judge rows themselves and pass 0.
func (b *bounder) roomSetOf(sec *Section, weeks WeekSet) roomSet {
	s := roomSet{plainMin: bvAll(bvInf), plainRep: -1, member: func(int) (bvals, bool) { return bvals{}, false }}
	if sec.NoRoom {
		return s
	}
	t := b.t
	norm := make([]string, 0, len(sec.Needs))
	for _, f := range sec.Needs {
		norm = append(norm, normFeature(f))
	}
	fits := func(r int) bool { return b.hasAll(r, norm) && (t.SoftCapacity || sec.Size <= t.Rooms[r].Capacity) }
	addMarked := func(r int, static bvals) {
		c := candRoom{room: r, static: static}
		c.hard, c.softN, c.softW = b.roomArrays(r, weeks)
		s.marked = append(s.marked, c)
	}
	if len(sec.RoomChoices) > 0 || len(sec.Rooms) > 0 {
		weight := map[int]int{}
		var ids []int
		if len(sec.RoomChoices) > 0 {
			for _, rc := range sec.RoomChoices {
				if r, ok := b.roomIdx[rc.Room]; ok && rc.Room != "" {
					if _, dup := weight[r]; !dup {
						weight[r] = rc.Weight
						ids = append(ids, r)
					}
				}
			}
		} else {
			for _, id := range occUnique(sec.Rooms) {
				if r, ok := b.roomIdx[id]; ok && id != "" {
					ids = append(ids, r)
				}
			}
		}
		for _, r := range ids {
			if !fits(r) {
				continue
			}
			s.count++
			static := b.staticOf(sec, r, weight[r])
			if b.roomMarked[r] {
				addMarked(r, static)
				continue
			}
			s.plainMin.minWith(static)
			if s.plainRep < 0 {
				s.plainRep = r
			}
		}
		s.member = func(r int) (bvals, bool) {
			w, ok := weight[r]
			if len(sec.RoomChoices) == 0 {
				ok = slices.Contains(ids, r)
			}
			if !ok || !fits(r) {
				return bvals{}, false
			}
			return b.staticOf(sec, r, w), true
		}
	} else {
		nr := b.roomsFor(sec.Needs)
		s.marked = make([]candRoom, 0, len(nr.marked))
		from := 0
		if !t.SoftCapacity {
			from = sort.SearchInts(nr.caps, sec.Size)
		}
		if n := len(nr.plain) - from; n > 0 {
			s.count += n
			// Over capacity is least in the largest room, wasted seats in
			// the smallest room that seats everyone (or any smaller room).
			s.plainMin = bvals{}
			s.plainMin[bvOver] = b.staticOf(sec, nr.plain[len(nr.plain)-1], 0)[bvOver]
			fit := max(from, sort.SearchInts(nr.caps, sec.Size))
			switch {
			case fit > from:
				s.plainMin[bvWaste] = 0 // a room smaller than the section wastes nothing
			case fit < len(nr.caps):
				s.plainMin[bvWaste] = int64(nr.caps[fit] - sec.Size)
			default:
				s.plainMin[bvWaste] = 0
			}
			s.plainRep = nr.plain[min(fit, len(nr.plain)-1)]
		}
		for _, r := range nr.marked { // they have the features already
			if t.SoftCapacity || sec.Size <= t.Rooms[r].Capacity {
				s.count++
				addMarked(r, b.staticOf(sec, r, 0))
			}
		}
		s.member = func(r int) (bvals, bool) {
			if !fits(r) {
				return bvals{}, false
			}
			return b.staticOf(sec, r, 0), true
		}
	}
	if s.plainRep >= 0 {
		s.plainMin[bvAvoidN], s.plainMin[bvAvoidW] = 0, 0
	}
	s.allMin = s.plainMin
	for _, c := range s.marked {
		v := c.static
		v[bvAvoidN], v[bvAvoidW] = s.plainMin[bvAvoidN], s.plainMin[bvAvoidW]
		s.allMin.minWith(v)
	}
	return s
}

// roomArrays gives the periods the hard rows of room r block and the soft
// rows' counts and weights per period, for a section meeting in weeks (a
// row naming weeks applies when they meet): shared arrays when no row of
// the room names weeks.
func (b *bounder) roomArrays(r int, weeks WeekSet) ([]bool, []int64, []int64) {
	if a := b.roomBase[r]; a.hard != nil {
		return a.hard, a.softN, a.softW
	}
	n := len(b.t.Periods)
	a := roomRowArrays{make([]bool, n), make([]int64, n), make([]int64, n)}
	b.applyRows(b.rowsOf[rowKey{WhoRoom, b.t.Rooms[r].ID}], weeks, a.hard, a.softN, a.softW)
	return a.hard, a.softN, a.softW
}

// roomRowArrays are a room's row arrays (roomArrays).
type roomRowArrays struct {
	hard         []bool
	softN, softW []int64
}

// applyRows marks the periods the given rows cover: hard ones in hard,
// soft ones counted in softN and weighed in softW; a row naming weeks
// applies only when they meet weeks.
func (b *bounder) applyRows(rows []int, weeks WeekSet, hard []bool, softN, softW []int64) {
	for _, i := range rows {
		u := &b.t.Unavailable[i]
		if u.Weeks != 0 && !weeks.Overlaps(u.Weeks) {
			continue
		}
		for _, p := range b.rowCover[i] {
			if u.Hard {
				hard[p] = true
			} else {
				softN[p]++
				softW[p] += int64(u.Weight)
			}
		}
	}
}
