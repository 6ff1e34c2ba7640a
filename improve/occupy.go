package improve

// insert puts meeting m (currently unplaced) at start p in room r and adds
// its per-meeting criteria and student clashes to the running cost. It
// does not check legality; see canPlace. O(length·(people + neighbours)).
func (x *State) insert(m, p, r int32) {
	mt := &x.mt[m]
	mt.p, mt.r = p, r
	si := mt.sec
	in := &x.secs[si]
	np := int32(x.np)
	for q := p; q < p+int32(in.length); q++ {
		for _, nb := range in.nb {
			if x.secOcc[nb.sec*np+q] > 0 {
				x.cur.add(cStudentClash, nb.shared, nb.shared)
			}
		}
		x.secOcc[si*np+q]++
		for _, res := range in.people {
			k := res*np + q
			x.occ[k] = append(x.occ[k], m)
			if x.useMasks && len(x.occ[k]) == 1 {
				x.busyMask[res*int32(x.nDays)+x.dayNo[q]] |= 1 << (q - x.dayFirst[q])
			}
		}
	}
	x.holdRoom(m, p, r)
	x.meetingLocal(m, 1)
}

// remove takes meeting m out of its place, subtracting what insert added.
func (x *State) remove(m int32) {
	mt := &x.mt[m]
	p, r := mt.p, mt.r
	si := mt.sec
	in := &x.secs[si]
	np := int32(x.np)
	x.meetingLocal(m, -1)
	for q := p; q < p+int32(in.length); q++ {
		x.secOcc[si*np+q]--
		for _, nb := range in.nb {
			if x.secOcc[nb.sec*np+q] > 0 {
				x.cur.add(cStudentClash, -nb.shared, -nb.shared)
			}
		}
		for _, res := range in.people {
			k := res*np + q
			x.occ[k] = drop(x.occ[k], m)
			if x.useMasks && len(x.occ[k]) == 0 {
				x.busyMask[res*int32(x.nDays)+x.dayNo[q]] &^= 1 << (q - x.dayFirst[q])
			}
		}
	}
	x.freeRoom(m, p, r)
	mt.p, mt.r = -1, -1
}

// holdRoom adds meeting m starting at p to room r's occupancy (nothing
// when r is -1) with the room's avoid-times hits.
func (x *State) holdRoom(m, p, r int32) {
	if r < 0 {
		return
	}
	np := int32(x.np)
	for q := p; q < p+int32(x.secs[x.mt[m].sec].length); q++ {
		k := x.roomRes(r)*np + q
		x.occ[k] = append(x.occ[k], m)
		x.cur.add(cAvoid, x.roomAvU[r*np+q], x.roomAvW[r*np+q])
	}
}

// roomAvoid sums room r's avoid-times units and row-weighted units over
// the periods of a meeting of the given length starting at p, as holdRoom
// adds them.
func (x *State) roomAvoid(r, p int32, length int) (units, weighted int64) {
	np := int32(x.np)
	for q := p; q < p+int32(length); q++ {
		units += x.roomAvU[r*np+q]
		weighted += x.roomAvW[r*np+q]
	}
	return units, weighted
}

// freeRoom takes out what holdRoom added.
func (x *State) freeRoom(m, p, r int32) {
	if r < 0 {
		return
	}
	np := int32(x.np)
	for q := p; q < p+int32(x.secs[x.mt[m].sec].length); q++ {
		k := x.roomRes(r)*np + q
		x.occ[k] = drop(x.occ[k], m)
		x.cur.add(cAvoid, -x.roomAvU[r*np+q], -x.roomAvW[r*np+q])
	}
}

// meetingLocal adds sign times the criteria that depend on meeting m alone:
// avoid times of its section's people and section rows, early and late
// periods, and those of its room (roomLocal).
func (x *State) meetingLocal(m int32, sign int64) {
	mt := &x.mt[m]
	in := &x.secs[mt.sec]
	p := mt.p
	x.cur.add(cAvoid, sign*in.avoidU[p], sign*in.avoidW[p])
	if p == x.dayFirst[p] {
		x.cur.add(cEarly, sign, sign)
	}
	if p+int32(in.length)-1 == x.dayLast[p] {
		x.cur.add(cLate, sign, sign)
	}
	x.roomLocal(m, sign)
}

// roomLocal adds sign times meeting m's room criteria: over capacity and
// wasted seats.
func (x *State) roomLocal(m int32, sign int64) {
	x.roomSeats(m, x.mt[m].r, sign, &x.cur)
}

// roomSeats adds to out sign times the over-capacity and wasted-seat
// units of meeting m in room r (nothing for -1).
func (x *State) roomSeats(m, r int32, sign int64, out *tally) {
	if r < 0 {
		return
	}
	over, waste := x.seatUnits(m, r)
	if over > 0 {
		out.add(cOverCap, sign*over, sign*over)
	}
	if waste > 0 {
		out.add(cWasted, sign*waste, sign*waste)
	}
}

// seatUnits is the over-capacity (counted only when capacity is soft) and
// wasted-seat units of meeting m in room r (r >= 0).
func (x *State) seatUnits(m, r int32) (over, waste int64) {
	size := int64(x.t.Sections[x.mt[m].sec].Size)
	capa := int64(x.roomCap[r])
	if x.t.SoftCapacity && size > capa {
		over = size - capa
	}
	return over, max(capa-size, 0)
}

// canPlace reports whether unplaced meeting m may start at p in room r
// given every other placed meeting: allowed start (grid, hard
// unavailability), allowed room, no overlap with its own section, and no
// staff, cohort or room clash with a section whose weeks overlap.
func (x *State) canPlace(m, p, r int32) bool {
	if !x.canStart(m, p) {
		return false
	}
	in := &x.secs[x.mt[m].sec]
	if in.noRoom != (r < 0) {
		return false
	}
	return r < 0 || x.roomFits(r, p, in)
}

// canStart is canPlace without the room: an allowed start, no overlap
// with its own section and no staff or cohort clash, weeks overlapping.
func (x *State) canStart(m, p int32) bool {
	si := x.mt[m].sec
	in := &x.secs[si]
	if p < 0 || int(p) >= x.np || !in.startOK[p] {
		return false
	}
	np := int32(x.np)
	for q := p; q < p+int32(in.length); q++ {
		if x.secOcc[si*np+q] > 0 {
			return false
		}
		for _, res := range in.people {
			for _, o := range x.occ[res*np+q] {
				if x.secs[x.mt[o].sec].weeks.Overlaps(in.weeks) {
					return false
				}
			}
		}
	}
	return true
}

// roomFits reports whether room r is one section in may use and is open
// and free of meetings whose weeks overlap in's over the periods of a
// meeting starting at p.
func (x *State) roomFits(r, p int32, in *secInfo) bool {
	return in.roomOK[r] && x.roomFree(r, p, in)
}

// roomHeld reports whether room r is closed at period q or held there by
// a meeting whose weeks overlap in's.
func (x *State) roomHeld(r, q int32, in *secInfo) bool {
	if x.roomBlock[r*int32(x.np)+q] {
		return true
	}
	for _, o := range x.occ[x.roomRes(r)*int32(x.np)+q] {
		if x.secs[x.mt[o].sec].weeks.Overlaps(in.weeks) {
			return true
		}
	}
	return false
}

// drop removes v from xs in place (order is not kept).
func drop(xs []int32, v int32) []int32 {
	for i, y := range xs {
		if y == v {
			xs[i] = xs[len(xs)-1]
			return xs[:len(xs)-1]
		}
	}
	panic("improve: occupancy lost a meeting")
}
