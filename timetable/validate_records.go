package timetable

import "strconv"

// largeRoom is the capacity above which a room gets a caution to check its
// posted legal occupancy (common practice: few teaching rooms seat more).
const largeRoom = 500

func (v *validator) checkRooms() {
	checkDuplicates(v, v.t.Rooms, "room", "Room", func(r Room) (string, Source) { return r.ID, r.Src })
	if len(v.t.Rooms) == 0 && v.hasRoomsSheet() {
		n := 0
		for _, s := range v.t.Sections {
			if !s.NoRoom {
				n++
			}
		}
		if n > 0 {
			v.ps.errorf(v.sheetPos(shRooms), "the term has no rooms but %s need one — list the rooms on the Rooms sheet, or write \"no room\" in Needs for online sections", countNoun(n, "section"))
		}
	}
	for _, r := range v.t.Rooms {
		switch {
		case r.Capacity < 0 || (r.Capacity == 0 && r.Src.Sheet == ""):
			v.ps.errorf(v.at(r.Src, "Capacity"), "%scapacity %d is not a number of seats — give the room a capacity of at least 1", subjectPrefix(r.Src, "room", r.ID), r.Capacity)
		case r.Capacity > largeRoom:
			v.ps.warnf(v.at(r.Src, "Capacity"), "%scapacity %d is unusually large — check the posted legal occupancy of the room and follow local codes", subjectPrefix(r.Src, "room", r.ID), r.Capacity)
		}
	}
}

func (v *validator) checkStaff() {
	checkDuplicates(v, v.t.Staff, "staff", "Staff ID", func(s Staff) (string, Source) { return s.ID, s.Src })
	used := map[string]bool{}
	for _, s := range v.t.Sections {
		for _, id := range s.Staff {
			used[id] = true
		}
	}
	for _, s := range v.t.Staff {
		if s.MaxPerDay < 0 || s.MaxConsecutive < 0 {
			v.ps.errorf(v.at(s.Src, "Max periods per day"), "%sa limit is negative — leave it blank for no limit", subjectPrefix(s.Src, "staff", s.ID))
		}
		v.checkWeekLimits(s)
		v.checkLunch(s.Lunch, s.Src, subjectPrefix(s.Src, "staff", s.ID))
		if s.ID != "" && !used[s.ID] {
			v.ps.warnf(v.at(s.Src, "Staff ID"), "%sstaff %q teaches no section — list them in a section's Staff or remove the row", subjectPrefix(s.Src, "staff", s.ID), s.ID)
		}
	}
}

func (v *validator) checkCohorts() {
	checkDuplicates(v, v.t.Cohorts, "cohort", "Cohort", func(c Cohort) (string, Source) { return c.ID, c.Src })
	used := map[string]bool{}
	for _, s := range v.t.Sections {
		for _, id := range s.Cohorts {
			used[id] = true
		}
	}
	for _, c := range v.t.Cohorts {
		if c.Size < 0 {
			v.ps.errorf(v.at(c.Src, "Size"), "%ssize %d is negative — give the number of students", subjectPrefix(c.Src, "cohort", c.ID), c.Size)
		}
		v.checkLunch(c.Lunch, c.Src, subjectPrefix(c.Src, "cohort", c.ID))
		if c.ID != "" && !used[c.ID] {
			v.ps.warnf(v.at(c.Src, "Cohort"), "%scohort %q attends no section — list it in a section's Cohorts or remove the row", subjectPrefix(c.Src, "cohort", c.ID), c.ID)
		}
	}
}

// checkUnavailable checks that each row names something that exists and a
// sensible time.
func (v *validator) checkUnavailable() {
	days := map[int]bool{}
	for _, p := range v.t.Periods {
		days[int(p.Day)] = true
	}
	patternDays := DaySet(0)
	for i := range v.t.Sections {
		for _, c := range v.t.Sections[i].Times {
			patternDays |= c.Days
		}
	}
	for _, d := range patternDays.List() {
		days[int(d)] = true
	}
	for _, u := range v.t.Unavailable {
		d := subjectPrefix(u.Src, "unavailability of", u.Who)
		var index map[string]int
		switch u.Kind {
		case WhoStaff:
			index = v.staff
		case WhoRoom:
			index = v.rooms
		case WhoCohort:
			index = v.cohorts
		case WhoSection:
			index = v.sections
		}
		if _, ok := index[u.Who]; !ok {
			if u.Kind == 0 {
				v.ps.errorf(v.at(u.Src, "Who"), "%s%q is not a staff ID, room, cohort or section — correct the name or add it to its sheet", d, u.Who)
			} else {
				v.ps.errorf(v.at(u.Src, "Who"), "%s%s %q is not on the %s sheet — correct the name or add it", d, u.Kind, u.Who, kindSheet(u.Kind))
			}
		}
		if u.To <= u.From {
			v.ps.errorf(v.at(u.Src, "To"), "%sthe time ends at %s, not after it starts at %s — To must be later than From", d, u.To, u.From)
		}
		if !u.Hard && u.Weight < 0 {
			v.ps.errorf(v.at(u.Src, "Strength"), "%sweight %d is negative — write hard or a weight of 0 or more", d, u.Weight)
		}
		switch {
		case len(v.t.Periods) > 0 && patternDays == 0 && !days[int(u.Day)]:
			v.ps.warnf(v.at(u.Src, "Day"), "%sthere are no periods on %s, so this row has no effect — check the day", d, DayName(u.Day))
		case patternDays != 0 && !days[int(u.Day)]:
			v.ps.warnf(v.at(u.Src, "Day"), "%sno period and no meeting time is on %s, so this row has no effect — check the day", d, DayName(u.Day))
		}
		v.checkWeeks(u.Weeks, u.Src, "Weeks", d, true)
	}
}

