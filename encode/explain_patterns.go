package encode

import (
	"fmt"
	"slices"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Explain mode on pattern sections. Normally compilePatternChoices prunes a
// section's meeting patterns and rooms by hard unavailability and room
// fit; in Explain mode it keeps them all, and this part states each of
// those requirements as integrity constraints under the same groups the
// grid uses (one group per staff member's, cohort's, section's and room's
// availability, one room-fit group per section), so that switching a
// selector off really drops the requirement. The section's "scheduled"
// group (KindSection) is the body of its time and room choices
// (patSectionBody), made where the choices are compiled.

func init() {
	// Right after the grid's availability part, so that a term mixing both
	// kinds of section shares one group per staff member, cohort and room.
	at := slices.IndexFunc(parts, func(p part) bool { return p.name == "availability" })
	parts = slices.Insert(parts, at+1, part{"pattern availability", (*builder).compilePatternAvailability, false})
}

// patSectionBody is the body of pattern section s's time and room choices:
// in Explain mode the selector of its "section is scheduled" group (with
// the selector false the section takes no time and no room and so takes
// part in no constraint), nothing otherwise.
func (b *builder) patSectionBody(s int) []solver.Lit {
	if !b.opt.Explain {
		return nil
	}
	sec := &b.t.Sections[s]
	g := b.newGroup(KindSection, []string{sec.ID}, sectionSentence(b.t, s), []timetable.Source{sec.Src}, 0)
	return []solver.Lit{b.sel(g)}
}

// patternRoomFits reports whether room may hold pattern section sec:
// enough seats (unless capacity is soft) and every needed feature.
func patternRoomFits(t *timetable.Term, sec *timetable.Section, room *timetable.Room) bool {
	return (t.SoftCapacity || room.Capacity >= sec.Size) && room.HasFeatures(sec.Needs)
}

// compilePatternAvailability states, in Explain mode, the requirements that
// normal compilation uses to prune pattern candidates: a pattern meeting
// during a hard Unavailable row of the section, its staff or cohorts (days,
// minutes and teaching weeks exact, as rowHits) is forbidden under that
// entity's availability group; a room without the seats or features is
// forbidden under the section's room-fit group; a (pattern, room) pair
// meeting the room's unavailability under the room's availability group.
func (b *builder) compilePatternAvailability() {
	if !b.opt.Explain || !b.pat.any {
		return
	}
	t := b.t
	for s := range t.Sections {
		pm := &b.c.pats[s]
		if !pm.on {
			continue
		}
		sec := &t.Sections[s]
		for _, i := range pm.times {
			tc := &sec.Times[i]
			var groups []int
			if rowsHit(b.pat.section[s], tc) {
				groups = append(groups, b.patAvailGroup(KindSectionAvail, sec.ID,
					fmt.Sprintf("section %s cannot meet at the times on its Unavailable rows", sec.ID), sec.Src, b.pat.section[s]))
			}
			for _, id := range uniq(sec.Staff) {
				rows := b.pat.staff[b.staffIdx[id]]
				if rowsHit(rows, tc) {
					st := &t.Staff[b.staffIdx[id]]
					groups = append(groups, b.patAvailGroup(KindStaffAvailability, id,
						fmt.Sprintf("staff %s cannot teach at the times on their Unavailable rows", staffName(st)), st.Src, rows))
				}
			}
			for _, id := range uniq(sec.Cohorts) {
				rows := b.pat.cohort[b.cohortIdx[id]]
				if rowsHit(rows, tc) {
					co := &t.Cohorts[b.cohortIdx[id]]
					groups = append(groups, b.patAvailGroup(KindCohortAvailability, id,
						fmt.Sprintf("cohort %s cannot attend at the times on its Unavailable rows", cohortName(co)), co.Src, rows))
				}
			}
			for _, g := range groups {
				b.in(g, b.c.Groups[g].Kind)
				b.rule(0, solver.Pos(pm.time[i]), b.sel(g))
			}
		}
		for k, r := range pm.rooms {
			room := &t.Rooms[r]
			in := solver.Pos(pm.room[k])
			if !patternRoomFits(t, sec, room) {
				g, ok := b.c.rooms.fitGroup[s]
				if !ok {
					g = b.newGroup(KindRoomFit, []string{sec.ID}, patternFitSentence(t, sec), []timetable.Source{sec.Src}, RelaxRooms)
					b.c.rooms.fitGroup[s] = g
				}
				b.in(g, KindRoomFit)
				b.rule(0, in, b.sel(g))
			}
			for _, i := range pm.times {
				if !b.pat.roomBlocked(r, &sec.Times[i]) {
					continue
				}
				g := b.patAvailGroup(KindRoomAvailability, room.ID,
					fmt.Sprintf("room %s is not available at the times on its Unavailable rows", room.ID), room.Src, b.pat.room[r])
				b.in(g, KindRoomAvailability)
				b.rule(0, solver.Pos(pm.time[i]), in, b.sel(g))
			}
		}
	}
	b.in(-1, "pattern availability")
}

// patAvailGroup is the availability group of one staff member, cohort,
// section or room (the grid's, when it made one first), with every hard
// Unavailable row of it among its rows.
func (b *builder) patAvailGroup(kind, id, sentence string, src timetable.Source, rows []timetable.Unavailability) int {
	g := b.newGroup(kind, []string{id}, sentence, []timetable.Source{src}, RelaxAvailability)
	gr := &b.c.Groups[g]
	for _, row := range rows {
		if row.Src.Sheet != "" && !slices.Contains(gr.Src, row.Src) {
			gr.Src = append(gr.Src, row.Src)
		}
	}
	return g
}

// patternFitSentence says what rooms pattern section sec needs.
func patternFitSentence(t *timetable.Term, sec *timetable.Section) string {
	var want []string
	if !t.SoftCapacity {
		want = append(want, fmt.Sprintf("%d seats", sec.Size))
	}
	if len(sec.Needs) > 0 {
		want = append(want, "features "+strings.Join(sec.Needs, ", "))
	}
	if len(want) == 0 {
		want = append(want, "what it needs")
	}
	return fmt.Sprintf("section %s needs a room with %s", sec.ID, strings.Join(want, " and "))
}
