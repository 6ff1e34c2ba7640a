package improve

import (
	"context"
	"errors"
	"math"
	"math/rand/v2"
	"slices"
	"time"

	"github.com/termwright/termwright/timetable"
)

// Options control Run. The zero value is usable: every zero field takes
// the default its comment gives.
type Options struct {
	// Seed seeds the move choice; the same seed, term, schedule and
	// MaxMoves give the same result. 0 means 1.
	Seed uint64
	// InitialTemp is the starting temperature in cost units of the level
	// being annealed; 0 means measured: the mean worsening of up to 500
	// sampled legal moves.
	InitialTemp float64
	// MinTemp ends a cooling cycle; 0 means InitialTemp/1000 (at least 0.01).
	MinTemp float64
	// Cooling multiplies the temperature after each StepsPerTemp moves;
	// 0 means 0.97. It must lie in (0, 1).
	Cooling float64
	// StepsPerTemp is the number of moves tried at one temperature. 0
	// means planned: when ctx has a deadline or MaxMoves is set, each
	// cooling cycle is stretched to take its planned part of the budget
	// (measured move rate times time left, or moves left), re-planned at
	// every temperature; otherwise 10 per meeting whose time may change,
	// at least 1,000.
	StepsPerTemp int
	// CycleShare, when set, plans every cooling cycle to take this share
	// of the budget left (StepsPerTemp 0 only). 0 means growing cycles:
	// the last planned cycle takes 0.6 of the whole budget and each one
	// before it a third of the next, down to a first one of 0.1% of the
	// budget (or 200 moves per meeting whose time may change), so that the
	// first results come fast and the long cycle gives quality; cycles
	// after the plan take 0.6 of what is left. It must lie in (0, 1].
	CycleShare float64
	// AcceptShare ends a temperature early once this share of its
	// StepsPerTemp moves has been accepted (the cut-off on accepted
	// neighbours of Bellio, Ceschia, Di Gaspero, Schaerf 2016), so that hot
	// temperatures, where most moves are accepted, take few moves and the
	// planned budget goes to the cold ones; 0 means 0.1. It must lie in
	// (0, 1]; 1 never ends a temperature early.
	AcceptShare float64
	// MaxMoves stops the search after this many tried moves (for
	// reproducible runs and tests); 0 means only ctx stops it.
	MaxMoves int64
	// OnBest, when set, is called with each new best timetable and its
	// running cost (Per* maps nil). The schedule is the caller's to keep.
	OnBest func(s *timetable.Schedule, c timetable.CostReport)
	// Workers is the number of goroutines that draw and cost moves on the
	// one run (parallel.go); 0 means 1. With more than one the run uses
	// that many cores and costs more moves in its time, but the same seed
	// no longer gives the same result, and MaxMoves counts the first
	// worker's moves only.
	Workers int

	onAccept func(x *State) // test hook: called after every accepted move
}

// Stats counts the work of Run.
type Stats struct {
	Tried        int64                // moves proposed and evaluated
	Legal        int64                // of those, moves that kept every hard requirement
	Accepted     int64                // of those, moves the annealer kept
	Improvements int64                // new best timetables
	Cycles       int                  // cooling cycles begun (the first and each reheat)
	Optimal      bool                 // the best costs 0 on every level (weights all positive), so the search stopped
	InitialTemp  float64              // the starting temperature used (given or measured)
	MinTemp      float64              // the temperature that ends a cycle (given or measured)
	ByKind       map[string]MoveStats // per move kind
	Workers      int                  // goroutines that drew moves (Options.Workers, at least 1)
	Shared       int64                // moves kept by other workers and applied by the first
	Stale        int64                // accepted moves refused because another worker's came first
	Resyncs      int                  // moves a replica could not apply, after which the first worker's timetable was sent to all (0 unless there is a bug)
	Elapsed      time.Duration        // wall time of Run
	TriedPerSec  float64              // Tried / Elapsed
	AcceptPerSec float64              // Accepted / Elapsed
}

// MoveStats counts the moves of one kind.
type MoveStats struct {
	Tried, Legal, Accepted int64
}

// Result is the outcome of Run.
type Result struct {
	Best *timetable.Schedule // best timetable found (the start when nothing improved)
	// Cost is timetable.Cost of Best (with kept), computed from scratch.
	Cost  timetable.CostReport
	Stats Stats
}

