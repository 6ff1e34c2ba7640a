package timetable

import (
	"math/bits"
	"math/rand/v2"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// propTerm draws a small random mixed term over 4 teaching weeks on the
// ckTerm grid (Mon–Wed): about two in three sections at one random
// meeting time (any weekday, 5-minute starts, random weeks), the others a
// grid meeting of 1 or 2 periods; each with at most one staff member,
// cohort and room, and a schedule placing each at its (only) choice.
func propTerm(rng *rand.Rand) (*Term, *Schedule) {
	t := ckTerm()
	t.LastDay = time.Date(2027, 10, 8, 0, 0, 0, 0, time.UTC) // 4 teaching weeks
	t.Sections, t.Enrolments, t.Unavailable, t.Relations = nil, nil, nil, nil
	t.Staff[0].Lunch = LunchBreak{From: 11*60 + 30, To: 13*60 + 30, Minutes: 45}
	t.Staff[1].MaxPerDay, t.Staff[1].MaxConsecutive = 0, 0
	t.Staff[1].MaxWeekMinutes = 150 + 10*rng.IntN(30)
	t.Staff[1].MaxWeekDays = 1 + rng.IntN(3)
	t.Staff[0].MaxWeekPeriods = 1 + rng.IntN(2)
	t.Cohorts[0].Lunch = LunchBreak{From: 12 * 60, To: 14 * 60, Minutes: 60}
	s := &Schedule{}
	n := 5 + rng.IntN(6)
	pick := func(ids ...string) []string {
		if k := rng.IntN(len(ids) + 1); k < len(ids) {
			return []string{ids[k]}
		}
		return nil
	}
	for k := 0; k < n; k++ {
		weeks := WeekSet(1 + rng.IntN(15))
		sec := Section{ID: "X" + itoa(k), Size: 10, Meetings: 1, Length: 1, Weeks: weeks,
			Staff: pick("S1", "S2"), Cohorts: pick("C1", "C2"), Src: Source{"Sections", k + 2}}
		room := []string{"R1", "R3", ""}[rng.IntN(3)]
		sec.NoRoom = room == ""
		pl := Placement{Section: sec.ID, Meeting: 1, Room: room}
		if rng.IntN(3) > 0 {
			days := DaySet(0)
			for days == 0 {
				days = DaySet(rng.IntN(1<<5)) << 1 // Mon–Fri
			}
			sec.Weeks = t.AllWeeks()
			sec.Times = []TimeChoice{{Days: days, Start: Clock(8*60 + 5*rng.IntN(73)),
				Minutes: []int{30, 50, 75, 90, 120}[rng.IntN(5)], Weeks: weeks}}
			pl.Period, pl.Time = -1, 1
		} else {
			sec.Length = 1 + rng.IntN(2)
			for {
				pl.Period = rng.IntN(len(t.Periods))
				if _, ok := t.Span(pl.Period, sec.Length); ok {
					break
				}
			}
		}
		t.Sections = append(t.Sections, sec)
		s.Placements = append(s.Placements, pl)
	}
	return t, s
}

// bruteMinutes is the reference occupancy: for placement i, the minutes
// [start, end) of each day it meets and its weeks, computed from the
// Periods rows and the meeting time directly.
func bruteMinutes(t *Term, s *Schedule, i int) (days []time.Weekday, start, end int, weeks WeekSet) {
	sec := t.Sections[i] // one placement per section, in order
	p := s.Placements[i]
	if len(sec.Times) > 0 {
		c := sec.Times[p.Time-1]
		for d := time.Sunday; d <= time.Saturday; d++ {
			if c.Days&(1<<d) != 0 {
				days = append(days, d)
			}
		}
		return days, int(c.Start), int(c.Start) + c.Minutes, c.Weeks
	}
	first, last := t.Periods[p.Period], t.Periods[p.Period+sec.Length-1]
	return []time.Weekday{first.Day}, int(first.Start), int(last.End), sec.Weeks
}

// TestCheckAgreesWithMinuteByMinuteOccupancy draws random small mixed
// schedules and compares Check's double bookings, lunch breaks and weekly
// limits with a brute-force count over every minute of every day of every
// teaching week, written independently here (common practice: an
// exhaustive reference model for a sweep-line implementation).
func TestCheckAgreesWithMinuteByMinuteOccupancy(t *testing.T) {
	rng := rand.New(rand.NewPCG(14, 2027))
	var clashes, lunches, limits int
	defer func() {
		t.Logf("over all trials: %d double bookings, %d lunch days, %d weekly limits", clashes, lunches, limits)
	}()
	for trial := 0; trial < 200; trial++ {
		tm, s := propTerm(rng)
		const weeks, day = 4, 24 * 60
		// who -> [week][weekday][minute] bit mask of placements
		type grid [weeks][7][day]uint16
		occ := map[string]*grid{}
		mark := func(who string, i int) {
			if occ[who] == nil {
				occ[who] = &grid{}
			}
			ds, a, b, ws := bruteMinutes(tm, s, i)
			for w := 0; w < weeks; w++ {
				if ws&(1<<w) == 0 {
					continue
				}
				for _, d := range ds {
					for m := a; m < b; m++ {
						occ[who][w][d][m] |= 1 << i
					}
				}
			}
		}
		for i := range s.Placements {
			sec := tm.Sections[i]
			for _, id := range sec.Staff {
				mark("staff "+id, i)
			}
			for _, id := range sec.Cohorts {
				mark("cohort "+id, i)
			}
			if r := s.Placements[i].Room; r != "" {
				mark("room "+r, i)
			}
		}
		ruleOf := map[string]string{"staff": RuleStaffClash, "cohort": RuleCohortClash, "room": RuleRoomClash}
		want := map[clashPair]bool{}
		lunchDays := map[string]int{}
		weekOver := map[string]int{}
		for who, g := range occ {
			kind := who[:len(who)-3]
			if kind == "room " || kind == "staff " || kind == "cohort " {
				kind = kind[:len(kind)-1]
			}
			var lunch LunchBreak
			switch who {
			case "staff S1":
				lunch = tm.Staff[0].Lunch
			case "cohort C1":
				lunch = tm.Cohorts[0].Lunch
			}
			badDay := [7]bool{}
			minsOver, daysOver := false, false
			for w := 0; w < weeks; w++ {
				busyMins, busyDays := 0, 0
				for d := 0; d < 7; d++ {
					any := false
					for m := 0; m < day; m++ {
						mask := g[w][d][m]
						if mask != 0 {
							any = true
							busyMins++
						}
						if bits.OnesCount16(mask) < 2 {
							continue
						}
						for i := 0; i < 16; i++ {
							for j := i + 1; j < 16; j++ {
								if mask&(1<<i) != 0 && mask&(1<<j) != 0 {
									want[clashPair{ruleOf[kind], i, j}] = true
								}
							}
						}
					}
					if any {
						busyDays++
					}
					if any && lunch.Set() {
						best, run := 0, 0
						for m := int(lunch.From); m < int(lunch.To); m++ {
							if g[w][d][m] == 0 {
								run++
								best = max(best, run)
							} else {
								run = 0
							}
						}
						if best < lunch.Minutes {
							badDay[d] = true
						}
					}
				}
				if who == "staff S2" {
					minsOver = minsOver || busyMins > tm.Staff[1].MaxWeekMinutes
					daysOver = daysOver || busyDays > tm.Staff[1].MaxWeekDays
				}
			}
			for _, b := range badDay {
				if b {
					lunchDays[who]++
				}
			}
			if minsOver {
				weekOver[who]++
			}
			if daysOver {
				weekOver[who]++
			}
		}
		// MaxWeekPeriods of S1: grid periods busy in a week, from the Periods rows.
		for w := 0; w < weeks; w++ {
			busy := map[int]bool{}
			for i, p := range s.Placements {
				sec := tm.Sections[i]
				if len(sec.Times) == 0 && len(sec.Staff) == 1 && sec.Staff[0] == "S1" && sec.Weeks&(1<<w) != 0 {
					for q := p.Period; q < p.Period+sec.Length; q++ {
						busy[q] = true
					}
				}
			}
			if len(busy) > tm.Staff[0].MaxWeekPeriods {
				weekOver["staff S1"] = 1
			}
		}
		got := map[clashPair]bool{}
		gotLunch := map[string]int{}
		gotWeek := map[string]int{}
		for _, v := range Check(tm, s) {
			switch v.Rule {
			case RuleStaffClash, RuleCohortClash, RuleRoomClash:
				require.Len(t, v.Placements, 2)
				got[clashPair{v.Rule, v.Placements[0], v.Placements[1]}] = true
			case RuleLunch:
				gotLunch[ptWho(tm, v)]++
			case RuleWeekLimit:
				gotWeek[ptWho(tm, v)]++
			case RuleTravel:
			default:
				t.Fatalf("trial %d: unexpected %v", trial, v)
			}
		}
		clashes, lunches, limits = clashes+len(got), lunches+len(gotLunch), limits+len(gotWeek)
		require.Equal(t, want, got, "trial %d: double bookings", trial)
		assert.Equal(t, lunchDays, gotLunch, "trial %d: lunch breaks (days per person)", trial)
		assert.Equal(t, weekOver, gotWeek, "trial %d: weekly limits broken per person", trial)
	}
}

// clashPair is a double booking as a rule and a pair of placements.
type clashPair struct {
	rule string
	i, j int
}

// ptWho names the staff member or cohort among a violation's sources.
func ptWho(t *Term, v Violation) string {
	for _, src := range v.Sources {
		for _, st := range t.Staff {
			if st.Src == src {
				return "staff " + st.ID
			}
		}
		for _, co := range t.Cohorts {
			if co.Src == src {
				return "cohort " + co.ID
			}
		}
	}
	return ""
}

// TestTravelIndexAgreesWithTravelMinutes compares the checker's travel
// index with Term.TravelMinutes's linear scan on random rows over rooms
// and buildings (the scan is the definition; common practice).
func TestTravelIndexAgreesWithTravelMinutes(t *testing.T) {
	rng := rand.New(rand.NewPCG(3, 5))
	places := []string{"R1", "R2", "R3", "North", "South", "East"}
	for trial := 0; trial < 200; trial++ {
		tm := ckTerm()
		tm.Rooms = append(tm.Rooms, Room{ID: "R4", Capacity: 10}) // no building
		tm.Travel = nil
		for k := rng.IntN(6); k > 0; k-- {
			tm.Travel = append(tm.Travel, Travel{From: places[rng.IntN(len(places))], To: places[rng.IntN(len(places))], Minutes: rng.IntN(30)})
		}
		ti := NewTravelIndex(tm)
		for _, a := range []string{"R1", "R2", "R3", "R4", "", "R9"} {
			for _, b := range []string{"R1", "R2", "R3", "R4", "", "R9"} {
				require.Equal(t, tm.TravelMinutes(a, b), ti.Between(a, b), "trial %d: %s to %s with %v", trial, a, b, tm.Travel)
			}
		}
	}
}

// TestCheckAndCostTakeAnyPlacements feeds Check and Cost random, mostly
// broken placements of mixed terms (times and periods out of range, blank
// and unknown rooms and sections, repeated meetings, a kept timetable of
// the same kind): neither may panic, every violation names a rule and a
// sentence, and Check is deterministic (common practice: robustness of a
// verifier on arbitrary input).
func TestCheckAndCostTakeAnyPlacements(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 8))
	for trial := 0; trial < 300; trial++ {
		tm, s := propTerm(rng)
		tm.Travel = []Travel{{From: "North", To: "South", Minutes: 10}}
		tm.Relations = append(tm.Relations, Relation{Kind: RelationKinds[rng.IntN(len(RelationKinds))].Kind,
			Sections: []string{"X0", "X1", "X9", "nobody"}, Hard: rng.IntN(2) == 0, Weight: 3, N: 60, M: 10})
		garble := func(s *Schedule) {
			for i := range s.Placements {
				p := &s.Placements[i]
				switch rng.IntN(6) {
				case 0:
					p.Time = rng.IntN(4) - 1
				case 1:
					p.Period = rng.IntN(len(tm.Periods)+3) - 2
				case 2:
					p.Room = []string{"", "R9", "R2"}[rng.IntN(3)]
				case 3:
					p.Section = "nobody"
				case 4:
					p.Meeting = rng.IntN(3)
				}
			}
			if rng.IntN(3) == 0 && len(s.Placements) > 0 {
				s.Placements = append(s.Placements, s.Placements[rng.IntN(len(s.Placements))])
			}
		}
		kept := &Schedule{Placements: append([]Placement(nil), s.Placements...)}
		garble(s)
		garble(kept)
		vs := Check(tm, s)
		for _, v := range vs {
			require.NotEmpty(t, v.Rule)
			require.NotEmpty(t, v.Msg)
		}
		require.Equal(t, vs, Check(tm, s), "trial %d: deterministic", trial)
		r := Cost(tm, s, kept)
		require.Len(t, r.Criteria, len(Criteria))
	}
}
