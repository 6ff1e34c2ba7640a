package timetable

import "sort"

// CriterionCost is the value of one soft criterion on a schedule.
type CriterionCost struct {
	Name   string `json:"name"`   // criterion name, as in Criteria
	Level  int    `json:"level"`  // priority level (higher is minimised first)
	Weight int    `json:"weight"` // criterion weight for this term (0 = off)
	// Count is the raw number of units the definition counts (for "avoid
	// times" the affected meeting periods, for "soft relations" the broken
	// rows), whatever the weight.
	Count int64 `json:"count"`
	// Cost is Weight times the units, where for "avoid times" and "soft
	// relations" each unit is first multiplied by its row's own weight.
	Cost int64 `json:"cost"`
}

// CostReport is the objective of a schedule, criterion by criterion, with
// the weighted cost summed per level and attributed to the people, rooms
// and sections it falls on.
type CostReport struct {
	Criteria []CriterionCost `json:"criteria"` // every criterion, in Criteria order
	// ByLevel sums Cost per level over the criteria with a non-zero weight;
	// every such level has an entry, even when its cost is 0. Schedules
	// compare lexicographically, highest level first.
	ByLevel map[int]int64 `json:"by_level"`
	// PerStaff attributes weighted cost to staff IDs: staff gaps, staff
	// days, their share of travel, avoid times on their Unavailable rows.
	PerStaff map[string]int64 `json:"per_staff"`
	// PerCohort attributes weighted cost to cohort IDs: cohort gaps,
	// isolated periods, their share of travel, avoid times on their rows.
	PerCohort map[string]int64 `json:"per_cohort"`
	// PerSection attributes weighted cost to section IDs: moved meetings,
	// spread days, room stability, over capacity, wasted seats, early and
	// late periods, avoid times on section rows.
	PerSection map[string]int64 `json:"per_section"`
	// PerRoom attributes weighted avoid-times cost on room rows to room IDs.
	PerRoom map[string]int64 `json:"per_room"`
}

// Levels lists the levels of ByLevel, highest (most important) first.
func (r CostReport) Levels() []int {
	out := make([]int, 0, len(r.ByLevel))
	for l := range r.ByLevel {
		out = append(out, l)
	}
	sort.Sort(sort.Reverse(sort.IntSlice(out)))
	return out
}

// Criterion returns the entry for the named criterion (zero when absent).
func (r CostReport) Criterion(name string) CriterionCost {
	for _, c := range r.Criteria {
		if c.Name == name {
			return c
		}
	}
	return CriterionCost{}
}

// Cost evaluates every soft criterion of criteria.go on schedule s of term
// t, independently of the encoder; kept is the earlier timetable for
// "moved meetings" and nil otherwise. Period-based criteria use only grid
// placements of known sections that fit the grid (pattern meetings occupy
// no periods); room-based ones use placements whose room is known. Week
// sets are ignored except where a definition names them ("student
// clashes", "avoid times" rows with weeks, the counted relations).
// Readings of the definitions:
//   - "avoid times": Count is the number of (row, meeting, period) hits;
//     each hit costs the row's weight times the criterion weight.
//   - "moved meetings": a kept meeting of a section of t counts unless a
//     meeting of its section in s has its start period and room, each
//     meeting of s standing for one kept meeting at most (a maximum
//     matching on equal places); meeting numbers play no part. New
//     sections and extra meetings do not count; kept meetings of a section
//     that now meets fewer times do.
//   - "room stability": distinct non-blank rooms minus 1, when positive.
//   - "travel": per staff member or cohort, one unit per pair of its
//     meetings where one ends in the period right before (consecutive, same
//     day) the period the other starts, both rooms have a building, and the
//     buildings differ.
//   - "early periods"/"late periods": a meeting counts when it occupies the
//     first/last period of its day in the grid.
//   - "time choice"/"room choice": Count is the sum of the chosen weights.
//   - "student clashes": over Term.StudentEnrolments (fixed and sectioned).
//   - "unplaced requests": a student is placed in a course when they hold
//     a section of it, fixed or sectioned; each request is judged on its
//     own (a request whose course is unknown is unplaced).
//   - "moved students": a kept sectioned enrolment (kept.Enrolments) of a
//     known section with a Course counts when its student now holds a
//     section of that course (fixed or sectioned) but not that section.
//   - "soft relations": Count is the broken rows, each counted kind adding
//     its count (divided as its cost is) instead of 1; a counted row costs
//     its weight times its count (minutes in 5-minute steps) divided by the
//     teaching weeks, rounded down after multiplying, as term.go defines.
//
// Cost runs in O(P·(staff+cohorts) + placements + Σ students·k²).
func Cost(t *Term, s *Schedule, kept *Schedule) CostReport {
	if s == nil {
		s = &Schedule{}
	}
	c := newCoster(t, s)
	c.moved(kept)
	c.studentClashes()
	c.avoidTimes()
	c.people()
	c.sections()
	c.travel()
	c.softRelations()
	c.choices()
	c.unplaced()
	c.movedStudents(kept)
	return c.finish()
}

