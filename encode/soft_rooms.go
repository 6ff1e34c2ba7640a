package encode

import (
	"slices"

	"github.com/termwright/termwright/timetable"
)

// Room improvement: the engine decides times, Decode finds a room for every
// meeting, and this local search then lowers the room-dependent criteria —
// room stability, room over capacity, wasted seats, travel, avoid times on
// room rows, soft same-room relations and the room half of moved meetings —
// by moving a section's meetings into one room, moving single meetings
// into free rooms, and moving a meeting into a room after moving the one
// meeting holding it elsewhere (a swap or an ejection chain of two). Every move keeps each meeting inside its candidate rooms and every
// room to one meeting at a time (in overlapping weeks), so hard
// requirements stay met. Moves are taken when they lower the cost vector
// (levels compared highest first); the search stops at a local optimum or
// after maxRoomPasses passes.

// maxRoomPasses bounds the passes of improveRooms over all meetings.
const maxRoomPasses = 8

// roomSearch is the state of one improveRooms call.
type roomSearch struct {
	t       *timetable.Term
	c       *Catalog
	levels  []int
	ms      []roomMeeting
	bySec   [][]int          // section -> meetings
	byWho   [][]int          // person (staff, then cohorts) -> meetings
	startAt [][][]int        // person -> start period -> meetings (nil for people without meetings)
	endAt   [][][]int        // person -> last period -> meetings
	whoOf   [][]int          // section -> persons
	relOf   [][]int          // section -> soft same-room relations (indexes into Term.Relations)
	relSec  [][]int          // relation -> sections
	occ     [][][]int        // occ[r][p]: meetings holding room r at period p
	avoid   [][]int64        // avoid[r][p]: weight of soft room rows of r covering p (criterion weight included), nil row when none
	w       [roomCrits]int64 // criterion weight
	lvl     [roomCrits]int   // criterion -> index into levels, -1 when off
}

// The criteria room improvement works on, indexes of roomSearch.w and lvl.
const (
	rcStability = iota
	rcOverCapacity
	rcWastedSeats
	rcTravel
	rcAvoid
	rcMoved
	rcRelations
	roomCrits
)

// roomCritNames are the criterion names of the rc... indexes.
var roomCritNames = [roomCrits]string{timetable.CritRoomStability, timetable.CritOverCapacity, timetable.CritWastedSeats,
	timetable.CritTravel, timetable.CritAvoidTimes, timetable.CritMoved, timetable.CritSoftRelations}

// roomMeeting is one placed meeting that takes a room.
type roomMeeting struct {
	pl       int // index into Schedule.Placements
	sec      int
	start    int
	end      int
	weeks    timetable.WeekSet
	room     int   // current room
	cands    []int // candidate rooms
	movable  bool  // false for meetings of hard same-room groups and single candidates
	oldRooms []int // rooms (-1: none in the term) of its section's kept meetings at its start; nil when none
}

// improveRooms returns s with rooms changed to lower the room-dependent
// criteria; s itself is not modified.
func improveRooms(t *timetable.Term, c *Catalog, s *timetable.Schedule, kept *timetable.Schedule) *timetable.Schedule {
	rs := newRoomSearch(t, c, s, kept)
	if rs == nil {
		return s
	}
	for pass := 0; pass < maxRoomPasses; pass++ {
		better := false
		for sec := range rs.bySec {
			if rs.sectionMove(sec) {
				better = true
			}
		}
		for i := range rs.ms {
			if rs.meetingMove(i) {
				better = true
			}
		}
		if !better {
			break
		}
	}
	out := &timetable.Schedule{Placements: slices.Clone(s.Placements)}
	for _, m := range rs.ms {
		out.Placements[m.pl].Room = t.Rooms[m.room].ID
	}
	return out
}

// newRoomSearch indexes the schedule; nil when no room criterion is on or
// no meeting has a room.
func newRoomSearch(t *timetable.Term, c *Catalog, s *timetable.Schedule, kept *timetable.Schedule) *roomSearch {
	rs := &roomSearch{t: t, c: c, levels: termLevels(t)}
	on := false
	for k, name := range roomCritNames {
		w, l := t.CriterionWeight(name)
		rs.w[k] = int64(w)
		rs.lvl[k] = slices.Index(rs.levels, l)
		if w == 0 {
			rs.lvl[k] = -1
		}
		on = on || w != 0
	}
	if !t.SoftCapacity {
		rs.lvl[rcOverCapacity] = -1
	}
	if !on {
		return nil
	}
	secIdx, roomIdx := t.SectionIndex(), t.RoomIndex()
	rs.bySec = make([][]int, len(t.Sections))
	for i, p := range s.Placements {
		si, ok := secIdx[p.Section]
		r, rok := roomIdx[p.Room]
		if !ok || !rok || p.Room == "" {
			continue
		}
		m := &c.secs[si]
		cand := m.candAt(p.Period)
		if cand < 0 {
			continue
		}
		rm := roomMeeting{pl: i, sec: si, start: p.Period, end: p.Period + m.length - 1, weeks: m.weeks,
			room: r, cands: c.rooms.sets.sets[cand].members()}
		rm.movable = m.sameRoom < 0 && len(rm.cands) > 1 && !c.explicitRooms(si) // the search chose explicit rooms (rooms_grid.go)
		rs.bySec[si] = append(rs.bySec[si], len(rs.ms))
		rs.ms = append(rs.ms, rm)
	}
	if len(rs.ms) == 0 {
		return nil
	}
	rs.indexPeople()
	rs.indexRelations()
	rs.indexRooms()
	rs.indexKept(kept)
	return rs
}

