package timetable

import "time"

// CountingBound returns, per criterion, a lower bound on the cost every
// timetable passing Check must pay (kept: the earlier timetable for
// "moved meetings", or nil), with ByLevel summed per level like Cost.
//
// The bounds are counting arguments on the term alone, independent of the
// encoder: each relaxes the hard rules (it keeps some of them and forgets
// the rest), so the least cost of the relaxation is at most the least cost
// of any timetable that passes Check. A criterion whose cost is a sum over
// separate units (meetings, sections, cohorts) is bounded unit by unit and
// the unit bounds are added; no unit is bounded twice. Criteria are bounded
// separately, so ByLevel is the sum of bounds that may come from different
// timetables (still a lower bound on every timetable's level cost).
// The arguments, each documented where it is computed:
//   - per meeting, the least cost over its legal places (bound_section.go):
//     avoid times, early and late periods, time choice, room choice, room
//     over capacity and wasted seats; the legal places honour the grid,
//     hard unavailability of the section, its staff, cohorts and rooms,
//     the allowed rooms (list, choices, features, hard capacity), fixed
//     meetings and meetings on different days;
//   - spread days from the days a section can use (bound_section.go);
//   - room stability where no single allowed room can hold all meetings
//     (bound_section.go);
//   - room over capacity from the competition of large sections for the
//     large rooms (bound_rooms.go);
//   - cohort isolated periods from how many meetings must fall on
//     different days, staff days from that and from the periods their
//     meetings of a common week fill (bound_people.go);
//   - unplaced requests whose courses no section teaches, and moved
//     meetings that no legal place can keep (bound_people.go,
//     bound_moved.go).
//
// Every other criterion (student clashes, gaps, travel, soft relations,
// moved students) is bounded by 0. PerStaff, PerCohort, PerSection and
// PerRoom are nil. The bound assumes weights that Validate accepts (none
// negative). It runs in O(Σ sections' (periods · length + rows + rooms
// with rows) + rooms · log rooms), the rooms with rows judged start by
// start at most 16 to a section (boundMarkedRooms; beyond, a relaxation).
func CountingBound(t *Term, kept *Schedule) CostReport {
	b := newBounder(t)
	b.keptOf(kept)
	b.sections()
	b.overCapacity()
	b.people()
	b.unplaced()
	return b.finish()
}

// bounder accumulates the bound of each criterion in units and in
// row-weighted units (equal except for avoid times).
type bounder struct {
	t        *Term
	at       map[string]int // criterion name -> index in Criteria
	units    []int64
	weighted []int64

	dayFirst, dayLast []int // period index -> first/last period of its day
	rowsOf            map[rowKey][]int
	rowCover          [][]int // Unavailable index -> periods the row covers
	rooms             []int   // the room indexes placements can name (first of each ID)
	roomFeat          []map[string]bool
	roomMarked        []bool  // the room has some Unavailable row
	roomTouch         [][]int // periods some row of the room covers
	roomIdx           map[string]int
	byNeeds           map[string]*needsRooms // roomsFor's lists by set of needs
	roomBase          []roomRowArrays        // roomArrays of marked rooms whose rows name no weeks (nil arrays otherwise)
	run               []int                  // period index -> periods in the run of consecutive periods from it
	startAt           map[[2]int]int         // (weekday, start clock) -> period index

	// Per section, filled by sections and read by overCapacity, people
	// and moved.
	sec     []secBound
	scratch *gridPlaces // newGridPlaces's arrays, reused section after section

	// overCapacity's slot bound (bound_rooms.go): the sizes of the grid
	// meetings of sections that may use every room, with their weeks.
	kept map[string][]Placement // kept placements by section ID (nil without kept)
}

// rowKey finds the Unavailable rows of one staff member, cohort, room or
// section.
type rowKey struct {
	kind WhoKind
	who  string
}

