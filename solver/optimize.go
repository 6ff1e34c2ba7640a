package solver

import (
	"context"
	"fmt"
	"math"
	"slices"
)

// Optimize searches for a stable model of least cost under the weak
// constraints, lexicographically by priority level (highest first), under
// the assumptions set by Assume. Every model that improves on the best so
// far is passed to onModel (which may be nil; it may keep both slices) with
// its cost per level, highest level first (see Levels).
//
// It returns Satisfiable with the best cost found when a model exists (then
// Proven tells whether that cost is optimal, LowerBound gives proven lower
// bounds, and Model and Value give the best model), Unsatisfiable when there
// is no model (Core gives failed assumptions), and Unknown when ctx was done
// or Options.ConflictLimit was reached before any model was found. The error
// is non-nil only for assumptions naming no atom or weights whose sums
// overflow.
//
// Method: level-0 consequences are propagated first, and weak constraints
// whose literal they fix are constants of the call. Then, per level from
// the highest: core-guided lower bounds with stratification (Fu & Malik
// 2006; OLL, Morgado, Dodaro & Marques-Silva 2014) for up to
// Options.CoreBudget conflicts, then model-improving search
// with a native weighted-sum bound "cost ≤ best − 1" until unsatisfiable;
// the level's optimum is then fixed by a bound while lower levels are
// optimised. Bounds are guarded by activation literals, and relaxation
// literals are fixed true when the call returns; both kinds of constraint
// are then removed, so later calls are unaffected.
func (s *Solver) Optimize(ctx context.Context, onModel func(cost []int64, model []Atom)) (Status, []int64, error) {
	assumps, err := s.takeAssumptions("Optimize")
	if err != nil {
		return Unknown, nil, err
	}
	s.cancelUntil(0)
	if s.ok && s.propagate() { // level-0 consequences first: newOptimizer folds fixed soft literals
		s.ok = false
	}
	s.startBudget()
	o, err := newOptimizer(s, assumps, onModel)
	if err != nil {
		return Unknown, nil, err
	}
	st := o.run(ctx)
	o.finish()
	if st == Satisfiable {
		return st, slices.Clone(o.best), nil
	}
	return st, nil, nil
}

// LowerBound returns, per level (highest first), the best lower bound on the
// cost proven by the last Optimize call (under its assumptions, with higher
// levels at their optimum); equal to the best cost when Proven.
func (s *Solver) LowerBound() []int64 { return slices.Clone(s.lower) }

// Levels returns the distinct levels of the program's weak constraints,
// highest first: the order of cost vectors.
func (s *Solver) Levels() []int { return slices.Clone(s.levels) }

// Proven reports whether the last Optimize call proved its best cost
// optimal.
func (s *Solver) Proven() bool { return s.proven }

// softLit is a literal whose truth costs w > 0.
type softLit struct {
	lit Lit
	w   int64
}

// optimizer holds the state of one Optimize call.
type optimizer struct {
	s         *Solver
	onModel   func([]int64, []Atom)
	base      []Lit       // assumptions of every solve: the caller's, then activation literals of fixed levels
	user      int         // base[:user] are the caller's assumptions
	softs     [][]softLit // per level index: cost literals with positive weights
	offset    []int64     // per level index: constant cost (empty bodies, negative weights)
	best      []int64     // cost per level of the incumbent; nil before the first model
	bestModel []bool      // per atom: the incumbent
	lower     []int64     // proven lower bound per level
	acts      []Lit       // activation literals created by this call
	relax     []Lit       // "at least k" literals of relaxed cores, made true when the call ends
	cardBase  int         // len(s.cards) before the call
	cardLits  int         // len(s.cardLits) before the call
	sumBase   int         // len(s.sums) before the call
	partsBase int         // len(s.parts.lits) before the call
	proven    bool        // every level's optimum was proven
}

// newOptimizer turns the weak constraints into soft literals per level:
// weight w on body literal l becomes w on l when w > 0, and -w on not l plus
// the constant w when w < 0; an always-true body adds a constant.
func newOptimizer(s *Solver, assumps []Lit, onModel func([]int64, []Atom)) (*optimizer, error) {
	o := &optimizer{s: s, onModel: onModel, base: assumps, user: len(assumps),
		sumBase: len(s.sums), partsBase: len(s.parts.lits), cardBase: len(s.cards), cardLits: len(s.cardLits)}
	n := len(s.levels)
	o.softs = make([][]softLit, n)
	o.offset = make([]int64, n)
	o.lower = make([]int64, n)
	total := make([]int64, n)
	add := func(a, b int64) (int64, bool) {
		c := a + b
		return c, (b > 0 && c < a) || (b < 0 && c > a)
	}
	for _, w := range s.weaks {
		i := slices.Index(s.levels, w.level)
		var over bool
		switch {
		case w.lit == 0:
			o.offset[i], over = add(o.offset[i], w.weight)
		case w.weight > 0:
			o.softs[i] = append(o.softs[i], softLit{w.lit, w.weight})
			total[i], over = add(total[i], w.weight)
		default:
			if w.weight == math.MinInt64 {
				over = true
				break
			}
			o.offset[i], over = add(o.offset[i], w.weight)
			o.softs[i] = append(o.softs[i], softLit{w.lit ^ 1, -w.weight})
			total[i], _ = add(total[i], -w.weight)
		}
		if over || total[i] > math.MaxInt64/4 || o.offset[i] < math.MinInt64/4 || o.offset[i] > math.MaxInt64/4 {
			return nil, fmt.Errorf("%w: the weights of level %d add up beyond the range of int64; scale them down", ErrProgram, w.level)
		}
	}
	for i := range o.softs {
		o.softs[i] = o.foldFixed(i, mergeSofts(o.softs[i]))
		o.lower[i] = o.offset[i]
	}
	return o, nil
}

