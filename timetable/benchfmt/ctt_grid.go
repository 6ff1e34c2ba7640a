package benchfmt

import "github.com/termwright/termwright/timetable"

// itcGrid numbers the periods of a term the way the competition does: a
// day number (0 = the first day of the grid) and a slot within the day
// (0 = the day's first period), both in grid order.
type itcGrid struct {
	day    []int          // per period index: its day number
	slot   []int          // per period index: its slot within the day
	at     map[[2]int]int // (day, slot) -> period index
	days   int            // number of days in the grid
	perDay []int          // per day number: number of slots
}

// newITCGrid numbers the periods of t; Term.Periods is sorted by day and
// start time, so numbering follows slice order.
func newITCGrid(t *timetable.Term) *itcGrid {
	g := &itcGrid{day: make([]int, len(t.Periods)), slot: make([]int, len(t.Periods)), at: make(map[[2]int]int, len(t.Periods))}
	d, s := -1, 0
	for i, p := range t.Periods {
		if i == 0 || p.Day != t.Periods[i-1].Day {
			d++
			s = 0
			g.perDay = append(g.perDay, 0)
		}
		g.day[i], g.slot[i] = d, s
		g.at[[2]int{d, s}] = i
		g.perDay[d]++
		s++
	}
	g.days = d + 1
	return g
}

// period returns the index of (day, slot), or -1 when the grid has no such period.
func (g *itcGrid) period(day, slot int) int {
	if i, ok := g.at[[2]int{day, slot}]; ok {
		return i
	}
	return -1
}

// adjacent reports whether periods a and b are on the same day with slots
// one apart (the competition's "adjacent" for curriculum compactness).
func (g *itcGrid) adjacent(a, b int) bool {
	if g.day[a] != g.day[b] {
		return false
	}
	d := g.slot[a] - g.slot[b]
	return d == 1 || d == -1
}
