package encode

import (
	"context"
	"fmt"
	"math/rand"
	"slices"
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// The outside check for relation rows and travel with grid sections:
// timetable.Check and timetable.Cost, which judge every kind on meetings
// as the doc comments of timetable/term.go define them, grid meetings
// read from Term.Periods (Term.Occurrences). On tiny random terms mixing
// grid and pattern sections, every timetable is enumerated by brute force
// and put through Check and Cost; the engine's stable models, decoded,
// must be exactly the timetables Check accepts, each at the cost Cost
// gives, and the engine's optimum must be their least cost.

// mixedGridPeriods: Mon, Tue, Wed with three back-to-back hours from
// 08:00.
func mixedGridPeriods() []timetable.Period {
	var out []timetable.Period
	for _, d := range []time.Weekday{time.Monday, time.Tuesday, time.Wednesday} {
		for h := 8; h < 11; h++ {
			out = append(out, timetable.Period{Index: len(out), Day: d, Start: timetable.Clock(60 * h), End: timetable.Clock(60*h + 60),
				Src: timetable.Source{Sheet: "Periods", Row: len(out) + 2}})
		}
	}
	return out
}

// mixedTestTerm makes a small random term with one relation row of kind k
// over nSec sections, grid and pattern sections mixed (the first is on the
// grid; with two or more, the second has patterns, the rest either). Rows
// of the room kinds get rooms in two buildings with travel between them:
// grid sections one room, or two of which one is the second section's
// first room; pattern sections a list of one or two.
// Every criterion weighs 0 but "soft relations".
func mixedTestTerm(rng *rand.Rand, k timetable.RelationKind, hard bool, nSec int) *timetable.Term {
	t := relTestTerm(rng, k, hard, nSec)
	t.Periods = mixedGridPeriods()
	weeks := []timetable.WeekSet{t.AllWeeks(), 0b0101, 0b1010, 0b0011}
	days := []timetable.DaySet{
		timetable.DaysOf(time.Monday), timetable.DaysOf(time.Tuesday), timetable.DaysOf(time.Wednesday),
		timetable.DaysOf(time.Monday, time.Wednesday), timetable.DaysOf(time.Monday, time.Tuesday),
	}
	starts := []timetable.Clock{8 * 60, 8*60 + 30, 9 * 60, 9*60 + 50, 10 * 60}
	lengths := []int{50, 60, 110}
	for s := range t.Sections {
		sec := &t.Sections[s]
		if s == 0 || s >= 2 && rng.Intn(2) == 0 {
			sec.Times = nil
			sec.Meetings, sec.Length = 1+rng.Intn(2), 1+rng.Intn(2)
			sec.Weeks = weeks[rng.Intn(len(weeks))]
			if k == timetable.DifferentWeeks { // else a hard row is rarely met
				sec.Weeks = weeks[1+s%2]
			}
			sec.SameDay = rng.Intn(4) == 0
			if !sec.NoRoom {
				sec.RoomChoices = nil
				sec.Rooms = []string{t.Rooms[rng.Intn(len(t.Rooms))].ID}
				if len(t.Sections) > 1 && rng.Intn(2) == 0 {
					// Two rooms, one shared with S2 (a pattern section):
					// explicit grid rooms (rooms_grid.go).
					shared := t.Sections[1].RoomChoices[0].Room
					other := t.Rooms[(slices.IndexFunc(t.Rooms, func(r timetable.Room) bool { return r.ID == shared })+1+rng.Intn(2))%3].ID
					sec.Rooms = []string{shared, other}
				}
			}
			continue
		}
		sec.Times = nil
		n := 2 + rng.Intn(2)
		seen := map[string]bool{}
		for len(sec.Times) < n {
			tc := timetable.TimeChoice{Days: days[rng.Intn(len(days))], Start: starts[rng.Intn(len(starts))],
				Minutes: lengths[rng.Intn(len(lengths))], Weeks: weeks[rng.Intn(len(weeks))]}
			if key := fmt.Sprint(tc); !seen[key] {
				seen[key] = true
				sec.Times = append(sec.Times, tc)
			}
		}
	}
	return t
}

// bruteSchedules lists every timetable of a term whose sections take no
// room or list their rooms (Rooms for grid sections, RoomChoices for
// pattern sections): grid sections at every set of Meetings start periods
// whose meetings fit the grid, each meeting in every listed room, pattern
// sections at every pattern and candidate room.
func bruteSchedules(t *timetable.Term) []*timetable.Schedule {
	type opt []timetable.Placement
	per := make([][]opt, len(t.Sections))
	for s := range t.Sections {
		sec := &t.Sections[s]
		if sec.UsesTimes() {
			rooms := []string{""}
			if !sec.NoRoom {
				rooms = nil
				for _, rc := range sec.RoomChoices {
					rooms = append(rooms, rc.Room)
				}
			}
			for i := range sec.Times {
				for _, r := range rooms {
					per[s] = append(per[s], opt{{Section: sec.ID, Meeting: 1, Period: -1, Time: i + 1, Room: r}})
				}
			}
			continue
		}
		rooms := []string{""}
		if !sec.NoRoom {
			rooms = sec.Rooms
		}
		var fit []int
		for p := range t.Periods {
			if _, ok := t.Span(p, sec.Length); ok {
				fit = append(fit, p)
			}
		}
		var rec func(from int, cur []int)
		rec = func(from int, cur []int) {
			if len(cur) == sec.Meetings {
				// every room of the list for each meeting
				for code := 0; code < pow(len(rooms), len(cur)); code++ {
					var o opt
					c := code
					for k, p := range cur {
						o = append(o, timetable.Placement{Section: sec.ID, Meeting: k + 1, Period: p, Room: rooms[c%len(rooms)]})
						c /= len(rooms)
					}
					per[s] = append(per[s], o)
				}
				return
			}
			for k := from; k < len(fit); k++ {
				rec(k+1, append(cur, fit[k]))
			}
		}
		rec(0, nil)
	}
	var out []*timetable.Schedule
	var rec func(s int, pls []timetable.Placement)
	rec = func(s int, pls []timetable.Placement) {
		if s == len(per) {
			out = append(out, &timetable.Schedule{Placements: slices.Clone(pls)})
			return
		}
		for _, o := range per[s] {
			rec(s+1, append(pls, o...))
		}
	}
	rec(0, nil)
	return out
}

func pow(a, n int) int {
	out := 1
	for range n {
		out *= a
	}
	return out
}

// scheduleKey names a timetable by its meetings, whatever their order and
// numbering.
func scheduleKey(s *timetable.Schedule) string {
	var parts []string
	for _, pl := range s.Placements {
		parts = append(parts, fmt.Sprintf("%s@%d/%d/%s", pl.Section, pl.Period, pl.Time, pl.Room))
	}
	sort.Strings(parts)
	return strings.Join(parts, " ")
}

// checkAccepts is the outside verdict on a schedule: no hard violation
// from timetable.Check, and the "soft relations" cost from timetable.Cost
// of the schedule with grid rooms left out — the part of the objective the
// engine states (grid rooms are judged after the search, as the third gate
// of optimize_gate.go reads it).
func checkAccepts(t *timetable.Term, s *timetable.Schedule) (int64, bool) {
	if len(timetable.HardViolations(timetable.Check(t, s))) > 0 {
		return 0, false
	}
	return timetable.Cost(t, withoutRooms(s), nil).Criterion(timetable.CritSoftRelations).Cost, true
}

// engineSchedules enumerates the stable models of the compiled term, each
// through solver.Verify and Decode, keyed by scheduleKey, with the
// engine's "soft relations" cost.
func engineSchedules(tb testing.TB, term *timetable.Term) (map[string]int64, map[string]*timetable.Schedule) {
	tb.Helper()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		tb.Fatalf("compile: %v\n%s", err, describeMixed(term))
	}
	s, err := solver.New(p, solver.DefaultOptions())
	if err != nil {
		tb.Fatalf("engine: %v", err)
	}
	soft := critIndex[timetable.CritSoftRelations]
	costs, scheds := map[string]int64{}, map[string]*timetable.Schedule{}
	_, complete := s.Enumerate(context.Background(), 0, nil, func(model []solver.Atom) bool {
		if err := solver.Verify(p, model); err != nil {
			tb.Fatalf("verify: %v", err)
		}
		sch, err := Decode(term, cat, model)
		if err != nil {
			tb.Fatalf("decode: %v", err)
		}
		key := scheduleKey(sch)
		if _, dup := costs[key]; dup {
			tb.Fatalf("two models for %s", key)
		}
		costs[key], scheds[key] = cat.EngineCost(p, model)[soft], sch
		return true
	})
	if !complete {
		tb.Fatal("enumeration did not complete")
	}
	return costs, scheds
}