// foldFixed drops the soft literals of level i that are assigned at level
// 0, constants of the call: a true one adds its weight to the level's
// offset. In a neighbourhood step most soft literals are fixed, and fewer
// make cores, their bookkeeping and the weighted sums smaller. The offset
// stays in range: the weights were checked above.
func (o *optimizer) foldFixed(i int, ss []softLit) []softLit {
	j := 0
	for _, sf := range ss {
		switch o.s.vals[sf.lit] {
		case 1:
			o.offset[i] += sf.w
		case 0:
			ss[j] = sf
			j++
		}
	}
	return ss[:j]
}

// mergeSofts adds up the weights of equal literals.
func mergeSofts(ss []softLit) []softLit {
	slices.SortFunc(ss, func(a, b softLit) int { return int(a.lit) - int(b.lit) })
	j := 0
	for i := range ss {
		if j > 0 && ss[j-1].lit == ss[i].lit {
			ss[j-1].w += ss[i].w
			continue
		}
		ss[j] = ss[i]
		j++
	}
	return ss[:j]
}

func (o *optimizer) run(ctx context.Context) Status {
	s := o.s
	switch o.solve(ctx, nil) {
	case Unsatisfiable:
		return Unsatisfiable
	case Unknown:
		return Unknown
	}
	for i := range o.softs {
		if o.best[i] > o.lower[i] && s.opts.CoreBudget > 0 {
			st := o.corePhase(ctx, i)
			if st == Unknown {
				return Satisfiable
			}
		}
		if o.best[i] > o.lower[i] && o.improve(ctx, i) == Unknown {
			return Satisfiable
		}
		if i+1 < len(o.softs) {
			o.fix(i)
		}
	}
	o.proven = true
	return Satisfiable
}

// solve runs one search under base and extra assumptions, records an
// improving model, and returns to level 0.
func (o *optimizer) solve(ctx context.Context, extra []Lit) Status {
	s := o.s
	st := s.solve(ctx, append(slices.Clip(o.base), extra...), o.user)
	if st == Satisfiable {
		o.consider()
	}
	s.cancelUntil(0)
	return st
}

// cost returns the cost per level of the current total assignment.
func (o *optimizer) cost() []int64 {
	c := slices.Clone(o.offset)
	for i, ss := range o.softs {
		for _, sf := range ss {
			if o.s.vals[sf.lit] == 1 {
				c[i] += sf.w
			}
		}
	}
	return c
}

// consider makes the current model the incumbent if it is better.
func (o *optimizer) consider() {
	c := o.cost()
	if o.best != nil && slices.Compare(c, o.best) >= 0 {
		return
	}
	o.best = c
	o.bestModel = slices.Clone(o.s.model)
	if o.onModel != nil {
		o.onModel(slices.Clone(c), o.s.Model(nil))
	}
}

