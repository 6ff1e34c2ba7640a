package solver

import (
	"errors"
	"fmt"
)

// RestartPolicy chooses when the search restarts from decision level 0.
type RestartPolicy int

// Restart policies.
const (
	// RestartDefault selects the engine's default policy (RestartGlucose).
	RestartDefault RestartPolicy = iota
	// RestartLuby restarts after LubyUnit × luby(i) conflicts (Luby, Sinclair,
	// Zuckerman 1993).
	RestartLuby
	// RestartGlucose restarts when the recent average literal block distance
	// of learned clauses exceeds the long-run average (Audemard & Simon 2012).
	RestartGlucose
)

// Options holds every tuning constant of the engine. A zero field means "use
// the default" (see DefaultOptions); New rejects values out of range.
type Options struct {
	// Seed seeds the random generator used for tie-breaking among initial
	// variable activities and for random decisions. Equal seeds give equal
	// runs.
	Seed int64
	// RandomFreq is the probability in [0, 1) of a random decision instead of
	// the most active variable. Default 0.
	RandomFreq float64
	// VarDecay is the VSIDS activity decay factor in (0, 1): after each
	// conflict all activities are divided by it implicitly. Default 0.95.
	VarDecay float64
	// Restarts selects the restart policy. Default RestartGlucose.
	Restarts RestartPolicy
	// LubyUnit is the number of conflicts of one Luby unit. Default 100.
	LubyUnit int
	// GlucoseWindow is the number of recent learned clauses whose average
	// LBD is compared with the global average. Default 50.
	GlucoseWindow int
	// GlucoseK is the margin of the glucose restart test: restart when
	// recentAverage*K > globalAverage. In (0, 1]; default 0.8.
	GlucoseK float64
	// ReduceFirst is the number of conflicts before the first reduction of
	// the learned-clause database. Default 2000.
	ReduceFirst int
	// ReduceInc is added to the interval between reductions after each
	// reduction (conflicts). Default 300.
	ReduceInc int
	// GlueLBD: learned clauses with literal block distance at most GlueLBD
	// are never deleted. Default 2.
	GlueLBD int
	// CoreBudget is the number of conflicts Optimize spends per priority
	// level on core-guided lower bounds before switching to model-improving
	// search; with a ConflictLimit, at most half of it. 0 means the default
	// 20000; negative skips the core-guided phase.
	CoreBudget int64
	// ConflictLimit bounds the conflicts of one Solve, Enumerate or Optimize
	// call (0 = no limit); when reached the call returns Unknown.
	ConflictLimit int64
}

// DefaultOptions returns the default tuning of the engine.
func DefaultOptions() Options {
	return Options{
		VarDecay:      0.95,
		Restarts:      RestartGlucose,
		LubyUnit:      100,
		GlucoseWindow: 50,
		GlucoseK:      0.8,
		ReduceFirst:   2000,
		ReduceInc:     300,
		GlueLBD:       2,
		CoreBudget:    20000,
	}
}

// ErrOptions is wrapped by every error New returns for invalid Options.
var ErrOptions = errors.New("invalid solver options")

// withDefaults fills zero fields from DefaultOptions and validates the
// result.
func (o Options) withDefaults() (Options, error) {
	d := DefaultOptions()
	if o.VarDecay == 0 {
		o.VarDecay = d.VarDecay
	}
	if o.Restarts == RestartDefault {
		o.Restarts = d.Restarts
	}
	if o.LubyUnit == 0 {
		o.LubyUnit = d.LubyUnit
	}
	if o.GlucoseWindow == 0 {
		o.GlucoseWindow = d.GlucoseWindow
	}
	if o.GlucoseK == 0 {
		o.GlucoseK = d.GlucoseK
	}
	if o.ReduceFirst == 0 {
		o.ReduceFirst = d.ReduceFirst
	}
	if o.ReduceInc == 0 {
		o.ReduceInc = d.ReduceInc
	}
	if o.CoreBudget == 0 {
		o.CoreBudget = d.CoreBudget
	}
	if o.GlueLBD == 0 {
		o.GlueLBD = d.GlueLBD
	}
	bad := func(field string, v any, want string) error {
		return fmt.Errorf("%w: %s is %v; it must be %s", ErrOptions, field, v, want)
	}
	switch {
	case o.RandomFreq < 0 || o.RandomFreq >= 1:
		return o, bad("RandomFreq", o.RandomFreq, "in [0, 1)")
	case o.VarDecay <= 0 || o.VarDecay >= 1:
		return o, bad("VarDecay", o.VarDecay, "in (0, 1)")
	case o.Restarts != RestartLuby && o.Restarts != RestartGlucose:
		return o, bad("Restarts", int(o.Restarts), "RestartLuby or RestartGlucose")
	case o.LubyUnit < 1:
		return o, bad("LubyUnit", o.LubyUnit, "at least 1")
	case o.GlucoseWindow < 1:
		return o, bad("GlucoseWindow", o.GlucoseWindow, "at least 1")
	case o.GlucoseK <= 0 || o.GlucoseK > 1:
		return o, bad("GlucoseK", o.GlucoseK, "in (0, 1]")
	case o.ReduceFirst < 1:
		return o, bad("ReduceFirst", o.ReduceFirst, "at least 1")
	case o.ReduceInc < 0:
		return o, bad("ReduceInc", o.ReduceInc, "at least 0")
	case o.GlueLBD < 0:
		return o, bad("GlueLBD", o.GlueLBD, "at least 0")
	case o.ConflictLimit < 0:
		return o, bad("ConflictLimit", o.ConflictLimit, "at least 0 (0 = no limit)")
	}
	return o, nil
}
