package sectioning

import (
	"sort"

	"github.com/termwright/termwright/timetable"
)

// setKept records each student's sectioned sections of the kept
// timetable, by course (sections no longer in the term are dropped).
func (p *problem) setKept(keep *timetable.Schedule) {
	byID := make(map[string]int32, len(p.students))
	for k := range p.students {
		byID[p.students[k].id] = int32(k)
	}
	for _, e := range keep.Enrolments {
		k, ok := byID[e.Student]
		si, ok2 := p.secIdx[e.Section]
		if !ok || !ok2 || p.secCourse[si] < 0 || p.isFixed(k, int32(si)) {
			continue
		}
		st := &p.students[k]
		if st.kept == nil {
			st.kept = map[int32][]int32{}
		}
		c := p.secCourse[si]
		if !contains(st.kept[c], int32(si)) {
			st.kept[c] = append(st.kept[c], int32(si))
		}
	}
}

// seatKept seats the kept students first, each request in the option
// it held in the kept timetable (its best enrollment with room there: the
// moved-students cost keeps the sections where the rules and the limits
// still allow), higher priorities first.
func (p *problem) seatKept(sr *searcher) {
	type keptReq struct{ r, o int32 }
	var rs []keptReq
	for k := range p.students {
		if len(p.students[k].kept) == 0 {
			continue
		}
		for _, r := range p.students[k].reqs {
			for o, c := range p.reqs[r].options {
				if c >= 0 && len(p.students[k].kept[c]) > 0 {
					rs = append(rs, keptReq{r, int32(o)})
					break
				}
			}
		}
	}
	sort.SliceStable(rs, func(i, j int) bool { return p.reqs[rs[i].r].rank < p.reqs[rs[j].r].rank })
	for _, kr := range rs {
		p.placeOption(sr, kr.r, kr.o)
	}
}

// moves lists the kept students' changes, part by part.
func (p *problem) moves(keep *timetable.Schedule) []Move {
	if keep == nil {
		return nil
	}
	type key struct {
		student, course string
		part            int32
	}
	byID := make(map[string]int32, len(p.students))
	for k := range p.students {
		byID[p.students[k].id] = int32(k)
	}
	from := map[key]string{}
	for _, e := range keep.Enrolments {
		si, ok := p.secIdx[e.Section]
		if !ok || p.secCourse[si] < 0 {
			continue
		}
		if k, ok := byID[e.Student]; ok && p.isFixed(k, int32(si)) {
			continue // now a fixed enrolment: the student did not move
		}
		from[key{e.Student, p.courses[p.secCourse[si]].ID, p.secPart[si]}] = e.Section
	}
	to := map[key]string{}
	for ri := range p.reqs {
		k := p.reqs[ri].student
		for _, x := range p.st.secs[ri] {
			to[key{p.students[k].id, p.courses[p.secCourse[x]].ID, p.secPart[x]}] = p.t.Sections[x].ID
		}
	}
	was := map[[2]string]bool{} // student and course of the kept timetable
	for kk := range from {
		was[[2]string{kk.student, kk.course}] = true
	}
	var out []Move
	for kk, f := range from {
		if t := to[kk]; t != f {
			out = append(out, Move{Student: kk.student, Course: kk.course, From: f, To: t})
		}
	}
	for kk, t := range to {
		if _, ok := from[kk]; !ok && was[[2]string{kk.student, kk.course}] {
			out = append(out, Move{Student: kk.student, Course: kk.course, To: t})
		}
	}
	sort.Slice(out, func(i, j int) bool {
		a, b := out[i], out[j]
		if a.Student != b.Student {
			return a.Student < b.Student
		}
		if a.Course != b.Course {
			return a.Course < b.Course
		}
		if a.From != b.From {
			return a.From < b.From
		}
		return a.To < b.To
	})
	return out
}
