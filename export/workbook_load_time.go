package export

import (
	"math"
	"sort"
	"time"

	"github.com/termwright/termwright/timetable"
)

// Column headers of the Load sheet's tables for a timetable with pattern
// placements, where meetings need not fill whole periods: the same
// figures in hours.
var (
	loadStaffHourColumns = []string{"Staff ID", "Name", "Sections", "Meetings per week", "Weekly hours",
		"Busiest day (hours)", "Limit per day (periods)", "Hours over the term"}
	loadRoomHourColumns = []string{"Room", "Building", "Capacity", "Largest class", "Meetings",
		"Occupied hours a week", "Grid hours a week", "Utilisation"}
)

// span is a piece of a day in minutes, from..to.
type span struct{ from, to timetable.Clock }

// busyMinutes is the length of the union of the meetings' times on each
// day (a person or room busy in at least one week), and the union of all
// days.
func (v *view) busyMinutes(items []int) (perDay map[time.Weekday]int, total int) {
	byDay := map[time.Weekday][]span{}
	for _, i := range items {
		m := &v.meetings[i]
		byDay[m.day] = append(byDay[m.day], span{m.from, m.to})
	}
	perDay = map[time.Weekday]int{}
	for d, ss := range byDay {
		sort.Slice(ss, func(i, j int) bool { return ss[i].from < ss[j].from })
		n, end := 0, timetable.Clock(-1)
		for _, s := range ss {
			switch {
			case s.from >= end:
				n += int(s.to - s.from)
				end = s.to
			case s.to > end:
				n += int(s.to - end)
				end = s.to
			}
		}
		perDay[d] = n
		total += n
	}
	return perDay, total
}

// hours is minutes as hours, to two decimals.
func hours(minutes int) float64 { return math.Round(float64(minutes)/60*100) / 100 }

// staffLoadHours is one row of the staff table in hours.
func (v *view) staffLoadHours(id, name string, limit int, days *calendarInfo) []any {
	items := v.byStaff[id]
	sections := map[string]bool{}
	term := 0
	for _, i := range items {
		m := &v.meetings[i]
		sections[m.sec.ID] = true
		if days != nil {
			on, _ := v.occurrences(days, m)
			term += len(on) * int(m.to-m.from)
		}
	}
	perDay, week := v.busyMinutes(items)
	busiest := 0
	for _, n := range perDay {
		busiest = max(busiest, n)
	}
	out := []any{id, name, len(sections), len(items), hours(week), hours(busiest), "", ""}
	if limit > 0 {
		out[6] = limit
	}
	if days != nil {
		out[7] = hours(term)
	}
	return out
}

// roomLoadHours is one row of the room table in hours: the room's busy
// hours a week over the grid's hours (its rows' minutes on each of its
// days).
func (v *view) roomLoadHours(id string) []any {
	r := v.rooms[id]
	items := v.byRoom[id]
	largest := 0
	for _, i := range items {
		largest = max(largest, v.meetings[i].sec.Size)
	}
	_, busy := v.busyMinutes(items)
	grid := 0
	for _, row := range v.rows {
		grid += int(row.to-row.from) * len(v.days)
	}
	util := 0.0
	if grid > 0 {
		util = float64(busy) / float64(grid)
	}
	return []any{r.ID, r.Building, r.Capacity, largest, len(items), hours(busy), hours(grid), util}
}
