package sectioning

import "slices"

// A student move re-seats all of one student's placed requests at once
// (each in the course it is placed in): a branch and bound over the
// requests, arrangement by arrangement and part by part, each section
// costed against every section chosen before it and the student's fixed
// sections (from a small clash matrix of the student's sections), cut when the cost so far plus a lower bound of the rest
// cannot beat the current seating. Single-request moves cannot leave a
// seating where only changing two courses together helps; this can.

// studentBudget bounds one student's search in nodes.
const studentBudget = 3000

type studentSearch struct {
	p        *problem
	k        int32
	reqs     []int32   // the student's placed requests, in search order
	cur      [][]int32 // per request position: its sectioned sections chosen
	best     [][]int32
	bestCost int64
	lbReq    []int64 // lower bound of requests from position i on
	nodes    int
	scratch  [][]cand // per depth
	depth    int
	// The student's universe: fixed sections and every section of their
	// placed courses, with local indexes (loc, -1 outside), their pairwise
	// clashes (m, weighted) and each one's clash with the chosen sections
	// (cnt), kept up to date on every choice.
	loc  []int32
	univ []int32
	m    []int64
	cnt  []int64
}

// improveStudent re-seats student k when a cheaper joint seating exists;
// it reports whether it changed anything.
func (p *problem) improveStudent(ss *studentSearch, k int32) bool {
	st := &p.students[k]
	ss.p, ss.k, ss.nodes = p, k, 0
	ss.reqs = ss.reqs[:0]
	for _, r := range st.reqs {
		if p.st.opt[r] >= 0 {
			ss.reqs = append(ss.reqs, r)
		}
	}
	ss.univ = ss.univ[:0]
	if len(ss.reqs) == 0 {
		return false
	}
	cur := p.studentCost(k)
	if cur <= 0 {
		return false
	}
	ss.bestCost = cur
	ss.best = ss.best[:0]
	for len(ss.cur) < len(ss.reqs) {
		ss.cur = append(ss.cur, nil)
	}
	ss.lbReq = append(ss.lbReq[:0], make([]int64, len(ss.reqs)+1)...)
	for i := len(ss.reqs) - 1; i >= 0; i-- {
		ss.lbReq[i] = ss.lbReq[i+1] + p.requestLB(ss.reqs[i], st.fixed)
	}
	ss.buildUniverse()
	ss.search(0, 0)
	for _, x := range ss.univ {
		ss.loc[x] = -1
	}
	if len(ss.best) == 0 {
		return false
	}
	for i, r := range ss.reqs {
		if !sameSecs(p.st.secs[r], ss.best[i]) {
			p.seat(r, p.st.opt[r], ss.best[i])
		}
	}
	return true
}

// buildUniverse fills loc, univ, m and cnt for the search's student.
func (ss *studentSearch) buildUniverse() {
	p := ss.p
	if len(ss.loc) != len(p.t.Sections) {
		ss.loc = make([]int32, len(p.t.Sections))
		for i := range ss.loc {
			ss.loc[i] = -1
		}
	}
	ss.univ = ss.univ[:0]
	add := func(x int32) {
		if ss.loc[x] < 0 {
			ss.loc[x] = int32(len(ss.univ))
			ss.univ = append(ss.univ, x)
		}
	}
	for _, x := range p.students[ss.k].fixed {
		add(x)
	}
	for _, r := range ss.reqs {
		for _, ai := range p.courseArr[p.course(r)] {
			for _, pi := range p.arrs[ai].parts {
				for _, x := range p.parts[pi].sections {
					add(x)
				}
			}
		}
	}
	n := len(ss.univ)
	ss.m = append(ss.m[:0], make([]int64, n*n)...)
	for i, x := range ss.univ {
		for j := i + 1; j < n; j++ {
			if v := p.clash.get(x, ss.univ[j]); v != 0 {
				w := int64(v) * p.mulClash
				ss.m[i*n+j], ss.m[j*n+i] = w, w
			}
		}
	}
	ss.cnt = append(ss.cnt[:0], make([]int64, n)...)
	for _, f := range p.students[ss.k].fixed {
		ss.push(f, 1)
	}
}

// push adds (sign 1) or removes (sign -1) section x from the chosen
// sections' clash counts.
func (ss *studentSearch) push(x int32, sign int64) {
	n := len(ss.univ)
	row := ss.m[int(ss.loc[x])*n : int(ss.loc[x]+1)*n]
	for i, v := range row {
		ss.cnt[i] += sign * v
	}
}

// studentCost is the moved and clash cost of k's seating that a student
// move can change: clashes of pairs with a sectioned section, and moved.
func (p *problem) studentCost(k int32) int64 {
	st := &p.students[k]
	var clashes int
	var secs []int32
	for _, r := range st.reqs {
		for _, x := range p.st.secs[r] {
			clashes += p.crossClash(x, st.fixed) + p.crossClash(x, secs)
			secs = append(secs, x)
		}
	}
	cost := int64(clashes) * p.mulClash
	for _, r := range st.reqs {
		if c := p.course(r); c >= 0 && len(st.kept[c]) > 0 {
			cost += int64(p.keptMoved(k, c, append(p.fixedIn(k, c, nil), p.st.secs[r]...))) * p.mulMoved
		}
	}
	return cost
}

