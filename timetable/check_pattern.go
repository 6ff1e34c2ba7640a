package timetable

import (
	"sort"
	"strings"
	"time"
)

// Rule names for meeting patterns, travel and people's weekly limits.
const (
	RuleTimeChoice = "meeting time"
	RuleTravel     = "travel time"
	RuleWeekLimit  = "weekly limit"
	RuleLunch      = "lunch break"
)

// patternPlacement checks the placement of a pattern section: it names
// one of the section's meeting times and no grid period.
func (c *checker) patternPlacement(i int, sec *Section) {
	x := c.x
	p := x.s.Placements[i]
	switch {
	case p.Time == 0:
		which := "one of its " + itoa(len(sec.Times)) + " meeting times"
		if len(sec.Times) == 1 {
			which = "its one meeting time"
		}
		c.add(RuleTimeChoice, true, []int{i}, []Source{sec.Src},
			x.meetingLabel(i)+" names no meeting time; "+sec.ID+" meets at "+which)
	case !x.pl[i].pok:
		c.add(RuleTimeChoice, true, []int{i}, []Source{sec.Src},
			x.meetingLabel(i)+" names meeting time "+itoa(p.Time)+", but "+sec.ID+" has meeting times 1 to "+itoa(len(sec.Times)))
	}
	if p.Period != -1 {
		c.add(RuleTimeChoice, true, []int{i}, []Source{sec.Src},
			x.meetingLabel(i)+" names a grid period, but "+sec.ID+" meets at one of its meeting times; leave the period out")
	}
}

// roomChoiceOf finds room in a section's room choices.
func roomChoiceOf(sec *Section, room string) (RoomChoice, bool) {
	for _, rc := range sec.RoomChoices {
		if rc.Room == room {
			return rc, true
		}
	}
	return RoomChoice{}, false
}

// fixedPattern checks the Fixed entries of a pattern section: each is
// matched by a day of its chosen meeting time at that start (and room).
func (c *checker) fixedPattern(si int) {
	x := c.x
	sec := &x.t.Sections[si]
	for _, f := range sec.Fixed {
		found := false
		for _, m := range x.sectionMeets(si) {
			if m.Day == f.Day && m.Start == f.Start && (f.Room == "" || f.Room == x.s.Placements[m.pl].Room) {
				found = true
			}
		}
		if found {
			continue
		}
		want, text := f.wanted()
		c.add(RuleFixed, true, nil, []Source{sec.Src},
			sec.ID+" is fixed at "+chkQuote(text)+" but its meeting time in the timetable does not meet at "+want)
	}
}

// byDay buckets meets by weekday, each bucket sorted by start (then end,
// then placement) so that a sweep sees them in time order.
func byDay(ms []occMeet) [7][]occMeet {
	var out [7][]occMeet
	for _, m := range ms {
		out[m.Day%7] = append(out[m.Day%7], m)
	}
	for d := range out {
		b := out[d]
		sort.Slice(b, func(i, j int) bool {
			if b[i].Start != b[j].Start {
				return b[i].Start < b[j].Start
			}
			if b[i].End != b[j].End {
				return b[i].End < b[j].End
			}
			return b[i].pl < b[j].pl
		})
	}
	return out
}

// weekOrder lists the weekdays Monday first, the order of the day buckets
// in messages.
var weekOrder = []time.Weekday{time.Monday, time.Tuesday, time.Wednesday, time.Thursday, time.Friday, time.Saturday, time.Sunday}

// dayRank is a weekday's place in week order (Monday 0 … Sunday 6).
func dayRank(d time.Weekday) int { return (int(d) + 6) % 7 }

// patternClashes reports double bookings of staff, cohorts and rooms in
// which at least one meeting is a pattern placement: two occurrences of
// different sections that share a minute of a common day in a common
// week. Grid pairs are left to resourceClashes. Each pair of placements is
// reported once, at its first common time. A sweep per day over meetings
// sorted by start costs O(m log m + pairs overlapping in time of day).
func (c *checker) patternClashes() {
	x := c.x
	if !x.hasPat {
		return
	}
	for _, r := range x.clashKinds() {
		for k := range r.pat {
			if len(r.pat[k]) > 0 {
				c.meetClashes(x.personMeets(r.grid[k], r.pat[k]), r.src(k), r.rule, r.say(k))
			}
		}
	}
}

