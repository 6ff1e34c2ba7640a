package encode

import (
	"fmt"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// peopleSections lists, per staff member and per cohort (indexes into
// Term.Staff and Term.Cohorts), the sections they teach or attend, each
// once, in section order. It is built once per compilation; callers must
// not change the lists.
func (b *builder) peopleSections() (staff, cohorts [][]int) {
	if b.staffSecs == nil {
		t := b.t
		b.staffSecs = make([][]int, len(t.Staff))
		b.cohortSecs = make([][]int, len(t.Cohorts))
		for s, sec := range t.Sections {
			for _, id := range uniq(sec.Staff) {
				i := b.staffIdx[id]
				b.staffSecs[i] = append(b.staffSecs[i], s)
			}
			for _, id := range uniq(sec.Cohorts) {
				i := b.cohortIdx[id]
				b.cohortSecs[i] = append(b.cohortSecs[i], s)
			}
		}
	}
	return b.staffSecs, b.cohortSecs
}

// compileNoOverlap: no staff member or cohort is in two meetings that
// occupy a common period in overlapping weeks: for each of them, each
// period and each week scope, at most one of the start atoms covering the
// period (one bound over start literals; never pairwise clauses).
func (b *builder) compileNoOverlap() {
	t := b.t
	staffSecs, cohortSecs := b.peopleSections()
	for i, secs := range staffSecs {
		if len(secs) < 2 {
			continue
		}
		st := &t.Staff[i]
		g := b.newGroup(KindStaffNoOverlap, []string{st.ID},
			fmt.Sprintf("staff %s teaches at most one meeting at a time (sections %s)", staffName(st), sectionList(t, secs)),
			[]timetable.Source{st.Src}, RelaxNoOverlap)
		b.noOverlap(secs, g, KindStaffNoOverlap)
	}
	for i, secs := range cohortSecs {
		if len(secs) < 2 {
			continue
		}
		co := &t.Cohorts[i]
		g := b.newGroup(KindCohortNoOverlap, []string{co.ID},
			fmt.Sprintf("cohort %s attends at most one meeting at a time (sections %s)", cohortName(co), sectionList(t, secs)),
			[]timetable.Source{co.Src}, RelaxNoOverlap)
		b.noOverlap(secs, g, KindCohortNoOverlap)
	}
}

// noOverlap states, under group g's selector: at each period and in each
// week scope, at most one meeting of the given sections. Bounds over fewer
// than two sections are left out (a section's own meetings are kept apart
// by its own constraints).
func (b *builder) noOverlap(secs []int, g int, kind string) {
	weeks := make([]timetable.WeekSet, len(secs))
	for i, s := range secs {
		weeks[i] = b.c.secs[s].weeks
	}
	b.in(g, kind)
	sel := b.sel(g)
	var lits []solver.Lit
	for _, scope := range weekScopes(weeks) {
		for p := range b.t.Periods {
			lits = lits[:0]
			n := 0
			for _, i := range scope {
				before := len(lits)
				lits = b.coveringStarts(lits, secs[i], p)
				if len(lits) > before {
					n++
				}
			}
			if n >= 2 {
				b.bound(lits, solver.NoBound, 1, sel)
			}
		}
	}
}

// compileSectionDays: meetings of a section fall on different days unless
// it may share days (at most one start per day), and a section's own
// meetings never overlap.
func (b *builder) compileSectionDays() {
	t := b.t
	var lits []solver.Lit
	for s := range t.Sections {
		sec := &t.Sections[s]
		m := &b.c.secs[s]
		if sec.Meetings < 2 {
			continue
		}
		if !sec.SameDay {
			g := -1
			for _, day := range b.days {
				lits = lits[:0]
				for _, p := range day {
					if m.start[p] != 0 {
						lits = append(lits, solver.Pos(m.start[p]))
					}
				}
				if len(lits) < 2 {
					continue
				}
				if g < 0 {
					g = b.newGroup(KindSectionDays, []string{sec.ID},
						fmt.Sprintf("the %d meetings of section %s fall on different days", sec.Meetings, sec.ID),
						[]timetable.Source{sec.Src}, RelaxSectionDays)
					b.in(g, KindSectionDays)
				}
				b.bound(lits, solver.NoBound, 1, b.sel(g))
			}
			if !b.opt.Explain {
				continue // different days already keep the meetings apart
			}
		}
		if sec.Length < 2 {
			continue
		}
		b.in(-1, "own overlap")
		for p := range t.Periods {
			lits = b.coveringStarts(lits[:0], s, p)
			if len(lits) >= 2 {
				b.bound(lits, solver.NoBound, 1)
			}
		}
	}
}

func uniq(ids []string) []string {
	if len(ids) < 2 {
		return ids
	}
	seen := map[string]bool{}
	out := make([]string, 0, len(ids))
	for _, id := range ids {
		if !seen[id] {
			seen[id] = true
			out = append(out, id)
		}
	}
	return out
}

func staffName(st *timetable.Staff) string {
	if st.Name != "" && st.Name != st.ID {
		return st.Name + " (" + st.ID + ")"
	}
	return st.ID
}

func cohortName(co *timetable.Cohort) string {
	if co.Name != "" && co.Name != co.ID {
		return co.Name + " (" + co.ID + ")"
	}
	return co.ID
}

// sectionList names up to six sections.
func sectionList(t *timetable.Term, secs []int) string {
	out := ""
	for i, s := range secs {
		if i == 6 && len(secs) > 7 {
			return out + fmt.Sprintf(" and %d more", len(secs)-6)
		}
		if i > 0 {
			out += ", "
		}
		out += t.Sections[s].ID
	}
	return out
}
