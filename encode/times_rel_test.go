package encode

import (
	"context"
	"fmt"
	"math/rand"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// relTestTerm makes a small random pattern term with one relation row of
// kind k over nSec sections: patterns from a few day sets, starts and
// lengths, in all, odd, even or the first two of four teaching weeks; room
// lists over three rooms in two buildings with travel between them when
// rooms matter. Every criterion weighs 0 but "soft relations", so that the
// engine's objective is the row's cost alone.
func relTestTerm(rng *rand.Rand, k timetable.RelationKind, hard bool, nSec int) *timetable.Term {
	t := &timetable.Term{
		Name:     "Relation test term",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 10, 1, 0, 0, 0, 0, time.UTC), // 4 teaching weeks
		Weights:  map[string]timetable.Weight{},
	}
	for _, c := range timetable.Criteria {
		t.Weights[c.Name] = timetable.Weight{Weight: 0, Level: 1}
	}
	t.Weights[timetable.CritSoftRelations] = timetable.Weight{Weight: 1, Level: 1}
	weeks := []timetable.WeekSet{t.AllWeeks(), 0b0101, 0b1010, 0b0011}
	days := []timetable.DaySet{
		timetable.DaysOf(time.Monday), timetable.DaysOf(time.Tuesday), timetable.DaysOf(time.Wednesday),
		timetable.DaysOf(time.Monday, time.Wednesday), timetable.DaysOf(time.Tuesday, time.Thursday),
		timetable.DaysOf(time.Monday, time.Tuesday), timetable.DaysOf(time.Monday, time.Wednesday, time.Friday),
	}
	starts := []timetable.Clock{8 * 60, 8*60 + 30, 9 * 60, 9*60 + 50, 10 * 60, 11 * 60}
	lengths := []int{50, 60, 80, 110}
	rooms := k == timetable.SameRoom || k == timetable.DifferentRooms || k == timetable.SamePeople
	if rooms {
		t.Rooms = []timetable.Room{{ID: "R1", Capacity: 40, Building: "North"}, {ID: "R2", Capacity: 40, Building: "North"}, {ID: "R3", Capacity: 40, Building: "South"}}
		t.Travel = []timetable.Travel{{From: "North", To: "South", Minutes: 15}, {From: "R1", To: "R2", Minutes: 5}}
	}
	var ids []string
	for s := 0; s < nSec; s++ {
		sec := timetable.Section{ID: fmt.Sprintf("S%d", s+1), Meetings: 1, Size: 20, NoRoom: !rooms,
			Src: timetable.Source{Sheet: "Sections", Row: s + 2}}
		n := 2 + rng.Intn(3)
		seen := map[string]bool{}
		for len(sec.Times) < n {
			tc := timetable.TimeChoice{Days: days[rng.Intn(len(days))], Start: starts[rng.Intn(len(starts))],
				Minutes: lengths[rng.Intn(len(lengths))], Weeks: weeks[rng.Intn(len(weeks))]}
			if key := fmt.Sprint(tc); !seen[key] {
				seen[key] = true
				sec.Times = append(sec.Times, tc)
			}
		}
		if rooms {
			for _, r := range rng.Perm(3)[:1+rng.Intn(2)] {
				sec.RoomChoices = append(sec.RoomChoices, timetable.RoomChoice{Room: t.Rooms[r].ID})
			}
		}
		t.Sections = append(t.Sections, sec)
		ids = append(ids, sec.ID)
	}
	rel := timetable.Relation{Kind: k, Sections: ids, Hard: hard, Src: timetable.Source{Sheet: "Relations", Row: 2}}
	if !hard {
		rel.Weight = 1 + rng.Intn(6) // below, at and above the 4 teaching weeks
	}
	switch k {
	case timetable.DaySpan:
		rel.N = []int{100, 150, 200}[rng.Intn(3)]
	case timetable.MinGap:
		rel.N = []int{0, 10, 30}[rng.Intn(3)]
	case timetable.MaxDays:
		rel.N = rng.Intn(3)
	case timetable.MaxDayMinutes:
		rel.N = []int{50, 90, 130}[rng.Intn(3)]
	case timetable.MaxBreaks:
		rel.N, rel.M = rng.Intn(2), []int{0, 10, 40}[rng.Intn(3)]
	case timetable.MaxBlock:
		rel.N, rel.M = []int{60, 100, 150}[rng.Intn(3)], []int{0, 10, 40}[rng.Intn(3)]
	}
	t.Relations = []timetable.Relation{rel}
	return t
}

