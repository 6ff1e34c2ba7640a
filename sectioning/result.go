package sectioning

import (
	"sort"

	"github.com/termwright/termwright/timetable"
)

// result turns the state into a Result.
func (p *problem) result(keep *timetable.Schedule) *Result {
	res := &Result{}
	for ri := range p.reqs {
		r := int32(ri)
		if p.st.opt[r] < 0 {
			res.Unplaced = append(res.Unplaced, Unplaced{Request: ri, Reason: p.reason(r)})
			continue
		}
		id := p.students[p.reqs[r].student].id
		for _, x := range p.st.secs[r] {
			res.Enrolments = append(res.Enrolments, timetable.Enrolment{Student: id, Section: p.t.Sections[x].ID})
		}
	}
	sort.Slice(res.Enrolments, func(i, j int) bool {
		a, b := res.Enrolments[i], res.Enrolments[j]
		if a.Student != b.Student {
			return a.Student < b.Student
		}
		return a.Section < b.Section
	})
	res.Moves = p.moves(keep)
	return res
}

// restoreFrom seats the state as res says: each student's sectioned
// sections, grouped by course, go to a request naming the course (its
// course first, then as an alternative). Requests res lists as unplaced
// stay unplaced; a course whose fixed sections alone complete it meets
// its request with no sectioned section.
func (p *problem) restoreFrom(res *Result) {
	unplaced := make([]bool, len(p.reqs))
	for _, u := range res.Unplaced {
		if u.Request >= 0 && u.Request < len(unplaced) {
			unplaced[u.Request] = true
		}
	}
	byStudent := map[string]map[int32][]int32{}
	for _, e := range res.Enrolments {
		si, ok := p.secIdx[e.Section]
		if !ok || p.secCourse[si] < 0 {
			continue
		}
		m := byStudent[e.Student]
		if m == nil {
			m = map[int32][]int32{}
			byStudent[e.Student] = m
		}
		c := p.secCourse[si]
		m[c] = append(m[c], int32(si))
	}
	for k := range p.students {
		st := &p.students[k]
		courses := byStudent[st.id]
		for pass := 0; pass < 2; pass++ {
			for _, r := range st.reqs {
				if unplaced[r] || p.st.opt[r] >= 0 {
					continue
				}
				for o, c := range p.reqs[r].options {
					if c < 0 || (pass == 0 && o > 0) || p.holdsCourse(int32(k), c, r) {
						continue
					}
					if secs, ok := courses[c]; ok || len(p.fixedIn(int32(k), c, nil)) > 0 {
						p.seat(r, int32(o), secs)
						break
					}
				}
			}
		}
	}
}
