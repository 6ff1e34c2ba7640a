package encode

import (
	"context"
	"errors"
	"fmt"
	"math"
	"slices"
	"time"

	"github.com/termwright/termwright/improve"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// LocalStats counts the work of the local-search phase (package improve:
// simulated annealing on the timetable itself, rooms included).
type LocalStats struct {
	Runs     int           // local-search runs
	Moves    int64         // moves tried, all runs
	Adopted  int           // runs whose best timetable became the incumbent
	Rejected int           // runs whose better timetable failed a gate (see adopt)
	Time     time.Duration // time spent in local search
	Workers  int           // goroutines of the last run (LocalWorkers), 0 before any
	// Skipped says why local search did not run ("" when it could): it
	// knows the period grid only, so terms with pattern sections skip it.
	Skipped string
}

// Defaults of the local-search phase.
const (
	// DefaultLocalShare is the share of the time left that each
	// local-search run takes when the search has a deadline; neighbourhood
	// search gets the rest, and when it stalls with time left local search
	// runs again from the incumbent.
	DefaultLocalShare = 0.7
	// DefaultLocalMovesPerMeeting sets the move budget of a run when the
	// search has no deadline (the run ends by itself, and the same seed
	// gives the same result).
	DefaultLocalMovesPerMeeting = 2_000
	// adoptLimit bounds the engine call that adopts a timetable: with every
	// start fixed it is propagation only.
	adoptLimit = 30 * time.Second
)

// defaultShare is the share of the time left of a local-search run with
// workers workers: DefaultLocalShare for one; with more, a cooling plan
// costs more moves in its time (two workers 1.6-1.8 times as many), so a
// run takes DefaultLocalShare divided by workers to the power 0.75 (0.42
// for two, 2^0.75 = 1.68): about the moves of the one-worker run, so a
// like cost comes sooner, and the time saved goes to the runs after it.
// Measured on the 2,000-section term (BENCHMARKS §1j, §1m): with two
// workers a share of 0.7 ended worse than one worker (one run), 0.35 at
// like costs sooner, 0.49 at lower costs 1.28 times sooner, 0.42 1.42
// times sooner (medians of three seeds).
func defaultShare(workers int) float64 {
	return DefaultLocalShare / math.Pow(float64(max(workers, 1)), 0.75)
}

// longRunCycles is improve.Options.CycleShare of every local-search run
// but a warm-up round's: one cooling cycle over the whole run. Growing
// cycles (the improve default) give early results sooner; after the
// warm-up, which already gave them, one long cooling gave lower costs on
// the public ITC-2007 instances (BENCHMARKS §1k).
const longRunCycles = 1.0

// localOptions are the options of the next local-search run.
func (o *optRun) localOptions() improve.Options {
	opts := improve.Options{Seed: uint64(o.opt.Seed) + uint64(o.res.Local.Runs), Workers: o.opt.LocalWorkers,
		OnBest: func(_ *timetable.Schedule, c timetable.CostReport) {
			o.local = o.levelsOf(c)
			o.note(false)
		}}
	if !o.turns.warm {
		opts.CycleShare = longRunCycles
	}
	return opts
}

// errNotAdopted says a timetable of local search could not become a
// candidate (its starts are not a model of the program as it stands).
var errNotAdopted = errors.New("not a model of the program")

// localSearch runs one local-search run from the incumbent and adopts its
// best timetable when that is better (adopt puts it through every gate).
func (o *optRun) localSearch() error {
	if o.opt.LocalShare < 0 || o.best == nil || o.skipLocal {
		return nil
	}

	o.phase = "local search"
	o.note(true)
	share := o.opt.LocalShare
	if share == 0 {
		share = defaultShare(o.opt.LocalWorkers)
	}
	opts := o.localOptions()
	ctx := o.ctx
	if _, ok := ctx.Deadline(); ok {
		var cancel context.CancelFunc
		ctx, cancel = context.WithTimeout(ctx, o.localTurn(share))
		defer cancel()
	} else {
		opts.MaxMoves = int64(DefaultLocalMovesPerMeeting) * int64(max(1, len(o.best.sched.Placements)))
	}
	t0 := time.Now()
	res, err := improve.Run(ctx, o.t, o.best.sched, o.opt.Keep, opts)
	o.local = nil
	o.res.Local.Runs++
	o.turns.lastLocal = time.Since(t0)
	o.res.Local.Time += o.turns.lastLocal
	if err != nil {
		return fmt.Errorf("internal error: local search: %w", err)
	}
	o.res.Local.Moves += res.Stats.Tried
	o.res.Local.Workers = max(res.Stats.Workers, 1)
	if slices.Compare(o.levelsOf(res.Cost), o.best.total) >= 0 {
		return nil
	}
	c, err := o.adopt(res.Best)
	if errors.Is(err, errNotAdopted) {
		o.res.Local.Rejected++
		return nil
	}
	if err != nil {
		return err
	}
	o.res.Local.Adopted++
	o.accept(c)
	return nil
}

// adopt makes a timetable of local search a candidate like any model of
// the engine: with every start fixed to the timetable's, the engine finds
// the model of the program, which must pass solver.Verify; the timetable,
// with its own rooms, must pass timetable.Check; and the engine's cost of
// the model must equal the independent cost of the timetable (the third
// gate). A timetable whose starts the program refuses (an unproved room
// cut, say) or whose cost disagrees is not adopted (errNotAdopted); a
// model that fails Verify, or a timetable that fails Check, is a bug and an
// error.
func (o *optRun) adopt(s *timetable.Schedule) (*candidate, error) {
	assume, ok := o.startsOf(s)
	if !ok {
		return nil, errNotAdopted
	}
	// Adopting is propagation only; it runs even after Ctrl-C or the time
	// limit, so that the last run's result is not lost.
	ctx, cancel := context.WithTimeout(context.WithoutCancel(o.ctx), adoptLimit)
	defer cancel()
	st, err := o.x.Solve(ctx, assume...)
	if err != nil {
		return nil, err
	}
	if st != solver.Satisfiable {
		return nil, errNotAdopted
	}
	model := o.x.Model()
	t0 := time.Now()
	err = solver.Verify(o.p, model)
	o.res.Timings.Verify += time.Since(t0)
	if err != nil {
		return nil, fmt.Errorf("internal error: the engine's model fails the verifier: %w", err)
	}
	if err := o.x.Check(s); err != nil {
		return nil, fmt.Errorf("internal error: local search: %w", err)
	}
	if err := o.cat.thirdGate(o.t, o.p, model, s, o.opt.Keep); err != nil {
		return nil, errNotAdopted
	}
	c := &candidate{model: model, sched: s, engine: o.cat.EngineCost(o.p, model)}
	c.cost = timetable.Cost(o.t, s, o.opt.Keep)
	c.total = o.levelsOf(c.cost)
	c.time = o.byLevel(c.engine)
	return c, nil
}

// startsOf fixes every start atom to the timetable: true where a meeting
// of the section starts, false at the section's other candidate starts. It
// reports false when a meeting starts where the program has no start.
func (o *optRun) startsOf(s *timetable.Schedule) ([]solver.Lit, bool) {
	idx := o.t.SectionIndex()
	at := make([][]int, len(o.t.Sections))
	for _, p := range s.Placements {
		si, ok := idx[p.Section]
		if !ok || o.cat.StartAtom(si, p.Period) == 0 {
			return nil, false
		}
		at[si] = append(at[si], p.Period)
	}
	var out []solver.Lit
	for si := range o.t.Sections {
		for _, p := range o.cat.Candidates(si) {
			a := o.cat.StartAtom(si, p)
			if slices.Contains(at[si], p) {
				out = append(out, solver.Pos(a))
			} else {
				out = append(out, solver.Neg(a))
			}
		}
	}
	return out, true
}

// levelsOf is a cost report per level of o.levels.
func (o *optRun) levelsOf(c timetable.CostReport) []int64 {
	out := make([]int64, len(o.levels))
	for i, l := range o.levels {
		out[i] = c.ByLevel[l]
	}
	return out
}
