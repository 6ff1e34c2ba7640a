package encode

import (
	"context"
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
)

// Place is a start where a refused request's section could meet instead,
// with the room of a timetable that proves it.
type Place struct {
	At     string `json:"at"`     // "Tue 10:00"
	Period int    `json:"period"` // index into Term.Periods
	Room   string `json:"room"`   // room in the proving timetable; "" for sections that take no room
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
		not = append(not, solver.Neg(x.cat.StartAtom(s, p)))
	}
	return x.placeList(room), true, nil
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
