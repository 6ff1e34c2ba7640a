package benchfmt

import "github.com/termwright/termwright/timetable"

// CTTHard counts violations of the competition's hard constraints
// (Di Gaspero, McCollum, Schaerf 2007, "hard constraints"); a timetable is
// feasible when every count is zero.
//
//   - Meetings: all meetings of a course are scheduled, at distinct periods.
//     Counts, per course, each meeting missing or extra, and each meeting
//     sharing a period with an earlier one of the same course; plus each
//     placement naming no known course, room or period.
//   - Conflicts: meetings of courses in one curriculum or taught by one
//     teacher are at distinct periods. Counts, per period, each pair of
//     distinct courses with meetings there that share a curriculum or a
//     teacher.
//   - Availability: a course is not scheduled in a period it is unavailable.
//     Counts each meeting in a period covered by a hard unavailability of
//     its course (or of its teacher, curriculum or room, which .ctt files do
//     not have but a Term may).
//   - RoomOccupancy: one meeting per room and period. Counts, per room and
//     period, the meetings beyond the first.
type CTTHard struct {
	Meetings      int `json:"meetings"`
	Conflicts     int `json:"conflicts"`
	Availability  int `json:"availability"`
	RoomOccupancy int `json:"room_occupancy"`
}

// Total is the number of violations of every kind.
func (h CTTHard) Total() int { return h.Meetings + h.Conflicts + h.Availability + h.RoomOccupancy }

// CTTHardViolations counts the violations of the competition's hard
// constraints by s on t.
func CTTHardViolations(t *timetable.Term, s *timetable.Schedule) CTTHard {
	var h CTTHard
	secIdx := t.SectionIndex()
	roomIdx := t.RoomIndex()
	nP := len(t.Periods)
	count := make([]int, len(t.Sections))
	at := make([][]int, nP)             // per period: section indexes there (with repeats)
	roomUse := make(map[[2]int]int, nP) // (room, period) -> meetings
	blocks := newITCBlocks(t)
	for _, p := range s.Placements {
		si, ok := secIdx[p.Section]
		ri, rok := roomIdx[p.Room]
		if !ok || !rok || p.Period < 0 || p.Period >= nP {
			h.Meetings++
			continue
		}
		count[si]++
		at[p.Period] = append(at[p.Period], si)
		roomUse[[2]int{ri, p.Period}]++
		if blocks.blocked(t, &t.Sections[si], p) {
			h.Availability++
		}
	}
	for si, sec := range t.Sections {
		if d := count[si] - sec.Meetings; d > 0 {
			h.Meetings += d
		} else {
			h.Meetings -= d
		}
	}
	for _, here := range at {
		seen := map[int]bool{}
		var distinct []int
		for _, si := range here {
			if seen[si] {
				h.Meetings++ // same course twice in one period
				continue
			}
			seen[si] = true
			distinct = append(distinct, si)
		}
		for i := range distinct {
			for j := i + 1; j < len(distinct); j++ {
				if itcConflict(&t.Sections[distinct[i]], &t.Sections[distinct[j]]) {
					h.Conflicts++
				}
			}
		}
	}
	for _, n := range roomUse {
		if n > 1 {
			h.RoomOccupancy += n - 1
		}
	}
	return h
}

// itcConflict reports whether two courses share a curriculum or a teacher.
func itcConflict(a, b *timetable.Section) bool {
	return sharesString(a.Cohorts, b.Cohorts) || sharesString(a.Staff, b.Staff)
}

func sharesString(a, b []string) bool {
	for _, x := range a {
		for _, y := range b {
			if x == y {
				return true
			}
		}
	}
	return false
}

// itcBlocks indexes the hard unavailability rows of a term by kind and ID.
type itcBlocks map[timetable.WhoKind]map[string][]*timetable.Unavailability

func newITCBlocks(t *timetable.Term) itcBlocks {
	b := itcBlocks{}
	for i := range t.Unavailable {
		u := &t.Unavailable[i]
		if !u.Hard {
			continue
		}
		if b[u.Kind] == nil {
			b[u.Kind] = map[string][]*timetable.Unavailability{}
		}
		b[u.Kind][u.Who] = append(b[u.Kind][u.Who], u)
	}
	return b
}

// blocked reports whether meeting p of sec falls in a hard unavailability
// of the course, its teacher, a curriculum or its room.
func (b itcBlocks) blocked(t *timetable.Term, sec *timetable.Section, p timetable.Placement) bool {
	per := t.Periods[p.Period]
	covers := func(kind timetable.WhoKind, who string) bool {
		for _, u := range b[kind][who] {
			if u.Covers(per) {
				return true
			}
		}
		return false
	}
	if covers(timetable.WhoSection, sec.ID) || covers(timetable.WhoRoom, p.Room) {
		return true
	}
	for _, st := range sec.Staff {
		if covers(timetable.WhoStaff, st) {
			return true
		}
	}
	for _, c := range sec.Cohorts {
		if covers(timetable.WhoCohort, c) {
			return true
		}
	}
	return false
}
