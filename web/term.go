package web

import (
	"net/http"
	"sort"
	"strconv"
	"time"

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
	// Patterns holds, per section that meets by meeting patterns, its
	// acceptable patterns and rooms: the page's choices for a move.
	Patterns map[string]patternJSON `json:"patterns"`
}

// patternJSON is a pattern section's choices.
type patternJSON struct {
	Times []choiceJSON `json:"times"`
	Rooms []choiceJSON `json:"rooms"` // empty: any room that fits
}

// choiceJSON is one acceptable pattern (Time, 1-based) or room.
type choiceJSON struct {
	Time   int    `json:"time,omitempty"`
	Room   string `json:"room,omitempty"`
	Text   string `json:"text"`
	Weight int    `json:"weight"` // preference penalty; 0 = fully acceptable
}

// timeRow is one row of the week grids; From and To are minutes since
// midnight, for drawing meetings by clock time.
type timeRow struct {
	Start string `json:"start"`
	End   string `json:"end"`
	From  int    `json:"from"`
	To    int    `json:"to"`
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
	out := termJSON{Name: t.Name, Enrolled: map[string][]string{}, Patterns: map[string]patternJSON{}}
	days := map[time.Weekday]bool{}
	seenTime := map[timeRow]bool{}
	var rows []timeRow
	addRow := func(a, b timetable.Clock) {
		r := timeRow{a.String(), b.String(), int(a), int(b)}
		if !seenTime[r] {
			seenTime[r] = true
			rows = append(rows, r)
		}
	}
	for _, p := range t.Periods {
		days[p.Day] = true
		addRow(p.Start, p.End)
		out.Periods = append(out.Periods, periodJSON{Index: p.Index, Day: timetable.DayName(p.Day), Start: p.Start.String(), End: p.End.String(), Label: p.Label()})
	}
	// Meeting patterns outside the grid's rows get hourly rows of their own,
	// so that every pattern meeting has a cell to be drawn in.
	for i := range t.Sections {
		sec := &t.Sections[i]
		if !sec.UsesTimes() {
			continue
		}
		pj := patternJSON{Times: []choiceJSON{}, Rooms: []choiceJSON{}}
		for k, c := range sec.Times {
			pj.Times = append(pj.Times, choiceJSON{Time: k + 1, Text: choiceText(t, c), Weight: c.Weight})
			for _, d := range c.Days.List() {
				days[d] = true
			}
			for h := c.Start / 60 * 60; h < c.End(); h += 60 {
				if !overlapsRow(rows, h, h+60) {
					addRow(h, h+60)
				}
			}
		}
		for _, rc := range sec.RoomChoices {
			pj.Rooms = append(pj.Rooms, choiceJSON{Room: rc.Room, Text: rc.Room, Weight: rc.Weight})
		}
		out.Patterns[sec.ID] = pj
	}
	for i := 0; i < 7; i++ {
		if d := time.Weekday((i + 1) % 7); days[d] {
			out.Days = append(out.Days, timetable.DayName(d))
		}
	}
	sort.Slice(rows, func(i, j int) bool {
		if rows[i].From != rows[j].From {
			return rows[i].From < rows[j].From
		}
		return rows[i].To < rows[j].To
	})
	out.Times = rows
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

// overlapsRow says some row shares a minute with [a, b).
func overlapsRow(rows []timeRow, a, b timetable.Clock) bool {
	for _, r := range rows {
		if r.From < int(b) && int(a) < r.To {
			return true
		}
	}
	return false
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
