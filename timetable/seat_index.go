package timetable

// seatIndex is the read-only index of students that Check and Cost share:
// every student's enrolments (fixed and sectioned, Term.StudentEnrolments)
// and course requests grouped by a dense student number, and each
// section's place in its course. Groups are slices into two flat arrays
// (offsets, as a compressed sparse row), so building it costs
// O(enrolments + requests + sections) with one map lookup per record and
// no allocation per student.
type seatIndex struct {
	t      *Term
	ens    []Enrolment // fixed enrolments, then the sectioned ones
	nFixed int         // ens[:nFixed] are Term.Enrolments
	ensSec []int32     // parallel to ens: section index, -1 when unknown

	stuID   map[string]int32 // student ID -> dense number, first appearance in ens then Requests
	names   []string         // dense number -> student ID
	enStart []int32          // enrolments of student k: enOrd[enStart[k]:enStart[k+1]] (indexes into ens, in order)
	enOrd   []int32
	rqStart []int32 // requests of student k: rqOrd[rqStart[k]:rqStart[k+1]] (indexes into Term.Requests, in order)
	rqOrd   []int32

	courses   []Course       // Term.Courses()
	courseIdx map[string]int // course ID -> index in courses
	secCourse []int32        // section index -> its course, -1 when it has none
	secArr    []int32        // section index -> its arrangement within the course
	secPart   []int32        // section index -> its part within the arrangement
	secParent []int32        // section index -> its parent section, -1 when none or unknown
	reqCourse []int32        // request index -> course index, -1 when unknown
}

// newSeatIndex indexes the students of s (nil: fixed enrolments only).
func newSeatIndex(t *Term, s *Schedule, secIdx map[string]int) *seatIndex {
	x := &seatIndex{t: t, ens: t.StudentEnrolments(s), nFixed: len(t.Enrolments)}
	x.indexCourses(secIdx)
	x.ensSec = make([]int32, len(x.ens))
	x.stuID = make(map[string]int32, len(x.ens)/4+len(t.Requests)/4+1)
	enStu := make([]int32, len(x.ens))
	for i, e := range x.ens {
		x.ensSec[i] = -1
		if j, ok := secIdx[e.Section]; ok {
			x.ensSec[i] = int32(j)
		}
		enStu[i] = x.student(e.Student)
	}
	rqStu := make([]int32, len(t.Requests))
	x.reqCourse = make([]int32, len(t.Requests))
	for i, r := range t.Requests {
		rqStu[i] = x.student(r.Student)
		x.reqCourse[i] = x.courseOf(r.Course)
	}
	x.enStart, x.enOrd = groupBy(enStu, len(x.names))
	x.rqStart, x.rqOrd = groupBy(rqStu, len(x.names))
	return x
}

// student gives the dense number of a student ID, adding it when new.
func (x *seatIndex) student(id string) int32 {
	k, ok := x.stuID[id]
	if !ok {
		k = int32(len(x.names))
		x.stuID[id] = k
		x.names = append(x.names, id)
	}
	return k
}

// courseOf is the index of course id, or -1.
func (x *seatIndex) courseOf(id string) int32 {
	if c, ok := x.courseIdx[id]; ok {
		return int32(c)
	}
	return -1
}

// indexCourses records each section's course, arrangement, part and parent.
func (x *seatIndex) indexCourses(secIdx map[string]int) {
	n := len(x.t.Sections)
	x.courses = x.t.Courses()
	x.courseIdx = make(map[string]int, len(x.courses))
	x.secCourse, x.secArr, x.secPart, x.secParent = make([]int32, n), make([]int32, n), make([]int32, n), make([]int32, n)
	for i := range x.secCourse {
		x.secCourse[i], x.secParent[i] = -1, -1
		if p := x.t.Sections[i].Parent; p != "" {
			if j, ok := secIdx[p]; ok {
				x.secParent[i] = int32(j)
			}
		}
	}
	for ci, c := range x.courses {
		x.courseIdx[c.ID] = ci
		for ai, a := range c.Arrangements {
			for pi, p := range a.Parts {
				for _, si := range p.Sections {
					x.secCourse[si], x.secArr[si], x.secPart[si] = int32(ci), int32(ai), int32(pi)
				}
			}
		}
	}
}

// groupBy sorts the indexes 0..len(keys)-1 by key (stable, counting sort)
// and returns the offsets of each key's run: key k's indexes are
// ord[start[k]:start[k+1]].
func groupBy(keys []int32, n int) (start, ord []int32) {
	start = make([]int32, n+1)
	for _, k := range keys {
		start[k+1]++
	}
	for k := 0; k < n; k++ {
		start[k+1] += start[k]
	}
	ord = make([]int32, len(keys))
	next := append([]int32(nil), start[:n]...)
	for i, k := range keys {
		ord[next[k]] = int32(i)
		next[k]++
	}
	return start, ord
}

// enrolmentsOf lists the enrolment indexes of student k, fixed first.
func (x *seatIndex) enrolmentsOf(k int) []int32 { return x.enOrd[x.enStart[k]:x.enStart[k+1]] }

// requestsOf lists the request indexes of student k, in term order.
func (x *seatIndex) requestsOf(k int) []int32 { return x.rqOrd[x.rqStart[k]:x.rqStart[k+1]] }

// holdsCourse reports whether student k holds a section of course c
// (fixed or sectioned).
func (x *seatIndex) holdsCourse(k int, c int32) bool {
	if c < 0 {
		return false
	}
	for _, ei := range x.enrolmentsOf(k) {
		if si := x.ensSec[ei]; si >= 0 && x.secCourse[si] == c {
			return true
		}
	}
	return false
}

// holdsSection reports whether student k holds section si.
func (x *seatIndex) holdsSection(k int, si int32) bool {
	for _, ei := range x.enrolmentsOf(k) {
		if x.ensSec[ei] == si {
			return true
		}
	}
	return false
}
