package encode

import (
	"context"
	"slices"
	"sort"

	"github.com/termwright/termwright/solver"
)

// maxTrimRounds caps the re-solves of a core on itself before shrinking.
const maxTrimRounds = 3

// shrink reduces core, a set of groups that cannot all hold (every other
// group switched off), to a minimal such set: switching off any one member
// makes the rest satisfiable. It is deletion-based with core re-use (after
// an unsatisfiable check the engine's core replaces the set) and deletes in
// halving chunks, so a set of n members with a minimal subset of k costs
// about k·log(n/k) checks rather than n (the divide-and-conquer idea of
// QuickXplain, Junker 2004; core re-use as in ENGINE-NOTES §7). Members are
// tried for deletion in an order that keeps the most specific reasons:
// broad requirements first, then sections, requests last. A check that
// runs out of budget keeps its member and clears minimal.
//
// Pre: the groups of core cannot all hold. Post: the result cannot all
// hold; when minimal is true, switching off any one member of it gives a
// satisfiable check.
func (x *Explainer) shrink(ctx context.Context, core []int) (mus []int, minimal bool, err error) {
	return x.shrinkFrom(ctx, core, true)
}

// shrinkFrom is shrink; trim false skips re-solving the set on itself (for
// a set proved unsatisfiable otherwise, whose proof by search may be long).
func (x *Explainer) shrinkFrom(ctx context.Context, core []int, trim bool) (mus []int, minimal bool, err error) {
	minimal = true
	set := x.deletionOrder(core)
	for round := 0; trim && round < maxTrimRounds; round++ {
		r, err := x.check(ctx, x.onlyOn(set), nil)
		if err != nil {
			return nil, false, err
		}
		if r.status != solver.Unsatisfiable || len(r.core) >= len(set) {
			break
		}
		set = x.deletionOrder(r.core)
	}
	necessary := map[int]bool{}
	pending := slices.Clone(set)
	chunk := max(1, len(pending)/2)
	for len(pending) > 0 {
		if ctx.Err() != nil {
			return set, false, nil
		}
		n := min(chunk, len(pending))
		drop := pending[:n]
		rest := make([]int, 0, len(set))
		for _, g := range set {
			if !slices.Contains(drop, g) {
				rest = append(rest, g)
			}
		}
		r, err := x.check(ctx, x.onlyOn(rest), nil)
		if err != nil {
			return nil, false, err
		}
		switch r.status {
		case solver.Unsatisfiable:
			// Keep what the core names, the members known to be
			// necessary, and nothing that was dropped.
			next := slices.Clone(r.core)
			for g := range necessary {
				if !slices.Contains(next, g) {
					next = append(next, g)
				}
			}
			set = x.deletionOrder(next)
			var left []int
			for _, g := range pending[n:] {
				if slices.Contains(set, g) {
					left = append(left, g)
				}
			}
			for _, g := range set {
				if !necessary[g] && !slices.Contains(left, g) && !slices.Contains(pending, g) {
					left = append(left, g) // new groups found by this check
				}
			}
			pending = left
		default:
			if n > 1 {
				chunk = n / 2
				continue
			}
			if r.status == solver.Unknown {
				minimal = false
			}
			necessary[drop[0]] = true
			pending = pending[1:]
		}
	}
	return set, minimal, nil
}

// deletionOrder sorts groups for deletion: requirements from the broadest
// to the most specific, then sections, then requests; duplicates dropped.
func (x *Explainer) deletionOrder(groups []int) []int {
	out := slices.Clone(groups)
	slices.Sort(out)
	out = slices.Compact(out)
	rank := func(g int) int {
		switch x.role(g) {
		case roleSection:
			return 1000
		case roleRequest:
			return 2000
		}
		return -reasonSpecificity(x.cat.Groups[g].Kind)
	}
	sort.SliceStable(out, func(i, j int) bool {
		ri, rj := rank(out[i]), rank(out[j])
		if ri != rj {
			return ri < rj
		}
		return len(x.cat.Groups[out[i]].Src) > len(x.cat.Groups[out[j]].Src)
	})
	return out
}

// reasonSpecificity ranks group kinds from the most specific (a request, one
// fixed meeting) to the broadest (every room of a kind): explanations list
// reasons in this order.
func reasonSpecificity(kind string) int {
	order := []string{
		KindRequest, KindFixed, KindSectionAvail, KindSectionDays, KindRoomFit, KindRelation,
		KindStaffAvailability, KindCohortAvailability, KindRoomAvailability,
		KindStaffDayLimit, KindStaffConsecutive, KindStaffNoOverlap, KindCohortNoOverlap,
		KindRoomSupply, KindRoomAssignment, KindSection,
	}
	if i := slices.Index(order, kind); i >= 0 {
		return len(order) - i
	}
	return 0
}