// engineModels compiles term and enumerates its stable models (every atom
// but the time and room atoms is defined by rules, so models and
// assignments correspond one to one), each verified by solver.Verify and
// timetable.Check, with the engine's cost equal to timetable.Cost's; it
// returns them as assignments (keyed by assignKey) with
// the engine's "soft relations" cost of each.
func engineModels(tb testing.TB, term *timetable.Term) map[string]int64 {
	tb.Helper()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		tb.Fatalf("compile: %v", err)
	}
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		tb.Fatalf("engine: %v", err)
	}
	soft := critIndex[timetable.CritSoftRelations]
	out := map[string]int64{}
	_, complete := s.Enumerate(context.Background(), 0, nil, func(model []solver.Atom) bool {
		if err := solver.Verify(p, model); err != nil {
			tb.Fatalf("verify: %v", err)
		}
		a := refAssign{time: make([]int, len(term.Sections)), room: make([]int, len(term.Sections))}
		for s := range a.room {
			a.time[s], a.room[s] = -1, -1
		}
		for _, x := range model {
			switch info := cat.AtomInfo(x); info.Kind {
			case AtomTime:
				a.time[info.Section] = info.Time - 1
			case AtomRoom:
				a.room[info.Section] = info.Room
			}
		}
		sch := checkSchedule(tb, term, a)
		eng := cat.EngineCost(p, model)[soft]
		if got := timetable.Cost(term, sch, nil).Criterion(timetable.CritSoftRelations).Cost; got != eng {
			tb.Fatalf("engine cost %d, timetable.Cost %d for %s\n%s", eng, got, assignKey(a), describeMixed(term))
		}
		if _, dup := out[assignKey(a)]; dup {
			tb.Fatalf("two models for %s", assignKey(a))
		}
		out[assignKey(a)] = eng
		return true
	})
	if !complete {
		tb.Fatal("enumeration did not complete")
	}
	return out
}

// checkSchedule puts an assignment through timetable.Check and fails on a
// hard violation; it returns the schedule.
func checkSchedule(tb testing.TB, term *timetable.Term, a refAssign) *timetable.Schedule {
	tb.Helper()
	var sch timetable.Schedule
	for s, sec := range term.Sections {
		pl := timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: a.time[s] + 1}
		if a.room[s] >= 0 {
			pl.Room = term.Rooms[a.room[s]].ID
		}
		sch.Placements = append(sch.Placements, pl)
	}
	for _, v := range timetable.HardViolations(timetable.Check(term, &sch)) {
		tb.Fatalf("check: %s (%v)", v.Msg, a)
	}
	return &sch
}

func assignKey(a refAssign) string { return fmt.Sprint(a.time, a.room) }

// compareWithReference checks the engine against the reference on one
// term: for a hard row, every assignment the reference accepts without a
// room clash is a model, and every model is accepted by the reference; for
// a soft row, every model's engine cost equals the row's weight times the
// reference count, and the engine's optimum equals the reference optimum.
func compareWithReference(t *testing.T, term *timetable.Term) {
	t.Helper()
	rel := term.Relations[0]
	models := engineModels(t, term)
	want := map[string]int64{}
	for _, a := range refAll(term) {
		_, broken := refCount(term, rel, a)
		if rel.Hard && broken {
			continue
		}
		var c int64
		if !rel.Hard {
			c = refSoftCost(term, rel, a)
		}
		key := assignKey(a)
		got, ok := models[key]
		switch {
		case !ok && !refClash(term, a):
			t.Fatalf("%s: the reference accepts %s (cost %d) but the engine has no such model\n%s", rel.Kind, key, c, describeMixed(term))
		case ok && got != c:
			t.Fatalf("%s: engine cost %d, reference %d for %s\n%s", rel.Kind, got, c, key, describeMixed(term))
		}
		want[key] = c
	}
	for key := range models {
		if _, ok := want[key]; !ok {
			t.Fatalf("%s: the engine has model %s, which the reference rejects\n%s", rel.Kind, key, describeMixed(term))
		}
	}
	if !rel.Hard && len(models) > 0 {
		sum, cost := engineOptimum(t, term)
		best := leastCost(models)
		if sum != best {
			t.Fatalf("%s: engine optimum %v, reference optimum %d\n%s", rel.Kind, cost, best, describeMixed(term))
		}
	}
}

