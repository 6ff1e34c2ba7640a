package improve

import (
	"math"
	"sync"
	"sync/atomic"

	"github.com/termwright/termwright/timetable"
)

// Several workers on one annealing run (Options.Workers > 1). Each worker
// holds its own copy of the State (a replica) and draws and costs moves on
// it; an accepted move is kept only when its worker had already applied
// every move the others kept before, and is then sent, with the rooms it
// chose, to the others, which apply it before they draw their next move.
// So every replica goes through the same timetables in the same order,
// and two workers cost about twice as many moves per temperature: most
// moves are refused at the low temperatures where annealing spends its
// time, and a refused move needs no sending (the speculative, synchronous
// scheme of parallel annealing; for the idea see Greening 1990, "Parallel
// simulated annealing techniques", Physica D 42). The first worker (the
// leader) owns the temperature, the cooling plan, the best timetable and
// every reheat; the others (helpers) anneal at the leader's temperature.
// A replica never holds an illegal timetable or a wrong running cost,
// whatever the others send: apply refuses a move its replica cannot take
// and leaves the replica as it was (counted in Stats.Resyncs, after which
// the leader sends its timetable to all).

// maxBacklog is the number of moves a helper may keep before the leader
// has applied them: beyond it the helper waits, so that a leader slowed
// down (by the machine, or a test hook) is not buried in moves, and a
// waiting helper leaves its core to the leader.
const maxBacklog = 64

// team is what the workers of one run share.
type team struct {
	mu      sync.Mutex
	boxes   []inbox         // per worker: what the others kept since it last looked
	pending []atomic.Int32  // per worker: len(boxes[i].ends), or 1 for a reset, readable without mu
	temp    atomic.Uint64   // the leader's temperature (float64 bits)
	stop    atomic.Bool     // the leader has finished
	resync  atomic.Bool     // a helper could not apply a move: the leader sends its timetable
	stale   atomic.Int64    // accepted moves refused because another worker's came first
	wake    []chan struct{} // per helper: the leader has taken its inbox (one token at most)
	done    chan struct{}   // closed when the leader has finished
	wg      sync.WaitGroup
	helpers []*annealer
}

// inbox holds moves another worker kept, in order, with their rooms: move
// k is chs[ends[k-1]:ends[k]]. reset, when set, is a timetable to move to
// before them.
type inbox struct {
	chs   []change
	ends  []int
	reset *timetable.Schedule
}

// newTeam builds the helpers of a: workers-1 replicas of the start, each
// with its own random stream.
func newTeam(a *annealer, t *timetable.Term, s, kept *timetable.Schedule, workers int) (*team, error) {
	tm := &team{boxes: make([]inbox, workers), pending: make([]atomic.Int32, workers), wake: make([]chan struct{}, workers), done: make(chan struct{})}
	for i := range tm.wake {
		tm.wake[i] = make(chan struct{}, 1)
	}
	for i := 1; i < workers; i++ {
		x, err := New(t, s, kept)
		if err != nil {
			return nil, err
		}
		o := a.opts
		o.Seed = a.opts.Seed + uint64(i)*0x9e3779b9
		o.OnBest, o.onAccept = nil, nil
		h := newAnnealer(x, o)
		h.id, h.team = i, tm
		x.levelCosts(&x.cur, h.curCost)
		tm.helpers = append(tm.helpers, h)
	}
	a.team = tm
	return tm, nil
}

// start runs the helpers until finish.
func (tm *team) start() {
	for _, h := range tm.helpers {
		tm.wg.Add(1)
		go h.help()
	}
}

// finish stops the helpers and adds their counts to the leader's stats.
func (tm *team) finish(st *Stats) {
	tm.stop.Store(true)
	close(tm.done)
	tm.wg.Wait()
	for _, h := range tm.helpers {
		st.Tried += h.st.Tried
		st.Legal += h.st.Legal
		st.Accepted += h.st.Accepted
		for k := range h.kinds {
			st.ByKind[moveNames[k]] = addMoves(st.ByKind[moveNames[k]], h.kinds[k])
		}
	}
	st.Workers = 1 + len(tm.helpers)
	st.Stale = tm.stale.Load()
}

