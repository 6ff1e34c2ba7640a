package timetable

import (
	"slices"
	"strings"
)

// Rule names of the seating rule (Course's doc comment).
const (
	RuleSeating      = "seating"       // a student's sections of a course are not one of each part of one arrangement, a parent is missing, or an enrolment is unknown or repeated
	RuleSectionLimit = "section limit" // a section of a course holds more students than its limit
	RuleNotRequested = "not requested" // the sectioner placed a student in a course no request of theirs names
)

// seatItem is one of a student's enrolments while their seating is judged.
type seatItem struct {
	sec   int32 // section index
	en    int32 // index into seatIndex.ens
	fixed bool  // a Term.Enrolments row, not a sectioned one
}

// seating checks every sectioned enrolment (Schedule.Enrolments) against
// the seating rule, independently of the sectioner: a known section with
// a Course; per student and course with a sectioned enrolment, the
// student's sections of the course (fixed and sectioned) are exactly one
// of every part of one arrangement, and the parent of each is held too;
// no section of a course holds more students than SectionLimit (fixed and
// sectioned counted); the sectioned courses of a student can be given
// each its own request that names it (as Course or under Alternatives);
// and no student is both fixed and sectioned in a section, or sectioned
// in it twice. Students with fixed enrolments only are term data, judged
// by Validate, except that they count against the limits. O(enrolments + requests) with small per-student sorts.
func (c *checker) seating() {
	if len(c.x.s.Enrolments) == 0 && !c.x.t.hasCourses() {
		return
	}
	st := c.x.seats()
	count := make([]int, len(c.x.t.Sections))
	var items []seatItem
	for k := range st.names {
		items = items[:0]
		for _, ei := range st.enrolmentsOf(k) {
			si, fixed := st.ensSec[ei], int(ei) < st.nFixed
			if !fixed && !c.seatKnown(st, ei, si) {
				continue
			}
			if si >= 0 {
				items = append(items, seatItem{sec: si, en: ei, fixed: fixed})
			}
		}
		items = c.seatRepeats(st, k, items)
		for _, it := range items {
			count[it.sec]++
		}
		c.seatCourses(st, k, items)
	}
	c.seatLimits(count)
}

// seatKnown reports a sectioned enrolment whose section is unknown or has
// no Course, and reports whether it is usable.
func (c *checker) seatKnown(st *seatIndex, ei, si int32) bool {
	e := st.ens[ei]
	switch {
	case si < 0:
		c.add(RuleSeating, true, nil, []Source{e.Src}, "student "+e.Student+" is sectioned into "+e.Section+", which is not a section of the term")
		return false
	case st.secCourse[si] < 0:
		c.add(RuleSeating, true, nil, []Source{e.Src, c.x.t.Sections[si].Src}, "student "+e.Student+" is sectioned into "+e.Section+", which belongs to no course (its Course is blank)")
		return false
	}
	return true
}

// seatRepeats sorts a student's items by course, section and fixed first,
// reports a section held twice where a sectioned enrolment is involved,
// and returns the items with each section once.
func (c *checker) seatRepeats(st *seatIndex, k int, items []seatItem) []seatItem {
	slices.SortFunc(items, func(a, b seatItem) int {
		if ca, cb := st.secCourse[a.sec], st.secCourse[b.sec]; ca != cb {
			return int(ca - cb)
		}
		if a.sec != b.sec {
			return int(a.sec - b.sec)
		}
		if a.fixed != b.fixed {
			if a.fixed {
				return -1
			}
			return 1
		}
		return int(a.en - b.en)
	})
	out := items[:0]
	for i, it := range items {
		if i > 0 && items[i-1].sec == it.sec {
			prev := items[i-1]
			id := c.x.t.Sections[it.sec].ID
			srcs := []Source{st.ens[prev.en].Src, st.ens[it.en].Src}
			switch {
			case prev.fixed && !it.fixed:
				c.add(RuleSeating, true, nil, srcs, "student "+st.names[k]+" is fixed in "+id+" on the Enrolments sheet and sectioned into it again")
			case !prev.fixed:
				c.add(RuleSeating, true, nil, srcs, "student "+st.names[k]+" is sectioned into "+id+" twice")
			}
			continue
		}
		out = append(out, it)
	}
	return out
}

// seatCourses checks, for each course of a student's items (sorted by
// course) that has a sectioned enrolment, one section of every part of one
// arrangement and the parents, then whether their requests name the
// sectioned courses.
func (c *checker) seatCourses(st *seatIndex, k int, items []seatItem) {
	var sectioned []int32 // courses with a sectioned enrolment
	for i := 0; i < len(items); {
		j := i
		some := false // some enrolment of the course is sectioned
		for j < len(items) && st.secCourse[items[j].sec] == st.secCourse[items[i].sec] {
			some = some || !items[j].fixed
			j++
		}
		if ci := st.secCourse[items[i].sec]; ci >= 0 && some {
			sectioned = append(sectioned, ci)
			c.seatParts(st, k, ci, items[i:j])
		}
		i = j
	}
	c.seatRequested(st, k, sectioned)
}