// coster accumulates criterion units and attributed cost.
type coster struct {
	x      *occupancy
	rep    CostReport
	at     map[string]int // criterion name -> index in rep.Criteria
	weight map[string]int
}

func newCoster(t *Term, s *Schedule) *coster {
	x := newOccupancy(t, s)
	x.quiet = true
	c := &coster{
		x:      x,
		at:     map[string]int{},
		weight: map[string]int{},
		rep: CostReport{
			ByLevel:    map[int]int64{},
			PerStaff:   map[string]int64{},
			PerCohort:  map[string]int64{},
			PerSection: map[string]int64{},
			PerRoom:    map[string]int64{},
		},
	}
	for _, cr := range Criteria {
		w, l := t.CriterionWeight(cr.Name)
		c.at[cr.Name] = len(c.rep.Criteria)
		c.weight[cr.Name] = w
		c.rep.Criteria = append(c.rep.Criteria, CriterionCost{Name: cr.Name, Level: l, Weight: w})
	}
	return c
}

// add counts units of criterion name whose row-weighted size is weighted
// (equal to units for criteria without row weights) and attributes the
// resulting cost to who (of kind), when who is not "".
func (c *coster) add(name string, units, weighted int64, kind WhoKind, who string) {
	k, ok := c.at[name]
	if !ok || units == 0 && weighted == 0 {
		return
	}
	cost := int64(c.weight[name]) * weighted
	c.rep.Criteria[k].Count += units
	c.rep.Criteria[k].Cost += cost
	if who == "" || cost == 0 {
		return
	}
	switch kind {
	case WhoStaff:
		c.rep.PerStaff[who] += cost
	case WhoCohort:
		c.rep.PerCohort[who] += cost
	case WhoSection:
		c.rep.PerSection[who] += cost
	case WhoRoom:
		c.rep.PerRoom[who] += cost
	}
}

// finish sums the levels.
func (c *coster) finish() CostReport {
	for _, cr := range c.rep.Criteria {
		if cr.Weight != 0 {
			c.rep.ByLevel[cr.Level] += cr.Cost
		}
	}
	return c.rep
}

// softRelations charges each broken soft relation its row weight.
func (c *coster) softRelations() {
	for _, r := range c.x.t.Relations {
		if r.Hard {
			continue
		}
		if why, _, n, div := c.x.relationJudge(r); why != "" {
			c.add(CritSoftRelations, n/div, n*int64(r.Weight)/div, 0, "")
		}
	}
}

// avoidTimes charges each soft Unavailable row w per occupied period of an
// involved meeting that the row covers.
func (c *coster) avoidTimes() {
	x := c.x
	for _, u := range x.t.Unavailable {
		if u.Hard {
			continue
		}
		pls, _, _, ok := x.involved(u)
		if !ok {
			continue
		}
		for _, i := range pls {
			if x.unavailWeeksMiss(u, i) {
				continue
			}
			n := int64(len(x.coveredPeriods(u, i)))
			c.add(CritAvoidTimes, n, n*int64(u.Weight), u.Kind, u.Who)
		}
		for _, i := range x.patternInvolved(u) {
			n := int64(len(unavailMeets(x, u, i)))
			c.add(CritAvoidTimes, n, n*int64(u.Weight), u.Kind, u.Who)
		}
	}
}

// unplaced counts the course requests met neither by their course nor by
// any alternative.
func (c *coster) unplaced() {
	if len(c.x.t.Requests) == 0 {
		return
	}
	st := c.x.seats()
	n := int64(0)
	for k := range st.names {
		for _, ri := range st.requestsOf(k) {
			if !c.requestMet(st, k, ri) {
				n++
			}
		}
	}
	c.add(CritUnplaced, n, n, 0, "")
}

// requestMet reports whether student k holds a section of request ri's
// course or of one of its alternatives.
func (c *coster) requestMet(st *seatIndex, k int, ri int32) bool {
	if st.holdsCourse(k, st.reqCourse[ri]) {
		return true
	}
	for _, a := range c.x.t.Requests[ri].Alternatives {
		if st.holdsCourse(k, st.courseOf(a)) {
			return true
		}
	}
	return false
}

// movedStudents counts the kept sectioned enrolments whose student keeps
// the course but not the section.
func (c *coster) movedStudents(kept *Schedule) {
	if kept == nil || len(kept.Enrolments) == 0 {
		return
	}
	st := c.x.seats()
	n := int64(0)
	for _, e := range kept.Enrolments {
		si, ok := c.x.secIdx[e.Section]
		if !ok || st.secCourse[si] < 0 {
			continue
		}
		k, ok := st.stuID[e.Student]
		if ok && st.holdsCourse(int(k), st.secCourse[si]) && !st.holdsSection(int(k), int32(si)) {
			n++
		}
	}
	c.add(CritMovedStudents, n, n, 0, "")
}

// studentClashes counts, per pair of sections with overlapping weeks, the
// students in both times the periods both occupy.
func (c *coster) studentClashes() {
	for _, cp := range c.x.studentClashes() {
		n := int64(len(cp.students)) * int64(cp.common)
		c.add(CritStudentClash, n, n, 0, "")
	}
}
