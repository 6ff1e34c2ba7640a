package sectioning

// Priority ejection: an unplaced request that no repair can seat takes
// the place of a less important one (a larger priority rank) in a full
// section, which then tries a repair of its own. The number of unplaced
// requests never grows, and the unplaced ones become less important —
// "higher priority first when places are scarce".

// ejectFor tries to seat unplaced request r by ejecting a less important
// request from one full section; it reports whether r is now seated.
func (p *problem) ejectFor(sr *searcher, rep *repairer, r int32) bool {
	rq := &p.reqs[r]
	k := rq.student
	others := p.others(k, r, nil)
	for o, c := range rq.options {
		if c < 0 || p.holdsCourse(k, c, r) {
			continue
		}
		for _, ai := range p.courseArr[c] {
			for _, pi := range p.arrs[ai].parts {
				for _, x := range p.parts[pi].sections {
					if p.st.load[x] < p.limit[x] {
						continue
					}
					victim := p.leastImportant(x, rq.rank, k)
					if victim < 0 {
						continue
					}
					q := query{r: r, k: k, c: c, others: others, pass: x}
					e, ok := sr.find(&q)
					if !ok || !contains(e.secs, x) {
						continue
					}
					vo, vs := p.st.opt[victim], append([]int32(nil), p.st.secs[victim]...)
					p.unseat(victim)
					if !p.roomAll(e.secs) {
						p.seat(victim, vo, vs) // x was not the only full section after all
						continue
					}
					p.seat(r, int32(o), e.secs)
					rep.repair(victim)
					return true
				}
			}
		}
	}
	return false
}

// leastImportant is the sectioned request in section x with the largest
// priority rank above rank (ties: the latest request), -1 when none; it
// skips student k's own requests.
func (p *problem) leastImportant(x int32, rank int, k int32) int32 {
	var best int32 = -1
	for _, h := range p.st.holders[x] {
		if p.reqs[h].student == k || p.reqs[h].rank <= rank {
			continue
		}
		if best < 0 || p.reqs[h].rank > p.reqs[best].rank || p.reqs[h].rank == p.reqs[best].rank && h > best {
			best = h
		}
	}
	return best
}