// agreeWithCheck compares the engine with Check and Cost on every
// timetable of term (see the top of this file); it returns the number of
// timetables Check accepts.
func agreeWithCheck(t *testing.T, term *timetable.Term) int {
	t.Helper()
	eng, scheds := engineSchedules(t, term)
	want := map[string]int64{}
	for _, s := range bruteSchedules(term) {
		if c, ok := checkAccepts(term, s); ok {
			want[scheduleKey(s)] = c
		}
	}
	for key, c := range want {
		got, ok := eng[key]
		switch {
		case !ok:
			t.Fatalf("Check accepts %s (cost %d), the engine has no such model\n%s", key, c, describeMixed(term))
		case got != c:
			t.Fatalf("engine cost %d, Cost %d for %s\n%s", got, c, key, describeMixed(term))
		}
	}
	for key := range eng {
		if _, ok := want[key]; !ok {
			vs := timetable.HardViolations(timetable.Check(term, scheds[key]))
			t.Fatalf("the engine has model %s, which Check rejects (%v)\n%s", key, vs, describeMixed(term))
		}
	}
	if len(want) > 0 && len(term.Relations) > 0 && !term.Relations[0].Hard {
		sum, cost := engineOptimum(t, term)
		best := leastCost(want)
		if sum != best {
			t.Fatalf("engine optimum %v, least Cost %d\n%s", cost, best, describeMixed(term))
		}
	}
	return len(want)
}

