package encode

import (
	"fmt"
	"slices"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// lunch states a lunch break (timetable/pattern.go, LunchBreak): on every
// day of every teaching week on which the person has a meeting, some
// stretch of at least lb.Minutes consecutive minutes inside [lb.From,
// lb.To) is free of the person's meetings. Per class of weeks and day: the
// leftmost free stretch, if any, starts at From or where a meeting ends,
// so with one atom free(t) :- not m1, ..., not mk per such time t (the
// meetings mi that would overlap [t, t+Minutes)) the break is the
// constraint ":- teaches that day, not free(t1), ..., not free(tn)".
func (b *builder) lunch(items []limItem, lb timetable.LunchBreak, kind, id, who string, src timetable.Source) {
	grp := -1
	seen := map[string]bool{}
	span := timetable.Clock(lb.Minutes)
	for _, c := range b.limClasses(items) {
		for _, d := range weekdays {
			type meet struct {
				lit        solver.Lit
				start, end timetable.Clock
			}
			var day []meet
			for _, k := range c.items {
				for _, o := range items[k].occ {
					if o.Day == d {
						day = append(day, meet{items[k].lit, o.Start, o.End})
					}
				}
			}
			if len(day) == 0 {
				continue
			}
			times := []timetable.Clock{lb.From}
			for _, m := range day {
				if m.end > lb.From && m.end+span <= lb.To {
					times = append(times, m.end)
				}
			}
			slices.Sort(times)
			times = slices.Compact(times)
			if lb.From+span > lb.To {
				times = nil // no stretch fits the window: no teaching that day
			}
			var frees []solver.Lit
			always := false
			for _, t := range times {
				var busy []solver.Lit
				for _, m := range day {
					if m.start < t+span && t < m.end && !slices.Contains(busy, m.lit) {
						busy = append(busy, m.lit)
					}
				}
				if len(busy) == 0 {
					always = true
					break
				}
				frees = append(frees, b.freeAtom(busy))
			}
			if always {
				continue
			}
			var teach [][]solver.Lit
			for _, m := range day {
				teach = append(teach, []solver.Lit{m.lit})
			}
			tl := b.relOr("teach:"+fmt.Sprint(teach), "meets_day", teach)
			key := fmt.Sprint(tl, frees)
			if seen[key] {
				continue
			}
			seen[key] = true
			if grp < 0 {
				grp = b.newGroup(kind, []string{id},
					fmt.Sprintf("%s has at least %d free minutes between %s and %s on every day with a meeting", who, lb.Minutes, lb.From, lb.To),
					[]timetable.Source{src}, RelaxDayLimit)
			}
			b.in(grp, kind)
			body := []solver.Lit{tl}
			for _, f := range frees {
				body = append(body, f.Not())
			}
			b.rule(0, append(body, b.sel(grp))...)
		}
	}
}

// freeAtom returns an atom that holds exactly when none of busy holds
// (interned by the list).
func (b *builder) freeAtom(busy []solver.Lit) solver.Lit {
	key := "free:" + fmt.Sprint(busy)
	if b.rel.or == nil {
		b.rel.or = map[string]solver.Atom{}
	}
	if a, ok := b.rel.or[key]; ok {
		return solver.Pos(a)
	}
	b.rel.n++
	a := b.newAtom(fmt.Sprintf("free_%d", b.rel.n), aux(-1, -1))
	b.rel.or[key] = a
	saveG, saveK := b.group, b.boundKind
	b.in(-1, "pattern relation aux")
	body := make([]solver.Lit, len(busy))
	for i, l := range busy {
		body[i] = l.Not()
	}
	b.rule(a, body...)
	b.group, b.boundKind = saveG, saveK
	return solver.Pos(a)
}