// Run improves schedule s of term t by simulated annealing (Kirkpatrick,
// Gelatt, Vecchi 1983) over legal moves (relocations and swaps, room
// changes, Kempe chains after Thompson and Dowsland 1998, one room per
// section, moves aimed at a meeting that carries cost, and shifts that
// bring a cohort's meetings beside an isolated period), with exact
// incremental cost, on Options.Workers cores. Levels are kept lexicographic:
// a move may worsen a level only while it and every level above are
// annealed (the highest level with cost and those below), never one
// already at zero. When the temperature falls below MinTemp the search
// reheats from the best timetable. It runs until ctx is done (or MaxMoves)
// and stops early only when the best costs zero on every level (a proof
// of optimality: no criterion counts below zero). s must pass timetable.Check; kept is the earlier
// timetable for "moved meetings" or nil. Errors: an illegal start, or
// invalid Options.
func Run(ctx context.Context, t *timetable.Term, s *timetable.Schedule, kept *timetable.Schedule, opts Options) (Result, error) {
	start := time.Now()
	if opts.Cooling < 0 || opts.Cooling >= 1 || opts.InitialTemp < 0 || opts.MinTemp < 0 || opts.StepsPerTemp < 0 || opts.MaxMoves < 0 ||
		opts.CycleShare < 0 || opts.CycleShare > 1 || opts.AcceptShare < 0 || opts.AcceptShare > 1 || opts.Workers < 0 {
		return Result{}, errors.New("improve: Cooling must lie in (0, 1), CycleShare and AcceptShare in (0, 1], and the temperatures, steps, move limit and workers must not be negative")
	}
	x, err := New(t, s, kept)
	if err != nil {
		return Result{}, err
	}
	a := newAnnealer(x, opts)
	if opts.Workers > 1 {
		if _, err := newTeam(a, t, s, kept, opts.Workers); err != nil {
			return Result{}, err
		}
	}
	a.run(ctx)
	best := a.best
	res := Result{Best: best, Cost: timetable.Cost(t, best, kept), Stats: a.st}
	res.Stats.Elapsed = time.Since(start)
	if sec := res.Stats.Elapsed.Seconds(); sec > 0 {
		res.Stats.TriedPerSec = float64(res.Stats.Tried) / sec
		res.Stats.AcceptPerSec = float64(res.Stats.Accepted) / sec
	}
	return res, nil
}

// annealer is the search state of Run.
type annealer struct {
	x        *State
	opts     Options
	rng      *rand.Rand
	temp     float64
	best     *timetable.Schedule
	bestCost []int64 // per level, highest first
	curCost  []int64
	delta    []int64
	kinds    [nMoves]MoveStats
	measured int64 // moves drawn by measure
	st       Stats
	steps    int // moves per temperature now

	// Several workers (parallel.go): nil team when alone.
	id   int   // 0 for the leader
	team *team // what the workers share
	in   inbox // the moves of others being applied

	// Budget planning (StepsPerTemp 0 with a deadline or MaxMoves).
	began      time.Time // start of the search loop
	deadline   time.Time // zero when ctx has none
	cycleEnd   float64   // planned end of this cycle in tried moves (MaxMoves)
	cycleEndAt time.Time // planned end of this cycle in time (deadline)
	tmin       float64
	plan       []float64 // growing cycles: share of the whole budget of each planned cycle
	budget     float64   // the whole budget in moves (MaxMoves, or move rate times time left)
	budgetT    time.Duration
	measureAt  float64 // moves per second while measuring the temperature
}

// Growing cycles (CycleShare 0): the last planned cycle takes lastShare of
// the budget, each earlier one 1/cycleGrowth of the next, and the first is
// no shorter than minCycleShare of the budget or minCycleMoves moves per
// meeting whose time may change. With growth 3 the planned cycles take
// 0.6 + 0.3 of the budget (a geometric series), leaving a tenth for
// cycles after the plan.
const (
	lastShare     = 0.6
	cycleGrowth   = 3.0
	minCycleShare = 1e-3
	minCycleMoves = 200
)

// moveMix is the share of each move kind, in per mille.
var moveMix = [nMoves]int{mvRelocate: 200, mvRoom: 200, mvSwap: 300, mvKempe: 100, mvSectionRoom: 50, mvAimed: 100, mvShift: 50}

func newAnnealer(x *State, opts Options) *annealer {
	seed := opts.Seed
	if seed == 0 {
		seed = 1
	}
	a := &annealer{x: x, opts: opts, rng: rand.New(rand.NewPCG(seed, 0x9e3779b97f4a7c15))}
	n := len(x.levels)
	a.bestCost, a.curCost, a.delta = make([]int64, n), make([]int64, n), make([]int64, n)
	if a.opts.Cooling == 0 {
		a.opts.Cooling = 0.97
	}
	if a.opts.AcceptShare == 0 {
		a.opts.AcceptShare = 0.1
	}
	a.steps = a.opts.StepsPerTemp
	if a.steps == 0 {
		a.steps = max(1000, 10*len(x.movable))
	}
	x.levelCosts(&x.cur, a.bestCost)
	a.best = x.Schedule()
	return a
}

