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
	Period  int    `json:"period"` // index into the term's periods (grid sections)
	// Time is the 1-based meeting pattern of a pattern section (Section.Times);
	// Period is not read for those.
	Time int `json:"time"`
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

// staleLocked refuses an edit made on another version than the current
// one, and says so; it reports whether it refused.
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
		s.commitLocked(next, s.locks)
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
	at, err := s.placementLocked(req.Section, req.Meeting)
	if err != nil {
		return nil, 0, err
	}
	if s.locks[meetingKey{req.Section, req.Meeting}] {
		return nil, 0, fmt.Errorf("%s meeting %d is locked; unlock it first to move it", req.Section, req.Meeting)
	}
	sec := t.Sections[t.SectionIndex()[req.Section]]
	next := cloneSchedule(s.cur)
	p := &next.Placements[at]
	if sec.UsesTimes() {
		if req.Time < 1 || req.Time > len(sec.Times) {
			return nil, 0, fmt.Errorf("%s meets by one of its %d meeting patterns; pick one of them (time 1 to %d), not %d", sec.ID, len(sec.Times), len(sec.Times), req.Time)
		}
		p.Period, p.Time = -1, req.Time
	} else {
		if req.Period < 0 || req.Period >= len(t.Periods) {
			return nil, 0, fmt.Errorf("period %d is not in the term's grid (0 to %d); pick a cell of the grid", req.Period, len(t.Periods)-1)
		}
		if _, ok := t.Span(req.Period, sec.Length); !ok {
			return nil, 0, fmt.Errorf("%s meets for %d consecutive periods, which do not fit from %s (the day ends or has a gap); pick an earlier cell", sec.ID, sec.Length, t.Periods[req.Period].Label())
		}
		p.Period = req.Period
	}
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
		return nil, 0, fmt.Errorf("%s meeting %d is already at %s in %s; pick another time or room", sec.ID, req.Meeting, placementWhen(t, *p), roomName(p.Room))
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
		return placementWhen(t, p) + " in " + roomName(p.Room)
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
	last := s.undo[len(s.undo)-1]
	s.cur, s.locks = last.sched, last.locks
	s.undo = s.undo[:len(s.undo)-1]
	s.version++
	writeJSON(w, http.StatusOK, s.stateLocked())
}

// placementWhen is "Tue 10:00" for a grid meeting and "Mon Wed 09:00–10:15"
// (with weeks when not every week) for a meeting pattern.
func placementWhen(t *timetable.Term, p timetable.Placement) string {
	if p.Time == 0 {
		return periodLabel(t, p.Period)
	}
	if k, ok := t.SectionIndex()[p.Section]; ok && p.Time >= 1 && p.Time <= len(t.Sections[k].Times) {
		return choiceText(t, t.Sections[k].Times[p.Time-1])
	}
	return "meeting pattern " + itoa(p.Time)
}

// choiceText is "Mon Wed 09:00–10:15" with ", weeks 1-6" when the pattern
// does not meet every week.
func choiceText(t *timetable.Term, c timetable.TimeChoice) string {
	s := c.Days.String() + " " + c.Start.String() + "–" + c.End().String()
	if c.Weeks != t.AllWeeks() {
		s += ", weeks " + weeksText(c.Weeks)
	}
	return s
}

// periodLabel is "Tue 10:00", or "period N" outside the grid.
func periodLabel(t *timetable.Term, i int) string {
	if i < 0 || i >= len(t.Periods) {
		return "period " + itoa(i)
	}
	return t.Periods[i].Label()
}
