package encode

import (
	"fmt"
	"slices"
	"strconv"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// People limits of timetable/term.go that pattern terms bring (all hard):
// a staff member's weekly limits (MaxWeekPeriods, MaxWeekMinutes,
// MaxWeekDays, per teaching week) and the lunch break of staff and cohorts
// (times_limits_lunch.go). They count every meeting of the person: pattern
// sections through their time atoms, grid sections through their start
// atoms. Weeks are split into classes of weeks in which the same
// candidates meet, and each class gets one bound (or, for lunch, one
// constraint per day).

// limItem is one candidate meeting decision of a person: a pattern of a
// pattern section (its days' occurrences), or a start of a grid meeting
// (one occurrence).
type limItem struct {
	grp   int        // items with the same grp >= 0 exclude each other (one pattern section's patterns); grid starts have their own
	lit   solver.Lit // the time or start literal
	occ   []timetable.Occurrence
	weeks timetable.WeekSet
}

// personItems lists the candidate meeting decisions of every section that
// has, in its Staff (staff true) or Cohorts, the given ID, with the grid
// sections among them.
func (b *builder) personItems(id string, staff bool) (items []limItem, grid []int) {
	t := b.t
	next := len(t.Sections)
	for s := range t.Sections {
		sec := &t.Sections[s]
		list := sec.Cohorts
		if staff {
			list = sec.Staff
		}
		if !slices.Contains(list, id) {
			continue
		}
		if b.c.IsPattern(s) {
			for _, i := range b.c.TimeCandidates(s) {
				tc := &sec.Times[i]
				items = append(items, limItem{grp: s, lit: solver.Pos(b.c.TimeAtom(s, i)), occ: b.c.Pattern(s, i), weeks: tc.Weeks})
			}
			continue
		}
		grid = append(grid, s)
		m := &b.c.secs[s]
		for _, p := range m.starts {
			occ := t.SectionOccurrences(sec, timetable.Placement{Section: sec.ID, Period: p, Meeting: 1})
			if len(occ) == 0 {
				continue
			}
			items = append(items, limItem{grp: next, lit: solver.Pos(m.start[p]), occ: occ, weeks: b.weeksOf(sec)})
			next++
		}
	}
	return items, grid
}

// limClass is a class of weeks with the items meeting in them.
type limClass struct {
	weeks []int // the teaching weeks of the class
	items []int // indexes into the item list
}

// limClasses splits the teaching weeks (1 .. TeachingWeeks) into classes
// with the same meeting items; weeks with none are left out.
func (b *builder) limClasses(items []limItem) []limClass {
	var out []limClass
	at := map[string]int{}
	var key strings.Builder
	for w := 1; w <= b.t.TeachingWeeks(); w++ {
		key.Reset()
		var in []int
		for k := range items {
			if items[k].weeks.Has(w) {
				in = append(in, k)
				key.WriteString(strconv.Itoa(k))
				key.WriteByte(',')
			}
		}
		if len(in) == 0 {
			continue
		}
		if c, ok := at[key.String()]; ok {
			out[c].weeks = append(out[c].weeks, w)
			continue
		}
		at[key.String()] = len(out)
		out = append(out, limClass{weeks: []int{w}, items: in})
	}
	return out
}

// compileTimesLimits states the weekly limits of every staff member and
// the lunch breaks of staff and cohorts.
func (b *builder) compileTimesLimits() {
	t := b.t
	for i := range t.Staff {
		st := &t.Staff[i]
		if st.MaxWeekPeriods <= 0 && st.MaxWeekMinutes <= 0 && st.MaxWeekDays <= 0 && !st.Lunch.Set() {
			continue
		}
		items, grid := b.personItems(st.ID, true)
		if st.MaxWeekPeriods > 0 {
			b.weekPeriods(st, grid)
		}
		if st.MaxWeekMinutes > 0 {
			b.weekMinutes(st, items)
		}
		if st.MaxWeekDays > 0 {
			b.weekDays(st, items)
		}
		if st.Lunch.Set() {
			b.lunch(items, st.Lunch, KindStaffLunch, st.ID, "staff "+staffName(st), st.Src)
		}
	}
	for c := range t.Cohorts {
		co := &t.Cohorts[c]
		if !co.Lunch.Set() {
			continue
		}
		items, _ := b.personItems(co.ID, false)
		b.lunch(items, co.Lunch, KindCohortLunch, co.ID, "cohort "+co.ID, co.Src)
	}
	b.in(-1, "pattern limits")
}

// Requirement group kinds of the people limits of pattern terms.
const (
	KindStaffWeekLimit = "staff week limit"
	KindStaffLunch     = "staff lunch break"
	KindCohortLunch    = "cohort lunch break"
)

// weekGroup makes (once) the group of one of a staff member's weekly limits.
func (b *builder) weekGroup(st *timetable.Staff, what string, n int) int {
	g := b.newGroup(KindStaffWeekLimit, []string{st.ID, what},
		fmt.Sprintf("staff %s teaches at most %d %s a week", staffName(st), n, what), []timetable.Source{st.Src}, RelaxDayLimit)
	b.in(g, KindStaffWeekLimit)
	return g
}

// weekPeriods: grid periods count (timetable/term.go: "periods count grid
// periods"): a grid section occupies Meetings × Length periods in each of
// its weeks whatever its starts, so the limit holds or fails outright;
// pattern meetings occupy no grid periods.
func (b *builder) weekPeriods(st *timetable.Staff, grid []int) {
	for w := 1; w <= b.t.TeachingWeeks(); w++ {
		n := 0
		for _, s := range grid {
			sec := &b.t.Sections[s]
			if b.weeksOf(sec).Has(w) {
				n += sec.Meetings * sec.Length
			}
		}
		if n > st.MaxWeekPeriods {
			g := b.weekGroup(st, "periods", st.MaxWeekPeriods)
			b.rule(0, b.sel(g))
			return
		}
	}
}

// weekMinutes: per class of weeks, the minutes of every meeting are at most
// MaxWeekMinutes: a bound over unit literals (unitChain), one unit per
// step of the gcd of the items' weekly minutes, per exclusive group.
func (b *builder) weekMinutes(st *timetable.Staff, items []limItem) {
	minutes := func(it *limItem) int {
		n := 0
		for _, o := range it.occ {
			n += o.Minutes()
		}
		return n
	}
	g := 0
	for k := range items {
		g = gcd(g, minutes(&items[k]))
	}
	g = max(g, 1)
	grp := -1
	seen := map[string]bool{}
	for _, c := range b.limClasses(items) {
		var lits []solver.Lit
		most := 0
		for _, part := range limGroups(items, c.items) {
			vals := make([]litVal, len(part))
			top := 0
			for k, x := range part {
				vals[k] = litVal{items[x].lit, minutes(&items[x]) / g}
				top = max(top, minutes(&items[x]))
			}
			most += top
			lits = append(lits, b.unitChain(vals)...)
		}
		if most <= st.MaxWeekMinutes {
			continue
		}
		key := fmt.Sprint(lits)
		if seen[key] {
			continue
		}
		seen[key] = true
		if grp < 0 {
			grp = b.weekGroup(st, "minutes", st.MaxWeekMinutes)
		}
		b.in(grp, KindStaffWeekLimit)
		b.bound(b.distinct(lits), solver.NoBound, st.MaxWeekMinutes/g, b.sel(grp))
	}
}

// weekDays: per class of weeks, at most MaxWeekDays days have a meeting:
// a bound over one "meets that day" literal per day.
func (b *builder) weekDays(st *timetable.Staff, items []limItem) {
	grp := -1
	seen := map[string]bool{}
	for _, c := range b.limClasses(items) {
		var days []solver.Lit
		for _, d := range weekdays {
			var bodies [][]solver.Lit
			for _, k := range c.items {
				for _, o := range items[k].occ {
					if o.Day == d {
						bodies = append(bodies, []solver.Lit{items[k].lit})
					}
				}
			}
			if len(bodies) > 0 {
				days = append(days, b.relOr("staffday:"+fmt.Sprint(bodies), "teaches_day", bodies))
			}
		}
		if len(days) <= st.MaxWeekDays {
			continue
		}
		key := fmt.Sprint(days)
		if seen[key] {
			continue
		}
		seen[key] = true
		if grp < 0 {
			grp = b.weekGroup(st, "days", st.MaxWeekDays)
		}
		b.in(grp, KindStaffWeekLimit)
		b.bound(b.distinct(days), solver.NoBound, st.MaxWeekDays, b.sel(grp))
	}
}

// limGroups splits items idx into their exclusive groups, in order.
func limGroups(items []limItem, idx []int) [][]int {
	var out [][]int
	at := map[int]int{}
	for _, k := range idx {
		g := items[k].grp
		if j, ok := at[g]; ok {
			out[j] = append(out[j], k)
			continue
		}
		at[g] = len(out)
		out = append(out, []int{k})
	}
	return out
}
