package encode

import (
	"context"

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
// named a room (the time may work in another room). complete is false when
// some check ran out of budget or time.
func (x *Explainer) places(ctx context.Context, r int) (out []Place, complete bool, err error) {
	s, want := x.reqSec[r], x.reqStart[r]
	on := x.allOn(x.reqGroup[r])
	room := map[int]string{}
	complete = true
	for _, p := range x.cat.Candidates(s) {
		if _, ok := room[p]; ok || (p == want && x.reqs[r].Room == "") {
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
					if _, ok := room[pl.Period]; !ok && (pl.Period != want || x.reqs[r].Room != "") {
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
