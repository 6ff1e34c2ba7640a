package improve

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// Indexes of the criteria in timetable.Criteria order.
const (
	cMoved = iota
	cStudentClash
	cAvoid
	cStaffGaps
	cStaffDays
	cCohortGaps
	cCohortIsolated
	cSpread
	cStability
	cOverCap
	cWasted
	cTravel
	cEarly
	cLate
	cSoftRel
	cTimeChoice // always 0: terms with meeting times are refused (support.go)
	cRoomChoice // always 0: terms with room choices are refused
	cUnplaced   // always 0 here: students are sectioned after the timetable
	cMovedStudents
	nCrit
)

// critNames is the criterion name of each index above.
var critNames = [nCrit]string{
	timetable.CritMoved, timetable.CritStudentClash, timetable.CritAvoidTimes,
	timetable.CritStaffGaps, timetable.CritStaffDays, timetable.CritCohortGaps,
	timetable.CritCohortIsolated, timetable.CritSpreadDays, timetable.CritRoomStability,
	timetable.CritOverCapacity, timetable.CritWastedSeats, timetable.CritTravel,
	timetable.CritEarly, timetable.CritLate, timetable.CritSoftRelations,
	timetable.CritTimeChoice, timetable.CritRoomChoice, timetable.CritUnplaced,
	timetable.CritMovedStudents,
}

// tally is a cost in criterion units: u the raw units, w the row-weighted
// units (equal to u except for avoid times and soft relations).
type tally struct {
	u, w [nCrit]int64
}

func (a *tally) add(c int, units, weighted int64) { a.u[c] += units; a.w[c] += weighted }

func (a *tally) plus(b *tally) {
	for i := range a.u {
		a.u[i] += b.u[i]
		a.w[i] += b.w[i]
	}
}

func (a *tally) minus(b *tally) {
	for i := range a.u {
		a.u[i] -= b.u[i]
		a.w[i] -= b.w[i]
	}
}

// secInfo is what a State knows about one section; fixed for the run.
type secInfo struct {
	length  int
	weeks   timetable.WeekSet // never 0 (0 is read as every week)
	people  []int32           // staff then cohort resources, unique, known
	staff   []int32           // staff indexes, unique, known
	starts  []int32           // start periods allowed by the grid and hard unavailability
	startOK []bool            // per period: in starts
	rooms   []int32           // allowed rooms (empty when noRoom)
	roomOK  []bool            // per room: in rooms
	noRoom  bool
	avoidU  []int64 // per start period: avoid-times hits of the section's staff, cohort and section rows
	avoidW  []int64 // per start period: the same hits times their row weights
	rels    []int32 // relations naming this section
	sameAs  []int32 // other sections in a hard same-time relation with this one
	nb      []neighbour
	kept    []slot // kept placements for moved meetings
}

// neighbour is another section sharing students, with overlapping weeks.
type neighbour struct {
	sec    int32
	shared int64 // distinct students enrolled in both
}

// slot is a start period and a room (-1 none, -2 a room unknown to the term).
type slot struct{ p, r int32 }

// meeting is one placement of the schedule.
type meeting struct {
	sec    int32
	p      int32 // start period
	r      int32 // room index or -1
	fixedT bool  // time fixed by a Fixed entry
	fixedR bool  // room fixed too
}

