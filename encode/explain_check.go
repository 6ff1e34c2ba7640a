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
// off. A model is decoded into a timetable; a room set that the model
// overfills (a Hall violation the program did not yet state) is added as a
// new room family and the check searches again, and so is a room
// combination that Decode proves impossible (a nogood behind the room
// assignment group). The status is Unknown when the conflict budget or ctx
// runs out.
func (x *Explainer) check(ctx context.Context, on []bool, extra []solver.Lit) (explainCheck, error) {
	x.stats.Checks++
	isOn := func(g int) bool { return g >= len(on) || on[g] }
	for round := 0; round < maxCheckRounds; round++ {
		x.s.Assume(x.assumptions(isOn, extra)...)
		st := x.s.Solve(ctx)
		switch st {
		case solver.Unknown:
			x.stats.Unknown++
			return explainCheck{status: solver.Unknown}, nil
		case solver.Unsatisfiable:
			x.stats.Unsat++
			return x.unsat(extra), nil
		}
		model := x.s.Model(nil)
		if x.opt.VerifyModels {
			if err := solver.Verify(x.p, model); err != nil {
				return explainCheck{}, fmt.Errorf("internal error: a model of the explanation program fails the verifier: %w", err)
			}
		}
		sched, err := x.decode(model, isOn)
		var herr *HallError
		var rerr *RoomConflictError
		switch {
		case err == nil:
			x.stats.Sat++
			return explainCheck{status: solver.Satisfiable, model: model, sched: sched}, nil
		case errors.As(err, &herr):
			added, err := x.addFamilies(herr, model)
			if err != nil {
				return explainCheck{}, err
			}
			if !added {
				// Every overfilled room set is stated already: the
				// shortage comes from room requirements switched off.
				x.stats.Sat++
				return explainCheck{status: solver.Satisfiable, model: model}, nil
			}
		case errors.As(err, &rerr):
			if !isOn(x.roomAssign) {
				x.stats.Sat++
				return explainCheck{status: solver.Satisfiable, model: model}, nil
			}
			if err := x.addNogoods(rerr, isOn); err != nil {
				return explainCheck{}, err
			}
		default:
			return explainCheck{}, fmt.Errorf("internal error: %w", err)
		}
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
	for _, l := range x.s.Core(nil) {
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
func (x *Explainer) decode(model []solver.Atom, isOn func(int) bool) (*timetable.Schedule, error) {
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
	for s, g := range x.secGroup {
		if !isOn(g) && cc.secs[s].meetings != 0 {
			if !copied {
				cc.secs = slices.Clone(cc.secs)
				copied = true
			}
			cc.secs[s].meetings = 0
		}
	}
	return Decode(x.work, &cc, model)
}

// addFamilies adds the room sets of a Hall violation as room families (new
// requirement groups) and rebuilds the engine; it reports whether any set
// was new.
func (x *Explainer) addFamilies(herr *HallError, model []solver.Atom) (bool, error) {
	b := x.cat.extender(x.p)
	added := false
	for _, set := range herr.sets {
		if _, ok := b.addFamily(set, true); ok {
			added = true
			x.stats.Families++
		}
	}
	if !added {
		return false, nil
	}
	return true, x.rebuild(model)
}

// addNogoods forbids the room combinations of a room conflict while the
// room assignment group holds: in the engine at once, and in the program
// for later rebuilds and for Verify.
func (x *Explainer) addNogoods(rerr *RoomConflictError, isOn func(int) bool) error {
	if rerr.Incomplete {
		x.incomplete = true
	}
	b := x.cat.extender(x.p)
	b.in(x.roomAssign, KindRoomAssignment)
	// The nogood holds while room assignment holds and every room that was
	// unavailable in this check stays so (more free rooms may allow it).
	guard := []solver.Lit{b.sel(x.roomAssign)}
	for _, g := range x.cat.rooms.blocker {
		if g >= 0 && isOn(g) && !slices.Contains(guard, b.sel(g)) {
			guard = append(guard, b.sel(g))
		}
	}
	for _, ng := range rerr.nogoods {
		body := make([]solver.Lit, 0, len(ng)+len(guard))
		for _, l := range ng {
			body = append(body, l.Not())
		}
		b.rule(0, append(body, guard...)...)
		clause := slices.Clone(ng)
		for _, l := range guard {
			clause = append(clause, l.Not())
		}
		if err := x.s.AddClause(clause...); err != nil {
			return fmt.Errorf("internal error: adding a room nogood: %w", err)
		}
		x.stats.Nogoods++
	}
	secIdx := x.work.SectionIndex()
	for _, id := range rerr.Sections {
		if s, ok := secIdx[id]; ok && !slices.Contains(x.raSecs, s) {
			x.raSecs = append(x.raSecs, s)
		}
	}
	return nil
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
