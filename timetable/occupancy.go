package timetable

import "math/bits"

// occupancy is the read-only index that Check and Cost build from a Term
// and a Schedule: which periods each placement occupies and which
// placements involve each staff member, cohort, room and section. It holds
// no search state and shares nothing with the encoder. Building it costs
// O(|Periods| + |Sections| + sum of staff/cohort lists + |Placements|).
type occupancy struct {
	t        *Term
	s        *Schedule
	secIdx   map[string]int // section ID -> index in t.Sections
	roomIdx  map[string]int // room ID -> index in t.Rooms
	staffIdx map[string]int // staff ID -> index in t.Staff
	cohIdx   map[string]int // cohort ID -> index in t.Cohorts

	pl []occPlacement // parallel to s.Placements

	bySection [][]int // section index -> placements of it (any validity), in schedule order
	byStaff   [][]int // staff index -> valid placements of sections they teach
	byCohort  [][]int // cohort index -> valid placements of sections they attend
	byRoom    [][]int // room index -> valid placements held in that room

	// Pattern placements (valid ones only), kept apart so that every
	// period-based rule and criterion sees grid meetings alone.
	patStaff  [][]int
	patCohort [][]int
	patRoom   [][]int
	meets     []occMeet    // occurrences of every valid placement, grid and pattern
	secMeets  [][]occMeet  // section index -> its meets (built lazily by sectionMeets)
	hasPat    bool         // some valid placement is a pattern placement
	travelIdx *TravelIndex // built on first use
	seat      *seatIndex   // students' enrolments and requests, built on first use (seats)
	quiet     bool         // Cost: relations judged without sentences or placements
	nWeeks    int          // weeks the weekly rules look at: teaching weeks, or more when a week set names later weeks

	dayFirst []int // period index -> index of the first period of its day
	dayLast  []int // period index -> index of the last period of its day
	words    int   // uint64 words in a period bitset
}

// occPlacement is what the index knows about one placement.
type occPlacement struct {
	sec   int  // index in t.Sections, -1 when the section is unknown
	room  int  // index in t.Rooms, -1 when blank or unknown
	ok    bool // section known and the meeting lies inside one run of periods
	first int  // first occupied period (valid when ok)
	last  int  // last occupied period (valid when ok); occupied = first..last
	pat   bool // the section uses meeting patterns
	pok   bool // pattern section and Time names one of its choices
	m0    int  // meets[m0:m1] are the occurrences of a valid (ok or pok) placement
	m1    int
}

// occMeet is one occurrence of placement pl (a grid meeting, or one day of
// a chosen pattern); grid meetings take their section's weeks, a zero set
// read as every week.
type occMeet struct {
	Occurrence
	pl int
}

// meetsOf lists the occurrences of placement i (none when invalid).
func (x *occupancy) meetsOf(i int) []occMeet { return x.meets[x.pl[i].m0:x.pl[i].m1] }

// newOccupancy indexes schedule s against term t.
func newOccupancy(t *Term, s *Schedule) *occupancy {
	x := &occupancy{
		t:        t,
		s:        s,
		secIdx:   t.SectionIndex(),
		roomIdx:  t.RoomIndex(),
		staffIdx: t.StaffIndex(),
		cohIdx:   t.CohortIndex(),
		pl:       make([]occPlacement, len(s.Placements)),
		words:    (len(t.Periods) + 63) / 64,
	}
	x.indexDays()
	x.bySection = make([][]int, len(t.Sections))
	x.byStaff = make([][]int, len(t.Staff))
	x.byCohort = make([][]int, len(t.Cohorts))
	x.byRoom = make([][]int, len(t.Rooms))
	x.patStaff = make([][]int, len(t.Staff))
	x.patCohort = make([][]int, len(t.Cohorts))
	x.patRoom = make([][]int, len(t.Rooms))
	x.nWeeks = countWeeks(t)
	for i, p := range s.Placements {
		op := occPlacement{sec: -1, room: -1}
		if si, ok := x.secIdx[p.Section]; ok {
			op.sec = si
			x.bySection[si] = append(x.bySection[si], i)
		}
		if ri, ok := x.roomIdx[p.Room]; ok && p.Room != "" {
			op.room = ri
		}
		op.m0, op.m1 = len(x.meets), len(x.meets)
		if op.sec >= 0 {
			sec := &t.Sections[op.sec]
			switch {
			case sec.UsesTimes():
				op.pat = true
				if p.Time >= 1 && p.Time <= len(sec.Times) {
					op.pok = true
					c := sec.Times[p.Time-1]
					for _, d := range c.Days.List() {
						x.meets = append(x.meets, occMeet{Occurrence{Day: d, Start: c.Start, End: c.End(), Weeks: c.Weeks}, i})
					}
				}
			default:
				if span, ok := t.Span(p.Period, occLength(sec)); ok {
					op.ok, op.first, op.last = true, span[0], span[len(span)-1]
					pf, pl := t.Periods[op.first], t.Periods[op.last]
					x.meets = append(x.meets, occMeet{Occurrence{Day: pf.Day, Start: pf.Start, End: pl.End, Weeks: x.weeks(op.sec)}, i})
				}
			}
			op.m1 = len(x.meets)
		}
		x.pl[i] = op
		if !op.ok && !op.pok {
			continue
		}
		x.hasPat = x.hasPat || op.pok
		staff, cohorts, rooms := x.byStaff, x.byCohort, x.byRoom
		if op.pok {
			staff, cohorts, rooms = x.patStaff, x.patCohort, x.patRoom
		}
		sec := &t.Sections[op.sec]
		for _, id := range occUnique(sec.Staff) {
			if k, ok := x.staffIdx[id]; ok {
				staff[k] = append(staff[k], i)
			}
		}
		for _, id := range occUnique(sec.Cohorts) {
			if k, ok := x.cohIdx[id]; ok {
				cohorts[k] = append(cohorts[k], i)
			}
		}
		if op.room >= 0 {
			rooms[op.room] = append(rooms[op.room], i)
		}
	}
	return x
}

