package encode

import (
	"context"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Explain answers whether term t has a timetable that grants the requests
// (none: the whole term), and if not, why not and what would have to give.
// See Explainer.Run.
func Explain(ctx context.Context, t *timetable.Term, reqs []Request, opt ExplainOptions) (*Explanation, error) {
	x, err := NewExplainer(t, reqs, opt)
	if err != nil {
		return nil, err
	}
	return x.Run(ctx)
}

// Run answers the Explainer's question:
//   - with every requirement and request holding, a timetable is searched
//     for; one found is verified (solver.Verify, timetable.Check, every
//     request honoured) and returned with, when there are requests, its
//     preference cost beside a timetable without them;
//   - otherwise the engine's core is shrunk to a minimal conflict (the
//     reasons, most specific first, and exactly the sections involved),
//     the cheapest relaxations are listed, and for requests: whether the
//     term works without them, whether each works alone, and the places
//     where a refused request's section could meet instead.
//
// When ctx has a deadline, shrinking may use half of the time left,
// relaxations half of what then remains, and places the rest; whatever
// runs out is reported as not minimal or not complete.
func (x *Explainer) Run(ctx context.Context) (*Explanation, error) {
	out := &Explanation{Term: x.term.Name, Requests: x.requestResults(), Corrections: []Correction{}}
	defer func() { out.Stats = x.Stats() }()
	r, err := x.check(ctx, x.allOn(), nil)
	if err != nil {
		return nil, err
	}
	switch r.status {
	case solver.Unknown:
		out.Status = StatusUnknown
		return out, nil
	case solver.Satisfiable:
		return out, x.granted(ctx, out, r)
	}
	out.Status = StatusInfeasible
	if len(x.reqs) > 0 {
		out.Status = StatusRefused
	}
	sctx, cancel := share(ctx, 0.5)
	mus, minimal, err := x.shrink(sctx, r.core)
	cancel()
	if err != nil {
		return nil, err
	}
	out.Conflict = x.conflict(mus, r.core, minimal)
	if len(x.reqs) > 0 {
		if err := x.answerRequests(ctx, out); err != nil {
			return nil, err
		}
	}
	if k := x.alternatives(); k > 0 {
		cctx, cancel := share(ctx, 0.5)
		found, done, err := x.corrections(cctx, [][]int{mus, r.core}, k)
		cancel()
		if err != nil {
			return nil, err
		}
		for _, h := range found {
			out.Corrections = append(out.Corrections, x.correction(h))
		}
		out.CorrectionsComplete = done
	}
	if len(x.reqs) > 0 && !x.opt.NoPlaces && !out.TermInfeasible {
		for i := range out.Requests {
			rr := &out.Requests[i]
			if rr.GrantedAlone && len(x.reqs) > 1 {
				continue
			}
			rr.Places, rr.PlacesComplete, err = x.places(ctx, i)
			if err != nil {
				return nil, err
			}
		}
	}
	if x.incomplete {
		out.Uncertain = "a room combination was ruled out without a complete proof (the exact room search ran out of budget), so this answer may be too strict"
	}
	return out, nil
}

func (x *Explainer) alternatives() int {
	switch {
	case x.opt.Alternatives < 0:
		return 0
	case x.opt.Alternatives == 0:
		return 3
	}
	return x.opt.Alternatives
}

// granted fills the answer yes: a verified timetable and, with requests,
// the cost comparison.
func (x *Explainer) granted(ctx context.Context, out *Explanation, r checkResult) error {
	out.Status = StatusFeasible
	if len(x.reqs) > 0 {
		out.Status = StatusGranted
	}
	if err := x.witness(r); err != nil {
		return err
	}
	out.Schedule = r.sched
	for i := range out.Requests {
		out.Requests[i].Granted, out.Requests[i].GrantedAlone = true, true
	}
	if len(x.reqs) == 0 {
		return nil
	}
	with := timetable.Cost(x.term, r.sched, nil)
	if len(x.p.Weaks) == 0 {
		out.Cost = compareCost("first found", with, timetable.CostReport{ByLevel: map[int]int64{}})
		out.Cost.Compared = false
		return nil
	}
	best, err := x.optimised(ctx, x.allOn())
	if err != nil || best == nil {
		return err
	}
	without, err := x.optimised(ctx, x.allOn(x.reqGroup...))
	if err != nil || without == nil {
		return err
	}
	out.Schedule = best
	out.Cost = compareCost("optimised", timetable.Cost(x.term, best, nil), timetable.Cost(x.term, without, nil))
	out.Cost.Compared = true
	return nil
}

// optimised runs the engine's optimiser with the groups of on holding and
// returns the best timetable found, verified and checked, or nil when the
// best model cannot be given rooms or fails a check (the first timetable
// found then stands).
func (x *Explainer) optimised(ctx context.Context, on []bool) (*timetable.Schedule, error) {
	isOn := func(g int) bool { return g >= len(on) || on[g] }
	x.s.Assume(x.assumptions(isOn, nil)...)
	st, _, err := x.s.Optimize(ctx, nil)
	if err != nil || st != solver.Satisfiable {
		return nil, nil
	}
	model := x.s.Model(nil)
	if err := solver.Verify(x.p, model); err != nil {
		return nil, nil
	}
	sched, err := x.decode(model, isOn)
	if err != nil {
		return nil, nil
	}
	if len(timetable.HardViolations(timetable.Check(x.term, sched))) > 0 {
		return nil, nil
	}
	return sched, nil
}

// answerRequests checks whether the term works without any request and,
// with several requests, whether each works alone.
func (x *Explainer) answerRequests(ctx context.Context, out *Explanation) error {
	r, err := x.check(ctx, x.allOn(x.reqGroup...), nil)
	if err != nil {
		return err
	}
	out.TermInfeasible = r.status == solver.Unsatisfiable
	if out.TermInfeasible || len(x.reqs) == 1 {
		return nil
	}
	for i := range x.reqs {
		var others []int
		for j, g := range x.reqGroup {
			if j != i {
				others = append(others, g)
			}
		}
		r, err := x.check(ctx, x.allOn(others...), nil)
		if err != nil {
			return err
		}
		out.Requests[i].GrantedAlone = r.status == solver.Satisfiable
	}
	return nil
}

// share returns a context whose deadline leaves the given share of the
// time ctx has left (ctx itself when it has no deadline).
func share(ctx context.Context, frac float64) (context.Context, context.CancelFunc) {
	dl, ok := ctx.Deadline()
	if !ok {
		return context.WithCancel(ctx)
	}
	left := time.Until(dl)
	return context.WithDeadline(ctx, time.Now().Add(time.Duration(float64(left)*frac)))
}