// State is a legal timetable of a term with its occupancy and running cost.
// It is not safe for concurrent use.
type State struct {
	t        *timetable.Term
	src      *timetable.Schedule // the placements (IDs, meeting numbers, sources)
	np       int                 // periods
	nStaff   int
	nCohort  int
	dayFirst []int32
	dayLast  []int32
	prevCons []bool   // period p follows p-1 consecutively on one day
	dayNo    []int32  // period -> day number (0-based, in period order)
	nDays    int      // days of the grid
	dayStart []int32  // day number -> its first period
	dayCons  []uint64 // per day: bit i set when the day's period i follows period i-1 consecutively
	useMasks bool     // at most 64 days of at most 64 periods: busy masks are kept
	anyBld   bool     // some room names a building (travel can cost)
	weight   [nCrit]int64
	level    [nCrit]int // index into levels, -1 when the weight is 0
	levels   []int      // distinct levels in use, highest first

	secs       []secInfo
	mt         []meeting
	bySec      [][]int32
	rels       []timetable.Relation
	relSecs    [][]int32 // per relation: its known sections (unique unless before / back to back)
	roomBld    []int32   // room -> building number, -1 when blank
	roomCap    []int
	roomAvU    []int64 // room*np+p: avoid-times hits of soft room rows
	roomAvW    []int64
	roomBlock  []bool // room*np+p: covered by a hard room row
	isStaffLim []bool // staff with MaxPerDay or MaxConsecutive

	occ    [][]int32 // res*np+p -> meetings occupying (res: staff, cohorts, rooms)
	secOcc []int32   // si*np+p -> meetings of si occupying p
	// busyMask is person*nDays+day -> bit i set when the person's occupancy
	// list at the day's period i is not empty (kept when useMasks).
	busyMask []uint64

	cur tally // running cost

	// scratch, named after their users
	markSec   []uint32
	markPD    []uint32
	markRel   []uint32
	stamp     uint32
	touchSec  []int32
	touchPD   []int32 // person*nDays... encoded res*np+dayFirst
	touchRel  []int32
	log       []undoRec
	chainSeen []uint32
	markMt    []uint32 // meeting -> stamp when it is part of the move apply checks
	chs       []change // the move being proposed
	peekOld   []int32  // peekRooms's saved rooms (a field, so that it is not allocated per move)
	scoreTry  []int64  // pickRoom's per-level score of the room tried
	scoreBest []int64  // and of the best room so far
	delta     tally    // the cost difference commit hands to accept (a field, so that it never escapes to the heap)
	movable   []int32  // meetings whose time may change (not fixed, more than one start)
	roomy     []int32  // meetings whose room may change (takes rooms, not fixed, more than one room)
}

// undoRec is a meeting's place before a move.
type undoRec struct{ m, p, r int32 }

// New builds the state of schedule s of term t; kept is the earlier
// timetable for "moved meetings" or nil. s must be complete and pass
// timetable.Check without hard violations; New returns an error otherwise.
// The term and schedule are not modified. Building costs
// O(placements·length·people + periods·(rooms + sections) + Σ students·k²).
func New(t *timetable.Term, s *timetable.Schedule, kept *timetable.Schedule) (*State, error) {
	if t == nil || s == nil {
		return nil, errors.New("improve: a term and a timetable are needed")
	}
	if why := Unsupported(t); why != "" {
		return nil, fmt.Errorf("improve: local search does not model this term: %s", why)
	}
	if hv := timetable.HardViolations(timetable.Check(t, s)); len(hv) > 0 {
		return nil, fmt.Errorf("improve: the starting timetable breaks %d hard requirements; the first: %s", len(hv), hv[0].Msg)
	}
	x := &State{t: t, src: s, np: len(t.Periods), nStaff: len(t.Staff), nCohort: len(t.Cohorts)}
	x.grid()
	x.criteria()
	x.rooms()
	if err := x.sections(kept); err != nil {
		return nil, err
	}
	if err := x.place(); err != nil {
		return nil, err
	}
	x.recount()
	return x, nil
}

// grid fills the day bounds and consecutive flags.
func (x *State) grid() {
	t := x.t
	n := x.np
	x.dayFirst = make([]int32, n)
	x.dayLast = make([]int32, n)
	x.prevCons = make([]bool, n)
	for i := 0; i < n; {
		j := i
		for j+1 < n && t.Periods[j+1].Day == t.Periods[i].Day {
			j++
		}
		for k := i; k <= j; k++ {
			x.dayFirst[k], x.dayLast[k] = int32(i), int32(j)
		}
		i = j + 1
	}
	for p := 1; p < n; p++ {
		x.prevCons[p] = t.Consecutive(p-1, p)
	}
	x.dayNo = make([]int32, n)
	x.useMasks = true
	for p := 0; p < n; p++ {
		if p > 0 && x.dayFirst[p] == int32(p) {
			x.nDays++
		}
		x.dayNo[p] = int32(x.nDays)
		if p-int(x.dayFirst[p]) >= 64 {
			x.useMasks = false
		}
	}
	if n > 0 {
		x.nDays++
	}
	x.useMasks = x.useMasks && x.nDays <= 64
	x.dayStart = make([]int32, x.nDays)
	for p := n - 1; p >= 0; p-- {
		x.dayStart[x.dayNo[p]] = int32(p)
	}
	x.dayCons = make([]uint64, x.nDays)
	for p := 1; p < n; p++ {
		if x.prevCons[p] && x.dayFirst[p] != int32(p) && x.useMasks {
			x.dayCons[x.dayNo[p]] |= 1 << (p - int(x.dayFirst[p]))
		}
	}
}

