package encode

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Requests on pattern sections. A request names meeting patterns of the
// section (matchTimes) and optionally a room; it becomes one group whose
// constraints forbid every model where the section meets at another
// pattern ("exactly one time" makes that the negation of the requested
// time atoms) or in another room. It adds nothing to the room model, so
// switching it off drops it entirely.

// matchTimes lists the 0-based patterns of pattern section sec that
// request r names: r.Time's pattern when given; with two days or more (r.Days), the patterns with
// exactly those days and r's start; with one day, every pattern meeting on
// that day and starting at r's start. When none matches it returns a
// message saying so, with the section's meeting times.
func matchTimes(sec *timetable.Section, r Request) ([]int, string) {
	if r.Time > 0 {
		if r.Time > len(sec.Times) {
			return nil, fmt.Sprintf("section %s has %d meeting times, not %d — ask for one of 1 to %d", sec.ID, len(sec.Times), r.Time, len(sec.Times))
		}
		return []int{r.Time - 1}, ""
	}
	var idx []int
	for i := range sec.Times {
		tc := &sec.Times[i]
		if tc.Start != r.Start {
			continue
		}
		if r.Days.Count() > 1 && tc.Days == r.Days || r.Days.Count() <= 1 && tc.Days.Has(r.Day) {
			idx = append(idx, i)
		}
	}
	if len(idx) > 0 {
		return idx, ""
	}
	var all []string
	for i := range sec.Times {
		all = append(all, sec.Times[i].Days.String()+" "+sec.Times[i].Start.String())
		if len(all) == 6 && len(sec.Times) > 6 {
			all = append(all, fmt.Sprintf("and %d more", len(sec.Times)-6))
			break
		}
	}
	how := "meets on " + timetable.DayName(r.Day) + " at " + r.Start.String()
	if r.Days.Count() > 1 {
		how = "meets on exactly " + r.Days.String() + " at " + r.Start.String()
	}
	return nil, fmt.Sprintf("no meeting time of section %s %s — its meeting times are %s (Meeting times sheet); ask for one of them", sec.ID, how, strings.Join(all, ", "))
}

// patternText is "Tue Thu 10:30-11:45" with ", weeks 1-7" when the pattern
// does not meet every teaching week.
func patternText(t *timetable.Term, tc *timetable.TimeChoice) string {
	s := tc.Days.String() + " " + tc.Start.String() + "-" + tc.End().String()
	if tc.Weeks != t.AllWeeks() {
		s += ", weeks " + tc.Weeks.Ranges()
	}
	return s
}

// acceptsRoom reports whether room id is on pattern section s's list of
// acceptable rooms (RoomChoices, else Rooms, else any room).
func acceptsRoom(sec *timetable.Section, id string) bool {
	switch {
	case len(sec.RoomChoices) > 0:
		return slices.ContainsFunc(sec.RoomChoices, func(rc timetable.RoomChoice) bool { return rc.Room == id })
	case len(sec.Rooms) > 0:
		return slices.Contains(sec.Rooms, id)
	}
	return true
}

// addPatternRequest makes the group of request i on pattern section s
// asking for one of the patterns idx: src are its rows (the Requests row,
// if any); the requested patterns' Meeting times rows are added.
func (x *Explainer) addPatternRequest(b *builder, i, s int, idx []int, src []timetable.Source) int {
	r := x.reqs[i]
	sec := &x.work.Sections[s]
	for _, k := range idx {
		if s := sec.Times[k].Src; s.Sheet != "" && !slices.Contains(src, s) {
			src = append(src, s)
		}
	}
	g := b.newGroup(KindRequest, []string{strconv.Itoa(i + 1)}, x.patternRequestSentence(r, i+1, sec, idx), src, 0)
	b.in(g, KindRequest)
	var body []solver.Lit
	for _, k := range idx {
		if a := x.cat.TimeAtom(s, k); a != 0 {
			body = append(body, solver.Neg(a))
		}
	}
	if len(body) == 0 {
		b.rule(0, b.sel(g)) // no requested pattern is left: the request cannot hold
	} else {
		b.rule(0, append(body, b.sel(g))...)
	}
	if r.Room != "" {
		ri := x.work.RoomIndex()[r.Room]
		if a := x.cat.RoomAtom(s, ri); a != 0 {
			b.rule(0, solver.Neg(a), b.sel(g))
		} else {
			b.rule(0, b.sel(g))
		}
	}
	return g
}

