package encode

import (
	"sort"
	"time"

	"github.com/termwright/termwright/timetable"
)

// The reference for the pattern relation tests: each kind's definition
// from the doc comments of timetable/term.go, evaluated directly on the
// meetings (one per day of the chosen pattern, in its weeks) of a full
// assignment, written without the encoder's compatibility tables.

// refMeeting is one meeting of a chosen pattern: a day, minutes of the day,
// weeks, and the section's room ("" for none).
type refMeeting struct {
	day        time.Weekday
	start, end int
	weeks      timetable.WeekSet
	room       string
}

// refAssign is a full assignment: per section its 0-based pattern and room
// index (-1 for no room).
type refAssign struct{ time, room []int }

// refMeetings lists the meetings of section s under a.
func refMeetings(t *timetable.Term, a refAssign, s int) []refMeeting {
	tc := t.Sections[s].Times[a.time[s]]
	room := ""
	if a.room[s] >= 0 {
		room = t.Rooms[a.room[s]].ID
	}
	var out []refMeeting
	for d := time.Sunday; d <= time.Saturday; d++ {
		if tc.Days&(1<<uint(d)) != 0 {
			out = append(out, refMeeting{day: d, start: int(tc.Start), end: int(tc.Start) + tc.Minutes, weeks: tc.Weeks, room: room})
		}
	}
	return out
}

// weekOrder is the day's place in a week that starts on Monday.
func weekOrder(d time.Weekday) int { return (int(d) + 6) % 7 }

func refSameDayWeek(x, y refMeeting) bool { return x.day == y.day && x.weeks&y.weeks != 0 }
func refHoursMeet(x, y refMeeting) bool   { return x.start < y.end && y.start < x.end }

// refDays and refWeeks are the sets a section meets on.
func refDays(ms []refMeeting) map[time.Weekday]bool {
	out := map[time.Weekday]bool{}
	for _, m := range ms {
		out[m.day] = true
	}
	return out
}

func refWeeks(ms []refMeeting) timetable.WeekSet {
	var w timetable.WeekSet
	for _, m := range ms {
		w |= m.weeks
	}
	return w
}

func subsetDays(a, b map[time.Weekday]bool) bool {
	for d := range a {
		if !b[d] {
			return false
		}
	}
	return true
}

// refCount returns the relation's count under a: for a non-counted kind 1
// when broken and 0 when it holds; for a counted kind the count its
// definition gives. broken reports whether the requirement itself fails
// (for the three kinds divided by the teaching weeks: in some week and
// day, even when the rounded count is 0), which is what a hard row forbids.
func refCount(t *timetable.Term, rel timetable.Relation, a refAssign) (count int, broken bool) {
	count, sum := refCountSum(t, rel, a)
	return count, sum > 0
}

// refSoftCost is what a soft row of weight rowW costs under a (criterion
// weight 1), as timetable/term.go defines it: rowW when a non-counted row
// is broken; rowW times the days over N for "at most days"; for the three
// per-week kinds rowW times their sum over weeks and days (minutes over N
// in whole 5-minute steps, rounded down) divided by the teaching weeks,
// rounded down after multiplying.
func refSoftCost(t *timetable.Term, rel timetable.Relation, a refAssign) int64 {
	count, sum := refCountSum(t, rel, a)
	w := int64(rel.Weight)
	switch rel.Kind {
	case timetable.MaxDayMinutes:
		return w * int64(sum/5) / int64(t.TeachingWeeks())
	case timetable.MaxBreaks, timetable.MaxBlock:
		return w * int64(sum) / int64(t.TeachingWeeks())
	}
	return w * int64(count)
}

