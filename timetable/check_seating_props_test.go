package timetable

import (
	"fmt"
	"math/rand/v2"
	"slices"
	"testing"
	"time"
)

// seatPropTerm makes a random tiny term: course X with one or two
// arrangements of one or two parts of one or two sections (four sections
// at most), random parents within an arrangement, course Y of one section,
// random limits 0–2 (some by Limit, some by Expected size), students s1 and
// s2 with random requests (X, maybe with Y under Or instead; Y), and
// sometimes a fixed enrolment. Every section is a no-room grid section
// with one meeting at its own period, so that Check's other rules stay
// quiet.
func seatPropTerm(rng *rand.Rand) *Term {
	t := &Term{Name: "prop", FirstDay: time.Date(2027, 9, 13, 0, 0, 0, 0, time.UTC), LastDay: time.Date(2027, 9, 17, 0, 0, 0, 0, time.UTC)}
	for h := 8; h < 16; h++ {
		t.Periods = append(t.Periods, Period{Index: len(t.Periods), Day: time.Monday, Start: Clock(h * 60), End: Clock(h*60 + 50)})
	}
	add := func(course, arr, part string) {
		s := Section{ID: fmt.Sprintf("S%d", len(t.Sections)+1), Meetings: 1, Length: 1, NoRoom: true, Weeks: t.AllWeeks(),
			Course: course, Arrangement: arr, Part: part}
		if rng.IntN(2) == 0 {
			s.Limit = rng.IntN(3) // 0 falls back on Size
		}
		s.Size = rng.IntN(3)
		t.Sections = append(t.Sections, s)
	}
	for a := range 1 + rng.IntN(2) {
		first := len(t.Sections)
		for p := range 1 + rng.IntN(2) {
			for range 1 + rng.IntN(2) {
				if len(t.Sections) < 4 {
					add("X", fmt.Sprint("A", a), fmt.Sprint("P", p))
				}
			}
		}
		for i := first; i < len(t.Sections); i++ {
			var heads []int
			for j := first; j < len(t.Sections); j++ {
				if t.Sections[j].Part != t.Sections[i].Part {
					heads = append(heads, j)
				}
			}
			if len(heads) > 0 && t.Sections[i].Part != "P0" && rng.IntN(2) == 0 {
				t.Sections[i].Parent = t.Sections[heads[rng.IntN(len(heads))]].ID
			}
		}
	}
	add("Y", "", "")
	for _, st := range []string{"s1", "s2"} {
		if rng.IntN(3) > 0 {
			r := Request{Student: st, Course: "X"}
			if rng.IntN(3) == 0 {
				r.Alternatives = []string{"Y"}
			}
			t.Requests = append(t.Requests, r)
		}
		if rng.IntN(2) == 0 {
			t.Requests = append(t.Requests, Request{Student: st, Course: "Y"})
		}
	}
	if rng.IntN(4) == 0 {
		t.Enrolments = []Enrolment{{Student: "s1", Section: t.Sections[rng.IntN(len(t.Sections))].ID}}
	}
	return t
}

