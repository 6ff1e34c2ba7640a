package timetable

import (
	"slices"
	"sort"
	"strings"
)

// relPhraseMore is what the newer relation kinds ask, after the list.
var relPhraseMore = map[RelationKind]string{
	SameStart:      "must all start at one time of day",
	WithinHours:    "must each meet within the other's hours",
	DifferentHours: "must meet at different hours of the day",
	DaysWithin:     "must each meet on days among the other's days",
	WeeksWithin:    "must each meet in weeks among the other's weeks",
	DifferentWeeks: "must meet in different weeks",
	OverlapRel:     "must overlap",
	NoOverlap:      "must not overlap",
	DifferentRooms: "must use different rooms",
	SamePeople:     "must be attendable by the same people (no overlap, and time to get between rooms)",
	FirstBefore:    "must start in the order listed (first week, then first day, then time)",
	DaySpan:        "must lie within a span of N minutes on any day",
	MinGap:         "must leave at least N minutes between them on any day",
	MaxDays:        "must together meet on at most N days",
	MaxDayMinutes:  "must together meet at most N minutes a day",
	MaxBreaks:      "must together have at most N breaks (gaps over M minutes) a day",
	MaxBlock:       "must together form no block of meetings (gaps up to M minutes) longer than N minutes",
}

// relMaxReasons is how many broken pairs a message names before "N more".
const relMaxReasons = 3

// relationJudge evaluates relation r as term.go defines it and returns
// "" when it holds, or a sentence saying how it is broken, the placements
// involved, and what a soft row costs: Weight times count, divided by div
// and rounded down (count 1, div 1 for a broken row of a kind that is not
// counted; for a counted kind its sum over weeks and days and the divisor
// its definition gives, so the cost may be 0 while the hard reading is
// broken).
// Relations of the first seven kinds over grid sections only keep their
// grid evaluation (relationBroken); everything else is judged on
// occurrences.
func (x *occupancy) relationJudge(r Relation) (why string, pls []int, count, div int64) {
	ordered := r.Kind == Before || r.Kind == BackToBack || r.Kind == FirstBefore
	secs := x.relSections(r, !ordered)
	if r.Kind.OnGrid() && !x.relUsesTimes(secs) {
		w, ps := x.relationBroken(r)
		if w == "" {
			return "", nil, 0, 1
		}
		return w, ps, 1, 1
	}
	if r.Kind == SameRoom {
		w, ps := x.relationBroken(r)
		if w == "" {
			return "", nil, 0, 1
		}
		return w, ps, 1, 1
	}
	var reasons []string
	count, div = 1, 1
	more := 0
	note := func(w func() string, ps ...int) {
		if x.quiet {
			if len(reasons) == 0 {
				reasons = append(reasons, "broken")
			}
			return
		}
		if len(reasons) < relMaxReasons {
			reasons = append(reasons, w())
		} else {
			more++
		}
		pls = append(pls, ps...)
	}
	switch r.Kind {
	case SameTime, SameDayRel, SameStart:
		x.relSameSets(r.Kind, secs, note)
	case FirstBefore, Before, BackToBack:
		for k := 0; k+1 < len(secs); k++ {
			x.relOrdered(r.Kind, secs[k], secs[k+1], note)
		}
	case MaxDays, MaxDayMinutes, MaxBreaks, MaxBlock:
		count, div = x.relCounted(r, secs, note)
	default:
		for a := 0; a < len(secs) && !(x.quiet && len(reasons) > 0); a++ {
			for b := a + 1; b < len(secs) && !(x.quiet && len(reasons) > 0); b++ {
				x.relPair(r, secs[a], secs[b], note)
			}
		}
	}
	if len(reasons) == 0 {
		return "", nil, 0, 1
	}
	if x.quiet {
		return "broken", nil, count, div
	}
	if more > 0 {
		reasons = append(reasons, itoa(more)+" more")
	}
	ids := make([]string, len(secs))
	for k, si := range secs {
		ids[k] = x.t.Sections[si].ID
	}
	phrase := chkRelPhrase[r.Kind]
	if phrase == "" {
		phrase = strings.NewReplacer(" N ", " "+itoa(r.N)+" ", " M ", " "+itoa(r.M)+" ").Replace(relPhraseMore[r.Kind])
	}
	slices.Sort(pls)
	return chkJoin(ids) + " " + phrase + ", but " + strings.Join(reasons, "; "), slices.Compact(pls), count, div
}

