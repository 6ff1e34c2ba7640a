package timetable

import (
	"fmt"
	"strings"
)

func (v *validator) checkSections() {
	checkDuplicates(v, v.t.Sections, "section", "Section", func(s Section) (string, Source) { return s.ID, s.Src })
	for i := range v.t.Sections {
		s := &v.t.Sections[i]
		d := subjectPrefix(s.Src, "section", s.ID)
		v.checkSectionRefs(s, d)
		if s.UsesTimes() {
			v.checkPatternSection(s, d)
			continue
		}
		v.checkRoomChoices(s, d)
		if s.Meetings < 1 || s.Length < 1 {
			v.ps.errorf(v.at(s.Src, "Meetings per week"), "%smeetings per week and periods per meeting must be at least 1 — correct them", d)
			continue
		}
		v.checkSectionFit(s, d)
		v.checkSectionWeeks(s, d)
		v.checkSectionRoom(s, d)
		v.checkFixed(s, d)
	}
}

func (v *validator) checkSectionRefs(s *Section, d string) {
	if unk := unknownIDs(s.Staff, v.staff); len(unk) > 0 {
		v.ps.errorf(v.at(s.Src, "Staff"), "%sstaff %s %s not on the Staff sheet — add them to Staff or correct the ID", d, idList(unk), isAre(len(unk)))
	}
	if rep := repeated(s.Staff); len(rep) > 0 {
		v.ps.warnf(v.at(s.Src, "Staff"), "%sstaff %s is listed more than once — list each person once", d, idList(rep))
	}
	if unk := unknownIDs(s.Cohorts, v.cohorts); len(unk) > 0 {
		v.ps.errorf(v.at(s.Src, "Cohorts"), "%scohort %s %s not on the Cohorts sheet — add it to Cohorts or correct the ID", d, idList(unk), isAre(len(unk)))
	}
	if rep := repeated(s.Cohorts); len(rep) > 0 {
		v.ps.warnf(v.at(s.Src, "Cohorts"), "%scohort %s is listed more than once — list each cohort once", d, idList(rep))
	}
	if unk := unknownIDs(s.Rooms, v.rooms); len(unk) > 0 {
		v.ps.errorf(v.at(s.Src, "Rooms"), "%sroom %s %s not on the Rooms sheet — add it to Rooms or correct the ID", d, idList(unk), isAre(len(unk)))
	}
	if s.Size < 0 {
		v.ps.errorf(v.at(s.Src, "Expected size"), "%sexpected size %d is negative — give the number of students", d, s.Size)
	}
	if s.SameDay && s.MinDays > s.Meetings {
		v.ps.warnf(v.at(s.Src, "Min days"), "%sMin days %d is more than the %s, so it can never be met — lower it to at most %d", d, s.MinDays, countNoun(s.Meetings, "meeting"), s.Meetings)
	}
}

// checkSectionFit checks that a meeting fits a run of consecutive periods
// and that meetings on different days have enough days.
func (v *validator) checkSectionFit(s *Section, d string) {
	if len(v.t.Periods) == 0 {
		return
	}
	if s.Length > v.maxRun {
		v.ps.errorf(v.at(s.Src, "Periods per meeting"), "%sa meeting of %s does not fit: the longest run of consecutive periods is %d — shorten the meeting or make periods touch on the Periods sheet", d, countNoun(s.Length, "period"), v.maxRun)
		return
	}
	if !s.SameDay {
		if n := v.daysWithRun(s.Length); s.Meetings > n {
			v.ps.errorf(v.at(s.Src, "Meetings per week"), "%s%s must fall on different days but only %s room for a %d-period meeting — reduce the meetings or set Min days to let meetings share a day", d, countNoun(s.Meetings, "meeting"), daysHave(n), s.Length)
		}
	}
}

func daysHave(n int) string {
	if n == 1 {
		return "1 day has"
	}
	return fmt.Sprintf("%d days have", n)
}