func kindSheet(k WhoKind) string {
	switch k {
	case WhoStaff:
		return shStaff
	case WhoRoom:
		return shRooms
	case WhoCohort:
		return shCohorts
	}
	return shSections
}

// buildHard marks, per staff member, cohort, room and section, the periods
// made unavailable by hard rows.
func (v *validator) buildHard() {
	v.hardStaff, v.hardCohort = map[string][]bool{}, map[string][]bool{}
	v.hardRoom, v.hardSection = map[string][]bool{}, map[string][]bool{}
	all := v.t.AllWeeks()
	for _, u := range v.t.Unavailable {
		if !u.Hard || u.Weeks != 0 && u.Weeks&all != all {
			continue // rows of some weeks only never make a grid period unavailable every week
		}
		var m map[string][]bool
		switch u.Kind {
		case WhoStaff:
			m = v.hardStaff
		case WhoRoom:
			m = v.hardRoom
		case WhoCohort:
			m = v.hardCohort
		case WhoSection:
			m = v.hardSection
		default:
			continue
		}
		marks := m[u.Who]
		if marks == nil {
			marks = make([]bool, len(v.t.Periods))
			m[u.Who] = marks
		}
		for i, p := range v.t.Periods {
			if u.Covers(p) {
				marks[i] = true
			}
		}
	}
}

// blocked reports whether period p is hard-unavailable for section s or
// anyone who attends it, and names who.
func (v *validator) blocked(s *Section, p int) (string, bool) {
	if v.hardSection[s.ID] != nil && v.hardSection[s.ID][p] {
		return "the section itself", true
	}
	for _, id := range s.Staff {
		if m := v.hardStaff[id]; m != nil && m[p] {
			return "staff " + strconv.Quote(id), true
		}
	}
	for _, id := range s.Cohorts {
		if m := v.hardCohort[id]; m != nil && m[p] {
			return "cohort " + strconv.Quote(id), true
		}
	}
	return "", false
}

func (v *validator) checkEnrolments() {
	type pair struct{ student, section string }
	seen := map[pair]int{}
	for _, e := range v.t.Enrolments {
		d := subjectPrefix(e.Src, "enrolment of", e.Student)
		if e.Student == "" && e.Src.Sheet == "" {
			v.ps.errorf(Position{}, "%san enrolment has a blank student — give every enrolment a student ID", d)
		}
		if e.Section == "" {
			continue // the reader has reported the blank cell
		}
		if _, ok := v.sections[e.Section]; !ok {
			v.ps.errorf(v.at(e.Src, "Section"), "%ssection %q is not on the Sections sheet — correct the ID or add the section", d, e.Section)
			continue
		}
		k := pair{e.Student, e.Section}
		if row, dup := seen[k]; dup {
			v.ps.warnf(v.at(e.Src, "Section"), "%sstudent %q is enrolled in section %q again (first in row %d) — delete the repeat", d, e.Student, e.Section, row)
		}
		seen[k] = e.Src.Row
	}
}

func (v *validator) checkRelations() {
	for _, r := range v.t.Relations {
		d := subjectPrefix(r.Src, "relation", r.Kind.String())
		if r.Kind < SameTime || r.Kind > MaxBlock {
			v.ps.errorf(v.at(r.Src, "Kind"), "%sthe kind is not a relation — use one of %s", d, quoteList(relationNames()))
			continue
		}
		if len(r.Sections) < 2 {
			v.ps.errorf(v.at(r.Src, "Sections"), "%sa %s relation needs at least two sections but lists %d — list two or more section IDs", d, r.Kind, len(r.Sections))
		}
		if unk := unknownIDs(r.Sections, v.sections); len(unk) > 0 {
			v.ps.errorf(v.at(r.Src, "Sections"), "%ssection %s %s not on the Sections sheet — correct the ID or add the section", d, idList(unk), isAre(len(unk)))
			continue
		}
		if rep := repeated(r.Sections); len(rep) > 0 {
			v.ps.warnf(v.at(r.Src, "Sections"), "%ssection %s is listed more than once — list each section once", d, idList(rep))
		}
		if !r.Hard && r.Weight < 0 {
			v.ps.errorf(v.at(r.Src, "Strength"), "%sweight %d is negative — write hard or a weight of 0 or more", d, r.Weight)
		}
		v.checkRelationNumbers(r, d)
		if r.Kind == SameTime && len(r.Sections) > 1 {
			a := v.t.Sections[v.sections[r.Sections[0]]]
			for _, id := range r.Sections[1:] {
				b := v.t.Sections[v.sections[id]]
				if a.UsesTimes() || b.UsesTimes() {
					break // meeting patterns have no grid shape to compare
				}
				if a.Meetings != b.Meetings || a.Length != b.Length {
					v.ps.errorf(v.at(r.Src, "Sections"), "%ssections %q (%d × %d periods) and %q (%d × %d periods) cannot meet at the same time — give them the same meetings per week and periods per meeting", d, a.ID, a.Meetings, a.Length, b.ID, b.Meetings, b.Length)
					break
				}
			}
		}
	}
}

func (v *validator) checkWeights() {
	for _, name := range sortedNames(v.t.Weights) {
		w := v.t.Weights[name]
		known := false
		for _, c := range Criteria {
			known = known || c.Name == name
		}
		if !known {
			v.ps.errorf(v.at(w.Src, "Criterion"), "criterion %q is not known — use one of %s", name, quoteList(criterionNames()))
			continue
		}
		if w.Weight < 0 {
			v.ps.errorf(v.at(w.Src, "Weight"), "%sweight %d is negative — write 0 to switch the criterion off or a positive whole number", subjectPrefix(w.Src, "criterion", name), w.Weight)
		}
	}
}
