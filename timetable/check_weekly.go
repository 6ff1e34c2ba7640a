package timetable

// weeklyLimits reports staff over MaxWeekPeriods (busy grid periods),
// MaxWeekMinutes (busy minutes of every meeting) or MaxWeekDays (days with
// a meeting) in some teaching week: one violation per staff member and
// limit, naming the worst week and how many weeks are over.
func (c *checker) weeklyLimits() {
	x := c.x
	for k := range x.t.Staff {
		st := &x.t.Staff[k]
		if st.MaxWeekPeriods <= 0 && st.MaxWeekMinutes <= 0 && st.MaxWeekDays <= 0 {
			continue
		}
		ms := x.personMeets(x.byStaff[k], x.patStaff[k])
		type over struct{ worst, week, weeks int }
		var per, mins, days over
		note := func(o *over, v, limit, w int) {
			if limit <= 0 || v <= limit {
				return
			}
			o.weeks++
			if v > o.worst {
				o.worst, o.week = v, w
			}
		}
		for w := 1; w <= x.nWeeks; w++ {
			if st.MaxWeekPeriods > 0 {
				busy := x.newPeriodSet()
				for _, i := range x.byStaff[k] {
					if x.weeks(x.pl[i].sec).Has(w) {
						busy.addRange(x.pl[i].first, x.pl[i].last)
					}
				}
				note(&per, len(busy.members()), st.MaxWeekPeriods, w)
			}
			var inWeek []occMeet
			for _, m := range ms {
				if m.Weeks.Has(w) {
					inWeek = append(inWeek, m)
				}
			}
			note(&mins, busyMinutes(inWeek), st.MaxWeekMinutes, w)
			var ds DaySet
			for _, m := range inWeek {
				ds |= DaysOf(m.Day)
			}
			note(&days, ds.Count(), st.MaxWeekDays, w)
		}
		var pls []int
		for _, m := range ms {
			pls = append(pls, m.pl)
		}
		say := func(o over, what string, limit int) {
			if o.weeks == 0 {
				return
			}
			more := ""
			if o.weeks > 1 {
				more = " (" + itoa(o.weeks) + " weeks are over the limit)"
			}
			c.add(RuleWeekLimit, true, pls, []Source{st.Src},
				x.staffLabel(k)+" teaches "+itoa(o.worst)+" "+what+" in week "+itoa(o.week)+more+"; the limit is "+itoa(limit)+" a week")
		}
		say(per, "periods", st.MaxWeekPeriods)
		say(mins, "minutes", st.MaxWeekMinutes)
		say(days, "days", st.MaxWeekDays)
	}
}

// busyMinutes is the length of the union of the meets' times, day by day.
func busyMinutes(ms []occMeet) int {
	n := 0
	for _, b := range byDay(ms) {
		var end Clock = -1
		for _, m := range b {
			start := max(m.Start, end)
			if m.End > start {
				n += int(m.End - start)
			}
			end = max(end, m.End)
		}
	}
	return n
}

// freeRun is the longest free time inside [from, to) left by meets b,
// which are sorted by start.
func freeRun(b []occMeet, from, to Clock) int {
	best, cur := 0, from
	for _, m := range b {
		if m.Start >= to {
			break
		}
		if m.Start > cur {
			best = max(best, int(m.Start-cur))
		}
		cur = max(cur, m.End)
	}
	if to > cur {
		best = max(best, int(to-cur))
	}
	return best
}

// lunch reports staff and cohorts whose lunch break is not kept: on a day
// and week they have a meeting, the window holds no free run of the
// break's minutes. One violation per person and day, naming the weeks.
func (c *checker) lunch() {
	x := c.x
	for k := range x.t.Staff {
		if l := x.t.Staff[k].Lunch; l.Set() {
			c.lunchOf(l, x.personMeets(x.byStaff[k], x.patStaff[k]), x.staffLabel(k), x.t.Staff[k].Src)
		}
	}
	for k := range x.t.Cohorts {
		if l := x.t.Cohorts[k].Lunch; l.Set() {
			c.lunchOf(l, x.personMeets(x.byCohort[k], x.patCohort[k]), x.cohortLabel(k), x.t.Cohorts[k].Src)
		}
	}
}

func (c *checker) lunchOf(l LunchBreak, ms []occMeet, label string, src Source) {
	x := c.x
	days := byDay(ms)
	for _, d := range weekOrder {
		var bad WeekSet
		least := -1
		for w := 1; w <= x.nWeeks; w++ {
			b := meetsInWeek(days[d], w)
			if len(b) == 0 {
				continue
			}
			if run := freeRun(b, l.From, l.To); run < l.Minutes {
				bad |= 1 << (w - 1)
				if least < 0 || run < least {
					least = run
				}
			}
		}
		if bad == 0 {
			continue
		}
		var pls []int
		for _, m := range days[d] {
			if m.Weeks.Overlaps(bad) && m.Start < l.To && l.From < m.End {
				pls = append(pls, m.pl)
			}
		}
		c.add(RuleLunch, true, pls, []Source{src},
			label+" has no free "+chkMinutes(l.Minutes)+" between "+l.From.String()+" and "+l.To.String()+" on "+DayName(d)+
				chkInWeeks(x.t, bad)+" (the longest free time there is "+chkMinutes(least)+")")
	}
}

// meetsInWeek filters meets to those in teaching week w, keeping order.
func meetsInWeek(b []occMeet, w int) []occMeet {
	var out []occMeet
	for _, m := range b {
		if m.Weeks.Has(w) {
			out = append(out, m)
		}
	}
	return out
}

// unavailMeets lists the meets of valid placement i that hard or soft
// unavailability u covers: same day, a common minute, and (when u names
// weeks) a common week.
func unavailMeets(x *occupancy, u Unavailability, i int) []occMeet {
	var out []occMeet
	for _, m := range x.meetsOf(i) {
		if m.Day == u.Day && m.Start < u.To && u.From < m.End && (u.Weeks == 0 || m.Weeks.Overlaps(u.Weeks)) {
			out = append(out, m)
		}
	}
	return out
}

// unavailWeeksMiss reports whether u names weeks that grid placement i's
// section never meets in (then u does not affect it).
func (x *occupancy) unavailWeeksMiss(u Unavailability, i int) bool {
	return u.Weeks != 0 && !x.weeks(x.pl[i].sec).Overlaps(u.Weeks)
}

// patternInvolved lists the valid pattern placements u's Who refers to.
func (x *occupancy) patternInvolved(u Unavailability) []int {
	switch u.Kind {
	case WhoStaff:
		if k, ok := x.staffIdx[u.Who]; ok {
			return x.patStaff[k]
		}
	case WhoCohort:
		if k, ok := x.cohIdx[u.Who]; ok {
			return x.patCohort[k]
		}
	case WhoRoom:
		if k, ok := x.roomIdx[u.Who]; ok {
			return x.patRoom[k]
		}
	case WhoSection:
		if k, ok := x.secIdx[u.Who]; ok {
			var out []int
			for _, i := range x.bySection[k] {
				if x.pl[i].pok {
					out = append(out, i)
				}
			}
			return out
		}
	}
	return nil
}

// meetsText names meets as "Mon 09:00–09:50 and Wed 09:00–09:50".
func meetsText(ms []occMeet) string {
	var items []string
	for _, m := range ms {
		items = append(items, DayName(m.Day)+" "+m.Start.String()+"–"+m.End.String())
	}
	return chkJoin(items)
}