// seatRuleHolds is the seating rule of Course's doc comment written
// directly as sets, by brute force and independently of Check: for each
// student with a sectioned enrolment in a course, some arrangement holds
// all their sections of the course with exactly one in each of its parts;
// every held section's parent is held; limits hold (fixed counted); some
// one-to-one choice of requests names every sectioned course; and no
// student is fixed and sectioned in one section.
func seatRuleHolds(t *Term, sectioned []Enrolment) bool {
	held := map[string]map[string]bool{} // student -> sections
	secOf := map[string]bool{}           // "student/section" sectioned
	hold := func(st, sec string) {
		if held[st] == nil {
			held[st] = map[string]bool{}
		}
		held[st][sec] = true
	}
	for _, e := range t.Enrolments {
		hold(e.Student, e.Section)
	}
	for _, e := range sectioned {
		if held[e.Student][e.Section] {
			return false // fixed and sectioned (or twice)
		}
		hold(e.Student, e.Section)
		secOf[e.Student+"/"+e.Section] = true
	}
	sec := func(id string) *Section {
		for i := range t.Sections {
			if t.Sections[i].ID == id {
				return &t.Sections[i]
			}
		}
		return nil
	}
	for i := range t.Sections {
		n := 0
		for _, h := range held {
			if h[t.Sections[i].ID] {
				n++
			}
		}
		if n > t.SectionLimit(i) {
			return false
		}
	}
	for st, h := range held {
		var coursesSectioned []string
		for _, c := range []string{"X", "Y"} {
			some := false
			var mine []*Section
			for id := range h {
				if s := sec(id); s.Course == c {
					mine = append(mine, s)
					some = some || secOf[st+"/"+id]
				}
			}
			if !some {
				continue
			}
			coursesSectioned = append(coursesSectioned, c)
			ok := false
			for _, arr := range []string{"", "A0", "A1"} {
				parts := map[string]int{}
				for i := range t.Sections {
					if t.Sections[i].Course == c && t.Sections[i].Arrangement == arr {
						parts[t.Sections[i].Part] += 0
					}
				}
				inside := len(parts) > 0
				for _, s := range mine {
					if s.Arrangement != arr {
						inside = false
					}
					parts[s.Part]++
				}
				for _, n := range parts {
					inside = inside && n == 1
				}
				ok = ok || inside
			}
			for _, s := range mine {
				if s.Parent != "" && !h[s.Parent] {
					ok = false
				}
			}
			if !ok {
				return false
			}
		}
		var reqs []Request
		for _, r := range t.Requests {
			if r.Student == st {
				reqs = append(reqs, r)
			}
		}
		if !seatAssignable(coursesSectioned, reqs, map[int]bool{}) {
			return false
		}
	}
	return true
}

// seatAssignable tries every way of giving each course its own request.
func seatAssignable(courses []string, reqs []Request, used map[int]bool) bool {
	if len(courses) == 0 {
		return true
	}
	for i, r := range reqs {
		if used[i] || r.Course != courses[0] && !slices.Contains(r.Alternatives, courses[0]) {
			continue
		}
		used[i] = true
		if seatAssignable(courses[1:], reqs, used) {
			return true
		}
		used[i] = false
	}
	return false
}

// TestCheckSeatingProperty: on random tiny terms, Check reports no
// violation of the seating rule exactly for the seatings that satisfy it,
// over every seating of two students (each a subset of the sections).
func TestCheckSeatingProperty(t *testing.T) {
	rng := rand.New(rand.NewPCG(15, 2027))
	terms := 40
	if testing.Short() {
		terms = 8
	}
	accepted, refused := 0, 0
	for n := range terms {
		tm := seatPropTerm(rng)
		s := &Schedule{}
		for i, sec := range tm.Sections {
			s.Placements = append(s.Placements, Placement{Section: sec.ID, Meeting: 1, Period: i})
		}
		k := len(tm.Sections)
		for m1 := 0; m1 < 1<<k; m1++ {
			for m2 := 0; m2 < 1<<k; m2++ {
				s.Enrolments = s.Enrolments[:0]
				for i := range k {
					if m1&(1<<i) != 0 {
						s.Enrolments = append(s.Enrolments, Enrolment{Student: "s1", Section: tm.Sections[i].ID})
					}
					if m2&(1<<i) != 0 {
						s.Enrolments = append(s.Enrolments, Enrolment{Student: "s2", Section: tm.Sections[i].ID})
					}
				}
				want := seatRuleHolds(tm, s.Enrolments)
				vs := seatViolations(Check(tm, s))
				if got := len(vs) == 0; got != want {
					t.Fatalf("term %d, seating %v: rule holds %v, Check says %v: %v\nsections %+v\nrequests %+v\nfixed %+v", n, s.Enrolments, want, got, vs, tm.Sections, tm.Requests, tm.Enrolments)
				}
				if want {
					accepted++
				} else {
					refused++
				}
			}
		}
	}
	if accepted == 0 || refused == 0 {
		t.Fatalf("the random terms exercise one side only: %d accepted, %d refused", accepted, refused)
	}
	t.Logf("%d seatings accepted, %d refused", accepted, refused)
}
