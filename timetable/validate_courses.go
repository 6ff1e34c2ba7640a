package timetable

import (
	"fmt"
	"strings"
)

// This file validates courses (the Course, Arrangement, Part, Parent
// section and Limit columns of Sections) and the Course requests sheet.

// checkCourses checks the course cells of every section, the parent links
// and the fixed enrolments against the limits.
func (v *validator) checkCourses() {
	for i := range v.t.Sections {
		s := &v.t.Sections[i]
		d := subjectPrefix(s.Src, "section", s.ID)
		if s.Limit < 0 {
			v.ps.errorf(v.at(s.Src, "Limit"), "%sLimit %d is below 0 — write the most students the section may take, or leave it blank for its Expected size", d, s.Limit)
		}
		if s.Course != "" {
			v.checkParent(s, d)
			continue
		}
		for _, c := range []struct{ header, text string }{{"Arrangement", s.Arrangement}, {"Part", s.Part}, {"Parent section", s.Parent}} {
			if c.text != "" {
				v.ps.errorf(v.at(s.Src, c.header), "%s%s %s is given but Course is blank — write the section's course in Course, or clear %s", d, c.header, Quote(c.text), c.header)
			}
		}
		if s.Limit > 0 {
			v.ps.warnf(v.at(s.Src, "Limit"), "%sLimit is used only for sections with a Course, which students request — write the course in Course, or clear Limit (Expected size sizes the room)", d)
		}
	}
	v.checkParentCycles()
	v.checkFixedOverLimit()
}

// checkParent checks that a section's parent is a known section of the same
// course and arrangement in another part.
func (v *validator) checkParent(s *Section, d string) {
	if s.Parent == "" {
		return
	}
	pos := v.at(s.Src, "Parent section")
	j, ok := v.sections[s.Parent]
	switch {
	case !ok:
		v.ps.errorf(pos, "%sparent section %s is not on the Sections sheet — correct the ID or clear Parent section", d, Quote(s.Parent))
	case s.Parent == s.ID:
		v.ps.errorf(pos, "%sthe section names itself as its parent — name the section of another part that its students also take, or clear Parent section", d)
	default:
		p := &v.t.Sections[j]
		switch {
		case p.Course != s.Course:
			v.ps.errorf(pos, "%sparent section %s belongs to course %s, not %s — a parent is a section of the same course; correct Parent section or the Course cells", d, Quote(s.Parent), Quote(p.Course), Quote(s.Course))
		case p.Arrangement != s.Arrangement:
			v.ps.errorf(pos, "%sparent section %s is in arrangement %s of course %s, not %s — a parent is in the same arrangement; correct Parent section or Arrangement", d, Quote(s.Parent), Quote(p.Arrangement), Quote(s.Course), Quote(s.Arrangement))
		case p.Part == s.Part:
			v.ps.errorf(pos, "%sparent section %s is in the same part %s, and a student takes one section of each part — name a section of another part (such as the main class a lab belongs to), or clear Parent section", d, Quote(s.Parent), Quote(s.Part))
		}
	}
}

// checkParentCycles reports parent links that go round in a circle, once
// per circle, at the row of its first section in term order. Each section
// has at most one parent, so following the links from every section with
// colours (0 unvisited, 1 on the current path, 2 done) takes O(sections).
func (v *validator) checkParentCycles() {
	colour := make([]byte, len(v.t.Sections))
	var path []int
	for i := range v.t.Sections {
		path = path[:0]
		j := i
		for j >= 0 && colour[j] == 0 {
			colour[j] = 1
			path = append(path, j)
			j = v.parentIndex(j)
		}
		if j >= 0 && colour[j] == 1 {
			start := 0
			for path[start] != j {
				start++
			}
			loop := path[start:]
			first := loop[0]
			for _, k := range loop {
				if k < first {
					first = k
				}
			}
			ids := make([]string, 0, len(loop)+1)
			for _, k := range loop {
				ids = append(ids, Quote(v.t.Sections[k].ID))
			}
			ids = append(ids, ids[0])
			s := &v.t.Sections[first]
			v.ps.errorf(v.at(s.Src, "Parent section"), "%sparent sections go round in a circle (%s) — clear Parent section in one of them", subjectPrefix(s.Src, "section", s.ID), strings.Join(ids, " → "))
		}
		for _, k := range path {
			colour[k] = 2
		}
	}
}

// parentIndex is the index of section i's parent, or -1 for none or an
// unknown one.
func (v *validator) parentIndex(i int) int {
	p := v.t.Sections[i].Parent
	if p == "" {
		return -1
	}
	if j, ok := v.sections[p]; ok {
		return j
	}
	return -1
}

// checkFixedOverLimit reports sections of a course whose fixed enrolments
// alone exceed the limit (the seating rule counts them).
func (v *validator) checkFixedOverLimit() {
	fixed := v.fixedPerSection()
	for i := range v.t.Sections {
		s := &v.t.Sections[i]
		if s.Course == "" || fixed[i] == 0 {
			continue
		}
		if lim := v.t.SectionLimit(i); fixed[i] > lim {
			v.ps.errorf(v.at(s.Src, "Limit"), "%ssection %s has %s on the Enrolments sheet, more than its limit of %d — raise Limit (or Expected size), or move students to another section", subjectPrefix(s.Src, "section", s.ID), Quote(s.ID), countNoun(fixed[i], "fixed student"), lim)
		}
	}
}

