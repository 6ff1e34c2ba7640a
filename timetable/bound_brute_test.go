package timetable

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
)

// The soundness of CountingBound is checked against exhaustive search
// (brute force, the outside reference RULES.md asks for): on small random
// terms every timetable is enumerated, Check keeps the legal ones, Cost
// prices them, and the bound must not exceed the least cost, criterion by
// criterion (units and cost) and level by level.

// bruteRand builds one small random term exercising what the bound reads:
// grids with gaps, weeks, rooms with features and rows, room lists and
// choices, no-room sections, fixed meetings, pattern sections, hard and
// soft rows (some naming weeks), soft capacity, SameDay/MinDays and every
// criterion weighted.
func bruteRand(rng *rand.Rand) *Term {
	t := &Term{
		Name:     "brute",
		FirstDay: time.Date(2027, 1, 4, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 1, 15, 0, 0, 0, 0, time.UTC), // two teaching weeks
		Weights:  map[string]Weight{},
	}
	nDays := 2 + rng.IntN(2)
	for d := 0; d < nDays; d++ {
		day := time.Weekday(1 + d)
		start := Clock(540)
		for k := 0; k < 1+rng.IntN(3); k++ {
			if k > 0 && rng.IntN(4) == 0 {
				start += 60 // a gap: the periods do not touch
			}
			t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: day, Start: start, End: start + 60})
			start += 60
		}
	}
	t.SoftCapacity = rng.IntN(2) == 0
	for r := 0; r < 1+rng.IntN(3); r++ {
		room := Room{ID: fmt.Sprintf("R%d", r), Capacity: 10 + 10*rng.IntN(4), Building: []string{"", "A", "B"}[rng.IntN(3)]}
		if rng.IntN(3) == 0 {
			room.Features = []string{"lab"}
		}
		t.Rooms = append(t.Rooms, room)
	}
	for k := 0; k < 2; k++ {
		st := Staff{ID: fmt.Sprintf("S%d", k)}
		if rng.IntN(6) == 0 {
			st.MaxPerDay = 1
		}
		t.Staff = append(t.Staff, st)
		t.Cohorts = append(t.Cohorts, Cohort{ID: fmt.Sprintf("C%d", k)})
	}
	weeks := []WeekSet{3, 3, 3, 1, 2}
	nSec := 2 + rng.IntN(2)
	for s := 0; s < nSec; s++ {
		sec := Section{ID: fmt.Sprintf("X%d", s), Size: 5 + 5*rng.IntN(8), Meetings: 1, Length: 1, Weeks: weeks[rng.IntN(len(weeks))]}
		for k := 0; k < 2; k++ {
			if rng.IntN(2) == 0 {
				sec.Staff = append(sec.Staff, t.Staff[k].ID)
			}
			if rng.IntN(2) == 0 {
				sec.Cohorts = append(sec.Cohorts, t.Cohorts[k].ID)
			}
		}
		switch {
		case rng.IntN(6) == 0:
			sec.NoRoom = true
		case rng.IntN(4) == 0:
			sec.Needs = []string{"lab"}
		}
		if !sec.NoRoom {
			switch rng.IntN(5) {
			case 0:
				sec.Rooms = []string{t.Rooms[rng.IntN(len(t.Rooms))].ID}
			case 1:
				for _, r := range t.Rooms {
					if rng.IntN(2) == 0 {
						sec.RoomChoices = append(sec.RoomChoices, RoomChoice{Room: r.ID, Weight: rng.IntN(3)})
					}
				}
			}
		}
		if rng.IntN(4) == 0 {
			bruteTimes(rng, t, &sec)
		} else {
			sec.Meetings = 1 + rng.IntN(2)
			if rng.IntN(5) == 0 {
				sec.Length = 2
			}
			sec.SameDay = rng.IntN(2) == 0
			if sec.SameDay {
				sec.MinDays = rng.IntN(4)
			}
			if rng.IntN(5) == 0 {
				p := t.Periods[rng.IntN(len(t.Periods))]
				f := Fixed{Day: p.Day, Start: p.Start}
				if !sec.NoRoom && rng.IntN(2) == 0 {
					f.Room = t.Rooms[rng.IntN(len(t.Rooms))].ID
				}
				sec.Fixed = []Fixed{f}
			}
		}
		t.Sections = append(t.Sections, sec)
	}
	for k := 0; k < rng.IntN(5); k++ {
		u := Unavailability{Day: t.Periods[rng.IntN(len(t.Periods))].Day, Hard: rng.IntN(3) == 0, Weight: 1 + rng.IntN(3)}
		u.From = Clock(540 + 30*rng.IntN(8))
		u.To = u.From + Clock(30+30*rng.IntN(4))
		if rng.IntN(4) == 0 {
			u.Weeks = WeekSet(1 + rng.IntN(2))
		}
		switch rng.IntN(4) {
		case 0:
			u.Kind, u.Who = WhoStaff, t.Staff[rng.IntN(2)].ID
		case 1:
			u.Kind, u.Who = WhoCohort, t.Cohorts[rng.IntN(2)].ID
		case 2:
			u.Kind, u.Who = WhoRoom, t.Rooms[rng.IntN(len(t.Rooms))].ID
		default:
			u.Kind, u.Who = WhoSection, t.Sections[rng.IntN(nSec)].ID
		}
		if u.Hard {
			u.Weight = 0
		}
		t.Unavailable = append(t.Unavailable, u)
	}
	if rng.IntN(4) == 0 {
		t.Relations = append(t.Relations, Relation{Kind: NotSameTime, Sections: []string{"X0", "X1"}, Hard: true})
	}
	if rng.IntN(4) == 0 {
		t.Sections[0].Course = "K1"
		t.Requests = []Request{{Student: "st1", Course: "K1"}, {Student: "st2", Course: "K9", Alternatives: []string{"K8"}}}
	}
	for _, c := range Criteria {
		t.Weights[c.Name] = Weight{Weight: rng.IntN(3), Level: 1 + rng.IntN(2)}
	}
	return t
}

