package encode

import (
	"context"
	"fmt"
	"slices"
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
	// A load that exceeds what someone has left is a proof by counting:
	// start from it instead of searching (pigeonhole conflicts are hard
	// for the engine).
	core := x.countingConflict()
	counted := core != nil
	if !counted {
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
		core = r.core
	}
	out.Status = StatusInfeasible
	if len(x.reqs) > 0 {
		out.Status = StatusRefused
	}
	sctx, cancel := explainShare(ctx, 0.5)
	mus, minimal, err := x.shrinkFrom(sctx, core, !counted)
	cancel()
	if err != nil {
		return nil, err
	}
	out.Conflict = x.conflict(mus, core, minimal)
	out.Conflict.Counted = counted
	switch {
	case counted && len(x.reqs) > 0:
		out.TermInfeasible = true
	case len(x.reqs) > 0:
		if err := x.answerRequests(ctx, out); err != nil {
			return nil, err
		}
	}
	if k := x.alternatives(); k > 0 {
		cctx, cancel := explainShare(ctx, 0.5)
		found, done, err := x.corrections(cctx, [][]int{mus, core}, k)
		cancel()
		if err != nil {
			return nil, err
		}
		for _, h := range found {
			out.Corrections = append(out.Corrections, x.correction(h))
		}
		sortCorrections(out.Corrections)
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
func (x *Explainer) granted(ctx context.Context, out *Explanation, r explainCheck) error {
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
	out.Cost = compareCost("first found", timetable.Cost(x.term, r.sched, nil), timetable.CostReport{ByLevel: map[int]int64{}})
	if x.opt.NoCost || len(termLevels(x.term)) == 0 {
		return nil
	}
	return x.compareOptimised(ctx, out)
}

// Budgets of the two optimisations that price a granted request: small,
// since the comparison is a courtesy ("if cheap").
const (
	costGlobalConflicts = 20_000
	costMaxStall        = 40
)

// compareOptimised optimises the term with the requests as fixed meetings
// and without them (each within a small budget and a quarter of the time
// left) and, when both give timetables, compares their preference costs
// and keeps the optimised timetable that grants the requests.
func (x *Explainer) compareOptimised(ctx context.Context, out *Explanation) error {
	opt := OptimizeOptions{Seed: x.opt.Seed, GlobalConflicts: costGlobalConflicts, MaxStall: costMaxStall}
	wctx, cancel := explainShare(ctx, 0.25)
	fixedTerm, back := requestsFixed(x.term, x.reqs)
	with, err := Optimize(wctx, fixedTerm, opt)
	cancel()
	if err != nil {
		return err
	}
	if with.Schedule != nil {
		back(with.Schedule)
	}
	octx, cancel := explainShare(ctx, 0.33)
	without, err := Optimize(octx, x.term, opt)
	cancel()
	if err != nil {
		return err
	}
	if with.Status != solver.Satisfiable || without.Status != solver.Satisfiable {
		return nil
	}
	if hard := timetable.HardViolations(timetable.Check(x.term, with.Schedule)); len(hard) > 0 {
		return fmt.Errorf("%w: %s", ErrCheckFailed, hard[0].Msg)
	}
	for _, req := range x.reqs {
		if !grantsRequest(x.term, with.Schedule, req) {
			return fmt.Errorf("internal error: the optimised timetable does not grant the request %s", req)
		}
	}
	out.Schedule = with.Schedule
	out.Cost = compareCost("optimised", timetable.Cost(x.term, with.Schedule, nil), timetable.Cost(x.term, without.Schedule, nil))
	out.Cost.Compared = true
	return nil
}

// requestsFixed is a copy of t in which every request on a grid section
// is a fixed meeting and every pattern section with requests keeps only
// the requested patterns and room; back turns a timetable of the copy into
// one of t.
func requestsFixed(t *timetable.Term, reqs []Request) (c *timetable.Term, back func(*timetable.Schedule)) {
	cp := *t
	c = &cp
	c.Sections = slices.Clone(t.Sections)
	idx := t.SectionIndex()
	back = patternRequestsFixed(c, reqs)
	for _, r := range reqs {
		if t.Sections[idx[r.Section]].UsesTimes() {
			continue
		}
		sec := &c.Sections[idx[r.Section]]
		p := t.PeriodAt(r.Day, r.Start)
		done := false
		sec.Fixed = slices.Clone(sec.Fixed)
		for i, f := range sec.Fixed {
			if t.PeriodAt(f.Day, f.Start) == p {
				if f.Room == "" {
					sec.Fixed[i].Room = r.Room
				}
				done = true
			}
		}
		if !done {
			sec.Fixed = append(sec.Fixed, timetable.Fixed{Day: r.Day, Start: r.Start, Room: r.Room, Text: r.At() + ", as requested"})
		}
	}
	return c, back
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

// explainShare returns a context whose deadline leaves the given share of the
// time ctx has left (ctx itself when it has no deadline).
func explainShare(ctx context.Context, frac float64) (context.Context, context.CancelFunc) {
	dl, ok := ctx.Deadline()
	if !ok {
		return context.WithCancel(ctx)
	}
	left := time.Until(dl)
	return context.WithDeadline(ctx, time.Now().Add(time.Duration(float64(left)*frac)))
}
