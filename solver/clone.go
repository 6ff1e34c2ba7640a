package solver

import (
	"math/rand/v2"
	"slices"
)

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
// the completion of New; only what no method changes after New is shared:
// the unfounded-set checker's support graph and the weak constraints. Call
// it between searches (it returns s to level 0).
func (s *Solver) Clone() *Solver {
	s.cancelUntil(0)
	c := new(Solver)
	*c = *s // scalars; every slice and pointer field is replaced below
	pcg := *s.pcg
	c.pcg = &pcg
	c.rng = rand.New(c.pcg)

	c.added = slices.Clone(s.added)
	c.vals = slices.Clone(s.vals)
	c.level = slices.Clone(s.level)
	c.reason = slices.Clone(s.reason)
	c.trailPos = slices.Clone(s.trailPos)
	c.trail = cloneCap(s.trail) // assign appends without allocating: cap(trail) >= numVars
	c.trailLim = slices.Clone(s.trailLim)

	c.arena = slices.Clone(s.arena)
	c.watches = cloneLists(s.watches, watchSpare)
	c.learnts = slices.Clone(s.learnts)

	c.activity = slices.Clone(s.activity)
	c.order = varHeap{heap: slices.Clone(s.order.heap), index: slices.Clone(s.order.index), activity: &c.activity}
	c.polarity = slices.Clone(s.polarity)

	c.cards = slices.Clone(s.cards)
	c.cardLits = slices.Clone(s.cardLits)
	c.cardOcc = cloneLists(s.cardOcc, noSpare)
	c.sums = slices.Clone(s.sums)
	c.parts = sumParts{lits: slices.Clone(s.parts.lits), w: slices.Clone(s.parts.w), of: slices.Clone(s.parts.of)}
	c.sumOcc = cloneLists(s.sumOcc, noSpare)
	if s.ufs != nil {
		c.ufs = s.ufs.clone()
	}

	c.conflict = slices.Clone(s.conflict)
	c.seen = slices.Clone(s.seen)
	c.analyzeLearnt = slices.Clone(s.analyzeLearnt)
	c.analyzeStack = slices.Clone(s.analyzeStack)
	c.analyzeToClear = slices.Clone(s.analyzeToClear)
	c.levelStamp = slices.Clone(s.levelStamp)
	c.explArena = slices.Clone(s.explArena)
	c.explIndex = slices.Clone(s.explIndex)
	c.explVars = slices.Clone(s.explVars)

	c.assumptions = slices.Clone(s.assumptions)
	c.pending = slices.Clone(s.pending)
	c.core = slices.Clone(s.core)
	c.failed = slices.Clone(s.failed)
	c.model = slices.Clone(s.model)
	// weaks and levels are shared: nothing changes them after New.
	c.lower = slices.Clone(s.lower)
	c.lbdQueue = slices.Clone(s.lbdQueue)

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
// spare room for spare(len) more entries; an empty list without spare room
// stays nil.
func cloneLists[T any](lists [][]T, spare func(int) int) [][]T {
	total := 0
	for _, l := range lists {
		total += len(l) + spare(len(l))
	}
	buf := make([]T, total)
	out := make([][]T, len(lists))
	off := 0
	for i, l := range lists {
		n := len(l) + spare(len(l))
		if n > 0 {
			out[i] = append(buf[off:off:off+n], l...)
		}
		off += n
	}
	return out
}

// watchSpare is the spare room of a copied watch list, as rebuildWatches
// gives it: propagation moves watches between lists.
func watchSpare(n int) int { return n/4 + 2 }

// noSpare: occurrence lists grow only when a constraint is added.
func noSpare(int) int { return 0 }

// clone copies the mutable state of the checker (sources, counters, queues,
// scratch) and shares the support graph, which is read-only after New.
func (u *unfounded) clone() *unfounded {
	c := *u
	c.unsourced = slices.Clone(u.unsourced)
	c.src = slices.Clone(u.src)
	c.todo = slices.Clone(u.todo)
	c.inTodo = slices.Clone(u.inTodo)
	c.falseQueue = slices.Clone(u.falseQueue)
	c.work = nil
	c.inSet = make([]bool, len(u.inSet))
	c.nodeMark = make([]bool, len(u.nodeMark))
	c.marked = nil
	c.set = nil
	c.external = nil
	c.clause = nil
	return &c
}