// TestPatternRelationsAgainstReference checks every relation kind, hard
// and soft, on random small terms against the reference enumeration
// (times_rel_ref_test.go, the definitions of timetable/term.go).
func TestPatternRelationsAgainstReference(t *testing.T) {
	rounds := 12
	if testing.Short() {
		rounds = 4
	}
	for _, rk := range timetable.RelationKinds {
		for _, hard := range []bool{true, false} {
			name := strings.ReplaceAll(rk.Name, " ", "_")
			if !hard {
				name += "/soft"
			}
			t.Run(name, func(t *testing.T) {
				rng := rand.New(rand.NewSource(int64(rk.Kind) * 7919))
				for round := 0; round < rounds; round++ {
					n := 2 + round%2
					if rk.Kind.Counted() {
						n = 1 + round%3 // a counted row may list one section
					}
					compareWithReference(t, relTestTerm(rng, rk.Kind, hard, n))
				}
			})
		}
	}
}

// TestPatternRelationsOrderedPair covers a section listed twice in an
// ordered row ("before" with A, A: A's meetings all before its own starts,
// which no pattern of two days or more can do).
func TestPatternRelationsOrderedPair(t *testing.T) {
	rng := rand.New(rand.NewSource(5))
	term := relTestTerm(rng, timetable.Before, true, 1)
	term.Sections[0].Times = []timetable.TimeChoice{
		{Days: timetable.DaysOf(time.Monday), Start: 9 * 60, Minutes: 50, Weeks: term.AllWeeks()},
		{Days: timetable.DaysOf(time.Monday, time.Wednesday), Start: 9 * 60, Minutes: 50, Weeks: term.AllWeeks()},
	}
	term.Relations[0].Sections = []string{"S1", "S1"}
	compareWithReference(t, term)
	// Reference (term.go, "before"): a meeting's own periods are not before
	// its start, so no pattern passes.
	if models := engineModels(t, term); len(models) != 0 {
		t.Fatalf("models %v, want none", models)
	}
}

// TestPatternRelationGridRowsExplicit: room rows that list a grid section
// with several candidate rooms beside a pattern section ("same room",
// "different rooms"), hard or soft, give the grid section explicit rooms
// (rooms_grid.go) and compile; their agreement with timetable.Check is
// TestGridRelationsAgainstCheck's.
func TestPatternRelationGridRowsExplicit(t *testing.T) {
	term := relTestTerm(rand.New(rand.NewSource(1)), timetable.SameRoom, true, 2)
	term.Periods = []timetable.Period{{Index: 0, Day: time.Monday, Start: 9 * 60, End: 10 * 60}}
	term.Sections[1].Times = nil
	term.Sections[1].Length = 1
	term.Sections[1].RoomChoices = nil
	for _, kind := range []timetable.RelationKind{timetable.SameRoom, timetable.DifferentRooms} {
		term.Relations[0].Kind = kind
		for _, soft := range []bool{false, true} {
			term.Relations[0].Hard, term.Relations[0].Weight = !soft, 2
			_, cat, err := Compile(term, Options{})
			if err != nil {
				t.Fatalf("%s soft=%v: %v", kind, soft, err)
			}
			if _, ok := cat.gridRooms[1]; !ok {
				t.Fatalf("%s soft=%v: S2 has no explicit rooms", kind, soft)
			}
		}
	}
}

// engineOptimum compiles term with its soft criteria and returns the
// engine's proven optimum, summed over the levels, and its cost per level.
func engineOptimum(t *testing.T, term *timetable.Term) (int64, []int64) {
	t.Helper()
	p, _, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		t.Fatal(err)
	}
	st, cost, err := s.Optimize(context.Background(), nil)
	if err != nil || st != solver.Satisfiable {
		t.Fatalf("optimize: %v %v", st, err)
	}
	var sum int64
	for _, c := range cost {
		sum += c
	}
	return sum, cost
}

// leastCost is the smallest of costs (-1 when there are none).
func leastCost(costs map[string]int64) int64 {
	best := int64(-1)
	for _, c := range costs {
		if best < 0 || c < best {
			best = c
		}
	}
	return best
}