// countWeeks is the number of weeks the weekly rules look at: the term's
// teaching weeks, or the highest week a section or meeting time names when
// that is later (a term built in code without dates).
func countWeeks(t *Term) int {
	n := t.TeachingWeeks()
	high := func(w WeekSet) {
		if w != 0 && w != ^WeekSet(0) {
			n = max(n, 64-bits.LeadingZeros64(uint64(w)))
		}
	}
	for i := range t.Sections {
		high(t.Sections[i].Weeks)
		for _, c := range t.Sections[i].Times {
			high(c.Weeks)
		}
	}
	return n
}

// sectionMeets lists the occurrences of the valid placements of section
// si, in schedule order.
func (x *occupancy) sectionMeets(si int) []occMeet {
	if x.secMeets == nil {
		x.secMeets = make([][]occMeet, len(x.t.Sections))
	}
	if x.secMeets[si] == nil {
		out := []occMeet{}
		for _, i := range x.bySection[si] {
			out = append(out, x.meetsOf(i)...)
		}
		x.secMeets[si] = out
	}
	return x.secMeets[si]
}

// personMeets lists the occurrences of the valid placements in the grid
// and pattern lists given.
func (x *occupancy) personMeets(grid, pat []int) []occMeet {
	out := make([]occMeet, 0, len(grid)+3*len(pat))
	for _, i := range grid {
		out = append(out, x.meetsOf(i)...)
	}
	for _, i := range pat {
		out = append(out, x.meetsOf(i)...)
	}
	return out
}

// occLength is a section's meeting length, at least 1.
func occLength(sec *Section) int {
	if sec.Length < 1 {
		return 1
	}
	return sec.Length
}

// weeks returns a section's week set; the zero set (a Term built in code
// without weeks) is read as every week, so that no clash goes unseen.
func (x *occupancy) weeks(sec int) WeekSet {
	w := x.t.Sections[sec].Weeks
	if w == 0 {
		return ^WeekSet(0)
	}
	return w
}

// indexDays fills dayFirst and dayLast; Periods are sorted by day, so each
// day is one block of indexes.
func (x *occupancy) indexDays() {
	n := len(x.t.Periods)
	x.dayFirst = make([]int, n)
	x.dayLast = make([]int, n)
	for i := 0; i < n; {
		j := i
		for j+1 < n && x.t.Periods[j+1].Day == x.t.Periods[i].Day {
			j++
		}
		for k := i; k <= j; k++ {
			x.dayFirst[k], x.dayLast[k] = i, j
		}
		i = j + 1
	}
}

// sectionOK returns the valid placements of section si.
func (x *occupancy) sectionOK(si int) []int {
	var out []int
	for _, i := range x.bySection[si] {
		if x.pl[i].ok {
			out = append(out, i)
		}
	}
	return out
}

// occSet is a bitset over period indexes.
type occSet []uint64

func (x *occupancy) newPeriodSet() occSet { return make(occSet, x.words) }

func (ps occSet) add(p int)      { ps[p/64] |= 1 << (uint(p) % 64) }
func (ps occSet) has(p int) bool { return ps[p/64]&(1<<(uint(p)%64)) != 0 }

// addRange adds periods first..last.
func (ps occSet) addRange(first, last int) {
	for p := first; p <= last; p++ {
		ps.add(p)
	}
}

// commonCount is |ps ∩ o|.
func (ps occSet) commonCount(o occSet) int {
	n := 0
	for i, w := range ps {
		n += bits.OnesCount64(w & o[i])
	}
	return n
}

// members lists the periods in the set in increasing order.
func (ps occSet) members() []int {
	var out []int
	for i, w := range ps {
		for w != 0 {
			b := bits.TrailingZeros64(w)
			out = append(out, i*64+b)
			w &= w - 1
		}
	}
	return out
}

// sectionPeriods is the set of periods occupied by the valid placements of
// section si.
func (x *occupancy) sectionPeriods(si int) occSet {
	ps := x.newPeriodSet()
	for _, i := range x.bySection[si] {
		if op := x.pl[i]; op.ok {
			ps.addRange(op.first, op.last)
		}
	}
	return ps
}

// busy is the set of periods occupied by the given valid placements.
func (x *occupancy) busy(placements []int) occSet {
	ps := x.newPeriodSet()
	for _, i := range placements {
		ps.addRange(x.pl[i].first, x.pl[i].last)
	}
	return ps
}

// occUnique drops repeated entries, keeping the first of each.
func occUnique(xs []string) []string {
	if len(xs) < 2 {
		return xs
	}
	seen := make(map[string]bool, len(xs))
	out := make([]string, 0, len(xs))
	for _, v := range xs {
		if !seen[v] {
			seen[v] = true
			out = append(out, v)
		}
	}
	return out
}
