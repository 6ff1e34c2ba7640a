package timetable

import (
	"slices"
	"sort"
	"strings"
)

// relations reports broken hard relations.
func (c *checker) relations() {
	x := c.x
	for _, r := range x.t.Relations {
		if !r.Hard {
			continue
		}
		reason, pls, _, _ := x.relationJudge(r)
		if reason == "" {
			continue
		}
		srcs := []Source{r.Src}
		for _, si := range x.relSections(r, false) {
			srcs = append(srcs, x.t.Sections[si].Src)
		}
		c.add(RuleRelation, true, pls, srcs, reason)
	}
}

// relSections lists the known sections of a relation in written order;
// with unique set, each section once.
func (x *occupancy) relSections(r Relation, unique bool) []int {
	var out []int
	for _, id := range r.Sections {
		si, ok := x.secIdx[id]
		if !ok || (unique && slices.Contains(out, si)) {
			continue
		}
		out = append(out, si)
	}
	return out
}

// chkRelPhrase is what a relation asks, in words, after the section list.
var chkRelPhrase = map[RelationKind]string{
	SameTime:      "must start at the same times",
	NotSameTime:   "must not meet at the same time",
	DifferentDays: "must meet on different days",
	SameDayRel:    "must meet on the same days",
	Before:        "must meet in the order listed, each entirely before the next starts",
	BackToBack:    "must meet back to back in the order listed",
	SameRoom:      "must all use one room",
}

// relationBroken evaluates relation r on the valid placements of its
// known sections, following the definitions in term.go (week sets are
// ignored; unknown sections are skipped). It returns "" when r holds, or a
// sentence saying how it is broken and the placements involved.
func (x *occupancy) relationBroken(r Relation) (string, []int) {
	secs := x.relSections(r, r.Kind != Before && r.Kind != BackToBack)
	var why []string
	var pls []int
	switch r.Kind {
	case SameTime, SameDayRel:
		key := func(si int) []int { return x.startSet(si, r.Kind == SameDayRel) }
		for _, si := range secs[min(1, len(secs)):] {
			if !slices.Equal(key(secs[0]), key(si)) {
				why = append(why, x.relSetText(secs[0], r.Kind == SameDayRel)+" but "+x.relSetText(si, r.Kind == SameDayRel))
				pls = append(pls, x.sectionOK(secs[0])...)
				pls = append(pls, x.sectionOK(si)...)
			}
		}
	case NotSameTime, DifferentDays:
		for a := 0; a < len(secs); a++ {
			for b := a + 1; b < len(secs); b++ {
				w, p := x.relSharing(secs[a], secs[b], r.Kind == DifferentDays)
				if w != "" {
					why = append(why, w)
					pls = append(pls, p...)
				}
			}
		}
	case Before:
		for k := 0; k+1 < len(secs); k++ {
			a, b := secs[k], secs[k+1]
			la, lp := x.relLastOccupied(a)
			fb, fp := x.relFirstStart(b)
			if la >= 0 && fb >= 0 && la >= fb {
				why = append(why, x.t.Sections[a].ID+" is still meeting at "+x.t.Periods[la].Label()+
					" but "+x.t.Sections[b].ID+" starts at "+x.t.Periods[fb].Label())
				pls = append(pls, lp, fp)
			}
		}
	case BackToBack:
		for k := 0; k+1 < len(secs); k++ {
			a, b := secs[k], secs[k+1]
			for _, j := range x.sectionOK(b) {
				if !x.relFollows(a, j) {
					why = append(why, x.meetingLabel(j)+" at "+x.t.Periods[x.pl[j].first].Label()+
						" does not start right after a meeting of "+x.t.Sections[a].ID)
					pls = append(pls, j)
				}
			}
		}
	case SameRoom:
		var rooms []string
		for _, si := range secs {
			for _, i := range x.bySection[si] {
				if rm := x.s.Placements[i].Room; rm != "" {
					pls = append(pls, i)
					if !slices.Contains(rooms, rm) {
						rooms = append(rooms, rm)
					}
				}
			}
		}
		if len(rooms) > 1 {
			sort.Strings(rooms)
			why = append(why, "the meetings use rooms "+chkJoin(rooms))
		}
	}
	if len(why) == 0 {
		return "", nil
	}
	ids := make([]string, len(secs))
	for k, si := range secs {
		ids[k] = x.t.Sections[si].ID
	}
	return chkJoin(ids) + " " + chkRelPhrase[r.Kind] + ", but " + strings.Join(why, "; "), pls
}