// indexPeople lists each staff member's and cohort's meetings.
func (rs *roomSearch) indexPeople() {
	t := rs.t
	staffIdx, cohIdx := t.StaffIndex(), t.CohortIndex()
	rs.byWho = make([][]int, len(t.Staff)+len(t.Cohorts))
	rs.whoOf = make([][]int, len(t.Sections))
	for si, sec := range t.Sections {
		for _, id := range uniq(sec.Staff) {
			if k, ok := staffIdx[id]; ok {
				rs.whoOf[si] = append(rs.whoOf[si], k)
			}
		}
		for _, id := range uniq(sec.Cohorts) {
			if k, ok := cohIdx[id]; ok {
				rs.whoOf[si] = append(rs.whoOf[si], len(t.Staff)+k)
			}
		}
	}
	rs.startAt = make([][][]int, len(rs.byWho))
	rs.endAt = make([][][]int, len(rs.byWho))
	for i, m := range rs.ms {
		for _, k := range rs.whoOf[m.sec] {
			rs.byWho[k] = append(rs.byWho[k], i)
			if rs.startAt[k] == nil {
				rs.startAt[k], rs.endAt[k] = make([][]int, len(t.Periods)), make([][]int, len(t.Periods))
			}
			rs.startAt[k][m.start] = append(rs.startAt[k][m.start], i)
			rs.endAt[k][m.end] = append(rs.endAt[k][m.end], i)
		}
	}
}

// indexRelations lists the soft same-room relations of each section.
func (rs *roomSearch) indexRelations() {
	t := rs.t
	secIdx := t.SectionIndex()
	rs.relOf = make([][]int, len(t.Sections))
	rs.relSec = make([][]int, len(t.Relations))
	for ri, r := range t.Relations {
		if r.Hard || r.Kind != timetable.SameRoom || r.Weight == 0 {
			continue
		}
		for _, id := range r.Sections {
			if si, ok := secIdx[id]; ok && !slices.Contains(rs.relSec[ri], si) {
				rs.relSec[ri] = append(rs.relSec[ri], si)
				rs.relOf[si] = append(rs.relOf[si], ri)
			}
		}
	}
}

// indexRooms fills room occupancy and the weights of soft room rows.
func (rs *roomSearch) indexRooms() {
	t := rs.t
	nP := len(t.Periods)
	rs.occ = make([][][]int, len(t.Rooms))
	for r := range rs.occ {
		rs.occ[r] = make([][]int, nP)
	}
	for i, m := range rs.ms {
		for q := m.start; q <= m.end; q++ {
			rs.occ[m.room][q] = append(rs.occ[m.room][q], i)
		}
	}
	rs.avoid = make([][]int64, len(t.Rooms))
	roomIdx := t.RoomIndex()
	for _, u := range t.Unavailable {
		r, ok := roomIdx[u.Who]
		if u.Hard || u.Kind != timetable.WhoRoom || u.Weight <= 0 || !ok {
			continue
		}
		for p, per := range t.Periods {
			if u.Covers(per) {
				if rs.avoid[r] == nil {
					rs.avoid[r] = make([]int64, nP)
				}
				rs.avoid[r][p] += int64(u.Weight) * rs.w[rcAvoid]
			}
		}
	}
}

// indexKept notes, per meeting, the rooms of its section's kept meetings
// at the same start. The meeting keeps one of those kept meetings ("moved
// meetings") only in one of their rooms; in any other room it costs one
// unit, the room half of the criterion (the engine counts the time half).
func (rs *roomSearch) indexKept(kept *timetable.Schedule) {
	if kept == nil {
		return
	}
	km := newKeepModel(rs.t, kept)
	roomIdx := rs.t.RoomIndex()
	for si, ms := range rs.bySec {
		for _, i := range ms {
			for _, p := range km.secs[si] {
				if p.Period != rs.ms[i].start {
					continue
				}
				r, ok := roomIdx[p.Room]
				if !ok || p.Room == "" {
					r = -1
				}
				rs.ms[i].oldRooms = append(rs.ms[i].oldRooms, r)
			}
		}
	}
}