// fixedPerSection counts the fixed enrolments of each section (by index).
func (v *validator) fixedPerSection() []int {
	out := make([]int, len(v.t.Sections))
	for _, e := range v.t.Enrolments {
		if j, ok := v.sections[e.Section]; ok {
			out[j]++
		}
	}
	return out
}

// checkRequests checks every course request: a known course, no course
// twice for one student, known alternatives, a priority of 0 or more; and,
// per course, whether its limits can hold the students who ask for it
// first (a warning, see requestCapacity).
func (v *validator) checkRequests() {
	if len(v.t.Requests) == 0 {
		return
	}
	courses := v.t.Courses()
	byID := make(map[string]int, len(courses))
	for i, c := range courses {
		byID[c.ID] = i
	}
	type pair struct{ student, course string }
	seen := make(map[pair]Source, len(v.t.Requests))
	first := make([]int, len(courses)) // first-choice requests per course
	over := make([]Source, len(courses))
	caps := v.courseCapacities(courses)
	for _, r := range v.t.Requests {
		d := subjectPrefix(r.Src, "request of", r.Student)
		if r.Student == "" && r.Src.Sheet == "" {
			v.ps.errorf(Position{}, "%sa course request has a blank student — give every request a student ID", d)
		}
		if r.Priority < 0 {
			v.ps.errorf(v.at(r.Src, "Priority"), "%sPriority %d is below 0 — write 1 for the most important, higher numbers for less, or leave it blank", d, r.Priority)
		}
		ci, ok := byID[r.Course]
		switch {
		case r.Course == "":
			if r.Src.Sheet == "" {
				v.ps.errorf(Position{}, "%sa course request has a blank course — name a course of the Sections sheet", d)
			}
		case !ok:
			v.ps.errorf(v.at(r.Src, "Course"), "%scourse %s is not the Course of any section on the Sections sheet — correct the course, or write it in the Course column of its sections", d, Quote(r.Course))
		default:
			first[ci]++
			if first[ci] == caps[ci]+1 {
				over[ci] = r.Src
			}
		}
		if r.Course != "" && r.Student != "" {
			k := pair{r.Student, r.Course}
			if prev, dup := seen[k]; dup {
				v.ps.errorf(v.at(r.Src, "Course"), "%sstudent %s requests course %s again (first in %s) — keep one of the two rows", d, Quote(r.Student), Quote(r.Course), sourceWhere(prev))
			} else {
				seen[k] = r.Src
			}
		}
		v.checkAlternatives(r, byID, d)
	}
	for ci, c := range courses {
		if first[ci] > caps[ci] {
			v.ps.warnf(v.at(over[ci], "Course"), "%scourse %s is the first choice of %s but its section limits hold at most %d — %d of them cannot be placed in it; raise a Limit, add a section, or give students a course under Or instead",
				subjectPrefix(over[ci], "course", c.ID), Quote(c.ID), countNoun(first[ci], "request"), caps[ci], first[ci]-caps[ci])
		}
	}
}

// checkAlternatives checks the Or instead list of one request.
func (v *validator) checkAlternatives(r Request, byID map[string]int, d string) {
	var unknown []string
	for i, a := range r.Alternatives {
		switch {
		case a == r.Course:
			v.ps.warnf(v.at(r.Src, "Or instead"), "%sOr instead lists the requested course %s itself — list only other courses", d, Quote(a))
		case listHas(r.Alternatives[:i], a):
			v.ps.warnf(v.at(r.Src, "Or instead"), "%sOr instead lists course %s more than once — list each course once", d, Quote(a))
		default:
			if _, ok := byID[a]; !ok {
				unknown = append(unknown, a)
			}
		}
	}
	if len(unknown) > 0 {
		v.ps.errorf(v.at(r.Src, "Or instead"), "%sOr instead: course %s %s not the Course of any section on the Sections sheet — correct the course or remove it from the list", d, idList(unknown), isAre(len(unknown)))
	}
}

// courseCapacities bounds, per course, the students its limits can seat:
// the most over its arrangements of the least over their parts of the sum
// of the parts' section limits less their fixed enrolments. A student takes
// one section of every part of one arrangement, so no seating places more
// (it is a counting bound: parent links may allow fewer).
func (v *validator) courseCapacities(courses []Course) []int {
	fixed := v.fixedPerSection()
	out := make([]int, len(courses))
	for ci, c := range courses {
		best := 0
		for _, a := range c.Arrangements {
			least := -1
			for _, p := range a.Parts {
				sum := 0
				for _, i := range p.Sections {
					sum += max(0, v.t.SectionLimit(i)-fixed[i])
				}
				if least < 0 || sum < least {
					least = sum
				}
			}
			best = max(best, least)
		}
		out[ci] = best
	}
	return out
}

// sourceWhere names a record's row for a message: "row 7" or "another row".
func sourceWhere(src Source) string {
	if src.Row == 0 {
		return "another row"
	}
	return fmt.Sprintf("row %d", src.Row)
}