// meetClashes reports each pair of placements (one at least a pattern
// placement, of different sections) whose meets in ms overlap.
func (c *checker) meetClashes(ms []occMeet, src Source, rule string, say func(a, b, when string) string) {
	x := c.x
	type pair struct{ i, j int }
	seen := map[pair]bool{}
	days := byDay(ms)
	for _, d := range weekOrder {
		b := days[d]
		for a := 0; a < len(b); a++ {
			for k := a + 1; k < len(b) && b[k].Start < b[a].End; k++ {
				ma, mb := b[a], b[k]
				i, j := ma.pl, mb.pl
				if !x.pl[i].pat && !x.pl[j].pat || x.pl[i].sec == x.pl[j].sec || !ma.Weeks.Overlaps(mb.Weeks) {
					continue
				}
				if i > j {
					i, j = j, i
				}
				if seen[pair{i, j}] {
					continue
				}
				seen[pair{i, j}] = true
				si, sj := x.pl[i].sec, x.pl[j].sec
				when := DayName(d) + " " + max(ma.Start, mb.Start).String() + "–" + min(ma.End, mb.End).String() +
					chkInWeeks(x.t, ma.Weeks&mb.Weeks)
				c.add(rule, true, []int{i, j}, []Source{src, x.t.Sections[si].Src, x.t.Sections[sj].Src},
					say(x.s.Placements[i].Section, x.s.Placements[j].Section, when))
			}
		}
	}
}

// chkInWeeks is " in weeks 1–4 and 6" for a week set, or "" when it holds
// every teaching week of the term.
func chkInWeeks(t *Term, w WeekSet) string {
	all := t.AllWeeks()
	if w&all == all || w == ^WeekSet(0) {
		return ""
	}
	var items []string
	for n := 1; n <= 64; n++ {
		if !w.Has(n) {
			continue
		}
		m := n
		for m+1 <= 64 && w.Has(m+1) {
			m++
		}
		switch {
		case m == n:
			items = append(items, itoa(n))
		default:
			items = append(items, itoa(n)+"–"+itoa(m))
		}
		n = m
	}
	if len(items) == 1 && !strings.Contains(items[0], "–") {
		return " in week " + items[0]
	}
	return " in weeks " + chkJoin(items)
}

// roomOfMeet is the room of a meet's placement.
func (x *occupancy) roomOfMeet(m occMeet) string { return x.s.Placements[m.pl].Room }

// travel reports, per staff member and cohort, two meetings on a common
// day in a common week that do not overlap but leave less free time
// between them than the travel time between their rooms. Overlapping
// meetings are double bookings, reported as such.
func (c *checker) travel() {
	x := c.x
	if len(x.t.Travel) == 0 {
		return
	}
	ti := newTravelIndexOnce(x)
	for k := range x.t.Staff {
		c.travelOf(ti, x.personMeets(x.byStaff[k], x.patStaff[k]), x.staffLabel(k), x.t.Staff[k].Src)
	}
	for k := range x.t.Cohorts {
		c.travelOf(ti, x.personMeets(x.byCohort[k], x.patCohort[k]), x.cohortLabel(k), x.t.Cohorts[k].Src)
	}
}

func (c *checker) travelOf(ti *TravelIndex, ms []occMeet, label string, src Source) {
	x := c.x
	type pair struct{ i, j int }
	seen := map[pair]bool{}
	days := byDay(ms)
	for _, d := range weekOrder {
		b := days[d]
		for a := 0; a < len(b); a++ {
			for k := a + 1; k < len(b) && b[k].Start < b[a].End+Clock(ti.Most()); k++ {
				ma, mb := b[a], b[k]
				if ma.pl == mb.pl || mb.Start < ma.End || !ma.Weeks.Overlaps(mb.Weeks) {
					continue
				}
				ra, rb := x.roomOfMeet(ma), x.roomOfMeet(mb)
				need := ti.Between(ra, rb)
				gap := int(mb.Start - ma.End)
				if gap >= need {
					continue
				}
				i, j := min(ma.pl, mb.pl), max(ma.pl, mb.pl)
				if seen[pair{i, j}] {
					continue
				}
				seen[pair{i, j}] = true
				c.add(RuleTravel, true, []int{i, j}, []Source{src, x.t.Sections[x.pl[i].sec].Src, x.t.Sections[x.pl[j].sec].Src},
					label+" has "+x.s.Placements[ma.pl].Section+" in "+ra+" until "+DayName(d)+" "+ma.End.String()+" and "+
						x.s.Placements[mb.pl].Section+" in "+rb+" from "+mb.Start.String()+chkInWeeks(x.t, ma.Weeks&mb.Weeks)+
						", "+chkMinutes(gap)+" apart, but getting from "+ra+" to "+rb+" takes "+chkMinutes(need))
			}
		}
	}
}

// chkMinutes is "1 minute", "10 minutes".
func chkMinutes(n int) string {
	if n == 1 {
		return "1 minute"
	}
	return itoa(n) + " minutes"
}
