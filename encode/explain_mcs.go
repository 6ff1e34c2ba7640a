package encode

import (
	"context"
	"slices"

	"github.com/termwright/termwright/solver"
)

// maxCorrectionRounds caps the checks of one search for corrections.
const maxCorrectionRounds = 100

// corrections finds up to k relaxations: sets of requirement groups and,
// with several requests, requests (never sections) whose switching off
// lets every other group hold, each minimal (no proper subset works),
// cheapest first by summed relaxCost; dropping one of several requests is
// a way out like relaxing a requirement (dropping the only request is
// the question itself, not an answer). It uses the hitting-set duality between minimal unsatisfiable
// sets and minimal correction sets (Reiter 1987; Liffiton & Sakallah 2008)
// as an implicit hitting-set loop: a minimum-cost set hitting every known
// conflict is tried; if the rest still cannot hold, the engine's core is a
// new conflict to hit; if it can, the set is a correction and is blocked
// (no later answer may contain it). seeds are known conflicts (sets of
// groups that cannot all hold). done reports that no further relaxation
// exists (every relaxation was listed, or none exists at all); it is false
// when k were found or budget, time or the round cap ran out.
func (x *Explainer) corrections(ctx context.Context, seeds [][]int, k int) (found [][]int, done bool, err error) {
	relaxable := func(gs []int) []int {
		var out []int
		for _, g := range gs {
			if x.relaxable(g) {
				out = append(out, g)
			}
		}
		return out
	}
	var conflicts [][]int
	for _, s := range seeds {
		conflicts = append(conflicts, relaxable(s))
	}
	for round := 0; round < maxCorrectionRounds && len(found) < k; round++ {
		if ctx.Err() != nil {
			return found, false, nil
		}
		h, ok, proven := minHittingSet(conflicts, found, x.relaxCost)
		if !ok {
			return found, proven, nil
		}
		r, err := x.check(ctx, x.allOn(h...), nil)
		if err != nil {
			return nil, false, err
		}
		switch r.status {
		case solver.Satisfiable:
			found = append(found, h)
		case solver.Unsatisfiable:
			c := relaxable(r.core)
			if len(c) == 0 {
				// Sections (and a single request) alone conflict: nothing to relax.
				return found, true, nil
			}
			c = x.trim(ctx, r.core, c)
			conflicts = append(conflicts, c)
		default:
			return found, false, nil
		}
	}
	return found, false, nil
}

// trim re-solves a core on itself once (everything else off) and returns
// the relaxable part of the smaller core when that is still a conflict.
func (x *Explainer) trim(ctx context.Context, core, relaxable []int) []int {
	keep := []groupRole{roleSection}
	if len(x.reqs) < 2 { // a single request stays: it is not relaxable
		keep = append(keep, roleRequest)
	}
	r, err := x.check(ctx, x.onlyOn(core, keep...), nil)
	if err != nil || r.status != solver.Unsatisfiable {
		return relaxable
	}
	var out []int
	for _, g := range r.core {
		if x.relaxable(g) {
			out = append(out, g)
		}
	}
	if len(out) == 0 || len(out) >= len(relaxable) {
		return relaxable
	}
	return slices.Clip(out)
}

// relaxCost is what giving up group g costs a correction: its RelaxCost,
// and at least 1, so that a request (RelaxCost 0) counts like the mildest
// preference and every member makes a correction dearer.
func (x *Explainer) relaxCost(g int) int { return max(1, x.cat.Groups[g].RelaxCost) }

// relaxable reports whether a correction may switch group g off: a
// requirement, or a request when there are several.
func (x *Explainer) relaxable(g int) bool {
	switch x.role(g) {
	case roleRequirement:
		return true
	case roleRequest:
		return len(x.reqs) > 1
	}
	return false
}