// refCountSum returns the count and, for the kinds summed over weeks and
// days, the sum before the division (else the count).
func refCountSum(t *timetable.Term, rel timetable.Relation, a refAssign) (int, int) {
	one := func(c int) (int, int) { return c, c }
	idx := t.SectionIndex()
	var secs []int
	for _, id := range rel.Sections {
		secs = append(secs, idx[id])
	}
	ms := make([][]refMeeting, len(secs))
	for k, s := range secs {
		ms[k] = refMeetings(t, a, s)
	}
	// every pair of different listed sections
	pairs := func(f func(x, y []refMeeting) bool) int {
		for i := range ms {
			for j := range ms {
				if i < j && secs[i] != secs[j] && !f(ms[i], ms[j]) {
					return 1
				}
			}
		}
		return 0
	}
	// every consecutive pair in the list
	consecutive := func(f func(x, y []refMeeting) bool) int {
		for i := 0; i+1 < len(ms); i++ {
			if !f(ms[i], ms[i+1]) {
				return 1
			}
		}
		return 0
	}
	// for all meetings x of one and y of the other
	allMeet := func(f func(x, y refMeeting) bool) func(x, y []refMeeting) bool {
		return func(xs, ys []refMeeting) bool {
			for _, x := range xs {
				for _, y := range ys {
					if !f(x, y) {
						return false
					}
				}
			}
			return true
		}
	}
	n := rel.N
	switch rel.Kind {
	case timetable.SameTime: // same set of (day, start)
		key := func(xs []refMeeting) []int {
			var out []int
			for _, x := range xs {
				out = append(out, int(x.day)*10000+x.start)
			}
			sort.Ints(out)
			return out
		}
		for k := range ms {
			if !equalInts(key(ms[k]), key(ms[0])) {
				return one(1)
			}
		}
		return one(0)
	case timetable.NotSameTime: // no common occupied minute of a day (weeks ignored)
		return one(pairs(allMeet(func(x, y refMeeting) bool { return !(x.day == y.day && refHoursMeet(x, y)) })))
	case timetable.DifferentDays:
		return one(pairs(allMeet(func(x, y refMeeting) bool { return x.day != y.day })))
	case timetable.SameDayRel:
		for k := range ms {
			dk, d0 := refDays(ms[k]), refDays(ms[0])
			if !subsetDays(dk, d0) || !subsetDays(d0, dk) {
				return one(1)
			}
		}
		return one(0)
	case timetable.Before: // every occupied minute of A before every start of B, in (day, time) order
		return one(consecutive(allMeet(func(x, y refMeeting) bool {
			return weekOrder(x.day)*1440+x.end-1 < weekOrder(y.day)*1440+y.start
		})))
	case timetable.BackToBack: // every meeting of B starts where some meeting of A ends, same day
		return one(consecutive(func(xs, ys []refMeeting) bool {
			for _, y := range ys {
				ok := false
				for _, x := range xs {
					ok = ok || x.day == y.day && x.end == y.start
				}
				if !ok {
					return false
				}
			}
			return true
		}))
	case timetable.SameRoom:
		room := ""
		for k := range ms {
			for _, x := range ms[k] {
				if x.room == "" {
					continue
				}
				if room == "" {
					room = x.room
				}
				if x.room != room {
					return one(1)
				}
			}
		}
		return one(0)
	case timetable.SameStart:
		for k := range ms {
			for _, x := range ms[k] {
				if x.start != ms[0][0].start {
					return one(1)
				}
			}
		}
		return one(0)
	case timetable.WithinHours:
		return one(pairs(allMeet(func(x, y refMeeting) bool {
			return x.start <= y.start && y.end <= x.end || y.start <= x.start && x.end <= y.end
		})))
	case timetable.DifferentHours:
		return one(pairs(allMeet(func(x, y refMeeting) bool { return !refHoursMeet(x, y) })))
	case timetable.DaysWithin:
		return one(pairs(func(x, y []refMeeting) bool {
			return subsetDays(refDays(x), refDays(y)) || subsetDays(refDays(y), refDays(x))
		}))
	case timetable.WeeksWithin:
		return one(pairs(func(x, y []refMeeting) bool {
			wx, wy := refWeeks(x), refWeeks(y)
			return wx&^wy == 0 || wy&^wx == 0
		}))
	case timetable.DifferentWeeks:
		return one(pairs(func(x, y []refMeeting) bool { return refWeeks(x)&refWeeks(y) == 0 }))
	case timetable.OverlapRel:
		return one(pairs(func(xs, ys []refMeeting) bool {
			for _, x := range xs {
				for _, y := range ys {
					if refSameDayWeek(x, y) && refHoursMeet(x, y) {
						return true
					}
				}
			}
			return false
		}))
	case timetable.NoOverlap:
		return one(pairs(allMeet(func(x, y refMeeting) bool { return !(refSameDayWeek(x, y) && refHoursMeet(x, y)) })))
	case timetable.DifferentRooms:
		return one(pairs(func(xs, ys []refMeeting) bool {
			return len(xs) == 0 || len(ys) == 0 || xs[0].room == "" || xs[0].room != ys[0].room
		}))
	case timetable.SamePeople:
		return one(pairs(allMeet(func(x, y refMeeting) bool {
			if !refSameDayWeek(x, y) {
				return true
			}
			if refHoursMeet(x, y) {
				return false
			}
			gap := max(x.start, y.start) - min(x.end, y.end)
			return gap >= t.TravelMinutes(x.room, y.room)
		})))
	case timetable.FirstBefore:
		return one(consecutive(func(xs, ys []refMeeting) bool {
			fa, fb := refWeeks(xs).First(), refWeeks(ys).First()
			if fa != fb {
				return fa < fb
			}
			first := func(ms []refMeeting) refMeeting {
				best := ms[0]
				for _, m := range ms {
					if weekOrder(m.day) < weekOrder(best.day) {
						best = m
					}
				}
				return best
			}
			x, y := first(xs), first(ys)
			if x.day != y.day {
				return weekOrder(x.day) < weekOrder(y.day)
			}
			return x.end <= y.start
		}))
	case timetable.DaySpan:
		return one(pairs(allMeet(func(x, y refMeeting) bool {
			return !refSameDayWeek(x, y) || max(x.end, y.end)-min(x.start, y.start) <= n
		})))
	case timetable.MinGap:
		return one(pairs(allMeet(func(x, y refMeeting) bool {
			return !refSameDayWeek(x, y) || x.end+n <= y.start || y.end+n <= x.start
		})))
	case timetable.MaxDays:
		all := map[time.Weekday]bool{}
		for k := range ms {
			for d := range refDays(ms[k]) {
				all[d] = true
			}
		}
		return max(0, len(all)-n), max(0, len(all)-n)
	case timetable.MaxDayMinutes, timetable.MaxBreaks, timetable.MaxBlock:
		sum := 0
		for w := 1; w <= t.TeachingWeeks(); w++ {
			for d := time.Sunday; d <= time.Saturday; d++ {
				var day []refMeeting
				for k := range ms {
					for _, x := range ms[k] {
						if x.day == d && x.weeks.Has(w) {
							day = append(day, x)
						}
					}
				}
				sum += refDayCount(rel, day)
			}
		}
		return sum / t.TeachingWeeks(), sum
	}
	return 0, 0
}

