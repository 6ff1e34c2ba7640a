package web

import (
	"errors"
	"net/http"

	"github.com/termwright/termwright/encode"
)

// studentJSON is the answer of /api/student: encode.ExplainStudent on
// the version shown (the command line's explain TERM TIMETABLE --student
// ID), with that version's number.
type studentJSON struct {
	Version int `json:"version"`
	*encode.StudentExplanation
}

// handleStudent answers "can this student get every course they asked
// for without a clash on the current timetable, and if not, why not". The
// answer enumerates the student's choices with the timetable fixed (no
// engine search), on a copy of the current version taken under the lock.
func (s *Server) handleStudent(w http.ResponseWriter, r *http.Request) {
	id := r.URL.Query().Get("id")
	if id == "" {
		writeError(w, http.StatusBadRequest, "give the student's ID (id=...); pick a student on the page")
		return
	}
	s.mu.Lock()
	cur, version := cloneSchedule(s.cur), s.version
	s.mu.Unlock()
	ex, err := encode.ExplainStudent(s.opt.Term, cur, id)
	switch {
	case errors.Is(err, encode.ErrNoStudent):
		writeError(w, http.StatusNotFound, err.Error())
		return
	case err != nil:
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	writeJSON(w, http.StatusOK, studentJSON{Version: version, StudentExplanation: ex})
}
