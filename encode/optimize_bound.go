package encode

import (
	"slices"

	"github.com/termwright/termwright/timetable"
)

// startBound starts the lower bound from timetable.CountingBound: what
// every legal timetable must pay, counted from the term alone (a section
// larger than every room it may use, fewer usable days than its minimum,
// a meeting whose every legal place is avoided, ...). The engine's
// core-guided bounds raise it later, level by level. Both are valid lower
// bounds on the best timetable's cost at each level (the engine's under
// the higher levels at their optimum, which the best timetable has), so
// their maximum per level is one too.
func (o *optRun) startBound() {
	var floor timetable.CostReport
	if o.opt.floor != nil {
		floor = *o.opt.floor
	} else {
		floor = timetable.CountingBound(o.t, o.opt.Keep)
	}
	if o.opt.noFloor {
		floor = timetable.CostReport{ByLevel: map[int]int64{}}
	}
	o.bound = o.levelsOf(floor)
	o.engineBound = make([]int64, len(o.levels))
	o.timeFloor = make([]int64, len(o.levels))
	for _, c := range floor.Criteria {
		if k := slices.Index(o.levels, c.Level); k >= 0 && c.Weight != 0 && !slices.Contains(roomCriteria, c.Name) {
			o.timeFloor[k] += c.Cost
		}
	}
}

// timeBound is the lower bound on the time part of the cost (every
// criterion but the room-dependent ones): the engine's bound, or the
// counting bound of the time criteria where that is higher. The room
// floors in bound say nothing about the time part.
func (o *optRun) timeBound() []int64 {
	return maxPerLevel(o.engineBound, o.timeFloor)
}

// maxPerLevel is the larger of two bounds at each level.
func maxPerLevel(a, b []int64) []int64 {
	out := slices.Clone(a)
	for i := range out {
		if i < len(b) {
			out[i] = max(out[i], b[i])
		}
	}
	return out
}
