package benchfmt

import (
	"math"

	"github.com/termwright/termwright/timetable"
)

// CTTParts is the competition's soft cost of a timetable by component,
// each already multiplied by its weight (Di Gaspero, McCollum, Schaerf 2007,
// "soft constraints"):
//
//   - RoomCapacity: for each meeting, the students of its course over the
//     capacity of its room (weight 1).
//   - MinWorkingDays: for each course, 5 per day below its minimum number of
//     working days (the distinct days its meetings use).
//   - CurriculumCompactness: for each curriculum, 2 per meeting of the
//     curriculum that is isolated: no meeting of the same curriculum in the
//     period right before or right after it on the same day.
//   - RoomStability: for each course, 1 per distinct room used beyond the
//     first.
type CTTParts struct {
	RoomCapacity          int `json:"room_capacity"`
	MinWorkingDays        int `json:"min_working_days"`
	CurriculumCompactness int `json:"curriculum_compactness"`
	RoomStability         int `json:"room_stability"`
}

// Total is the sum of the parts (the competition's objective).
// A sum that does not fit an int is clamped to math.MaxInt.
func (p CTTParts) Total() int {
	return addClamped(addClamped(p.RoomCapacity, p.MinWorkingDays), addClamped(p.CurriculumCompactness, p.RoomStability))
}

// addClamped adds two non-negative costs, clamping at math.MaxInt instead
// of wrapping to a negative number.
func addClamped(a, b int) int {
	if a > math.MaxInt-b {
		return math.MaxInt
	}
	return a + b
}

// mulClamped multiplies two non-negative numbers, clamping at math.MaxInt.
func mulClamped(a, b int) int {
	if a != 0 && b > math.MaxInt/a {
		return math.MaxInt
	}
	return a * b
}

// CTTCost evaluates the competition's soft cost of s directly from its
// published definitions, reading the Term as ReadCTT builds it: a course is
// a Section (students = Size, meetings = placements, minimum working days =
// MinDays), a curriculum is a Cohort (its courses are the sections listing
// it), days and slots follow the grid order. It shares no code with Cost, so
// that the two check each other. Placements naming an unknown section, room
// or period are skipped (CTTHardViolations counts them); meetings that
// clash are still each counted, as the competition's validator does.
func CTTCost(t *timetable.Term, s *timetable.Schedule) (total int, parts CTTParts) {
	g := newITCGrid(t)
	secIdx := t.SectionIndex()
	roomIdx := t.RoomIndex()
	cohortIdx := t.CohortIndex()
	nP := len(t.Periods)

	days := make([]map[int]bool, len(t.Sections))     // per course: days used
	rooms := make([]map[string]bool, len(t.Sections)) // per course: rooms used
	busy := make([][]int, len(t.Cohorts))             // per curriculum and period: meetings
	for i := range busy {
		busy[i] = make([]int, nP)
	}
	for _, p := range s.Placements {
		si, ok := secIdx[p.Section]
		ri, rok := roomIdx[p.Room]
		if !ok || !rok || p.Period < 0 || p.Period >= nP {
			continue
		}
		sec := &t.Sections[si]
		if capacity := max(t.Rooms[ri].Capacity, 0); sec.Size > capacity {
			parts.RoomCapacity = addClamped(parts.RoomCapacity, mulClamped(ITCWeightRoomCapacity, sec.Size-capacity))
		}
		if days[si] == nil {
			days[si], rooms[si] = map[int]bool{}, map[string]bool{}
		}
		days[si][g.day[p.Period]] = true
		rooms[si][p.Room] = true
		for _, c := range sec.Cohorts {
			if ci, ok := cohortIdx[c]; ok {
				busy[ci][p.Period]++
			}
		}
	}
	for si, sec := range t.Sections {
		if missing := sec.MinDays - len(days[si]); missing > 0 {
			parts.MinWorkingDays = addClamped(parts.MinWorkingDays, mulClamped(ITCWeightMinWorkingDays, missing))
		}
		if len(rooms[si]) > 1 {
			parts.RoomStability += ITCWeightRoomStability * (len(rooms[si]) - 1)
		}
	}
	for _, b := range busy {
		for p := 0; p < nP; p++ {
			if b[p] == 0 {
				continue
			}
			before := p > 0 && g.adjacent(p-1, p) && b[p-1] > 0
			after := p+1 < nP && g.adjacent(p, p+1) && b[p+1] > 0
			if !before && !after {
				parts.CurriculumCompactness = addClamped(parts.CurriculumCompactness, mulClamped(ITCWeightCompactness, b[p]))
			}
		}
	}
	return parts.Total(), parts
}
