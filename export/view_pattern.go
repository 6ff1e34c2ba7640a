package export

import (
	"sort"
	"time"

	"github.com/termwright/termwright/timetable"
)

// patternMeetings resolves a placement of a pattern section: one meeting
// per day of its chosen meeting time, all with the choice's start, end and
// weeks. ok is false (and bad called) when the choice or room is unknown.
func (v *view) patternMeetings(p timetable.Placement, sec *timetable.Section, bad func(timetable.Placement, string, ...any)) ([]meeting, bool) {
	if p.Time < 1 || p.Time > len(sec.Times) {
		bad(p, "meeting time %d is not one of the section's meeting times (it has %d meeting time%s); choose one from its rows of the meeting times sheet", p.Time, len(sec.Times), plural(len(sec.Times)))
		return nil, false
	}
	c := sec.Times[p.Time-1]
	var room *timetable.Room
	if p.Room != "" {
		r, ok := v.rooms[p.Room]
		if !ok {
			bad(p, "room %q is not in the term's Rooms sheet; use a listed room", p.Room)
			return nil, false
		}
		room = r
	}
	days := c.Days.List()
	if len(days) == 0 {
		bad(p, "meeting time %d has no days; give it at least one day on the meeting times sheet", p.Time)
		return nil, false
	}
	out := make([]meeting, 0, len(days))
	for k, d := range days {
		out = append(out, meeting{sec: sec, num: p.Meeting, first: -1, last: -1, day: d, from: c.Start, to: c.End(),
			room: room, time: p.Time, days: c.Days, part: k, weeks: c.Weeks})
	}
	return out, true
}

// clockOrder sorts meetings of a term with pattern placements by day (week
// order), start, end, section, meeting number and day of the placement.
func clockOrder(a, b *meeting) bool {
	if da, db := timetable.WeekOrder(a.day), timetable.WeekOrder(b.day); da != db {
		return da < db
	}
	if a.from != b.from {
		return a.from < b.from
	}
	if a.to != b.to {
		return a.to < b.to
	}
	if a.sec.ID != b.sec.ID {
		return a.sec.ID < b.sec.ID
	}
	if a.num != b.num {
		return a.num < b.num
	}
	return a.part < b.part
}

// buildTimeGrid fills days, dayCol, rows, rowOf and has for a term whose
// timetable has pattern placements. Pattern times need not line up with
// the periods, so the rows are the pieces between consecutive clock times
// at which any period, meeting or unavailable time starts or ends,
// leaving out the pieces that no period or meeting covers (a break shows
// as a heavy rule, as between periods); writers draw them to scale. Days are those of the periods and of the
// meetings. Every row counts as existing on every day ("no such period"
// means nothing when a pattern may start at any time).
func (v *view) buildTimeGrid() {
	for i := range v.dayCol {
		v.dayCol[i] = -1
	}
	type span struct{ from, to timetable.Clock }
	var spans []span
	onDay := map[time.Weekday]bool{}
	for _, p := range v.t.Periods {
		spans = append(spans, span{p.Start, p.End})
		onDay[p.Day] = true
	}
	for i := range v.meetings {
		m := &v.meetings[i]
		spans = append(spans, span{m.from, m.to})
		onDay[m.day] = true
	}
	for i := 0; i < 7; i++ {
		if d := time.Weekday((i + 1) % 7); onDay[d] {
			v.dayCol[d] = len(v.days)
			v.days = append(v.days, d)
		}
	}
	points := map[timetable.Clock]bool{}
	for _, s := range spans {
		points[s.from], points[s.to] = true, true
	}
	for _, u := range v.t.Unavailable { // so that shading covers exactly the unavailable times
		points[u.From], points[u.To] = true, true
	}
	cuts := make([]timetable.Clock, 0, len(points))
	for c := range points {
		cuts = append(cuts, c)
	}
	sort.Slice(cuts, func(i, j int) bool { return cuts[i] < cuts[j] })
	for k := 0; k+1 < len(cuts); k++ {
		a, b := cuts[k], cuts[k+1]
		for _, s := range spans {
			if s.from <= a && b <= s.to {
				v.rows = append(v.rows, gridRow{a, b})
				break
			}
		}
	}
	v.rowOf = make([]int, len(v.t.Periods))
	for i, p := range v.t.Periods {
		v.rowOf[i] = v.rowStarting(p.Start)
	}
	v.has = make([][]bool, len(v.rows))
	for r := range v.has {
		v.has[r] = make([]bool, len(v.days))
		for c := range v.has[r] {
			v.has[r][c] = true
		}
	}
}

// rowStarting is the grid row that starts at c (rows are sorted by start).
func (v *view) rowStarting(c timetable.Clock) int {
	return sort.Search(len(v.rows), func(i int) bool { return v.rows[i].from >= c })
}

// placeRows sets the grid rows a meeting covers.
func (v *view) placeRows(m *meeting) {
	if !v.minutes {
		m.r0, m.r1 = v.rowOf[m.first], v.rowOf[m.last]
		return
	}
	m.r0 = v.rowStarting(m.from)
	m.r1 = max(sort.Search(len(v.rows), func(i int) bool { return v.rows[i].to >= m.to }), m.r0)
}

// masterItems lists the meetings that are rows of the master timetable:
// every grid meeting and the first day of every pattern placement, in
// meeting order.
func (v *view) masterItems() []int {
	out := make([]int, 0, len(v.meetings))
	for i := range v.meetings {
		if v.meetings[i].part == 0 {
			out = append(out, i)
		}
	}
	return out
}
