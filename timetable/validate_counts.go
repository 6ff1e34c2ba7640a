package timetable

import (
	"time"
)

// weeklyNeeds returns, per ID named by ids(s) over all sections, the most
// periods needed in any one teaching week: a lower bound on the distinct
// periods of the weekly grid that ID must spend in class, since sections
// meeting in disjoint weeks may share a period.
func (v *validator) weeklyNeeds(ids func(*Section) []string) map[string]int {
	perWeek := map[string]*[64]int{}
	for i := range v.t.Sections {
		s := &v.t.Sections[i]
		if s.UsesTimes() || s.Meetings < 1 || s.Length < 1 {
			continue // pattern sections take no grid periods
		}
		load := s.Meetings * s.Length
		for _, id := range ids(s) {
			pw := perWeek[id]
			if pw == nil {
				pw = new([64]int)
				perWeek[id] = pw
			}
			for w := 0; w < 64; w++ {
				if s.Weeks&(1<<w) != 0 {
					pw[w] += load
				}
			}
		}
	}
	out := make(map[string]int, len(perWeek))
	for id, pw := range perWeek {
		best := 0
		for _, n := range pw {
			best = max(best, n)
		}
		out[id] = best
	}
	return out
}

// available counts the periods not marked in hard, with at most perDay of
// them on any one day (0 = no limit).
func (v *validator) available(hard []bool, perDay int) int {
	byDay := map[time.Weekday]int{}
	for i, p := range v.t.Periods {
		if hard == nil || !hard[i] {
			byDay[p.Day]++
		}
	}
	n := 0
	for _, c := range byDay {
		if perDay > 0 {
			c = min(c, perDay)
		}
		n += c
	}
	return n
}

// checkLoads applies counting arguments that prove infeasibility early: a
// staff member or cohort who must be in more periods a week than they are
// available, and more room-taking meeting periods than room periods.
func (v *validator) checkLoads() {
	if len(v.t.Periods) == 0 {
		return
	}
	staffNeed := v.weeklyNeeds(func(s *Section) []string { return uniqueIDs(s.Staff) })
	for _, st := range v.t.Staff {
		need := staffNeed[st.ID]
		if have := v.available(v.hardStaff[st.ID], st.MaxPerDay); st.ID != "" && need > have {
			v.ps.errorf(v.at(st.Src, "Staff ID"), "staff %q must teach %s in some week but is available for only %d (the grid less hard unavailability and the daily limit) — give some sections to other staff or lift an unavailability", st.ID, countNoun(need, "period"), have)
		} else if st.ID != "" && st.MaxWeekPeriods > 0 && need > st.MaxWeekPeriods {
			v.ps.errorf(v.at(st.Src, "Max periods per week"), "staff %q must teach %s in some week but Max periods per week is %d — give some sections to other staff or raise the limit (as the contract allows)", st.ID, countNoun(need, "period"), st.MaxWeekPeriods)
		}
	}
	cohortNeed := v.weeklyNeeds(func(s *Section) []string { return uniqueIDs(s.Cohorts) })
	for _, c := range v.t.Cohorts {
		need := cohortNeed[c.ID]
		if have := v.available(v.hardCohort[c.ID], 0); c.ID != "" && need > have {
			v.ps.errorf(v.at(c.Src, "Cohort"), "cohort %q must attend %s in some week but is available for only %d — remove it from some sections or lift an unavailability", c.ID, countNoun(need, "period"), have)
		}
	}
	if len(v.t.Rooms) == 0 {
		return
	}
	need := v.weeklyNeeds(func(s *Section) []string {
		if s.NoRoom {
			return nil
		}
		return []string{""}
	})[""]
	have := 0
	for _, r := range v.t.Rooms {
		have += v.available(v.hardRoom[r.ID], 0)
	}
	if need > have {
		v.ps.errorf(v.sheetPos(shRooms), "the sections need %s of room time in some week but the rooms offer only %d — add rooms or periods, or mark online sections \"no room\"", countNoun(need, "period"), have)
	}
}

// fixedUse is one fixed meeting occupying one period.
type fixedUse struct {
	sec   *Section
	fixed Fixed
}

