package sectioning

import (
	"fmt"

	"github.com/termwright/termwright/timetable"
)

// This file judges sectionings from the outside: the objective as the
// criteria's definitions in timetable/criteria.go word it (plus the
// sectioner's documented tie-breaks: priorities, then alternatives), and
// an exhaustive search over every seating of a small term. It shares no
// code with the sectioner.

// judged is a sectioning's objective: unplaced requests, unplaced by
// priority rank, alternative positions used, moved students, student
// clashes (default weights and levels: moved students above clashes).
type judged struct {
	unplaced int
	prio     []int
	alt      int
	moved    int
	clashes  int
}

func (a judged) String() string {
	return fmt.Sprintf("unplaced %d %v, alternatives %d, moved %d, clashes %d", a.unplaced, a.prio, a.alt, a.moved, a.clashes)
}

func (a judged) less(b judged) bool {
	if a.unplaced != b.unplaced {
		return a.unplaced < b.unplaced
	}
	for i := range a.prio {
		if a.prio[i] != b.prio[i] {
			return a.prio[i] < b.prio[i]
		}
	}
	if a.alt != b.alt {
		return a.alt < b.alt
	}
	if a.moved != b.moved {
		return a.moved < b.moved
	}
	return a.clashes < b.clashes
}

// ranks gives each request's priority rank (0 becomes after every number)
// and the number of ranks.
func ranks(t *timetable.Term) ([]int, int) {
	most := 0
	for _, r := range t.Requests {
		most = max(most, r.Priority)
	}
	out := make([]int, len(t.Requests))
	for i, r := range t.Requests {
		out[i] = r.Priority
		if r.Priority <= 0 {
			out[i] = most + 1
		}
	}
	return out, most + 2
}

// pairClash is criterion "student clashes" for one student in sections a
// and b, from the definition: grid pairs with overlapping weeks count the
// periods both occupy; a pair with a pattern section counts 1 when two
// meetings share a minute of a common day in a common week, or leave less
// free time between them than Term.TravelMinutes between their rooms.
func pairClash(t *timetable.Term, s *timetable.Schedule, a, b int) int {
	sa, sb := &t.Sections[a], &t.Sections[b]
	var pa, pb []timetable.Placement
	for _, pl := range s.Placements {
		if pl.Section == sa.ID {
			pa = append(pa, pl)
		}
		if pl.Section == sb.ID {
			pb = append(pb, pl)
		}
	}
	if !sa.UsesTimes() && !sb.UsesTimes() {
		if !sa.Weeks.Overlaps(sb.Weeks) {
			return 0
		}
		occ := map[int]bool{}
		for _, pl := range pa {
			span, _ := t.Span(pl.Period, sa.Length)
			for _, q := range span {
				occ[q] = true
			}
		}
		both := map[int]bool{}
		for _, pl := range pb {
			span, _ := t.Span(pl.Period, sb.Length)
			for _, q := range span {
				if occ[q] {
					both[q] = true
				}
			}
		}
		return len(both)
	}
	for _, x := range pa {
		for _, y := range pb {
			for _, m := range t.Occurrences(x) {
				for _, o := range t.Occurrences(y) {
					if m.Day != o.Day || !m.Weeks.Overlaps(o.Weeks) {
						continue
					}
					if m.Overlaps(o) {
						return 1
					}
					first, second := m, o
					if o.Start < m.Start {
						first, second = o, m
					}
					if int(second.Start-first.End) < t.TravelMinutes(x.Room, y.Room) {
						return 1
					}
				}
			}
		}
	}
	return 0
}

// judge evaluates a result from its enrolments.
func judge(t *timetable.Term, s *timetable.Schedule, keep *timetable.Schedule, res *Result) judged {
	rk, n := ranks(t)
	j := judged{unplaced: len(res.Unplaced), prio: make([]int, n)}
	for _, u := range res.Unplaced {
		j.prio[rk[u.Request]]++
	}
	idx := t.SectionIndex()
	held := map[string][]int{}
	for _, e := range append(append([]timetable.Enrolment(nil), t.Enrolments...), res.Enrolments...) {
		if si, ok := idx[e.Section]; ok && !containsInt(held[e.Student], si) {
			held[e.Student] = append(held[e.Student], si)
		}
	}
	for _, secs := range held {
		for i := range secs {
			for k := i + 1; k < len(secs); k++ {
				j.clashes += pairClash(t, s, secs[i], secs[k])
			}
		}
	}
	// alternatives: which option met each placed request, by matching
	// the student's courses to requests (first option wins)
	courseOf := map[string]map[string]bool{}
	for st, secs := range held {
		courseOf[st] = map[string]bool{}
		for _, si := range secs {
			courseOf[st][t.Sections[si].Course] = true
		}
	}
	unplaced := map[int]bool{}
	for _, u := range res.Unplaced {
		unplaced[u.Request] = true
	}
	for ri, r := range t.Requests {
		if unplaced[ri] {
			continue
		}
		if !courseOf[r.Student][r.Course] {
			for a, alt := range r.Alternatives {
				if courseOf[r.Student][alt] {
					j.alt += a + 1
					break
				}
			}
		}
	}
	if keep != nil {
		for _, e := range keep.Enrolments {
			si, ok := idx[e.Section]
			if !ok {
				continue
			}
			if courseOf[e.Student][t.Sections[si].Course] && !containsInt(held[e.Student], si) {
				j.moved++
			}
		}
	}
	return j
}

