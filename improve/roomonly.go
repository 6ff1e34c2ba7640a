package improve

// roomOnly reports whether every change of chs keeps its meeting's start
// and names its room, so that commitRooms may apply the move: the people's
// busy periods, student clashes and every time rule stay as they are.
// Their days' criteria are recomputed only when some room names a
// building (travel reads rooms; markTouched touches those days then).
func (x *State) roomOnly(chs []change) bool {
	for _, ch := range chs {
		if ch.r == roomAuto || ch.p != x.mt[ch.m].p {
			return false
		}
	}
	return true
}

// commitRooms is commit for a move that changes rooms only (roomOnly): it
// lifts and puts back the meetings' rooms alone, not their people, and
// recomputes the touched sections and relations (room stability), and
// with buildings the touched person-days (travel), only.
// A move that fails is undone the same way.
func (x *State) commitRooms(chs []change, accept func(delta *tally) bool) bool {
	var before, base tally
	x.begin(chs, &before, &base) // person-days only with buildings: no start changes
	for _, u := range x.log {
		x.setRoom(u.m, -1)
	}
	placed := 0
	for _, ch := range chs {
		if !x.mayTake(ch.m, ch.r) {
			break
		}
		x.setRoom(ch.m, ch.r)
		placed++
	}
	if placed < len(chs) || !x.hardOK() || !x.decide(&before, &base, accept) {
		x.undoRooms(placed, base)
		return false
	}
	return true
}

// setRoom moves meeting m, at its start, from its room to room r (-1:
// none), with the room criteria and occupancy.
func (x *State) setRoom(m, r int32) {
	mt := &x.mt[m]
	x.roomLocal(m, -1)
	x.freeRoom(m, mt.p, mt.r)
	mt.r = r
	x.holdRoom(m, mt.p, r)
	x.roomLocal(m, 1)
}

// mayTake reports whether meeting m, roomless at its start, may take
// room r there: a room its section allows (none when it takes none), open
// and held by no meeting whose weeks overlap its own.
func (x *State) mayTake(m, r int32) bool {
	in := &x.secs[x.mt[m].sec]
	if in.noRoom != (r < 0) || (r >= 0 && !in.roomOK[r]) {
		return false
	}
	return r < 0 || x.roomFree(r, x.mt[m].p, in)
}

// undoRooms takes the first placed meetings of the log out of their new
// rooms, puts every logged meeting back in its old room and restores the
// running cost to base.
func (x *State) undoRooms(placed int, base tally) {
	for _, u := range x.log[:placed] {
		x.setRoom(u.m, -1)
	}
	for _, u := range x.log {
		x.setRoom(u.m, u.r)
	}
	x.cur = base
}