// corePhase raises the lower bound of level i with unsatisfiable cores over
// the soft literals (assumed false), relaxing each core with the soft
// cardinality "at least k of the core's literals" (OLL), stratified by
// weight. It stops when a model meets the bound (proving the level), when
// its budget is spent, or returns Unknown when the caller's limits stop it.
func (o *optimizer) corePhase(ctx context.Context, i int) Status {
	s := o.s
	budget := s.opts.CoreBudget
	if s.opts.ConflictLimit > 0 {
		budget = min(budget, s.opts.ConflictLimit/2)
	}
	saved := s.budgetEnd
	if end := s.stats.Conflicts + budget; saved == 0 || end < saved {
		s.budgetEnd = end
	}
	defer func() { s.budgetEnd = saved }()

	type relaxed struct {
		softLit
		set int // index in sets of the core this literal counts, -1 for an original soft
		k   int // the literal means "at least k of sets[set] are true"
	}
	var softs []relaxed
	for _, sf := range o.softs[i] {
		softs = append(softs, relaxed{sf, -1, 0})
	}
	var sets [][]Lit // cost literals of each relaxed core
	index := map[Lit]int{}
	var extra []Lit
	var lb int64          // raw lower bound: o.lower[i] - o.offset[i]
	threshold := int64(0) // only soft literals of at least this weight are assumed (stratification)
	for _, sf := range softs {
		threshold = max(threshold, sf.w)
	}
	for o.best[i] > o.lower[i] {
		extra = extra[:0]
		clear(index)
		for j, sf := range softs {
			if sf.w >= threshold {
				extra = append(extra, sf.lit^1)
				index[sf.lit^1] = j
			}
		}
		switch o.solve(ctx, extra) {
		case Unknown:
			if ctx.Err() != nil || (saved > 0 && s.stats.Conflicts >= saved) {
				return Unknown
			}
			return Satisfiable // the phase's budget is spent
		case Satisfiable:
			next := int64(0)
			for _, sf := range softs {
				if sf.w < threshold && sf.w > next {
					next = sf.w
				}
			}
			if next == 0 {
				return Satisfiable // every soft literal false is possible: cost = bound
			}
			threshold = next
			continue
		}
		var core []int
		for _, q := range s.failed {
			if j, ok := index[q]; ok {
				core = append(core, j)
			}
		}
		if len(core) == 0 {
			return Satisfiable // cannot happen while the incumbent exists
		}
		wmin := int64(math.MaxInt64)
		for _, j := range core {
			wmin = min(wmin, softs[j].w)
		}
		lb += wmin
		o.lower[i] = o.offset[i] + lb
		var grow []int
		for _, j := range core {
			softs[j].w -= wmin
			if softs[j].set >= 0 && softs[j].k < len(sets[softs[j].set]) {
				grow = append(grow, j)
			}
		}
		atLeast := func(set, k int) {
			v := Pos(Atom(s.newVar()))
			s.addCard(sets[set], NoBound, k-1, v^1) // not v -> at most k-1 true
			o.relax = append(o.relax, v)
			softs = append(softs, relaxed{softLit{v, wmin}, set, k})
		}
		if len(core) > 1 {
			lits := make([]Lit, len(core))
			for n, j := range core {
				lits[n] = softs[j].lit
			}
			sets = append(sets, lits)
			atLeast(len(sets)-1, 2)
		}
		for _, j := range grow {
			atLeast(softs[j].set, softs[j].k+1)
		}
		if !s.ok {
			return Satisfiable
		}
	}
	return Satisfiable
}

// improve runs model-improving search on level i: bound the level's cost
// below the incumbent's and solve, until unsatisfiable (the incumbent is
// optimal) or the bound meets the lower bound. It returns Unknown when
// stopped by the caller's limits.
func (o *optimizer) improve(ctx context.Context, i int) Status {
	s := o.s
	k := -1
	var act Lit
	for o.best[i] > o.lower[i] {
		bound := o.best[i] - o.offset[i] - 1
		if k < 0 {
			act = o.newAct()
			k = o.addLevelSum(i, bound, act)
		} else {
			s.sums[k].bound = bound // tightening keeps learned clauses valid
			s.sumPropagate(uint32(k))
		}
		for _, sf := range o.softs[i] {
			s.polarity[sf.lit>>1] = sf.lit&1 == 1 // try the free value first
		}
		switch o.solve(ctx, []Lit{act}) {
		case Unsatisfiable:
			o.lower[i] = o.best[i]
		case Unknown:
			return Unknown
		}
	}
	if k >= 0 {
		s.addClauseLevel0([]Lit{act ^ 1})
	}
	return Satisfiable
}

// fix keeps level i at its optimum while lower levels are optimised.
func (o *optimizer) fix(i int) {
	act := o.newAct()
	o.addLevelSum(i, o.best[i]-o.offset[i], act)
	o.base = append(o.base, act)
}

func (o *optimizer) newAct() Lit {
	act := Pos(Atom(o.s.newVar()))
	o.acts = append(o.acts, act)
	return act
}

// addLevelSum bounds the cost of level i's soft literals by bound when act
// holds.
func (o *optimizer) addLevelSum(i int, bound int64, act Lit) int {
	ss := o.softs[i]
	lits := make([]Lit, len(ss))
	ws := make([]int64, len(ss))
	for j, sf := range ss {
		lits[j], ws[j] = sf.lit, sf.w
	}
	return o.s.addSum(lits, ws, bound, act)
}

// finish retires the activation literals, removes this call's sums, and
// publishes the incumbent and bounds.
func (o *optimizer) finish() {
	s := o.s
	s.cancelUntil(0)
	for _, a := range o.acts {
		s.addClauseLevel0([]Lit{a ^ 1})
	}
	// Relaxation literals become true: their cards are then inactive and
	// every learned clause that depends on a card is satisfied.
	for _, v := range o.relax {
		s.addClauseLevel0([]Lit{v})
	}
	s.dropSums(o.sumBase, o.partsBase)
	s.dropCards(o.cardBase, o.cardLits)
	s.proven = o.proven && o.best != nil
	s.lower = slices.Clone(o.lower)
	if s.proven {
		s.lower = slices.Clone(o.best)
	}
	if o.best != nil {
		s.model = o.bestModel
		s.hasModel = true
	}
}
