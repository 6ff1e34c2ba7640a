package web

import (
	"fmt"
	"net/http"
	"strconv"

	"github.com/termwright/termwright/timetable"
)

func itoa(n int) string { return strconv.Itoa(n) }

// moveRequest moves one meeting to a start period (and room).
type moveRequest struct {
	Version int    `json:"version"` // the version the page showed
	Section string `json:"section"`
	Meeting int    `json:"meeting"`
	Period  int    `json:"period"` // index into the term's periods
	// Room is the new room; nil keeps the meeting's room.
	Room *string `json:"room"`
	// Force applies the move even when it breaks a hard requirement.
	Force bool `json:"force"`
}

// moveResult is the verdict on a move and, when applied, the new state.
type moveResult struct {
	Applied bool          `json:"applied"`
	Legal   bool          `json:"legal"`
	What    string        `json:"what"`    // "BIO-101 meeting 1: Mon 09:00 in R1 → Tue 10:00 in R1"
	Reasons []problemJSON `json:"reasons"` // hard requirements the move breaks
	Cost    []costChange  `json:"cost"`    // criteria whose cost changes
	Levels  []levelChange `json:"levels"`  // cost per level before and after
	State   *stateJSON    `json:"state,omitempty"`
}

type costChange struct {
	Name   string `json:"name"`
	Before int64  `json:"before"`
	After  int64  `json:"after"`
}

type levelChange struct {
	Level  int   `json:"level"`
	Before int64 `json:"before"`
	After  int64 `json:"after"`
}

// versionRequest names the version an edit without other fields is made on.
type versionRequest struct {
	Version int `json:"version"`
}

// staleLocked refuses an edit made on another version than the current
// one, and says so; it reports whether it refused.
// beginEdit reads an edit's body into req, takes the lock and refuses an
// edit naming a stale version (version reads it from req). It reports
// whether the edit may go on, holding the lock; otherwise it has answered
// and holds nothing.
func (s *Server) beginEdit(w http.ResponseWriter, r *http.Request, req any, version func() int) bool {
	if err := readBody(w, r, req); err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return false
	}
	s.mu.Lock()
	if s.staleLocked(w, version()) {
		s.mu.Unlock()
		return false
	}
	return true
}

func (s *Server) staleLocked(w http.ResponseWriter, v int) bool {
	if v == s.version {
		return false
	}
	msg := fmt.Sprintf("this edit was made on version %d, but the timetable is now at version %d (changed in another tab or window); nothing was changed — reload the page to see the current timetable and make the edit again", v, s.version)
	if v <= 0 {
		msg = fmt.Sprintf("the edit names no version; send \"version\": %d, the version the page shows", s.version)
	}
	writeJSON(w, http.StatusConflict, apiError{Error: msg, Version: s.version})
	return true
}

func (s *Server) handleMove(w http.ResponseWriter, r *http.Request) {
	var req moveRequest
	if !s.beginEdit(w, r, &req, func() int { return req.Version }) {
		return
	}
	defer s.mu.Unlock()
	next, at, err := s.movedLocked(req)
	if err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	res := judgeMove(s.opt.Term, s.cur, next)
	res.What = moveText(s.opt.Term, s.cur.Placements[at], next.Placements[at])
	if res.Legal || req.Force {
		s.undo = append(s.undo, s.cur)
		s.cur = next
		s.version++
		res.Applied = true
	}
	st := s.stateLocked()
	res.State = &st
	writeJSON(w, http.StatusOK, res)
}

