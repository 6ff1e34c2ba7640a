package encode

import (
	"fmt"
	"math/rand"
	"sort"
	"testing"
	"time"

	"github.com/termwright/termwright/timetable"
)

// limitsTestTerm makes a small random pattern term whose sections all have
// staff member T1 and cohort C1 (without rooms), with one of the limits
// set: weekly minutes or days (timetable/term.go, Staff), or a lunch break
// of the staff member or the cohort (timetable/pattern.go, LunchBreak).
func limitsTestTerm(rng *rand.Rand, which string) *timetable.Term {
	t := relTestTerm(rng, timetable.SameStart, false, 2+rng.Intn(2))
	t.Relations = nil
	t.Staff = []timetable.Staff{{ID: "T1", Src: timetable.Source{Sheet: "Staff", Row: 2}}}
	t.Cohorts = []timetable.Cohort{{ID: "C1", Src: timetable.Source{Sheet: "Cohorts", Row: 2}}}
	for s := range t.Sections {
		t.Sections[s].Staff = []string{"T1"}
		if rng.Intn(3) > 0 {
			t.Sections[s].Cohorts = []string{"C1"}
		}
	}
	lunch := timetable.LunchBreak{From: 11 * 60, To: timetable.Clock([]int{12 * 60, 13 * 60, 14 * 60}[rng.Intn(3)]),
		Minutes: []int{30, 50, 70}[rng.Intn(3)]}
	switch which {
	case "minutes":
		t.Staff[0].MaxWeekMinutes = []int{110, 160, 230, 300}[rng.Intn(4)]
	case "days":
		t.Staff[0].MaxWeekDays = 1 + rng.Intn(3)
	case "staff lunch":
		t.Staff[0].Lunch = lunch
	case "cohort lunch":
		t.Cohorts[0].Lunch = lunch
	}
	return t
}

// refLimitsHold evaluates the limits of staff T1 and cohort C1 on an
// assignment, directly from the definitions: per teaching week, the
// minutes of every meeting and the distinct days with a meeting; per week
// and day with a meeting, some stretch of Minutes consecutive free minutes
// inside [From, To).
func refLimitsHold(t *timetable.Term, a refAssign) bool {
	meetingsOf := func(id string, staff bool) []refMeeting {
		var out []refMeeting
		for s, sec := range t.Sections {
			list := sec.Cohorts
			if staff {
				list = sec.Staff
			}
			for _, x := range list {
				if x == id {
					out = append(out, refMeetings(t, a, s)...)
				}
			}
		}
		return out
	}
	st := t.Staff[0]
	staffMs := meetingsOf("T1", true)
	for w := 1; w <= t.TeachingWeeks(); w++ {
		minutes, days := 0, map[time.Weekday]bool{}
		for _, m := range staffMs {
			if m.weeks.Has(w) {
				minutes += m.end - m.start
				days[m.day] = true
			}
		}
		if st.MaxWeekMinutes > 0 && minutes > st.MaxWeekMinutes || st.MaxWeekDays > 0 && len(days) > st.MaxWeekDays {
			return false
		}
	}
	return refLunchHolds(t, st.Lunch, staffMs) && refLunchHolds(t, t.Cohorts[0].Lunch, meetingsOf("C1", false))
}

func refLunchHolds(t *timetable.Term, lb timetable.LunchBreak, ms []refMeeting) bool {
	if !lb.Set() {
		return true
	}
	for w := 1; w <= t.TeachingWeeks(); w++ {
		for d := time.Sunday; d <= time.Saturday; d++ {
			var day []refMeeting
			for _, m := range ms {
				if m.day == d && m.weeks.Has(w) {
					day = append(day, m)
				}
			}
			if len(day) == 0 {
				continue
			}
			// Walk the window minute by minute: the longest free run.
			best, run := 0, 0
			for x := int(lb.From); x < int(lb.To); x++ {
				busy := false
				for _, m := range day {
					busy = busy || m.start <= x && x < m.end
				}
				if busy {
					run = 0
				} else {
					run++
					best = max(best, run)
				}
			}
			if best < lb.Minutes {
				return false
			}
		}
	}
	return true
}

