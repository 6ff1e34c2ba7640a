package solver

// analyze derives a first-UIP clause from s.conflict (all literals false, at
// least one at the current decision level, which is above 0), minimises it
// recursively (Sörensson & Biere 2009) and bumps the activity of every
// variable met. The clause is left in s.analyzeLearnt with the asserting
// literal first and a literal of the backjump level second. It returns the
// backjump level and the clause's literal block distance.
func (s *Solver) analyze() (btLevel int, lbd int) {
	dl := int32(s.decisionLevel())
	learnt := append(s.analyzeLearnt[:0], 0)
	pathC := 0
	index := len(s.trail) - 1
	lits := s.conflict
	var p Lit
	for {
		for _, q := range lits {
			v := q >> 1
			if s.seen[v] == 0 && s.level[v] > 0 {
				s.bump(uint32(v))
				s.seen[v] = 1
				if s.level[v] >= dl {
					pathC++
				} else {
					learnt = append(learnt, q)
				}
			}
		}
		for s.seen[s.trail[index]>>1] == 0 {
			index--
		}
		p = s.trail[index]
		index--
		s.seen[p>>1] = 0
		pathC--
		if pathC <= 0 {
			break
		}
		s.refreshLBD(s.reason[p>>1])
		lits = s.reasonLits(uint32(p >> 1))[1:]
	}
	learnt[0] = p ^ 1

	// Recursive minimisation: drop literals implied by the others.
	s.analyzeToClear = append(s.analyzeToClear[:0], learnt[1:]...)
	var abstract uint32
	for _, q := range learnt[1:] {
		abstract |= 1 << (s.level[q>>1] & 31)
	}
	j := 1
	for i := 1; i < len(learnt); i++ {
		q := learnt[i]
		if s.reason[q>>1] == 0 || !s.litRedundant(q, abstract) {
			learnt[j] = q
			j++
		}
	}
	learnt = learnt[:j]

	if len(learnt) > 1 {
		m := 1
		for i := 2; i < len(learnt); i++ {
			if s.level[learnt[i]>>1] > s.level[learnt[m]>>1] {
				m = i
			}
		}
		learnt[1], learnt[m] = learnt[m], learnt[1]
		btLevel = int(s.level[learnt[1]>>1])
	}
	lbd = s.computeLBD(learnt)
	for _, q := range s.analyzeToClear {
		s.seen[q>>1] = 0
	}
	s.clearExplanations()
	s.analyzeLearnt = learnt
	return btLevel, lbd
}

// litRedundant reports whether the false literal p of the learned clause is
// implied by the other literals (all marked seen), exploring reasons
// depth-first. Variables found redundant stay marked (and are listed in
// analyzeToClear); on failure the marks made by this call are undone.
func (s *Solver) litRedundant(p Lit, abstract uint32) bool {
	stack := append(s.analyzeStack[:0], p)
	top := len(s.analyzeToClear)
	for len(stack) > 0 {
		q := stack[len(stack)-1]
		stack = stack[:len(stack)-1]
		for _, l := range s.reasonLits(uint32(q >> 1))[1:] {
			v := l >> 1
			if s.seen[v] != 0 || s.level[v] == 0 {
				continue
			}
			if s.reason[v] != 0 && abstract&(1<<(s.level[v]&31)) != 0 {
				s.seen[v] = 1
				stack = append(stack, l)
				s.analyzeToClear = append(s.analyzeToClear, l)
				continue
			}
			for _, c := range s.analyzeToClear[top:] {
				s.seen[c>>1] = 0
			}
			s.analyzeToClear = s.analyzeToClear[:top]
			s.analyzeStack = stack
			return false
		}
	}
	s.analyzeStack = stack
	return true
}

// refreshLBD lowers the stored literal block distance of a learned clause
// used in conflict analysis when it has dropped (Audemard & Simon 2009), so
// that clauses that keep being useful survive reductions.
func (s *Solver) refreshLBD(r uint32) {
	if r>>reasonKindShift != kindClause || s.arena[r]&flagLearnt == 0 || s.arena[r+1] <= 2 {
		return
	}
	if lbd := s.computeLBD(s.clauseLits(r)); Lit(lbd) < s.arena[r+1] {
		s.arena[r+1] = Lit(lbd)
	}
}

// computeLBD counts the distinct decision levels of lits.
func (s *Solver) computeLBD(lits []Lit) int {
	s.stamp++
	n := 0
	for _, q := range lits {
		lv := s.level[q>>1]
		if s.levelStamp[lv] != s.stamp {
			s.levelStamp[lv] = s.stamp
			n++
		}
	}
	return n
}

// bump raises the activity of v, rescaling all activities on overflow.
func (s *Solver) bump(v uint32) {
	s.activity[v] += s.varInc
	if s.activity[v] > 1e100 {
		for i := range s.activity {
			s.activity[i] *= 1e-100
		}
		s.varInc *= 1e-100
	}
	s.order.increased(v)
}

// decayActivities makes future bumps count more (equivalent to decaying all
// activities).
func (s *Solver) decayActivities() { s.varInc /= s.opts.VarDecay }

// analyzeFinal computes, for the assumption p found false, the assumptions
// whose consequences falsify it (Eén & Sörensson 2003): it walks the trail
// backwards from the end to the first decision, expanding reasons. The
// result, p included, is left in s.failed (every assumption literal
// involved) and s.core (the user's ones, in the order given).
func (s *Solver) analyzeFinal(p Lit) {
	s.failed = append(s.failed[:0], p)
	v := p >> 1
	if s.level[v] > 0 {
		s.seen[v] = 1
		for i := len(s.trail) - 1; i >= int(s.trailLim[0]); i-- {
			q := s.trail[i]
			x := q >> 1
			if s.seen[x] == 0 {
				continue
			}
			s.seen[x] = 0
			if s.reason[x] == 0 {
				s.failed = append(s.failed, q)
				continue
			}
			for _, l := range s.reasonLits(uint32(x))[1:] {
				if s.level[l>>1] > 0 {
					s.seen[l>>1] = 1
				}
			}
		}
		s.clearExplanations()
	}
	s.core = s.core[:0]
	for _, q := range s.failed {
		s.seen[q>>1] |= 4 << (q & 1) // bit 2: positive literal failed, bit 3: negative
	}
	for _, q := range s.assumptions[:s.userAssume] {
		if bit := uint8(4) << (q & 1); s.seen[q>>1]&bit != 0 {
			s.core = append(s.core, q)
			s.seen[q>>1] &^= bit
		}
	}
	for _, q := range s.failed {
		s.seen[q>>1] = 0
	}
}