// relUsesTimes reports whether a listed section uses meeting patterns.
func (x *occupancy) relUsesTimes(secs []int) bool {
	for _, si := range secs {
		if x.t.Sections[si].UsesTimes() {
			return true
		}
	}
	return false
}

// relPls lists the placements of meets, each once.
func relPls(ms []occMeet) []int {
	var out []int
	for _, m := range ms {
		if !slices.Contains(out, m.pl) {
			out = append(out, m.pl)
		}
	}
	return out
}

// relSameSets handles the kinds where every section must show one key
// set: same time (day and start of each meeting), same day (days), same
// start (start times, one for all meetings of all sections).
func (x *occupancy) relSameSets(kind RelationKind, secs []int, note func(func() string, ...int)) {
	key := func(m occMeet) int {
		switch kind {
		case SameTime:
			return dayRank(m.Day)*24*60 + int(m.Start)
		case SameDayRel:
			return dayRank(m.Day)
		}
		return int(m.Start)
	}
	text := func(k int) string {
		switch kind {
		case SameTime:
			return DayName(weekOrder[k/(24*60)]) + " " + Clock(k%(24*60)).String()
		case SameDayRel:
			return DayName(weekOrder[k])
		}
		return Clock(k).String()
	}
	set := func(si int) []int {
		var out []int
		for _, m := range x.sectionMeets(si) {
			out = append(out, key(m))
		}
		sort.Ints(out)
		return slices.Compact(out)
	}
	say := func(si int, ks []int) string {
		id := x.t.Sections[si].ID
		if len(ks) == 0 {
			return id + " has no meetings in the timetable"
		}
		var items []string
		for _, k := range ks {
			items = append(items, text(k))
		}
		if kind == SameDayRel {
			return id + " meets on " + chkJoin(items)
		}
		return id + " starts at " + chkJoin(items)
	}
	if len(secs) == 0 {
		return
	}
	first := set(secs[0])
	if kind == SameStart && len(first) > 1 {
		note(func() string { return say(secs[0], first) }, relPls(x.sectionMeets(secs[0]))...)
	}
	for _, si := range secs[1:] {
		ks := set(si)
		if slices.Equal(first, ks) && (kind != SameStart || len(ks) <= 1) {
			continue
		}
		note(func() string { return say(secs[0], first) + " while " + say(si, ks) }, append(relPls(x.sectionMeets(secs[0])), relPls(x.sectionMeets(si))...)...)
	}
}