// startSet is the sorted set of start periods (or, with days, of the days
// as their first period index) of the valid placements of section si.
func (x *occupancy) startSet(si int, days bool) []int {
	var out []int
	for _, i := range x.sectionOK(si) {
		v := x.pl[i].first
		if days {
			v = x.dayFirst[v]
		}
		out = append(out, v)
	}
	sort.Ints(out)
	return slices.Compact(out)
}

// relSetText is "BIO-101 starts at Mon 09:00 and Wed 09:00" or "BIO-101
// meets on Mon and Wed".
func (x *occupancy) relSetText(si int, days bool) string {
	set := x.startSet(si, days)
	id := x.t.Sections[si].ID
	if len(set) == 0 {
		return id + " has no meetings in the timetable"
	}
	var items []string
	for _, p := range set {
		if days {
			items = append(items, DayName(x.t.Periods[p].Day))
		} else {
			items = append(items, x.t.Periods[p].Label())
		}
	}
	if days {
		return id + " meets on " + chkJoin(items)
	}
	return id + " starts at " + chkJoin(items)
}

// relSharing says whether sections a and b share a period (or, with days,
// a day), naming what they share and the placements involved.
func (x *occupancy) relSharing(a, b int, days bool) (string, []int) {
	key := func(p int) int {
		if days {
			return x.dayFirst[p]
		}
		return p
	}
	inA := map[int]bool{}
	for _, i := range x.sectionOK(a) {
		for p := x.pl[i].first; p <= x.pl[i].last; p++ {
			inA[key(p)] = true
		}
	}
	shared := map[int]bool{}
	var pls []int
	for _, j := range x.sectionOK(b) {
		for p := x.pl[j].first; p <= x.pl[j].last; p++ {
			if inA[key(p)] {
				shared[key(p)] = true
			}
		}
	}
	if len(shared) == 0 {
		return "", nil
	}
	for _, i := range append(x.sectionOK(a), x.sectionOK(b)...) {
		for p := x.pl[i].first; p <= x.pl[i].last; p++ {
			if shared[key(p)] {
				pls = append(pls, i)
				break
			}
		}
	}
	keys := make([]int, 0, len(shared))
	for p := range shared {
		keys = append(keys, p)
	}
	sort.Ints(keys)
	ida, idb := x.t.Sections[a].ID, x.t.Sections[b].ID
	if days {
		var names []string
		for _, p := range keys {
			names = append(names, DayName(x.t.Periods[p].Day))
		}
		return ida + " and " + idb + " both meet on " + chkJoin(names), pls
	}
	return ida + " and " + idb + " both meet at " + chkTimes(x.t, keys), pls
}

// relLastOccupied is the highest period occupied by section si and the
// placement occupying it, or -1, -1.
func (x *occupancy) relLastOccupied(si int) (int, int) {
	best, who := -1, -1
	for _, i := range x.sectionOK(si) {
		if x.pl[i].last > best {
			best, who = x.pl[i].last, i
		}
	}
	return best, who
}

// relFirstStart is the lowest start period of section si and its
// placement, or -1, -1.
func (x *occupancy) relFirstStart(si int) (int, int) {
	best, who := -1, -1
	for _, i := range x.sectionOK(si) {
		if best < 0 || x.pl[i].first < best {
			best, who = x.pl[i].first, i
		}
	}
	return best, who
}

// relFollows reports whether placement j starts in the period right after
// (consecutive, same day) the last period of some meeting of section a.
func (x *occupancy) relFollows(a, j int) bool {
	start := x.pl[j].first
	for _, i := range x.sectionOK(a) {
		last := x.pl[i].last
		if last+1 == start && x.t.Consecutive(last, start) {
			return true
		}
	}
	return false
}
