package encode

import (
	"context"
	"sync/atomic"
	"time"
)

// stallWatch ends a turn that has stopped paying: it cancels its context
// when no gain was noted for longer than the rule allows. Gains are noted
// from the goroutine that runs the turn; the watch runs on its own.
type stallWatch struct {
	began time.Time
	last  atomic.Int64 // time of the last gain, in nanoseconds since began
}

// stallPoll is how often a watch looks at the clock.
const stallPoll = 50 * time.Millisecond

// watchStall returns ctx cancelled as soon as too(sinceBegan, lastGain)
// says the turn has stalled (both durations from the start of the turn),
// the watch whose gain method the turn calls, and the function that stops
// the watch.
func watchStall(ctx context.Context, too func(elapsed, lastGain time.Duration) bool) (context.Context, *stallWatch, func()) {
	ctx, cancel := context.WithCancel(ctx)
	w := &stallWatch{began: time.Now()}
	go func() {
		tick := time.NewTicker(stallPoll)
		defer tick.Stop()
		for {
			select {
			case <-ctx.Done():
				return
			case <-tick.C:
				if too(time.Since(w.began), time.Duration(w.last.Load())) {
					cancel()
					return
				}
			}
		}
	}()
	return ctx, w, cancel
}

// gain notes a gain now.
func (w *stallWatch) gain() {
	if w != nil {
		w.last.Store(int64(time.Since(w.began)))
	}
}

// Stall rules.
const (
	// minStall is the least time any turn is given without a gain.
	minStall = time.Second
	// wholeTermStallShare: after the warm-up, the whole-term phase ends
	// when it has not improved the incumbent for this share of its turn
	// (at least minStall); its lower bound is kept.
	wholeTermStallShare = 0.25
)

// wholeTermStalled returns the rule of the whole-term phase with a turn
// of length turn.
func wholeTermStalled(turn time.Duration) func(elapsed, lastGain time.Duration) bool {
	limit := max(minStall, time.Duration(wholeTermStallShare*float64(turn)))
	return func(elapsed, lastGain time.Duration) bool { return elapsed-lastGain > limit }
}
