package sectioning

// Repair by augmenting paths, as in bipartite matching: when no
// enrollment of a request has room, pick a full section X that would
// complete one, and move one of X's students to another enrollment (of
// the same course or of another option of their request) that avoids X —
// with room, or by freeing a seat there the same way, one level deeper.
// Sections on the path are marked so that no path visits one twice
// (Kuhn's method); with one-part courses and single requests this finds
// a seating for every request that the limits can hold (Hall's theorem).
// A failed path is undone.

const (
	repairDepth  = 12   // longest path
	repairBudget = 4000 // students tried as movers per repair
)

// repairer holds the scratch space of repairs.
type repairer struct {
	p       *problem
	sr      *searcher
	visited []bool
	marked  []int32
	log     undoLog
	budget  int
}

func newRepairer(p *problem, sr *searcher) *repairer {
	return &repairer{p: p, sr: sr, visited: make([]bool, len(p.t.Sections))}
}

// repair tries to seat request r (unplaced) and reports whether it did;
// on failure the state is as before.
func (rp *repairer) repair(r int32) bool {
	rp.budget = repairBudget
	ok := rp.place(r, 0)
	if !ok {
		rp.p.undo(&rp.log, 0)
	}
	for _, x := range rp.marked {
		rp.visited[x] = false
	}
	rp.marked = rp.marked[:0]
	rp.log = undoLog{r: rp.log.r[:0], opt: rp.log.opt[:0], secs: rp.log.secs[:0]}
	return ok
}

// optionOrder lists r's options to try: its current one first.
func (rp *repairer) optionOrder(r int32) []int32 {
	p := rp.p
	n := int32(len(p.reqs[r].options))
	out := make([]int32, 0, n)
	if o := p.st.opt[r]; o >= 0 {
		out = append(out, o)
	}
	for o := range n {
		if o != p.st.opt[r] {
			out = append(out, o)
		}
	}
	return out
}

// place seats r (unplaced, or leaving the marked sections) in an
// enrollment that avoids every marked section.
func (rp *repairer) place(r int32, depth int) bool {
	p := rp.p
	rq := &p.reqs[r]
	k := rq.student
	others := p.others(k, r, nil)
	opts := rp.optionOrder(r)
	query := func(o int32, pass int32) (query, bool) {
		c := rq.options[o]
		if c < 0 || p.holdsCourse(k, c, r) {
			return query{}, false
		}
		q := query{r: r, k: k, c: c, others: others, pass: pass, banned: rp.visited}
		if p.course(r) == c {
			q.own = p.st.secs[r]
		}
		return q, true
	}
	for _, o := range opts {
		if q, ok := query(o, -1); ok {
			if e, ok := rp.sr.find(&q); ok {
				p.reseat(&rp.log, r, o, e.secs)
				return true
			}
		}
	}
	if depth >= repairDepth {
		return false
	}
	for _, o := range opts {
		c := rq.options[o]
		if _, ok := query(o, -1); !ok {
			continue
		}
		for _, ai := range p.courseArr[c] {
			for _, pi := range p.arrs[ai].parts {
				for _, x := range p.parts[pi].sections {
					if rp.budget <= 0 {
						return false
					}
					if rp.visited[x] || p.st.load[x] < p.limit[x] || p.isFixed(k, x) {
						continue
					}
					q, _ := query(o, x)
					e, ok := rp.sr.find(&q)
					if !ok || !contains(e.secs, x) {
						continue
					}
					rp.visited[x] = true
					rp.marked = append(rp.marked, x)
					mark := len(rp.log.r)
					if rp.free(x, depth+1) && rp.roomFor(r, e.secs) && !p.holdsCourse(k, c, r) {
						p.reseat(&rp.log, r, o, e.secs)
						return true
					}
					p.undo(&rp.log, mark)
				}
			}
		}
	}
	return false
}

// free moves one student out of the full section x (marked).
func (rp *repairer) free(x int32, depth int) bool {
	p := rp.p
	hs := append([]int32(nil), p.st.holders[x]...)
	for _, h := range hs {
		if rp.budget--; rp.budget < 0 {
			return false
		}
		mark := len(rp.log.r)
		if rp.place(h, depth) {
			return true
		}
		p.undo(&rp.log, mark)
	}
	return false
}

// roomFor reports whether every section of secs has room for r.
func (rp *repairer) roomFor(r int32, secs []int32) bool {
	p := rp.p
	for _, x := range secs {
		if p.st.load[x] >= p.limit[x] && !contains(p.st.secs[r], x) {
			return false
		}
	}
	return true
}

func contains(xs []int32, v int32) bool {
	for _, x := range xs {
		if x == v {
			return true
		}
	}
	return false
}
