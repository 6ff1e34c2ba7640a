package samples

import (
	"math"
	"slices"
	"time"

	"github.com/termwright/termwright/timetable"
)

// Everything that restricts a timetable is derived here from the witness,
// so the witness keeps satisfying every hard requirement.

// derive adds allowed-room lists, fixed meetings, staff limits,
// unavailabilities, relations, weights and holidays.
func (g *gen) derive() {
	g.allowRooms()
	g.fixMeetings()
	g.limitStaff()
	g.addUnavailable()
	g.addRelations()
	g.chooseWeights()
	g.chooseHolidays()
}

// allowRooms gives about 2% of the sections that take rooms a short list of
// allowed rooms: the rooms the witness used plus up to two more that fit.
func (g *gen) allowRooms() {
	for i := range g.secs {
		s := &g.secs[i]
		if s.noRoom || !g.chance(0.02) {
			continue
		}
		allowed := slices.Clone(s.rooms)
		fit := g.fittingRooms(s)
		for range 2 {
			allowed = append(allowed, fit[g.rng.IntN(len(fit))])
		}
		slices.Sort(allowed)
		s.allowed = slices.Compact(allowed)
	}
}

// fixMeetings pre-assigns one witness meeting of about 3% of the sections
// (both meetings of some two-meeting sections), half of them with the room.
func (g *gen) fixMeetings() {
	for i := range g.secs {
		s := &g.secs[i]
		if !g.chance(0.03) {
			continue
		}
		ks := []int{g.rng.IntN(len(s.starts))}
		if len(s.starts) == 2 && g.chance(0.2) {
			ks = []int{0, 1}
		}
		withRoom := !s.noRoom && g.chance(0.5)
		for _, k := range ks {
			p := g.periods[s.starts[k]]
			f := timetable.Fixed{Day: p.Day, Start: p.Start}
			if withRoom {
				f.Room = g.rooms[s.rooms[k]].id
			}
			f.Text = timetable.FormatFixed(f)
			s.fixed = append(s.fixed, f)
		}
	}
}

// limitStaff gives about a fifth of the staff a daily limit and about one in
// eight a limit on consecutive periods, never below what the witness gives
// them (counting every meeting whatever its weeks).
func (g *gen) limitStaff() {
	perDay := make([][]int, len(g.staff))
	for p := range g.staff {
		perDay[p] = make([]int, 7)
	}
	for _, s := range g.secs {
		for _, st := range s.starts {
			for _, p := range s.staff {
				perDay[p][g.periods[st].Day] += s.length
			}
		}
	}
	for p := range g.staff {
		st := &g.staff[p]
		if g.chance(0.2) {
			st.maxPerDay = max(slices.Max(perDay[p]), g.between(4, 6))
		}
		if g.chance(0.12) {
			st.maxConsecutive = max(g.longestRun(g.occStaff[p]), g.between(3, 4))
		}
	}
}

// longestRun is the longest run of consecutive busy periods in occ.
func (g *gen) longestRun(occ []weekSet) int {
	best, run := 0, 0
	for p := range occ {
		switch {
		case occ[p] == 0:
			run = 0
		case p > 0 && run > 0 && g.consecutive(p-1, p):
			run++
		default:
			run = 1
		}
		best = max(best, run)
	}
	return best
}

// window is a stretch of one day: its periods and the clock times written.
type window struct {
	day      time.Weekday
	periods  []int
	from, to timetable.Clock
	kind     windowKind
}

// windowKind says which stretch of the day a window is.
type windowKind int

const (
	wholeDay windowKind = iota
	firstRun            // the morning (the periods before the first gap)
	laterRun            // a run after a gap (the afternoon)
	earlyTwo            // the first two periods
	lateTwo             // the last two periods
)

// windows lists the stretches of day an unavailability may cover: the whole
// day, each run of consecutive periods (morning, afternoon), the first two
// and the last two periods.
func (g *gen) windows(day time.Weekday) []window {
	var ps []int
	for i, p := range g.periods {
		if p.Day == day {
			ps = append(ps, i)
		}
	}
	out := []window{{day: day, periods: ps, from: 0, to: 24 * 60, kind: wholeDay}}
	add := func(sub []int, kind windowKind) {
		out = append(out, window{day, sub, g.periods[sub[0]].Start, g.periods[sub[len(sub)-1]].End, kind})
	}
	start := 0
	for k := 1; k <= len(ps); k++ {
		if k == len(ps) || !g.consecutive(ps[k-1], ps[k]) {
			switch {
			case start == 0 && k < len(ps):
				add(ps[start:k], firstRun)
			case start > 0:
				add(ps[start:k], laterRun)
			}
			start = k
		}
	}
	if len(ps) >= 4 {
		add(ps[:2], earlyTwo)
		add(ps[len(ps)-2:], lateTwo)
	}
	return out
}

// freeWindow finds a window none of whose periods is busy, trying a few at
// random; ok is false when none was found.
func (g *gen) freeWindow(busy func(p int) bool) (window, bool) {
	for range 8 {
		ws := g.windows(g.days[g.rng.IntN(len(g.days))])
		w := ws[g.rng.IntN(len(ws))]
		if !slices.ContainsFunc(w.periods, busy) {
			return w, true
		}
	}
	return window{}, false
}