// bruteTimes makes sec a pattern section with a few meeting times on the
// grid's days.
func bruteTimes(rng *rand.Rand, t *Term, sec *Section) {
	days := t.Days()
	for k := 0; k < 1+rng.IntN(3); k++ {
		c := TimeChoice{Start: Clock(540 + 30*rng.IntN(6)), Minutes: []int{50, 90}[rng.IntN(2)], Weeks: WeekSet(1 + rng.IntN(3)), Weight: rng.IntN(3)}
		for _, d := range days {
			if rng.IntN(2) == 0 {
				c.Days |= DaysOf(d)
			}
		}
		if c.Days == 0 {
			c.Days = DaysOf(days[0])
		}
		sec.Times = append(sec.Times, c)
	}
	sec.SameDay = rng.IntN(3) == 0
	if sec.SameDay {
		sec.MinDays = rng.IntN(3)
	}
	if rng.IntN(5) == 0 {
		c := sec.Times[0]
		d, _ := c.Days.First()
		sec.Fixed = []Fixed{{Day: d, Start: c.Start}}
	}
}

// bruteKept is a random earlier timetable: random places of some
// sections (legal or not) and a section the term no longer has.
func bruteKept(rng *rand.Rand, t *Term) *Schedule {
	s := &Schedule{}
	rooms := []string{""}
	for _, r := range t.Rooms {
		rooms = append(rooms, r.ID)
	}
	for _, sec := range t.Sections {
		for m := 1; m <= rng.IntN(4); m++ {
			p := Placement{Section: sec.ID, Meeting: m, Period: rng.IntN(len(t.Periods)), Room: rooms[rng.IntN(len(rooms))]}
			if sec.UsesTimes() {
				p.Period, p.Time = -1, 1+rng.IntN(len(sec.Times))
			}
			s.Placements = append(s.Placements, p)
		}
	}
	s.Placements = append(s.Placements, Placement{Section: "GONE", Meeting: 1, Period: 0})
	return s
}

// bruteOptions lists, per section, the placement sets that pass Check on
// the term cut down to that section alone (no relations or requests).
// Every rule Check applies there only gets harder to meet when other
// sections' meetings are added, so no legal timetable of the whole term
// is lost; the whole term's Check judges the combinations.
func bruteOptions(t *Term) [][][]Placement {
	rooms := []string{""}
	for _, r := range t.Rooms {
		rooms = append(rooms, r.ID)
	}
	var out [][][]Placement
	for _, sec := range t.Sections {
		var places []Placement
		for _, room := range rooms {
			if sec.UsesTimes() {
				for c := range sec.Times {
					places = append(places, Placement{Section: sec.ID, Period: -1, Time: c + 1, Room: room})
				}
				continue
			}
			for p := range t.Periods {
				places = append(places, Placement{Section: sec.ID, Period: p, Room: room})
			}
		}
		m := max(1, sec.Meetings)
		if sec.UsesTimes() {
			m = 1
		}
		alone := *t
		alone.Sections = []Section{sec}
		alone.Relations, alone.Requests = nil, nil
		var sets [][]Placement
		var pick func(from int, cur []Placement)
		pick = func(from int, cur []Placement) {
			if len(cur) == m {
				s := slices.Clone(cur)
				for i := range s {
					s[i].Meeting = i + 1
				}
				if len(HardViolations(Check(&alone, &Schedule{Placements: s}))) == 0 {
					sets = append(sets, s)
				}
				return
			}
			for i := from; i < len(places); i++ { // with repeats: Check refuses them
				pick(i, append(cur, places[i]))
			}
		}
		pick(0, nil)
		out = append(out, sets)
	}
	return out
}

