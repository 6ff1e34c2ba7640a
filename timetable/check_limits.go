package timetable

// involved returns the valid placements an Unavailable row's Who refers to,
// a label for it and its term row; ok is false when Who is unknown.
func (x *occupancy) involved(u Unavailability) (pls []int, label string, src Source, ok bool) {
	switch u.Kind {
	case WhoStaff:
		if k, found := x.staffIdx[u.Who]; found {
			return x.byStaff[k], x.staffLabel(k), x.t.Staff[k].Src, true
		}
	case WhoCohort:
		if k, found := x.cohIdx[u.Who]; found {
			return x.byCohort[k], x.cohortLabel(k), x.t.Cohorts[k].Src, true
		}
	case WhoRoom:
		if k, found := x.roomIdx[u.Who]; found {
			return x.byRoom[k], "room " + u.Who, x.t.Rooms[k].Src, true
		}
	case WhoSection:
		if k, found := x.secIdx[u.Who]; found {
			return x.sectionOK(k), u.Who, x.t.Sections[k].Src, true
		}
	}
	return nil, "", Source{}, false
}

// coveredPeriods lists the periods of valid placement i that u covers.
func (x *occupancy) coveredPeriods(u Unavailability, i int) []int {
	var out []int
	op := x.pl[i]
	for p := op.first; p <= op.last; p++ {
		if u.Covers(x.t.Periods[p]) {
			out = append(out, p)
		}
	}
	return out
}

// unavailable reports meetings that occupy a period covered by a hard
// Unavailable row of their staff, cohort, room or section.
func (c *checker) unavailable() {
	x := c.x
	for _, u := range x.t.Unavailable {
		if !u.Hard {
			continue
		}
		pls, label, src, ok := x.involved(u)
		if !ok {
			continue
		}
		when := chkUnavailText(x.t, u)
		for _, i := range append(append([]int(nil), pls...), x.patternInvolved(u)...) {
			var at string
			if x.pl[i].pat {
				hit := unavailMeets(x, u, i)
				if len(hit) == 0 {
					continue
				}
				at = meetsText(hit)
			} else {
				hit := x.coveredPeriods(u, i)
				if len(hit) == 0 || x.unavailWeeksMiss(u, i) {
					continue
				}
				at = chkTimes(x.t, hit)
			}
			var msg string
			switch u.Kind {
			case WhoStaff:
				msg = label + " is unavailable " + when + " but teaches " + x.meetingLabel(i) + " at " + at
			case WhoCohort:
				msg = label + " is unavailable " + when + " but has " + x.meetingLabel(i) + " at " + at
			case WhoRoom:
				msg = label + " is unavailable " + when + " but holds " + x.meetingLabel(i) + " at " + at
			default:
				msg = label + " may not meet " + when + " but " + x.meetingLabel(i) + " is at " + at
			}
			c.add(RuleUnavailable, true, []int{i}, []Source{u.Src, src, x.t.Sections[x.pl[i].sec].Src}, msg)
		}
	}
}

// staffLimits reports days on which a staff member is busy for more than
// MaxPerDay periods, and runs of busy consecutive periods longer than
// MaxConsecutive. A period is busy when any meeting of the staff member
// occupies it, whatever its weeks.
func (c *checker) staffLimits() {
	x := c.x
	t := x.t
	for k := range t.Staff {
		st := &t.Staff[k]
		if st.MaxPerDay <= 0 && st.MaxConsecutive <= 0 {
			continue
		}
		pls := x.byStaff[k]
		busy := x.busy(pls)
		touching := func(first, last int) []int {
			var out []int
			for _, i := range pls {
				if x.pl[i].first <= last && x.pl[i].last >= first {
					out = append(out, i)
				}
			}
			return out
		}
		for d := 0; d < len(t.Periods); d = x.dayLast[d] + 1 {
			end := x.dayLast[d]
			if st.MaxPerDay > 0 {
				n := 0
				for p := d; p <= end; p++ {
					if busy.has(p) {
						n++
					}
				}
				if n > st.MaxPerDay {
					c.add(RuleMaxPerDay, true, touching(d, end), []Source{st.Src},
						x.staffLabel(k)+" teaches "+itoa(n)+" periods on "+DayName(t.Periods[d].Day)+
							"; the limit is "+itoa(st.MaxPerDay)+" a day")
				}
			}
			if st.MaxConsecutive > 0 {
				for p := d; p <= end; {
					if !busy.has(p) {
						p++
						continue
					}
					q := p
					for q+1 <= end && busy.has(q+1) && t.Consecutive(q, q+1) {
						q++
					}
					if q-p+1 > st.MaxConsecutive {
						c.add(RuleMaxConsecutive, true, touching(p, q), []Source{st.Src},
							x.staffLabel(k)+" teaches "+itoa(q-p+1)+" periods in a row, "+chkRange(t, p, q)+
								"; the limit is "+itoa(st.MaxConsecutive))
					}
					p = q + 1
				}
			}
		}
	}
}
