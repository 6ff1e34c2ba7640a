package improve

// peekRooms decides a room-only move (roomOnly) of sections without
// relations before anything is changed: it checks each new room against
// the meetings that stay and against the move's other new rooms, costs
// the move from the moving meetings' room criteria, their sections' room
// criteria (secRoomContrib) and, with buildings, their people's days
// (travel) with the new rooms written in, and changes the rooms only when
// accept keeps it. Most moves are refused, and a refused move so costs no
// lifting and no putting back. handled is false when a moving section has
// relations (a relation may read rooms and is checked on the changed
// state); commitRooms decides the move then. The running cost and the
// difference handed to accept are commitRooms's exactly.
func (x *State) peekRooms(chs []change, accept func(delta *tally) bool) (kept, handled bool) {
	for _, ch := range chs {
		if len(x.secs[x.mt[ch.m].sec].rels) > 0 {
			return false, false
		}
	}
	for _, ch := range chs {
		x.markMt[ch.m] = x.stamp // the moving meetings, for staysAt
	}
	for i := range chs {
		if !x.roomStaysFree(chs, i) {
			return false, true
		}
	}
	x.markTouched(chs) // sections, and person-days only with buildings: no start changes
	var before, after tally
	for _, si := range x.touchSec {
		x.secRoomContrib(si, &before)
	}
	x.pdsContrib(&before)
	for _, ch := range chs {
		x.roomCrit(ch.m, x.mt[ch.m].r, &before)
		x.roomCrit(ch.m, ch.r, &after)
	}
	old := x.peekOld[:0]
	for _, ch := range chs {
		old = append(old, x.mt[ch.m].r)
		x.mt[ch.m].r = ch.r
	}
	for _, si := range x.touchSec {
		x.secRoomContrib(si, &after)
	}
	x.pdsContrib(&after)
	x.delta = after
	x.delta.minus(&before)
	// accept runs with the new rooms written in: a worker's post reads the
	// places of the meetings it sends to the other replicas.
	keep := accept == nil || accept(&x.delta)
	for i, ch := range chs {
		x.mt[ch.m].r = old[i]
	}
	x.peekOld = old
	if !keep {
		return false, true
	}
	base := x.cur
	for _, ch := range chs {
		x.setRoom(ch.m, -1)
	}
	for _, ch := range chs {
		x.setRoom(ch.m, ch.r)
	}
	x.cur = base
	x.cur.plus(&x.delta)
	return true, true
}

// roomStaysFree reports whether change i of a room-only move may take its
// room: one its section allows (none when it takes none), open over the
// meeting's periods, held there by no meeting outside the move and taken
// by no earlier change of the move, weeks overlapping.
func (x *State) roomStaysFree(chs []change, i int) bool {
	ch := chs[i]
	mt := &x.mt[ch.m]
	in := &x.secs[mt.sec]
	r := ch.r
	if in.noRoom != (r < 0) || (r >= 0 && !in.roomOK[r]) {
		return false
	}
	if r < 0 {
		return true
	}
	np := int32(x.np)
	p, end := mt.p, mt.p+int32(in.length)
	for q := p; q < end; q++ {
		if x.roomBlock[r*np+q] || x.staysAt(x.roomRes(r)*np+q, in.weeks) {
			return false
		}
	}
	for _, o := range chs[:i] {
		ot := &x.mt[o.m]
		oin := &x.secs[ot.sec]
		if o.r == r && ot.p < end && p < ot.p+int32(oin.length) && oin.weeks.Overlaps(in.weeks) {
			return false
		}
	}
	return true
}

// roomCrit adds the criteria of meeting m, at its start, that room r (-1:
// none) decides: over capacity and wasted seats (roomSeats) and the room's
// avoid times, as holdRoom counts them.
func (x *State) roomCrit(m, r int32, out *tally) {
	if r < 0 {
		return
	}
	x.roomSeats(m, r, 1, out)
	mt := &x.mt[m]
	u, w := x.roomAvoid(r, mt.p, x.secs[mt.sec].length)
	out.add(cAvoid, u, w)
}
