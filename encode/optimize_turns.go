package encode

import "time"

// Turns of local search and neighbourhood search under a deadline.
//
// Right after the first timetable comes a warm-up, before the whole-term
// phase: up to warmUpRounds rounds of one short local-search run (a
// warmUpDivisor-th of the time left, at least minWarmUp) and one short
// neighbourhood turn, a new round only while the last neighbourhood turn
// improved the timetable. Annealing brings most terms close to their
// best within that time, and neighbourhood
// search, which re-solves times and rooms together exactly, then fixes
// what annealing leaves (typically a room-stability unit whose cure needs
// a new time), so a small term is often proven optimal (cost at its bound)
// within seconds instead of after the whole-term phase and a long
// annealing run. The later local-search runs take LocalShare of the time
// left: annealing needs long cooling plans for quality. Each neighbourhood
// turn takes lnsTurnRatio of the local run before it (at least
// minLNSTurn), at most half the time left. Every turn boundary is also a
// point where a portfolio member takes a better timetable from the board.
const (
	warmUpDivisor = 32
	warmUpRounds  = 3
	minWarmUp     = time.Second
	lnsTurnRatio  = 0.35
	minLNSTurn    = 500 * time.Millisecond
)

// turnPlan is the state of the turn schedule.
type turnPlan struct {
	warm      bool          // a warm-up round's local-search run is next
	warmed    bool          // the warm-up ran
	first     time.Duration // length of a warm-up round's local-search run
	lastLocal time.Duration // time the last local-search run took
	timed     bool          // the search has a deadline
	ranLocal  bool          // a local-search run has run
	localGain bool          // the last local-search run improved the incumbent
	lnsGain   bool          // the last neighbourhood turn improved the incumbent
}

// warmUp runs the warm-up rounds when ctx has a deadline and both local
// search and neighbourhood search are on. done reports that the search
// must end (a proof of optimality, or ctx ended).
func (o *optRun) warmUp() (done bool, err error) {
	_, timed := o.ctx.Deadline()
	if !timed || o.opt.LocalShare < 0 || o.opt.MaxStall < 0 || o.skipLocal {
		return false, nil
	}
	o.turns.warmed = true
	for round := 0; round < warmUpRounds; round++ {
		if !o.turns.lnsOnly() {
			o.turns.warm = true
			if err := o.localTurnRun(); err != nil || o.finished() {
				return true, err
			}
		}
		o.phase = "neighbourhoods"
		if err := o.lnsTurnRun(); err != nil || o.finished() {
			return true, err
		}
		if !o.turns.lnsGain {
			break // nothing left that neighbourhood search finds quickly
		}
	}
	return false, nil
}

// lnsOnly says that local search passes its turn: its last run did not
// improve the incumbent and the neighbourhood turn after it did, so
// neighbourhood search goes on (annealing gets its turn back as soon as a
// neighbourhood turn brings nothing). Only under a deadline: runs without
// one keep their fixed order.
func (p *turnPlan) lnsOnly() bool {
	return p.timed && p.ranLocal && !p.localGain && p.lnsGain
}

// localTurnRun runs one local-search run and notes whether it improved
// the incumbent.
func (o *optRun) localTurnRun() error {
	before := o.best
	err := o.localSearch()
	_, o.turns.timed = o.ctx.Deadline()
	o.turns.ranLocal = true
	o.turns.localGain = o.best != before
	return err
}

// lnsTurnRun runs one neighbourhood turn and notes whether it improved the
// incumbent.
func (o *optRun) lnsTurnRun() error {
	before := o.best
	err := o.lnsTurn()
	o.turns.lnsGain = o.best != before
	return err
}

// localTurn is the length of the next local-search run when ctx has a
// deadline: share of the time left, or a warm-up round's short run.
func (o *optRun) localTurn(share float64) time.Duration {
	dl, _ := o.ctx.Deadline()
	left := time.Until(dl)
	d := time.Duration(share * float64(left))
	if o.turns.warm {
		o.turns.warm = false
		if o.turns.first == 0 {
			o.turns.first = max(minWarmUp, left/warmUpDivisor)
		}
		d = min(d, o.turns.first)
	}
	return d
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
	defer o.turnFor(d)()
	return o.lns()
}