func containsInt(xs []int, v int) bool {
	for _, x := range xs {
		if x == v {
			return true
		}
	}
	return false
}

// bruteEnrollments lists every set of sections (fixed ones included) by
// which student st can be in course c: per arrangement, every choice of
// one section per part, kept when every parent is chosen and every fixed
// section of st in c is among them.
func bruteEnrollments(t *timetable.Term, c timetable.Course, fixedInC []int) [][]int {
	var out [][]int
	for _, a := range c.Arrangements {
		choice := make([]int, len(a.Parts))
		var rec func(i int)
		rec = func(i int) {
			if i == len(a.Parts) {
				for _, si := range choice {
					if par := t.Sections[si].Parent; par != "" {
						found := false
						for _, sj := range choice {
							found = found || t.Sections[sj].ID == par
						}
						if !found {
							return
						}
					}
				}
				for _, f := range fixedInC {
					if !containsInt(choice, f) {
						return
					}
				}
				out = append(out, append([]int(nil), choice...))
				return
			}
			for _, si := range a.Parts[i].Sections {
				choice[i] = si
				rec(i + 1)
			}
		}
		rec(0)
	}
	return out
}

// bruteLeaves is the number of seatings bruteForce would visit.
func bruteLeaves(t *timetable.Term) float64 {
	opts := bruteOptions(t)
	n := 1.0
	for _, o := range opts {
		n *= float64(len(o))
	}
	return n
}

type bruteOpt struct {
	course string
	held   []int // sections held, fixed included
}

// bruteOptions lists each request's choices: every enrollment of its
// course and of each alternative, then "unplaced" (nil held, "" course).
func bruteOptions(t *timetable.Term) [][]bruteOpt {
	courses := map[string]timetable.Course{}
	for _, c := range t.Courses() {
		courses[c.ID] = c
	}
	idx := t.SectionIndex()
	fixed := map[string][]int{}
	for _, e := range t.Enrolments {
		if si, ok := idx[e.Section]; ok && !containsInt(fixed[e.Student], si) {
			fixed[e.Student] = append(fixed[e.Student], si)
		}
	}
	out := make([][]bruteOpt, len(t.Requests))
	for ri, r := range t.Requests {
		for _, name := range append([]string{r.Course}, r.Alternatives...) {
			c, ok := courses[name]
			if !ok {
				continue
			}
			var fixedInC []int
			for _, si := range fixed[r.Student] {
				if t.Sections[si].Course == name {
					fixedInC = append(fixedInC, si)
				}
			}
			for _, e := range bruteEnrollments(t, c, fixedInC) {
				out[ri] = append(out[ri], bruteOpt{course: name, held: e})
			}
		}
		out[ri] = append(out[ri], bruteOpt{})
	}
	return out
}

// bruteForce visits every seating of t's requests (each request unplaced
// or in any enrollment of any of its courses), keeps those within the
// limits that give no student one course twice, and returns the best
// objective.
func bruteForce(t *timetable.Term, s, keep *timetable.Schedule) judged {
	opts := bruteOptions(t)
	idx := t.SectionIndex()
	isFixed := map[string]map[int]bool{}
	load := make([]int, len(t.Sections))
	for _, e := range t.Enrolments {
		si, ok := idx[e.Section]
		if !ok {
			continue
		}
		if isFixed[e.Student] == nil {
			isFixed[e.Student] = map[int]bool{}
		}
		if !isFixed[e.Student][si] {
			isFixed[e.Student][si] = true
			load[si]++
		}
	}
	var best *judged
	pick := make([]int, len(t.Requests))
	var rec func(i int)
	rec = func(i int) {
		if i < len(t.Requests) {
			for k := range opts[i] {
				pick[i] = k
				rec(i + 1)
			}
			return
		}
		// build the seating and test it
		res := &Result{}
		used := map[[2]string]bool{}
		add := make([]int, len(t.Sections))
		for ri, k := range pick {
			o := opts[ri][k]
			r := t.Requests[ri]
			if o.course == "" {
				res.Unplaced = append(res.Unplaced, Unplaced{Request: ri})
				continue
			}
			if used[[2]string{r.Student, o.course}] {
				return
			}
			used[[2]string{r.Student, o.course}] = true
			for _, si := range o.held {
				if !isFixed[r.Student][si] {
					add[si]++
					res.Enrolments = append(res.Enrolments, timetable.Enrolment{Student: r.Student, Section: t.Sections[si].ID})
				}
			}
		}
		for si := range add {
			if add[si] > 0 && load[si]+add[si] > t.SectionLimit(si) {
				return
			}
		}
		j := judge(t, s, keep, res)
		if best == nil || j.less(*best) {
			best = &j
		}
	}
	rec(0)
	return *best
}