func (v *validator) checkSectionWeeks(s *Section, d string) {
	if s.Weeks == 0 {
		v.ps.errorf(v.at(s.Src, "Weeks"), "%sthe section meets in no teaching week — write all, odd, even or a list of weeks", d)
		return
	}
	if !v.datesOK {
		return
	}
	if out := s.Weeks &^ v.t.AllWeeks(); out != 0 {
		v.ps.errorf(v.at(s.Src, "Weeks"), "%sweeks %s are outside the term, which has %s — use weeks 1 to %d", d, out.Ranges(), countNoun(v.t.TeachingWeeks(), "teaching week"), v.t.TeachingWeeks())
	}
}

// roomAllowed reports whether room id is in the section's room choices, or
// when it has none in its allowed list (an empty list allows every room).
func roomAllowed(s *Section, id string) bool {
	if len(s.RoomChoices) > 0 {
		for _, c := range s.RoomChoices {
			if c.Room == id {
				return true
			}
		}
		return false
	}
	if len(s.Rooms) == 0 {
		return true
	}
	for _, r := range s.Rooms {
		if r == id {
			return true
		}
	}
	return false
}

// suits reports whether room r can hold section s, and if not, why.
func (v *validator) suits(r *Room, s *Section) (string, bool) {
	switch {
	case !roomAllowed(s, r.ID) && len(s.RoomChoices) > 0:
		return "it is not among the section's room choices", false
	case !roomAllowed(s, r.ID):
		return "it is not in the section's Rooms list", false
	case !r.HasFeatures(s.Needs):
		return "it lacks " + strings.Join(s.Needs, ", "), false
	case !v.t.SoftCapacity && r.Capacity < s.Size:
		return fmt.Sprintf("it seats %d, fewer than the %d expected", r.Capacity, s.Size), false
	}
	return "", true
}

// fits reports whether room r can hold section s (suits without the reason).
func (v *validator) fits(r *Room, s *Section) bool {
	return roomAllowed(s, r.ID) && r.HasFeatures(s.Needs) && (v.t.SoftCapacity || r.Capacity >= s.Size)
}

// checkSectionRoom checks that some room can hold the section.
func (v *validator) checkSectionRoom(s *Section, d string) {
	if s.NoRoom || len(v.t.Rooms) == 0 {
		return // no rooms at all is reported once, by checkRooms
	}
	if len(s.RoomChoices) > 0 {
		return // each choice is checked on its own row (checkRoomChoices)
	}
	largest, any := v.largestRoom(s)
	if !any {
		if len(s.Rooms) > 0 && len(unknownIDs(s.Rooms, v.rooms)) == len(s.Rooms) {
			return // every allowed room is unknown, already reported
		}
		col, what := "Needs", "no room has "+strings.Join(s.Needs, ", ")
		if len(s.Rooms) > 0 {
			col, what = "Rooms", "none of the allowed rooms has "+strings.Join(s.Needs, ", ")
		}
		v.ps.errorf(v.at(s.Src, col), "%s%s — change Needs, add the feature to a room, or write \"no room\" for an online section", d, what)
		return
	}
	if !v.t.SoftCapacity && largest < s.Size {
		v.ps.errorf(v.at(s.Src, "Expected size"), "%sno suitable room holds %d students (the largest seats %d) — split the section, lower the expected size or allow a larger room", d, s.Size, largest)
	}
}

// largestRoom returns the largest capacity among the rooms that section s
// may use and that have its features, and whether there is any. Results
// are cached by the section's needs and allowed rooms, which many sections
// share.
func (v *validator) largestRoom(s *Section) (int, bool) {
	key := strings.Join(s.Needs, "\x00") + "\x01" + strings.Join(s.Rooms, "\x00")
	if c, ok := v.largest[key]; ok {
		return c, c >= 0
	}
	best := -1
	for i := range v.t.Rooms {
		r := &v.t.Rooms[i]
		if roomAllowed(s, r.ID) && r.HasFeatures(s.Needs) {
			best = max(best, r.Capacity)
		}
	}
	if v.largest == nil {
		v.largest = map[string]int{}
	}
	v.largest[key] = best
	return best, best >= 0
}

