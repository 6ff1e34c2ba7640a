package web

import (
	"context"
	"errors"
	"net/http"
	"time"

	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/timetable"
)

// whereElseLimit bounds one where-else search.
const whereElseLimit = 2 * time.Minute

// whereElseRequest asks where else one meeting could go.
type whereElseRequest struct {
	Section string `json:"section"`
	Meeting int    `json:"meeting"`
}

// whereElseJSON is every other place a meeting could go.
type whereElseJSON struct {
	Section  string      `json:"section"`
	Meeting  int         `json:"meeting"`
	From     string      `json:"from"`     // where it is now
	Version  int         `json:"version"`  // the version the moves alone were judged on
	Complete bool        `json:"complete"` // every start was tried
	Basis    string      `json:"basis"`    // how each place is proved
	Places   []whereJSON `json:"places"`
}

// whereJSON is one place with what moving the meeting alone there does.
type whereJSON struct {
	At     string `json:"at"`
	Period int    `json:"period"`         // grid start; -1 for a meeting pattern
	Time   int    `json:"time,omitempty"` // 1-based meeting pattern
	Room   string `json:"room"`
	// Alone says the meeting can move there by itself, the rest of this
	// timetable unchanged (judged by timetable.Check); otherwise other
	// meetings have to move too (re-plan with it there).
	Alone  bool          `json:"alone"`
	Reason string        `json:"reason,omitempty"` // the first requirement a lone move breaks
	Cost   []costChange  `json:"cost"`             // of the lone move
	Levels []levelChange `json:"levels"`
}

func (s *Server) handleWhereElse(w http.ResponseWriter, r *http.Request) {
	var req whereElseRequest
	if err := readBody(w, r, &req); err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	s.mu.Lock()
	defer s.mu.Unlock()
	t := s.opt.Term
	at, err := s.placementLocked(req.Section, req.Meeting)
	if err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	sec := t.Sections[t.SectionIndex()[req.Section]]
	from := s.cur.Placements[at]
	j, err := s.startJobLocked("whereelse", whereElseLimit, func(ctx context.Context, j *job) {
		out := &whereElseJSON{Section: req.Section, Meeting: req.Meeting, From: placementWhen(t, from) + " in " + roomName(from.Room), Places: []whereJSON{}}
		what := "every start of " + sec.ID
		if sec.UsesTimes() {
			what = "every meeting time and room of " + sec.ID
		}
		j.setProgress(jobProgress{Phase: "testing " + what + " against the whole term"})
		places, complete, err := encode.PlacesOf(ctx, t, sec.ID, encode.ExplainOptions{Seed: 1, Alternatives: -1})
		var cerr encode.CompileError
		onlyAlone := false
		var cands []whereJSON
		switch {
		case errors.As(err, &cerr) && sec.UsesTimes():
			// The engine cannot search this term (a mix of grid and pattern
			// sections it does not compile): fall back to the moves that
			// work alone on this timetable.
			out.Complete, onlyAlone = true, true
			out.Basis = "Each place is proved by this timetable with the meeting moved there alone (timetable.Check); the whole term cannot be searched: " + cerr.Error()
			cands = patternCandidates(t, &sec, from)
		case err != nil:
			j.finish(nil, nil, err)
			return
		default:
			out.Complete = complete && ctx.Err() == nil
			out.Basis = "Each place is proved by a full timetable of the term in which the section meets there (encode's explanation search: solver.Verify and timetable.Check)"
			if sec.UsesTimes() {
				out.Basis += "; meeting times and rooms are listed cheapest first"
			}
			for _, p := range places {
				if p.Time > 0 && !(p.Time == from.Time && p.Room == from.Room) || p.Time == 0 && p.Period != from.Period {
					cands = append(cands, whereJSON{At: p.At, Period: p.Period, Time: p.Time, Room: p.Room})
				}
			}
		}
		j.setProgress(jobProgress{Phase: "judging a move of the meeting alone to each place"})
		s.mu.Lock()
		out.Version = s.version
		// Judge on the timetable as it is now: edits made meanwhile count.
		if now, err := s.placementLocked(req.Section, req.Meeting); err == nil {
			out.Places = s.judgePlacesLocked(now, s.cur.Placements[now], cands, onlyAlone)
		}
		s.mu.Unlock()
		j.finish(out, nil, nil)
	})
	if err != nil {
		writeError(w, http.StatusServiceUnavailable, err.Error())
		return
	}
	writeJSON(w, http.StatusAccepted, j.json())
}

// patternCandidates lists every meeting pattern and acceptable room of a
// pattern section other than where it is.
func patternCandidates(t *timetable.Term, sec *timetable.Section, from timetable.Placement) []whereJSON {
	rooms := []string{from.Room}
	if len(sec.RoomChoices) > 0 {
		rooms = rooms[:0]
		for _, rc := range sec.RoomChoices {
			rooms = append(rooms, rc.Room)
		}
	}
	var out []whereJSON
	for i, c := range sec.Times {
		for _, room := range rooms {
			if i+1 == from.Time && room == from.Room {
				continue
			}
			out = append(out, whereJSON{At: choiceText(t, c), Period: -1, Time: i + 1, Room: room})
		}
	}
	return out
}

// judgePlacesLocked judges, on the current timetable, moving the meeting
// at index at (now at from) alone to each candidate: a grid start in its
// own room first, else in the candidate's room; a meeting time in the
// candidate's room. With onlyAlone, only the moves that work alone are
// kept (nothing else proves the others).
func (s *Server) judgePlacesLocked(at int, from timetable.Placement, cands []whereJSON, onlyAlone bool) []whereJSON {
	t := s.opt.Term
	out := []whereJSON{}
	for _, c := range cands {
		if c.Period == from.Period && c.Time == from.Time && c.Room == from.Room {
			continue // where it is now (it moved while the search ran)
		}
		rooms := []string{from.Room}
		if c.Room != from.Room {
			rooms = append(rooms, c.Room)
		}
		if c.Time > 0 {
			rooms = []string{c.Room}
		}
		var best *moveResult
		for _, room := range rooms {
			next := cloneSchedule(s.cur)
			p := &next.Placements[at]
			p.Period, p.Time, p.Room = c.Period, c.Time, room
			res := judgeMove(t, s.cur, next)
			if best == nil || res.Legal {
				r := res
				best = &r
				c.Room = room
			}
			if res.Legal {
				break
			}
		}
		c.Alone, c.Cost, c.Levels = best.Legal, best.Cost, best.Levels
		if !best.Legal && len(best.Reasons) > 0 {
			c.Reason = best.Reasons[0].Rule + ": " + best.Reasons[0].Msg
		}
		if onlyAlone && !c.Alone {
			continue
		}
		out = append(out, c)
	}
	return out
}
