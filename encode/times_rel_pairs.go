package encode

import (
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// pairOK reports whether pattern a of a section A and pattern b of a
// section B satisfy a relation of kind k with number n, for the pair (A, B)
// in this order (only the consecutive-pair kinds care about the order).
// The cases are the definitions of timetable/term.go read for patterns: a
// pattern meets on each of its days from Start to End in each of its
// weeks; "start period" is (day, start), grid order is (day in week order,
// time); week sets are ignored unless the definition names weeks.
func pairOK(k timetable.RelationKind, n int, a, b *timetable.TimeChoice) bool {
	days := a.Days&b.Days != 0
	weeks := a.Weeks.Overlaps(b.Weeks)
	hours := a.Start < b.End() && b.Start < a.End()
	switch k {
	case timetable.SameTime:
		return a.Days == b.Days && a.Start == b.Start
	case timetable.NotSameTime:
		return !(days && hours)
	case timetable.DifferentDays:
		return !days
	case timetable.SameDayRel:
		return a.Days == b.Days
	case timetable.Before:
		la, fb := lastRank(a.Days), firstRank(b.Days)
		return la < fb || la == fb && a.End() <= b.Start
	case timetable.BackToBack:
		return b.Days&^a.Days == 0 && b.Start == a.End()
	case timetable.SameStart:
		return a.Start == b.Start
	case timetable.WithinHours:
		return a.Start <= b.Start && b.End() <= a.End() || b.Start <= a.Start && a.End() <= b.End()
	case timetable.DifferentHours:
		return !hours
	case timetable.DaysWithin:
		return a.Days&^b.Days == 0 || b.Days&^a.Days == 0
	case timetable.WeeksWithin:
		return a.Weeks&^b.Weeks == 0 || b.Weeks&^a.Weeks == 0
	case timetable.DifferentWeeks:
		return !weeks
	case timetable.OverlapRel:
		return days && weeks && hours
	case timetable.NoOverlap, timetable.SamePeople:
		return !(days && weeks && hours)
	case timetable.FirstBefore:
		fa, fb := a.Weeks.First(), b.Weeks.First()
		if fa != fb {
			return fa < fb
		}
		da, db := firstRank(a.Days), firstRank(b.Days)
		if da != db {
			return da < db
		}
		return a.End() <= b.Start
	case timetable.DaySpan:
		return !(days && weeks) || max(a.End(), b.End())-min(a.Start, b.Start) <= timetable.Clock(n)
	case timetable.MinGap:
		return !(days && weeks) || a.End()+timetable.Clock(n) <= b.Start || b.End()+timetable.Clock(n) <= a.Start
	}
	return true
}

// dayRank is a weekday's position in week order (Monday 0, Sunday 6).
func dayRank(d int) int { return (d + 6) % 7 }

// firstRank and lastRank are the week-order positions of the first and
// last day of a non-empty day set.
func firstRank(s timetable.DaySet) int {
	best := 7
	for d := 0; d < 7; d++ {
		if s&(1<<d) != 0 {
			best = min(best, dayRank(d))
		}
	}
	return best
}

func lastRank(s timetable.DaySet) int {
	best := -1
	for d := 0; d < 7; d++ {
		if s&(1<<d) != 0 {
			best = max(best, dayRank(d))
		}
	}
	return best
}

// relPairs lists the ordered section pairs a kind constrains: the first
// section with each other one for the equivalences (same time, same day,
// same start: equal to the first is equal to each other), consecutive pairs
// for the ordered kinds, every pair otherwise.
func relPairs(k timetable.RelationKind, secs []int) [][2]int {
	var out [][2]int
	switch {
	case k == timetable.SameTime || k == timetable.SameDayRel || k == timetable.SameStart:
		for _, s := range secs[1:] {
			out = append(out, [2]int{secs[0], s})
		}
	case consecutiveKind(k):
		for i := 0; i+1 < len(secs); i++ {
			out = append(out, [2]int{secs[i], secs[i+1]})
		}
	default:
		for i := range secs {
			for j := i + 1; j < len(secs); j++ {
				out = append(out, [2]int{secs[i], secs[j]})
			}
		}
	}
	return out
}

// pairWays lists the ways a pairwise (or consecutive-pair) row breaks: for
// each pair (A, B) and each group of A's candidate patterns that rule out
// the same patterns of B, the body "A at one of the group, B at one of
// those" (two interned any_time literals; B's side is written as "not at
// one of the others" when that list is shorter). A section paired with
// itself (listed twice in an ordered row) breaks at each pattern that is
// not compatible with itself.
func (b *builder) pairWays(secs []int, k timetable.RelationKind, n int) [][]solver.Lit {
	var ways [][]solver.Lit
	for _, pr := range relPairs(k, secs) {
		ways = b.pairWaysOf(ways, pr[0], pr[1], func(x, y *timetable.TimeChoice) bool { return pairOK(k, n, x, y) })
	}
	return ways
}

// pairWaysOf appends to ways the bodies that hold exactly when sections a
// and c meet at patterns (x of a, y of c) with !ok(x, y).
func (b *builder) pairWaysOf(ways [][]solver.Lit, a, c int, ok func(x, y *timetable.TimeChoice) bool) [][]solver.Lit {
	ta, tc := b.t.Sections[a].Times, b.t.Sections[c].Times
	ca, cc := b.c.TimeCandidates(a), b.c.TimeCandidates(c)
	if a == c {
		var bad []int
		for _, i := range ca {
			if !ok(&ta[i], &ta[i]) {
				bad = append(bad, i)
			}
		}
		if len(bad) > 0 {
			ways = append(ways, []solver.Lit{b.anyTime(a, bad)})
		}
		return ways
	}
	groups := groupByRefused(ca, cc, func(i, j int) bool { return !ok(&ta[i], &tc[j]) })
	for _, g := range groups {
		body := []solver.Lit{b.anyTime(a, g.rows)}
		switch {
		case len(g.bad) == len(cc):
			body = append(body, b.patSectionBody(c)...) // Explain mode: only while c is scheduled
		case len(cc)-len(g.bad) < len(g.bad):
			body = append(body, b.anyTime(c, without(cc, g.bad)).Not())
		default:
			body = append(body, b.anyTime(c, g.bad))
		}
		ways = append(ways, body)
	}
	return ways
}

// without lists the members of all (ascending) not in some (ascending).
func without(all, some []int) []int {
	out := make([]int, 0, len(all)-len(some))
	j := 0
	for _, x := range all {
		for j < len(some) && some[j] < x {
			j++
		}
		if j < len(some) && some[j] == x {
			continue
		}
		out = append(out, x)
	}
	return out
}
