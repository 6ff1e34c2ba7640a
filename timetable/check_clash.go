package timetable

import (
	"slices"
	"sort"
	"strings"
)

// clashes reports double bookings of staff, cohorts and rooms (pairs of
// meetings of different sections with overlapping week sets that occupy a
// common period) and a section's meetings that overlap each other.
func (c *checker) clashes() {
	x := c.x
	for _, r := range x.clashKinds() {
		for k := range r.grid {
			c.resourceClashes(r.grid[k], r.src(k), r.rule, r.say(k))
		}
	}
	for si := range x.t.Sections {
		pls := x.sectionOK(si)
		chkOverlapPairs(x, pls, func(i, j, first, last int) {
			c.add(RuleSelfOverlap, true, []int{i, j}, []Source{x.t.Sections[si].Src},
				x.t.Sections[si].ID+" meetings "+itoa(x.s.Placements[i].Meeting)+" and "+
					itoa(x.s.Placements[j].Meeting)+" overlap at "+chkRange(x.t, first, last))
		})
	}
}

// clashKind is one kind of resource that cannot be in two places at once;
// clashes and patternClashes report staff, cohorts and rooms in this order.
type clashKind struct {
	rule  string
	grid  [][]int            // resource index -> valid grid placements
	pat   [][]int            // resource index -> valid pattern placements
	label func(k int) string // "staff …", "cohort …", "room …"
	src   func(k int) Source // the resource's term row
	verb  string             // what the resource does with two sections at once
}

// clashKinds lists staff, cohorts and rooms as clashKinds.
func (x *occupancy) clashKinds() []clashKind {
	return []clashKind{
		{RuleStaffClash, x.byStaff, x.patStaff, x.staffLabel, func(k int) Source { return x.t.Staff[k].Src }, "teaches"},
		{RuleCohortClash, x.byCohort, x.patCohort, x.cohortLabel, func(k int) Source { return x.t.Cohorts[k].Src }, "has"},
		{RuleRoomClash, x.byRoom, x.patRoom, func(k int) string { return "room " + x.t.Rooms[k].ID }, func(k int) Source { return x.t.Rooms[k].Src }, "holds"},
	}
}

// say gives the message maker for a double booking of resource k:
// "staff … teaches A and B at when".
func (r clashKind) say(k int) func(a, b, when string) string {
	label := r.label(k)
	return func(a, b, when string) string {
		return label + " " + r.verb + " " + a + " and " + b + " at " + when
	}
}

// resourceClashes reports every pair of placements in pls (all valid, all
// involving one resource whose term row is src) of different sections with
// overlapping weeks that share a period.
func (c *checker) resourceClashes(pls []int, src Source, rule string, say func(a, b, when string) string) {
	x := c.x
	chkOverlapPairs(x, pls, func(i, j, first, last int) {
		si, sj := x.pl[i].sec, x.pl[j].sec
		if si == sj || !x.weeks(si).Overlaps(x.weeks(sj)) {
			return
		}
		a, b := x.s.Placements[i].Section, x.s.Placements[j].Section
		c.add(rule, true, []int{i, j}, []Source{src, x.t.Sections[si].Src, x.t.Sections[sj].Src},
			say(a, b, chkRange(x.t, first, last)))
	})
}

// chkOverlapPairs calls found(i, j, first, last) for every pair i < j of
// valid placements in pls whose occupied ranges intersect, first..last being
// the common periods. Sorting by start and sweeping costs O(n log n + pairs).
func chkOverlapPairs(x *occupancy, pls []int, found func(i, j, first, last int)) {
	if len(pls) < 2 {
		return
	}
	ord := append([]int(nil), pls...)
	sort.Slice(ord, func(a, b int) bool {
		pa, pb := x.pl[ord[a]], x.pl[ord[b]]
		if pa.first != pb.first {
			return pa.first < pb.first
		}
		return ord[a] < ord[b]
	})
	for a := 0; a < len(ord); a++ {
		pa := x.pl[ord[a]]
		for b := a + 1; b < len(ord) && x.pl[ord[b]].first <= pa.last; b++ {
			pb := x.pl[ord[b]]
			i, j := ord[a], ord[b]
			if i > j {
				i, j = j, i
			}
			found(i, j, pb.first, min(pa.last, pb.last))
		}
	}
}

// chkStudentPair is a pair of section indexes, lower first.
type chkStudentPair struct{ a, b int }

// chkClashPair is a pair of sections that share students, have overlapping
// week sets and occupy common periods.
type chkClashPair struct {
	common   int    // periods both sections occupy; 1 for a pair with a pattern section
	students []int  // index of the first enrolment of each shared student
	at       string // for a pair with a pattern section: their first common time
	pls      []int  // for a pair with a pattern section: the placements meeting together
}

