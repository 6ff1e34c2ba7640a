package solver

import "math/rand/v2"

// Clone returns an independent copy of s at decision level 0: the same
// clauses (original and learned), constraints, level-0 assignment,
// activities, saved phases, random state, pending assumptions and last
// result, so that the copy searches exactly as s would. Additions,
// assumptions and searches on either afterwards do not affect the other,
// and the two may be used from different goroutines. The clone's Stats
// start at zero (so that Stats.Add over a solver and its clones counts work
// once) and it has no progress callback (see SetProgress).
//
// Cost: one copy of every table, O(size of the solver), without redoing
// the completion of New; only the unfounded-set checker's graph, which no
// method changes after New, is shared.
func (s *Solver) Clone() *Solver {
	s.cancelUntil(0)
	c := new(Solver)
	*c = *s // scalars; every slice and pointer field is replaced below
	pcg := *s.pcg
	c.pcg = &pcg
	c.rng = rand.New(c.pcg)

	c.added = cloneCap(s.added)
	c.vals = cloneCap(s.vals)
	c.level = cloneCap(s.level)
	c.reason = cloneCap(s.reason)
	c.trailPos = cloneCap(s.trailPos)
	c.trail = cloneCap(s.trail)
	c.trailLim = cloneCap(s.trailLim)

	c.arena = cloneCap(s.arena)
	c.watches = cloneLists(s.watches)
	c.learnts = cloneCap(s.learnts)

	c.activity = cloneCap(s.activity)
	c.order = varHeap{heap: cloneCap(s.order.heap), index: cloneCap(s.order.index), activity: &c.activity}
	c.polarity = cloneCap(s.polarity)

	c.cards = cloneCap(s.cards)
	c.cardLits = cloneCap(s.cardLits)
	c.cardOcc = cloneLists(s.cardOcc)
	c.sums = cloneCap(s.sums)
	c.parts = sumParts{lits: cloneCap(s.parts.lits), w: cloneCap(s.parts.w), of: cloneCap(s.parts.of)}
	c.sumOcc = cloneLists(s.sumOcc)
	if s.ufs != nil {
		c.ufs = s.ufs.clone()
	}

	c.conflict = cloneCap(s.conflict)
	c.seen = cloneCap(s.seen)
	c.analyzeLearnt = cloneCap(s.analyzeLearnt)
	c.analyzeStack = cloneCap(s.analyzeStack)
	c.analyzeToClear = cloneCap(s.analyzeToClear)
	c.levelStamp = cloneCap(s.levelStamp)
	c.explArena = cloneCap(s.explArena)
	c.explIndex = cloneCap(s.explIndex)
	c.explVars = cloneCap(s.explVars)

	c.assumptions = cloneCap(s.assumptions)
	c.pending = cloneCap(s.pending)
	c.core = cloneCap(s.core)
	c.failed = cloneCap(s.failed)
	c.model = cloneCap(s.model)
	c.weaks = cloneCap(s.weaks)
	c.levels = cloneCap(s.levels)
	c.lower = cloneCap(s.lower)
	c.lbdQueue = cloneCap(s.lbdQueue)

	c.stats = Stats{}
	c.nextReduce = s.nextReduce - s.stats.Conflicts // reductions are scheduled by the conflict count
	c.budgetEnd = 0
	c.progress = nil
	return c
}

// cloneCap copies x keeping its capacity, so that appends on hot paths
// (the trail, scratch buffers) allocate no more in the copy than in x.
func cloneCap[T any](x []T) []T {
	if x == nil {
		return nil
	}
	return append(make([]T, 0, cap(x)), x...)
}

// cloneLists copies per-literal lists into one allocation, each list with
// the spare room rebuildWatches gives (a quarter plus two).
func cloneLists[T any](lists [][]T) [][]T {
	total := 0
	for _, l := range lists {
		total += len(l) + len(l)/4 + 2
	}
	buf := make([]T, total)
	out := make([][]T, len(lists), cap(lists))
	off := 0
	for i, l := range lists {
		n := len(l) + len(l)/4 + 2
		out[i] = append(buf[off:off:off+n], l...)
		off += n
	}
	return out
}

// clone copies the mutable state of the checker (sources, counters, queues,
// scratch) and shares the support graph, which is read-only after New.
func (u *unfounded) clone() *unfounded {
	c := *u
	c.unsourced = cloneCap(u.unsourced)
	c.src = cloneCap(u.src)
	c.todo = cloneCap(u.todo)
	c.inTodo = cloneCap(u.inTodo)
	c.falseQueue = cloneCap(u.falseQueue)
	c.work = nil
	c.inSet = make([]bool, len(u.inSet))
	c.nodeMark = make([]bool, len(u.nodeMark))
	c.marked = nil
	c.set = nil
	c.external = nil
	c.clause = nil
	return &c
}
