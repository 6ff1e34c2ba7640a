package timetable

import (
	"slices"
	"sort"
)

// sections evaluates the per-section and per-meeting criteria: spread days,
// room stability, room over capacity, wasted seats, early and late periods.
func (c *coster) sections() {
	x := c.x
	t := x.t
	for si := range t.Sections {
		sec := &t.Sections[si]
		if sec.SameDay && sec.MinDays > 0 {
			days := int64(len(x.startSet(si, true)))
			if short := int64(sec.MinDays) - days; short > 0 {
				c.add(CritSpreadDays, short, short, WhoSection, sec.ID)
			}
		}
		if !sec.NoRoom {
			var rooms []string
			for _, i := range x.bySection[si] {
				if rm := x.s.Placements[i].Room; rm != "" && !slices.Contains(rooms, rm) {
					rooms = append(rooms, rm)
				}
			}
			if n := int64(len(rooms)) - 1; n > 0 {
				c.add(CritRoomStability, n, n, WhoSection, sec.ID)
			}
		}
		for _, i := range x.bySection[si] {
			op := x.pl[i]
			if op.room >= 0 {
				capa := t.Rooms[op.room].Capacity
				if over := int64(sec.Size - capa); t.SoftCapacity && over > 0 {
					c.add(CritOverCapacity, over, over, WhoSection, sec.ID)
				}
				if waste := int64(capa - sec.Size); waste > 0 {
					c.add(CritWastedSeats, waste, waste, WhoSection, sec.ID)
				}
			}
			if !op.ok {
				continue
			}
			if op.first == x.dayFirst[op.first] {
				c.add(CritEarly, 1, 1, WhoSection, sec.ID)
			}
			if op.last == x.dayLast[op.first] {
				c.add(CritLate, 1, 1, WhoSection, sec.ID)
			}
		}
	}
}

// moved pairs each section's meetings in s and kept in start-period order
// and counts pairs whose start period or room differs.
func (c *coster) moved(kept *Schedule) {
	if kept == nil {
		return
	}
	x := c.x
	old := map[string][]Placement{}
	for _, p := range kept.Placements {
		old[p.Section] = append(old[p.Section], p)
	}
	for si, sec := range x.t.Sections {
		prev := old[sec.ID]
		if len(prev) == 0 {
			continue
		}
		cur := make([]Placement, 0, len(x.bySection[si]))
		for _, i := range x.bySection[si] {
			cur = append(cur, x.s.Placements[i])
		}
		costSortMeetings(cur)
		prev = slices.Clone(prev)
		costSortMeetings(prev)
		var n int64
		for k := 0; k < len(cur) && k < len(prev); k++ {
			if cur[k].Period != prev[k].Period || cur[k].Room != prev[k].Room {
				n++
			}
		}
		c.add(CritMoved, n, n, WhoSection, sec.ID)
	}
}

// costSortMeetings orders one section's placements by start period, room
// and meeting number.
func costSortMeetings(ps []Placement) {
	sort.SliceStable(ps, func(i, j int) bool {
		a, b := ps[i], ps[j]
		if a.Period != b.Period {
			return a.Period < b.Period
		}
		if a.Room != b.Room {
			return a.Room < b.Room
		}
		return a.Meeting < b.Meeting
	})
}
