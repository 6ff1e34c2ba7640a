package encode

import (
	"context"
	"slices"
	"sync"

	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// portfolioSeed is the seed of member i of a portfolio started from seed:
// member 0 keeps the caller's seed, so a portfolio of one is the plain run.
func portfolioSeed(seed int64, i int) int64 {
	if seed == 0 {
		seed = 1
	}
	return seed + int64(i)*7919
}

// SolvePortfolio runs threads copies of Solve with different seeds (so
// different branching tie-breaks, phases and restart points) on all
// cores; the first timetable that passes both gates wins and the other
// searches are cancelled. An Unsatisfiable answer from any member is final
// too (every member solves the same program). threads <= 1 is Solve.
func SolvePortfolio(ctx context.Context, t *timetable.Term, opt SolveOptions, threads int) (*Result, error) {
	if threads <= 1 {
		return Solve(ctx, t, opt)
	}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	type answer struct {
		res *Result
		err error
	}
	out := make(chan answer, threads)
	for i := 0; i < threads; i++ {
		o := opt
		o.Seed = portfolioSeed(opt.Seed, i)
		go func() {
			r, err := Solve(ctx, t, o)
			out <- answer{r, err}
		}()
	}
	var best answer
	for i := 0; i < threads; i++ {
		a := <-out
		decided := a.err == nil && (a.res.Status == solver.Satisfiable || a.res.Status == solver.Unsatisfiable && !a.res.Incomplete)
		if decided {
			cancel()
			// Drain the rest in the background; they stop promptly.
			go func(left int) {
				for ; left > 0; left-- {
					<-out
				}
			}(threads - i - 1)
			return a.res, nil
		}
		if best.res == nil && best.err == nil || best.err != nil && a.err == nil {
			best = a
		}
	}
	return best.res, best.err
}

// OptimizePortfolio runs Optimize on threads cores until ctx ends or each
// member stops by itself, and returns the best verified timetable found
// (lowest cost, compared level by level from the highest). The lower
// bound returned is the best proven by any member. threads <= 1 is
// Optimize.
//
// Where local search runs (and LocalWorkers is 0), two of the cores go to
// the first member's annealing, which costs moves on both
// (improve.Options.Workers), and each further core to a member with
// another seed (portfolioMembers): one annealer on two cores reaches a
// cost sooner than two annealers on one core each, because annealing's
// quality comes from the moves costed in its cooling plan. Otherwise
// every core runs a member.
//
// Members share their best timetables and bounds while they run
// (portfolio_share.go): a stalled member adopts a better timetable of
// another, and the portfolio stops as soon as a timetable meets the best
// proven bound. The best is chosen when all have stopped. Each member
// holds its own program and engine, so memory grows with threads.
func OptimizePortfolio(ctx context.Context, t *timetable.Term, opt OptimizeOptions, threads int) (*OptimizeResult, error) {
	if threads <= 1 {
		return Optimize(ctx, t, opt)
	}
	members, workers := portfolioMembers(t, opt, threads)
	if members == 1 {
		o := opt
		o.LocalWorkers = workers
		return Optimize(ctx, t, o)
	}
	ctx, cancel := context.WithCancel(ctx)
	defer cancel()
	board := &shareBoard{stop: cancel}
	floor := timetable.CountingBound(t, opt.Keep) // the same for every member
	results := make([]*OptimizeResult, members)
	errs := make([]error, members)
	var wg sync.WaitGroup
	var mu sync.Mutex
	for i := 0; i < members; i++ {
		o := opt
		o.Seed = portfolioSeed(opt.Seed, i)
		o.LocalShare = memberLocalShare(opt.LocalShare, i)
		if i == 0 {
			o.LocalWorkers = workers
		}
		o.share = &share{board: board, member: i}
		o.floor = &floor
		if opt.Progress != nil && i > 0 {
			o.Progress = nil // one progress display
		}
		if opt.Progress != nil && i == 0 {
			o.Progress = func(p Progress) { mu.Lock(); defer mu.Unlock(); opt.Progress(p) }
		}
		wg.Add(1)
		go func(i int) {
			defer wg.Done()
			results[i], errs[i] = Optimize(ctx, t, o)
		}(i)
	}
	wg.Wait()
	return pickPortfolio(results, errs)
}

// portfolioMembers splits threads cores between members and the first
// member's local-search workers: two workers and threads-1 members when
// local search runs on t and opt leaves LocalWorkers to the portfolio,
// else threads members with opt's workers.
func portfolioMembers(t *timetable.Term, opt OptimizeOptions, threads int) (members, workers int) {
	if opt.LocalWorkers != 0 || opt.LocalShare < 0 || improve.Unsupported(t) != "" {
		return threads, opt.LocalWorkers
	}
	return threads - 1, 2
}

// memberLocalShare is the LocalShare of portfolio member i: the caller's
// when set; else member 0 takes the default, member 1 none (it is the
// engine member: the whole-term phase and neighbourhood search without
// turns, on the board's best timetables), and each further member half the
// share of the one before. Members that differ only in their seeds reach
// a cost at about the same time, because annealing's cooling plan is
// stretched over its time; splitting the phases lets the engine improve
// one member's annealed timetables while the annealer goes on from the
// engine's.
func memberLocalShare(share float64, i int) float64 {
	switch {
	case share != 0:
		return share
	case i == 1:
		return -1
	}
	return DefaultLocalShare / float64(int(1)<<min(max(i-1, 0), 8))
}

// pickPortfolio chooses the best of the members' results.
func pickPortfolio(results []*OptimizeResult, errs []error) (*OptimizeResult, error) {
	var best *OptimizeResult
	var firstErr error
	var bound []int64
	for i, r := range results {
		if errs[i] != nil {
			if firstErr == nil {
				firstErr = errs[i]
			}
			continue
		}
		if r == nil {
			continue
		}
		if r.Status == solver.Satisfiable && len(r.Bound) > 0 {
			if bound == nil || slices.Compare(r.Bound, bound) > 0 {
				bound = slices.Clone(r.Bound)
			}
		}
		if best == nil || better(r, best) {
			best = r
		}
	}
	if best == nil {
		return nil, firstErr
	}
	if best.Status == solver.Satisfiable && bound != nil && len(bound) == len(best.Bound) && slices.Compare(bound, best.Bound) > 0 {
		// A bound proven by one member holds for all: the problem is the same.
		best.Bound = bound
		best.Proven = slices.Equal(best.Total, best.Bound)
	}
	if best.Proven {
		best.Stopped = "optimal" // the members stopped because of this proof
	}
	return best, nil
}

// better reports whether a is a better portfolio answer than b: a decided
// answer beats Unknown, and of two timetables the cheaper wins.
func better(a, b *OptimizeResult) bool {
	rank := func(r *OptimizeResult) int {
		switch r.Status {
		case solver.Satisfiable:
			return 2
		case solver.Unsatisfiable:
			if !r.Incomplete {
				return 1
			}
		}
		return 0
	}
	if ra, rb := rank(a), rank(b); ra != rb {
		return ra > rb
	}
	if a.Status != solver.Satisfiable {
		return false
	}
	return slices.Compare(a.Total, b.Total) < 0
}
