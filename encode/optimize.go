package encode

import (
	"context"
	"errors"
	"slices"
	"time"

	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// OptimizeOptions control Optimize.
type OptimizeOptions struct {
	Seed int64 // engine and neighbourhood seed; see Optimize for when equal seeds give equal results
	// Keep is the earlier timetable for minimal-change re-planning: its
	// meetings that move cost "moved meetings".
	Keep *timetable.Schedule
	// Start is a timetable to start from (a warm start): the engine tries
	// its meetings' places first, so when it is valid on the term the
	// first timetable is usually it. Nil starts from nothing.
	Start *timetable.Schedule
	// GlobalConflicts is the conflict budget of the first phase, model-
	// improving search with core-guided bounds on the whole term; 0 means
	// DefaultGlobalConflicts when the program has at most
	// GlobalWeakLimit weak constraints, and skipping the phase otherwise
	// (on large terms each conflict of the whole-term search costs too
	// much; neighbourhood search does better). Negative skips the phase
	// after the first timetable.
	GlobalConflicts int64
	// StepConflicts is the conflict budget of one neighbourhood search; 0
	// means DefaultStepConflicts.
	StepConflicts int64
	// MaxStall ends neighbourhood search after this many steps in a row
	// without improvement; 0 means DefaultMaxStall, negative skips
	// neighbourhood search.
	MaxStall int
	// MaxSteps ends neighbourhood search after this many steps; 0 means
	// no limit.
	MaxSteps int
	// Horizon is the number of times neighbourhood search restarts after
	// a stall when ctx has no deadline (with a deadline it restarts until
	// the deadline, see lns_restart.go); 0 means none: it stops at the
	// first stall. Runs that end by themselves stay reproducible, so
	// tests use it to exercise restarts without long timers.
	Horizon int
	// LocalShare is the share of the time left that each local-search run
	// (package improve) takes when ctx has a deadline; 0 means
	// DefaultLocalShare, less with several LocalWorkers (defaultShare), negative
	// skips local search.
	LocalShare float64
	// LocalWorkers is the number of goroutines (cores) each local-search
	// run uses (improve.Options.Workers); 0 means 1. With more than one the
	// same seed no longer gives the same result.
	LocalWorkers int
	// Progress, when set, is called with the state of the search after each
	// improvement and about every ProgressEvery while searching.
	Progress      func(Progress)
	ProgressEvery time.Duration // 0 means 250 ms

	share *share // the portfolio's board (portfolio_share.go); nil alone
	// noFloor starts the bound at zero instead of timetable.CountingBound
	// (tests that need the search to go on past a cost the count proves).
	noFloor bool
	// floor is timetable.CountingBound of the term, counted once for all
	// portfolio members; nil counts it in Optimize.
	floor *timetable.CostReport
}

// Defaults of OptimizeOptions.
const (
	DefaultGlobalConflicts = 200_000
	DefaultStepConflicts   = 2_000
	DefaultMaxStall        = 400
	GlobalWeakLimit        = 30_000
)

// Progress is a snapshot of an optimisation in progress.
type Progress struct {
	Elapsed time.Duration
	Phase   string  // "first timetable", "whole term", "local search" or "neighbourhoods"
	Levels  []int   // priority levels, highest first
	Cost    []int64 // cost per level of the best verified timetable (in local search: of its best timetable so far, verified when the run ends); nil before the first
	Bound   []int64 // proven lower bound per level
	Steps   int     // neighbourhood steps so far
	Found   int     // verified timetables that improved on the best so far
}

// OptimizeResult is the outcome of Optimize: the Result fields of Solve
// for the best timetable found, and its quality.
type OptimizeResult struct {
	Result
	// Cost is timetable.Cost of Schedule (with Keep): the reported
	// objective, criterion by criterion.
	Cost   timetable.CostReport
	Levels []int   // the levels of Cost, highest first
	Total  []int64 // Cost.ByLevel per level of Levels
	// Bound is a lower bound per level of Levels, read lexicographically:
	// no timetable has a cost vector below it.
	Bound []int64
	// Proven says Total equals Bound: no timetable is better.
	Proven bool
	// TimeProven says the engine's part of the cost (every criterion but
	// the room-dependent ones, see TimeCost) equals Bound: no timetable is
	// better on those criteria. The room-dependent part is improved by
	// local search and is not proven.
	TimeProven bool
	// EngineCost is the engine's weak-constraint cost of the best model
	// per criterion (indexed like timetable.Criteria); it equals TimeCost
	// of Schedule (the third gate).
	EngineCost []int64
	Kept       bool       // Keep was given
	Moves      []Move     // with Keep: meetings whose start or room changed, and new or dropped meetings
	History    []Progress // one entry per improvement
	Steps      int        // neighbourhood steps run
	Local      LocalStats // the local-search phase
	Restarts   int        // restarts of neighbourhood search after it stalled (lns_restart.go)
	Adopted    int        // better timetables of other portfolio members adopted (portfolio_share.go)
	Stopped    string     // why the search ended: "optimal", "time limit", "interrupted", "conflict budget", "step limit", "no improvement"
}

// Optimize compiles the term with its soft criteria and searches for the
// best timetable: first a verified timetable, then model-improving search
// with core-guided lower bounds on the whole term (solver.Optimize, within
// GlobalConflicts), then, unless that proved the optimum, local search on
// the timetable itself (package improve; see LocalShare) and
// large-neighbourhood search (Shaw 1998) in turns: in a neighbourhood step
// most sections stay where the incumbent has them while a neighbourhood of
// related sections is re-optimised within StepConflicts; improvements are
// kept and the neighbourhood size adapts. With a deadline the turns go on
// until it, Ctrl-C or a proof of optimality: when neighbourhood search
// stalls it restarts from the incumbent with larger, perturbed
// neighbourhoods (lns_restart.go) instead of stopping.
//
// Every timetable it keeps has passed solver.Verify, Decode, room
// improvement, timetable.Check and the third gate (the engine's cost of
// the model equals timetable.Cost without rooms); Schedule is always the
// best such timetable, so a cancelled ctx (time limit, Ctrl-C) still
// returns the best verified timetable found so far, with Status
// Satisfiable. Status is Unsatisfiable when no timetable exists, Unknown
// when ctx ended before the first one.
//
// Determinism: the same term, options and seed give the same timetable
// when the run ends by itself (optimum proven, budgets, or a stall after
// Horizon restarts), because every budget counts conflicts and steps; a
// run cut short by ctx depends on how far it got. A portfolio member
// (OptimizePortfolio with more than one thread) also depends on what the
// others publish.
func Optimize(ctx context.Context, t *timetable.Term, opt OptimizeOptions) (*OptimizeResult, error) {
	if opt.StepConflicts <= 0 {
		opt.StepConflicts = DefaultStepConflicts
	}
	if opt.MaxStall == 0 {
		opt.MaxStall = DefaultMaxStall
	}
	if opt.ProgressEvery <= 0 {
		opt.ProgressEvery = 250 * time.Millisecond
	}
	o := &optRun{ctx: ctx, t: t, opt: opt, start: time.Now(), levels: termLevels(t)}
	o.res = &OptimizeResult{Levels: o.levels}
	t0 := time.Now()
	p, cat, err := Compile(t, Options{Keep: opt.Keep})
	o.res.Timings.Compile = time.Since(t0)
	if err != nil {
		return nil, err
	}
	o.p, o.cat = p, cat
	o.res.Program, o.res.Catalog = p, cat
	if why := improve.Unsupported(t); why != "" && o.opt.LocalShare >= 0 {
		// Package improve moves grid meetings and counts the grid criteria
		// only: its turns go to neighbourhood search (the phases keep their
		// shares of the time).
		o.skipLocal = true
		o.res.Local.Skipped = "local search skipped: " + why + ", which it does not model"
	}
	if o.opt.GlobalConflicts == 0 {
		o.opt.GlobalConflicts = DefaultGlobalConflicts
		if len(p.Weaks) > GlobalWeakLimit {
			o.opt.GlobalConflicts = -1
		}
	}
	o.startBound()
	eopts := solver.DefaultOptions()
	eopts.Seed = o.opt.Seed
	note := func(solver.Stats) { o.note(false) }
	o.x = NewSearch(t, p, cat, SearchOptions{Engine: eopts, Progress: note, Tally: &o.res.Result, Improve: o.bestRooms})
	o.h = NewSearch(t, p, cat, SearchOptions{Engine: firstTimetableOptions(eopts, p), Progress: note, Tally: &o.res.Result, HardOnly: true})
	if start := cat.startAtoms(opt.Start); start != nil {
		o.x.Prefer(start)
		o.h.Prefer(start)
	}
	if err := o.run(); err != nil {
		return nil, err
	}
	return o.finish(), nil
}

// termLevels lists the levels of the criteria switched on for t, highest
// first (the levels of timetable.Cost's ByLevel).
func termLevels(t *timetable.Term) []int {
	var out []int
	for _, c := range timetable.Criteria {
		if w, l := t.CriterionWeight(c.Name); w != 0 && !slices.Contains(out, l) {
			out = append(out, l)
		}
	}
	slices.Sort(out)
	slices.Reverse(out)
	return out
}

// optRun is the state of one Optimize call.
type optRun struct {
	ctx    context.Context
	t      *timetable.Term
	opt    OptimizeOptions
	p      *solver.Program
	cat    *Catalog
	x      *Search // the whole term: global search, first-timetable completion, neighbourhood steps
	h      *Search // the hard requirements only: the first timetable's search
	res    *OptimizeResult
	levels []int
	start  time.Time

	best  *candidate // best verified timetable so far, the incumbent of neighbourhood search
	local []int64    // during local search: the cost per level of its best timetable so far
	bound []int64    // proven lower bound per level of levels
	// engineBound is the part of bound the engine proved on the time part
	// of the cost, timeFloor the counting bound of the time criteria
	// (optimize_bound.go).
	engineBound, timeFloor []int64

	// In neighbourhood steps only the engine's last model of a call is
	// put through the gates (each improves on the one before).
	lastOnly bool
	pending  []solver.Atom

	uses [][]int32 // atom -> rules with the atom in their body (lns.go), built on first use
	ls   *lnsState // neighbourhood search's state, made on first use (lns.go)

	roomCache roomCache // the incumbent's sections with room cost (lns_roomhood.go)

	phase    string
	lastNote time.Time

	skipLocal bool // the term has pattern sections: no local-search runs (optimize_local.go)

	turns turnPlan    // lengths of the local-search and neighbourhood turns (optimize_turns.go)
	watch *stallWatch // during a watched turn, noted at each gain (optimize_stall.go)
}

func (o *optRun) run() error {
	o.phase = "first timetable"
	if err := o.first(); err != nil || o.best == nil {
		return err
	}
	if done, err := o.warmUp(); err != nil || done {
		return err
	}
	if err := o.wholeTerm(o.opt.GlobalConflicts); err != nil {
		return err
	}
	if o.best == nil || o.res.Proven || o.ctx.Err() != nil {
		return nil
	}
	if o.opt.MaxStall < 0 {
		o.res.Stopped = "conflict budget"
		return nil
	}
	// Local search and neighbourhood search take turns until the time
	// limit, Ctrl-C or a proof of optimality: when neighbourhood search
	// stalls with time left, local search runs again from the incumbent
	// (turnPlan.lnsOnly says when its turn passes).
	for {
		if _, err := o.fromBoard(); err != nil {
			return err
		}
		if o.finished() {
			return nil
		}
		if !o.turns.lnsOnly() {
			if err := o.localTurnRun(); err != nil {
				return err
			}
			if o.finished() {
				return nil
			}
		}
		o.phase = "neighbourhoods"
		if err := o.lnsTurnRun(); err != nil {
			return err
		}
		if _, timed := o.ctx.Deadline(); o.finished() || !timed || o.res.Stopped == "step limit" || o.opt.LocalShare < 0 {
			return nil
		}
	}
}

// Shares of the time left of the engine's turns when local search is on.
const wholeTermShare = 0.2 // the whole-term phase, after the warm-up (optimize_turns.go)

// turn limits o.ctx to share of the time left when it has a deadline and
// local search is on, and returns the function that restores it.
func (o *optRun) turn(share float64) (restore func()) {
	dl, timed := o.ctx.Deadline()
	if !timed || o.opt.LocalShare < 0 {
		return func() {}
	}
	return o.turnFor(time.Duration(share * float64(time.Until(dl))))
}

// turnFor limits o.ctx to d from now and returns the function that
// restores it.
func (o *optRun) turnFor(d time.Duration) (restore func()) {
	ctx, cancel := context.WithTimeout(o.ctx, d)
	restoreCtx := o.within(ctx)
	return func() {
		cancel()
		restoreCtx()
	}
}

// within makes ctx, derived from o.ctx, the context of the phases that
// follow, and returns the function that puts o.ctx back.
func (o *optRun) within(ctx context.Context) (restore func()) {
	outer := o.ctx
	o.ctx = ctx
	return func() { o.ctx = outer }
}

// finished reports that the search must end: ctx ended (Stopped says why)
// or the incumbent meets the bound.
func (o *optRun) finished() bool {
	switch {
	case o.ctx.Err() != nil:
		o.res.Stopped = o.ctxStopped()
		return true
	case slices.Equal(o.best.total, o.bound):
		o.res.Stopped = "optimal"
		return true
	}
	return false
}

// wholeTerm runs, unless budget is negative, model-improving search with
// core-guided lower bounds on the whole term until the optimum is proven,
// budget conflicts are spent or its turn (wholeTermShare of the time left)
// ends. Room problems found on the way are added to the program and the
// search resumes.
func (o *optRun) wholeTerm(budget int64) error {
	if budget < 0 {
		return nil
	}
	o.phase = "whole term"
	o.note(true)
	defer o.turn(wholeTermShare)()
	if dl, timed := o.ctx.Deadline(); timed && o.turns.warmed {
		// After the warm-up the incumbent comes from local search, which
		// the engine's models seldom beat: the phase is mostly for its
		// bound, kept when the watch ends it.
		ctx, w, stop := watchStall(o.ctx, wholeTermStalled(time.Until(dl)))
		restore := o.within(ctx)
		o.watch = w
		defer func() {
			stop()
			restore()
			o.watch = nil
		}()
	}
	for round := 0; round < 1000; round++ {
		if o.ctx.Err() != nil {
			o.res.Stopped = o.ctxStopped()
			return nil
		}
		spent := o.res.Engine.Conflicts
		st, complete, err := o.x.Improve(o.ctx, nil, nil, budget, 0, o.onModel)
		if err != nil {
			return err
		}
		if !complete {
			if o.ctx.Err() == nil {
				budget = max(budget-(o.res.Engine.Conflicts-spent), 1)
				continue // room problems were added: search again
			}
			// The cores found before the turn ended still bound the cost.
			o.readBound()
			o.res.Stopped = o.ctxStopped()
			return nil
		}
		if st == solver.Satisfiable {
			o.readBound()
		}
		if o.res.Proven {
			o.res.Stopped = "optimal"
		}
		return nil
	}
	return errors.New("internal error: room assignment keeps failing after 1000 rounds")
}

// readBound takes the engine's lower bound after a complete call on the
// whole term: the time part of the cost is at least the engine's bound,
// and the room part is never negative.
func (o *optRun) readBound() {
	lb := o.x.s.LowerBound()
	for i, l := range o.x.s.Levels() {
		if k := slices.Index(o.levels, l); k >= 0 && i < len(lb) {
			o.bound[k] = max(o.bound[k], lb[i])
			o.engineBound[k] = max(o.engineBound[k], lb[i])
		}
	}
	o.res.Proven = o.best != nil && slices.Equal(o.best.total, o.bound)
	o.publishedBound()
}

// note reports progress when it is due (or always, when forced).
func (o *optRun) note(force bool) {
	if o.opt.Progress == nil {
		return
	}
	now := time.Now()
	if !force && now.Sub(o.lastNote) < o.opt.ProgressEvery {
		return
	}
	o.lastNote = now
	o.opt.Progress(o.snapshot())
}

func (o *optRun) snapshot() Progress {
	pr := Progress{Elapsed: time.Since(o.start), Phase: o.phase, Levels: o.levels,
		Bound: slices.Clone(o.bound), Steps: o.res.Steps, Found: len(o.res.History)}
	if o.best != nil {
		pr.Cost = slices.Clone(o.best.total)
	}
	if o.local != nil {
		pr.Cost = slices.Clone(o.local)
	}
	return pr
}

// finish fills the result from the best timetable.
func (o *optRun) finish() *OptimizeResult {
	res := o.res
	res.Size = o.cat.Stats(o.p)
	if o.best == nil {
		if res.Status == solver.Satisfiable {
			res.Status = solver.Unknown
		}
		return res
	}
	res.Status = solver.Satisfiable
	res.Schedule = o.best.sched
	res.Cost = o.best.cost
	res.Total = o.best.total
	res.EngineCost = o.best.engine
	res.Bound = o.bound
	res.Proven = slices.Equal(res.Total, res.Bound)
	res.TimeProven = slices.Equal(o.best.time, o.timeBound())
	if res.Proven {
		res.Stopped = "optimal"
	}
	if o.opt.Keep != nil {
		res.Kept = true
		res.Moves = Moves(o.t, o.opt.Keep, res.Schedule)
	}
	return res
}

// ctxStopped names why ctx ended: "time limit" for a deadline, else
// "interrupted".
func (o *optRun) ctxStopped() string {
	if errors.Is(o.ctx.Err(), context.DeadlineExceeded) {
		return "time limit"
	}
	return "interrupted"
}
