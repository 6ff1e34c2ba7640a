package timetable

import "slices"

// overCapacity adds the bound on room over capacity (SoftCapacity only):
// each section's per-meeting bound, raised for the sections that may use
// every room by a slot count.
//
// The slot argument: take the grid sections that may use every room and
// meet in one common teaching week w (chosen as the week most of them
// meet in). Any two of their meetings in one room occupy different start
// periods (Check: a room holds no two meetings of sections with
// overlapping weeks at a common period, and a section's own meetings never
// overlap), so a room holds at most |Periods| of them. Forgetting every
// other rule leaves a transportation problem: meetings of sizes s_i to room
// slots of capacities c_r (|Periods| slots per room) at cost
// max(0, s_i − c_r). That cost is a convex function of s_i − c_r, so the
// cost matrix with sizes and capacities sorted in decreasing order is a
// Monge array, and for such arrays the north-west corner rule (largest
// meeting to the largest free slot) is optimal (Hoffman, "On simple linear
// programming problems", Proc. Symp. Pure Math. 7, AMS 1963). Meetings
// fixed in a room keep their fixed cost and are left out of the slots
// (leaving their slots free only relaxes further). The greater of the slot
// bound and the sum of these sections' per-meeting bounds is kept.
func (b *bounder) overCapacity() {
	t := b.t
	var local int64
	for si := range t.Sections {
		local += b.sec[si].over
	}
	if !t.SoftCapacity || len(b.rooms) == 0 {
		b.add(CritOverCapacity, local, local)
		return
	}
	wide := func(si int) bool { return b.sec[si].ok && b.sec[si].wide && !t.Sections[si].UsesTimes() }
	var perWeek [64]int
	for si := range t.Sections {
		if !wide(si) {
			continue
		}
		w := sectionWeeks(&t.Sections[si])
		for k := 0; k < 64; k++ {
			if w&(1<<k) != 0 {
				perWeek[k] += b.sec[si].free
			}
		}
	}
	week := 0
	for k := range perWeek {
		if perWeek[k] > perWeek[week] {
			week = k
		}
	}
	var sizes []int
	var groupLocal, groupFixed int64
	for si := range t.Sections {
		if !wide(si) || sectionWeeks(&t.Sections[si])&(1<<week) == 0 {
			continue
		}
		groupLocal += b.sec[si].over
		groupFixed += b.sec[si].fixedOver
		for range b.sec[si].free {
			sizes = append(sizes, t.Sections[si].Size)
		}
	}
	caps := make([]int, 0, len(b.rooms))
	for _, r := range b.rooms {
		caps = append(caps, t.Rooms[r].Capacity)
	}
	slot, ok := slotBound(sizes, caps, len(t.Periods))
	if ok && groupFixed+slot > groupLocal {
		local += groupFixed + slot - groupLocal
	}
	b.add(CritOverCapacity, local, local)
}

// slotBound is the least total of max(0, size − capacity) over the ways to
// give each meeting its own slot, each room having perRoom slots: the
// largest meetings take the slots of the largest rooms in order (optimal
// by the Monge property, see overCapacity). ok is false when there are
// more meetings than slots.
func slotBound(sizes, caps []int, perRoom int) (int64, bool) {
	if len(sizes) > len(caps)*perRoom {
		return 0, false
	}
	sizes = slices.Clone(sizes)
	caps = slices.Clone(caps)
	slices.Sort(sizes)
	slices.Reverse(sizes)
	slices.Sort(caps)
	slices.Reverse(caps)
	var sum int64
	for i, s := range sizes {
		if over := s - caps[i/perRoom]; over > 0 {
			sum += int64(over)
		}
	}
	return sum, true
}
