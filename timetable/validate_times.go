package timetable

import (
	"fmt"
	"strconv"
)

// This file checks the parts of a term that meeting patterns brought:
// meeting times, room choices, travel, weekly limits and lunch breaks, and
// the numbers of relations.

// timeStep is the step of meeting-time starts and lengths, in minutes
// (common practice in registrars' meeting patterns; it keeps the encoding's
// time points few).
const timeStep = 5

// checkPatternSection checks a section that chooses among meeting times.
func (v *validator) checkPatternSection(s *Section, d string) {
	if len(s.Fixed) > 0 {
		v.ps.errorf(v.at(s.Src, "Fixed"), "%sfixed meetings are for sections on the Periods grid, and this section has rows on the %s sheet — list only the fixed time there, or clear Fixed", d, shTimes)
	}
	type key struct {
		days    DaySet
		start   Clock
		minutes int
		weeks   WeekSet
	}
	seen := map[key]Source{}
	for _, c := range s.Times {
		v.checkChoice(s, c, d)
		k := key{c.Days, c.Start, c.Minutes, c.Weeks}
		if first, dup := seen[k]; dup {
			v.ps.errorf(v.at(c.Src, "Days"), "%sthe meeting time %s is listed twice for section %q%s — delete one of the rows", d, choiceLabel(c), s.ID, rowNote(first))
			continue
		}
		seen[k] = c.Src
	}
	v.checkRoomChoices(s, d)
	v.checkSectionRoom(s, d)
	v.checkPlaceable(s, d)
}

// checkChoice checks one meeting time of section s.
func (v *validator) checkChoice(s *Section, c TimeChoice, d string) {
	if c.Days == 0 {
		v.ps.errorf(v.at(c.Src, "Days"), "%sthe meeting time has no days — write the days it meets, e.g. Mon Wed Fri", d)
	}
	switch {
	case c.Minutes < timeStep:
		v.ps.errorf(v.at(c.Src, "Minutes"), "%sa meeting of %s is too short — meetings last at least %d minutes, in %d-minute steps", d, countNoun(c.Minutes, "minute"), timeStep, timeStep)
	case c.Minutes%timeStep != 0:
		v.ps.errorf(v.at(c.Src, "Minutes"), "%sMinutes %d is not a multiple of %d — meeting times go in %d-minute steps; write %d or %d", d, c.Minutes, timeStep, timeStep, c.Minutes/timeStep*timeStep, (c.Minutes/timeStep+1)*timeStep)
	}
	switch {
	case c.Start < 0 || c.Start >= 24*60:
		v.ps.errorf(v.at(c.Src, "Start"), "%sthe start %s is not a time of day — write HH:MM from 00:00 to 23:55", d, c.Start)
	case c.Start%timeStep != 0:
		v.ps.errorf(v.at(c.Src, "Start"), "%sthe start %s is not on a %d-minute step — write %s or %s", d, c.Start, timeStep, c.Start/timeStep*timeStep, (c.Start/timeStep+1)*timeStep)
	case c.Minutes >= timeStep && c.End() > 24*60:
		v.ps.errorf(v.at(c.Src, "Minutes"), "%sa meeting from %s for %s would end after midnight — start earlier or shorten it", d, c.Start, countNoun(c.Minutes, "minute"))
	}
	if c.Weeks == 0 {
		v.ps.errorf(v.at(c.Src, "Weeks"), "%sthe meeting time is in no teaching week — write all, odd, even or a list of weeks", d)
	} else {
		v.checkWeeks(c.Weeks, c.Src, "Weeks", d, false)
	}
	if c.Weight < 0 {
		v.ps.errorf(v.at(c.Src, "Weight"), "%sweight %d is negative — write 0 for a fully acceptable time or a positive whole number for a less wanted one", d, c.Weight)
	}
}

// checkWeeks reports teaching weeks outside the term (0 is every week when
// zeroOK).
func (v *validator) checkWeeks(w WeekSet, src Source, header, d string, zeroOK bool) {
	if !v.datesOK || w == 0 && zeroOK {
		return
	}
	if out := w &^ v.t.AllWeeks(); out != 0 {
		v.ps.errorf(v.at(src, header), "%sweeks %s are outside the term, which has %s — use weeks 1 to %d", d, out.Ranges(), countNoun(v.t.TeachingWeeks(), "teaching week"), v.t.TeachingWeeks())
	}
}

