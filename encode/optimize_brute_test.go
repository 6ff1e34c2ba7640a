package encode

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"time"

	"github.com/termwright/termwright/timetable"
)

// randomSoftTerm makes a tiny term that exercises every soft criterion:
// two days of three or four periods, two or three sections (one of which
// may meet twice or for two periods), one or two rooms in buildings,
// enrolments, soft unavailability of staff, cohorts, sections and rooms,
// soft relations, and random weights and levels. With timeOnly the
// room-dependent criteria are switched off and no soft row depends on
// rooms, so the whole objective is what the engine encodes.
func randomSoftTerm(rng *rand.Rand, timeOnly bool) *timetable.Term {
	per := 3 + rng.IntN(2)
	b := newTerm(2, per)
	t := b.t
	buildings := []string{"North", "South", ""}
	nRooms := 1 + rng.IntN(2)
	for r := 0; r < nRooms; r++ {
		b.room(fmt.Sprintf("R%d", r+1), []int{12, 20, 30}[rng.IntN(3)])
		t.Rooms[r].Building = buildings[rng.IntN(len(buildings))]
	}
	t.SoftCapacity = rng.IntN(3) == 0
	nSecs := 2 + rng.IntN(2)
	long := rng.IntN(nSecs) // the one section that may be bigger
	for s := 0; s < nSecs; s++ {
		var opts []func(*timetable.Section)
		opts = append(opts, staffOf(fmt.Sprintf("T%d", rng.IntN(2))))
		if rng.IntN(3) > 0 {
			opts = append(opts, cohortsOf(fmt.Sprintf("Y%d", rng.IntN(2))))
		}
		m, l := 1, 1
		if s == long {
			switch rng.IntN(3) {
			case 0:
				m = 2
			case 1:
				l = 2
			}
		}
		opts = append(opts, meetings(m, l), sized([]int{10, 15, 25}[rng.IntN(3)]))
		if rng.IntN(6) == 0 {
			opts = append(opts, noRoom)
		}
		if m == 2 && rng.IntN(2) == 0 {
			opts = append(opts, sameDay, func(sec *timetable.Section) { sec.MinDays = 2 })
		}
		b.section(fmt.Sprintf("S%d", s), opts...)
	}
	for k := rng.IntN(4); k > 0; k-- {
		who, kind := t.Staff[rng.IntN(len(t.Staff))].ID, timetable.WhoStaff
		switch rng.IntN(4) {
		case 1:
			if len(t.Cohorts) > 0 {
				who, kind = t.Cohorts[rng.IntN(len(t.Cohorts))].ID, timetable.WhoCohort
			}
		case 2:
			who, kind = t.Sections[rng.IntN(nSecs)].ID, timetable.WhoSection
		case 3:
			if !timeOnly {
				who, kind = t.Rooms[rng.IntN(nRooms)].ID, timetable.WhoRoom
			}
		}
		from := 9 + rng.IntN(per)
		t.Unavailable = append(t.Unavailable, timetable.Unavailability{Who: who, Kind: kind,
			Day: time.Weekday(1 + rng.IntN(2)), From: timetable.Clock(from * 60), To: timetable.Clock((from + 1 + rng.IntN(2)) * 60),
			Weight: 1 + rng.IntN(3), Src: timetable.Source{Sheet: "Unavailable", Row: len(t.Unavailable) + 2}})
	}
	if rng.IntN(2) == 0 {
		kinds := timetable.RelationKinds[:7] // grid rows take the first seven kinds (times_rel.go)
		kind := kinds[rng.IntN(len(kinds))].Kind
		for timeOnly && kind == timetable.SameRoom {
			kind = kinds[rng.IntN(len(kinds))].Kind
		}
		x, y := rng.IntN(nSecs), rng.IntN(nSecs-1)
		if y >= x {
			y++
		}
		if kind == timetable.SameTime {
			t.Sections[y].Meetings, t.Sections[y].Length = t.Sections[x].Meetings, t.Sections[x].Length
		}
		t.Relations = append(t.Relations, timetable.Relation{Kind: kind, Sections: []string{t.Sections[x].ID, t.Sections[y].ID},
			Weight: 1 + rng.IntN(4), Src: timetable.Source{Sheet: "Relations", Row: 2}})
	}
	for st := 0; st < 3; st++ {
		for s := range t.Sections {
			if rng.IntN(2) == 0 {
				t.Enrolments = append(t.Enrolments, timetable.Enrolment{Student: fmt.Sprintf("P%d", st), Section: t.Sections[s].ID})
			}
		}
	}
	t.Weights = map[string]timetable.Weight{}
	for _, c := range timetable.Criteria {
		w := timetable.Weight{Weight: rng.IntN(4), Level: rng.IntN(3)}
		room := slices.Contains(roomCriteria, c.Name)
		if timeOnly && room {
			w.Weight = 0
		}
		t.Weights[c.Name] = w
	}
	return t
}

// bruteOptimum searches every schedule of a tiny term (every set of start
// periods of every section, every room for every meeting) and returns the
// least cost vector (timetable.Cost with kept, per level of termLevels)
// among those timetable.Check accepts. It shares nothing with the encoder.
func bruteOptimum(t *timetable.Term, kept *timetable.Schedule) ([]int64, bool) {
	levels := termLevels(t)
	opts := bruteOptions(t)
	var best []int64
	var dfs func(s int, pl []timetable.Placement)
	dfs = func(s int, pl []timetable.Placement) {
		sched := &timetable.Schedule{Placements: pl}
		hard := timetable.HardViolations(timetable.Check(t, sched))
		for _, v := range hard {
			if bruteMonotone[v.Rule] || s == len(t.Sections) {
				return
			}
		}
		if s == len(t.Sections) {
			rep := timetable.Cost(t, sched, kept)
			v := make([]int64, len(levels))
			for i, l := range levels {
				v[i] = rep.ByLevel[l]
			}
			if best == nil || slices.Compare(v, best) < 0 {
				best = v
			}
			return
		}
		for _, o := range opts[s] {
			dfs(s+1, append(pl[:len(pl):len(pl)], o...))
		}
	}
	dfs(0, nil)
	return best, best != nil
}

// bruteMonotone are the hard rules whose violations no further meeting can
// repair: the brute-force search prunes on them.
var bruteMonotone = map[string]bool{
	timetable.RuleStaffClash: true, timetable.RuleCohortClash: true, timetable.RuleRoomClash: true,
	timetable.RuleSelfOverlap: true, timetable.RuleCapacity: true, timetable.RuleFeatures: true,
	timetable.RuleRoomNotAllowed: true, timetable.RuleUnavailable: true, timetable.RuleSameDay: true,
	timetable.RuleMaxPerDay: true, timetable.RuleMaxConsecutive: true, timetable.RuleNoRoom: true,
}