// seatParts checks one student's sections of one course.
func (c *checker) seatParts(st *seatIndex, k int, ci int32, group []seatItem) {
	t := c.x.t
	course := &st.courses[ci]
	name := "student " + st.names[k]
	srcs := func() []Source {
		out := make([]Source, 0, len(group))
		for _, it := range group {
			out = append(out, st.ens[it.en].Src)
		}
		return out
	}
	arr := st.secArr[group[0].sec]
	for _, it := range group[1:] {
		if st.secArr[it.sec] != arr {
			a, b := course.Arrangements[arr].ID, course.Arrangements[st.secArr[it.sec]].ID
			c.add(RuleSeating, true, nil, srcs(), name+" holds sections of two arrangements of course "+course.ID+": "+
				t.Sections[group[0].sec].ID+" ("+seatNamed(a)+") and "+t.Sections[it.sec].ID+" ("+seatNamed(b)+"); a student takes one arrangement")
			return
		}
	}
	for pi, part := range course.Arrangements[arr].Parts {
		n := 0
		for _, it := range group {
			if st.secPart[it.sec] == int32(pi) {
				n++
			}
		}
		switch {
		case n == 0:
			var ids []string
			for _, si := range part.Sections {
				ids = append(ids, t.Sections[si].ID)
			}
			c.add(RuleSeating, true, nil, srcs(), name+" takes course "+course.ID+" but no section of its "+seatPartName(part.ID)+" ("+seatList(ids)+")")
		case n > 1:
			var held []string
			for _, it := range group {
				if st.secPart[it.sec] == int32(pi) {
					held = append(held, t.Sections[it.sec].ID)
				}
			}
			c.add(RuleSeating, true, nil, srcs(), name+" holds "+itoa(n)+" sections of the "+seatPartName(part.ID)+" of course "+course.ID+" ("+chkJoin(held)+"); a student takes one")
		}
	}
	for _, it := range group {
		if p := st.secParent[it.sec]; p >= 0 && !seatHolds(group, p) {
			c.add(RuleSeating, true, nil, append(srcs(), t.Sections[it.sec].Src), name+" holds "+t.Sections[it.sec].ID+" of course "+course.ID+" but not its parent section "+t.Sections[p].ID)
		}
	}
}

// seatRequested checks that each sectioned course of student k can be given
// its own request naming it, by a bipartite matching (augmenting paths) of
// the student's few courses to their few requests.
func (c *checker) seatRequested(st *seatIndex, k int, courses []int32) {
	if len(courses) == 0 {
		return
	}
	reqs := st.requestsOf(k)
	names := func(ri int32, ci int32) bool {
		r := &c.x.t.Requests[ri]
		if st.reqCourse[ri] == ci {
			return true
		}
		id := st.courses[ci].ID
		return slices.Contains(r.Alternatives, id)
	}
	var unasked []string
	for _, ci := range courses {
		asked := false
		for _, ri := range reqs {
			if names(ri, ci) {
				asked = true
				break
			}
		}
		if !asked {
			unasked = append(unasked, st.courses[ci].ID)
		}
	}
	if len(unasked) > 0 {
		what := "course " + unasked[0] + ", which no request of theirs names"
		if len(unasked) > 1 {
			what = "courses " + chkJoin(unasked) + ", which no request of theirs names"
		}
		c.add(RuleNotRequested, true, nil, nil, "student "+st.names[k]+" is sectioned into "+what+" (as a course or under Or instead)")
		return
	}
	match := c.seatMatch[:0] // request position -> course position + 1, 0 = free
	for range reqs {
		match = append(match, 0)
	}
	c.seatMatch = match
	seen := c.seatSeen[:0]
	for range reqs {
		seen = append(seen, false)
	}
	c.seatSeen = seen
	var augment func(cp int) bool
	augment = func(cp int) bool {
		for rp, ri := range reqs {
			if seen[rp] || !names(ri, courses[cp]) {
				continue
			}
			seen[rp] = true
			if match[rp] == 0 || augment(match[rp]-1) {
				match[rp] = cp + 1
				return true
			}
		}
		return false
	}
	for cp := range courses {
		clear(seen)
		if !augment(cp) {
			var ids []string
			for _, ci := range courses {
				ids = append(ids, st.courses[ci].ID)
			}
			srcs := make([]Source, 0, len(reqs))
			for _, ri := range reqs {
				srcs = append(srcs, c.x.t.Requests[ri].Src)
			}
			c.add(RuleNotRequested, true, nil, srcs, "student "+st.names[k]+" is sectioned into courses "+chkJoin(ids)+
				", more than their requests name (each request is met by one course at most)")
			return
		}
	}
}

// seatLimits reports sections of a course holding more students than
// their limit.
func (c *checker) seatLimits(count []int) {
	t := c.x.t
	for si, n := range count {
		if t.Sections[si].Course == "" {
			continue
		}
		if lim := t.SectionLimit(si); n > lim {
			c.add(RuleSectionLimit, true, nil, []Source{t.Sections[si].Src}, "section "+t.Sections[si].ID+" of course "+t.Sections[si].Course+
				" holds "+itoa(n)+" students (fixed and sectioned), more than its limit of "+itoa(lim))
		}
	}
}

func seatHolds(group []seatItem, si int32) bool {
	for _, it := range group {
		if it.sec == si {
			return true
		}
	}
	return false
}

// seatNamed names an arrangement for a message.
func seatNamed(id string) string {
	if id == "" {
		return "the unnamed arrangement"
	}
	return "arrangement " + id
}

// seatPartName names a part for a message.
func seatPartName(id string) string {
	if id == "" {
		return "only part"
	}
	return "part " + id
}

// seatList is "section A", "one of A or B", "one of A, B or C".
func seatList(ids []string) string {
	if len(ids) <= 1 {
		return "section " + strings.Join(ids, "")
	}
	return "one of " + strings.Join(ids[:len(ids)-1], ", ") + " or " + ids[len(ids)-1]
}