// hasRoomsSheet reports whether a read workbook had a Rooms sheet (its
// absence is already an error of its own).
func (v *validator) hasRoomsSheet() bool {
	if v.lay == nil {
		return true
	}
	for name := range v.lay.cols {
		if normHeader(name) == normHeader(shRooms) {
			return true
		}
	}
	return false
}

// checkFixed checks the pre-assigned meetings of a section.
func (v *validator) checkFixed(s *Section, d string) {
	if len(s.Fixed) == 0 {
		return
	}
	pos := v.at(s.Src, "Fixed")
	if len(s.Fixed) > s.Meetings {
		v.ps.errorf(pos, "%s%s are fixed but the section has only %s — fix at most %d", d, countNoun(len(s.Fixed), "meeting"), countNoun(s.Meetings, "meeting"), s.Meetings)
	}
	usedDay := map[int]string{}
	usedStart := map[int]string{}
	for _, f := range s.Fixed {
		p := v.t.PeriodAt(f.Day, f.Start)
		label := fixedLabel(f)
		if p < 0 {
			v.ps.errorf(pos, "%sfixed meeting %q is not at the start of a period — use a day and start time listed on the Periods sheet", d, label)
			continue
		}
		if _, ok := v.t.Span(p, s.Length); !ok {
			v.ps.errorf(pos, "%sfixed meeting %q cannot hold %s in a row from %s — start it earlier or on another day", d, label, countNoun(s.Length, "period"), f.Start)
		}
		if prev, dup := usedStart[p]; dup {
			v.ps.errorf(pos, "%sfixed meetings %q and %q start at the same time — give each meeting its own time", d, prev, label)
		} else if prev, dup := usedDay[int(f.Day)]; dup && !s.SameDay {
			v.ps.errorf(pos, "%sfixed meetings %q and %q are on the same day but the section's meetings fall on different days — move one, or set Min days", d, prev, label)
		}
		usedStart[p], usedDay[int(f.Day)] = label, label
		if span, ok := v.t.Span(p, s.Length); ok {
			for _, q := range span {
				if who, bad := v.blocked(s, q); bad {
					v.ps.errorf(pos, "%sfixed meeting %q falls in a time when %s is unavailable (hard) — move the meeting or change the Unavailable sheet", d, label, who)
					break
				}
			}
		}
		v.checkFixedRoom(s, f, p, pos, d)
	}
}

func (v *validator) checkFixedRoom(s *Section, f Fixed, p int, pos Position, d string) {
	if f.Room == "" {
		return
	}
	label := fixedLabel(f)
	if s.NoRoom {
		v.ps.errorf(pos, "%sfixed meeting %q names room %q but the section takes no room — remove the room or the \"no room\" mark", d, label, f.Room)
		return
	}
	i, ok := v.rooms[f.Room]
	if !ok {
		v.ps.errorf(pos, "%sfixed meeting %q names room %q, which is not on the Rooms sheet — correct the room or add it", d, label, f.Room)
		return
	}
	r := &v.t.Rooms[i]
	if why, ok := v.suits(r, s); !ok {
		v.ps.errorf(pos, "%sfixed meeting %q names room %q, which cannot hold the section: %s — choose another room", d, label, f.Room, why)
		return
	}
	if span, ok := v.t.Span(p, s.Length); ok {
		for _, q := range span {
			if m := v.hardRoom[r.ID]; m != nil && m[q] {
				v.ps.errorf(pos, "%sfixed meeting %q is in room %q when the room is unavailable (hard) — move the meeting or choose another room", d, label, f.Room)
				break
			}
		}
	}
}

// fixedLabel is "Tue 10:00 R204" (or "Tue 10:00").
func fixedLabel(f Fixed) string {
	s := DayName(f.Day) + " " + f.Start.String()
	if f.Room != "" {
		s += " " + f.Room
	}
	return s
}
