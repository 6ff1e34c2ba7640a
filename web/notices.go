package web

import (
	"bytes"
	"fmt"
	"mime"
	"net/http"
	"net/url"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/timetable"
)

// noticesJSON is the change notices between two versions: per affected
// staff member, cohort and student (rooms get none) the text of
// export.Notices.Text and the address of their calendar (Calendar).
type noticesJSON struct {
	Old     string       `json:"old"`
	New     string       `json:"new"`
	Notices []noticeJSON `json:"notices"`
}

type noticeJSON struct {
	Kind     string `json:"kind"` // staff, cohort, student
	ID       string `json:"id"`
	Name     string `json:"name,omitempty"`
	Changes  int    `json:"changes"`
	Text     string `json:"text"`     // ready to paste into an e-mail
	File     string `json:"file"`     // the calendar's file name, as the text names it
	Calendar string `json:"calendar"` // address of the calendar file
}

// noticeSet is one comparison prepared for notices.
type noticeSet struct {
	notices  *export.Notices
	cmp      *timetable.Comparison
	affected []timetable.Affected
	files    map[string]string // kind + "/" + ID -> calendar file name
	moves    map[string]int    // student -> changes of section
	oldName  string
	newName  string
}

// noticesLocked prepares the notices from version old to new ("current"
// or a saved version's number). It refuses a new version that breaks a
// hard requirement, as termwright notify does: no one should be told of
// a timetable that cannot be kept.
func (s *Server) noticesLocked(old, new string) (*noticeSet, int, error) {
	a, an, err := s.versionLocked(old)
	if err != nil {
		return nil, http.StatusBadRequest, fmt.Errorf("old: %w", err)
	}
	b, bn, err := s.versionLocked(new)
	if err != nil {
		return nil, http.StatusBadRequest, fmt.Errorf("new: %w", err)
	}
	t := s.opt.Term
	if hard := timetable.HardViolations(timetable.Check(t, b)); len(hard) > 0 {
		return nil, http.StatusConflict, fmt.Errorf("%s breaks %s (first: %s: %s), so no notices are made; fix the timetable first", bn, plural(len(hard), "hard requirement"), hard[0].Rule, hard[0].Msg)
	}
	c := timetable.Compare(timetable.MeetingsOf(t, a), timetable.MeetingsOf(t, b))
	n, err := export.NewNotices(t, b, c)
	if err != nil {
		return nil, http.StatusBadRequest, fmt.Errorf("cannot make change notices: %w", err)
	}
	set := &noticeSet{notices: n, cmp: c, files: map[string]string{}, oldName: an, newName: bn}
	ids := map[string][]string{}
	moves := export.SectionChanges(t, a, b)
	n.SetSectionChanges(moves)
	set.moves = map[string]int{}
	for _, mv := range moves {
		set.moves[mv.Student]++
	}
	for _, af := range export.WithSectionChanges(c.Affected(export.StayingStudents(t, a, b)), moves) {
		if _, ok := export.NoticeSubject(af); ok {
			set.affected = append(set.affected, af)
			ids[af.Kind] = append(ids[af.Kind], af.ID)
		}
	}
	for kind, list := range ids {
		for i, name := range export.SafeFileNames(list) {
			set.files[kind+"/"+list[i]] = name + ".ics"
		}
	}
	return set, http.StatusOK, nil
}

func (s *Server) handleNotices(w http.ResponseWriter, r *http.Request) {
	q := r.URL.Query()
	s.mu.Lock()
	defer s.mu.Unlock()
	set, code, err := s.noticesLocked(q.Get("old"), q.Get("new"))
	if err != nil {
		writeError(w, code, err.Error())
		return
	}
	out := noticesJSON{Old: set.oldName, New: set.newName, Notices: []noticeJSON{}}
	t := s.opt.Term
	for _, af := range set.affected {
		file := set.files[af.Kind+"/"+af.ID]
		var buf bytes.Buffer
		if err := set.notices.Text(&buf, af, file); err != nil {
			writeError(w, http.StatusInternalServerError, err.Error())
			return
		}
		changes := len(af.Changes)
		if af.Kind == timetable.SubjectStudent {
			changes += set.moves[af.ID]
		}
		nj := noticeJSON{Kind: af.Kind, ID: af.ID, Name: af.Name, Changes: changes, Text: buf.String(), File: file,
			Calendar: "/api/notices/calendar?" + calendarQuery(q.Get("old"), q.Get("new"), af.Kind, af.ID)}
		if i, ok := t.CohortIndex()[af.ID]; ok && af.Kind == timetable.SubjectCohort {
			nj.Name = t.Cohorts[i].Name
		}
		out.Notices = append(out.Notices, nj)
	}
	writeJSON(w, http.StatusOK, out)
}

func calendarQuery(old, new, kind, id string) string {
	return url.Values{"old": {old}, "new": {new}, "kind": {kind}, "id": {id}}.Encode()
}

// handleNoticeCalendar sends one affected person's or cohort's updated
// calendar (export.Notices.Calendar) as a file to save.
func (s *Server) handleNoticeCalendar(w http.ResponseWriter, r *http.Request) {
	q := r.URL.Query()
	s.mu.Lock()
	defer s.mu.Unlock()
	set, code, err := s.noticesLocked(q.Get("old"), q.Get("new"))
	if err != nil {
		writeError(w, code, err.Error())
		return
	}
	kind, id := q.Get("kind"), q.Get("id")
	for _, af := range set.affected {
		if af.Kind != kind || af.ID != id {
			continue
		}
		who, _ := export.NoticeSubject(af)
		var cancelled []timetable.Meeting
		for _, sc := range af.Changes {
			if ch := set.cmp.Changes[sc.Change]; sc.Kind == timetable.ChangeDropped && ch.Old != nil {
				cancelled = append(cancelled, *ch.Old)
			}
		}
		var buf bytes.Buffer
		if err := set.notices.Calendar(&buf, who, cancelled, export.Options{Generated: s.opt.Now()}); err != nil {
			writeError(w, http.StatusInternalServerError, err.Error())
			return
		}
		w.Header().Set("Content-Type", "text/calendar; charset=utf-8")
		w.Header().Set("Content-Disposition", mime.FormatMediaType("attachment", map[string]string{"filename": set.files[kind+"/"+id]}))
		w.WriteHeader(http.StatusOK)
		_, _ = w.Write(buf.Bytes())
		return
	}
	writeError(w, http.StatusNotFound, fmt.Sprintf("%s %q is not affected by the change from %s to %s, so there is no notice for them; pick one from the list of notices", kind, id, set.oldName, set.newName))
}

// plural is "1 hard requirement", "2 hard requirements".
func plural(n int, what string) string {
	if n == 1 {
		return "1 " + what
	}
	return itoa(n) + " " + what + "s"
}
