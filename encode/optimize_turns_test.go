package encode

import (
	"context"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestMemberLocalShare(t *testing.T) {
	for _, c := range []struct {
		share  float64
		member int
		want   float64
	}{
		{0, 0, DefaultLocalShare},
		{0, 1, -1}, // the engine member
		{0, 2, DefaultLocalShare / 2},
		{0, 3, DefaultLocalShare / 4},
		{0.5, 3, 0.5}, // the caller's share holds for every member
		{-1, 1, -1},   // local search off stays off
	} {
		assert.Equal(t, c.want, memberLocalShare(c.share, c.member), "share %v member %d", c.share, c.member)
	}
}

// The local-search turns: a warm-up round's run is short, the runs after
// it take their share of the time left.
func TestLocalTurn(t *testing.T) {
	ctx, cancel := context.WithTimeout(context.Background(), 64*time.Second)
	defer cancel()
	o := &optRun{ctx: ctx, res: &OptimizeResult{}}
	o.turns.warm = true
	warm := o.localTurn(0.7)
	assert.InDelta(t, 2*time.Second, warm, float64(100*time.Millisecond), "a 32nd of the time left")
	assert.False(t, o.turns.warm)
	o.turns.warm = true
	assert.Equal(t, warm, o.localTurn(0.7), "every warm-up round runs as long")
	assert.InDelta(t, 0.7*64*float64(time.Second), float64(o.localTurn(0.7)), float64(100*time.Millisecond))

	short, cancel2 := context.WithTimeout(context.Background(), 4*time.Second)
	defer cancel2()
	o = &optRun{ctx: short, res: &OptimizeResult{}}
	o.turns.warm = true
	assert.InDelta(t, minWarmUp, o.localTurn(0.7), float64(100*time.Millisecond), "at least minWarmUp")
	o.turns.warm = true
	o.turns.first = 0
	assert.LessOrEqual(t, o.localTurn(0.1), time.Duration(0.1*4*float64(time.Second)), "never beyond the share")
}

func TestWholeTermStalled(t *testing.T) {
	rule := wholeTermStalled(20 * time.Second) // a quarter: 5 s without a gain
	assert.False(t, rule(4*time.Second, 0))
	assert.True(t, rule(6*time.Second, 0))
	assert.False(t, rule(9*time.Second, 5*time.Second))
	assert.True(t, rule(11*time.Second, 5*time.Second))
	short := wholeTermStalled(2 * time.Second) // never under minStall
	assert.False(t, short(900*time.Millisecond, 0))
	assert.True(t, short(1100*time.Millisecond, 0))
}

// The watch cancels its context once its rule says so, and a gain is seen
// by the rule.
func TestWatchStall(t *testing.T) {
	ctx, w, stop := watchStall(context.Background(), func(_, last time.Duration) bool { return last > 0 })
	defer stop()
	require.NoError(t, ctx.Err(), "no gain yet: the rule holds it open")
	w.gain()
	<-ctx.Done() // the rule now says stalled; the watch must cancel
	assert.ErrorIs(t, ctx.Err(), context.Canceled)

	parent, cancel := context.WithCancel(context.Background())
	ctx, _, stop = watchStall(parent, func(time.Duration, time.Duration) bool { return false })
	defer stop()
	cancel()
	<-ctx.Done() // the parent ends it too
	var nilWatch *stallWatch
	nilWatch.gain() // outside a watched turn, a gain is a no-op
}

func TestLNSOnly(t *testing.T) {
	for _, c := range []struct {
		p    turnPlan
		want bool
	}{
		{turnPlan{timed: true, ranLocal: true, localGain: false, lnsGain: true}, true},
		{turnPlan{timed: true, ranLocal: true, localGain: true, lnsGain: true}, false},   // annealing still pays
		{turnPlan{timed: true, ranLocal: true, localGain: false, lnsGain: false}, false}, // neither: annealing again
		{turnPlan{timed: true, ranLocal: false, lnsGain: true}, false},                   // annealing has not run yet
		{turnPlan{timed: false, ranLocal: true, lnsGain: true}, false},                   // no deadline: the fixed order
	} {
		assert.Equal(t, c.want, c.p.lnsOnly(), "%+v", c.p)
	}
}

// A warm-up round's local-search run keeps improve's growing cycles (early
// results); every later run cools once over its whole time.
func TestLocalOptionsCycles(t *testing.T) {
	o := &optRun{res: &OptimizeResult{}, opt: OptimizeOptions{Seed: 3, LocalWorkers: 2}}
	o.turns.warm = true
	warm := o.localOptions()
	assert.Zero(t, warm.CycleShare, "warm-up: growing cycles")
	assert.Equal(t, uint64(3), warm.Seed)
	assert.Equal(t, 2, warm.Workers)
	o.turns.warm = false
	o.res.Local.Runs = 1
	long := o.localOptions()
	assert.Equal(t, longRunCycles, long.CycleShare, "after the warm-up: one cycle")
	assert.Equal(t, uint64(4), long.Seed, "each run its own stream")
}
