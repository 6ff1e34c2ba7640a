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
// is proved by a timetable that passes timetable.Check: a check with the
// choice assumed finds one, and every other choice the section can take in
// that timetable alone — the rest unchanged, timetable.Check clean and
// every request still held — is proved by the moved timetable without a
// search. complete is false when a check ran out of budget or ctx ended.
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
	for _, c := range cands {
		if proved[c] {
			continue
		}
		if ctx.Err() != nil {
			return x.patPlaceList(s, cands, proved), false, nil
		}
		extra := []solver.Lit{solver.Pos(x.cat.TimeAtom(s, c.k))}
		if c.r >= 0 {
			extra = append(extra, solver.Pos(x.cat.RoomAtom(s, c.r)))
		}
		res, err := x.check(ctx, on, extra)
		if err != nil {
			return nil, false, err
		}
		switch res.status {
		case solver.Unknown:
			complete = false
			continue
		case solver.Unsatisfiable:
			continue
		}
		if res.sched == nil {
			complete = false // rooms of a relaxed term only: not a proof
			continue
		}
		if hard := timetable.HardViolations(timetable.Check(x.term, res.sched)); len(hard) > 0 {
			return nil, false, fmt.Errorf("%w: %s", ErrCheckFailed, hard[0].Msg)
		}
		if !x.placedAt(res.sched, s, c) {
			return nil, false, fmt.Errorf("internal error: a timetable places section %s elsewhere than assumed", x.work.Sections[s].ID)
		}
		proved[c] = true
		x.moveAlone(ctx, s, res.sched, cands, proved, on)
	}
	return x.patPlaceList(s, cands, proved), complete, nil
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

// placedAt reports whether timetable sch places section s at choice c.
func (x *Explainer) placedAt(sch *timetable.Schedule, s int, c patPlace) bool {
	id := x.work.Sections[s].ID
	for _, pl := range sch.Placements {
		if pl.Section == id {
			return pl.Time == c.k+1 && (c.r < 0 || pl.Room == x.work.Rooms[c.r].ID)
		}
	}
	return false
}

// moveAlone proves the choices of cands that section s can take in
// timetable sch by itself: the timetable with s moved there passes
// timetable.Check with no hard violation and still grants every request
// that holds.
func (x *Explainer) moveAlone(ctx context.Context, s int, sch *timetable.Schedule, cands []patPlace, proved map[patPlace]bool, on []bool) {
	id := x.work.Sections[s].ID
	at := slices.IndexFunc(sch.Placements, func(pl timetable.Placement) bool { return pl.Section == id })
	if at < 0 {
		return
	}
	cp := *sch
	cp.Placements = slices.Clone(sch.Placements)
	moved := &cp
	for _, c := range cands {
		if proved[c] || ctx.Err() != nil {
			continue
		}
		pl := &moved.Placements[at]
		pl.Time, pl.Room = c.k+1, ""
		if c.r >= 0 {
			pl.Room = x.work.Rooms[c.r].ID
		}
		if len(timetable.HardViolations(timetable.Check(x.term, moved))) > 0 {
			continue
		}
		ok := true
		for i, req := range x.reqs {
			if g := x.reqGroup[i]; (g >= len(on) || on[g]) && !grantsRequest(x.term, moved, req) {
				ok = false
			}
		}
		if ok {
			proved[c] = true
		}
	}
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