// describeMixed writes a small term (relations, sections with their grid
// shape, time choices and rooms) for a failure message.
func describeMixed(t *timetable.Term) string {
	var sb strings.Builder
	for _, r := range t.Relations {
		fmt.Fprintf(&sb, "relation %s %v hard=%v w=%d N=%d M=%d\n", r.Kind, r.Sections, r.Hard, r.Weight, r.N, r.M)
	}
	for _, s := range t.Sections {
		fmt.Fprintf(&sb, "  %s:", s.ID)
		if !s.UsesTimes() {
			fmt.Fprintf(&sb, " grid %d×%d w%04b sameday=%v rooms=%v staff=%v", s.Meetings, s.Length, s.Weeks, s.SameDay, s.Rooms, s.Staff)
		}
		for i, tc := range s.Times {
			fmt.Fprintf(&sb, " [%d] %s %s+%d w%04b;", i, tc.Days, tc.Start, tc.Minutes, tc.Weeks)
		}
		for _, rc := range s.RoomChoices {
			fmt.Fprintf(&sb, " %s", rc.Room)
		}
		sb.WriteByte('\n')
	}
	return sb.String()
}

// TestGridRelationsAgainstCheck: every relation kind, hard and soft, on
// random tiny terms mixing grid and pattern sections.
func TestGridRelationsAgainstCheck(t *testing.T) {
	rounds := 10
	if testing.Short() {
		rounds = 3
	}
	for _, rk := range timetable.RelationKinds {
		for _, hard := range []bool{true, false} {
			name := strings.ReplaceAll(rk.Name, " ", "_")
			if !hard {
				name += "/soft"
			}
			t.Run(name, func(t *testing.T) {
				agreeOverRounds(t, int64(rk.Kind)*104729+3, rounds, func(rng *rand.Rand, round int) *timetable.Term {
					n := 2 + round%2
					if rk.Kind.Counted() && round%3 == 0 {
						n = 1 // a counted row may list one (grid) section
					}
					return mixedTestTerm(rng, rk.Kind, hard, n)
				})
			})
		}
	}
}