// relOrdered handles the kinds defined on consecutive pairs (A, B).
func (x *occupancy) relOrdered(kind RelationKind, a, b int, note func(func() string, ...int)) {
	ma, mb := x.sectionMeets(a), x.sectionMeets(b)
	if len(ma) == 0 || len(mb) == 0 {
		return
	}
	ida, idb := x.t.Sections[a].ID, x.t.Sections[b].ID
	switch kind {
	case Before:
		// Every minute A occupies comes before every start of B, in week
		// order: A's latest (day, end) against B's earliest (day, start).
		la, fb := ma[0], mb[0]
		for _, m := range ma {
			if dayRank(m.Day) > dayRank(la.Day) || m.Day == la.Day && m.End > la.End {
				la = m
			}
		}
		for _, m := range mb {
			if dayRank(m.Day) < dayRank(fb.Day) || m.Day == fb.Day && m.Start < fb.Start {
				fb = m
			}
		}
		if dayRank(la.Day) < dayRank(fb.Day) || la.Day == fb.Day && la.End <= fb.Start {
			return
		}
		note(func() string {
			return ida + " is still meeting until " + DayName(la.Day) + " " + la.End.String() + " while " + idb + " starts at " +
				DayName(fb.Day) + " " + fb.Start.String()
		}, la.pl, fb.pl)
	case BackToBack:
		for _, m := range mb {
			ok := false
			for _, n := range ma {
				if n.Day == m.Day && n.End == m.Start {
					ok = true
				}
			}
			if !ok {
				note(func() string {
					return idb + " at " + DayName(m.Day) + " " + m.Start.String() + " does not start right when a meeting of " + ida + " ends"
				}, m.pl)
			}
		}
	case FirstBefore:
		wa, wb := relWeeks(ma).First(), relWeeks(mb).First()
		if wa < wb {
			return
		}
		da, _ := relDays(ma).First()
		db, _ := relDays(mb).First()
		if wa == wb && dayRank(da) < dayRank(db) {
			return
		}
		if wa == wb && da == db {
			var endA, startB Clock = -1, 24 * 60 * 2
			for _, m := range ma {
				if m.Day == da {
					endA = max(endA, m.End)
				}
			}
			for _, m := range mb {
				if m.Day == db {
					startB = min(startB, m.Start)
				}
			}
			if endA <= startB {
				return
			}
			note(func() string {
				return ida + " ends at " + DayName(da) + " " + endA.String() + " of week " + itoa(wa) + ", after " + idb + " starts at " + startB.String()
			},
				append(relPls(ma), relPls(mb)...)...)
			return
		}
		note(func() string {
			return ida + " first meets in week " + itoa(wa) + " on " + DayName(da) + ", " + idb + " in week " + itoa(wb) + " on " + DayName(db)
		},
			append(relPls(ma), relPls(mb)...)...)
	}
}

// relWeeks and relDays are the teaching weeks and days meets use.
func relWeeks(ms []occMeet) WeekSet {
	var w WeekSet
	for _, m := range ms {
		w |= m.Weeks
	}
	return w
}

func relDays(ms []occMeet) DaySet {
	var d DaySet
	for _, m := range ms {
		d |= DaysOf(m.Day)
	}
	return d
}

// relRooms lists the non-blank rooms of meets' placements.
func (x *occupancy) relRooms(ms []occMeet) []string {
	var out []string
	for _, m := range ms {
		if r := x.roomOfMeet(m); r != "" && !slices.Contains(out, r) {
			out = append(out, r)
		}
	}
	sort.Strings(out)
	return out
}

