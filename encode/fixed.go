package encode

import (
	"fmt"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// initSections fills the per-section model and the day lists before the
// parts run.
func (b *builder) initSections() {
	t := b.t
	for p := range t.Periods {
		if p == 0 || t.Periods[p].Day != t.Periods[p-1].Day {
			b.days = append(b.days, nil)
		}
		b.days[len(b.days)-1] = append(b.days[len(b.days)-1], p)
		b.dayOf = append(b.dayOf, len(b.days)-1)
	}
	for s := range t.Sections {
		sec := &t.Sections[s]
		b.c.secs[s] = secModel{
			length:    sec.Length,
			meetings:  sec.Meetings,
			weeks:     b.weeksOf(sec),
			takesRoom: !sec.NoRoom,
			cand:      -1,
			sameRoom:  -1,
		}
		if sec.UsesTimes() {
			// The grid parts see no meetings and no room (pattern_atoms.go).
			b.c.secs[s].length, b.c.secs[s].meetings, b.c.secs[s].takesRoom = 1, 0, false
		}
	}
}

// compileFixed: each fixed meeting is held at its period (its room is the
// room model's business: the meeting's candidate set is that one room). Two
// fixed meetings of one section at the same period cannot both be held.
func (b *builder) compileFixed() {
	t := b.t
	for s := range t.Sections {
		sec := &t.Sections[s]
		m := &b.c.secs[s]
		first := map[int]int{} // period -> group of the first fixed meeting there
		for i, f := range sec.Fixed {
			p := t.PeriodAt(f.Day, f.Start)
			where := f.Text
			if where == "" {
				where = timetable.DayName(f.Day) + " " + f.Start.String()
				if f.Room != "" {
					where += " " + f.Room
				}
			}
			g := b.newGroup(KindFixed, []string{sec.ID, fmt.Sprint(i + 1)},
				fmt.Sprintf("section %s has a meeting fixed at %s", sec.ID, where),
				[]timetable.Source{sec.Src}, RelaxFixed)
			b.in(g, KindFixed)
			if g0, dup := first[p]; dup {
				b.rule(0, b.sel(g0), b.sel(g))
				continue
			}
			first[p] = g
			if f.Room != "" && !m.takesRoom {
				// A section that takes no room cannot meet in the fixed room.
				b.rule(0, b.sel(g))
			} else if p >= 0 && m.start[p] != 0 {
				b.rule(0, solver.Neg(m.start[p]), b.sel(g))
			} else {
				b.rule(0, b.sel(g))
			}
		}
	}
}

// compileAvailability: in Explain mode, where candidates are not pruned,
// each staff member's, cohort's and section's hard unavailability is a
// group forbidding the starts whose meetings would overlap it. (Rooms'
// unavailability takes part in the room supply bounds.)
func (b *builder) compileAvailability() {
	if !b.opt.Explain {
		return
	}
	t := b.t
	forbid := func(g int, kind string, s int, blocked func(q int) bool) {
		m := &b.c.secs[s]
		for _, p := range m.starts {
			lo, hi := b.span(s, p)
			for q := lo; q <= hi; q++ {
				if blocked(q) {
					b.in(g, kind)
					b.rule(0, solver.Pos(m.start[p]), b.sel(g))
					break
				}
			}
		}
	}
	groupOf := map[string]int{}
	get := func(kind, id, sentence string, src []timetable.Source) int {
		if g, ok := groupOf[kind+"\x00"+id]; ok {
			return g
		}
		g := b.newGroup(kind, []string{id}, sentence, src, RelaxAvailability)
		groupOf[kind+"\x00"+id] = g
		return g
	}
	for s := range t.Sections {
		sec := &t.Sections[s]
		for _, id := range uniq(sec.Staff) {
			i := b.staffIdx[id]
			e := &b.unavail.staff[i]
			if e.periods == nil {
				continue
			}
			st := &t.Staff[i]
			g := get(KindStaffAvailability, id, fmt.Sprintf("staff %s cannot teach at the times on their Unavailable rows", staffName(st)), append([]timetable.Source{st.Src}, e.src...))
			forbid(g, KindStaffAvailability, s, e.blocked)
		}
		for _, id := range uniq(sec.Cohorts) {
			i := b.cohortIdx[id]
			e := &b.unavail.cohort[i]
			if e.periods == nil {
				continue
			}
			co := &t.Cohorts[i]
			g := get(KindCohortAvailability, id, fmt.Sprintf("cohort %s cannot attend at the times on its Unavailable rows", cohortName(co)), append([]timetable.Source{co.Src}, e.src...))
			forbid(g, KindCohortAvailability, s, e.blocked)
		}
		if e := &b.unavail.section[s]; e.periods != nil {
			g := get(KindSectionAvail, sec.ID, fmt.Sprintf("section %s cannot meet at the times on its Unavailable rows", sec.ID), append([]timetable.Source{sec.Src}, e.src...))
			forbid(g, KindSectionAvail, s, e.blocked)
		}
	}
}