// TestGridRelationsOrderedSelf: a grid section listed twice in an ordered
// row is compared with its own meetings (term.go: every consecutive pair).
func TestGridRelationsOrderedSelf(t *testing.T) {
	for _, k := range []timetable.RelationKind{timetable.Before, timetable.BackToBack, timetable.FirstBefore} {
		for _, hard := range []bool{true, false} {
			rng := rand.New(rand.NewSource(int64(k)))
			for round := 0; round < 4; round++ {
				term := mixedTestTerm(rng, k, hard, 1)
				term.Sections[0].Meetings, term.Sections[0].SameDay = 2, round%2 == 0
				term.Relations[0].Sections = []string{"S1", "S1"}
				agreeWithCheck(t, term)
			}
		}
	}
}

// TestGridTravelAgainstCheck: travel times (Term.Travel, hard) between
// meetings of one staff member or cohort, grid sections with one room
// each beside pattern sections with room lists, against Check on every
// timetable.
func TestGridTravelAgainstCheck(t *testing.T) {
	rounds := 16
	if testing.Short() {
		rounds = 6
	}
	agreeOverRounds(t, 77, rounds, func(rng *rand.Rand, round int) *timetable.Term {
		term := mixedTestTerm(rng, timetable.SamePeople, true, 2+round%2)
		term.Relations = nil
		if round%3 == 2 {
			term.Travel = term.Travel[:1] // R1 and R2 then form one travel class (North)
		}
		if round%2 == 0 {
			term.Staff = []timetable.Staff{{ID: "T1", Name: "Teacher One", Src: timetable.Source{Sheet: "Staff", Row: 2}}}
		} else {
			term.Cohorts = []timetable.Cohort{{ID: "K1", Name: "Cohort One", Src: timetable.Source{Sheet: "Cohorts", Row: 2}}}
		}
		for s := range term.Sections {
			if round%2 == 0 {
				term.Sections[s].Staff = []string{"T1"}
			} else {
				term.Sections[s].Cohorts = []string{"K1"}
			}
		}
		return term
	})
}

// TestGridTravelRooms: a grid section that may meet in several rooms,
// beside other sections in rooms of one staff member under travel rows,
// gets explicit rooms (rooms_grid.go); so does a grid section in a hard
// same-room relation with it (one room for both, the grid's same-room
// group); both against Check on every timetable.
func TestGridTravelRooms(t *testing.T) {
	term := mixedTestTerm(rand.New(rand.NewSource(5)), timetable.SamePeople, true, 2)
	term.Relations = nil
	term.Staff = []timetable.Staff{{ID: "T1", Name: "Teacher One"}}
	for s := range term.Sections {
		term.Sections[s].Staff = []string{"T1"}
	}
	term.Sections[0].Rooms = []string{"R1", "R3"}
	_, cat, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if _, ok := cat.gridRooms[0]; !ok {
		t.Fatal("S1 has no explicit rooms")
	}
	agreeWithCheck(t, term)
	term.Sections = append(term.Sections, timetable.Section{ID: "S3", Meetings: 1, Length: 1, Size: 10, Rooms: []string{"R1", "R3"},
		Weeks: term.AllWeeks(), Src: timetable.Source{Sheet: "Sections", Row: 4}})
	term.Relations = []timetable.Relation{{Kind: timetable.SameRoom, Sections: []string{"S1", "S3"}, Hard: true, Src: timetable.Source{Sheet: "Relations", Row: 2}}}
	term.Sections[2].Staff = []string{"T1"}
	if n := agreeWithCheck(t, term); n == 0 {
		t.Fatal("no timetable: the same-room case checked nothing")
	}
}

