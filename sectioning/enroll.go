package sectioning

import (
	"cmp"
	"slices"
)

// An enrollment of a student in a course is one arrangement and one
// section of each of its parts, every held section's parent held too.
// findEnrollment searches them part by part (parents' parts first) by
// branch and bound: each part's sections are tried cheapest first, and a
// branch is cut when its cost so far plus the cheapest section of every
// remaining part cannot beat the best enrollment found. It never builds
// the product of the parts.

// query says what enrollment to look for.
type query struct {
	r      int32   // the request
	k      int32   // its student
	c      int32   // the course
	others []int32 // the student's sections outside r (see problem.others)
	own    []int32 // sections r holds now: they have room for it
	pass   int32   // a full section treated as having room (-1 none)
	// passAll treats every section as having room (eject.go then makes
	// room in the full ones).
	passAll bool
	banned  []bool // sections not to use (nil: none)
}

// enrollment is a found enrollment.
type enrollment struct {
	secs  []int32 // sectioned sections (the student's fixed sections of the course excluded)
	score int64   // moved and clash cost plus fill
	cost  int64   // moved and clash cost (see score.go)
}

// nodeBudget bounds one search; once spent the best enrollment found so
// far is returned (the search goes on until it has found one).
const nodeBudget = 20000

type cand struct {
	sec   int32
	cost  int64 // score contribution against the others (moved, clash, fill)
	fixed bool
}

// searcher holds one search's scratch space, reused between searches.
type searcher struct {
	p      *problem
	q      *query
	parts  [][]cand
	suffix []int64
	chosen []int32 // section per part position
	forced []int32
	best   enrollment
	found  bool
	nodes  int
	keptC  []int32
	arrOf  int32
	others []int32 // scratch for callers building a query's others
}

func newSearcher(p *problem) *searcher { return &searcher{p: p} }

// hasRoom reports whether section x can take the query's student.
func (s *searcher) hasRoom(x int32) bool {
	q := s.q
	if x == q.pass || q.passAll {
		return true
	}
	for _, y := range q.own {
		if y == x {
			return true
		}
	}
	return s.p.st.load[x] < s.p.limit[x]
}

// find returns the best enrollment for q, and false when none exists
// (every candidate hits a full or banned section, or a parent link cannot
// be met).
func (s *searcher) find(q *query) (enrollment, bool) {
	p := s.p
	s.q, s.found, s.nodes = q, false, 0
	s.forced = p.fixedIn(q.k, q.c, s.forced)
	s.keptC = p.students[q.k].kept[q.c]
	for _, ai := range p.courseArr[q.c] {
		s.searchArr(ai)
	}
	if !s.found {
		return enrollment{}, false
	}
	out := s.best
	out.secs = append([]int32(nil), out.secs...)
	return out, true
}

// searchArr searches arrangement ai.
func (s *searcher) searchArr(ai int32) {
	p, q := s.p, s.q
	a := &p.arrs[ai]
	for _, f := range s.forced {
		if p.secArr[f] != ai {
			return
		}
	}
	s.arrOf = ai
	n := len(a.parts)
	for len(s.parts) < n {
		s.parts = append(s.parts, nil)
	}
	s.suffix = append(s.suffix[:0], make([]int64, n+1)...)
	var base int64
	for _, x := range s.keptC { // kept sections whose part this arrangement lacks
		if p.secArr[x] != ai {
			base += p.mulMoved
		}
	}
	for pos, pi := range a.parts {
		cs := s.parts[pos][:0]
		var forced int32 = -1
		for _, f := range s.forced {
			if p.secPart[f] == pi {
				if forced >= 0 {
					return // two fixed sections in one part
				}
				forced = f
			}
		}
		if forced >= 0 {
			cs = append(cs, cand{sec: forced, fixed: true})
		} else {
			var keptHere int32 = -1
			for _, x := range s.keptC {
				if p.secPart[x] == pi {
					keptHere = x
				}
			}
			for _, x := range p.parts[pi].sections {
				if (q.banned != nil && q.banned[x]) || !s.hasRoom(x) {
					continue
				}
				c := int64(p.crossClash(x, q.others))*p.mulClash + p.fill(x)
				if keptHere >= 0 && x != keptHere {
					c += p.mulMoved
				}
				cs = append(cs, cand{sec: x, cost: c})
			}
			slices.SortFunc(cs, candOrder)
		}
		if len(cs) == 0 {
			s.parts[pos] = cs
			return
		}
		s.parts[pos] = cs
	}
	for pos := n - 1; pos >= 0; pos-- {
		s.suffix[pos] = s.suffix[pos+1] + s.parts[pos][0].cost
	}
	s.chosen = append(s.chosen[:0], make([]int32, n)...)
	s.dfs(0, n, base)
}

