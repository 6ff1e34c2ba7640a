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