// bruteLeast returns the least Cost over the legal timetables of t, per
// criterion (units and cost separately) and per level, and how many legal
// timetables there are; it gives up (ok false) past limit combinations.
func bruteLeast(t *Term, kept *Schedule, limit int) (least CostReport, legal int, ok bool) {
	opts := bruteOptions(t)
	n := 1
	for _, o := range opts {
		n *= len(o)
		if n > limit {
			return least, 0, false
		}
	}
	var cur []Placement
	var walk func(k int)
	walk = func(k int) {
		if k == len(opts) {
			s := &Schedule{Placements: cur}
			if len(HardViolations(Check(t, s))) > 0 {
				return
			}
			r := Cost(t, s, kept)
			if legal == 0 {
				least = r
				least.Criteria = slices.Clone(r.Criteria)
				least.ByLevel = map[int]int64{}
				for l, v := range r.ByLevel {
					least.ByLevel[l] = v
				}
			}
			legal++
			for i, c := range r.Criteria {
				least.Criteria[i].Count = min(least.Criteria[i].Count, c.Count)
				least.Criteria[i].Cost = min(least.Criteria[i].Cost, c.Cost)
			}
			for l, v := range r.ByLevel {
				least.ByLevel[l] = min(least.ByLevel[l], v)
			}
			return
		}
		for _, set := range opts[k] {
			keep := len(cur)
			cur = append(cur, set...)
			walk(k + 1)
			cur = cur[:keep]
		}
	}
	walk(0)
	return least, legal, true
}

// TestCountingBoundBruteForce: on random small terms, CountingBound never
// exceeds the exhaustive least cost (brute force over every timetable,
// judged by Check and priced by Cost).
func TestCountingBoundBruteForce(t *testing.T) {
	terms := 700
	if testing.Short() {
		terms = 150
	}
	positive := bruteCompare(t, rand.New(rand.NewPCG(13, 2027)), terms, bruteRand)
	for _, name := range []string{CritAvoidTimes, CritSpreadDays, CritEarly, CritLate, CritRoomChoice, CritTimeChoice, CritWastedSeats, CritMoved, CritCohortIsolated, CritStaffDays, CritUnplaced} {
		require.Positive(t, positive[name], "no random term gave %s a positive bound: the test does not reach it", name)
	}
}

// TestCountingBoundBruteForceCrowded does the same on terms with few
// periods and rooms, where large sections compete for the large rooms
// (the slot bound of room over capacity) and fixed meetings and room rows
// split sections over rooms (room stability).
func TestCountingBoundBruteForceCrowded(t *testing.T) {
	terms := 400
	if testing.Short() {
		terms = 100
	}
	positive := bruteCompare(t, rand.New(rand.NewPCG(14, 2027)), terms, bruteCrowded)
	for _, name := range []string{CritOverCapacity, CritRoomStability} {
		require.Positive(t, positive[name], "no random term gave %s a positive bound: the test does not reach it", name)
	}
}

