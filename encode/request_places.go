package encode

import (
	"context"
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Place is a start where a refused request's section could meet instead,
// with the room of a timetable that proves it; for a pattern section, a
// meeting pattern and room that a timetable gives it.
type Place struct {
	At     string `json:"at"`     // "Tue 10:00"; for a pattern "Tue Thu 10:30-11:45"
	Period int    `json:"period"` // index into Term.Periods; -1 for a meeting pattern
	Room   string `json:"room"`   // room in the proving timetable; "" for sections that take no room
	// Time is the 1-based meeting pattern (as Placement.Time); 0 on the grid.
	Time int `json:"time,omitempty"`
	// Cost is the pattern's and room's own preference penalty (criteria
	// time choice and room choice); pattern places are listed cheapest
	// first.
	Cost int `json:"cost,omitempty"`
}

// places tests every candidate start of request r's section, with request
// r switched off and everything else (other requests included) holding,
// and lists the starts where a meeting can go, in grid order. Each
// timetable found proves all the starts of that section it uses, which
// saves checks. The requested start itself is tested only when the request
// named a room (the time may work in another room); such a request is
// compiled into the room model, so a second explainer without it answers.
// complete is false when some check ran out of budget or time.
func (x *Explainer) places(ctx context.Context, r int) (out []Place, complete bool, err error) {
	if s := x.reqSec[r]; x.cat.IsPattern(s) {
		return x.placesPattern(ctx, s, x.patternSkip(r), x.allOn(x.reqGroup[r]))
	}
	if x.reqs[r].Room != "" {
		// The requested room narrows the section's rooms at the requested
		// start even with the request off: ask an explainer without it.
		others := make([]Request, 0, len(x.reqs)-1)
		others = append(others, x.reqs[:r]...)
		others = append(others, x.reqs[r+1:]...)
		y, err := NewExplainer(x.term, others, x.opt)
		if err != nil {
			return nil, false, err
		}
		out, complete, err = y.placesOf(ctx, x.reqSec[r], -1, y.allOn())
		x.stats.add(y.Stats())
		return out, complete, err
	}
	return x.placesOf(ctx, x.reqSec[r], x.reqStart[r], x.allOn(x.reqGroup[r]))
}

// placesOf tests the candidate starts of section s other than want with
// the groups of on holding.
func (x *Explainer) placesOf(ctx context.Context, s, want int, on []bool) (out []Place, complete bool, err error) {
	if x.cat.IsPattern(s) {
		return x.placesPattern(ctx, s, func(patPlace) bool { return false }, on)
	}
	if x.work.Sections[s].Meetings == 1 {
		return x.placesOne(ctx, s, want, on)
	}
	room := map[int]string{}
	complete = true
	for _, p := range x.cat.Candidates(s) {
		if _, ok := room[p]; ok || p == want {
			continue
		}
		if ctx.Err() != nil {
			return x.placeList(room), false, nil
		}
		res, err := x.check(ctx, on, []solver.Lit{solver.Pos(x.cat.StartAtom(s, p))})
		if err != nil {
			return nil, false, err
		}
		switch res.status {
		case solver.Satisfiable:
			if res.sched == nil {
				room[p] = ""
				continue
			}
			if err := x.quickPlaces(ctx, s, want, on, res, room); err != nil {
				return nil, false, err
			}
			id := x.work.Sections[s].ID
			for _, pl := range res.sched.Placements {
				if pl.Section == id {
					if _, ok := room[pl.Period]; !ok && pl.Period != want {
						room[pl.Period] = pl.Room
					}
				}
			}
		case solver.Unknown:
			complete = false
		}
	}
	return x.placeList(room), complete, nil
}

// placesOne finds the places of a one-meeting section by asking for a
// timetable that puts it anywhere not yet proven (every proven start and
// want assumed false): each answer proves one more place, and the first
// "no" rules out every start left, so the checks number the places plus
// one.
func (x *Explainer) placesOne(ctx context.Context, s, want int, on []bool) (out []Place, complete bool, err error) {
	room := map[int]string{}
	var not []solver.Lit
	if want >= 0 && x.cat.StartAtom(s, want) != 0 {
		not = append(not, solver.Neg(x.cat.StartAtom(s, want)))
	}
	id := x.work.Sections[s].ID
	for range x.cat.Candidates(s) {
		if ctx.Err() != nil {
			return x.placeList(room), false, nil
		}
		res, err := x.check(ctx, on, not)
		if err != nil {
			return nil, false, err
		}
		switch res.status {
		case solver.Unsatisfiable:
			return x.placeList(room), true, nil
		case solver.Unknown:
			return x.placeList(room), false, nil
		}
		p := -1
		if res.sched != nil {
			for _, pl := range res.sched.Placements {
				if pl.Section == id {
					p = pl.Period
					room[p] = pl.Room
				}
			}
		} else {
			for _, q := range x.cat.Candidates(s) {
				if a := x.cat.StartAtom(s, q); slices.Contains(res.model, a) {
					p = q
					room[p] = ""
				}
			}
		}
		if p < 0 || p == want {
			return nil, false, fmt.Errorf("internal error: a timetable places section %s where it was ruled out", id)
		}
		if res.sched != nil {
			if err := x.quickPlaces(ctx, s, want, on, res, room); err != nil {
				return nil, false, err
			}
		}
		not = not[:0]
		if want >= 0 && x.cat.StartAtom(s, want) != 0 {
			not = append(not, solver.Neg(x.cat.StartAtom(s, want)))
		}
		for q := range room {
			not = append(not, solver.Neg(x.cat.StartAtom(s, q)))
		}
	}
	return x.placeList(room), true, nil
}

// quickPlaces proves places of section s by moving it alone in a
// timetable res already found: with every other section's starts assumed
// as they are and a start q assumed for s, a model of the engine gives s's
// starts; when a room stays free for each of its meetings, res with s's
// meetings replaced is a new timetable, which must pass timetable.Check,
// and every start of s in it is a place. Starts it cannot prove this way
// are left to full checks. Sections whose rooms are tied (same-room
// relations, fixed rooms) are left out.
func (x *Explainer) quickPlaces(ctx context.Context, s, want int, on []bool, res explainCheck, room map[int]string) error {
	m := &x.cat.secs[s]
	if m.sameRoom >= 0 || len(m.fixedCand) > 0 {
		return nil
	}
	isOn := func(g int) bool { return g >= len(on) || on[g] }
	id := x.work.Sections[s].ID
	var fixed []solver.Lit
	for _, a := range res.model {
		if info := x.cat.AtomInfo(a); info.Kind == AtomStart && info.Section != s {
			fixed = append(fixed, solver.Pos(a))
		}
	}
	// Rooms taken by the other meetings of the timetable, period by period
	// (whatever their weeks: a conservative test).
	roomIdx, secIdx := x.work.RoomIndex(), x.work.SectionIndex()
	taken := map[[2]int]bool{}
	// People of s busy in the timetable, by period: a start where one of
	// them is busy in a common week cannot work with the rest fixed.
	sec := &x.work.Sections[s]
	mineWho := map[string]bool{}
	for _, w := range sec.Staff {
		mineWho["s"+w] = true
	}
	for _, w := range sec.Cohorts {
		mineWho["c"+w] = true
	}
	busy := map[int]bool{}
	var others []timetable.Placement
	for _, pl := range res.sched.Placements {
		if pl.Section == id {
			continue
		}
		others = append(others, pl)
		o := &x.work.Sections[secIdx[pl.Section]]
		shares := false
		for _, w := range o.Staff {
			shares = shares || mineWho["s"+w]
		}
		for _, w := range o.Cohorts {
			shares = shares || mineWho["c"+w]
		}
		shares = shares && x.cat.secs[secIdx[pl.Section]].weeks.Overlaps(m.weeks)
		r, hasRoom := roomIdx[pl.Room]
		for q := pl.Period; q < pl.Period+o.Length; q++ {
			if hasRoom {
				taken[[2]int{r, q}] = true
			}
			if shares {
				busy[q] = true
			}
		}
	}
	for _, q := range x.cat.Candidates(s) {
		if _, ok := room[q]; ok || q == want {
			continue
		}
		if ctx.Err() != nil {
			return nil
		}
		clash := false
		for t := q; t < q+m.length; t++ {
			clash = clash || busy[t]
		}
		if clash || (m.takesRoom && x.freeRoom(s, q, isOn, func(k [2]int) bool { return taken[k] }) < 0) {
			continue
		}
		x.stats.Checks++
		st, err := x.search.Solve(ctx, x.assumptions(isOn, append(fixed, solver.Pos(x.cat.StartAtom(s, q))))...)
		if err != nil {
			return err
		}
		switch st {
		case solver.Satisfiable:
			x.stats.Sat++
		case solver.Unsatisfiable:
			x.stats.Unsat++
			continue
		default:
			x.stats.Unknown++
			continue
		}
		moved := &timetable.Schedule{Placements: slices.Clone(others)}
		mine := map[[2]int]bool{}
		ok := true
		n := 0
		for _, p := range x.cat.Candidates(s) {
			if !x.search.Value(x.cat.StartAtom(s, p)) {
				continue
			}
			n++
			pl := timetable.Placement{Section: id, Meeting: n, Period: p}
			if m.takesRoom {
				r := x.freeRoom(s, p, isOn, func(k [2]int) bool { return taken[k] || mine[k] })
				if r < 0 {
					ok = false
					break
				}
				for t := p; t < p+m.length; t++ {
					mine[[2]int{r, t}] = true
				}
				pl.Room = x.work.Rooms[r].ID
			}
			moved.Placements = append(moved.Placements, pl)
		}
		if !ok || len(timetable.HardViolations(timetable.Check(x.term, moved))) > 0 {
			continue
		}
		for _, pl := range moved.Placements[len(others):] {
			if _, seen := room[pl.Period]; !seen && pl.Period != want {
				room[pl.Period] = pl.Room
			}
		}
	}
	return nil
}

// freeRoom returns a candidate room of section s's meeting at start q that
// is available and not taken in every period of the meeting, the best fit
// first, or -1.
func (x *Explainer) freeRoom(s, q int, isOn func(int) bool, taken func([2]int) bool) int {
	m := &x.cat.secs[s]
	if !m.takesRoom {
		return -1
	}
	// Best fit: the fewest seats that hold the section, then any.
	size := x.work.Sections[s].Size
	fits := func(r int) bool { return x.work.Rooms[r].Capacity >= size }
	best := -1
	rm := &x.cat.rooms
	rm.sets.sets[m.candAt(q)].each(func(r int) {
		for p := q; p < q+m.length; p++ {
			if taken([2]int{r, p}) || (rm.blocked[r] != nil && rm.blocked[r][p] && isOn(rm.blocker[r])) {
				return
			}
		}
		switch {
		case best < 0,
			fits(r) && !fits(best),
			fits(r) == fits(best) && x.work.Rooms[r].Capacity < x.work.Rooms[best].Capacity:
			best = r
		}
	})
	return best
}

// placeList orders places by period.
func (x *Explainer) placeList(room map[int]string) []Place {
	out := []Place{}
	for p := range x.work.Periods {
		if r, ok := room[p]; ok {
			out = append(out, Place{At: x.work.Periods[p].Label(), Period: p, Room: r})
		}
	}
	return out
}
