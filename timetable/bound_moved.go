package timetable

// keptOf groups the kept timetable's placements by section ID, as Cost
// does for "moved meetings"; placements of sections the term no longer
// has are not counted by Cost and so are left out.
func (b *bounder) keptOf(kept *Schedule) {
	if kept == nil {
		return
	}
	b.kept = map[string][]Placement{}
	for _, p := range kept.Placements {
		b.kept[p.Section] = append(b.kept[p.Section], p)
	}
}

// movedGrid bounds the moved meetings of grid section sec. A kept meeting
// is held only by a meeting of the section at its start period (with no
// meeting time) and room, so only a kept place that some legal meeting
// can take (a legal start, with that room allowed and free of hard rows
// there, or no room for a section that takes none) can be held; the
// section's meetings hold at most one kept meeting each, at different
// start periods (its meetings never overlap), and on different days when
// they must be. Every other kept meeting is moved.
func (b *bounder) movedGrid(sec *Section, g *gridPlaces, want int) {
	prev := b.kept[sec.ID]
	if len(prev) == 0 {
		return
	}
	periods, days := map[int]bool{}, map[int]bool{}
	for _, k := range prev {
		if !g.keptLegal(k) {
			continue
		}
		periods[k.Period] = true
		days[b.dayFirst[k.Period]] = true
	}
	held := min(want, len(periods))
	if !sec.SameDay {
		held = min(held, len(days))
	}
	if n := int64(len(prev) - held); n > 0 {
		b.add(CritMoved, n, n)
	}
}

// keptLegal reports whether a legal meeting of the section can sit at kept
// placement k's start period and room.
func (g *gridPlaces) keptLegal(k Placement) bool {
	if k.Time != 0 || !g.spanOK(k.Period) || !g.peopleOK(k.Period) {
		return false
	}
	if g.sec.NoRoom {
		return k.Room == ""
	}
	if k.Room == "" {
		return false
	}
	c, ok := g.rooms.byID(g.b, k.Room)
	if !ok {
		return false
	}
	_, free := g.roomAt(&c, k.Period)
	return free
}

// movedPattern bounds the moved meetings of pattern section sec: its one
// placement (no period, a meeting time and a room) holds at most one kept
// meeting, and only one whose meeting time is legal (legal[time-1]) in
// its room (roomOK). A nil legal means no placement is legal.
func (b *bounder) movedPattern(sec *Section, legal []bool, roomOK func(ci int, room string) bool) {
	prev := b.kept[sec.ID]
	if len(prev) == 0 {
		return
	}
	held := 0
	for _, k := range prev {
		if k.Period == -1 && k.Time >= 1 && k.Time <= len(legal) && legal[k.Time-1] && roomOK(k.Time-1, k.Room) {
			held = 1
		}
	}
	if n := int64(len(prev) - held); n > 0 {
		b.add(CritMoved, n, n)
	}
}