// studentClashes finds every pair of distinct known sections with
// overlapping week sets that occupy a common period and share enrolled
// students (each student counted once per section). Shared by Check and
// Cost; O(Σ k²) for k sections per student, with a word-wide set
// intersection per pair.
func (x *occupancy) studentClashes() map[chkStudentPair]*chkClashPair {
	out := map[chkStudentPair]*chkClashPair{}
	if len(x.t.Enrolments) == 0 {
		return out
	}
	sets := make([]occSet, len(x.t.Sections))
	for si := range x.t.Sections {
		sets[si] = x.sectionPeriods(si)
	}
	bySt := map[string][]int{}
	var order []string
	for ei, e := range x.t.Enrolments {
		if _, ok := x.secIdx[e.Section]; !ok {
			continue
		}
		if _, ok := bySt[e.Student]; !ok {
			order = append(order, e.Student)
		}
		bySt[e.Student] = append(bySt[e.Student], ei)
	}
	var secs, first []int
	for _, st := range order {
		secs, first = secs[:0], first[:0]
		for _, ei := range bySt[st] {
			si := x.secIdx[x.t.Enrolments[ei].Section]
			if !slices.Contains(secs, si) {
				secs = append(secs, si)
				first = append(first, ei)
			}
		}
		for a := range secs {
			for b := a + 1; b < len(secs); b++ {
				sa, sb, ea := secs[a], secs[b], first[a]
				if sa > sb {
					sa, sb, ea = sb, sa, first[b]
				}
				k := chkStudentPair{sa, sb}
				cp := out[k]
				if cp == nil && (x.t.Sections[sa].UsesTimes() || x.t.Sections[sb].UsesTimes()) {
					if at, pls := x.meetTogether(sa, sb); at != "" {
						cp = &chkClashPair{common: 1, at: at, pls: pls}
						out[k] = cp
					} else {
						continue
					}
				}
				if cp == nil {
					n := sets[sa].commonCount(sets[sb])
					if n == 0 || !x.weeks(sa).Overlaps(x.weeks(sb)) {
						continue
					}
					cp = &chkClashPair{common: n}
					out[k] = cp
				}
				cp.students = append(cp.students, ea)
			}
		}
	}
	return out
}

// students reports pairs of sections with overlapping weeks that share a
// period and share enrolled students, one soft violation per pair.
func (c *checker) students() {
	x := c.x
	pairs := x.studentClashes()
	keys := make([]chkStudentPair, 0, len(pairs))
	for k := range pairs {
		keys = append(keys, k)
	}
	sort.Slice(keys, func(i, j int) bool {
		if keys[i].a != keys[j].a {
			return keys[i].a < keys[j].a
		}
		return keys[i].b < keys[j].b
	})
	for _, k := range keys {
		if cp := pairs[k]; cp.at != "" {
			srcs := []Source{x.t.Sections[k.a].Src, x.t.Sections[k.b].Src}
			var names []string
			for _, ei := range cp.students {
				names = append(names, x.t.Enrolments[ei].Student)
				srcs = append(srcs, x.t.Enrolments[ei].Src)
			}
			c.add(RuleStudentClash, false, cp.pls, srcs, chkStudentsText(names)+" enrolled in both "+
				x.t.Sections[k.a].ID+" and "+x.t.Sections[k.b].ID+", which meet together at "+cp.at)
			continue
		}
		sa, sb := x.sectionPeriods(k.a), x.sectionPeriods(k.b)
		common := x.newPeriodSet()
		for w := range common {
			common[w] = sa[w] & sb[w]
		}
		var pls []int
		for _, si := range []int{k.a, k.b} {
			for _, i := range x.sectionOK(si) {
				if op := x.pl[i]; chkRangeMeets(common, op.first, op.last) {
					pls = append(pls, i)
				}
			}
		}
		srcs := []Source{x.t.Sections[k.a].Src, x.t.Sections[k.b].Src}
		var names []string
		for _, ei := range pairs[k].students {
			names = append(names, x.t.Enrolments[ei].Student)
			srcs = append(srcs, x.t.Enrolments[ei].Src)
		}
		c.add(RuleStudentClash, false, pls, srcs, chkStudentsText(names)+" enrolled in both "+
			x.t.Sections[k.a].ID+" and "+x.t.Sections[k.b].ID+", which meet together at "+chkTimes(x.t, common.members()))
	}
}

// meetTogether names the first time (in week order) at which sections a
// and b share a minute of a common day in a common week, and the
// placements that meet together; "" when they never do.
func (x *occupancy) meetTogether(a, b int) (string, []int) {
	var at string
	var pls []int
	bestKey := -1
	for _, m := range x.sectionMeets(a) {
		for _, n := range x.sectionMeets(b) {
			if !m.Overlaps(n.Occurrence) {
				continue
			}
			pls = append(pls, m.pl, n.pl)
			start := max(m.Start, n.Start)
			if key := dayRank(m.Day)*24*60 + int(start); bestKey < 0 || key < bestKey {
				bestKey = key
				at = DayName(m.Day) + " " + start.String() + "–" + min(m.End, n.End).String() + chkInWeeks(x.t, m.Weeks&n.Weeks)
			}
		}
	}
	return at, pls
}

// chkRangeMeets reports whether any period first..last is in s.
func chkRangeMeets(s occSet, first, last int) bool {
	for p := first; p <= last; p++ {
		if s.has(p) {
			return true
		}
	}
	return false
}

// chkStudentsText is "student S1 is", "3 students (S1, S2 and S3) are",
// naming at most five.
func chkStudentsText(names []string) string {
	if len(names) == 1 {
		return "student " + names[0] + " is"
	}
	shown := names
	more := ""
	if len(names) > 5 {
		shown = names[:5]
		more = " and " + itoa(len(names)-5) + " more"
	}
	list := strings.Join(shown, ", ") + more
	if more == "" {
		list = chkJoin(shown)
	}
	return itoa(len(names)) + " students (" + list + ") are"
}
