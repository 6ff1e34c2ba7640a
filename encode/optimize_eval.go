package encode

import (
	"context"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// candidate is a model that passed every gate, with its timetable and
// costs.
type candidate struct {
	model  []solver.Atom
	sched  *timetable.Schedule
	cost   timetable.CostReport // timetable.Cost with the kept timetable
	total  []int64              // cost.ByLevel per level of optRun.levels
	engine []int64              // the engine's cost per criterion
	time   []int64              // the engine's cost per level of optRun.levels
}

// onModel is the gate of every model that improves on the engine call's
// best. A model that places every meeting where the best
// timetable has it is passed over; any other goes through the gates and
// becomes the best timetable when its total cost (rooms included) is lower.
// The engine sees only the time part of the cost, so a model it prefers may
// still lose on the room criteria. A model whose rooms cannot be assigned
// stops the call so that the room constraints can be added (Search.Improve).
func (o *optRun) onModel(_ context.Context, model []solver.Atom) error {
	if o.best != nil && (o.sameStarts(model, o.best.model) || slices.Compare(o.timeCost(model), o.best.total) >= 0) {
		return nil // rooms never cost less than nothing: it cannot beat the best
	}
	if o.lastOnly {
		o.pending = slices.Clone(model) // evaluated when the engine call ends
		return nil
	}
	return o.take(model)
}

// take puts a model through the gates and keeps it when it is the best.
func (o *optRun) take(model []solver.Atom) error {
	c, err := o.evaluate(model)
	if err != nil {
		return err
	}
	o.accept(c)
	return nil
}

// accept makes c the best timetable when its total cost is lower.
func (o *optRun) accept(c *candidate) {
	if o.best == nil || slices.Compare(c.total, o.best.total) < 0 {
		o.best = c
		o.watch.gain()
		o.x.Prefer(c.model) // a rebuilt engine starts from the incumbent
		o.x.Keep(c.model)   // and no room cut may forbid it (both Searches
		o.h.Keep(c.model)   // add cuts to the one program)
		o.published(c)
		o.res.History = append(o.res.History, o.snapshot())
		o.note(true)
	}
}

// timeCost is the engine's cost of a model per level of o.levels.
func (o *optRun) timeCost(model []solver.Atom) []int64 {
	return o.byLevel(o.cat.EngineCost(o.p, model))
}

// byLevel sums per-criterion costs into the levels of o.levels.
func (o *optRun) byLevel(perCrit []int64) []int64 {
	out := make([]int64, len(o.levels))
	for k, cr := range timetable.Criteria {
		if perCrit[k] == 0 {
			continue
		}
		w, l := o.t.CriterionWeight(cr.Name)
		if i := slices.Index(o.levels, l); i >= 0 && w != 0 {
			out[i] += perCrit[k]
		}
	}
	return out
}

// evaluate puts a model through the gates: Search.Gates (solver.Verify,
// Decode, which may report room problems as *HallError or
// *RoomConflictError, room improvement, timetable.Check) and the third
// gate; then it evaluates timetable.Cost.
func (o *optRun) evaluate(model []solver.Atom) (*candidate, error) {
	model = slices.Clone(model)
	sched, err := o.x.Gates(o.ctx, model)
	if err != nil {
		return nil, err
	}
	if err := o.cat.thirdGate(o.t, o.p, model, sched, o.opt.Keep); err != nil {
		return nil, err
	}
	c := &candidate{model: model, sched: sched, engine: o.cat.EngineCost(o.p, model)}
	c.cost = timetable.Cost(o.t, sched, o.opt.Keep)
	c.total = make([]int64, len(o.levels))
	for i, l := range o.levels {
		c.total[i] = c.cost.ByLevel[l]
	}
	c.time = o.byLevel(c.engine)
	return c, nil
}

// sameStarts reports whether two models have the same start atoms.
func (o *optRun) sameStarts(a, b []solver.Atom) bool {
	i, j := 0, 0
	for {
		for i < len(a) && !isDecision(o.cat.AtomInfo(a[i]).Kind) {
			i++
		}
		for j < len(b) && !isDecision(o.cat.AtomInfo(b[j]).Kind) {
			j++
		}
		if i == len(a) || j == len(b) {
			return i == len(a) && j == len(b)
		}
		if a[i] != b[j] {
			return false
		}
		i++
		j++
	}
}

// bestRooms improves the rooms of a decoded timetable: local search, then,
// when the room program is small enough, the engine's exact choice; the
// better of the two (by timetable.Cost) is kept.
func (o *optRun) bestRooms(s *timetable.Schedule) *timetable.Schedule {
	if o.cat.hasPatterns() {
		return o.bestGridRooms(s)
	}
	s = improveRooms(o.t, o.cat, s, o.opt.Keep)
	exact, _ := exactRooms(o.ctx, o.t, o.cat, s, o.opt.Keep, o.opt.Seed)
	if exact == s {
		return s
	}
	if slices.Compare(o.costVector(exact), o.costVector(s)) < 0 {
		return exact
	}
	return s
}

// costVector is timetable.Cost of s per level of o.levels.
func (o *optRun) costVector(s *timetable.Schedule) []int64 {
	rep := timetable.Cost(o.t, s, o.opt.Keep)
	out := make([]int64, len(o.levels))
	for i, l := range o.levels {
		out[i] = rep.ByLevel[l]
	}
	return out
}
