package encode

import (
	"context"
	"time"
)

// Turns of local search and neighbourhood search under a deadline.
//
// Right after the first timetable comes a warm-up: one short local-search
// run (a warmUpDivisor-th of the time left, at least minWarmUp) and one
// short neighbourhood turn, before the whole-term phase. Annealing brings
// most terms close to their best within that time, and neighbourhood
// search, which re-solves times and rooms together exactly, then fixes
// what annealing leaves (typically a room-stability unit whose cure needs
// a new time), so a small term is often proven optimal (cost at its bound)
// within seconds instead of after the whole-term phase and a long
// annealing run. The later local-search runs double in length from the
// first, never beyond LocalShare of the time left: annealing needs long
// cooling plans for quality, and the doubling gives them while keeping
// neighbourhood search's turns coming (a restart schedule that grows
// geometrically, as in Luby, Sinclair and Zuckerman 1993). Each neighbourhood
// turn takes lnsTurnRatio of the local run before it (at least
// minLNSTurn), at most half the time left. Every turn boundary is also a
// point where a portfolio member takes a better timetable from the board.
const (
	warmUpDivisor = 32
	minWarmUp     = time.Second
	lnsTurnRatio  = 0.35
	minLNSTurn    = 500 * time.Millisecond
)

// turnPlan is the state of the turn schedule.
type turnPlan struct {
	warmed    bool          // the warm-up ran
	first     time.Duration // length of the first local-search run
	lastLocal time.Duration // time the last local-search run took
}

// warmUp runs the warm-up turns when ctx has a deadline and both local
// search and neighbourhood search are on. done reports that the search
// must end (a proof of optimality, or ctx ended).
func (o *optRun) warmUp() (done bool, err error) {
	_, timed := o.ctx.Deadline()
	if !timed || o.opt.LocalShare < 0 || o.opt.MaxStall < 0 || o.skipLocal {
		return false, nil
	}
	o.turns.warmed = true
	if err := o.localSearch(); err != nil || o.finished() {
		return true, err
	}
	o.phase = "neighbourhoods"
	if err := o.lnsTurn(); err != nil || o.finished() {
		return true, err
	}
	return false, nil
}

// localTurn is the length of the next local-search run when ctx has a
// deadline: the warm-up's short run first, then runs that double from it,
// never more than share of the time left.
func (o *optRun) localTurn(share float64) time.Duration {
	dl, _ := o.ctx.Deadline()
	left := time.Until(dl)
	if o.turns.first == 0 {
		o.turns.first = max(minWarmUp, left/warmUpDivisor)
	}
	return min(time.Duration(share*float64(left)), o.turns.first<<min(o.res.Local.Runs, 16))
}

// lnsTurn runs neighbourhood search until it stalls or, when ctx has a
// deadline and local search is on, for its turn: lnsTurnRatio of the last
// local-search run (at least minLNSTurn), at most half the time left.
// Without local-search runs (terms of meeting patterns) the turn is half
// the time left.
func (o *optRun) lnsTurn() error {
	dl, timed := o.ctx.Deadline()
	if !timed || o.opt.LocalShare < 0 {
		return o.lns()
	}
	d := time.Until(dl) / 2
	if o.turns.lastLocal > 0 {
		d = min(d, max(minLNSTurn, time.Duration(lnsTurnRatio*float64(o.turns.lastLocal))))
	}
	outer := o.ctx
	ctx, cancel := context.WithDeadline(outer, time.Now().Add(d))
	defer func() {
		cancel()
		o.ctx = outer
	}()
	o.ctx = ctx
	return o.lns()
}
