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
	c.vals = withRoom(s.vals, 2*cloneVarRoom)
	c.level = withRoom(s.level, cloneVarRoom)
	c.reason = withRoom(s.reason, cloneVarRoom)
	c.trailPos = withRoom(s.trailPos, cloneVarRoom)
	c.trail = cloneCap(s.trail) // assign appends without allocating: cap(trail) >= numVars
	c.trailLim = slices.Clone(s.trailLim)

	c.arena = slices.Clone(s.arena)
	c.watches = cloneLists(s.watches, watchSpare, 2*cloneVarRoom)
	c.learnts = slices.Clone(s.learnts)

	c.activity = withRoom(s.activity, cloneVarRoom)
	c.order = varHeap{heap: withRoom(s.order.heap, cloneVarRoom), index: withRoom(s.order.index, cloneVarRoom), activity: &c.activity}
	c.polarity = withRoom(s.polarity, cloneVarRoom)

	c.cards = slices.Clone(s.cards)
	c.cardLits = slices.Clone(s.cardLits)
	c.cardOcc = cloneLists(s.cardOcc, noSpare, 2*cloneVarRoom)
	c.sums = slices.Clone(s.sums)
	c.parts = sumParts{lits: slices.Clone(s.parts.lits), w: slices.Clone(s.parts.w), of: slices.Clone(s.parts.of)}
	c.sumOcc = cloneLists(s.sumOcc, noSpare, 2*cloneVarRoom)
	if s.ufs != nil {
		c.ufs = s.ufs.clone()
	}

	c.conflict = slices.Clone(s.conflict)
	c.seen = withRoom(s.seen, cloneVarRoom)
	c.analyzeLearnt = slices.Clone(s.analyzeLearnt)
	c.analyzeStack = slices.Clone(s.analyzeStack)
	c.analyzeToClear = slices.Clone(s.analyzeToClear)
	c.levelStamp = withRoom(s.levelStamp, cloneVarRoom)
	c.explArena = slices.Clone(s.explArena)
	c.explIndex = withRoom(s.explIndex, cloneVarRoom)
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

// cloneVarRoom is the number of new variables a clone can get without
// copying its per-variable tables (Optimize and Enumerate make a few).
const cloneVarRoom = 256

// withRoom copies x with room for extra more elements.
func withRoom[T any](x []T, extra int) []T {
	return append(make([]T, 0, len(x)+extra), x...)
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
// spare room for spare(len) more entries (an empty list without spare room
// stays nil), and room for extra more lists.
func cloneLists[T any](lists [][]T, spare func(int) int, extra int) [][]T {
	total := 0
	for _, l := range lists {
		total += len(l) + spare(len(l))
	}
	buf := make([]T, total)
	out := make([][]T, len(lists), len(lists)+extra)
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