// refDayCount is the per-week-and-day part of the three kinds whose count
// is summed over weeks and days.
func refDayCount(rel timetable.Relation, day []refMeeting) int {
	if rel.Kind == timetable.MaxDayMinutes {
		total := 0
		for _, x := range day {
			total += x.end - x.start
		}
		return max(0, total-rel.N)
	}
	sort.Slice(day, func(i, j int) bool { return day[i].start < day[j].start })
	type block struct{ first, last, n int }
	var blocks []block
	for _, x := range day {
		if k := len(blocks) - 1; k >= 0 && x.start <= blocks[k].last+rel.M {
			blocks[k].last = max(blocks[k].last, x.end)
			blocks[k].n++
			continue
		}
		blocks = append(blocks, block{x.start, x.end, 1})
	}
	if rel.Kind == timetable.MaxBreaks {
		return max(0, len(blocks)-(rel.N+1))
	}
	long := 0
	for _, bl := range blocks {
		if bl.n >= 2 && bl.last-bl.first > rel.N {
			long++
		}
	}
	return long
}

func equalInts(a, b []int) bool {
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

// refClash reports whether two sections of a share a room at overlapping
// meetings (the room half of "one meeting at a time", which the engine's
// room layer states; the tests accept engines with or without it).
func refClash(t *timetable.Term, a refAssign) bool {
	for s := range t.Sections {
		for u := s + 1; u < len(t.Sections); u++ {
			if a.room[s] < 0 || a.room[s] != a.room[u] {
				continue
			}
			for _, x := range refMeetings(t, a, s) {
				for _, y := range refMeetings(t, a, u) {
					if refSameDayWeek(x, y) && refHoursMeet(x, y) {
						return true
					}
				}
			}
		}
	}
	return false
}

// refAll enumerates every full assignment of the term's pattern sections:
// each pattern, and each acceptable room of RoomChoices (or none for
// sections that take no room).
func refAll(t *timetable.Term) []refAssign {
	out := []refAssign{{time: make([]int, len(t.Sections)), room: make([]int, len(t.Sections))}}
	ridx := t.RoomIndex()
	for s := range t.Sections {
		sec := &t.Sections[s]
		var next []refAssign
		for _, a := range out {
			for i := range sec.Times {
				rooms := []int{-1}
				if !sec.NoRoom {
					rooms = nil
					for _, rc := range sec.RoomChoices {
						rooms = append(rooms, ridx[rc.Room])
					}
				}
				for _, r := range rooms {
					c := refAssign{time: append([]int(nil), a.time...), room: append([]int(nil), a.room...)}
					c.time[s], c.room[s] = i, r
					next = append(next, c)
				}
			}
		}
		out = next
	}
	return out
}