// criteria reads weights and levels.
func (x *State) criteria() {
	for c, name := range critNames {
		w, l := x.t.CriterionWeight(name)
		x.weight[c] = int64(w)
		x.level[c] = -1
		if w != 0 && !slices.Contains(x.levels, l) {
			x.levels = append(x.levels, l)
		}
	}
	slices.Sort(x.levels)
	slices.Reverse(x.levels)
	for c, name := range critNames {
		w, l := x.t.CriterionWeight(name)
		if w != 0 {
			x.level[c] = slices.Index(x.levels, l)
		}
	}
	x.scoreTry, x.scoreBest = make([]int64, len(x.levels)), make([]int64, len(x.levels))
}

// res numbers: staff k is k, cohort k is nStaff+k, room r is nStaff+nCohort+r.
func (x *State) roomRes(r int32) int32 { return int32(x.nStaff+x.nCohort) + r }

// rooms fills buildings, capacities and room rows.
func (x *State) rooms() {
	t := x.t
	nr := len(t.Rooms)
	x.roomBld = make([]int32, nr)
	x.roomCap = make([]int, nr)
	blds := map[string]int32{}
	for r, rm := range t.Rooms {
		x.roomCap[r] = rm.Capacity
		x.roomBld[r] = -1
		if rm.Building != "" {
			x.anyBld = true
			b, ok := blds[rm.Building]
			if !ok {
				b = int32(len(blds))
				blds[rm.Building] = b
			}
			x.roomBld[r] = b
		}
	}
	x.roomAvU = make([]int64, nr*x.np)
	x.roomAvW = make([]int64, nr*x.np)
	x.roomBlock = make([]bool, nr*x.np)
	ri := t.RoomIndex()
	for _, u := range t.Unavailable {
		r, ok := ri[u.Who]
		if u.Kind != timetable.WhoRoom || !ok {
			continue
		}
		for p, per := range t.Periods {
			if !u.Covers(per) {
				continue
			}
			if u.Hard {
				x.roomBlock[r*x.np+p] = true
			} else {
				x.roomAvU[r*x.np+p]++
				x.roomAvW[r*x.np+p] += int64(u.Weight)
			}
		}
	}
}

// sections fills secInfo for every section.
func (x *State) sections(kept *timetable.Schedule) error {
	t := x.t
	staffIdx, cohIdx, roomIdx, secIdx := t.StaffIndex(), t.CohortIndex(), t.RoomIndex(), t.SectionIndex()
	x.secs = make([]secInfo, len(t.Sections))
	x.isStaffLim = make([]bool, x.nStaff)
	for k, st := range t.Staff {
		x.isStaffLim[k] = st.MaxPerDay > 0 || st.MaxConsecutive > 0
	}
	for si := range t.Sections {
		sec := &t.Sections[si]
		in := &x.secs[si]
		in.length = max(sec.Length, 1)
		in.weeks = sec.Weeks
		if in.weeks == 0 {
			in.weeks = ^timetable.WeekSet(0)
		}
		for _, id := range unique(sec.Staff) {
			if k, ok := staffIdx[id]; ok {
				in.people = append(in.people, int32(k))
				in.staff = append(in.staff, int32(k))
			}
		}
		for _, id := range unique(sec.Cohorts) {
			if k, ok := cohIdx[id]; ok {
				in.people = append(in.people, int32(x.nStaff+k))
			}
		}
		in.noRoom = sec.NoRoom
		in.roomOK = make([]bool, len(t.Rooms))
		if !sec.NoRoom {
			for r := range t.Rooms {
				rm := &t.Rooms[r]
				if len(sec.Rooms) > 0 && !slices.Contains(sec.Rooms, rm.ID) {
					continue
				}
				if !hasAll(rm.Features, sec.Needs) || (!t.SoftCapacity && sec.Size > rm.Capacity) {
					continue
				}
				in.rooms = append(in.rooms, int32(r))
				in.roomOK[r] = true
			}
		}
		x.sectionTimes(si, staffIdx, cohIdx, secIdx)
	}
	x.relations(secIdx)
	x.neighbours(secIdx)
	if kept != nil {
		for _, p := range kept.Placements {
			si, ok := secIdx[p.Section]
			if !ok {
				continue
			}
			r := int32(-1)
			if p.Room != "" {
				r = -2
				if k, ok := roomIdx[p.Room]; ok {
					r = int32(k)
				}
			}
			x.secs[si].kept = append(x.secs[si].kept, slot{int32(p.Period), r})
		}
	}
	return nil
}