// requestLB is a lower bound of request r's cost in its course: the
// cheapest arrangement by the cheapest section of each part, costed
// against the fixed sections only.
func (p *problem) requestLB(r int32, fixed []int32) int64 {
	c := p.course(r)
	var best int64 = -1
	for _, ai := range p.courseArr[c] {
		var sum int64
		for _, pi := range p.arrs[ai].parts {
			var m int64 = -1
			for _, x := range p.parts[pi].sections {
				v := int64(p.crossClash(x, fixed)) * p.mulClash
				if m < 0 || v < m {
					m = v
				}
			}
			sum += max(m, 0)
		}
		if best < 0 || sum < best {
			best = sum
		}
	}
	return max(best, 0)
}

// search places request position i with acc the cost so far.
func (ss *studentSearch) search(i int, acc int64) {
	if acc+ss.lbReq[i] >= ss.bestCost || ss.nodes >= studentBudget {
		return
	}
	ss.nodes++
	if i == len(ss.reqs) {
		ss.bestCost = acc
		ss.best = ss.best[:0]
		for j := range ss.reqs {
			ss.best = append(ss.best, append([]int32(nil), ss.cur[j]...))
		}
		return
	}
	p := ss.p
	r := ss.reqs[i]
	c := p.course(r)
	forced := p.fixedIn(ss.k, c, nil)
	kept := p.students[ss.k].kept[c]
	for _, ai := range p.courseArr[c] {
		ok := true
		for _, f := range forced {
			ok = ok && p.secArr[f] == ai
		}
		if !ok {
			continue
		}
		var base int64
		for _, x := range kept {
			if p.secArr[x] != ai {
				base += p.mulMoved
			}
		}
		ss.cur[i] = ss.cur[i][:0]
		ss.parts(i, ai, 0, acc+base, forced)
	}
}

// parts chooses the section of part position pos of arrangement ai for
// request position i.
func (ss *studentSearch) parts(i int, ai int32, pos int, acc int64, forced []int32) {
	p := ss.p
	a := &p.arrs[ai]
	if acc+ss.lbReq[i+1] >= ss.bestCost || ss.nodes >= studentBudget {
		return
	}
	if pos == len(a.parts) {
		if ss.parentsHeld(i, forced) {
			ss.search(i+1, acc)
		}
		return
	}
	ss.nodes++
	r := ss.reqs[i]
	pi := a.parts[pos]
	for len(ss.scratch) <= ss.depth {
		ss.scratch = append(ss.scratch, nil)
	}
	cs := ss.scratch[ss.depth][:0]
	var forcedHere int32 = -1
	for _, f := range forced {
		if p.secPart[f] == pi {
			forcedHere = f
		}
	}
	if forcedHere >= 0 {
		cs = append(cs, cand{sec: forcedHere, fixed: true})
	} else {
		var keptHere int32 = -1
		for _, x := range p.students[ss.k].kept[p.course(r)] {
			if p.secPart[x] == pi {
				keptHere = x
			}
		}
		for _, x := range p.parts[pi].sections {
			if p.st.load[x] >= p.limit[x] && !contains(p.st.secs[r], x) {
				continue
			}
			if par := p.parent[x]; par >= 0 && p.secArr[par] == ai && !ss.parentOK(i, par, forced) {
				continue
			}
			v := ss.cnt[ss.loc[x]]
			if keptHere >= 0 && x != keptHere {
				v += p.mulMoved
			}
			cs = append(cs, cand{sec: x, cost: v})
		}
		slices.SortFunc(cs, candOrder)
	}
	ss.scratch[ss.depth] = cs
	ss.depth++
	for _, cd := range cs {
		if acc+cd.cost+ss.lbReq[i+1] >= ss.bestCost {
			break
		}
		if !cd.fixed {
			ss.push(cd.sec, 1)
			ss.cur[i] = append(ss.cur[i], cd.sec)
		}
		ss.parts(i, ai, pos+1, acc+cd.cost, forced)
		if !cd.fixed {
			ss.push(cd.sec, -1)
			ss.cur[i] = ss.cur[i][:len(ss.cur[i])-1]
		}
		if ss.nodes >= studentBudget {
			break
		}
	}
	ss.depth--
}

// parentOK reports whether parent section par is compatible with request
// position i's choice so far: chosen, forced, or its part not yet chosen.
func (ss *studentSearch) parentOK(i int, par int32, forced []int32) bool {
	if contains(ss.cur[i], par) || contains(forced, par) {
		return true
	}
	pp := ss.p.secPart[par]
	for _, x := range ss.cur[i] {
		if ss.p.secPart[x] == pp {
			return false
		}
	}
	for _, f := range forced {
		if ss.p.secPart[f] == pp {
			return false
		}
	}
	return true
}

// parentsHeld checks every parent link of request position i's full
// choice.
func (ss *studentSearch) parentsHeld(i int, forced []int32) bool {
	p := ss.p
	held := func(x int32) bool { return contains(ss.cur[i], x) || contains(forced, x) }
	for _, x := range ss.cur[i] {
		if par := p.parent[x]; par >= 0 && !held(par) {
			return false
		}
	}
	for _, x := range forced {
		if par := p.parent[x]; par >= 0 && !held(par) {
			return false
		}
	}
	return true
}
