package web

import (
	"net/http"
	"sort"
	"strconv"

	"github.com/termwright/termwright/timetable"
)

// termJSON is what the page needs of the term, sent once.
type termJSON struct {
	Name     string              `json:"name"`
	Days     []string            `json:"days"`  // day names in grid order
	Times    []timeRow           `json:"times"` // grid rows: distinct start and end times
	Periods  []periodJSON        `json:"periods"`
	Staff    []subjectJSON       `json:"staff"`
	Rooms    []subjectJSON       `json:"rooms"`
	Cohorts  []subjectJSON       `json:"cohorts"`
	Students []subjectJSON       `json:"students"`
	Enrolled map[string][]string `json:"enrolled"` // student ID -> section IDs
}

type timeRow struct {
	Start string `json:"start"`
	End   string `json:"end"`
}

type periodJSON struct {
	Index int    `json:"index"`
	Day   string `json:"day"`
	Start string `json:"start"`
	End   string `json:"end"`
	Label string `json:"label"`
}

// subjectJSON is someone or something with a week grid.
type subjectJSON struct {
	ID     string `json:"id"`
	Name   string `json:"name,omitempty"`
	Detail string `json:"detail,omitempty"`
}

func (s *Server) handleTerm(w http.ResponseWriter, r *http.Request) {
	writeJSON(w, http.StatusOK, buildTerm(s.opt.Term))
}

func buildTerm(t *timetable.Term) termJSON {
	out := termJSON{Name: t.Name, Enrolled: map[string][]string{}}
	seenDay := map[string]bool{}
	seenTime := map[timeRow]bool{}
	type tk struct{ s, e timetable.Clock }
	var times []tk
	for _, p := range t.Periods {
		d := timetable.DayName(p.Day)
		if !seenDay[d] {
			seenDay[d] = true
			out.Days = append(out.Days, d)
		}
		row := timeRow{p.Start.String(), p.End.String()}
		if !seenTime[row] {
			seenTime[row] = true
			times = append(times, tk{p.Start, p.End})
		}
		out.Periods = append(out.Periods, periodJSON{Index: p.Index, Day: d, Start: row.Start, End: row.End, Label: p.Label()})
	}
	sort.Slice(times, func(i, j int) bool {
		if times[i].s != times[j].s {
			return times[i].s < times[j].s
		}
		return times[i].e < times[j].e
	})
	for _, x := range times {
		out.Times = append(out.Times, timeRow{x.s.String(), x.e.String()})
	}
	for _, st := range t.Staff {
		out.Staff = append(out.Staff, subjectJSON{ID: st.ID, Name: st.Name})
	}
	for _, rm := range t.Rooms {
		out.Rooms = append(out.Rooms, subjectJSON{ID: rm.ID, Detail: roomDetail(rm)})
	}
	for _, c := range t.Cohorts {
		out.Cohorts = append(out.Cohorts, subjectJSON{ID: c.ID, Name: c.Name})
	}
	for _, en := range t.Enrolments {
		if _, ok := out.Enrolled[en.Student]; !ok {
			out.Students = append(out.Students, subjectJSON{ID: en.Student})
		}
		out.Enrolled[en.Student] = append(out.Enrolled[en.Student], en.Section)
	}
	sort.Slice(out.Students, func(i, j int) bool { return out.Students[i].ID < out.Students[j].ID })
	return out
}

func roomDetail(r timetable.Room) string {
	d := strconv.Itoa(r.Capacity) + " seats"
	if r.Building != "" {
		d += ", " + r.Building
	}
	for _, f := range r.Features {
		d += ", " + f
	}
	return d
}