// refPeopleClash reports whether two meetings of one staff member or
// cohort overlap (the engine's one-meeting-at-a-time layer).
func refPeopleClash(t *timetable.Term, a refAssign) bool {
	for s := range t.Sections {
		for u := s + 1; u < len(t.Sections); u++ {
			for _, x := range refMeetings(t, a, s) {
				for _, y := range refMeetings(t, a, u) {
					if refSameDayWeek(x, y) && refHoursMeet(x, y) {
						return true
					}
				}
			}
		}
	}
	return false
}

// TestPatternLimitsAgainstReference: the timetables the engine finds under
// each limit are exactly the assignments the reference accepts (those with
// overlapping meetings of the one staff member aside, which the engine's
// one-meeting-at-a-time layer may forbid).
func TestPatternLimitsAgainstReference(t *testing.T) {
	rounds := 25
	if testing.Short() {
		rounds = 8
	}
	for _, which := range []string{"minutes", "days", "staff lunch", "cohort lunch"} {
		t.Run(which, func(t *testing.T) {
			rng := rand.New(rand.NewSource(int64(len(which)) * 104729))
			for round := 0; round < rounds; round++ {
				term := limitsTestTerm(rng, which)
				models := engineModels(t, term)
				want := map[string]bool{}
				for _, a := range refAll(term) {
					if !refLimitsHold(term, a) {
						continue
					}
					key := assignKey(a)
					want[key] = true
					if _, ok := models[key]; !ok && !refPeopleClash(term, a) {
						t.Fatalf("%s: the reference accepts %s but the engine has no such model\n%s", which, key, describeLimits(term))
					}
				}
				for key := range models {
					if !want[key] {
						t.Fatalf("%s: the engine has model %s, which the reference rejects\n%s", which, key, describeLimits(term))
					}
				}
			}
		})
	}
}

func describeLimits(t *timetable.Term) string {
	st, co := t.Staff[0], t.Cohorts[0]
	out := fmt.Sprintf("staff minutes %d days %d lunch %+v; cohort lunch %+v\n", st.MaxWeekMinutes, st.MaxWeekDays, st.Lunch, co.Lunch)
	var lines []string
	for _, s := range t.Sections {
		line := fmt.Sprintf("  %s %v:", s.ID, s.Cohorts)
		for i, tc := range s.Times {
			line += fmt.Sprintf(" [%d] %s %s+%d w%04b;", i, tc.Days, tc.Start, tc.Minutes, tc.Weeks)
		}
		lines = append(lines, line)
	}
	sort.Strings(lines)
	for _, l := range lines {
		out += l + "\n"
	}
	return out
}

// TestPatternLimitsGridMeetings: grid meetings count too. A staff member
// with one grid section (two 60-minute meetings a week, hand-computed 120
// minutes and 2 grid periods) and a pattern section of 90 minutes on one
// day: 210 minutes a week; at most 200 minutes leaves no timetable, 210
// one; at most 1 grid period a week leaves none (Meetings × Length = 2).
func TestPatternLimitsGridMeetings(t *testing.T) {
	mk := func(minutes, periods int) *timetable.Term {
		term := relTestTerm(rand.New(rand.NewSource(3)), timetable.SameStart, false, 1)
		term.Relations = nil
		for d := time.Monday; d <= time.Wednesday; d++ {
			for h := 9; h < 11; h++ {
				term.Periods = append(term.Periods, timetable.Period{Index: len(term.Periods), Day: d, Start: timetable.Clock(h * 60), End: timetable.Clock(h*60 + 60)})
			}
		}
		term.Staff = []timetable.Staff{{ID: "T1", MaxWeekMinutes: minutes, MaxWeekPeriods: periods}}
		term.Sections[0].Staff = []string{"T1"}
		term.Sections[0].Times = []timetable.TimeChoice{{Days: timetable.DaysOf(time.Thursday), Start: 9 * 60, Minutes: 90, Weeks: term.AllWeeks()}}
		term.Sections = append(term.Sections, timetable.Section{ID: "G1", Staff: []string{"T1"}, Meetings: 2, Length: 1, NoRoom: true, Size: 10})
		return term
	}
	for _, tc := range []struct {
		minutes, periods int
		feasible         bool
	}{{200, 0, false}, {210, 0, true}, {0, 1, false}, {0, 2, true}} {
		term := mk(tc.minutes, tc.periods)
		res := solveEngine(t, term)
		if res.feasible != tc.feasible {
			t.Errorf("minutes %d periods %d: feasible %v, want %v", tc.minutes, tc.periods, res.feasible, tc.feasible)
		}
	}
}
