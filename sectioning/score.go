package sectioning

import "github.com/termwright/termwright/timetable"

// The sectioner's objective, compared lexicographically:
//  1. unplaced requests (criterion "unplaced requests"), fewest first;
//  2. among as many unplaced, the unplaced requests' priorities: fewest
//     unplaced of priority 1, then of 2, …, then of 0 (not given);
//  3. requests met by an alternative rather than their course: the sum of
//     the alternatives' positions (1 for the first alternative), so an
//     alternative is used only when the course itself cannot be placed;
//  4. criteria "moved students" and "student clashes" as their weights
//     and levels in the term say (by default moved students first).
//
// Within one student's one request, enrollments are compared by score:
// mulMoved × moved + mulClash × clashes + fill, where fill (a few bits,
// below every weighted unit) prefers emptier sections among equals so
// that later students find room.
const (
	unitLow  = 1 << 12 // weight unit of the lower criterion of 4.
	unitHigh = 1 << 36 // weight unit of the higher one
	fillMax  = 63      // fill of one full section
)

// setWeights reads the weights and levels of the two criteria of 4.
func (p *problem) setWeights() {
	wm, lm := p.t.CriterionWeight(timetable.CritMovedStudents)
	wc, lc := p.t.CriterionWeight(timetable.CritStudentClash)
	wm, wc = min(max(wm, 0), 1<<16), min(max(wc, 0), 1<<16)
	switch {
	case lm > lc:
		p.mulMoved, p.mulClash = int64(wm)*unitHigh, int64(wc)*unitLow
	case lm < lc:
		p.mulMoved, p.mulClash = int64(wm)*unitLow, int64(wc)*unitHigh
	default:
		p.mulMoved, p.mulClash = int64(wm)*unitLow, int64(wc)*unitLow
	}
}

// fill is section x's tie-breaking fill, 0 (empty) to fillMax (full).
func (p *problem) fill(x int32) int64 {
	if p.limit[x] <= 0 {
		return fillMax
	}
	return int64(min(p.st.load[x], p.limit[x])) * fillMax / int64(p.limit[x])
}

// crossClash is the clash count of section x against the sections ys.
func (p *problem) crossClash(x int32, ys []int32) int {
	n := 0
	for _, y := range ys {
		n += p.clash.get(x, y)
	}
	return n
}

// keptMoved is how many of student k's kept sections in course c the
// enrollment all (sectioned and fixed sections) leaves.
func (p *problem) keptMoved(k, c int32, all []int32) int {
	kept := p.students[k].kept[c]
	n := 0
	for _, x := range kept {
		found := false
		for _, y := range all {
			if x == y {
				found = true
				break
			}
		}
		if !found {
			n++
		}
	}
	return n
}

// totals is the objective (without the priority tie-break, see
// priorityVector) of the current state.
type totals struct {
	unplaced, altRank, moved, clashes int64
}

// totals evaluates the current state from scratch.
func (p *problem) totals() totals {
	var tt totals
	var buf []int32
	for ri := range p.reqs {
		r := int32(ri)
		o := p.st.opt[r]
		if o < 0 {
			tt.unplaced++
			continue
		}
		tt.altRank += int64(o)
	}
	for k := range p.students {
		kk := int32(k)
		buf = buf[:0]
		buf = append(buf, p.students[k].fixed...)
		for _, q := range p.students[k].reqs {
			buf = append(buf, p.st.secs[q]...)
		}
		for i := range buf {
			for j := i + 1; j < len(buf); j++ {
				tt.clashes += int64(p.clash.get(buf[i], buf[j]))
			}
		}
		for _, q := range p.students[k].reqs {
			if c := p.course(q); c >= 0 && len(p.students[k].kept[c]) > 0 {
				tt.moved += int64(p.keptMoved(kk, c, append(p.fixedIn(kk, c, nil), p.st.secs[q]...)))
			}
		}
	}
	return tt
}

// primary is the weighted value of the criteria of 4 in tt.
func (p *problem) primary(tt totals) int64 {
	return tt.moved*p.mulMoved + tt.clashes*p.mulClash
}
