package samples

import (
	"slices"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// term turns the generation state into a Term: sections and cohorts sorted
// by ID, rooms by ID (rooms added while building the witness come last),
// staff in ID order, enrolments by student.
func (g *gen) term() *timetable.Term {
	t := &timetable.Term{
		Name:        g.cfg.Name,
		FirstDay:    g.cfg.FirstDay,
		LastDay:     g.lastDay(),
		TimeZone:    "Europe/London",
		Holidays:    g.holidays,
		Periods:     g.periods,
		Unavailable: g.unavailable,
		Relations:   g.relations,
		Weights:     g.weights,
	}
	for _, r := range g.rooms {
		t.Rooms = append(t.Rooms, timetable.Room{ID: r.id, Capacity: r.capacity, Features: r.features,
			Building: g.buildings[r.building].name})
	}
	for _, st := range g.staff {
		t.Staff = append(t.Staff, timetable.Staff{ID: st.id, Name: st.name, Email: st.email,
			MaxPerDay: st.maxPerDay, MaxConsecutive: st.maxConsecutive})
	}
	for _, c := range g.cohorts {
		t.Cohorts = append(t.Cohorts, timetable.Cohort{ID: c.id, Name: c.name, Size: c.size})
	}
	slices.SortFunc(t.Cohorts, func(a, b timetable.Cohort) int { return strings.Compare(a.ID, b.ID) })
	for _, i := range g.sectionOrder() {
		t.Sections = append(t.Sections, g.section(&g.secs[i]))
	}
	n := 0
	for _, st := range g.students {
		n += len(g.cohorts[st.cohort].secs) + 1
	}
	t.Enrolments = make([]timetable.Enrolment, 0, n)
	var ids []string
	for _, st := range g.students {
		ids = ids[:0]
		for _, i := range g.cohorts[st.cohort].secs {
			ids = append(ids, g.secs[i].id)
		}
		if st.extra >= 0 {
			ids = append(ids, g.secs[st.extra].id)
		}
		slices.Sort(ids)
		for _, id := range ids {
			t.Enrolments = append(t.Enrolments, timetable.Enrolment{Student: st.id, Section: id})
		}
	}
	return t
}

// sectionOrder lists section indexes by ID.
func (g *gen) sectionOrder() []int {
	order := make([]int, len(g.secs))
	for i := range order {
		order[i] = i
	}
	slices.SortFunc(order, func(a, b int) int { return strings.Compare(g.secs[a].id, g.secs[b].id) })
	return order
}

func (g *gen) section(s *sec) timetable.Section {
	out := timetable.Section{ID: s.id, Title: s.title, Size: s.size, Meetings: s.meetings, Length: s.length,
		Needs: s.needs, NoRoom: s.noRoom, Fixed: s.fixed, Weeks: s.weeks, SameDay: s.sameDay, MinDays: s.minDays}
	for _, p := range s.staff {
		out.Staff = append(out.Staff, g.staff[p].id)
	}
	for _, c := range s.cohorts {
		out.Cohorts = append(out.Cohorts, g.cohorts[c].id)
	}
	for _, r := range s.allowed {
		out.Rooms = append(out.Rooms, g.rooms[r].id)
	}
	return out
}

// witness is the reference timetable: one placement per meeting, by section
// ID and meeting number (meetings numbered in start order).
func (g *gen) witness() *timetable.Schedule {
	s := &timetable.Schedule{}
	for _, i := range g.sectionOrder() {
		sc := &g.secs[i]
		for k, st := range sc.starts {
			pl := timetable.Placement{Section: sc.id, Meeting: k + 1, Period: st}
			if sc.rooms[k] >= 0 {
				pl.Room = g.rooms[sc.rooms[k]].id
			}
			s.Placements = append(s.Placements, pl)
		}
	}
	return s
}
