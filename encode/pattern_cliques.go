package encode

import (
	"slices"
	"sort"
	"strconv"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// One meeting at a time for pattern sections: for each staff member,
// cohort and room, the candidate meetings of its sections are intervals on
// a day in a set of teaching weeks. Two of them clash exactly when some
// minute of some day of some week lies in both, so the clashing sets are
// the sets of intervals that share a point of one (week, day). In an
// interval graph every clique shares a common point (the Helly property of
// intervals), so the maximal cliques are found by one sweep over the
// sorted endpoints, reporting the active set whenever an end follows a
// start (Gilmore and Hoffman 1964; Golumbic, Algorithmic Graph Theory,
// ch. 8). "At most one meeting at a time" is then one bound "at most 1"
// per maximal clique, over one literal per section (anyTime: the section
// meets at one of its patterns in the clique) — never pairwise clauses.
// The sweep runs per teaching week and day; identical member lists
// (common: most weeks look alike) are swept once and identical cliques
// stated once. Grid meetings of the same staff member, cohort or room take
// part as intervals (a start period's meeting on its day, in its section's
// weeks).
//
// Rooms need time and room together: the literal of pattern section S in
// a clique of room R is in(S,R) itself combined with its times there, an
// atom room_time(S,R,K) :- in(S,R), any_time(S,K), interned by (S, R, K)
// so that cliques with the same times of S share it. A section with a
// single candidate room uses any_time directly.

// interval is one candidate meeting while sweeping: section s at 0-based
// pattern idx (or grid start period idx when grid), on day, [start, end)
// in weeks.
type interval struct {
	s, idx     int
	grid       bool
	day        time7
	start, end timetable.Clock
	weeks      timetable.WeekSet
}

// time7 is a weekday 0..6 (time.Weekday as a small int).
type time7 = int8

// occupantsOf lists the candidate meetings of the given sections: every
// day of every candidate pattern, every candidate grid start (grid=false
// leaves grid sections out).
func (b *builder) occupantsOf(secs []int, grid bool) []interval {
	t := b.t
	var out []interval
	for _, s := range secs {
		pm := &b.c.pats[s]
		if pm.on {
			for _, i := range pm.times {
				tc := &t.Sections[s].Times[i]
				for _, d := range tc.Days.List() {
					out = append(out, interval{s: s, idx: i, day: time7(d), start: tc.Start, end: tc.End(), weeks: tc.Weeks})
				}
			}
			continue
		}
		if !grid {
			continue
		}
		m := &b.c.secs[s]
		for _, p := range m.starts {
			first, last := t.Periods[p], t.Periods[p+m.length-1]
			out = append(out, interval{s: s, idx: p, grid: true, day: time7(first.Day), start: first.Start, end: last.End, weeks: m.weeks})
		}
	}
	return out
}

// maximalCliques returns the maximal sets of two or more mutually
// overlapping intervals among occ, as sorted index lists into occ, each
// distinct set once: a sweep per teaching week and day over the members
// meeting then.
func maximalCliques(occ []interval, nWeeks int) [][]int {
	if nWeeks < 1 {
		nWeeks = 1
	}
	seenMembers := map[string]bool{}
	seenClique := map[string]bool{}
	var out [][]int
	var members []int
	var key []byte
	for d := time7(0); d < 7; d++ {
		for w := 0; w < nWeeks && w < 64; w++ {
			bit := timetable.WeekSet(1) << w
			members = members[:0]
			key = key[:0]
			for i := range occ {
				if occ[i].day == d && occ[i].weeks&bit != 0 {
					members = append(members, i)
					key = strconv.AppendInt(key, int64(i), 36)
					key = append(key, ',')
				}
			}
			if len(members) < 2 || seenMembers[string(key)] {
				continue
			}
			seenMembers[string(key)] = true
			for _, c := range sweep(occ, members) {
				key = key[:0]
				for _, i := range c {
					key = strconv.AppendInt(key, int64(i), 36)
					key = append(key, ',')
				}
				if !seenClique[string(key)] {
					seenClique[string(key)] = true
					out = append(out, c)
				}
			}
		}
	}
	return out
}

// sweep returns the maximal cliques of two or more of the intervals
// occ[members] (all on one day of one week), each as a sorted index list: endpoints in order,
// ends before starts at equal times (intervals are half-open), and the
// active set reported whenever an end follows a start.
func sweep(occ []interval, members []int) [][]int {
	type event struct {
		at    timetable.Clock
		start bool
		i     int
	}
	ev := make([]event, 0, 2*len(members))
	for _, i := range members {
		if occ[i].end <= occ[i].start {
			continue
		}
		ev = append(ev, event{occ[i].start, true, i}, event{occ[i].end, false, i})
	}
	sort.Slice(ev, func(a, b int) bool {
		if ev[a].at != ev[b].at {
			return ev[a].at < ev[b].at
		}
		return !ev[a].start && ev[b].start
	})
	var out [][]int
	active := map[int]bool{}
	grown := false
	for _, e := range ev {
		if e.start {
			active[e.i] = true
			grown = true
			continue
		}
		if grown && len(active) >= 2 {
			c := make([]int, 0, len(active))
			for i := range active {
				c = append(c, i)
			}
			sort.Ints(c)
			out = append(out, c)
			grown = false
		}
		delete(active, e.i)
	}
	return out
}

// cliqueLits turns a clique into one literal per section (the section's
// times or starts there), ascending by section; inRoom >= 0 asks for the
// room literal of room inRoom. It returns the number of sections.
func (b *builder) cliqueLits(dst []solver.Lit, occ []interval, clique []int, inRoom int) ([]solver.Lit, int) {
	bySec := map[int][]int{}
	var secs []int
	for _, i := range clique {
		s := occ[i].s
		if _, ok := bySec[s]; !ok {
			secs = append(secs, s)
		}
		bySec[s] = append(bySec[s], occ[i].idx)
	}
	sort.Ints(secs)
	for _, s := range secs {
		idx := bySec[s]
		slices.Sort(idx)
		idx = slices.Compact(idx)
		if !b.c.pats[s].on {
			// Grid starts of one section in one clique overlap each other,
			// which the section's own constraints forbid: at most one holds.
			for _, p := range idx {
				if inRoom >= 0 {
					if l := b.gridRoomLit(s, p, inRoom); l != 0 {
						dst = append(dst, l) // its grid_in atom, or its start when the room is its only one
					}
					continue
				}
				dst = append(dst, solver.Pos(b.c.secs[s].start[p]))
			}
			continue
		}
		l := b.anyTime(s, idx)
		if inRoom >= 0 {
			l = b.roomTime(s, inRoom, l)
		}
		dst = append(dst, l)
	}
	return dst, len(secs)
}

// roomTime is the literal "section s meets in room r at one of the times
// of l": l itself when r is s's only candidate room, else an atom
// room_time(S,R,N) :- in(S,R), l, interned by (s, r, l).
func (b *builder) roomTime(s, r int, l solver.Lit) solver.Lit {
	pm := &b.c.pats[s]
	if len(pm.rooms) == 1 {
		return l
	}
	key := [3]int{s, r, int(l)}
	if a, ok := b.pat.roomTime[key]; ok {
		return solver.Pos(a)
	}
	a := b.newAtom("room_time("+quote(b.t.Sections[s].ID)+","+quote(b.t.Rooms[r].ID)+","+strconv.Itoa(len(b.pat.roomTime)+1)+")",
		AtomInfo{Kind: AtomAux, Section: s, Period: -1, Staff: -1, Group: -1, Room: r})
	b.pat.roomTime[key] = a
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "room time")
	b.rule(a, solver.Pos(pm.room[pm.roomAt[r]]), l)
	b.group, b.boundKind = saveG, saveK
	return solver.Pos(a)
}
