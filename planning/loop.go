package planning

import (
	"context"
	"fmt"
	"slices"
	"strings"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/sectioning"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Shares of a round's time (with a deadline): the optimiser takes
// optimiseShare, the sectioner the rest (and whatever the optimiser leaves).
const optimiseShare = 0.75

// planned is one sectioned timetable of the loop.
type planned struct {
	res   *encode.OptimizeResult // the optimiser's result on the working term
	sec   *sectioning.Result
	sched *timetable.Schedule // res.Schedule with sec's students
	cost  timetable.CostReport
	total []int64 // cost.ByLevel per level of levels
}

// loop is the state of one Plan call on a term with requests.
type loop struct {
	ctx    context.Context
	t      *timetable.Term
	opt    Options
	levels []int // the term's levels, highest first
	best   *planned
	rounds []Round
	bound  []int64 // per level of levels: what the first round proved
}

func planWithRequests(ctx context.Context, t *timetable.Term, opt Options) (*Result, error) {
	l := &loop{ctx: ctx, t: t, opt: opt, levels: termLevels(t)}
	rounds := opt.Rounds
	if rounds == 0 {
		rounds = DefaultRounds
	}
	rounds = max(rounds, 0)
	first, err := l.round(0, rounds+1, nil)
	if err != nil || first == nil {
		return l.result(first, err)
	}
	l.bound = l.levelBound(first.res)
	l.keep(first)
	for r := 1; r <= rounds && ctx.Err() == nil; r++ {
		p, err := l.round(r, rounds+1-r, l.best)
		if err != nil {
			return nil, err
		}
		if p == nil {
			break
		}
		l.keep(p)
	}
	return l.result(nil, nil)
}

// round optimises the timetable on the working term (with from's seated
// students as fixed, none in the first round) and seats the students in
// it; left counts this round and those after it, which share the time
// left. A nil result means the optimiser found no timetable.
func (l *loop) round(r, left int, from *planned) (*planned, error) {
	end, timed := l.ctx.Deadline()
	octx, sctx := l.ctx, l.ctx
	if timed {
		span := time.Until(end) / time.Duration(left)
		var c1, c2 context.CancelFunc
		octx, c1 = context.WithTimeout(l.ctx, time.Duration(optimiseShare*float64(span)))
		defer c1()
		sctx, c2 = context.WithTimeout(l.ctx, span)
		defer c2()
	}
	var seated []timetable.Enrolment
	o := l.opt.OptimizeOptions
	o.Keep = workingKeep(o.Keep)
	o.Seed = l.opt.Seed + int64(r)*104729
	if from != nil {
		seated = from.sec.Enrolments
		o.Start = from.res.Schedule
	}
	work := workingTerm(l.t, seated)
	res, err := encode.OptimizePortfolio(octx, work, o, max(l.opt.Threads, 1))
	if err != nil {
		return nil, err
	}
	if res.Status != solver.Satisfiable || res.Schedule == nil {
		if r == 0 {
			return &planned{res: res}, nil
		}
		return nil, nil
	}
	sec, err := sectioning.Section(sctx, l.t, res.Schedule, sectioning.Options{Seed: l.opt.Seed, Keep: l.opt.Keep})
	if err != nil {
		return nil, err
	}
	return l.judge(res, sec)
}

// judge puts a sectioned timetable through timetable.Check on the term and
// evaluates its full cost.
func (l *loop) judge(res *encode.OptimizeResult, sec *sectioning.Result) (*planned, error) {
	sched := withEnrolments(res.Schedule, sec.Enrolments)
	if hard := timetable.HardViolations(timetable.Check(l.t, sched)); len(hard) > 0 {
		msgs := make([]string, 0, min(len(hard), 11))
		for i, v := range hard {
			if i == 10 {
				msgs = append(msgs, fmt.Sprintf("and %d more", len(hard)-10))
				break
			}
			msgs = append(msgs, v.Msg)
		}
		return nil, fmt.Errorf("%w (after sectioning):\n  %s", encode.ErrCheckFailed, strings.Join(msgs, "\n  "))
	}
	p := &planned{res: res, sec: sec, sched: sched, cost: timetable.Cost(l.t, sched, l.opt.Keep)}
	p.total = l.byLevel(p.cost)
	return p, nil
}

// keep records round p and makes it the best when its full cost is lower.
func (l *loop) keep(p *planned) {
	better := l.best == nil || slices.Compare(p.total, l.best.total) < 0
	l.rounds = append(l.rounds, Round{Total: p.total, Clashes: p.cost.Criterion(timetable.CritStudentClash).Count, Kept: better})
	if better {
		l.best = p
	}
}

// result assembles Plan's result from the best round (or from first, a
// round without a timetable).
func (l *loop) result(first *planned, err error) (*Result, error) {
	if err != nil {
		return nil, err
	}
	if l.best == nil {
		return &Result{OptimizeResult: first.res, Rounds: l.rounds}, nil
	}
	b := l.best
	res := *b.res
	res.Schedule = b.sched
	res.Cost = b.cost
	res.Levels = l.levels
	res.Total = b.total
	res.Bound = l.bound
	res.Proven = slices.Equal(res.Total, res.Bound)
	res.TimeProven = slices.Equal(l.byLevel(encode.TimeCost(l.t, b.sched, l.opt.Keep)), res.Bound)
	if res.Proven {
		res.Stopped = "optimal"
	}
	return &Result{OptimizeResult: &res, Sectioning: b.sec, Rounds: l.rounds}, nil
}

// levelBound maps the first round's bound (proven on the term with its
// fixed students only) onto the term's levels; levels the working term
// lacks get 0. Seating students only adds units (unplaced requests, moved
// students, their clashes), so every timetable's full cost is at least its
// working cost criterion by criterion, and the bound holds for the term.
func (l *loop) levelBound(res *encode.OptimizeResult) []int64 {
	out := make([]int64, len(l.levels))
	for i, lv := range l.levels {
		if k := slices.Index(res.Levels, lv); k >= 0 && k < len(res.Bound) {
			out[i] = res.Bound[k]
		}
	}
	return out
}

// byLevel is rep.ByLevel per level of l.levels.
func (l *loop) byLevel(rep timetable.CostReport) []int64 {
	out := make([]int64, len(l.levels))
	for i, lv := range l.levels {
		out[i] = rep.ByLevel[lv]
	}
	return out
}

// termLevels lists the levels of the criteria switched on for t, highest
// first (the levels of timetable.Cost's ByLevel).
func termLevels(t *timetable.Term) []int {
	var out []int
	for _, c := range timetable.Criteria {
		if w, l := t.CriterionWeight(c.Name); w != 0 && !slices.Contains(out, l) {
			out = append(out, l)
		}
	}
	slices.Sort(out)
	slices.Reverse(out)
	return out
}
