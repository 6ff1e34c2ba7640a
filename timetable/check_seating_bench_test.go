package timetable

import (
	"fmt"
	"math/rand/v2"
	"testing"
	"time"
)

// seatBenchTerm generates a term of 300 courses, each a main class and four
// labs whose parent is the main class, one meeting each on a 40-period week
// (no rooms), and nStudents students who request five courses each and
// are sectioned into the main class and one lab of each: a valid seating of
// 10 sectioned enrolments per student. Invented data.
func seatBenchTerm(nStudents int) (*Term, *Schedule) {
	rng := rand.New(rand.NewPCG(1, uint64(nStudents)))
	t := &Term{Name: "bench", FirstDay: time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2027, 12, 10, 0, 0, 0, 0, time.UTC)}
	for d := time.Monday; d <= time.Friday; d++ {
		for h := 8; h < 16; h++ {
			t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: d, Start: Clock(h * 60), End: Clock(h*60 + 50)})
		}
	}
	s := &Schedule{}
	const courses, labs = 300, 4
	for c := range courses {
		lec := fmt.Sprintf("C%03d-L", c)
		t.Sections = append(t.Sections, Section{ID: lec, Meetings: 1, Length: 1, NoRoom: true, Weeks: t.AllWeeks(),
			Course: fmt.Sprintf("C%03d", c), Part: "Main", Limit: nStudents})
		for l := range labs {
			t.Sections = append(t.Sections, Section{ID: fmt.Sprintf("C%03d-B%d", c, l), Meetings: 1, Length: 1, NoRoom: true, Weeks: t.AllWeeks(),
				Course: fmt.Sprintf("C%03d", c), Part: "Lab", Parent: lec, Limit: nStudents})
		}
	}
	for i, sec := range t.Sections {
		s.Placements = append(s.Placements, Placement{Section: sec.ID, Meeting: 1, Period: i % len(t.Periods)})
	}
	for k := range nStudents {
		st := fmt.Sprintf("Q%05d", k)
		picked := map[int]bool{}
		for len(picked) < 5 {
			c := rng.IntN(courses)
			if picked[c] {
				continue
			}
			picked[c] = true
			t.Requests = append(t.Requests, Request{Student: st, Course: fmt.Sprintf("C%03d", c)})
			base := c * (labs + 1)
			s.Enrolments = append(s.Enrolments,
				Enrolment{Student: st, Section: t.Sections[base].ID},
				Enrolment{Student: st, Section: t.Sections[base+1+rng.IntN(labs)].ID})
		}
	}
	return t, s
}

// BenchmarkCheckSectioned measures Check on 10,000 sectioned students
// (100,000 sectioned enrolments); setup outside the timed loop.
func BenchmarkCheckSectioned(b *testing.B) {
	t, s := seatBenchTerm(10_000)
	if vs := HardViolations(Check(t, s)); len(vs) > 0 {
		b.Fatalf("the generated seating is not valid: %v", vs[0])
	}
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		Check(t, s)
	}
}

// BenchmarkCheckSeatingOnly measures the seating rule alone on the same
// term (Check's other rules left out).
func BenchmarkCheckSeatingOnly(b *testing.B) {
	t, s := seatBenchTerm(10_000)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		c := &checker{x: newOccupancy(t, s)}
		c.seating()
		if len(c.out) > 0 {
			b.Fatal(c.out[0].Msg)
		}
	}
}

// BenchmarkCostSectioned measures Cost on the same term with itself as the
// kept timetable (moved students judged for every kept enrolment).
func BenchmarkCostSectioned(b *testing.B) {
	t, s := seatBenchTerm(10_000)
	b.ReportAllocs()
	b.ResetTimer()
	for range b.N {
		Cost(t, s, s)
	}
}