// relPair handles the pairwise kinds for sections a and b.
func (x *occupancy) relPair(r Relation, a, b int, note func(func() string, ...int)) {
	ma, mb := x.sectionMeets(a), x.sectionMeets(b)
	if len(ma) == 0 || len(mb) == 0 {
		return
	}
	ida, idb := x.t.Sections[a].ID, x.t.Sections[b].ID
	both := func() []int { return append(relPls(ma), relPls(mb)...) }
	hours := func(m occMeet) string { return m.Start.String() + "–" + m.End.String() }
	at := func(m, n occMeet) string {
		return DayName(m.Day) + " " + max(m.Start, n.Start).String() + "–" + min(m.End, n.End).String()
	}
	switch r.Kind {
	case DaysWithin:
		da, db := relDays(ma), relDays(mb)
		if da&db == da || da&db == db {
			return
		}
		note(func() string { return ida + " meets on " + da.String() + " and " + idb + " on " + db.String() }, both()...)
		return
	case WeeksWithin:
		wa, wb := relWeeks(ma), relWeeks(mb)
		if wa&wb == wa || wa&wb == wb {
			return
		}
		note(func() string { return ida + " meets" + chkInWeeks(x.t, wa) + " and " + idb + chkInWeeks(x.t, wb) }, both()...)
		return
	case DifferentWeeks, DifferentDays:
		if r.Kind == DifferentDays {
			if d := relDays(ma) & relDays(mb); d != 0 {
				var names []string
				for _, w := range d.List() {
					names = append(names, DayName(w))
				}
				note(func() string { return ida + " and " + idb + " both meet on " + chkJoin(names) }, both()...)
			}
			return
		}
		if w := relWeeks(ma) & relWeeks(mb); w != 0 {
			note(func() string { return ida + " and " + idb + " both meet" + chkInWeeks(x.t, w) + relAllWeeks(x.t, w) }, both()...)
		}
		return
	case DifferentRooms:
		var common []string
		rb := x.relRooms(mb)
		for _, rm := range x.relRooms(ma) {
			if slices.Contains(rb, rm) {
				common = append(common, rm)
			}
		}
		if len(common) > 0 {
			note(func() string { return ida + " and " + idb + " both use " + chkJoin(common) }, both()...)
		}
		return
	case OverlapRel:
		for _, m := range ma {
			for _, n := range mb {
				if m.Overlaps(n.Occurrence) {
					return
				}
			}
		}
		note(func() string { return ida + " and " + idb + " never meet at a common time" }, both()...)
		return
	}
	var ti *TravelIndex
	if r.Kind == SamePeople {
		ti = newTravelIndexOnce(x)
	}
	for _, m := range ma {
		for _, n := range mb {
			sameDayWeek := m.Day == n.Day && m.Weeks.Overlaps(n.Weeks)
			first, second := m, n
			if n.Start < m.Start {
				first, second = n, m
			}
			gap := int(second.Start - first.End)
			var w func() string
			switch r.Kind {
			case WithinHours:
				if !(m.Start <= n.Start && n.End <= m.End || n.Start <= m.Start && m.End <= n.End) {
					w = func() string {
						return ida + " meets " + hours(m) + " and " + idb + " " + hours(n) + ", neither within the other"
					}
				}
			case DifferentHours, NotSameTime:
				if m.Start < n.End && n.Start < m.End && (r.Kind == DifferentHours || m.Day == n.Day) {
					if r.Kind == NotSameTime {
						w = func() string {
							return ida + " and " + idb + " both meet at " + at(m, n)
						}
					} else {
						w = func() string {
							return ida + " meets " + hours(m) + " and " + idb + " " + hours(n)
						}
					}
				}
			case NoOverlap:
				if m.Overlaps(n.Occurrence) {
					w = func() string {
						return ida + " and " + idb + " both meet at " + at(m, n) + chkInWeeks(x.t, m.Weeks&n.Weeks)
					}
				}
			case SamePeople:
				if !sameDayWeek {
					break
				}
				if m.Overlaps(n.Occurrence) {
					w = func() string {
						return ida + " and " + idb + " both meet at " + at(m, n) + chkInWeeks(x.t, m.Weeks&n.Weeks)
					}
					break
				}
				ra, rb := x.roomOfMeet(first), x.roomOfMeet(second)
				if need := ti.Between(ra, rb); gap < need {
					w = func() string {
						return x.s.Placements[first.pl].Section + " ends at " + DayName(first.Day) + " " + first.End.String() + " in " + ra + " and " + x.s.Placements[second.pl].Section + " starts at " + second.Start.String() + " in " + rb + chkInWeeks(x.t, m.Weeks&n.Weeks) + ", but getting there takes " + chkMinutes(need)
					}
				}
			case DaySpan:
				if span := int(max(m.End, n.End) - min(m.Start, n.Start)); sameDayWeek && span > r.N {
					w = func() string {
						return ida + " and " + idb + " span " + min(m.Start, n.Start).String() + "–" + max(m.End, n.End).String() + " on " + DayName(m.Day) + chkInWeeks(x.t, m.Weeks&n.Weeks) + ", " + chkMinutes(span)
					}
				}
			case MinGap:
				if sameDayWeek && gap < r.N {
					free := "overlap"
					if gap >= 0 {
						free = "leave " + chkMinutes(gap) + " between them"
					}
					w = func() string {
						return ida + " and " + idb + " " + free + " on " + DayName(m.Day) + chkInWeeks(x.t, m.Weeks&n.Weeks) + " (" + hours(first) + " and " + hours(second) + ")"
					}
				}
			}
			if w != nil {
				note(w, m.pl, n.pl)
				return
			}
		}
	}
}

