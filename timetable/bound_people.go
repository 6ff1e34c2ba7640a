package timetable

// people adds the bounds on cohort isolated periods and staff days, which
// count meetings only (they hold for every place of them).
//
// Cohort isolated: let s be a grid section of the cohort with one-period
// meetings on m different days (not SameDay, or a single meeting), and N
// the other grid meetings of the cohort's sections. A meeting of s is not
// isolated only when the period right before or after it is busy for the
// cohort, that is taken by a meeting of another section on the same day
// (not by s itself: its meetings are on different days; pattern meetings
// occupy no periods). Sending each such meeting of s to one such other
// meeting is one to one, since the meetings of s are on different days. So
// at least m − N of them are isolated, and they are distinct busy periods
// (different days). The largest m − N over the cohort's sections is kept.
//
// Staff days: a staff member with a grid meeting is busy on at least one
// day, and on at least m days for each of their grid sections whose m
// meetings fall on different days. Also, the grid meetings of their
// sections that meet in a common week w occupy different periods (Check:
// no one is in two meetings of sections with overlapping weeks at a
// common period, and a section's meetings never overlap), so they are
// busy for at least the sum of those meetings' periods, at most the
// longest day's periods (or MaxPerDay) a day.
func (b *bounder) people() {
	t := b.t
	cohorts := t.CohortIndex()
	staff := t.StaffIndex()
	secsOfCohort := make([][]int, len(t.Cohorts))
	secsOfStaff := make([][]int, len(t.Staff))
	for si := range t.Sections {
		sec := &t.Sections[si]
		if sec.UsesTimes() {
			continue
		}
		for _, id := range occUnique(sec.Cohorts) {
			if k, ok := cohorts[id]; ok {
				secsOfCohort[k] = append(secsOfCohort[k], si)
			}
		}
		for _, id := range occUnique(sec.Staff) {
			if k, ok := staff[id]; ok {
				secsOfStaff[k] = append(secsOfStaff[k], si)
			}
		}
	}
	for k := range t.Cohorts {
		if cohorts[t.Cohorts[k].ID] != k {
			continue // a repeated ID: its sections are the first one's
		}
		total := 0
		for _, si := range secsOfCohort[k] {
			total += max(1, t.Sections[si].Meetings)
		}
		var most int64
		for _, si := range secsOfCohort[k] {
			sec := &t.Sections[si]
			m := max(1, sec.Meetings)
			if occLength(sec) != 1 || sec.SameDay && m > 1 {
				continue
			}
			most = max(most, int64(m-(total-m)))
		}
		b.add(CritCohortIsolated, most, most)
	}
	dayMost := 0 // periods in the longest day
	for p := 0; p < len(t.Periods); p = b.dayLast[p] + 1 {
		dayMost = max(dayMost, b.dayLast[p]-p+1)
	}
	for k := range t.Staff {
		if staff[t.Staff[k].ID] != k {
			continue
		}
		var most int64
		var perWeek [64]int
		for _, si := range secsOfStaff[k] {
			sec := &t.Sections[si]
			m := int64(1)
			if !sec.SameDay {
				m = int64(max(1, sec.Meetings))
			}
			most = max(most, m)
			w := sectionWeeks(sec)
			for i := range perWeek {
				if w&(1<<i) != 0 {
					perWeek[i] += max(1, sec.Meetings) * occLength(sec)
				}
			}
		}
		perDay := dayMost
		if lim := t.Staff[k].MaxPerDay; lim > 0 {
			perDay = min(perDay, lim)
		}
		if perDay > 0 {
			for _, n := range perWeek {
				most = max(most, int64((n+perDay-1)/perDay))
			}
		}
		b.add(CritStaffDays, most, most)
	}
}

// unplaced adds the course requests that no timetable can meet: neither
// their course nor any alternative is taught by a section (Cost counts a
// request whose course is unknown as unplaced).
func (b *bounder) unplaced() {
	t := b.t
	if len(t.Requests) == 0 {
		return
	}
	taught := map[string]bool{}
	for i := range t.Sections {
		if c := t.Sections[i].Course; c != "" {
			taught[c] = true
		}
	}
	var n int64
	for _, r := range t.Requests {
		met := taught[r.Course]
		for _, a := range r.Alternatives {
			met = met || taught[a]
		}
		if !met {
			n++
		}
	}
	b.add(CritUnplaced, n, n)
}