// pick draws a move kind by moveMix.
func (a *annealer) pick() int {
	v := a.rng.IntN(1000)
	for k, w := range moveMix {
		if v < w {
			return k
		}
		v -= w
	}
	return mvRelocate
}

// active is the index of the highest level with cost (levels above it are
// at zero and may not worsen), or the lowest level when all are zero.
func (a *annealer) active() int {
	for l, c := range a.curCost {
		if c != 0 {
			return l
		}
	}
	return len(a.curCost) - 1
}

// accept is the annealing rule on a move's cost difference.
func (a *annealer) accept(d *tally) bool {
	a.x.levelCosts(d, a.delta)
	act := a.active()
	for l, v := range a.delta {
		if v == 0 {
			continue
		}
		if v < 0 {
			return true
		}
		if l < act {
			return false
		}
		return a.temp > 0 && a.rng.Float64() < math.Exp(-float64(v)/a.temp)
	}
	return true
}

// measure samples legal moves without keeping them and returns the mean
// worsening, in units of the first level they change (a median was tried
// and gave worse timetables on the public benchmark: it starts too cold).
func (a *annealer) measure() float64 {
	var ups []int64
	for i := 0; i < 5000 && len(ups) < 500; i++ {
		a.measured++
		if !a.x.propose(a.pick(), a.rng) {
			continue
		}
		a.x.apply(a.x.chs, a.rng, func(d *tally) bool {
			a.x.levelCosts(d, a.delta)
			for _, v := range a.delta {
				if v != 0 {
					if v > 0 {
						ups = append(ups, v)
					}
					break
				}
			}
			return false
		})
	}
	if len(ups) == 0 {
		return 1
	}
	var sum float64
	for _, v := range ups {
		sum += float64(v)
	}
	return sum / float64(len(ups))
}

// better reports whether level costs c are lexicographically below b.
func better(c, b []int64) bool {
	for l := range c {
		if c[l] != b[l] {
			return c[l] < b[l]
		}
	}
	return false
}

// run anneals until ctx is done or MaxMoves is reached.
func (a *annealer) run(ctx context.Context) {
	t0 := a.opts.InitialTemp
	if t0 == 0 {
		began := time.Now()
		t0 = a.measure()
		if el := time.Since(began).Seconds(); el > 0 {
			a.measureAt = float64(a.measured) / el
		}
	}
	a.tmin = a.opts.MinTemp
	if a.tmin == 0 {
		a.tmin = max(t0/1000, 0.01)
	}
	a.began = time.Now()
	if d, ok := ctx.Deadline(); ok {
		a.deadline = d
	}
	a.setTemp(t0)
	a.st.InitialTemp, a.st.MinTemp = t0, a.tmin
	if a.team != nil {
		a.team.start()
	}
	a.st.Cycles = 1
	a.planCycles()
	a.planCycle()
	step, acc := 0, 0
	for {
		if a.st.Tried&1023 == 0 && ctx.Err() != nil {
			break
		}
		if a.opts.MaxMoves > 0 && a.st.Tried >= a.opts.MaxMoves {
			break
		}
		if a.team != nil && a.team.pending[0].Load() > 0 {
			a.catchUp(&acc)
		}
		if a.zero() {
			a.st.Optimal = true // no cost is below zero: nothing left to find
			break
		}
		if a.try() {
			a.moved()
			acc++
		}
		if step++; step >= a.steps || float64(acc) >= a.opts.AcceptShare*float64(a.steps) {
			step, acc = 0, 0
			a.setTemp(a.temp * a.opts.Cooling)
			if a.temp < a.tmin {
				a.reheat(t0)
				a.planCycle()
			}
			a.replan()
		}
	}
	a.st.Workers = 1
	a.st.ByKind = map[string]MoveStats{}
	for k, n := range a.kinds {
		a.st.ByKind[moveNames[k]] = n
	}
	if a.team != nil {
		a.team.finish(&a.st)
	}
}

// try draws one move, applies it when it is legal and the annealing rule
// accepts it, and counts it; it reports whether the move was kept.
func (a *annealer) try() bool {
	x := a.x
	k := a.pick()
	a.st.Tried++
	a.kinds[k].Tried++
	if !x.propose(k, a.rng) {
		return false
	}
	legal := false
	ok := x.apply(x.chs, a.rng, func(d *tally) bool { legal = true; return a.accept(d) && a.posted() })
	if legal {
		a.st.Legal++
		a.kinds[k].Legal++
	}
	if ok {
		a.st.Accepted++
		a.kinds[k].Accepted++
	}
	return ok
}

// posted reports whether a worker may keep its accepted move: always when
// alone, else when no other worker's move came first (post).
func (a *annealer) posted() bool {
	return a.team == nil || a.team.post(a.id, a.x, a.x.chs)
}

