package samples

import (
	"slices"

	"github.com/termwright/termwright/timetable"
)

// addRelations adds relations the witness satisfies: same time and back to
// back for the pairs placed that way on purpose, and before, not same time,
// different days, same day and same room found among the witness's
// meetings. Every fourth is a preference (a weight) rather than hard.
func (g *gen) addRelations() {
	k := g.relationsPerKind()
	var same, b2b [][]int
	for i, s := range g.secs {
		if s.partner >= 0 && g.holds(timetable.SameTime, s.partner, i) {
			same = append(same, []int{s.partner, i})
		}
		if s.follows >= 0 && g.holds(timetable.BackToBack, s.follows, i) {
			b2b = append(b2b, []int{s.follows, i})
		}
	}
	g.relate(timetable.SameTime, same)
	g.relate(timetable.BackToBack, b2b)
	g.relate(timetable.Before, g.findPairs(timetable.Before, k, g.courseMates))
	g.relate(timetable.NotSameTime, g.findPairs(timetable.NotSameTime, k, g.deptMates))
	g.relate(timetable.DifferentDays, g.findPairs(timetable.DifferentDays, k, g.deptMates))
	g.relate(timetable.SameDayRel, g.findPairs(timetable.SameDayRel, k, g.deptMates))
	g.relate(timetable.SameRoom, g.findPairs(timetable.SameRoom, k, g.roomMates()))
}

// relate adds one relation per group of section indexes.
func (g *gen) relate(kind timetable.RelationKind, groups [][]int) {
	for _, grp := range groups {
		r := timetable.Relation{Kind: kind, Hard: true}
		for _, i := range grp {
			r.Sections = append(r.Sections, g.secs[i].id)
		}
		if len(g.relations)%4 == 3 { // every fourth relation is a preference
			r.Hard, r.Weight = false, g.between(1, 5)
		}
		g.relations = append(g.relations, r)
	}
}

// courseMates lists, for the plenary a of a course, the course's laboratory
// and tutorial sections (a plenary comes before its groups' sessions).
func (g *gen) courseMates(a int) []int {
	s := &g.secs[a]
	if s.kind != kindPlenary {
		return nil
	}
	return g.courses[s.course].groups
}

// deptMates lists up to a dozen random sections of a's department.
func (g *gen) deptMates(a int) []int {
	var out []int
	for range 40 {
		b := g.rng.IntN(len(g.secs))
		if g.secs[b].dept == g.secs[a].dept {
			out = append(out, b)
			if len(out) == 12 {
				break
			}
		}
	}
	return out
}

// roomMates returns a function listing, for section a, the sections whose
// witness meetings all use the room a's first meeting uses.
func (g *gen) roomMates() func(int) []int {
	byRoom := make([][]int, len(g.rooms))
	for i, s := range g.secs {
		if !s.noRoom && len(s.rooms) > 0 {
			byRoom[s.rooms[0]] = append(byRoom[s.rooms[0]], i)
		}
	}
	return func(a int) []int {
		s := &g.secs[a]
		if s.noRoom || len(s.rooms) == 0 {
			return nil
		}
		return byRoom[s.rooms[0]]
	}
}

// findPairs looks for up to want pairs (a, b) of distinct sections, b among
// mates(a), for which the relation holds in the witness; each section is
// used at most once per kind.
func (g *gen) findPairs(kind timetable.RelationKind, want int, mates func(int) []int) [][]int {
	var out [][]int
	used := make([]bool, len(g.secs))
	for _, a := range g.shuffled(len(g.secs)) {
		if len(out) == want {
			break
		}
		if used[a] {
			continue
		}
		for _, b := range mates(a) {
			if b != a && !used[b] && g.holds(kind, a, b) {
				out = append(out, []int{a, b})
				used[a], used[b] = true, true
				break
			}
		}
	}
	return out
}

// holds reports whether relation kind holds for (a, b) in the witness, by
// the definitions in timetable/term.go (weeks are ignored). For the
// relations between sections of the same shape, it also checks the shape.
func (g *gen) holds(kind timetable.RelationKind, a, b int) bool {
	sa, sb := &g.secs[a], &g.secs[b]
	if len(sa.starts) == 0 || len(sb.starts) == 0 {
		return false
	}
	switch kind {
	case timetable.SameTime:
		return sa.meetings == sb.meetings && sa.length == sb.length && slices.Equal(sa.starts, sb.starts)
	case timetable.NotSameTime:
		occA := g.occupied(sa)
		return !slices.ContainsFunc(g.occupied(sb), func(p int) bool { return slices.Contains(occA, p) })
	case timetable.DifferentDays:
		return g.dayMask(sa)&g.dayMask(sb) == 0
	case timetable.SameDayRel:
		return g.dayMask(sa) == g.dayMask(sb)
	case timetable.Before:
		occA := g.occupied(sa)
		return slices.Max(occA) < slices.Min(sb.starts)
	case timetable.BackToBack:
		for _, st := range sb.starts {
			ok := false
			for _, sa0 := range sa.starts {
				last := sa0 + sa.length - 1
				ok = ok || st == last+1 && g.consecutive(last, st)
			}
			if !ok {
				return false
			}
		}
		return true
	case timetable.SameRoom:
		if sa.noRoom || sb.noRoom {
			return false
		}
		r := sa.rooms[0]
		return !slices.ContainsFunc(sa.rooms, func(x int) bool { return x != r }) &&
			!slices.ContainsFunc(sb.rooms, func(x int) bool { return x != r })
	}
	return false
}

// occupied lists the periods the witness meetings of s occupy.
func (g *gen) occupied(s *sec) []int {
	var out []int
	for _, st := range s.starts {
		for p := st; p < st+s.length; p++ {
			out = append(out, p)
		}
	}
	return out
}

// dayMask has bit d set when a witness meeting of s falls on weekday d.
func (g *gen) dayMask(s *sec) uint8 {
	var m uint8
	for _, st := range s.starts {
		m |= 1 << uint(g.periods[st].Day)
	}
	return m
}
