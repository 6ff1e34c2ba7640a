package solver

import "context"

// Solve searches for a stable model under the assumptions set by Assume
// (which are then cleared). It returns Satisfiable (Model and Value give the
// model), Unsatisfiable (Core gives failed assumptions) or Unknown when ctx
// is done or Options.ConflictLimit conflicts were spent. An assumption
// naming no atom is a misuse, the same as for Optimize: Solve then returns
// Unknown without searching and Err returns an error wrapping ErrProgram
// (Err is nil after every call without misuse).
func (s *Solver) Solve(ctx context.Context) Status {
	assumps, err := s.takeAssumptions("Solve")
	if err != nil {
		return Unknown
	}
	s.startBudget()
	st := s.solve(ctx, assumps, len(assumps))
	s.cancelUntil(0)
	return st
}

// solve starts a search from level 0 under assumps, of which the first user
// are the caller's. It leaves the assignment as found (total after
// Satisfiable) so that Enumerate can continue; callers cancel afterwards.
func (s *Solver) solve(ctx context.Context, assumps []Lit, user int) Status {
	s.cancelUntil(0)
	s.core = s.core[:0]
	s.failed = s.failed[:0]
	s.hasModel = false
	s.assumptions = append(s.assumptions[:0], assumps...)
	s.userAssume = user
	if !s.ok {
		return Unsatisfiable
	}
	if s.propagate() {
		s.ok = false
		return Unsatisfiable
	}
	if len(s.trail) > s.simpTrail {
		s.compact()
	}
	if ctx.Err() != nil {
		return Unknown
	}
	return s.search(ctx)
}

// search runs conflict-driven search from the current state until a model
// (the assignment is then total and saved), unsatisfiability (under the
// assumptions: core computed) or a limit.
func (s *Solver) search(ctx context.Context) Status {
	done := ctx.Done()
	conflictsHere := int64(0) // conflicts since the last restart
	for {
		if s.propagate() {
			s.stats.Conflicts++
			conflictsHere++
			if !s.handleConflict() {
				return Unsatisfiable
			}
			if s.conflictsExceeded() {
				return Unknown
			}
			if conflictsHere&63 == 0 && cancelled(done) {
				return Unknown
			}
			continue
		}
		if s.restartDue(conflictsHere) {
			conflictsHere = 0
			s.restart()
			if cancelled(done) {
				return Unknown
			}
			continue
		}
		next := Lit(0)
		for s.decisionLevel() < len(s.assumptions) {
			p := s.assumptions[s.decisionLevel()]
			switch s.vals[p] {
			case 1:
				s.newDecisionLevel()
				continue
			case -1:
				s.analyzeFinal(p)
				return Unsatisfiable
			}
			next = p
			break
		}
		if next == 0 {
			next = s.pickBranch()
			if next == 0 {
				s.saveModel()
				return Satisfiable
			}
			s.stats.Decisions++
			if s.stats.Decisions&255 == 0 && cancelled(done) {
				return Unknown
			}
		}
		s.newDecisionLevel()
		s.assign(next, 0)
	}
}

func cancelled(done <-chan struct{}) bool {
	select {
	case <-done:
		return true
	default:
		return false
	}
}

// startBudget starts the conflict budget of a public call.
func (s *Solver) startBudget() {
	s.budgetEnd = 0
	if s.opts.ConflictLimit > 0 {
		s.budgetEnd = s.stats.Conflicts + s.opts.ConflictLimit
	}
}

func (s *Solver) conflictsExceeded() bool {
	return s.budgetEnd > 0 && s.stats.Conflicts >= s.budgetEnd
}

// handleConflict learns from s.conflict and backjumps, asserting the learned
// clause. It returns false when the conflict is at level 0 (no model).
func (s *Solver) handleConflict() bool {
	maxLevel := int32(0)
	for _, q := range s.conflict {
		maxLevel = max(maxLevel, s.level[q>>1])
	}
	if maxLevel == 0 {
		s.ok = false
		s.cancelUntil(0)
		return false
	}
	s.cancelUntil(int(maxLevel)) // conflicts from added clauses may lie below the current level
	bt, lbd := s.analyze()
	s.cancelUntil(bt)
	learnt := s.analyzeLearnt
	s.stats.Learned++
	if len(learnt) == 1 {
		s.assign(learnt[0], 0)
	} else {
		c := s.allocClause(learnt, true, lbd)
		s.attach(c)
		s.assign(learnt[0], c)
	}
	s.decayActivities()
	s.recordLBD(lbd)
	return true
}

// pickBranch returns the next decision literal, or 0 when every variable is
// assigned.
func (s *Solver) pickBranch() Lit {
	if s.opts.RandomFreq > 0 && !s.order.empty() && s.rng.Float64() < s.opts.RandomFreq {
		v := s.order.heap[s.rng.IntN(len(s.order.heap))]
		if s.vals[Lit(v)<<1] == 0 {
			return s.phase(v)
		}
	}
	for !s.order.empty() {
		v := s.order.removeMax()
		if s.vals[Lit(v)<<1] == 0 {
			return s.phase(v)
		}
	}
	return 0
}

func (s *Solver) phase(v uint32) Lit {
	if s.polarity[v] {
		return Lit(v) << 1
	}
	return Lit(v)<<1 | 1
}

// recordLBD feeds the glucose restart averages.
func (s *Solver) recordLBD(lbd int) {
	s.lbdSum += float64(lbd)
	s.lbdCount++
	q := s.lbdQueue
	s.lbdQueueSum += int64(lbd - q[s.lbdQueueHead])
	q[s.lbdQueueHead] = lbd
	s.lbdQueueHead++
	if s.lbdQueueHead == len(q) {
		s.lbdQueueHead = 0
		s.lbdQueueFull = true
	}
}

// restartDue applies the restart policy.
func (s *Solver) restartDue(conflictsHere int64) bool {
	if s.opts.Restarts == RestartLuby {
		return conflictsHere >= int64(s.opts.LubyUnit)*luby(s.lubyIndex)
	}
	if !s.lbdQueueFull || s.lbdCount == 0 {
		return false
	}
	recent := float64(s.lbdQueueSum) / float64(len(s.lbdQueue))
	return recent*s.opts.GlucoseK > s.lbdSum/float64(s.lbdCount)
}

// restart backtracks to level 0, reduces the learned clauses when due and
// reports progress.
func (s *Solver) restart() {
	s.stats.Restarts++
	s.lubyIndex++
	s.lbdQueueFull = false
	s.lbdQueueHead = 0
	s.lbdQueueSum = 0
	for i := range s.lbdQueue {
		s.lbdQueue[i] = 0
	}
	s.cancelUntil(0)
	if s.stats.Conflicts >= s.nextReduce {
		s.reduceIncr += int64(s.opts.ReduceInc)
		s.nextReduce = s.stats.Conflicts + s.reduceIncr + int64(s.opts.ReduceFirst)
		s.reduceDB()
	}
	if s.progress != nil {
		s.progress(s.stats)
	}
}

// luby returns the i-th element (from 0) of the Luby sequence 1 1 2 1 1 2 4
// ... (Luby, Sinclair, Zuckerman 1993).
func luby(i int) int64 {
	size, seq := 1, 0
	for size < i+1 {
		seq++
		size = 2*size + 1
	}
	x := i
	for size-1 != x {
		size = (size - 1) >> 1
		seq--
		x %= size
	}
	return int64(1) << seq
}