var (
	staffReasons  = []string{"Part-time: not contracted at this time", "Research time", "Caring responsibilities", "Teaches at the harbour campus", "Professional body duties"}
	roomReasons   = []string{"Planned maintenance", "Booked for examinations", "Open-day use"}
	cohortReasons = []string{"Work placement", "Field trip", "Study time", "Clinical placement"}
	secReasons    = []string{"Off-site facility closed", "Technician not available"}
)

// staffWish and sectionWish give the reason of a preference by the
// stretch of day it covers.
func staffWish(k windowKind) string {
	switch k {
	case earlyTwo:
		return "Prefers no early start"
	case lateTwo:
		return "Would rather not teach late"
	case firstRun:
		return "Would rather keep mornings for research"
	}
	return "Would rather keep this time for marking"
}

func sectionWish(k windowKind) string {
	switch k {
	case earlyTwo:
		return "Students travel from the harbour campus"
	case firstRun:
		return "Teacher prefers afternoons"
	}
	return "Teacher would rather not teach then"
}

// addUnavailable adds hard unavailabilities where the witness leaves the
// staff member, room, cohort or section free, and soft ones (preferences)
// anywhere.
func (g *gen) addUnavailable() {
	for p := range g.staff {
		busy := func(q int) bool { return g.occStaff[p][q] != 0 }
		if g.chance(0.12) {
			g.unavail(timetable.WhoStaff, g.staff[p].id, busy, g.pickFrom(staffReasons))
		}
		if g.chance(0.15) {
			g.unavail(timetable.WhoStaff, g.staff[p].id, nil, staffWish)
		}
	}
	for r := range g.rooms {
		if g.chance(0.05) {
			g.unavail(timetable.WhoRoom, g.rooms[r].id, func(q int) bool { return g.occRoom[r][q] != 0 }, g.pickFrom(roomReasons))
		}
	}
	for c := range g.cohorts {
		if g.chance(0.1) {
			g.unavail(timetable.WhoCohort, g.cohorts[c].id, func(q int) bool { return g.occCohort[c][q] != 0 }, g.pickFrom(cohortReasons))
		}
	}
	for i := range g.secs {
		s := &g.secs[i]
		busy := func(q int) bool {
			for _, st := range s.starts {
				if q >= st && q < st+s.length {
					return true
				}
			}
			return false
		}
		if g.chance(0.01) {
			g.unavail(timetable.WhoSection, s.id, busy, g.pickFrom(secReasons))
		}
		if g.chance(0.01) {
			g.unavail(timetable.WhoSection, s.id, nil, sectionWish)
		}
	}
}

// unavail adds one row. A hard row (busy given) goes in a window free of
// busy; a preference (busy nil) goes in any window with a weight of 1 to 3.
// reason names the row from its window.
func (g *gen) unavail(kind timetable.WhoKind, who string, busy func(int) bool, reason func(windowKind) string) {
	hard := busy != nil
	if !hard {
		busy = func(int) bool { return false }
	}
	w, ok := g.freeWindow(busy)
	if !ok {
		return
	}
	u := timetable.Unavailability{Who: who, Kind: kind, Day: w.day, From: w.from, To: w.to, Hard: hard, Reason: reason(w.kind)}
	if !hard {
		u.Weight = g.between(1, 3)
	}
	g.unavailable = append(g.unavailable, u)
}

// pickFrom returns a reason function that draws from list at random.
func (g *gen) pickFrom(list []string) func(windowKind) string {
	return func(windowKind) string { return list[g.rng.IntN(len(list))] }
}

// chooseWeights sets the weights of five soft criteria, keeping each
// criterion's default priority level.
func (g *gen) chooseWeights() {
	names := []string{timetable.CritStudentClash, timetable.CritStaffGaps, timetable.CritCohortGaps,
		timetable.CritAvoidTimes, timetable.CritTravel, timetable.CritEarly, timetable.CritLate, timetable.CritSpreadDays}
	g.weights = map[string]timetable.Weight{}
	for _, k := range g.shuffled(len(names))[:5] {
		_, level := (&timetable.Term{}).CriterionWeight(names[k])
		g.weights[names[k]] = timetable.Weight{Weight: g.between(1, 5), Level: level}
	}
}

// chooseHolidays makes one teaching day in the middle of a term of four
// weeks or more a holiday, and one more in terms of ten weeks or more.
func (g *gen) chooseHolidays() {
	first := g.cfg.FirstDay
	monday := first.AddDate(0, 0, -timetable.WeekOrder(first.Weekday()))
	weeks := []int{}
	if g.cfg.Weeks >= 4 {
		weeks = append(weeks, g.cfg.Weeks/2+1)
	}
	if g.cfg.Weeks >= 10 {
		weeks = append(weeks, g.between(2, g.cfg.Weeks/2))
	}
	for _, w := range weeks {
		day := g.days[g.rng.IntN(len(g.days))]
		g.holidays = append(g.holidays, monday.AddDate(0, 0, 7*(w-1)+timetable.WeekOrder(day)))
	}
	slices.SortFunc(g.holidays, func(a, b time.Time) int { return a.Compare(b) })
}

// relationsPerKind is how many relations of each kind a term gets.
func (g *gen) relationsPerKind() int {
	return max(1, int(math.Round(float64(len(g.secs))/75)))
}
