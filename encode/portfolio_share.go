package encode

import (
	"context"
	"errors"
	"slices"
	"sync"

	"github.com/termwright/termwright/timetable"
)

// Sharing in a portfolio. The members of OptimizePortfolio publish every
// new best verified timetable and every better proven lower bound on one
// board while they run. A member whose neighbourhood search has stalled
// for shareStall steps, every shareEvery steps, and before each new turn,
// adopts the board's timetable when it is better than its own incumbent: the
// timetable's places are assumed in the member's own engine (each member
// has its own program, which its own room cuts have grown), and the model
// goes through every gate again before it becomes the member's incumbent
// (a warm start, see optimize_start.go). Bounds are taken over without a
// check: every member solves the same problem, so a bound one proves holds
// for all. When a timetable meets the best bound the board cancels the
// whole portfolio: the optimum is proven. A portfolio of one has no board,
// so one-thread runs stay reproducible.

// A member looks at the board after shareStall neighbourhood steps in a
// row without improvement, and every shareEvery steps in any case (on
// large terms steps improve often, and a member that never stalls would
// otherwise never catch up with a better one).
const (
	shareStall = 5
	shareEvery = 8
)

// shareBoard is what the members of one portfolio share.
type shareBoard struct {
	mu      sync.Mutex
	version int                 // bumped on every new timetable
	sched   *timetable.Schedule // best timetable published (verified by its member)
	total   []int64             // its cost per level
	member  int                 // the member that published it
	bound   []int64             // best proven lower bound per level, nil before any
	stop    context.CancelFunc  // cancels every member: the optimum is proven
}

// publish offers a member's new best timetable; the board keeps it when it
// is cheaper than the board's.
func (b *shareBoard) publish(member int, s *timetable.Schedule, total []int64) {
	b.mu.Lock()
	defer b.mu.Unlock()
	if b.total != nil && slices.Compare(total, b.total) >= 0 {
		return
	}
	b.sched, b.total, b.member = s, slices.Clone(total), member
	b.version++
	b.checkProven()
}

// publishBound offers a member's proven lower bound.
func (b *shareBoard) publishBound(bound []int64) {
	b.mu.Lock()
	defer b.mu.Unlock()
	if b.bound == nil || slices.Compare(bound, b.bound) > 0 {
		b.bound = slices.Clone(bound)
		b.checkProven()
	}
}

// checkProven stops the portfolio when the best timetable meets the best
// bound. Called with b.mu held.
func (b *shareBoard) checkProven() {
	if b.total != nil && b.bound != nil && slices.Equal(b.total, b.bound) && b.stop != nil {
		b.stop()
	}
}

// offer returns the board's timetable when it is cheaper than total and
// newer than version seen (from another member), with the board's
// version and bound.
func (b *shareBoard) offer(member, seen int, total []int64) (s *timetable.Schedule, version int, bound []int64) {
	b.mu.Lock()
	defer b.mu.Unlock()
	bound = slices.Clone(b.bound)
	if b.version == seen || b.member == member || b.total == nil || slices.Compare(b.total, total) >= 0 {
		return nil, b.version, bound
	}
	// A copy: the members' timetables are never shared between goroutines.
	cp := &timetable.Schedule{Placements: slices.Clone(b.sched.Placements), Enrolments: slices.Clone(b.sched.Enrolments)}
	return cp, b.version, bound
}

// share is one member's link to the board.
type share struct {
	board  *shareBoard
	member int
	seen   int // board version last looked at
}

// published tells the board about a new incumbent (accept calls it).
func (o *optRun) published(c *candidate) {
	if o.opt.share != nil {
		o.opt.share.board.publish(o.opt.share.member, c.sched, c.total)
	}
}

// publishedBound tells the board about the member's proven bound.
func (o *optRun) publishedBound() {
	if o.opt.share != nil {
		o.opt.share.board.publishBound(o.bound)
	}
}

// fromBoard takes the board's bound when it is better, and adopts the
// board's timetable when it is better than the incumbent. It reports
// whether the incumbent changed.
func (o *optRun) fromBoard() (bool, error) {
	sh := o.opt.share
	if sh == nil || o.best == nil {
		return false, nil
	}
	s, version, bound := sh.board.offer(sh.member, sh.seen, o.best.total)
	sh.seen = version
	if len(bound) == len(o.bound) && slices.Compare(bound, o.bound) > 0 {
		o.bound = maxPerLevel(o.bound, bound)
	}
	if s == nil {
		return false, nil
	}
	c, err := o.adoptShared(s)
	if errors.Is(err, errNotAdopted) || c == nil {
		return false, nil
	}
	if err != nil {
		return false, err
	}
	if slices.Compare(c.total, o.best.total) >= 0 {
		return false, nil
	}
	o.res.Adopted++
	o.accept(c)
	return true, nil
}

// adoptShared makes another member's timetable a candidate of this run:
// with its own rooms when its starts are a model of this member's program
// (adopt), else, on terms with pattern sections, by assuming its decisions
// and putting the engine's model through the gates.
func (o *optRun) adoptShared(s *timetable.Schedule) (*candidate, error) {
	c, err := o.adopt(s)
	if err == nil || !errors.Is(err, errNotAdopted) || !o.cat.hasPatterns() {
		return c, err
	}
	return o.completeStarts(s)
}
