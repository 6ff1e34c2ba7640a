package web

import (
	"fmt"
	"maps"
	"net/http"
	"sort"

	"github.com/termwright/termwright/timetable"
)

// meetingKey names one meeting of the timetable: section and meeting number.
type meetingKey struct {
	Section string
	Meeting int
}

// snapshot is one state of the edits: the timetable and its locked
// meetings. Undo restores both.
type snapshot struct {
	sched *timetable.Schedule
	locks map[meetingKey]bool
}

// lockRequest locks or unlocks one meeting.
type lockRequest struct {
	Version int    `json:"version"`
	Section string `json:"section"`
	Meeting int    `json:"meeting"`
	Locked  bool   `json:"locked"`
}

// commitLocked makes next (with locks) the current state: the old one
// goes on the undo stack and the version goes up.
func (s *Server) commitLocked(next *timetable.Schedule, locks map[meetingKey]bool) {
	s.undo = append(s.undo, snapshot{s.cur, s.locks})
	s.cur, s.locks = next, locks
	s.version++
}

// placementLocked finds a meeting of the current timetable; the error
// says what to pick instead.
func (s *Server) placementLocked(section string, meeting int) (int, error) {
	if _, ok := s.opt.Term.SectionIndex()[section]; !ok {
		return -1, fmt.Errorf("there is no section %q in the term; pick a meeting on the page", section)
	}
	for i, p := range s.cur.Placements {
		if p.Section == section && p.Meeting == meeting {
			return i, nil
		}
	}
	return -1, fmt.Errorf("section %s has no meeting %d in the timetable; pick a meeting on the page", section, meeting)
}

// handleLock locks or unlocks a meeting: a versioned edit that undo
// takes back like a move. Re-planning keeps locked meetings where they
// are, and moves refuse them.
func (s *Server) handleLock(w http.ResponseWriter, r *http.Request) {
	var req lockRequest
	if !s.beginEdit(w, r, &req, func() int { return req.Version }) {
		return
	}
	defer s.mu.Unlock()
	if _, err := s.placementLocked(req.Section, req.Meeting); err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	k := meetingKey{req.Section, req.Meeting}
	if s.locks[k] == req.Locked {
		state := map[bool]string{true: "locked", false: "not locked"}[req.Locked]
		writeError(w, http.StatusBadRequest, fmt.Sprintf("%s meeting %d is already %s; reload the page if it shows otherwise", req.Section, req.Meeting, state))
		return
	}
	locks := maps.Clone(s.locks)
	if locks == nil {
		locks = map[meetingKey]bool{}
	}
	if req.Locked {
		locks[k] = true
	} else {
		delete(locks, k)
	}
	s.commitLocked(s.cur, locks)
	writeJSON(w, http.StatusOK, s.stateLocked())
}

// lockedList is the locked meetings in section and meeting order.
func lockedList(locks map[meetingKey]bool) []meetingKey {
	out := make([]meetingKey, 0, len(locks))
	for k := range locks {
		out = append(out, k)
	}
	sort.Slice(out, func(i, j int) bool {
		if out[i].Section != out[j].Section {
			return out[i].Section < out[j].Section
		}
		return out[i].Meeting < out[j].Meeting
	})
	return out
}
