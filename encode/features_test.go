package encode

import (
	"testing"
	"time"

	"github.com/termwright/termwright/timetable"
)

// TestFeatures covers each requirement with a small feasible and a small
// infeasible term. Every timetable found passes solver.Verify and
// timetable.Check, and the engine and the reference library agree.
func TestFeatures(t *testing.T) {
	const (
		mon = time.Monday
		tue = time.Tuesday
	)
	cases := []struct {
		name     string
		term     *timetable.Term
		feasible bool
	}{
		{"staff no-overlap fits", newTerm(1, 2).room("R1", 30).room("R2", 30).
			section("A", staffOf("T")).section("B", staffOf("T")).t, true},
		{"staff no-overlap too many", newTerm(1, 2).room("R1", 30).room("R2", 30).room("R3", 30).
			section("A", staffOf("T")).section("B", staffOf("T")).section("C", staffOf("T")).t, false},
		{"cohort no-overlap too many", newTerm(1, 2).room("R1", 30).room("R2", 30).room("R3", 30).
			section("A", cohortsOf("Y1")).section("B", cohortsOf("Y1")).section("C", cohortsOf("Y1")).t, false},
		{"disjoint weeks share a period", newTerm(1, 1).room("R1", 30).
			section("A", staffOf("T"), weeks(0b010101)).section("B", staffOf("T"), weeks(0b101010)).t, true},
		{"overlapping weeks clash", newTerm(1, 1).room("R1", 30).room("R2", 30).
			section("A", staffOf("T"), weeks(0b0111)).section("B", staffOf("T"), weeks(0b1100)).t, false},
		{"odd, even and all weeks", newTerm(1, 2).room("R1", 30).
			section("A", weeks(0b0101)).section("B", weeks(0b1010)).section("C", weeks(0b1111)).t, true},
		{"odd, even, all weeks, one period", newTerm(1, 1).room("R1", 30).
			section("A", weeks(0b0101)).section("B", weeks(0b1010)).section("C", weeks(0b1111)).t, false},
		{"multi-period fits a run", newTerm(1, 3).room("R1", 30).section("A", meetings(1, 3)).t, true},
		{"multi-period longer than a run", newTerm(2, 2).room("R1", 30).section("A", meetings(1, 3)).t, false},
		{"multi-period overlap", newTerm(1, 3).room("R1", 30).room("R2", 30).
			section("A", meetings(1, 2), staffOf("T")).section("B", meetings(1, 2), staffOf("T")).t, false},
		{"different days", newTerm(2, 2).room("R1", 30).section("A", meetings(2, 1)).t, true},
		{"different days, one day", newTerm(1, 3).room("R1", 30).section("A", meetings(2, 1)).t, false},
		{"same day allowed", newTerm(1, 3).room("R1", 30).section("A", meetings(2, 1), sameDay).t, true},
		{"same day, own meetings apart", newTerm(1, 3).room("R1", 30).section("A", meetings(2, 2), sameDay).t, false},
		{"fixed meeting", newTerm(1, 2).room("R1", 30).
			section("A", staffOf("T"), fixedAt(mon, 9, "")).section("B", staffOf("T"), fixedAt(mon, 10, "")).t, true},
		{"fixed meetings clash", newTerm(1, 2).room("R1", 30).room("R2", 30).
			section("A", staffOf("T"), fixedAt(mon, 9, "")).section("B", staffOf("T"), fixedAt(mon, 9, "")).t, false},
		{"fixed room taken twice", newTerm(1, 1).room("R1", 30).room("R2", 30).
			section("A", fixedAt(mon, 9, "R1")).section("B", fixedAt(mon, 9, "R1")).t, false},
		{"fixed room", newTerm(1, 1).room("R1", 30).room("R2", 30).
			section("A", fixedAt(mon, 9, "R2")).section("B", fixedAt(mon, 9, "")).t, true},
		{"staff unavailable", newTerm(1, 2).room("R1", 30).room("R2", 30).
			section("A", staffOf("T")).section("B", staffOf("T")).unavailable(timetable.WhoStaff, "T", mon, 9, 10).t, false},
		{"staff unavailable part", newTerm(1, 3).room("R1", 30).room("R2", 30).
			section("A", staffOf("T")).section("B", staffOf("T")).unavailable(timetable.WhoStaff, "T", mon, 9, 10).t, true},
		{"cohort unavailable", newTerm(1, 1).room("R1", 30).
			section("A", cohortsOf("Y")).unavailable(timetable.WhoCohort, "Y", mon, 9, 10).t, false},
		{"section unavailable", newTerm(1, 2).room("R1", 30).
			section("A", meetings(1, 2)).unavailable(timetable.WhoSection, "A", mon, 10, 11).t, false},
		{"room unavailable", newTerm(1, 1).room("R1", 30).room("R2", 30).
			section("A").section("B").unavailable(timetable.WhoRoom, "R2", mon, 9, 10).t, false},
		{"room unavailable, other free", newTerm(1, 2).room("R1", 30).room("R2", 30).
			section("A").section("B").section("C").unavailable(timetable.WhoRoom, "R2", mon, 9, 10).t, true},
		{"capacity", newTerm(1, 1).room("R1", 30).room("R2", 50).
			section("A", sized(40)).section("B", sized(45)).t, false},
		{"capacity fits", newTerm(1, 2).room("R1", 30).room("R2", 50).
			section("A", sized(40)).section("B", sized(45)).t, true},
		{"features", newTerm(1, 1).room("R1", 30, "lab").room("R2", 30).
			section("A", needs("lab")).section("B", needs("lab")).t, false},
		{"allowed rooms", newTerm(1, 1).room("R1", 30).room("R2", 30).room("R3", 30).
			section("A", roomsOf("R1")).section("B", roomsOf("R1", "R2")).section("C", roomsOf("R2")).t, false},
		{"no room sections need none", newTerm(1, 1).
			section("A", noRoom).section("B", noRoom).t, true},
		{"max per day", withStaff(newTerm(2, 3).section("A", staffOf("T"), noRoom, meetings(1, 2)).
			section("B", staffOf("T"), noRoom, meetings(1, 2)).t, "T", 2, 0), true},
		{"max per day infeasible", withStaff(newTerm(1, 4).section("A", staffOf("T"), noRoom, meetings(1, 2)).
			section("B", staffOf("T"), noRoom, meetings(1, 1)).t, "T", 2, 0), false},
		{"max consecutive", withStaff(newTerm(1, 4).section("A", staffOf("T"), noRoom).
			section("B", staffOf("T"), noRoom).section("C", staffOf("T"), noRoom).t, "T", 0, 2), true},
		{"max consecutive infeasible", withStaff(newTerm(1, 3).section("A", staffOf("T"), noRoom).
			section("B", staffOf("T"), noRoom).section("C", staffOf("T"), noRoom).t, "T", 0, 2), false},
		{"max consecutive with a gap", withStaff(gapDay(newTerm(1, 4)).section("A", staffOf("T"), noRoom).
			section("B", staffOf("T"), noRoom).section("C", staffOf("T"), noRoom).section("D", staffOf("T"), noRoom).t, "T", 0, 2), true},
		{"same time", newTerm(1, 2).room("R1", 30).room("R2", 30).
			section("A", cohortsOf("Y")).section("B").section("C", cohortsOf("Y")).
			relation(timetable.SameTime, "A", "B").t, true},
		{"same time infeasible", newTerm(1, 2).room("R1", 30).room("R2", 30).
			section("A", staffOf("T")).section("B", staffOf("T")).relation(timetable.SameTime, "A", "B").t, false},
		{"not same time", newTerm(1, 1).room("R1", 30).room("R2", 30).
			section("A").section("B").relation(timetable.NotSameTime, "A", "B").t, false},
		{"different days rel", newTerm(2, 1).section("A", noRoom).section("B", noRoom).section("C", noRoom).
			relation(timetable.DifferentDays, "A", "B", "C").t, false},
		{"different days rel fits", newTerm(3, 1).section("A", noRoom).section("B", noRoom).section("C", noRoom).
			relation(timetable.DifferentDays, "A", "B", "C").t, true},
		{"same day rel", newTerm(2, 2).section("A", noRoom, meetings(2, 1)).section("B", noRoom, meetings(2, 1)).
			relation(timetable.SameDayRel, "A", "B").t, true},
		{"same day rel infeasible", newTerm(2, 2).section("A", noRoom, staffOf("T")).section("B", noRoom).
			section("C", noRoom, staffOf("T"), meetings(1, 2)).relation(timetable.SameDayRel, "A", "B").
			unavailable(timetable.WhoSection, "B", mon, 9, 11).unavailable(timetable.WhoSection, "A", tue, 9, 11).t, false},
		{"before", newTerm(1, 3).section("A", noRoom, meetings(1, 2)).section("B", noRoom).
			relation(timetable.Before, "A", "B").t, true},
		{"before infeasible", newTerm(1, 3).section("A", noRoom, meetings(1, 2)).section("B", noRoom, meetings(1, 2)).
			relation(timetable.Before, "A", "B").t, false},
		{"before chain", newTerm(2, 2).section("A", noRoom, meetings(2, 1), sameDay).section("B", noRoom).section("C", noRoom).
			relation(timetable.Before, "A", "B", "C").t, true},
		{"back to back", newTerm(2, 3).section("A", noRoom, meetings(2, 1)).section("B", noRoom, meetings(2, 2)).
			relation(timetable.BackToBack, "A", "B").t, true},
		{"back to back across a gap", gapDay(newTerm(1, 3)).section("A", noRoom).section("B", noRoom).
			relation(timetable.BackToBack, "A", "B").
			unavailable(timetable.WhoSection, "A", mon, 9, 10).t, false},
		{"back to back before the gap", gapDay(newTerm(1, 3)).section("A", noRoom).section("B", noRoom).
			relation(timetable.BackToBack, "A", "B").t, true},
		{"same room", newTerm(2, 1).room("R1", 30).room("R2", 30).
			section("A", staffOf("T")).section("B", staffOf("T")).relation(timetable.SameRoom, "A", "B").t, true},
		{"same room at one time", newTerm(1, 1).room("R1", 30).room("R2", 30).
			section("A").section("B").relation(timetable.SameRoom, "A", "B").t, false},
		{"same room with fixed room", newTerm(2, 1).room("R1", 30).room("R2", 30).
			section("A", fixedAt(mon, 9, "R2")).section("B", fixedAt(tue, 9, "")).section("C", fixedAt(tue, 9, "R2")).
			relation(timetable.SameRoom, "A", "B").t, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			out := solveBoth(t, tc.term)
			if out.feasible != tc.feasible {
				t.Fatalf("feasible = %v, want %v", out.feasible, tc.feasible)
			}
		})
	}
}

func withStaff(t *timetable.Term, id string, perDay, consecutive int) *timetable.Term {
	for i := range t.Staff {
		if t.Staff[i].ID == id {
			t.Staff[i].MaxPerDay, t.Staff[i].MaxConsecutive = perDay, consecutive
		}
	}
	return t
}

// gapDay moves every period after the second of each day an hour later, so
// the day has a break after its second period.
func gapDay(b *termBuilder) *termBuilder {
	for i := range b.t.Periods {
		p := &b.t.Periods[i]
		if p.Start >= 11*60 {
			p.Start += 60
			p.End += 60
		}
	}
	return b
}