// bruteCompare runs the exhaustive comparison on terms from gen and
// returns, per criterion, how many terms had a positive bound.
func bruteCompare(t *testing.T, rng *rand.Rand, terms int, gen func(*rand.Rand) *Term) map[string]int {
	t.Helper()
	solved, positive, tight := 0, map[string]int{}, map[string]int{}
	for i := 0; i < terms; i++ {
		term := gen(rng)
		var kept *Schedule
		if rng.IntN(2) == 0 {
			kept = bruteKept(rng, term)
		}
		least, legal, ok := bruteLeast(term, kept, 50000)
		if !ok || legal == 0 {
			continue
		}
		solved++
		bound := CountingBound(term, kept)
		require.ElementsMatch(t, least.Levels(), bound.Levels(), "term %d: levels", i)
		for k, c := range bound.Criteria {
			m := least.Criteria[k]
			require.Equal(t, m.Name, c.Name)
			require.Equal(t, m.Level, c.Level, "term %d %s", i, c.Name)
			require.Equal(t, m.Weight, c.Weight, "term %d %s", i, c.Name)
			require.LessOrEqual(t, c.Count, m.Count, "term %d %s: bound units above the exhaustive least\n%s", i, c.Name, bruteDump(term, kept))
			require.LessOrEqual(t, c.Cost, m.Cost, "term %d %s: bound cost above the exhaustive least\n%s", i, c.Name, bruteDump(term, kept))
			if c.Count > 0 {
				positive[c.Name]++
			}
			if c.Count == m.Count && m.Count > 0 {
				tight[c.Name]++
			}
		}
		for l, v := range bound.ByLevel {
			require.LessOrEqual(t, v, least.ByLevel[l], "term %d level %d", i, l)
		}
		// The relaxed room path (used for sets with many rooms with rows)
		// gives at most the exact one.
		save := boundMarkedRooms
		boundMarkedRooms = 0
		relaxed := CountingBound(term, kept)
		boundMarkedRooms = save
		for k, c := range relaxed.Criteria {
			require.LessOrEqual(t, c.Count, bound.Criteria[k].Count, "term %d %s: relaxed rooms above exact", i, c.Name)
			require.LessOrEqual(t, c.Cost, bound.Criteria[k].Cost, "term %d %s: relaxed rooms above exact", i, c.Name)
		}
	}
	t.Logf("%d of %d terms solved exhaustively; criteria with a positive bound: %v; of which equal to the exhaustive least: %v", solved, terms, positive, tight)
	require.Greater(t, solved, terms/4, "too few terms had a legal timetable within the enumeration limit")
	return positive
}

// bruteCrowded builds a term of one or two days with one to three
// periods, two or three rooms of different sizes (soft capacity), sections
// that may use any room, some fixed in a room, and hard room rows.
func bruteCrowded(rng *rand.Rand) *Term {
	t := &Term{Name: "crowded", SoftCapacity: rng.IntN(5) > 0, Weights: map[string]Weight{}}
	for d := 0; d < 1+rng.IntN(2); d++ {
		for k := 0; k < 1+rng.IntN(3); k++ {
			start := Clock(540 + 60*k)
			t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: time.Weekday(1 + d), Start: start, End: start + 60})
		}
	}
	for r := 0; r < 2+rng.IntN(2); r++ {
		t.Rooms = append(t.Rooms, Room{ID: fmt.Sprintf("R%d", r), Capacity: 10 * (r + 1)})
	}
	for s := 0; s < 2+rng.IntN(3); s++ {
		sec := Section{ID: fmt.Sprintf("X%d", s), Size: 5 + 5*rng.IntN(8), Meetings: 1 + rng.IntN(2), Length: 1, SameDay: rng.IntN(2) == 0}
		if rng.IntN(6) == 0 {
			sec.Weeks = 1
		}
		if rng.IntN(4) == 0 {
			for m := 0; m < sec.Meetings; m++ {
				p := t.Periods[rng.IntN(len(t.Periods))]
				sec.Fixed = append(sec.Fixed, Fixed{Day: p.Day, Start: p.Start, Room: t.Rooms[rng.IntN(len(t.Rooms))].ID})
			}
		}
		t.Sections = append(t.Sections, sec)
	}
	for k := 0; k < rng.IntN(3); k++ {
		p := t.Periods[rng.IntN(len(t.Periods))]
		t.Unavailable = append(t.Unavailable, Unavailability{Kind: WhoRoom, Who: t.Rooms[rng.IntN(len(t.Rooms))].ID, Day: p.Day, From: p.Start, To: p.End, Hard: true})
	}
	for _, c := range Criteria {
		t.Weights[c.Name] = Weight{Weight: 1 + rng.IntN(2), Level: 1}
	}
	return t
}

// bruteDump prints a failing term for the reader.
func bruteDump(t *Term, kept *Schedule) string {
	s := fmt.Sprintf("periods %v\nrooms %+v\nsoft capacity %v\n", t.Periods, t.Rooms, t.SoftCapacity)
	for _, sec := range t.Sections {
		s += fmt.Sprintf("section %+v\n", sec)
	}
	for _, u := range t.Unavailable {
		s += fmt.Sprintf("row %+v\n", u)
	}
	if kept != nil {
		s += fmt.Sprintf("kept %+v\n", kept.Placements)
	}
	return s
}
