package sectioning

// state is the current seating: which option of each request is met with
// which sections, and every section's load. Invariant: load[x] =
// fixedLoad[x] + number of requests whose secs hold x; holders[x] lists
// those requests.
type state struct {
	load    []int32   // section -> students in it, fixed enrolments included
	opt     []int32   // request -> index into its options, -1 when unplaced
	secs    [][]int32 // request -> its sectioned sections (its enrollment without fixed sections)
	holders [][]int32 // section -> requests seated in it
	// Change counters for skipping work that cannot pay: a student's
	// counter grows whenever their seating changes, a course's whenever
	// one of its full sections loses a student (opens).
	studentVer []uint32
	courseVer  []uint32
	opened     []uint32 // section -> times it went from full to having room
	// zeroAt[r] is the student's counter at which request r was last seen
	// to cost nothing (0: never; counters start at 1).
	zeroAt []uint32
}

func newState(p *problem) state {
	st := state{
		load:    append([]int32(nil), p.fixedLoad...),
		opt:     make([]int32, len(p.reqs)),
		secs:    make([][]int32, len(p.reqs)),
		holders: make([][]int32, len(p.t.Sections)),

		studentVer: make([]uint32, len(p.students)),
		courseVer:  make([]uint32, len(p.courses)),
		zeroAt:     make([]uint32, len(p.reqs)),
		opened:     make([]uint32, len(p.t.Sections)),
	}
	for i := range st.studentVer {
		st.studentVer[i] = 1
	}
	for i := range st.opt {
		st.opt[i] = -1
	}
	return st
}

// seat meets request r by option o with sections secs (copied).
func (p *problem) seat(r int32, o int32, secs []int32) {
	st := &p.st
	if st.opt[r] >= 0 {
		p.unseat(r)
	}
	st.opt[r] = o
	st.studentVer[p.reqs[r].student]++
	st.secs[r] = append(st.secs[r][:0], secs...)
	for _, x := range secs {
		st.load[x]++
		st.holders[x] = append(st.holders[x], r)
	}
}

// unseat makes request r unplaced.
func (p *problem) unseat(r int32) {
	st := &p.st
	if st.opt[r] < 0 {
		return
	}
	st.studentVer[p.reqs[r].student]++
	for _, x := range st.secs[r] {
		if st.load[x] == p.limit[x] {
			st.opened[x]++
			st.courseVer[p.secCourse[x]]++
		}
		st.load[x]--
		h := st.holders[x]
		for i, q := range h {
			if q == r {
				h[i] = h[len(h)-1]
				st.holders[x] = h[:len(h)-1]
				break
			}
		}
	}
	st.opt[r] = -1
	st.secs[r] = st.secs[r][:0]
}

// course is the course index request r is placed in, -1 when unplaced.
func (p *problem) course(r int32) int32 {
	if o := p.st.opt[r]; o >= 0 {
		return p.reqs[r].options[o]
	}
	return -1
}

// holdsCourse reports whether student k is placed in course c by a
// request other than r.
func (p *problem) holdsCourse(k, c, r int32) bool {
	for _, q := range p.students[k].reqs {
		if q != r && p.course(q) == c {
			return true
		}
	}
	return false
}

// others fills buf with student k's sections outside request r: fixed
// enrolments and the sections of k's other placed requests.
func (p *problem) others(k, r int32, buf []int32) []int32 {
	buf = append(buf[:0], p.students[k].fixed...)
	for _, q := range p.students[k].reqs {
		if q != r {
			buf = append(buf, p.st.secs[q]...)
		}
	}
	return buf
}

// undoLog records seatings so that a failed repair can be taken back.
type undoLog struct {
	r    []int32
	opt  []int32
	secs [][]int32
}

// reseat seats r (as seat, or unseat when o < 0) and logs its old seating.
func (p *problem) reseat(u *undoLog, r, o int32, secs []int32) {
	if u != nil {
		u.r = append(u.r, r)
		u.opt = append(u.opt, p.st.opt[r])
		u.secs = append(u.secs, append([]int32(nil), p.st.secs[r]...))
	}
	if o < 0 {
		p.unseat(r)
		return
	}
	p.seat(r, o, secs)
}

// undo takes back every seating logged after mark, newest first.
func (p *problem) undo(u *undoLog, mark int) {
	for i := len(u.r) - 1; i >= mark; i-- {
		if u.opt[i] < 0 {
			p.unseat(u.r[i])
		} else {
			p.seat(u.r[i], u.opt[i], u.secs[i])
		}
	}
	u.r, u.opt, u.secs = u.r[:mark], u.opt[:mark], u.secs[:mark]
}
