package timetable

import "slices"

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

// moved counts, per section, the kept meetings that s does not hold: a
// kept meeting is kept when a meeting of its section sits at its start
// period in its room, each meeting of s keeping at most one kept meeting
// (a maximum matching; with equal slots as the only edges it is the sum
// over slots of the smaller number of meetings there).
func (c *coster) moved(kept *Schedule) {
	if kept == nil {
		return
	}
	x := c.x
	type slot struct {
		period int
		time   int // meeting time of a pattern section; 0 on the grid
		room   string
	}
	old := map[string][]slot{}
	for _, p := range kept.Placements {
		old[p.Section] = append(old[p.Section], slot{p.Period, p.Time, p.Room})
	}
	for si, sec := range x.t.Sections {
		prev := old[sec.ID]
		if len(prev) == 0 {
			continue
		}
		free := map[slot]int{}
		for _, i := range x.bySection[si] {
			p := x.s.Placements[i]
			free[slot{p.Period, p.Time, p.Room}]++
		}
		var n int64
		for _, k := range prev {
			if free[k] > 0 {
				free[k]--
			} else {
				n++
			}
		}
		c.add(CritMoved, n, n, WhoSection, sec.ID)
	}
}