// sectionTimes fills the allowed starts and the avoid-times hits of a section.
func (x *State) sectionTimes(si int, staffIdx, cohIdx, secIdx map[string]int) {
	t := x.t
	in := &x.secs[si]
	hard := make([]bool, x.np)
	softU := make([]int64, x.np)
	softW := make([]int64, x.np)
	for _, u := range t.Unavailable {
		mine := false
		switch u.Kind {
		case timetable.WhoStaff:
			k, ok := staffIdx[u.Who]
			mine = ok && slices.Contains(in.staff, int32(k))
		case timetable.WhoCohort:
			k, ok := cohIdx[u.Who]
			mine = ok && slices.Contains(in.people, int32(x.nStaff+k))
		case timetable.WhoSection:
			k, ok := secIdx[u.Who]
			mine = ok && k == si
		}
		if !mine {
			continue
		}
		for p, per := range t.Periods {
			if !u.Covers(per) {
				continue
			}
			if u.Hard {
				hard[p] = true
			} else {
				softU[p]++
				softW[p] += int64(u.Weight)
			}
		}
	}
	in.startOK = make([]bool, x.np)
	in.avoidU = make([]int64, x.np)
	in.avoidW = make([]int64, x.np)
	for p := 0; p < x.np; p++ {
		span, ok := t.Span(p, in.length)
		if !ok {
			continue
		}
		good := true
		for _, q := range span {
			good = good && !hard[q]
			in.avoidU[p] += softU[q]
			in.avoidW[p] += softW[q]
		}
		if good {
			in.startOK[p] = true
			in.starts = append(in.starts, int32(p))
		}
	}
}

// relations indexes the relations by section.
func (x *State) relations(secIdx map[string]int) {
	x.rels = x.t.Relations
	x.relSecs = make([][]int32, len(x.rels))
	for ri, r := range x.rels {
		uniq := r.Kind != timetable.Before && r.Kind != timetable.BackToBack
		var out []int32
		for _, id := range r.Sections {
			si, ok := secIdx[id]
			if !ok || (uniq && slices.Contains(out, int32(si))) {
				continue
			}
			out = append(out, int32(si))
		}
		x.relSecs[ri] = out
		if r.Hard && r.Kind == timetable.SameTime {
			for _, a := range out {
				for _, b := range out {
					if a != b && !slices.Contains(x.secs[a].sameAs, b) {
						x.secs[a].sameAs = append(x.secs[a].sameAs, b)
					}
				}
			}
		}
		for _, si := range out {
			if !slices.Contains(x.secs[si].rels, int32(ri)) {
				x.secs[si].rels = append(x.secs[si].rels, int32(ri))
			}
		}
	}
}

// neighbours counts the students shared by each pair of sections with
// overlapping weeks.
func (x *State) neighbours(secIdx map[string]int) {
	bySt := map[string][]int32{}
	var order []string
	for _, e := range x.t.Enrolments {
		si, ok := secIdx[e.Section]
		if !ok {
			continue
		}
		if _, seen := bySt[e.Student]; !seen {
			order = append(order, e.Student)
		}
		if !slices.Contains(bySt[e.Student], int32(si)) {
			bySt[e.Student] = append(bySt[e.Student], int32(si))
		}
	}
	type pair struct{ a, b int32 }
	shared := map[pair]int64{}
	var pairs []pair
	for _, st := range order {
		secs := bySt[st]
		for i := range secs {
			for j := i + 1; j < len(secs); j++ {
				a, b := min(secs[i], secs[j]), max(secs[i], secs[j])
				if !x.secs[a].weeks.Overlaps(x.secs[b].weeks) {
					continue
				}
				k := pair{a, b}
				if shared[k] == 0 {
					pairs = append(pairs, k)
				}
				shared[k]++
			}
		}
	}
	for _, k := range pairs {
		n := shared[k]
		x.secs[k.a].nb = append(x.secs[k.a].nb, neighbour{k.b, n})
		x.secs[k.b].nb = append(x.secs[k.b].nb, neighbour{k.a, n})
	}
}

