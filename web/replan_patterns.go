package web

import (
	"slices"

	"github.com/termwright/termwright/timetable"
)

// patternPins holds a locked pattern section where it is during a re-plan.
// A pattern section has no fixed meetings; instead the working copy of the
// term offers it only its locked meeting time (and room), so the search
// cannot move it. Its choice index in the working term is therefore 1, and
// timetables cross between the two numberings with toWork and fromWork.
type patternPins struct {
	choice map[string]int // section -> locked choice index in the real term
}

// pinPatterns narrows, in work (a copy made by lockedTerm whose Sections
// slice may be changed), every locked pattern section of sched to its
// current meeting time and room.
func pinPatterns(work *timetable.Term, sched *timetable.Schedule, locks map[meetingKey]bool) patternPins {
	pins := patternPins{choice: map[string]int{}}
	idx := work.SectionIndex()
	for _, k := range lockedList(locks) {
		si, ok := idx[k.Section]
		if !ok || !work.Sections[si].UsesTimes() {
			continue
		}
		for _, pl := range sched.Placements {
			if pl.Section != k.Section || pl.Time < 1 || pl.Time > len(work.Sections[si].Times) {
				continue
			}
			sc := &work.Sections[si]
			sc.Times = []timetable.TimeChoice{sc.Times[pl.Time-1]}
			if pl.Room != "" {
				sc.RoomChoices = []timetable.RoomChoice{roomChoiceFor(sc, pl.Room)}
			}
			pins.choice[k.Section] = pl.Time
		}
	}
	return pins
}

// roomChoiceFor is the section's room choice for room, keeping its weight,
// or a plain choice when the section lists no room choices.
func roomChoiceFor(sc *timetable.Section, room string) timetable.RoomChoice {
	for _, rc := range sc.RoomChoices {
		if rc.Room == room {
			return rc
		}
	}
	return timetable.RoomChoice{Room: room}
}

// toWork renumbers the pinned sections' choices of s for the working term.
func (p patternPins) toWork(s *timetable.Schedule) *timetable.Schedule {
	return p.renumber(s, func(string) int { return 1 })
}

// fromWork renumbers a working-term timetable back to the real term.
func (p patternPins) fromWork(s *timetable.Schedule) *timetable.Schedule {
	return p.renumber(s, func(sec string) int { return p.choice[sec] })
}

func (p patternPins) renumber(s *timetable.Schedule, to func(string) int) *timetable.Schedule {
	if len(p.choice) == 0 || s == nil {
		return s
	}
	out := &timetable.Schedule{Placements: slices.Clone(s.Placements), Enrolments: s.Enrolments}
	for i := range out.Placements {
		if _, ok := p.choice[out.Placements[i].Section]; ok && out.Placements[i].Time > 0 {
			out.Placements[i].Time = to(out.Placements[i].Section)
		}
	}
	return out
}