// free reports whether room r can hold meeting i, ignoring the meetings in
// except (which are moving too).
func (rs *roomSearch) free(r, i int, except ...int) bool {
	m := &rs.ms[i]
	blocked := rs.c.rooms.blocked[r]
	for q := m.start; q <= m.end; q++ {
		if blocked != nil && blocked[q] {
			return false
		}
		for _, j := range rs.occ[r][q] {
			if j != i && !slices.Contains(except, j) && rs.ms[j].weeks&m.weeks != 0 {
				return false
			}
		}
	}
	return true
}

// setRoom moves meeting i to room r, keeping the occupancy index.
func (rs *roomSearch) setRoom(i, r int) {
	m := &rs.ms[i]
	for q := m.start; q <= m.end; q++ {
		l := rs.occ[m.room][q]
		if k := slices.Index(l, i); k >= 0 {
			rs.occ[m.room][q] = slices.Delete(l, k, k+1)
		}
		rs.occ[r][q] = append(rs.occ[r][q], i)
	}
	m.room = r
}

// sectionMove tries to put every movable meeting of section sec into one
// room and keeps the best improving choice.
func (rs *roomSearch) sectionMove(sec int) bool {
	ms := rs.bySec[sec]
	if len(ms) < 2 {
		return false
	}
	for _, i := range ms {
		if !rs.ms[i].movable {
			return false
		}
	}
	rooms := rs.ms[ms[0]].cands
	old := make([]int, len(ms))
	for k, i := range ms {
		old[k] = rs.ms[i].room
	}
	before := rs.cost(ms)
	if zero(before) {
		return false
	}
	bestRoom, best := -1, before
	for _, r := range rooms {
		ok := true
		for _, i := range ms {
			if !slices.Contains(rs.ms[i].cands, r) || !rs.free(r, i, ms...) {
				ok = false
				break
			}
		}
		if !ok {
			continue
		}
		for _, i := range ms {
			rs.setRoom(i, r)
		}
		if c := rs.cost(ms); slices.Compare(c, best) < 0 {
			bestRoom, best = r, c
		}
		for k, i := range ms {
			rs.setRoom(i, old[k])
		}
	}
	if bestRoom < 0 {
		return false
	}
	for _, i := range ms {
		rs.setRoom(i, bestRoom)
	}
	return true
}

// meetingMove tries moving meeting i to each free candidate room, and into
// each candidate room held by one other meeting that moves on to another
// free room (i's own, a swap, or any other), and keeps the best improving
// change.
func (rs *roomSearch) meetingMove(i int) bool {
	m := &rs.ms[i]
	if !m.movable {
		return false
	}
	single := []int{i}
	own := rs.cost(single)
	if zero(own) {
		return false // nothing of i's own can get cheaper; others may still move i out of their way
	}
	from := m.room
	type change struct{ r, j, r2 int } // j: the meeting moved out of r into r2, -1 for a plain move
	var best *change
	var bestCost []int64
	consider := func(c change, d []int64) {
		if slices.Compare(d, make([]int64, len(d))) < 0 && (best == nil || slices.Compare(d, bestCost) < 0) {
			best, bestCost = &c, d
		}
	}
	for _, r := range m.cands {
		if r == from {
			continue
		}
		// What i itself gains in r (whoever else is there): without a gain
		// neither a move nor a chain through i is worth trying, since i and
		// a meeting it displaces overlap in time and share no section.
		rs.setRoom(i, r)
		mine := rs.cost(single)
		rs.setRoom(i, from)
		if slices.Compare(mine, own) >= 0 {
			continue
		}
		if rs.free(r, i) {
			consider(change{r, -1, -1}, diff(mine, own))
			continue
		}
		j := rs.blocker(r, i)
		if j < 0 || !rs.ms[j].movable || !rs.free(r, i, j) {
			continue
		}
		// Move j out of r (to i's room: a swap, or to any other free
		// room: an ejection chain of two) and i into r.
		pair := []int{i, j}
		before := rs.cost(pair)
		for _, r2 := range rs.ms[j].cands {
			if r2 == r || !rs.free(r2, j, i) {
				continue
			}
			rs.setRoom(j, r2)
			rs.setRoom(i, r)
			after := rs.cost(pair)
			rs.setRoom(i, from)
			rs.setRoom(j, r)
			consider(change{r, j, r2}, diff(after, before))
		}
	}
	if best == nil {
		return false
	}
	if best.j >= 0 {
		rs.setRoom(best.j, best.r2)
	}
	rs.setRoom(i, best.r)
	return true
}