// place loads the schedule's placements and freezes the meetings that
// match Fixed entries.
func (x *State) place() error {
	t := x.t
	secIdx, roomIdx := t.SectionIndex(), t.RoomIndex()
	nres := x.nStaff + x.nCohort + len(t.Rooms)
	x.occ = make([][]int32, nres*x.np)
	x.secOcc = make([]int32, len(t.Sections)*x.np)
	if x.useMasks {
		x.busyMask = make([]uint64, (x.nStaff+x.nCohort)*x.nDays)
	}
	x.bySec = make([][]int32, len(t.Sections))
	x.mt = make([]meeting, len(x.src.Placements))
	for i, pl := range x.src.Placements {
		si := secIdx[pl.Section] // Check guarantees known sections
		r := int32(-1)
		if pl.Room != "" {
			r = int32(roomIdx[pl.Room])
		}
		x.mt[i] = meeting{sec: int32(si), p: -1, r: -1}
		x.bySec[si] = append(x.bySec[si], int32(i))
		if !x.secs[si].startOK[pl.Period] {
			return fmt.Errorf("improve: %s meeting %d starts where the term does not allow it", pl.Section, pl.Meeting)
		}
		x.insert(int32(i), int32(pl.Period), r)
	}
	for si := range t.Sections {
		x.freeze(si)
	}
	n := len(t.Sections)
	x.markSec = make([]uint32, n)
	x.markRel = make([]uint32, len(x.rels))
	x.markPD = make([]uint32, (x.nStaff+x.nCohort)*x.np)
	x.chainSeen = make([]uint32, len(x.mt))
	x.markMt = make([]uint32, len(x.mt))
	for m, mt := range x.mt {
		in := &x.secs[mt.sec]
		if !mt.fixedT && len(in.starts) > 1 {
			x.movable = append(x.movable, int32(m))
		}
		if !in.noRoom && !mt.fixedR && len(in.rooms) > 1 {
			x.roomy = append(x.roomy, int32(m))
		}
	}
	return nil
}

// freeze marks the meetings matching the Fixed entries of section si (a
// maximum matching, as Check does) so that no move changes them.
func (x *State) freeze(si int) {
	sec := &x.t.Sections[si]
	if len(sec.Fixed) == 0 {
		return
	}
	ms := x.bySec[si]
	fits := func(f timetable.Fixed, m int32) bool {
		per := x.t.Periods[x.mt[m].p]
		return per.Day == f.Day && per.Start == f.Start && (f.Room == "" || f.Room == x.src.Placements[m].Room)
	}
	owner := make([]int, len(ms))
	var try func(f int, seen []bool) bool
	try = func(f int, seen []bool) bool {
		for k, m := range ms {
			if seen[k] || !fits(sec.Fixed[f], m) {
				continue
			}
			seen[k] = true
			if owner[k] == 0 || try(owner[k]-1, seen) {
				owner[k] = f + 1
				return true
			}
		}
		return false
	}
	for f := range sec.Fixed {
		try(f, make([]bool, len(ms)))
	}
	for k, m := range ms {
		if owner[k] > 0 {
			x.mt[m].fixedT = true
			x.mt[m].fixedR = sec.Fixed[owner[k]-1].Room != ""
		}
	}
}

func unique(xs []string) []string {
	var out []string
	for _, v := range xs {
		if !slices.Contains(out, v) {
			out = append(out, v)
		}
	}
	return out
}

// hasAll reports whether have holds every feature of want, compared
// without regard to case or surrounding spaces (as timetable.Check does).
func hasAll(have, want []string) bool {
	for _, w := range want {
		w = strings.ToLower(strings.TrimSpace(w))
		if !slices.ContainsFunc(have, func(h string) bool { return strings.ToLower(strings.TrimSpace(h)) == w }) {
			return false
		}
	}
	return true
}
