package encode

import (
	"context"
	"fmt"
	"slices"
	"sort"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// patPlace is one (pattern, room) choice of a pattern section: k the
// 0-based pattern, r the room index or -1 for a section that takes none.
type patPlace struct{ k, r int }

// placesPattern lists every (meeting pattern, room) of pattern section s
// that some full timetable with the groups of on holding gives it, skip
// aside, cheapest first (placeCost), then in pattern and room order. Each
// is proved by a timetable that passes timetable.Check, found by a check
// with the choice assumed; a pattern or room tried alone first rules out
// all its pairs with one check when no timetable has it. (Moving the
// section alone in each timetable found and running timetable.Check on
// the result proves more per search, but on the public ITC-2019 instance
// bet-sum18 it took 5.6 of 6 seconds for a section of 7 patterns and 32
// rooms, against 0.4 seconds for the searches alone; shared 2-core
// machine.) complete is false when a check ran out of budget or ctx
// ended.
func (x *Explainer) placesPattern(ctx context.Context, s int, skip func(patPlace) bool, on []bool) (out []Place, complete bool, err error) {
	pm := &x.cat.pats[s]
	var cands []patPlace
	for _, k := range pm.times {
		if pm.roomAt == nil {
			cands = append(cands, patPlace{k, -1})
			continue
		}
		for _, r := range pm.rooms {
			cands = append(cands, patPlace{k, r})
		}
	}
	cands = slices.DeleteFunc(cands, skip)
	cost := func(c patPlace) int { return x.placeCost(s, c) }
	sort.SliceStable(cands, func(i, j int) bool { return cost(cands[i]) < cost(cands[j]) })
	proved := map[patPlace]bool{}
	complete = true
	// A pattern or room that no timetable gives the section rules out all
	// of its pairs with one check: each is tried alone first.
	dead := map[patPlace]bool{} // {k,-2}: pattern k impossible; {-2,r}: room r impossible
	tried := map[patPlace]bool{}
	// try checks the section at the choice of one or two atoms and records
	// what the timetable found proves; it reports whether one was found.
	try := func(c patPlace, lits ...solver.Lit) (bool, error) {
		res, err := x.check(ctx, on, lits)
		if err != nil {
			return false, err
		}
		switch res.status {
		case solver.Unknown:
			complete = false
			return false, nil
		case solver.Unsatisfiable:
			return false, nil
		}
		if res.sched == nil {
			complete = false // rooms of a relaxed term only: not a proof
			return false, nil
		}
		if hard := timetable.HardViolations(timetable.Check(x.term, res.sched)); len(hard) > 0 {
			return false, fmt.Errorf("%w: %s", ErrCheckFailed, hard[0].Msg)
		}
		got, ok := x.placeOf(res.sched, s)
		if !ok || (c.k >= 0 && got.k != c.k) || (c.r >= 0 && got.r != c.r) {
			return false, fmt.Errorf("internal error: a timetable places section %s elsewhere than assumed", x.work.Sections[s].ID)
		}
		if !skip(got) {
			proved[got] = true
		}
		return true, nil
	}
	for _, c := range cands {
		if proved[c] {
			continue
		}
		if ctx.Err() != nil {
			return x.patPlaceList(s, cands, proved), false, nil
		}
		t := solver.Pos(x.cat.TimeAtom(s, c.k))
		var r solver.Lit
		if c.r >= 0 {
			r = solver.Pos(x.cat.RoomAtom(s, c.r))
		}
		if kt := (patPlace{c.k, -2}); !tried[kt] && r != 0 {
			tried[kt] = true
			ok, err := try(patPlace{c.k, -1}, t)
			if err != nil {
				return nil, false, err
			}
			dead[kt] = !ok
		}
		if rt := (patPlace{-2, c.r}); !tried[rt] && r != 0 {
			tried[rt] = true
			ok, err := try(patPlace{-1, c.r}, r)
			if err != nil {
				return nil, false, err
			}
			dead[rt] = !ok
		}
		if proved[c] || dead[patPlace{c.k, -2}] || dead[patPlace{-2, c.r}] {
			continue
		}
		lits := []solver.Lit{t}
		if r != 0 {
			lits = append(lits, r)
		}
		if _, err := try(c, lits...); err != nil {
			return nil, false, err
		}
	}
	return x.patPlaceList(s, cands, proved), complete, nil
}

// placeOf is the choice timetable sch gives section s.
func (x *Explainer) placeOf(sch *timetable.Schedule, s int) (patPlace, bool) {
	id := x.work.Sections[s].ID
	for _, pl := range sch.Placements {
		if pl.Section == id {
			c := patPlace{pl.Time - 1, -1}
			if pl.Room != "" {
				c.r = x.work.RoomIndex()[pl.Room]
			}
			return c, true
		}
	}
	return patPlace{}, false
}

// placeCost is the preference penalty of choice c itself: the Weight of
// its meeting time and of its room (Room choices), each times its
// criterion weight, as timetable.Cost counts them.
func (x *Explainer) placeCost(s int, c patPlace) int {
	sec := &x.work.Sections[s]
	wt, _ := x.work.CriterionWeight(timetable.CritTimeChoice)
	cost := wt * sec.Times[c.k].Weight
	if c.r >= 0 {
		wr, _ := x.work.CriterionWeight(timetable.CritRoomChoice)
		for _, rc := range sec.RoomChoices {
			if rc.Room == x.work.Rooms[c.r].ID {
				cost += wr * rc.Weight
			}
		}
	}
	return cost
}

// patPlaceList lists the proved choices in the order of cands.
func (x *Explainer) patPlaceList(s int, cands []patPlace, proved map[patPlace]bool) []Place {
	out := []Place{}
	sec := &x.work.Sections[s]
	for _, c := range cands {
		if !proved[c] {
			continue
		}
		p := Place{At: patternText(x.work, &sec.Times[c.k]), Period: -1, Time: c.k + 1, Cost: x.placeCost(s, c)}
		if c.r >= 0 {
			p.Room = x.work.Rooms[c.r].ID
		}
		out = append(out, p)
	}
	return out
}

// patternSkip is the choices a request on a pattern section names (with
// its room, when it names one): the places of a refused request leave
// them out.
func (x *Explainer) patternSkip(r int) func(patPlace) bool {
	idx := x.reqTimes[r]
	room := -1
	if id := x.reqs[r].Room; id != "" {
		room = x.work.RoomIndex()[id]
	}
	return func(c patPlace) bool {
		return slices.Contains(idx, c.k) && (room < 0 || c.r == room)
	}
}
