package sectioning

import (
	"fmt"
	"sort"

	"github.com/termwright/termwright/timetable"
)

// allSeatingErrors is seatingErrors together with what timetable.Check
// (the domain's independent verifier) reports against the seating rule
// for the timetable s with res's enrolments.
func allSeatingErrors(t *timetable.Term, s *timetable.Schedule, res *Result) []string {
	errs := seatingErrors(t, res)
	withStudents := &timetable.Schedule{Placements: s.Placements, Enrolments: res.Enrolments}
	for _, v := range timetable.Check(t, withStudents) {
		switch v.Rule {
		case timetable.RuleSeating, timetable.RuleSectionLimit, timetable.RuleNotRequested:
			errs = append(errs, "timetable.Check: "+v.Msg)
		}
	}
	return errs
}

// seatingErrors checks res against the seating rule of timetable.Course,
// written out here from its doc comment and sharing no code with the
// sectioner: every sectioned enrolment names a known section of a course;
// a student placed in a course holds exactly one section of every part of
// exactly one arrangement and no other section of it, with every held
// section's parent; no section holds more than its limit (fixed
// enrolments counted; a section already over its limit by fixed
// enrolments takes no sectioned student); sectioned students are placed
// only in courses they requested, at most one per request; and Unplaced
// lists exactly the requests met by no course.
func seatingErrors(t *timetable.Term, res *Result) []string {
	var errs []string
	idx := t.SectionIndex()
	type held struct{ fixed, sectioned map[string]bool }
	byStudent := map[string]*held{}
	get := func(st string) *held {
		h := byStudent[st]
		if h == nil {
			h = &held{fixed: map[string]bool{}, sectioned: map[string]bool{}}
			byStudent[st] = h
		}
		return h
	}
	count := map[string]int{}
	sectionedCount := map[string]int{}
	for _, e := range t.Enrolments {
		if _, ok := idx[e.Section]; ok && !get(e.Student).fixed[e.Section] {
			get(e.Student).fixed[e.Section] = true
			count[e.Section]++
		}
	}
	for _, e := range res.Enrolments {
		si, ok := idx[e.Section]
		if !ok || t.Sections[si].Course == "" {
			errs = append(errs, fmt.Sprintf("%s placed in %s, which is no course's section", e.Student, e.Section))
			continue
		}
		h := get(e.Student)
		if h.sectioned[e.Section] || h.fixed[e.Section] {
			errs = append(errs, fmt.Sprintf("%s placed twice in %s", e.Student, e.Section))
			continue
		}
		h.sectioned[e.Section] = true
		count[e.Section]++
		sectionedCount[e.Section]++
	}
	for si, s := range t.Sections {
		if n := count[s.ID]; sectionedCount[s.ID] > 0 && n > t.SectionLimit(si) {
			errs = append(errs, fmt.Sprintf("section %s holds %d students, over its limit %d", s.ID, n, t.SectionLimit(si)))
		}
	}
	courses := map[string]timetable.Course{}
	for _, c := range t.Courses() {
		courses[c.ID] = c
	}
	requested := map[string][]int{} // student -> request indexes
	for ri, r := range t.Requests {
		requested[r.Student] = append(requested[r.Student], ri)
	}
	unplaced := map[int]bool{}
	for _, u := range res.Unplaced {
		unplaced[u.Request] = true
	}
	for st := range requested {
		get(st)
	}
	students := make([]string, 0, len(byStudent))
	for st := range byStudent {
		students = append(students, st)
	}
	sort.Strings(students)
	for _, st := range students {
		h := byStudent[st]
		inCourse := map[string][]string{}
		sectionedCourse := map[string]bool{}
		for sec := range h.fixed {
			if c := t.Sections[idx[sec]].Course; c != "" {
				inCourse[c] = append(inCourse[c], sec)
			}
		}
		for sec := range h.sectioned {
			c := t.Sections[idx[sec]].Course
			inCourse[c] = append(inCourse[c], sec)
			sectionedCourse[c] = true
		}
		for c := range sectionedCourse {
			if msg := enrollmentError(t, courses[c], inCourse[c], idx); msg != "" {
				errs = append(errs, st+" in course "+c+": "+msg)
			}
		}
		// requests met: a matching of requests to the sectioned courses
		var placedCourses []string
		for c := range sectionedCourse {
			placedCourses = append(placedCourses, c)
		}
		sort.Strings(placedCourses)
		var fixedOnly []string
		for c, secs := range inCourse {
			if !sectionedCourse[c] && enrollmentError(t, courses[c], secs, idx) == "" {
				fixedOnly = append(fixedOnly, c)
			}
		}
		sort.Strings(fixedOnly)
		match := matchRequests(t, requested[st], placedCourses, fixedOnly)
		if match < 0 {
			errs = append(errs, st+" is placed in a course no request of theirs names (or in more courses than requests)")
			continue
		}
		want := 0
		for _, ri := range requested[st] {
			if !unplaced[ri] {
				want++
			}
		}
		if match < want {
			errs = append(errs, fmt.Sprintf("%s: %d requests reported placed but only %d met", st, want, match))
		}
		if match > want {
			errs = append(errs, fmt.Sprintf("%s: %d requests met but %d reported unplaced", st, match, len(requested[st])-want))
		}
	}
	return errs
}

// enrollmentError says what is wrong with holding secs of course c, "" when
// nothing.
func enrollmentError(t *timetable.Term, c timetable.Course, secs []string, idx map[string]int) string {
	held := map[string]bool{}
	for _, s := range secs {
		held[s] = true
	}
	for _, a := range c.Arrangements {
		ok := true
		n := 0
		for _, p := range a.Parts {
			k := 0
			for _, si := range p.Sections {
				if held[t.Sections[si].ID] {
					k++
				}
			}
			if k != 1 {
				ok = false
			}
			n += k
		}
		if !ok || n != len(held) {
			continue
		}
		for s := range held {
			if par := t.Sections[idx[s]].Parent; par != "" && !held[par] {
				return "holds " + s + " without its parent " + par
			}
		}
		return ""
	}
	return fmt.Sprintf("holds %v, which is not one section of every part of one arrangement", secs)
}

// matchRequests returns the most requests of the student that the
// courses can meet, each course meeting one request that names it, every
// mandatory course (sectioned) matched, optional ones (complete fixed
// enrolments) where they help; -1 when the mandatory ones cannot all be
// matched (brute force: a student has few requests).
func matchRequests(t *timetable.Term, reqs []int, mandatory, optional []string) int {
	courses := append(append([]string(nil), mandatory...), optional...)
	used := make([]bool, len(reqs))
	best := -1
	var try func(i, n int)
	try = func(i, n int) {
		if i == len(courses) {
			best = max(best, n)
			return
		}
		if i >= len(mandatory) {
			try(i+1, n)
		}
		for j, ri := range reqs {
			if used[j] {
				continue
			}
			r := t.Requests[ri]
			for _, name := range append([]string{r.Course}, r.Alternatives...) {
				if name == courses[i] {
					used[j] = true
					try(i+1, n+1)
					used[j] = false
					break
				}
			}
		}
	}
	try(0, 0)
	return best
}