// blocker returns the one meeting that keeps room r from meeting i (in an
// overlapping period and week), -1 when there is none or more than one or
// the room is unavailable.
func (rs *roomSearch) blocker(r, i int) int {
	m := &rs.ms[i]
	blocked := rs.c.rooms.blocked[r]
	who := -1
	for q := m.start; q <= m.end; q++ {
		if blocked != nil && blocked[q] {
			return -1
		}
		for _, j := range rs.occ[r][q] {
			if j == i || rs.ms[j].weeks&m.weeks == 0 {
				continue
			}
			if who >= 0 && who != j {
				return -1
			}
			who = j
		}
	}
	return who
}

// zero reports whether every entry of v is 0.
func zero(v []int64) bool {
	for _, x := range v {
		if x != 0 {
			return false
		}
	}
	return true
}

func diff(a, b []int64) []int64 {
	out := make([]int64, len(a))
	for k := range a {
		out[k] = a[k] - b[k]
	}
	return out
}

// cost is the part of the room-dependent cost, per level, that the rooms
// of the given meetings can change: their own per-meeting criteria, the
// room stability of their sections, travel pairs that involve one of them,
// and their sections' soft same-room relations. The difference of cost
// over the same meetings before and after they change rooms is exactly the
// change of the whole room-dependent cost.
func (rs *roomSearch) cost(moved []int) []int64 {
	out := make([]int64, len(rs.levels))
	add := func(c int, v int64) {
		if k := rs.lvl[c]; k >= 0 && v != 0 {
			out[k] += rs.w[c] * v
		}
	}
	var secs, rels []int
	for _, i := range moved {
		m := &rs.ms[i]
		size := rs.t.Sections[m.sec].Size
		capa := rs.t.Rooms[m.room].Capacity
		if size > capa {
			add(rcOverCapacity, int64(size-capa))
		} else {
			add(rcWastedSeats, int64(capa-size))
		}
		if row := rs.avoid[m.room]; row != nil {
			if k := rs.lvl[rcAvoid]; k >= 0 {
				for q := m.start; q <= m.end; q++ {
					out[k] += row[q]
				}
			}
		}
		if m.oldRooms != nil && !slices.Contains(m.oldRooms, m.room) {
			add(rcMoved, 1)
		}
		if rs.lvl[rcTravel] >= 0 {
			add(rcTravel, rs.travelAt(i, moved))
		}
		if !slices.Contains(secs, m.sec) {
			secs = append(secs, m.sec)
		}
	}
	for _, sec := range secs {
		var rooms []int
		for _, i := range rs.bySec[sec] {
			if !slices.Contains(rooms, rs.ms[i].room) {
				rooms = append(rooms, rs.ms[i].room)
			}
		}
		add(rcStability, int64(max(len(rooms)-1, 0)))
		for _, ri := range rs.relOf[sec] {
			if !slices.Contains(rels, ri) {
				rels = append(rels, ri)
			}
		}
	}
	for _, ri := range rels {
		if rs.relBroken(ri) {
			add(rcRelations, int64(rs.t.Relations[ri].Weight))
		}
	}
	return out
}

// travelAt counts, over the staff and cohorts of meeting i, the pairs of
// meetings in consecutive periods of one day that involve i and are held
// in different non-blank buildings. A pair with another meeting of moved
// is counted from its earlier meeting only, so that no pair counts twice.
func (rs *roomSearch) travelAt(i int, moved []int) int64 {
	m := &rs.ms[i]
	t := rs.t
	b := t.Rooms[m.room].Building
	if b == "" {
		return 0
	}
	var n int64
	before := m.start > 0 && t.Consecutive(m.start-1, m.start)
	after := m.end+1 < len(t.Periods) && t.Consecutive(m.end, m.end+1)
	for _, k := range rs.whoOf[m.sec] {
		if after {
			for _, j := range rs.startAt[k][m.end+1] {
				if bb := t.Rooms[rs.ms[j].room].Building; j != i && bb != "" && bb != b {
					n++
				}
			}
		}
		if before {
			for _, j := range rs.endAt[k][m.start-1] {
				if slices.Contains(moved, j) {
					continue // counted from j
				}
				if bb := t.Rooms[rs.ms[j].room].Building; j != i && bb != "" && bb != b {
					n++
				}
			}
		}
	}
	return n
}

// relBroken reports whether the meetings of soft same-room relation ri use
// more than one room.
func (rs *roomSearch) relBroken(ri int) bool {
	room := -1
	for _, sec := range rs.relSec[ri] {
		for _, i := range rs.bySec[sec] {
			if room < 0 {
				room = rs.ms[i].room
			} else if rs.ms[i].room != room {
				return true
			}
		}
	}
	return false
}
