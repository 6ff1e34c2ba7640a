package timetable_test

import (
	"math/rand/v2"
	"testing"
	"time"

	"github.com/termwright/termwright/timetable"
)

// patternBenchTerm builds an invented term the size of the largest public
// ITC-2019 instance (1,061 sections): every section at one of 6 meeting
// times (Mon Wed Fri 50 minutes, Tue Thu 75, one long day; every week, odd
// or even weeks, or a block of weeks) with 8 room choices among 80 rooms
// in 6 buildings with travel times, 260 staff and 150 cohorts with lunch
// breaks and weekly limits, and 2,500 relations of every kind over 2–12
// sections (a few over 40). The schedule picks times and rooms at random,
// so it has clashes and broken relations of every kind to report.
func patternBenchTerm(nSec int, seed uint64) (*timetable.Term, *timetable.Schedule) {
	rng := rand.New(rand.NewPCG(seed, 19))
	t := &timetable.Term{Name: "Bench", FirstDay: time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC),
		LastDay: time.Date(2027, 12, 17, 0, 0, 0, 0, time.UTC)}
	all := t.AllWeeks()
	odd := all & 0x5555555555555555
	for r := 0; r < 80; r++ {
		t.Rooms = append(t.Rooms, timetable.Room{ID: "R" + itoaB(r), Capacity: 20 + 10*rng.IntN(20), Building: "B" + itoaB(r%6)})
	}
	for a := 0; a < 6; a++ {
		for b := a + 1; b < 6; b++ {
			t.Travel = append(t.Travel, timetable.Travel{From: "B" + itoaB(a), To: "B" + itoaB(b), Minutes: 5 * (1 + rng.IntN(4))})
		}
	}
	for k := 0; k < 260; k++ {
		t.Staff = append(t.Staff, timetable.Staff{ID: "S" + itoaB(k), MaxWeekMinutes: 900, MaxWeekDays: 4,
			Lunch: timetable.LunchBreak{From: 11 * 60, To: 14 * 60, Minutes: 30}})
	}
	for k := 0; k < 150; k++ {
		t.Cohorts = append(t.Cohorts, timetable.Cohort{ID: "C" + itoaB(k), Lunch: timetable.LunchBreak{From: 11 * 60, To: 14 * 60, Minutes: 45}})
	}
	mwf := timetable.DaysOf(time.Monday, time.Wednesday, time.Friday)
	tth := timetable.DaysOf(time.Tuesday, time.Thursday)
	s := &timetable.Schedule{}
	for k := 0; k < nSec; k++ {
		sec := timetable.Section{ID: "X" + itoaB(k), Size: 15, Meetings: 1, Length: 1, Weeks: all,
			Staff: []string{"S" + itoaB(rng.IntN(260))}, Cohorts: []string{"C" + itoaB(rng.IntN(150))}}
		for c := 0; c < 6; c++ {
			weeks := []timetable.WeekSet{all, odd, all &^ odd, 0b1111 << rng.IntN(10)}[rng.IntN(4)]
			start := timetable.Clock(8*60 + 30*rng.IntN(18))
			switch rng.IntN(3) {
			case 0:
				sec.Times = append(sec.Times, timetable.TimeChoice{Days: mwf, Start: start, Minutes: 50, Weeks: weeks, Weight: rng.IntN(3)})
			case 1:
				sec.Times = append(sec.Times, timetable.TimeChoice{Days: tth, Start: start, Minutes: 75, Weeks: weeks, Weight: rng.IntN(3)})
			default:
				sec.Times = append(sec.Times, timetable.TimeChoice{Days: timetable.DaysOf(time.Weekday(1 + rng.IntN(5))), Start: start, Minutes: 110, Weeks: weeks})
			}
		}
		for c := 0; c < 8; c++ {
			sec.RoomChoices = append(sec.RoomChoices, timetable.RoomChoice{Room: "R" + itoaB(rng.IntN(80)), Weight: rng.IntN(4)})
		}
		t.Sections = append(t.Sections, sec)
		s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1,
			Time: 1 + rng.IntN(6), Room: sec.RoomChoices[rng.IntN(8)].Room})
	}
	for k := 0; k < 2500; k++ {
		n := 2 + rng.IntN(11)
		if k%100 == 0 {
			n = 40 + rng.IntN(20)
		}
		kind := timetable.RelationKinds[rng.IntN(len(timetable.RelationKinds))].Kind
		r := timetable.Relation{Kind: kind, Hard: rng.IntN(3) == 0, Weight: 1 + rng.IntN(20), N: 60 * (1 + rng.IntN(6)), M: 10 * rng.IntN(4)}
		if kind == timetable.MaxDays {
			r.N = 1 + rng.IntN(4)
		}
		first := rng.IntN(nSec)
		for j := 0; j < n; j++ {
			r.Sections = append(r.Sections, "X"+itoaB((first+j*7)%nSec))
		}
		t.Relations = append(t.Relations, r)
	}
	return t, s
}

func itoaB(n int) string {
	if n < 10 {
		return string(rune('0' + n))
	}
	return itoaB(n/10) + string(rune('0'+n%10))
}

// BenchmarkCheckCostPatterns is Check and Cost of a full schedule of the
// 1,061-section pattern term.
func BenchmarkCheckCostPatterns(b *testing.B) {
	t, s := patternBenchTerm(1061, 1)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		timetable.Check(t, s)
		timetable.Cost(t, s, nil)
	}
}

// BenchmarkCheckCostPatternsScaling doubles the term to show the growth
// is near-linear.
func BenchmarkCheckCostPatternsScaling(b *testing.B) {
	for _, n := range []int{530, 1061, 2122} {
		t, s := patternBenchTerm(n, 1)
		b.Run(itoaB(n), func(b *testing.B) {
			b.ReportAllocs()
			for range b.N {
				timetable.Check(t, s)
				timetable.Cost(t, s, nil)
			}
		})
	}
}

func TestPatternBenchTermIsChecked(t *testing.T) {
	term, s := patternBenchTerm(200, 2)
	vs := timetable.Check(term, s)
	rules := map[string]bool{}
	for _, v := range vs {
		rules[v.Rule] = true
	}
	for _, r := range []string{timetable.RuleStaffClash, timetable.RuleRoomClash, timetable.RuleRelation, timetable.RuleTravel, timetable.RuleLunch} {
		if !rules[r] {
			t.Errorf("the bench term should break %q; got %v", r, rules)
		}
	}
}
