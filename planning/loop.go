package planning

import (
	"context"
	"errors"
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

// firstRoundWeight shortens the first round's optimisation: it sees no
// sectioned students, so time spent polishing its timetable is mostly
// lost once they are seated (on one shared instance the first round's
// student clashes were 97% of its cost).
const firstRoundWeight = 0.4

// onlyRoundShare is the optimiser's share without rounds (Options.Rounds
// negative): the sectioner runs once.
const onlyRoundShare = 0.9

// planned is one sectioned timetable of the loop.
type planned struct {
	res   *encode.OptimizeResult // the optimiser's result on the working term
	sec   *sectioning.Result
	sched *timetable.Schedule // res.Schedule with sec's students
	cost  timetable.CostReport
	total []int64 // cost.ByLevel per level of levels
	// sameSeating: the round kept the seating it started from, which cost
	// less on its timetable than seating the students again.
	sameSeating bool
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
	start  time.Time
}

func planWithRequests(ctx context.Context, t *timetable.Term, opt Options) (*Result, error) {
	l := &loop{ctx: ctx, t: t, opt: opt, levels: termLevels(t), start: time.Now()}
	rounds := opt.Rounds
	if rounds == 0 {
		rounds = DefaultRounds
	}
	rounds = max(rounds, 0)
	first, err := l.round(0, rounds+1, nil)
	if err != nil || first.sched == nil {
		return l.result(first, err)
	}
	l.bound = l.levelBound(first.res)
	l.keep(first)
	for r := 1; ctx.Err() == nil && (r <= rounds || opt.Rounds >= 0 && l.timeForMore()); r++ {
		p, err := l.round(r, max(rounds+1-r, 1), l.best)
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

// timeForMore reports whether ctx has a deadline and more than
// extraRoundShare of Plan's time is left after the planned rounds: the
// loop then goes on with more rounds.
func (l *loop) timeForMore() bool {
	end, timed := l.ctx.Deadline()
	return timed && time.Until(end) > time.Duration(extraRoundShare*float64(end.Sub(l.start)))
}

// extraRoundShare is the share of Plan's time that must be left for a
// round beyond Options.Rounds.
const extraRoundShare = 0.1

// round optimises the timetable on the working term (with from's seated
// students as fixed, none in the first round) and seats the students in
// it; left counts this round and those after it, which share the time
// left. A nil result means the optimiser found no timetable.
func (l *loop) round(r, left int, from *planned) (*planned, error) {
	var seated []timetable.Enrolment
	o := l.opt.OptimizeOptions
	o.Keep = workingKeep(o.Keep)
	o.Seed = l.opt.Seed + int64(r)*104729
	if from != nil {
		seated = from.sec.Enrolments
		o.Start = from.res.Schedule
		if o.GlobalConflicts == 0 && skipLaterGlobal {
			o.GlobalConflicts = -1
		}
	}
	octx, stop := l.optimiseCtx(&o, left, r == 0)
	work := workingTerm(l.t, seated)
	res, err := encode.OptimizePortfolio(octx, work, o, max(l.opt.Threads, 1))
	stop()
	if err != nil {
		return nil, err
	}
	if res.Status != solver.Satisfiable || res.Schedule == nil {
		if r == 0 {
			return &planned{res: res}, nil
		}
		return nil, nil
	}
	sctx := l.ctx
	if end, timed := l.ctx.Deadline(); timed {
		var cancel context.CancelFunc
		sctx, cancel = context.WithTimeout(l.ctx, time.Until(end)/time.Duration(left+1))
		defer cancel()
	}
	sec, err := sectioning.Section(sctx, l.t, res.Schedule, sectioning.Options{Seed: l.opt.Seed, Keep: l.opt.Keep})
	if err != nil {
		return nil, err
	}
	p, err := l.judge(res, sec)
	if err != nil || from == nil {
		return p, err
	}
	// The timetable was optimised for the seating it started from, and
	// that seating holds on it (the seating rule does not depend on
	// times): it competes with the new one.
	old, err := l.judge(res, from.sec)
	if err != nil {
		return nil, err
	}
	if slices.Compare(old.total, p.total) < 0 {
		old.sameSeating = true
		return old, nil
	}
	return p, nil
}

// optimiseCtx is the context of a round's optimisation: with a deadline,
// it ends once the optimiser has a timetable and its share of the round
// (optimiseShare of the time left over left rounds, less for the first)
// is spent, so that a
// slow first timetable is never thrown away; o's Progress is wrapped to
// watch. stop releases it.
func (l *loop) optimiseCtx(o *encode.OptimizeOptions, left int, first bool) (context.Context, func()) {
	end, timed := l.ctx.Deadline()
	if !timed {
		return l.ctx, func() {}
	}
	ctx, cancel := context.WithCancel(l.ctx)
	share := optimiseShare
	switch {
	case l.opt.Rounds < 0:
		share = onlyRoundShare
	case first:
		share *= firstRoundWeight
	}
	due := time.Now().Add(time.Duration(share * float64(time.Until(end)) / float64(left)))
	user := o.Progress
	o.Progress = func(p encode.Progress) {
		if user != nil {
			user(p)
		}
		if p.Cost != nil && time.Now().After(due) {
			cancel()
		}
	}
	if o.ProgressEvery <= 0 || o.ProgressEvery > time.Second {
		o.ProgressEvery = 250 * time.Millisecond
	}
	return ctx, cancel
}

// skipLaterGlobal skips the whole-term phase of the optimiser in rounds
// after the first unless the caller set its budget: its lower bounds
// hold only for the working copy and are not used, and the rounds start
// from a good timetable, which neighbourhood search improves. On one
// shared instance at 180 s (loaded 2-core machine, one run against two)
// skipping gave 5,253 against 7,646 and 9,914.
var skipLaterGlobal = true

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
	l.rounds = append(l.rounds, Round{Total: p.total, Clashes: p.cost.Criterion(timetable.CritStudentClash).Count,
		Kept: better, At: time.Since(l.start), SameSeating: p.sameSeating})
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
		return &Result{OptimizeResult: first.res}, nil
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
	// The optimiser's reason is about its working copy of the term (an
	// optimum there is none here): say why the loop ended instead.
	switch {
	case res.Proven:
		res.Stopped = "optimal"
	case errors.Is(l.ctx.Err(), context.DeadlineExceeded):
		res.Stopped = "time limit"
	case l.ctx.Err() != nil:
		res.Stopped = "interrupted"
	default:
		res.Stopped = "rounds done"
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