// checkRoomChoices checks a section's room choices: known rooms that can
// hold it, each once, with weights of 0 or more.
func (v *validator) checkRoomChoices(s *Section, d string) {
	if len(s.RoomChoices) == 0 {
		return
	}
	if len(s.Rooms) > 0 {
		v.ps.warnf(v.at(s.Src, "Rooms"), "%sthe Rooms list is not used: the section's rows on the %s sheet are its list of rooms — clear Rooms or those rows", d, shRoomChoices)
	}
	seen := map[string]Source{}
	for _, c := range s.RoomChoices {
		if s.NoRoom {
			v.ps.errorf(v.at(c.Src, "Room"), "%ssection %q takes no room (\"no room\" on the Sections sheet) but has room choices — delete this row or the \"no room\" mark", d, s.ID)
			return
		}
		if first, dup := seen[c.Room]; dup {
			v.ps.errorf(v.at(c.Src, "Room"), "%sroom %q is listed again for section %q%s — keep one of the rows", d, c.Room, s.ID, rowNote(first))
			continue
		}
		seen[c.Room] = c.Src
		if c.Weight < 0 {
			v.ps.errorf(v.at(c.Src, "Weight"), "%sweight %d is negative — write 0 for a fully acceptable room or a positive whole number for a less wanted one", d, c.Weight)
		}
		i, ok := v.rooms[c.Room]
		if !ok {
			v.ps.errorf(v.at(c.Src, "Room"), "%sroom %q is not on the Rooms sheet — correct the room or add it", d, c.Room)
			continue
		}
		if why, ok := v.suits(&v.t.Rooms[i], s); !ok {
			v.ps.errorf(v.at(c.Src, "Room"), "%sroom %q cannot hold section %q: %s — choose another room, or change the section", d, c.Room, s.ID, why)
		}
	}
}

// blocksChoice reports whether hard unavailability u shares a minute of a
// common day and week with a meeting of choice c.
func blocksChoice(u Unavailability, c TimeChoice) bool {
	return c.Days.Has(u.Day) && (u.Weeks == 0 || u.Weeks.Overlaps(c.Weeks)) && u.From < c.End() && c.Start < u.To
}

// checkPlaceable reports a pattern section none of whose meeting times can
// be used: each meets when the section, a member of its staff or one of
// its cohorts is unavailable (hard), or when no room that can hold it is
// free. It proves that no timetable exists, so it is an error.
func (v *validator) checkPlaceable(s *Section, d string) {
	var rooms []*Room
	if !s.NoRoom {
		for i := range v.t.Rooms {
			if v.fits(&v.t.Rooms[i], s) {
				rooms = append(rooms, &v.t.Rooms[i])
			}
		}
		if len(rooms) == 0 {
			return // no room can hold it: reported by the room checks
		}
	}
	first := ""
	for _, c := range s.Times {
		if c.Days == 0 || c.Weeks == 0 {
			return // reported on the row
		}
		if who := v.choiceBlockedFor(s, c); who != "" {
			if first == "" {
				first = fmt.Sprintf("%s (row %d) when %s is unavailable", choiceLabel(c), c.Src.Row, who)
			}
			continue
		}
		if s.NoRoom || v.freeRoom(rooms, c) {
			return
		}
		if first == "" {
			first = fmt.Sprintf("%s (row %d) when no room that can hold it is free", choiceLabel(c), c.Src.Row)
		}
	}
	v.ps.errorf(v.at(s.Src, "Section"), "%ssection %q cannot be placed: every one of its %s falls in a hard unavailability (the first, %s) — add a meeting time on the %s sheet or change the Unavailable sheet", d, s.ID, countNoun(len(s.Times), "meeting time"), first, shTimes)
}

// choiceBlockedFor names who makes choice c of s unusable, or "".
func (v *validator) choiceBlockedFor(s *Section, c TimeChoice) string {
	if v.blocks(WhoSection, s.ID, c) {
		return "the section itself"
	}
	for _, id := range s.Staff {
		if v.blocks(WhoStaff, id, c) {
			return "staff " + strconv.Quote(id)
		}
	}
	for _, id := range s.Cohorts {
		if v.blocks(WhoCohort, id, c) {
			return "cohort " + strconv.Quote(id)
		}
	}
	return ""
}

// freeRoom reports whether some room of rooms has no hard unavailability
// during choice c.
func (v *validator) freeRoom(rooms []*Room, c TimeChoice) bool {
	for _, r := range rooms {
		if !v.blocks(WhoRoom, r.ID, c) {
			return true
		}
	}
	return false
}

// whoKey names a staff member, room, cohort or section.
type whoKey struct {
	kind WhoKind
	id   string
}

// blocks reports whether a hard unavailability of (kind, id) meets choice c.
// The rows are indexed by who on first use.
func (v *validator) blocks(kind WhoKind, id string, c TimeChoice) bool {
	if v.hardRows == nil {
		v.hardRows = map[whoKey][]Unavailability{}
		for _, u := range v.t.Unavailable {
			if u.Hard {
				k := whoKey{u.Kind, u.Who}
				v.hardRows[k] = append(v.hardRows[k], u)
			}
		}
	}
	for _, u := range v.hardRows[whoKey{kind, id}] {
		if blocksChoice(u, c) {
			return true
		}
	}
	return false
}