// dfs chooses the section of part position pos with acc the cost so far.
func (s *searcher) dfs(pos, n int, acc int64) {
	p := s.p
	if s.found && (acc+s.suffix[pos] >= s.best.score || s.nodes >= nodeBudget) {
		return
	}
	s.nodes++
	if pos == n {
		s.record(acc)
		return
	}
	a := &p.arrs[s.arrOf]
	for _, cd := range s.parts[pos] {
		x := cd.sec
		if !s.parentsOK(pos, x, a.parts) {
			continue
		}
		add := cd.cost
		if !cd.fixed {
			for j := 0; j < pos; j++ { // clashes within the enrollment
				if y := s.chosen[j]; !s.isForced(y) {
					add += int64(p.clash.get(x, y)) * p.mulClash
				}
			}
		}
		s.chosen[pos] = x
		s.dfs(pos+1, n, acc+add)
		if s.found && (acc+cd.cost+s.suffix[pos+1] >= s.best.score || s.nodes >= nodeBudget) {
			return // candidates are sorted: the rest cost no less
		}
	}
}

// parentsOK checks the parent links between x (at part position pos) and
// the sections chosen before it.
func (s *searcher) parentsOK(pos int, x int32, parts []int32) bool {
	p := s.p
	if par := p.parent[x]; par >= 0 {
		if p.secArr[par] != s.arrOf {
			return false
		}
		for j := 0; j < pos; j++ {
			if parts[j] == p.secPart[par] && s.chosen[j] != par {
				return false
			}
		}
	}
	for j := 0; j < pos; j++ {
		y := s.chosen[j]
		if par := p.parent[y]; par >= 0 && p.secPart[par] == parts[pos] && par != x {
			return false
		}
	}
	return true
}

func (s *searcher) isForced(x int32) bool {
	for _, f := range s.forced {
		if f == x {
			return true
		}
	}
	return false
}

// record keeps the full choice in s.chosen when it beats the best.
func (s *searcher) record(score int64) {
	p := s.p
	// parents whose part lies later (only in a cycle) are checked here
	n := len(p.arrs[s.arrOf].parts)
	for pos := range n {
		if par := p.parent[s.chosen[pos]]; par >= 0 {
			ok := false
			for j := range n {
				if s.chosen[j] == par {
					ok = true
				}
			}
			if !ok {
				return
			}
		}
	}
	if s.found && score >= s.best.score {
		return
	}
	s.found = true
	s.best.score = score
	s.best.secs = s.best.secs[:0]
	var fill int64
	for pos := range n {
		if x := s.chosen[pos]; !s.isForced(x) {
			s.best.secs = append(s.best.secs, x)
			fill += p.fill(x)
		}
	}
	s.best.cost = score - fill
}

// candOrder sorts candidates cheapest first, then by section.
func candOrder(a, b cand) int {
	if a.cost != b.cost {
		return cmp.Compare(a.cost, b.cost)
	}
	return cmp.Compare(a.sec, b.sec)
}