// movedLocked is the current timetable with the move applied, and the
// index of the moved placement; the error says what is wrong with the
// request.
func (s *Server) movedLocked(req moveRequest) (*timetable.Schedule, int, error) {
	t := s.opt.Term
	k, ok := t.SectionIndex()[req.Section]
	if !ok {
		return nil, 0, fmt.Errorf("there is no section %q in the term; pick a meeting on the page", req.Section)
	}
	at := -1
	for i, p := range s.cur.Placements {
		if p.Section == req.Section && p.Meeting == req.Meeting {
			at = i
			break
		}
	}
	if at < 0 {
		return nil, 0, fmt.Errorf("section %s has no meeting %d in the timetable; pick a meeting on the page", req.Section, req.Meeting)
	}
	if req.Period < 0 || req.Period >= len(t.Periods) {
		return nil, 0, fmt.Errorf("period %d is not in the term's grid (0 to %d); pick a cell of the grid", req.Period, len(t.Periods)-1)
	}
	sec := t.Sections[k]
	if _, ok := t.Span(req.Period, sec.Length); !ok {
		return nil, 0, fmt.Errorf("%s meets for %d consecutive periods, which do not fit from %s (the day ends or has a gap); pick an earlier cell", sec.ID, sec.Length, t.Periods[req.Period].Label())
	}
	next := cloneSchedule(s.cur)
	p := &next.Placements[at]
	p.Period = req.Period
	if req.Room != nil {
		room := *req.Room
		switch {
		case sec.NoRoom && room != "":
			return nil, 0, fmt.Errorf("%s takes no room (online or off-site); leave the room out", sec.ID)
		case !sec.NoRoom:
			if _, ok := t.RoomIndex()[room]; !ok {
				return nil, 0, fmt.Errorf("there is no room %q in the term; pick one of the term's rooms", room)
			}
		}
		p.Room = room
	}
	if *p == s.cur.Placements[at] {
		return nil, 0, fmt.Errorf("%s meeting %d is already at %s in %s; pick another cell or room", sec.ID, req.Meeting, t.Periods[req.Period].Label(), roomName(p.Room))
	}
	return next, at, nil
}

// judgeMove compares the hard requirements and costs of two timetables:
// the move is legal when it breaks no hard requirement that was not
// already broken.
func judgeMove(t *timetable.Term, before, after *timetable.Schedule) moveResult {
	res := moveResult{Reasons: []problemJSON{}, Cost: []costChange{}}
	was := map[problemJSON]bool{}
	for _, v := range timetable.HardViolations(timetable.Check(t, before)) {
		was[problemJSON{v.Rule, v.Msg}] = true
	}
	for _, v := range timetable.HardViolations(timetable.Check(t, after)) {
		if pj := (problemJSON{v.Rule, v.Msg}); !was[pj] {
			res.Reasons = append(res.Reasons, pj)
		}
	}
	res.Legal = len(res.Reasons) == 0
	cb, ca := timetable.Cost(t, before, nil), timetable.Cost(t, after, nil)
	for _, c := range cb.Criteria {
		if a := ca.Criterion(c.Name); a.Cost != c.Cost {
			res.Cost = append(res.Cost, costChange{c.Name, c.Cost, a.Cost})
		}
	}
	for _, l := range ca.Levels() {
		res.Levels = append(res.Levels, levelChange{l, cb.ByLevel[l], ca.ByLevel[l]})
	}
	return res
}

func roomName(r string) string {
	if r == "" {
		return "no room"
	}
	return r
}

// moveText is "BIO-101 meeting 1: Mon 09:00 in R1 → Tue 10:00 in R2".
func moveText(t *timetable.Term, from, to timetable.Placement) string {
	at := func(p timetable.Placement) string {
		return periodLabel(t, p.Period) + " in " + roomName(p.Room)
	}
	return fmt.Sprintf("%s meeting %d: %s → %s", from.Section, from.Meeting, at(from), at(to))
}

func (s *Server) handleUndo(w http.ResponseWriter, r *http.Request) {
	var req versionRequest
	if !s.beginEdit(w, r, &req, func() int { return req.Version }) {
		return
	}
	defer s.mu.Unlock()
	if len(s.undo) == 0 {
		writeError(w, http.StatusBadRequest, "there is nothing to undo: the timetable is as it was loaded or last undone")
		return
	}
	s.cur = s.undo[len(s.undo)-1]
	s.undo = s.undo[:len(s.undo)-1]
	s.version++
	writeJSON(w, http.StatusOK, s.stateLocked())
}

// periodLabel is "Tue 10:00", or "period N" outside the grid.
func periodLabel(t *timetable.Term, i int) string {
	if i < 0 || i >= len(t.Periods) {
		return "period " + itoa(i)
	}
	return t.Periods[i].Label()
}
