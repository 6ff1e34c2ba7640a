package timetable

// people evaluates staff gaps, staff days, cohort gaps and cohort isolated
// periods from each person's busy periods (any meeting occupying the
// period, whatever its weeks).
func (c *coster) people() {
	x := c.x
	for k, st := range x.t.Staff {
		busy := x.busy(x.byStaff[k])
		gaps, days := costGapsAndDays(x, busy)
		c.add(CritStaffGaps, gaps, gaps, WhoStaff, st.ID)
		c.add(CritStaffDays, days, days, WhoStaff, st.ID)
	}
	for k, co := range x.t.Cohorts {
		busy := x.busy(x.byCohort[k])
		gaps, _ := costGapsAndDays(x, busy)
		c.add(CritCohortGaps, gaps, gaps, WhoCohort, co.ID)
		iso := costIsolated(x, busy)
		c.add(CritCohortIsolated, iso, iso, WhoCohort, co.ID)
	}
}

// costGapsAndDays returns, over all days, the number of periods not busy
// lying between the first and last busy period of the day, and the number
// of days with at least one busy period.
func costGapsAndDays(x *occupancy, busy occSet) (gaps, days int64) {
	n := len(x.t.Periods)
	for d := 0; d < n; d = x.dayLast[d] + 1 {
		first, last, count := -1, -1, 0
		for p := d; p <= x.dayLast[d]; p++ {
			if busy.has(p) {
				if first < 0 {
					first = p
				}
				last = p
				count++
			}
		}
		if first >= 0 {
			days++
			gaps += int64(last - first + 1 - count)
		}
	}
	return gaps, days
}

// costIsolated counts busy periods with neither the period right before nor
// right after (consecutive, same day) busy.
func costIsolated(x *occupancy, busy occSet) int64 {
	t := x.t
	var n int64
	for _, p := range busy.members() {
		before := p > 0 && t.Consecutive(p-1, p) && busy.has(p-1)
		after := p+1 < len(t.Periods) && t.Consecutive(p, p+1) && busy.has(p+1)
		if !before && !after {
			n++
		}
	}
	return n
}

// travel counts, per staff member and cohort, pairs of their meetings in
// consecutive periods of one day held in different non-blank buildings.
func (c *coster) travel() {
	x := c.x
	for k, st := range x.t.Staff {
		n := costTravelPairs(x, x.byStaff[k])
		c.add(CritTravel, n, n, WhoStaff, st.ID)
	}
	for k, co := range x.t.Cohorts {
		n := costTravelPairs(x, x.byCohort[k])
		c.add(CritTravel, n, n, WhoCohort, co.ID)
	}
}

// costTravelPairs counts ordered pairs (a, b) of distinct placements in pls
// where b starts in the period consecutive to a's last period and both
// rooms have buildings that differ. At most one order of a pair can hold.
func costTravelPairs(x *occupancy, pls []int) int64 {
	if len(pls) < 2 {
		return 0
	}
	startsAt := map[int][]int{}
	for _, i := range pls {
		startsAt[x.pl[i].first] = append(startsAt[x.pl[i].first], i)
	}
	var n int64
	for _, a := range pls {
		ba := x.building(a)
		if ba == "" {
			continue
		}
		last := x.pl[a].last
		if last+1 >= len(x.t.Periods) || !x.t.Consecutive(last, last+1) {
			continue
		}
		for _, b := range startsAt[last+1] {
			if bb := x.building(b); b != a && bb != "" && bb != ba {
				n++
			}
		}
	}
	return n
}

// building is the building of placement i's room, "" when unknown.
func (x *occupancy) building(i int) string {
	if r := x.pl[i].room; r >= 0 {
		return x.t.Rooms[r].Building
	}
	return ""
}
