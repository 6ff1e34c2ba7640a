package web

import (
	"fmt"
	"net/http"
	"strconv"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// compareJSON is two versions compared, per person, room and cohort.
type compareJSON struct {
	Old      string         `json:"old"`
	New      string         `json:"new"`
	Moved    int            `json:"moved"`
	Added    int            `json:"added"`
	Dropped  int            `json:"dropped"`
	Same     int            `json:"unchanged"`
	Affected []affectedJSON `json:"affected"`
	// Students are the students' changes of section between the versions
	// (terms with course requests).
	Students []export.SectionChange `json:"students,omitempty"`
}

type affectedJSON struct {
	Kind    string       `json:"kind"` // staff, room, cohort, student
	ID      string       `json:"id"`
	Name    string       `json:"name,omitempty"`
	Changes []changeJSON `json:"changes"`
	// Sections are a student's changes of section.
	Sections []export.SectionChange `json:"sections,omitempty"`
}

type changeJSON struct {
	Section string `json:"section"`
	Title   string `json:"title,omitempty"`
	Change  string `json:"change"` // moved, added, dropped
	From    string `json:"from,omitempty"`
	To      string `json:"to,omitempty"`
}

// versionLocked finds a version by its ID, or the current state for
// "current"; name labels it for people.
func (s *Server) versionLocked(id string) (sched *timetable.Schedule, name string, err error) {
	if id == "current" {
		return s.cur, fmt.Sprintf("current (edit %d, unsaved)", s.version), nil
	}
	n, err := strconv.Atoi(id)
	if err != nil || n < 1 || n > len(s.saved) {
		return nil, "", fmt.Errorf("there is no version %q; give a version number from the list of versions (1 to %d) or \"current\"", id, len(s.saved))
	}
	v := s.saved[n-1]
	return v.sched, v.File, nil
}

func (s *Server) handleCompare(w http.ResponseWriter, r *http.Request) {
	q := r.URL.Query()
	s.mu.Lock()
	defer s.mu.Unlock()
	a, an, err := s.versionLocked(q.Get("old"))
	if err != nil {
		writeError(w, http.StatusBadRequest, "old: "+err.Error())
		return
	}
	b, bn, err := s.versionLocked(q.Get("new"))
	if err != nil {
		writeError(w, http.StatusBadRequest, "new: "+err.Error())
		return
	}
	t := s.opt.Term
	c := timetable.Compare(timetable.MeetingsOf(t, a), timetable.MeetingsOf(t, b))
	out := compareJSON{Old: an, New: bn, Affected: []affectedJSON{},
		Moved: c.Count(timetable.ChangeMoved), Added: c.Count(timetable.ChangeAdded),
		Dropped: c.Count(timetable.ChangeDropped), Same: c.Count(timetable.ChangeUnchanged)}
	cohorts := t.CohortIndex()
	moves := export.SectionChanges(t, a, b)
	out.Students = moves
	for _, af := range export.WithSectionChanges(c.Affected(export.StayingStudents(t, a, b)), moves) {
		aj := affectedJSON{Kind: af.Kind, ID: af.ID, Name: af.Name, Changes: []changeJSON{}}
		if af.Kind == timetable.SubjectStudent {
			for _, mv := range moves {
				if mv.Student == af.ID {
					aj.Sections = append(aj.Sections, mv)
				}
			}
		}
		if i, ok := cohorts[af.ID]; ok && af.Kind == timetable.SubjectCohort {
			aj.Name = t.Cohorts[i].Name
		}
		for _, sc := range af.Changes {
			ch := c.Changes[sc.Change]
			cj := changeJSON{Section: ch.Section, Change: sc.Kind, From: placeText(ch.Old), To: placeText(ch.New)}
			for _, m := range []*timetable.Meeting{ch.New, ch.Old} {
				if m != nil && cj.Title == "" {
					cj.Title = m.Title
				}
			}
			aj.Changes = append(aj.Changes, cj)
		}
		out.Affected = append(out.Affected, aj)
	}
	writeJSON(w, http.StatusOK, out)
}

// placeText is "Tue 10:00–11:00 in R1" ("" for nil).
func placeText(m *timetable.Meeting) string {
	if m == nil {
		return ""
	}
	s := timetable.DayName(m.Day) + " " + m.Start.String()
	if m.End != 0 {
		s += "–" + m.End.String()
	}
	s += " in " + roomName(m.Room)
	if m.Weeks != "" && m.Weeks != "all" {
		s += ", weeks " + m.Weeks
	}
	return s
}
