package timetable

import (
	"cmp"
	"slices"
	"strings"
)

// Change kinds of a Change.
const (
	ChangeUnchanged = "unchanged" // the new timetable holds the meeting at its old day (or days of its pattern), time and room, in the same weeks
	ChangeMoved     = "moved"     // paired with a new meeting at another day, time or room, or in other weeks (another meeting time of a pattern section)
	ChangeAdded     = "added"     // a new meeting with no old one to pair with
	ChangeDropped   = "dropped"   // an old meeting with no new one to pair with
)

// What a moved meeting changed, in Change.What.
const (
	ChangedDay   = "day"
	ChangedTime  = "time" // start or end
	ChangedRoom  = "room"
	ChangedWeeks = "weeks"
)

// Change is one meeting of the old timetable, of the new one, or of both
// paired.
type Change struct {
	Section string
	Kind    string   // ChangeUnchanged, ChangeMoved, ChangeAdded or ChangeDropped
	Old     *Meeting // nil for added meetings
	New     *Meeting // nil for dropped meetings
	What    []string // for ChangeMoved: ChangedDay, ChangedTime, ChangedRoom, ChangedWeeks in that order
}

// Comparison is two timetables' meetings paired section by section.
type Comparison struct {
	// Changes holds every meeting of both timetables once: per section in
	// ID order, old meetings in start order (each with its partner, if
	// any), then the new meetings no old one paired with.
	Changes []Change
}

// Compare pairs the meetings of an old and a current timetable. Per section, an old
// meeting is unchanged when a new meeting of its section sits at its day,
// start and room (a maximum matching on equal places; among equal places,
// meetings with the same end and weeks pair first). The rest pair by a
// minimum-cost assignment in which another day costs more than any
// change of time, room and weeks together, another start time more than
// room and weeks, another room more than other weeks or end: so a meeting
// that stays on its day pairs before one that leaves it. What is left is
// dropped (old) or added (new). Meeting numbers play no part: renumbering
// the meetings of a section changes nothing.
func Compare(old, cur []Meeting) *Comparison {
	a, b := bySection(old), bySection(cur)
	ids := make([]string, 0, len(a)+len(b))
	for id := range a {
		ids = append(ids, id)
	}
	for id := range b {
		if _, ok := a[id]; !ok {
			ids = append(ids, id)
		}
	}
	slices.Sort(ids)
	c := &Comparison{}
	for _, id := range ids {
		c.Changes = append(c.Changes, pairSection(id, a[id], b[id])...)
	}
	return c
}

// bySection groups copies of the meetings by section, each group in start
// order (day, start, room, number).
func bySection(ms []Meeting) map[string][]*Meeting {
	out := map[string][]*Meeting{}
	for i := range ms {
		m := ms[i]
		out[m.Section] = append(out[m.Section], &m)
	}
	for _, g := range out {
		slices.SortStableFunc(g, func(x, y *Meeting) int {
			return cmp.Or(cmp.Compare(WeekOrder(x.Day), WeekOrder(y.Day)), cmp.Compare(x.Start, y.Start),
				strings.Compare(x.Room, y.Room), cmp.Compare(x.Number, y.Number))
		})
	}
	return out
}

// samePlace reports whether two meetings are at the same day (all the
// days of a meeting pattern), start and room.
func samePlace(x, y *Meeting) bool {
	return x.AllDays() == y.AllDays() && x.Start == y.Start && x.Room == y.Room
}

// AllDays is every day the meeting takes place: Days for a meeting pattern,
// else the one Day.
func (m *Meeting) AllDays() DaySet {
	if m.Days != 0 {
		return m.Days
	}
	return DaysOf(m.Day)
}

// DayText is the meeting's day as the timetable writes it: "Tue", or the
// days of a meeting pattern, "Mon Wed Fri".
func (m *Meeting) DayText() string {
	if m.Days != 0 {
		return m.Days.String()
	}
	return DayName(m.Day)
}