func newBounder(t *Term) *bounder {
	b := &bounder{t: t, at: map[string]int{}, rowsOf: map[rowKey][]int{}, byNeeds: map[string]*needsRooms{}}
	for i, c := range Criteria {
		b.at[c.Name] = i
	}
	b.units = make([]int64, len(Criteria))
	b.weighted = make([]int64, len(Criteria))
	x := &occupancy{t: t}
	x.indexDays()
	b.dayFirst, b.dayLast = x.dayFirst, x.dayLast
	b.roomIdx = t.RoomIndex()
	b.indexRows()
	b.indexRooms()
	n := len(t.Periods)
	b.run = make([]int, n)
	b.startAt = make(map[[2]int]int, n)
	for p := n - 1; p >= 0; p-- {
		b.run[p] = 1
		if p+1 < n && t.Consecutive(p, p+1) {
			b.run[p] += b.run[p+1]
		}
	}
	for p := range t.Periods {
		k := [2]int{int(t.Periods[p].Day), int(t.Periods[p].Start)}
		if _, dup := b.startAt[k]; dup {
			b.startAt[k] = -1 // two periods alike: Fixed entries are not pinned to one
		} else {
			b.startAt[k] = p
		}
	}
	b.sec = make([]secBound, len(t.Sections))
	return b
}

// periodAt is Term.PeriodAt by index: the first period of day starting at
// start, or -1.
func (b *bounder) periodAt(day time.Weekday, start Clock) int {
	if p, ok := b.startAt[[2]int{int(day), int(start)}]; ok {
		return p
	}
	return -1
}

// add counts units (and row-weighted units) of criterion name.
func (b *bounder) add(name string, units, weighted int64) {
	k := b.at[name]
	b.units[k] += units
	b.weighted[k] += weighted
}

// indexRows groups the Unavailable rows whose Who is known (Check and Cost
// ignore the others) and lists the periods each covers.
func (b *bounder) indexRows() {
	t := b.t
	staff, cohorts, rooms, secs := t.StaffIndex(), t.CohortIndex(), t.RoomIndex(), t.SectionIndex()
	known := func(u Unavailability) bool {
		var ok bool
		switch u.Kind {
		case WhoStaff:
			_, ok = staff[u.Who]
		case WhoCohort:
			_, ok = cohorts[u.Who]
		case WhoRoom:
			_, ok = rooms[u.Who]
		case WhoSection:
			_, ok = secs[u.Who]
		}
		return ok
	}
	b.rowCover = make([][]int, len(t.Unavailable))
	for i, u := range t.Unavailable {
		if !known(u) {
			continue
		}
		k := rowKey{u.Kind, u.Who}
		b.rowsOf[k] = append(b.rowsOf[k], i)
		for p := range t.Periods {
			if u.Covers(t.Periods[p]) {
				b.rowCover[i] = append(b.rowCover[i], p)
			}
		}
	}
}

// indexRooms lists the rooms a placement can name (a repeated ID names its
// first room, as in Check), their features and whether rows name them.
func (b *bounder) indexRooms() {
	t := b.t
	idx := b.roomIdx
	b.roomFeat = make([]map[string]bool, len(t.Rooms))
	b.roomMarked = make([]bool, len(t.Rooms))
	b.roomTouch = make([][]int, len(t.Rooms))
	b.roomBase = make([]roomRowArrays, len(t.Rooms))
	for i := range t.Rooms {
		r := &t.Rooms[i]
		if idx[r.ID] != i || r.ID == "" {
			continue
		}
		b.rooms = append(b.rooms, i)
		f := make(map[string]bool, len(r.Features))
		for _, s := range r.Features {
			f[normFeature(s)] = true
		}
		b.roomFeat[i] = f
		rows := b.rowsOf[rowKey{WhoRoom, r.ID}]
		b.roomMarked[i] = len(rows) > 0
		byWeek := false
		for _, k := range rows {
			b.roomTouch[i] = append(b.roomTouch[i], b.rowCover[k]...)
			byWeek = byWeek || t.Unavailable[k].Weeks != 0
		}
		if len(rows) > 0 && !byWeek {
			n := len(t.Periods)
			a := roomRowArrays{make([]bool, n), make([]int64, n), make([]int64, n)}
			b.applyRows(rows, 0, a.hard, a.softN, a.softW)
			b.roomBase[i] = a
		}
	}
}

// finish weighs the units and sums the levels as Cost does.
func (b *bounder) finish() CostReport {
	rep := CostReport{ByLevel: map[int]int64{}}
	for i, c := range Criteria {
		w, l := b.t.CriterionWeight(c.Name)
		cc := CriterionCost{Name: c.Name, Level: l, Weight: w}
		if w >= 0 {
			cc.Count = b.units[i]
			cc.Cost = int64(w) * b.weighted[i]
		}
		rep.Criteria = append(rep.Criteria, cc)
		if w != 0 {
			rep.ByLevel[l] += cc.Cost
		}
	}
	return rep
}
