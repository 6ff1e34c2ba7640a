package timetable

// Course is a requestable course as the Course, Arrangement and Part
// fields of its sections define it.
//
// The seating rule (checked by Check, kept by the sectioner): a student
// placed in a course holds exactly one section of every part of exactly
// one of its arrangements, and no other section of the course; for every
// held section with a Parent the student holds the parent too; no
// section of a course holds more students than its limit (SectionLimit),
// fixed enrolments included; and a student is placed by the sectioner
// (Schedule.Enrolments) only in courses they requested, as Course or as
// one of its Alternatives, at most one course per request. Check applies
// the parts-and-parents rule to each student's courses that hold a
// sectioned enrolment (fixed-only students are term data, though they
// count against the limits), and no student is both fixed and sectioned
// in one section.
type Course struct {
	ID           string
	Arrangements []Arrangement // in order of first appearance; at least one
}

// Arrangement is one way of taking a course: a set of parts, each of
// which the student attends one section of.
type Arrangement struct {
	ID    string // "" for the course's only unnamed arrangement
	Parts []Part // in order of first appearance; at least one
}

// Part is one part of an arrangement (for example the main classes, or the
// labs) with its parallel sections.
type Part struct {
	ID       string // "" for the arrangement's only unnamed part
	Sections []int  // indexes into Term.Sections, in term order
}

// Courses lists the requestable courses of t in order of first appearance
// among the sections, built from Section.Course, Arrangement and Part.
// It runs in O(sections) and allocates a fresh result each call.
func (t *Term) Courses() []Course {
	var out []Course
	course := map[string]int{}
	type key struct{ course, arr, part string }
	arrIdx := map[[2]string]int{}
	partIdx := map[key]int{}
	for i, s := range t.Sections {
		if s.Course == "" {
			continue
		}
		ci, ok := course[s.Course]
		if !ok {
			ci = len(out)
			course[s.Course] = ci
			out = append(out, Course{ID: s.Course})
		}
		c := &out[ci]
		ak := [2]string{s.Course, s.Arrangement}
		ai, ok := arrIdx[ak]
		if !ok {
			ai = len(c.Arrangements)
			arrIdx[ak] = ai
			c.Arrangements = append(c.Arrangements, Arrangement{ID: s.Arrangement})
		}
		a := &c.Arrangements[ai]
		pk := key{s.Course, s.Arrangement, s.Part}
		pi, ok := partIdx[pk]
		if !ok {
			pi = len(a.Parts)
			partIdx[pk] = pi
			a.Parts = append(a.Parts, Part{ID: s.Part})
		}
		a.Parts[pi].Sections = append(a.Parts[pi].Sections, i)
	}
	return out
}

// SectionLimit is the most students section i may hold: its Limit, or its
// Size when no limit is given.
func (t *Term) SectionLimit(i int) int {
	if s := t.Sections[i]; s.Limit > 0 {
		return s.Limit
	}
	return t.Sections[i].Size
}

// StudentEnrolments lists every student's sections under s: the fixed
// Term.Enrolments followed by the sectioned s.Enrolments (s may be nil).
func (t *Term) StudentEnrolments(s *Schedule) []Enrolment {
	if s == nil || len(s.Enrolments) == 0 {
		return t.Enrolments
	}
	out := make([]Enrolment, 0, len(t.Enrolments)+len(s.Enrolments))
	out = append(out, t.Enrolments...)
	return append(out, s.Enrolments...)
}

// hasCourses reports whether some section names a Course.
func (t *Term) hasCourses() bool {
	for i := range t.Sections {
		if t.Sections[i].Course != "" {
			return true
		}
	}
	return false
}
