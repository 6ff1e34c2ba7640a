package encode

import (
	"context"
	"errors"
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// explainCheck is the outcome of one satisfiability check.
type explainCheck struct {
	status solver.Status
	core   []int        // Unsatisfiable: groups whose selectors the engine blamed
	extra  []solver.Lit // Unsatisfiable: extra assumptions the engine blamed
	model  []solver.Atom
	// sched is the timetable of a Satisfiable check whose model decodes
	// with rooms; nil when decoding fails only on room requirements that the
	// check switched off (the model is then a timetable of the relaxed term
	// up to those rooms).
	sched *timetable.Schedule
}

// check decides whether the groups with on[g] true (groups beyond len(on),
// such as room families found during the check, count as on) can hold
// together with the extra assumptions, every other group being switched
// off: one Search.Find under those assumptions. A model is decoded into a
// timetable; a room set that the model overfills (a Hall violation the
// program did not yet state) is added as a new room family and the check
// searches again, and so is a room combination that Decode proves
// impossible (a nogood behind the room assignment group). The status is
// Unknown when the conflict budget or ctx runs out.
func (x *Explainer) check(ctx context.Context, on []bool, extra []solver.Lit) (explainCheck, error) {
	x.stats.Checks++
	isOn := func(g int) bool { return g >= len(on) || on[g] }
	var sched *timetable.Schedule
	gate := func(ctx context.Context, model []solver.Atom) error {
		sched = nil
		if x.opt.VerifyModels {
			if err := solver.Verify(x.p, model); err != nil {
				return fmt.Errorf("internal error: a model of the explanation program fails the verifier: %w", err)
			}
		}
		var err error
		sched, err = x.decode(ctx, model, isOn)
		var herr *HallError
		var rerr *RoomConflictError
		switch {
		case err == nil:
			return nil
		case errors.As(err, &herr):
			if x.addFamilies(herr) == 0 {
				// Every overfilled room set is stated already: the
				// shortage comes from room requirements switched off.
				return nil
			}
			return errSearchAgain
		case errors.As(err, &rerr):
			if !isOn(x.roomAssign) {
				return nil
			}
			x.addNogoods(rerr, isOn)
			return errSearchAgain
		case ctx.Err() != nil && errors.Is(err, ctx.Err()):
			return err
		}
		return fmt.Errorf("internal error: %w", err)
	}
	st, model, err := x.search.Find(ctx, func() []solver.Lit { return x.assumptions(isOn, extra) }, gate, maxCheckRounds)
	switch {
	case err != nil:
		return explainCheck{}, err
	case st == solver.Unsatisfiable:
		x.stats.Unsat++
		return x.unsat(extra), nil
	case st == solver.Satisfiable:
		x.stats.Sat++
		return explainCheck{status: solver.Satisfiable, model: model, sched: sched}, nil
	}
	x.stats.Unknown++
	return explainCheck{status: solver.Unknown}, nil
}

// assumptions lists the selector literals of a check: switched-off groups
// first, then the sections, requests and requirements that hold, then the
// extra literals.
func (x *Explainer) assumptions(isOn func(int) bool, extra []solver.Lit) []solver.Lit {
	n := len(x.cat.Groups)
	out := make([]solver.Lit, 0, n+len(extra))
	for g := 0; g < n; g++ {
		if !isOn(g) {
			out = append(out, solver.Neg(x.cat.Groups[g].Selector))
		}
	}
	for _, want := range []groupRole{roleSection, roleRequest, roleRequirement} {
		for g := 0; g < n; g++ {
			if isOn(g) && x.role(g) == want {
				out = append(out, solver.Pos(x.cat.Groups[g].Selector))
			}
		}
	}
	return append(out, extra...)
}

// unsat reads the engine's core as groups and extra literals.
func (x *Explainer) unsat(extra []solver.Lit) explainCheck {
	res := explainCheck{status: solver.Unsatisfiable}
	for _, l := range x.search.Core() {
		if g, ok := x.cat.GroupOf(l.Atom()); ok && !l.IsNeg() {
			res.core = append(res.core, g.ID)
			continue
		}
		if slices.Contains(extra, l) {
			res.extra = append(res.extra, l)
		}
	}
	slices.Sort(res.core)
	res.core = slices.Compact(res.core)
	return res
}

// decode turns a model into a timetable of the work term, treating rooms
// whose availability group is off as always available and sections whose
// group is off as absent.
func (x *Explainer) decode(ctx context.Context, model []solver.Atom, isOn func(int) bool) (*timetable.Schedule, error) {
	cc := *x.cat
	copied := false
	for r, g := range cc.rooms.blocker {
		if g >= 0 && !isOn(g) && cc.rooms.blocked[r] != nil {
			if !copied {
				cc.rooms.blocked = slices.Clone(cc.rooms.blocked)
				copied = true
			}
			cc.rooms.blocked[r] = nil
		}
	}
	copied = false
	copiedPats := false
	for s, g := range x.secGroup {
		if !isOn(g) && cc.IsPattern(s) {
			// An absent pattern section has no time: Decode skips it.
			if !copiedPats {
				cc.pats = slices.Clone(cc.pats)
				copiedPats = true
			}
			cc.pats[s].on = false
		}
		if !isOn(g) && cc.secs[s].meetings != 0 {
			if !copied {
				cc.secs = slices.Clone(cc.secs)
				copied = true
			}
			cc.secs[s].meetings = 0
		}
	}
	return DecodeContext(ctx, x.work, &cc, model)
}

// addFamilies adds the room sets of a Hall violation as room families (new
// requirement groups; the engine is rebuilt before the next check) and
// returns how many were new.
func (x *Explainer) addFamilies(herr *HallError) int {
	n := x.search.AddFamilies(herr)
	x.stats.Families += n
	return n
}

// addNogoods forbids the room combinations of a room conflict while the
// room assignment group holds, in the program (for Verify) and in the
// engine before its next call.
func (x *Explainer) addNogoods(rerr *RoomConflictError, isOn func(int) bool) {
	if rerr.Incomplete {
		x.incomplete = true
	}
	// The nogood holds while room assignment holds and every room that was
	// unavailable in this check stays so (more free rooms may allow it).
	guard := []solver.Lit{solver.Pos(x.cat.Groups[x.roomAssign].Selector)}
	for _, g := range x.cat.rooms.blocker {
		if g >= 0 && isOn(g) {
			if l := solver.Pos(x.cat.Groups[g].Selector); !slices.Contains(guard, l) {
				guard = append(guard, l)
			}
		}
	}
	x.search.Forbid(rerr, x.roomAssign, KindRoomAssignment, guard)
	x.stats.Nogoods += len(rerr.nogoods)
	secIdx := x.work.SectionIndex()
	for _, id := range rerr.Sections {
		if s, ok := secIdx[id]; ok && !slices.Contains(x.raSecs, s) {
			x.raSecs = append(x.raSecs, s)
		}
	}
}

// allOn returns an on-set with every group holding except those listed.
func (x *Explainer) allOn(except ...int) []bool {
	on := make([]bool, len(x.cat.Groups))
	for g := range on {
		on[g] = true
	}
	for _, g := range except {
		if g < len(on) {
			on[g] = false
		}
	}
	return on
}

// onlyOn returns an on-set with exactly the listed groups holding, plus
// every group whose role is in keep.
func (x *Explainer) onlyOn(groups []int, keep ...groupRole) []bool {
	on := make([]bool, len(x.cat.Groups))
	for g := range on {
		on[g] = slices.Contains(keep, x.role(g))
	}
	for _, g := range groups {
		if g < len(on) {
			on[g] = true
		}
	}
	return on
}