// relAllWeeks says nothing; chkInWeeks is silent for every week, so a
// common set of every week is named here.
func relAllWeeks(t *Term, w WeekSet) string {
	if chkInWeeks(t, w) == "" {
		return " in every week"
	}
	return ""
}

// newTravelIndexOnce builds the travel index of x once.
func newTravelIndexOnce(x *occupancy) *TravelIndex {
	if x.travelIdx == nil {
		x.travelIdx = NewTravelIndex(x.t)
	}
	return x.travelIdx
}

// relCounted handles the counted kinds, returning the count and the
// divisor of a soft row's cost: for at most days, the days over N (divisor
// 1); for the others, the sum over teaching weeks and days of the excess,
// divided by the term's teaching weeks, the division last (minutes count
// in 5-minute steps, rounded down). note is called when the hard reading
// is broken (any excess at all).
func (x *occupancy) relCounted(r Relation, secs []int, note func(func() string, ...int)) (int64, int64) {
	var ms []occMeet
	for _, si := range secs {
		ms = append(ms, x.sectionMeets(si)...)
	}
	if r.Kind == MaxDays {
		d := relDays(ms)
		over := d.Count() - r.N
		if over <= 0 {
			return 0, 1
		}
		note(func() string { return "they meet on " + itoa(d.Count()) + " days (" + d.String() + ")" }, relPls(ms)...)
		return int64(over), 1
	}
	days := byDay(ms)
	total, worst, worstWeek := 0, 0, 0
	var worstDay string
	var hit []int
	for _, d := range weekOrder {
		for w := 1; w <= x.nWeeks; w++ {
			b := meetsInWeek(days[d], w)
			if len(b) == 0 {
				continue
			}
			var ex int
			switch r.Kind {
			case MaxDayMinutes:
				load := 0
				for _, m := range b {
					load += m.Minutes()
				}
				ex = max(0, load-r.N)
			case MaxBreaks:
				ex = max(0, len(relBlocks(b, r.M))-(r.N+1))
			case MaxBlock:
				for _, bl := range relBlocks(b, r.M) {
					if bl.n >= 2 && int(bl.end-bl.start) > r.N {
						ex++
					}
				}
			}
			if ex == 0 {
				continue
			}
			total += ex
			hit = append(hit, relPls(b)...)
			if ex > worst {
				worst, worstWeek, worstDay = ex, w, DayName(d)
			}
		}
	}
	div := int64(x.t.TeachingWeeks())
	if total == 0 {
		return 0, div
	}
	var what string
	switch r.Kind {
	case MaxDayMinutes:
		what = chkMinutes(worst) + " over the limit"
	case MaxBreaks:
		what = chkCount(worst, "break", "breaks") + " too many"
	case MaxBlock:
		what = chkCount(worst, "block", "blocks") + " too long"
	}
	note(func() string {
		return "on " + worstDay + " of week " + itoa(worstWeek) + " they have " + what + " (" + itoa(total) + " over all weeks and days)"
	}, hit...)
	if r.Kind == MaxDayMinutes {
		return int64(total / 5), div // 5-minute steps, rounded down
	}
	return int64(total), div
}

// relBlock is a run of meetings of one day, each starting at most M
// minutes after the run so far ends.
type relBlock struct {
	start, end Clock
	n          int
}

// relBlocks merges meets sorted by start into blocks with gaps of at most
// gap minutes.
func relBlocks(b []occMeet, gap int) []relBlock {
	var out []relBlock
	for _, m := range b {
		if k := len(out) - 1; k >= 0 && m.Start <= out[k].end+Clock(gap) {
			out[k].end = max(out[k].end, m.End)
			out[k].n++
			continue
		}
		out = append(out, relBlock{m.Start, m.End, 1})
	}
	return out
}

// chkCount is "1 break", "3 breaks".
func chkCount(n int, one, many string) string {
	if n == 1 {
		return "1 " + one
	}
	return itoa(n) + " " + many
}