// TestGridLimitsAgainstCheck: a staff member's weekly limits (periods,
// minutes, days) and lunch breaks of staff and cohorts over grid and
// pattern sections mixed (times_limits*.go count grid starts as meetings),
// against Check on every timetable.
func TestGridLimitsAgainstCheck(t *testing.T) {
	rounds := 16
	if testing.Short() {
		rounds = 6
	}
	agreeOverRounds(t, 91, rounds, func(rng *rand.Rand, round int) *timetable.Term {
		term := mixedTestTerm(rng, timetable.NoOverlap, true, 2+round%2)
		term.Relations = nil
		st := timetable.Staff{ID: "T1", Name: "Teacher One", Src: timetable.Source{Sheet: "Staff", Row: 2}}
		co := timetable.Cohort{ID: "K1", Name: "Cohort One", Src: timetable.Source{Sheet: "Cohorts", Row: 2}}
		switch round % 4 {
		case 0:
			st.MaxWeekMinutes = []int{100, 150, 200}[rng.Intn(3)]
		case 1:
			st.MaxWeekDays = 1 + rng.Intn(2)
		case 2:
			st.MaxWeekPeriods = 2 + rng.Intn(2)
			st.Lunch = timetable.LunchBreak{From: 9 * 60, To: 11 * 60, Minutes: []int{30, 60}[rng.Intn(2)]}
		case 3:
			co.Lunch = timetable.LunchBreak{From: 8*60 + 30, To: 10*60 + 30, Minutes: []int{40, 60}[rng.Intn(2)]}
		}
		term.Staff, term.Cohorts = []timetable.Staff{st}, []timetable.Cohort{co}
		for s := range term.Sections {
			if s%2 == 0 || round%4 != 3 {
				term.Sections[s].Staff = []string{"T1"}
			}
			if round%4 == 3 {
				term.Sections[s].Cohorts = []string{"K1"}
			}
		}
		return term
	})
}

// TestGridRoomsAgainstCheck: rooms alone — grid sections with one room or
// two (one shared with a pattern section: explicit rooms), pattern
// sections with room lists, no relation and no travel — against Check on
// every timetable: no room ever holds two meetings at once.
func TestGridRoomsAgainstCheck(t *testing.T) {
	rounds := 16
	if testing.Short() {
		rounds = 6
	}
	rng := rand.New(rand.NewSource(31))
	accepted, total, explicit := 0, 0, 0
	for round := 0; round < rounds; round++ {
		term := mixedTestTerm(rng, timetable.DifferentRooms, true, 2+round%2)
		term.Relations, term.Travel = nil, nil
		_, cat, err := Compile(term, Options{})
		if err != nil {
			t.Fatal(err)
		}
		explicit += len(cat.gridRooms)
		accepted += agreeWithCheck(t, term)
		total += len(bruteSchedules(term))
	}
	t.Logf("%d of %d timetables accepted; %d grid sections with explicit rooms", accepted, total, explicit)
	if accepted == 0 || explicit == 0 {
		t.Fatal("the test checked nothing")
	}
}

// agreeOverRounds puts the term build makes for each of rounds rounds
// (one random source from seed) through agreeWithCheck, and fails when no
// round had a timetable: the test would have checked nothing.
func agreeOverRounds(t *testing.T, seed int64, rounds int, build func(rng *rand.Rand, round int) *timetable.Term) {
	t.Helper()
	rng := rand.New(rand.NewSource(seed))
	accepted, total := 0, 0
	for round := 0; round < rounds; round++ {
		term := build(rng, round)
		accepted += agreeWithCheck(t, term)
		total += len(bruteSchedules(term))
	}
	t.Logf("%d of %d timetables accepted", accepted, total)
	if accepted == 0 {
		t.Fatal("no round had a timetable: the test checked nothing")
	}
}
