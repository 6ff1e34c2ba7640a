package web

import (
	"context"
	"fmt"
	"net/http"
	"slices"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// Re-plan time limits: the page's default, and the most it may ask.
const (
	replanDefault = 20 * time.Second
	replanMax     = 10 * time.Minute
)

// replanRequest asks for a minimal-change re-plan of the current version
// with its locked meetings held where they are (and, with Place, one
// meeting fixed at another start as well: "lock it there and re-plan").
type replanRequest struct {
	Version int        `json:"version"`
	Seconds int        `json:"seconds"` // time limit; 0 means 20
	Place   *placeSpec `json:"place"`
}

// placeSpec is one meeting to fix at a start period for a re-plan; it is
// locked there when the result is kept.
type placeSpec struct {
	Section string `json:"section"`
	Meeting int    `json:"meeting"`
	Period  int    `json:"period"`
}

// replanJSON is the answer of a finished re-plan.
type replanJSON struct {
	// Status is "found" (a new timetable to keep or discard), "none" (no
	// timetable holds the locks: a proof) or "unknown" (none found in time).
	Status  string       `json:"status"`
	Stopped string       `json:"stopped,omitempty"` // why the search ended
	Proven  bool         `json:"proven,omitempty"`  // no timetable with these locks is cheaper
	Locked  int          `json:"locked"`            // meetings held
	Moves   []replanMove `json:"moves"`             // meetings that move
	// Students are the students who change section (terms with course
	// requests only).
	Students []export.SectionChange `json:"students,omitempty"`
	Cost     []costChange           `json:"cost"`
	Levels   []levelChange          `json:"levels"`
	Checked  string                 `json:"checked,omitempty"` // the gates it passed
	Hard     []problemJSON          `json:"hard,omitempty"`    // never set for "found": a broken timetable is an internal error
	Notes    []string               `json:"notes,omitempty"`
}

// replanMove is one meeting the re-plan moves.
type replanMove struct {
	Section string `json:"section"`
	Change  string `json:"change"` // moved, new, dropped
	From    string `json:"from,omitempty"`
	To      string `json:"to,omitempty"`
}

func (s *Server) handleReplan(w http.ResponseWriter, r *http.Request) {
	var req replanRequest
	if !s.beginEdit(w, r, &req, func() int { return req.Version }) {
		return
	}
	defer s.mu.Unlock()
	t := s.opt.Term
	if req.Place != nil {
		if k, ok := t.SectionIndex()[req.Place.Section]; ok && t.Sections[k].UsesTimes() {
			writeError(w, http.StatusBadRequest, fmt.Sprintf("%s meets by meeting times, so it cannot be asked for at a grid cell; move it to the meeting time you want, lock it there and re-plan", req.Place.Section))
			return
		}
	}
	limit := replanDefault
	switch {
	case req.Seconds < 0 || time.Duration(req.Seconds)*time.Second > replanMax:
		writeError(w, http.StatusBadRequest, fmt.Sprintf("seconds %d is out of range; give 1 to %d seconds (0 means %d)", req.Seconds, int(replanMax.Seconds()), int(replanDefault.Seconds())))
		return
	case req.Seconds > 0:
		limit = time.Duration(req.Seconds) * time.Second
	}
	kept := cloneSchedule(s.cur)
	locks := s.locks
	work, err := lockedTerm(t, kept, locks, req.Place)
	if err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	pin := pinPatterns(work, kept, locks)
	j, err := s.startJobLocked("replan", limit, func(ctx context.Context, j *job) {
		j.setProgress(jobProgress{Phase: "looking for a first timetable with the locks"})
		planned, err := planning.Plan(ctx, work, planning.Options{OptimizeOptions: encode.OptimizeOptions{Seed: 1, Keep: pin.toWork(kept), Progress: func(p encode.Progress) {
			j.setProgress(jobProgress{Phase: p.Phase, Cost: slices.Clone(p.Cost), Found: p.Found, Steps: p.Steps})
		}}})
		if err != nil {
			j.finish(nil, nil, err)
			return
		}
		res := planned.OptimizeResult
		if res.Schedule != nil {
			res.Schedule = pin.fromWork(res.Schedule)
		}
		out, keep, err := replanAnswer(t, kept, locks, req.Place, res)
		j.finish(out, keep, err)
	})
	if err != nil {
		writeError(w, http.StatusServiceUnavailable, err.Error())
		return
	}
	writeJSON(w, http.StatusAccepted, j.json())
}

// lockedTerm is t with every locked meeting of sched (and place) added to
// its section's fixed meetings, so that the search keeps them where they
// are. t itself is not changed.
func lockedTerm(t *timetable.Term, sched *timetable.Schedule, locks map[meetingKey]bool, place *placeSpec) (*timetable.Term, error) {
	work := *t
	work.Sections = slices.Clone(t.Sections)
	idx := t.SectionIndex()
	fix := func(sec string, period int, room string, what string) error {
		k, ok := idx[sec]
		if !ok {
			return fmt.Errorf("there is no section %q in the term; pick a meeting on the page", sec)
		}
		if period < 0 || period >= len(t.Periods) {
			return fmt.Errorf("period %d is not in the term's grid (0 to %d); pick a cell of the grid", period, len(t.Periods)-1)
		}
		sc := &work.Sections[k]
		p := t.Periods[period]
		for _, f := range sc.Fixed {
			if f.Day == p.Day && f.Start == p.Start && (f.Room == room || f.Room == "") {
				return nil // the workbook fixes it there already
			}
		}
		if len(sc.Fixed) >= sc.Meetings {
			return fmt.Errorf("%s has all %d of its meetings fixed already, so %s cannot be held at %s too; unlock one of its meetings", sc.ID, sc.Meetings, what, p.Label())
		}
		sc.Fixed = append(slices.Clone(sc.Fixed), timetable.Fixed{Day: p.Day, Start: p.Start, Room: room, Text: p.Label() + " " + room + " (" + what + ")"})
		return nil
	}
	for _, k := range lockedList(locks) {
		if si, ok := idx[k.Section]; ok && t.Sections[si].UsesTimes() {
			continue // pinned by pinPatterns: a pattern section has no fixed meetings
		}
		for _, pl := range sched.Placements {
			if pl.Section == k.Section && pl.Meeting == k.Meeting {
				if err := fix(pl.Section, pl.Period, pl.Room, "locked on the page"); err != nil {
					return nil, err
				}
			}
		}
	}
	if place != nil {
		if locks[meetingKey{place.Section, place.Meeting}] {
			return nil, fmt.Errorf("%s meeting %d is locked; unlock it first to move it", place.Section, place.Meeting)
		}
		found := false
		for _, pl := range sched.Placements {
			found = found || (pl.Section == place.Section && pl.Meeting == place.Meeting)
		}
		if !found {
			return nil, fmt.Errorf("section %s has no meeting %d in the timetable; pick a meeting on the page", place.Section, place.Meeting)
		}
		if err := fix(place.Section, place.Period, "", "asked for on the page"); err != nil {
			return nil, err
		}
	}
	return &work, nil
}

// replanAnswer checks a re-plan's timetable and says what it changes. A
// timetable must pass timetable.Check on the real term (Optimize has
// passed it through solver.Verify and timetable.Check on the term with the
// locks) and hold every locked meeting where it was; the locks are carried
// over to the new timetable's meeting numbers.
func replanAnswer(t *timetable.Term, kept *timetable.Schedule, locks map[meetingKey]bool, place *placeSpec, res *encode.OptimizeResult) (*replanJSON, *snapshot, error) {
	out := &replanJSON{Stopped: res.Stopped, Locked: len(locks), Moves: []replanMove{}, Cost: []costChange{}}
	switch res.Status {
	case solver.Unsatisfiable:
		out.Status = "none"
		out.Notes = append(out.Notes, "No timetable of the term keeps every locked meeting where it is: unlock some and re-plan, or ask why not for one of them.")
		return out, nil, nil
	case solver.Satisfiable:
	default:
		out.Status = "unknown"
		out.Notes = append(out.Notes, "No timetable was found before the search stopped; allow it more time.")
		return out, nil, nil
	}
	next := res.Schedule
	if hard := timetable.HardViolations(timetable.Check(t, next)); len(hard) > 0 {
		return nil, nil, fmt.Errorf("internal error: the re-planned timetable breaks %d hard requirements (%s: %s); it was not offered", len(hard), hard[0].Rule, hard[0].Msg)
	}
	newLocks := map[meetingKey]bool{}
	used := map[int]bool{}
	holds := func(sec string, at func(timetable.Placement) bool) (int, bool) {
		for i, q := range next.Placements {
			if q.Section == sec && !used[i] && at(q) {
				used[i] = true
				return q.Meeting, true
			}
		}
		return 0, false
	}
	for _, k := range lockedList(locks) {
		for _, p := range kept.Placements {
			if p.Section != k.Section || p.Meeting != k.Meeting {
				continue
			}
			m, ok := holds(p.Section, func(q timetable.Placement) bool { return q.Period == p.Period && q.Time == p.Time && q.Room == p.Room })
			if !ok {
				return nil, nil, fmt.Errorf("internal error: the re-planned timetable does not hold locked meeting %s %d at %s in %s; it was not offered", p.Section, p.Meeting, placementWhen(t, p), roomName(p.Room))
			}
			newLocks[meetingKey{p.Section, m}] = true
		}
	}
	if place != nil {
		m, ok := holds(place.Section, func(q timetable.Placement) bool { return q.Period == place.Period })
		if !ok {
			return nil, nil, fmt.Errorf("internal error: the re-planned timetable does not have %s at %s; it was not offered", place.Section, periodLabel(t, place.Period))
		}
		newLocks[meetingKey{place.Section, m}] = true
	}
	out.Status, out.Proven = "found", res.Proven
	out.Checked = "every hard requirement holds and every locked meeting is where it was (solver.Verify, timetable.Check)"
	for _, mv := range encode.Moves(t, kept, next) {
		rm := replanMove{Section: mv.Section, Change: mv.Change}
		if mv.From != nil {
			rm.From = placementWhen(t, *mv.From) + " in " + roomName(mv.From.Room)
		}
		if mv.To != nil {
			rm.To = placementWhen(t, *mv.To) + " in " + roomName(mv.To.Room)
		}
		out.Moves = append(out.Moves, rm)
	}
	out.Students = export.SectionChanges(t, kept, next)
	j := judgeMove(t, kept, next)
	out.Cost, out.Levels = j.Cost, j.Levels
	return out, &snapshot{sched: next, locks: newLocks}, nil
}

// decideRequest keeps or discards a finished re-plan.
type decideRequest struct {
	Version int  `json:"version"`
	Job     int  `json:"job"`
	Keep    bool `json:"keep"`
}

// handleReplanDecide makes a finished re-plan's timetable the current
// version (keep) or forgets it. Keeping is a versioned edit: refused when
// the timetable changed since the re-plan started, as the re-plan did not
// see that change.
func (s *Server) handleReplanDecide(w http.ResponseWriter, r *http.Request) {
	var req decideRequest
	if !s.beginEdit(w, r, &req, func() int { return req.Version }) {
		return
	}
	defer s.mu.Unlock()
	j, err := s.jobLocked(req.Job)
	if err != nil {
		writeError(w, http.StatusNotFound, err.Error())
		return
	}
	j.mu.Lock()
	state, keep := j.state, j.keep
	j.mu.Unlock()
	switch {
	case j.Kind != "replan":
		writeError(w, http.StatusBadRequest, fmt.Sprintf("search %d is a %s, not a re-plan; only a re-plan's timetable can be kept", j.ID, j.Kind))
		return
	case state == jobRunning:
		writeError(w, http.StatusConflict, "the re-plan is still running; wait for its answer or stop it first")
		return
	case keep == nil && req.Keep:
		writeError(w, http.StatusBadRequest, "this re-plan found no timetable to keep; change the locks or allow more time and re-plan")
		return
	case req.Keep && j.Base != s.version:
		writeJSON(w, http.StatusConflict, apiError{Error: fmt.Sprintf("this re-plan started from version %d, but the timetable is now at version %d (changed since); nothing was changed — re-plan again from the current version", j.Base, s.version), Version: s.version})
		return
	}
	delete(s.jobs, j.ID)
	if req.Keep {
		s.commitLocked(keep.sched, keep.locks)
	}
	writeJSON(w, http.StatusOK, s.stateLocked())
}