// checkTravel checks the Travel rows: known places, sensible minutes, no
// pair twice.
func (v *validator) checkTravel() {
	buildings := map[string]bool{}
	for _, r := range v.t.Rooms {
		if r.Building != "" {
			buildings[r.Building] = true
		}
	}
	type pair struct{ a, b string }
	seen := map[pair]Source{}
	for _, tr := range v.t.Travel {
		d := subjectPrefix(tr.Src, "travel from", tr.From)
		bad := false
		for _, h := range []struct{ place, col string }{{tr.From, "From"}, {tr.To, "To"}} {
			if _, room := v.rooms[h.place]; !room && !buildings[h.place] && h.place != "" {
				v.ps.errorf(v.at(tr.Src, h.col), "%s%q is neither a room nor a building on the Rooms sheet — correct the name, or fill in the rooms' Building column", d, h.place)
				bad = true
			}
		}
		if tr.Minutes < 0 || tr.Minutes > 24*60 {
			v.ps.errorf(v.at(tr.Src, "Minutes"), "%stravel time %d is out of range — write the minutes, from 0 to 1440", d, tr.Minutes)
		}
		if bad {
			continue
		}
		if _, room := v.rooms[tr.From]; room && tr.From == tr.To {
			v.ps.errorf(v.at(tr.Src, "To"), "%sa travel time from room %q to itself has no effect — name another room or a building", d, tr.From)
			continue
		}
		k := pair{min(tr.From, tr.To), max(tr.From, tr.To)}
		if first, dup := seen[k]; dup {
			v.ps.errorf(v.at(tr.Src, "From"), "%sthe travel time between %q and %q is given again%s — keep one of the rows (the time holds both ways)", d, tr.From, tr.To, rowNote(first))
			continue
		}
		seen[k] = tr.Src
	}
}

// checkWeekLimits checks the weekly limits of a member of staff.
func (v *validator) checkWeekLimits(s Staff) {
	d := subjectPrefix(s.Src, "staff", s.ID)
	for _, l := range []struct {
		n      int
		col    string
		hi     int
		unit   string
		single string
	}{
		{s.MaxWeekPeriods, "Max periods per week", 10_000, "periods", ""},
		{s.MaxWeekMinutes, "Max minutes per week", 7 * 24 * 60, "minutes", ""},
		{s.MaxWeekDays, "Max days per week", 7, "days", ""},
	} {
		if l.n < 0 || l.n > l.hi {
			v.ps.errorf(v.at(s.Src, l.col), "%s%s %d is out of range — write a whole number of %s from 1 to %d, or leave it blank for no limit", d, l.col, l.n, l.unit, l.hi)
		}
	}
}

// checkLunch checks a lunch break: a window that is a time of day, and no
// more free minutes than the window holds.
func (v *validator) checkLunch(l LunchBreak, src Source, d string) {
	if !l.Set() && l.From == 0 && l.To == 0 {
		return
	}
	switch {
	case l.Minutes < 0 || !l.Set():
		v.ps.errorf(v.at(src, "Lunch minutes"), "%sthe lunch break has %d free minutes — write at least 1, or clear the lunch cells", d, l.Minutes)
	case l.From < 0 || l.To > 24*60 || l.To <= l.From:
		v.ps.errorf(v.at(src, "Lunch to"), "%sthe lunch window %s–%s does not end after it starts — Lunch to must be later than Lunch from", d, l.From, l.To)
	case l.Minutes > int(l.To-l.From):
		v.ps.errorf(v.at(src, "Lunch minutes"), "%s%s of lunch do not fit in the window %s–%s — widen the window or lower Lunch minutes", d, countNoun(l.Minutes, "minute"), l.From, l.To)
	}
}

// checkRelationNumbers checks N and M of a relation against its kind.
func (v *validator) checkRelationNumbers(r Relation, d string) {
	for i, h := range []string{"N", "M"} {
		x := r.N
		if i == 1 {
			x = r.M
		}
		if i >= r.Kind.Params() {
			if x != 0 {
				v.ps.errorf(v.at(r.Src, h), "%sa %s relation takes no %s but has %d — clear it (only %s take it)", d, r.Kind, h, x, kindsTaking(i))
			}
			continue
		}
		if lo, hi := paramRange(r.Kind, i); x < lo || x > hi {
			v.ps.errorf(v.at(r.Src, h), "%s%s %d is out of range for a %s relation — write %s, from %d to %d", d, h, x, r.Kind, paramWhat(r.Kind, i), lo, hi)
		}
	}
}
