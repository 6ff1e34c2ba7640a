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
// week sets and occupy common periods (or, with a pattern section, meet
// together or too close for the travel between their rooms).
type chkClashPair struct {
	common   int    // periods both sections occupy; 1 for a pair with a pattern section
	students []int  // index (into seatIndex.ens) of the first enrolment of each shared student
	at       string // for a pair with a pattern section: their first common time
	travel   bool   // for a pair with a pattern section: they do not meet together but leave too little travel time
	pls      []int  // for a pair with a pattern section: the placements involved
}

// seats returns the students' index, building it on first use.
func (x *occupancy) seats() *seatIndex {
	if x.seat == nil {
		x.seat = newSeatIndex(x.t, x.s, x.secIdx)
	}
	return x.seat
}

// studentClashes finds every pair of distinct known sections that share
// students (fixed and sectioned enrolments, each student counted once per
// section) and clash by the definition of "student clashes": overlapping
// week sets and a common period; with a pattern section, a common minute
// of a common day in a common week, or two meetings on a common day in a
// common week with less free time between them than the travel time
// between their rooms. Shared by Check and Cost. The (pair, student)
// tuples are collected in flat slices and ordered by two counting sorts,
// so each distinct pair is judged once (a word-wide set intersection for
// grid pairs) without a hash lookup per tuple: O(T + sections) for
// T = Σ k² tuples, k sections per student.
func (x *occupancy) studentClashes() map[chkStudentPair]*chkClashPair {
	out := map[chkStudentPair]*chkClashPair{}
	st := x.seats()
	if len(st.ens) == 0 {
		return out
	}
	// One (pair, student) tuple per pair of a student's distinct sections,
	// in student order: lo, hi the pair's section indexes, en the student's
	// first enrolment in lo.
	var lo, hi, en []int32
	var secs, first []int
	for pass := 0; pass < 2; pass++ { // the first pass only counts, to allocate once
		n := 0
		for k := range st.names {
			secs, first = secs[:0], first[:0]
			for _, ei := range st.enrolmentsOf(k) {
				si := int(st.ensSec[ei])
				if si >= 0 && !slices.Contains(secs, si) {
					secs = append(secs, si)
					first = append(first, int(ei))
				}
			}
			if pass == 0 {
				n += len(secs) * (len(secs) - 1) / 2
				continue
			}
			for a := range secs {
				for b := a + 1; b < len(secs); b++ {
					sa, sb, ea := secs[a], secs[b], first[a]
					if sa > sb {
						sa, sb, ea = sb, sa, first[b]
					}
					lo, hi, en = append(lo, int32(sa)), append(hi, int32(sb)), append(en, int32(ea))
				}
			}
		}
		if pass == 0 {
			lo, hi, en = make([]int32, 0, n), make([]int32, 0, n), make([]int32, 0, n)
		}
	}
	// Two stable counting sorts (by hi, then by lo) order the tuples by
	// pair, students in order within a pair: O(tuples + sections).
	_, byHi := groupBy(hi, len(x.t.Sections))
	loOfHi := make([]int32, len(byHi))
	for i, t := range byHi {
		loOfHi[i] = lo[t]
	}
	_, order := groupBy(loOfHi, len(x.t.Sections))
	for i, o := range order {
		order[i] = byHi[o]
	}
	sets := make([]occSet, len(x.t.Sections))
	var ti *TravelIndex
	if len(x.t.Travel) > 0 {
		ti = newTravelIndexOnce(x)
	}
	for i := 0; i < len(order); {
		sa, sb := lo[order[i]], hi[order[i]]
		j := i
		for j < len(order) && lo[order[j]] == sa && hi[order[j]] == sb {
			j++
		}
		if cp := x.judgeStudentPair(ti, sets, int(sa), int(sb)); cp != nil {
			cp.students = make([]int, 0, j-i)
			for _, t := range order[i:j] {
				cp.students = append(cp.students, int(en[t]))
			}
			out[chkStudentPair{int(sa), int(sb)}] = cp
		}
		i = j
	}
	return out
}

// judgeStudentPair decides whether sections sa and sb clash for a student
// who takes both (nil when not); sets caches the sections' period sets.
func (x *occupancy) judgeStudentPair(ti *TravelIndex, sets []occSet, sa, sb int) *chkClashPair {
	if x.t.Sections[sa].UsesTimes() || x.t.Sections[sb].UsesTimes() {
		if at, pls := x.meetTogether(sa, sb); at != "" {
			return &chkClashPair{common: 1, at: at, pls: pls}
		}
		if ti != nil {
			if at, pls := x.tooLittleTravel(ti, sa, sb); at != "" {
				return &chkClashPair{common: 1, at: at, pls: pls, travel: true}
			}
		}
		return nil
	}
	if !x.weeks(sa).Overlaps(x.weeks(sb)) {
		return nil
	}
	for _, si := range [2]int{sa, sb} {
		if sets[si] == nil {
			sets[si] = x.sectionPeriods(si)
		}
	}
	n := sets[sa].commonCount(sets[sb])
	if n == 0 {
		return nil
	}
	return &chkClashPair{common: n}
}

// tooLittleTravel names the first time (in week order) at which a meeting
// of section a and one of section b fall on a common day in a common week,
// without overlapping, with less free time between them than the travel
// time between their rooms, and the two placements; "" when none do.
func (x *occupancy) tooLittleTravel(ti *TravelIndex, a, b int) (string, []int) {
	at, bestKey := "", -1
	var pls []int
	for _, m := range x.sectionMeets(a) {
		for _, n := range x.sectionMeets(b) {
			if m.Day != n.Day || !m.Weeks.Overlaps(n.Weeks) {
				continue
			}
			early, late := m, n
			if n.Start < m.Start {
				early, late = n, m
			}
			if late.Start < early.End {
				continue // they overlap: meetTogether's case
			}
			ra, rb := x.roomOfMeet(early), x.roomOfMeet(late)
			gap, need := int(late.Start-early.End), ti.Between(ra, rb)
			if gap >= need {
				continue
			}
			if key := dayRank(m.Day)*24*60 + int(early.End); bestKey < 0 || key < bestKey {
				bestKey = key
				pls = []int{early.pl, late.pl}
				at = DayName(m.Day) + " " + early.End.String() + "–" + late.Start.String() + chkInWeeks(x.t, m.Weeks&n.Weeks) +
					" (" + chkMinutes(gap) + " to get from " + ra + " to " + rb + ", which takes " + chkMinutes(need) + ")"
			}
		}
	}
	return at, pls
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
	ens := x.seats().ens
	for _, k := range keys {
		if cp := pairs[k]; cp.at != "" {
			srcs := []Source{x.t.Sections[k.a].Src, x.t.Sections[k.b].Src}
			var names []string
			for _, ei := range cp.students {
				names = append(names, ens[ei].Student)
				srcs = append(srcs, ens[ei].Src)
			}
			how := ", which meet together at "
			if cp.travel {
				how = ", which leave too little time between them at "
			}
			c.add(RuleStudentClash, false, cp.pls, srcs, chkStudentsText(names)+" enrolled in both "+
				x.t.Sections[k.a].ID+" and "+x.t.Sections[k.b].ID+how+cp.at)
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
			names = append(names, ens[ei].Student)
			srcs = append(srcs, ens[ei].Src)
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