// patternRequestSentence states request n on pattern section sec in plain
// words: "request 1: section CHEM-110 meets at Tue Thu 10:30-11:45 in room
// L2", saying so when the room is not one the section accepts.
func (x *Explainer) patternRequestSentence(r Request, n int, sec *timetable.Section, idx []int) string {
	var times []string
	for _, k := range idx {
		times = append(times, patternText(x.work, &sec.Times[k]))
	}
	out := fmt.Sprintf("request %d: section %s meets at %s", n, sec.ID, strings.Join(times, " or "))
	if r.Room != "" {
		out += " in room " + r.Room
		if !acceptsRoom(sec, r.Room) {
			out += ", but room " + r.Room + " is not one of its acceptable rooms"
		}
	}
	return out
}

// grantsPatternRequest reports whether schedule sch meets request r on a
// pattern section: its placement at one of the requested patterns (and in
// the requested room).
func grantsPatternRequest(t *timetable.Term, sch *timetable.Schedule, r Request) bool {
	s, ok := t.SectionIndex()[r.Section]
	if !ok {
		return false
	}
	idx, _ := matchTimes(&t.Sections[s], r)
	for _, pl := range sch.Placements {
		if pl.Section == r.Section && slices.Contains(idx, pl.Time-1) && (r.Room == "" || pl.Room == r.Room) {
			return true
		}
	}
	return false
}

// patternRequestsFixed narrows, in a copy c of a term (its Sections slice
// already cloned), each pattern section with requests to the patterns
// (and room) they all ask for, and returns how to read a timetable of c as
// one of the original term (placements' Time renumbered back).
func patternRequestsFixed(c *timetable.Term, reqs []Request) func(*timetable.Schedule) {
	idx := c.SectionIndex()
	back := map[string][]int{}
	for _, r := range reqs {
		s, ok := idx[r.Section]
		if !ok || !c.Sections[s].UsesTimes() {
			continue
		}
		match, _ := matchTimes(&c.Sections[s], r)
		if prev, ok := back[r.Section]; ok {
			match = slices.DeleteFunc(match, func(k int) bool { return !slices.Contains(prev, k) })
		}
		back[r.Section] = match
	}
	for _, r := range reqs {
		s, ok := idx[r.Section]
		if !ok || !c.Sections[s].UsesTimes() || r.Room == "" {
			continue
		}
		sec := &c.Sections[s]
		w := 0
		for _, rc := range sec.RoomChoices {
			if rc.Room == r.Room {
				w = rc.Weight
			}
		}
		sec.RoomChoices = []timetable.RoomChoice{{Room: r.Room, Weight: w}}
		sec.Rooms = nil
	}
	for id, keep := range back {
		sec := &c.Sections[idx[id]]
		times := make([]timetable.TimeChoice, 0, len(keep))
		for _, k := range keep {
			times = append(times, sec.Times[k])
		}
		sec.Times = times
	}
	return func(sch *timetable.Schedule) {
		for i := range sch.Placements {
			pl := &sch.Placements[i]
			if keep, ok := back[pl.Section]; ok && pl.Time >= 1 && pl.Time <= len(keep) {
				pl.Time = keep[pl.Time-1] + 1
			}
		}
	}
}

// PatternRequest is the request for pattern section sec at its 1-based
// meeting pattern k, in room (or any room), worded by the pattern's days
// and start; k must be one of 1 to len(sec.Times).
func PatternRequest(sec *timetable.Section, k int, room string) Request {
	tc := sec.Times[k-1]
	r := requestAt(sec.ID, tc.Days, tc.Start, room)
	r.Time = k
	return r
}