// zero reports whether the best timetable costs nothing on any level and
// no criterion has a negative weight, which proves it optimal.
func (a *annealer) zero() bool {
	for _, c := range a.bestCost {
		if c != 0 {
			return false
		}
	}
	for _, w := range a.x.weight {
		if w < 0 {
			return false
		}
	}
	return true
}

// planned reports whether the steps per temperature follow the budget.
func (a *annealer) planned() bool {
	return a.opts.StepsPerTemp == 0 && (a.opts.MaxMoves > 0 || !a.deadline.IsZero())
}

// rate is the measured move rate (moves per second), or a guess before
// there is anything to measure.
func (a *annealer) rate() float64 {
	if el := time.Since(a.began).Seconds(); el > 0.05 && a.st.Tried > 0 {
		return float64(a.st.Tried) / el
	}
	return 2e5
}

// planCycles plans the shares of growing cycles (CycleShare 0): the last
// takes lastShare of the whole budget, each earlier one 1/cycleGrowth of
// the next, down to the shortest worth running.
func (a *annealer) planCycles() {
	if !a.planned() || a.opts.CycleShare != 0 {
		return
	}
	if a.opts.MaxMoves > 0 {
		a.budget = float64(a.opts.MaxMoves - a.st.Tried)
	}
	if !a.deadline.IsZero() {
		a.budgetT = time.Until(a.deadline)
		rate := a.measureAt
		if rate <= 0 {
			rate = a.rate()
		}
		if inTime := rate * a.budgetT.Seconds(); a.opts.MaxMoves == 0 || inTime < a.budget {
			a.budget = inTime
		}
	}
	least := max(minCycleShare, minCycleMoves*float64(len(a.x.movable))/max(a.budget, 1))
	a.plan = a.plan[:0]
	for f := lastShare; f >= least || len(a.plan) == 0; f /= cycleGrowth {
		a.plan = append(a.plan, f)
	}
	slices.Reverse(a.plan)
}

// planCycle sets the end of a new cooling cycle: its planned share of the
// whole budget (growing cycles), or CycleShare (0.6 after the planned
// cycles) of the budget left, in moves under MaxMoves and in time before
// the deadline.
func (a *annealer) planCycle() {
	if !a.planned() {
		return
	}
	share := a.opts.CycleShare
	whole := 0.0
	if share == 0 {
		share = lastShare
		if k := a.st.Cycles - 1; k < len(a.plan) {
			whole = a.plan[k]
		}
	}
	if a.opts.MaxMoves > 0 {
		left := float64(a.opts.MaxMoves - a.st.Tried)
		a.cycleEnd = float64(a.st.Tried) + share*left
		if whole > 0 {
			a.cycleEnd = float64(a.st.Tried) + min(whole*a.budget, left)
		}
	}
	if !a.deadline.IsZero() {
		left := time.Until(a.deadline)
		a.cycleEndAt = time.Now().Add(time.Duration(share * float64(left)))
		if whole > 0 {
			a.cycleEndAt = time.Now().Add(min(time.Duration(whole*float64(a.budgetT)), left))
		}
	}
	a.replan()
}

// replan spreads the moves left in this cycle over its temperatures left.
func (a *annealer) replan() {
	if !a.planned() {
		return
	}
	temps := math.Ceil(math.Log(a.temp/a.tmin) / -math.Log(a.opts.Cooling))
	left := math.Inf(1)
	if a.opts.MaxMoves > 0 {
		left = a.cycleEnd - float64(a.st.Tried)
	}
	if !a.deadline.IsZero() {
		left = min(left, a.rate()*time.Until(a.cycleEndAt).Seconds())
	}
	a.steps = int(min(max(left/max(temps, 1), 100), 1e9))
}

// moved records a new best after an accepted move.
func (a *annealer) moved() {
	x := a.x
	if a.opts.onAccept != nil {
		a.opts.onAccept(x)
	}
	x.levelCosts(&x.cur, a.curCost)
	if !better(a.curCost, a.bestCost) {
		return
	}
	copy(a.bestCost, a.curCost)
	a.best = x.Schedule()
	a.st.Improvements++
	if a.opts.OnBest != nil {
		a.opts.OnBest(x.Schedule(), x.Cost())
	}
}

// reheat starts a new cooling cycle from the best timetable, alternating
// between a full and a third of the starting temperature so that the last
// planned cycle (the longest) starts at the full one, as the first cycle of
// a single long run would.
func (a *annealer) reheat(t0 float64) {
	a.st.Cycles++
	if better(a.bestCost, a.curCost) {
		a.x.restore(a.best)
		copy(a.curCost, a.bestCost)
		if a.team != nil {
			a.team.reset(a.best)
		}
	}
	temp := t0
	if (a.st.Cycles-len(a.plan))%2 != 0 {
		temp = t0 / 3
	}
	a.setTemp(temp)
}
