package sectioning

import (
	"github.com/termwright/termwright/timetable"
)

// problem is one sectioning task in dense form: sections, parts,
// arrangements and courses by index, each request's options, the fixed
// enrolments, and the current seating (state). Section indexes are those
// of Term.Sections; -1 means none.
type problem struct {
	t *timetable.Term

	secIdx    map[string]int // section ID -> index
	secCourse []int32        // section -> course index, -1 when not requestable
	secArr    []int32        // section -> arrangement index (global), -1 when none
	secPart   []int32        // section -> part index (global), -1 when none
	parent    []int32        // section -> parent section, -1 when none or unknown
	limit     []int32        // section -> SectionLimit
	fixedLoad []int32        // section -> fixed enrolments in it (distinct students)

	courses   []timetable.Course
	courseIdx map[string]int
	arrs      []arrInfo // every arrangement of every course
	courseArr [][]int32 // course -> its arrangements (global indexes)
	parts     []partInfo

	students []student
	reqs     []request

	clash *clashTable

	// Objective weights (see score.go).
	mulMoved, mulClash int64

	st state
}

// arrInfo is one arrangement: its parts, parents' parts first.
type arrInfo struct {
	course int32
	parts  []int32 // global part indexes, ordered so a parent's part comes before its children's
}

// partInfo is one part with its sections.
type partInfo struct {
	arr      int32
	sections []int32
}

// student is one student with requests or fixed enrolments.
type student struct {
	id    string
	fixed []int32 // sections of fixed enrolments, distinct, ascending
	reqs  []int32 // request indexes, in term order
	// kept: the kept timetable's sectioned sections of this student, by
	// course index (only with Options.Keep).
	kept map[int32][]int32
}

// request is one Term.Requests entry with its options resolved.
type request struct {
	student int32
	options []int32 // course indexes, the course first then alternatives; -1 for an unknown course
	rank    int     // priority rank: 1, 2, ... as given, 0 becomes the largest
}

// newProblem indexes t and the finished timetable s.
func newProblem(t *timetable.Term, s *timetable.Schedule) *problem {
	n := len(t.Sections)
	p := &problem{
		t:         t,
		secIdx:    t.SectionIndex(),
		secCourse: make([]int32, n),
		secArr:    make([]int32, n),
		secPart:   make([]int32, n),
		parent:    make([]int32, n),
		limit:     make([]int32, n),
		fixedLoad: make([]int32, n),
		courseIdx: map[string]int{},
	}
	for i := range n {
		p.secCourse[i], p.secArr[i], p.secPart[i], p.parent[i] = -1, -1, -1, -1
		p.limit[i] = int32(t.SectionLimit(i))
	}
	p.courses = t.Courses()
	p.courseArr = make([][]int32, len(p.courses))
	for ci, c := range p.courses {
		p.courseIdx[c.ID] = ci
		for _, a := range c.Arrangements {
			ai := int32(len(p.arrs))
			p.courseArr[ci] = append(p.courseArr[ci], ai)
			info := arrInfo{course: int32(ci)}
			for _, pt := range a.Parts {
				pi := int32(len(p.parts))
				secs := make([]int32, len(pt.Sections))
				for k, si := range pt.Sections {
					secs[k] = int32(si)
					p.secCourse[si], p.secArr[si], p.secPart[si] = int32(ci), ai, pi
				}
				p.parts = append(p.parts, partInfo{arr: ai, sections: secs})
				info.parts = append(info.parts, pi)
			}
			p.arrs = append(p.arrs, info)
		}
	}
	for i := range t.Sections {
		if par := t.Sections[i].Parent; par != "" {
			if j, ok := p.secIdx[par]; ok {
				p.parent[i] = int32(j)
			}
		}
	}
	for ai := range p.arrs {
		p.orderParts(int32(ai))
	}
	p.indexStudents()
	p.clash = newClashTable(t, s)
	p.setWeights()
	p.st = newState(p)
	return p
}

// orderParts sorts an arrangement's parts so that the part of every
// parent comes before the parts of its children (a stable topological
// order; parts in a cycle, which validation refuses, keep their order).
func (p *problem) orderParts(ai int32) {
	a := &p.arrs[ai]
	deps := map[int32]map[int32]bool{} // part -> parts its sections' parents lie in
	for _, pi := range a.parts {
		for _, si := range p.parts[pi].sections {
			if par := p.parent[si]; par >= 0 && p.secArr[par] == ai && p.secPart[par] != pi {
				if deps[pi] == nil {
					deps[pi] = map[int32]bool{}
				}
				deps[pi][p.secPart[par]] = true
			}
		}
	}
	out := make([]int32, 0, len(a.parts))
	done := map[int32]bool{}
	for len(out) < len(a.parts) {
		progress := false
		for _, pi := range a.parts {
			if done[pi] {
				continue
			}
			ready := true
			for d := range deps[pi] {
				if !done[d] {
					ready = false
					break
				}
			}
			if ready {
				out, done[pi], progress = append(out, pi), true, true
			}
		}
		if !progress { // a cycle: keep the rest in their order
			for _, pi := range a.parts {
				if !done[pi] {
					out, done[pi] = append(out, pi), true
				}
			}
		}
	}
	a.parts = out
}

// indexStudents gathers students from fixed enrolments and requests, in
// order of first appearance (requests' students first).
func (p *problem) indexStudents() {
	t := p.t
	byID := map[string]int32{}
	get := func(id string) int32 {
		if k, ok := byID[id]; ok {
			return k
		}
		k := int32(len(p.students))
		byID[id] = k
		p.students = append(p.students, student{id: id})
		return k
	}
	p.reqs = make([]request, len(t.Requests))
	most := 0
	for _, r := range t.Requests {
		most = max(most, r.Priority)
	}
	for ri, r := range t.Requests {
		k := get(r.Student)
		p.students[k].reqs = append(p.students[k].reqs, int32(ri))
		rq := request{student: k, rank: r.Priority}
		if r.Priority <= 0 {
			rq.rank = most + 1
		}
		for _, c := range append([]string{r.Course}, r.Alternatives...) {
			ci, ok := p.courseIdx[c]
			if !ok {
				ci = -1
			}
			rq.options = append(rq.options, int32(ci))
		}
		p.reqs[ri] = rq
	}
	seen := map[[2]int32]bool{}
	for _, e := range t.Enrolments {
		si, ok := p.secIdx[e.Section]
		if !ok {
			continue
		}
		k := get(e.Student)
		key := [2]int32{k, int32(si)}
		if seen[key] {
			continue
		}
		seen[key] = true
		p.fixedLoad[si]++
		p.students[k].fixed = insertSorted(p.students[k].fixed, int32(si))
	}
}

// insertSorted inserts v into the ascending slice xs.
func insertSorted(xs []int32, v int32) []int32 {
	i := len(xs)
	for i > 0 && xs[i-1] > v {
		i--
	}
	xs = append(xs, 0)
	copy(xs[i+1:], xs[i:])
	xs[i] = v
	return xs
}

// fixedIn lists the fixed sections of student k in course c.
func (p *problem) fixedIn(k int32, c int32, buf []int32) []int32 {
	buf = buf[:0]
	for _, si := range p.students[k].fixed {
		if p.secCourse[si] == c {
			buf = append(buf, si)
		}
	}
	return buf
}

// isFixed reports whether student k is fixed to section si.
func (p *problem) isFixed(k int32, si int32) bool {
	for _, f := range p.students[k].fixed {
		if f == si {
			return true
		}
		if f > si {
			return false
		}
	}
	return false
}