// addMoves sums the counts of two move kinds.
func addMoves(a, b MoveStats) MoveStats {
	return MoveStats{Tried: a.Tried + b.Tried, Legal: a.Legal + b.Legal, Accepted: a.Accepted + b.Accepted}
}

// setTemp sets the annealing temperature, and the helpers' with it.
func (a *annealer) setTemp(v float64) {
	a.temp = v
	if a.team != nil {
		a.team.temp.Store(math.Float64bits(v))
	}
}

// post sends worker i's accepted move (its changes, now placed in x) to
// the others, and reports whether it may be kept: only when i has applied
// every move the others kept before it.
func (tm *team) post(i int, x *State, chs []change) bool {
	tm.mu.Lock()
	defer tm.mu.Unlock()
	if tm.pending[i].Load() > 0 {
		tm.stale.Add(1)
		return false
	}
	for j := range tm.boxes {
		if j == i {
			continue
		}
		b := &tm.boxes[j]
		for _, ch := range chs {
			b.chs = append(b.chs, change{ch.m, x.mt[ch.m].p, x.mt[ch.m].r})
		}
		b.ends = append(b.ends, len(b.chs))
		tm.pending[j].Add(1)
	}
	return true
}

// reset sends the leader's timetable s to every helper in place of what
// they have not applied yet, and drops what the leader has not applied
// (its replica moves to s, or is s).
func (tm *team) reset(s *timetable.Schedule) {
	tm.mu.Lock()
	defer tm.mu.Unlock()
	for j := range tm.boxes {
		b := &tm.boxes[j]
		b.chs, b.ends, b.reset = b.chs[:0], b.ends[:0], nil
		tm.pending[j].Store(0)
		if j > 0 {
			b.reset = s
			tm.pending[j].Store(1)
		}
	}
}

// take moves worker i's inbox into mine (emptied first), so that applying
// it needs no lock.
func (tm *team) take(i int, mine *inbox) {
	tm.mu.Lock()
	defer tm.mu.Unlock()
	b := &tm.boxes[i]
	mine.chs = append(mine.chs[:0], b.chs...)
	mine.ends = append(mine.ends[:0], b.ends...)
	mine.reset = b.reset
	b.chs, b.ends, b.reset = b.chs[:0], b.ends[:0], nil
	tm.pending[i].Store(0)
	if i == 0 {
		for _, w := range tm.wake[1:] {
			select {
			case w <- struct{}{}:
			default:
			}
		}
	}
}

// catchUp applies what the other workers kept since this worker last
// looked. The leader records each as it records its own accepted moves;
// it counts them in acc, the moves accepted at this temperature.
func (a *annealer) catchUp(acc *int) {
	tm, x := a.team, a.x
	tm.take(a.id, &a.in)
	if a.in.reset != nil {
		x.restore(a.in.reset)
	}
	from := 0
	for _, end := range a.in.ends {
		ok := x.apply(a.in.chs[from:end], a.rng, nil)
		from = end
		if !ok {
			a.st.Resyncs++
			if a.id == 0 {
				tm.reset(x.Schedule())
			} else {
				tm.resync.Store(true)
			}
			break
		}
		if a.id == 0 {
			a.st.Shared++
			*acc++
			a.moved()
		}
	}
	if a.id != 0 {
		x.levelCosts(&x.cur, a.curCost)
	}
	if a.id == 0 && tm.resync.Swap(false) {
		tm.reset(x.Schedule())
	}
}

// help is a helper's loop: draw and cost moves at the leader's
// temperature, send the accepted ones, apply the others', until the
// leader finishes.
func (a *annealer) help() {
	tm, x := a.team, a.x
	defer tm.wg.Done()
	var acc int
	for !tm.stop.Load() {
		if tm.pending[a.id].Load() > 0 {
			a.catchUp(&acc)
		}
		if tm.pending[0].Load() > maxBacklog {
			// The leader is behind: wait until it has taken its inbox.
			select {
			case <-tm.wake[a.id]:
			case <-tm.done:
			}
			continue
		}
		a.temp = math.Float64frombits(tm.temp.Load())
		if a.try() {
			x.levelCosts(&x.cur, a.curCost)
		}
	}
}
