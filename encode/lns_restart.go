package encode

import (
	"math/rand/v2"
	"slices"

	"github.com/termwright/termwright/solver"
)

// Restarts of neighbourhood search. When MaxStall steps in a row bring no
// improvement and there is time left (a deadline), or restarts left (the
// Horizon option, for runs without a deadline), neighbourhood search does
// not stop: it restarts from the incumbent with a new random stream, a
// neighbourhood size multiplied by the next of 1, 2, 4, 8 (then 1 again),
// a conflict budget grown by the same factor, and a few perturbed steps:
// steps whose engine tries a random part of the freed sections away from
// the incumbent's places first and must return a timetable different from
// it on the freed sections. This is iterated local search over the
// neighbourhoods (Lourenço, Martin and Stützle 2003): the stall says the
// incumbent is a local optimum of the neighbourhoods of the current size,
// and larger, perturbed neighbourhoods are the way out. Everything counts
// steps and conflicts, so a run that ends by itself (Horizon spent, no
// deadline) is reproducible.

// Restart tuning.
const (
	// restartFactors are the neighbourhood-size and budget factors of
	// successive restarts, in turn.
	restartFactors = 4
	// restartStall is the stall limit after a restart (MaxStall bounds
	// it): a restart that brings nothing within this many steps makes way
	// for the next, larger one.
	restartStall = 60
	// perturbSteps is the number of perturbed steps after a restart.
	perturbSteps = 8
	// perturbShare is the share of the freed sections whose incumbent
	// places a perturbed step's engine tries last.
	perturbShare = 0.5
)

// restartState is the part of lnsState that restarts change.
type restartState struct {
	factor  int // neighbourhood-size and budget factor of the current restart (1 before the first)
	perturb int // perturbed steps still to run
}

// mayRestart reports whether neighbourhood search may restart after a
// stall instead of stopping: when ctx has a deadline (there is time left
// until it) or while the Horizon option has restarts left.
func (o *optRun) mayRestart() bool {
	if _, timed := o.ctx.Deadline(); timed {
		return true
	}
	return o.res.Restarts < o.opt.Horizon
}

// restart starts the next restart of neighbourhood search from the
// incumbent: a new random stream, the next size factor, and perturbed
// steps to come.
func (o *optRun) restart(ls *lnsState) {
	o.res.Restarts++
	k := o.res.Restarts
	ls.rng = rand.New(rand.NewPCG(uint64(o.opt.Seed), lnsStream+uint64(k)))
	ls.factor = 1 << (k % restartFactors)
	ls.perturb = perturbSteps
	ls.size = min(max(ls.base*ls.factor, lnsMinSize), ls.maxSize())
}

// stallLimit is the number of steps without improvement after which
// neighbourhood search restarts (or stops).
func (o *optRun) stallLimit() int {
	if o.res.Restarts == 0 {
		return o.opt.MaxStall
	}
	return min(o.opt.MaxStall, restartStall)
}

// maxSize is the largest neighbourhood of the current restart.
func (ls *lnsState) maxSize() int {
	return min(lnsMaxSize*max(ls.factor, 1), len(ls.related))
}

// forbidIncumbent makes the step's engine d look for a timetable that
// differs from the incumbent on the freed sections: the clause that not
// every decision atom of theirs that the incumbent holds stays true. Steps
// use it when the incumbent's cost lies partly in the rooms, which the
// engine does not see (its best model would be the incumbent again), and
// after a restart (perturbation). With only, the clause is about those
// sections alone (a room neighbourhood's chosen section must move). With
// rng, a perturbed step also makes the engine try a random share of those
// atoms false first.
func (o *optRun) forbidIncumbent(d *Derived, only []int, rng *rand.Rand) error {
	in := make([]bool, o.p.NumAtoms()+1)
	for _, a := range o.best.model {
		if int(a) < len(in) {
			in[a] = true
		}
	}
	var clause []solver.Lit
	add := func(engineAtom, a solver.Atom) {
		info := o.cat.AtomInfo(a)
		if int(a) < len(in) && in[a] && isDecision(info.Kind) && (only == nil || slices.Contains(only, info.Section)) {
			clause = append(clause, solver.Neg(engineAtom))
		}
	}
	if d.split == nil {
		for a := solver.Atom(1); int(a) <= d.s.NumAtoms(); a++ {
			add(a, a)
		}
	} else {
		for i, a := range d.split.orig[1:] {
			add(solver.Atom(i+1), a)
		}
	}
	if len(clause) == 0 {
		return nil
	}
	if rng != nil {
		for _, l := range clause {
			if rng.Float64() < perturbShare {
				d.s.SetPhase(l.Atom(), false)
			}
		}
	}
	return d.s.AddClause(clause...)
}

// roomPart reports whether the incumbent's cost lies partly in what the
// engine does not see (the room criteria).
func (o *optRun) roomPart() bool {
	for i := range o.best.total {
		if o.best.total[i] != o.best.time[i] {
			return true
		}
	}
	return false
}