// checkFixedTogether looks at fixed meetings that occupy the same period in
// a common week: no staff member, cohort or room may be in two at once, and
// there must be enough rooms for those that take one.
func (v *validator) checkFixedTogether() {
	byPeriod := make([][]fixedUse, len(v.t.Periods))
	for i := range v.t.Sections {
		s := &v.t.Sections[i]
		if s.UsesTimes() {
			continue // fixed meetings are for grid sections (refused by checkSections)
		}
		for _, f := range s.Fixed {
			p := v.t.PeriodAt(f.Day, f.Start)
			if p < 0 {
				continue
			}
			span, ok := v.t.Span(p, s.Length)
			if !ok {
				continue
			}
			for _, q := range span {
				byPeriod[q] = append(byPeriod[q], fixedUse{s, f})
			}
		}
	}
	reported := map[string]bool{}
	for p, uses := range byPeriod {
		if len(uses) < 2 {
			continue
		}
		v.checkFixedClashes(p, uses, reported)
		v.checkFixedRooms(p, uses, reported)
	}
}

func (v *validator) checkFixedClashes(p int, uses []fixedUse, reported map[string]bool) {
	for j := 1; j < len(uses); j++ {
		b := uses[j]
		for i := 0; i < j; i++ {
			a := uses[i]
			if a.sec == b.sec || !a.sec.Weeks.Overlaps(b.sec.Weeks) {
				continue
			}
			what := sharedName(a, b)
			if what == "" {
				continue
			}
			key := a.sec.ID + "\x00" + b.sec.ID + "\x00" + what
			if reported[key] {
				continue
			}
			reported[key] = true
			v.ps.errorf(v.at(b.sec.Src, "Fixed"), "%sfixed meeting %q clashes with the fixed meeting %q of section %q at %s: both need %s — move one of them", subjectPrefix(b.sec.Src, "section", b.sec.ID), fixedLabel(b.fixed), fixedLabel(a.fixed), a.sec.ID, v.t.Periods[p].Label(), what)
		}
	}
}

// sharedName names a staff member, cohort or room both fixed meetings need.
func sharedName(a, b fixedUse) string {
	for _, x := range a.sec.Staff {
		for _, y := range b.sec.Staff {
			if x == y {
				return "staff " + Quote(x)
			}
		}
	}
	for _, x := range a.sec.Cohorts {
		for _, y := range b.sec.Cohorts {
			if x == y {
				return "cohort " + Quote(x)
			}
		}
	}
	if a.fixed.Room != "" && a.fixed.Room == b.fixed.Room && !a.sec.NoRoom && !b.sec.NoRoom {
		return "room " + Quote(a.fixed.Room)
	}
	return ""
}

// checkFixedRooms compares, per week, the fixed room-taking meetings in
// period p with the rooms not hard-unavailable then that suit at least one
// of them.
func (v *validator) checkFixedRooms(p int, uses []fixedUse, reported map[string]bool) {
	var prev []int // indexes into uses of the meetings active in the week before
	for w := 0; w < 64; w++ {
		var idx []int
		for i, u := range uses {
			if !u.sec.NoRoom && u.sec.Weeks&(1<<w) != 0 {
				idx = append(idx, i)
			}
		}
		if len(idx) < 2 || sameIndexes(idx, prev) {
			prev = idx
			continue
		}
		prev = idx
		active := make([]fixedUse, len(idx))
		for i, j := range idx {
			active[i] = uses[j]
		}
		free := 0
		for i := range v.t.Rooms {
			r := &v.t.Rooms[i]
			if m := v.hardRoom[r.ID]; m != nil && m[p] {
				continue
			}
			for _, u := range active {
				if v.fits(r, u.sec) {
					free++
					break
				}
			}
			if free >= len(active) {
				break // enough rooms; no need to count further
			}
		}
		if len(active) > free {
			key := "rooms\x00" + itoa(p)
			if reported[key] {
				return
			}
			reported[key] = true
			last := active[len(active)-1]
			v.ps.errorf(v.at(last.sec.Src, "Fixed"), "%s%d fixed meetings take place at %s but only %s can hold them — move some fixed meetings to other times", subjectPrefix(last.sec.Src, "section", last.sec.ID), len(active), v.t.Periods[p].Label(), countNoun(free, "room"))
			return
		}
	}
}

func sameIndexes(a, b []int) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		if a[i] != b[i] {
			return false
		}
	}
	return true
}

// uniq returns list without repeated IDs (a repeat is a warning elsewhere and
// must not double a load).
func uniqueIDs(list []string) []string {
	if len(list) < 2 {
		return list
	}
	out := make([]string, 0, len(list))
	for i, x := range list {
		dup := false
		for _, y := range list[:i] {
			dup = dup || x == y
		}
		if !dup {
			out = append(out, x)
		}
	}
	return out
}
