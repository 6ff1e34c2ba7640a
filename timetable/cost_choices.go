package timetable

// choices charges "time choice" (per pattern section with a valid
// placement, the Weight of its chosen meeting time) and "room choice" (per
// placement of a section with room choices, the Weight of its room when
// the room is one of them; a room outside the list is a broken hard
// requirement and costs nothing here).
func (c *coster) choices() {
	x := c.x
	for i, p := range x.s.Placements {
		op := x.pl[i]
		if op.sec < 0 {
			continue
		}
		sec := &x.t.Sections[op.sec]
		if op.pok {
			if w := int64(sec.Times[p.Time-1].Weight); w != 0 {
				c.add(CritTimeChoice, w, w, WhoSection, sec.ID)
			}
		}
		if len(sec.RoomChoices) > 0 && p.Room != "" {
			if rc, ok := roomChoiceOf(sec, p.Room); ok && rc.Weight != 0 {
				c.add(CritRoomChoice, int64(rc.Weight), int64(rc.Weight), WhoSection, sec.ID)
			}
		}
	}
}