// pairSection is Compare for one section's old meetings a and new meetings b.
func pairSection(id string, a, b []*Meeting) []Change {
	partner := make([]int, len(a)) // old index -> new index, -1 when none
	taken := make([]bool, len(b))
	for i := range partner {
		partner[i] = -1
	}
	// Equal places only: any greedy matching inside each class of equal
	// places is maximum, and pairing identical meetings first within a
	// class keeps as many fully unchanged as possible.
	for _, exact := range []bool{true, false} {
		for i, x := range a {
			for j, y := range b {
				if partner[i] < 0 && !taken[j] && samePlace(x, y) && (!exact || len(what(x, y)) == 0) {
					partner[i], taken[j] = j, true
				}
			}
		}
	}
	var left, right []int
	for i := range a {
		if partner[i] < 0 {
			left = append(left, i)
		}
	}
	for j := range b {
		if !taken[j] {
			right = append(right, j)
		}
	}
	if len(left) > 0 && len(right) > 0 {
		cost := make([][]int64, len(left))
		for i, x := range left {
			cost[i] = make([]int64, len(right))
			for j, y := range right {
				cost[i][j] = distance(a[x], b[y])
			}
		}
		for i, j := range LeastCostPairs(cost) {
			if j >= 0 {
				partner[left[i]], taken[right[j]] = right[j], true
			}
		}
	}
	var out []Change
	for i, x := range a {
		if partner[i] < 0 {
			out = append(out, Change{Section: id, Kind: ChangeDropped, Old: x})
			continue
		}
		y := b[partner[i]]
		ch := Change{Section: id, Kind: ChangeUnchanged, Old: x, New: y, What: what(x, y)}
		if len(ch.What) > 0 {
			ch.Kind = ChangeMoved
		}
		out = append(out, ch)
	}
	for j, y := range b {
		if !taken[j] {
			out = append(out, Change{Section: id, Kind: ChangeAdded, New: y})
		}
	}
	return out
}

// what lists what differs between two meetings of a section.
func what(x, y *Meeting) []string {
	var out []string
	if x.AllDays() != y.AllDays() {
		out = append(out, ChangedDay)
	}
	if x.Start != y.Start || (x.End != y.End && x.End != 0 && y.End != 0) {
		out = append(out, ChangedTime)
	}
	if x.Room != y.Room {
		out = append(out, ChangedRoom)
	}
	if x.Weeks != y.Weeks {
		out = append(out, ChangedWeeks)
	}
	return out
}

// distance is the cost of pairing old meeting x with new meeting y: 8 for
// another day, 4 for another start, 2 for another room, 1 for another end
// or other weeks (so each weighs more than all the lighter ones together).
func distance(x, y *Meeting) int64 {
	var c int64
	if x.AllDays() != y.AllDays() {
		c += 8
	}
	if x.Start != y.Start {
		c += 4
	}
	if x.Room != y.Room {
		c += 2
	}
	if x.End != y.End || x.Weeks != y.Weeks {
		c++
	}
	return c
}

// Count is the number of changes of kind.
func (c *Comparison) Count(kind string) int {
	n := 0
	for _, ch := range c.Changes {
		if ch.Kind == kind {
			n++
		}
	}
	return n
}

// Renumber gives each new meeting of s (the new timetable, as read by
// ReadSchedule for the same file as the comparison's new meetings) the
// number of the old meeting it is paired with, so that a meeting keeps its
// identity (for example its calendar UID) when the sections' meetings were
// numbered in another order; meetings without a partner take the lowest
// numbers left. It returns a renumbered copy of s, with s's sectioned
// students (Enrolments) kept.
func (c *Comparison) Renumber(s *Schedule) *Schedule {
	type key struct {
		sec string
		num int
	}
	to := map[key]int{}
	used := map[string]map[int]bool{}
	for _, ch := range c.Changes {
		if ch.Old != nil && ch.New != nil {
			to[key{ch.Section, ch.New.Number}] = ch.Old.Number
			if used[ch.Section] == nil {
				used[ch.Section] = map[int]bool{}
			}
			used[ch.Section][ch.Old.Number] = true
		}
	}
	out := &Schedule{Placements: slices.Clone(s.Placements), Enrolments: slices.Clone(s.Enrolments)}
	for i, p := range s.Placements {
		if n, ok := to[key{p.Section, p.Meeting}]; ok {
			out.Placements[i].Meeting = n
		}
	}
	for i, p := range s.Placements {
		if _, ok := to[key{p.Section, p.Meeting}]; ok {
			continue
		}
		if used[p.Section] == nil {
			used[p.Section] = map[int]bool{}
		}
		n := 1
		for used[p.Section][n] {
			n++
		}
		used[p.Section][n] = true
		out.Placements[i].Meeting = n
	}
	return out
}
