package web

import (
	"context"
	"fmt"
	"net/http"
	"strconv"
	"time"

	"github.com/termwright/termwright/encode"
)

// whyNotLimit bounds one explanation; the answer says when it ran out.
const whyNotLimit = 30 * time.Second

// whyNotJSON answers "can any timetable of the term have this section at
// this time (and room)?", in the sentences and workbook rows of explain.
type whyNotJSON struct {
	Request   string         `json:"request"` // "section BIO-101 at Tue 10:00 in room L2"
	Granted   bool           `json:"granted"`
	Reasons   []reasonJSON   `json:"reasons"`  // a minimal set that cannot all hold, when refused
	Minimal   bool           `json:"minimal"`  // the reasons are a minimal set
	Places    []encode.Place `json:"places"`   // where else the section could meet, each proved by a timetable
	Complete  bool           `json:"complete"` // every other place was tried
	Relax     [][]reasonJSON `json:"relax"`    // cheapest sets of requirements whose relaxation would allow it
	Uncertain string         `json:"uncertain,omitempty"`
}

type reasonJSON struct {
	Kind     string `json:"kind"`
	Sentence string `json:"sentence"`
	Where    string `json:"where"`
}

func reasonsOf(rs []encode.Reason) []reasonJSON {
	out := []reasonJSON{}
	for _, r := range rs {
		out = append(out, reasonJSON{r.Kind, r.Sentence, r.Where()})
	}
	return out
}

// handleWhyNot runs encode.Explain for one request: section at period, or
// a section with meeting patterns at its 1-based pattern time (and room).
// The term is read-only, so it runs outside the lock; one explanation at
// a time, as each takes the engine for seconds.
func (s *Server) handleWhyNot(w http.ResponseWriter, r *http.Request) {
	t := s.opt.Term
	q := r.URL.Query()
	sec := q.Get("section")
	si, ok := t.SectionIndex()[sec]
	if !ok {
		writeError(w, http.StatusBadRequest, fmt.Sprintf("there is no section %q in the term; pick a meeting on the page", sec))
		return
	}
	room := q.Get("room")
	var req encode.Request
	if ts := &t.Sections[si]; ts.UsesTimes() {
		k, err := strconv.Atoi(q.Get("time"))
		if err != nil || k < 1 || k > len(ts.Times) {
			writeError(w, http.StatusBadRequest, fmt.Sprintf("time %q is not one of section %s's meeting times (1 to %d); pick one of them", q.Get("time"), sec, len(ts.Times)))
			return
		}
		req = encode.PatternRequest(ts, k, room)
	} else {
		per, err := strconv.Atoi(q.Get("period"))
		if err != nil || per < 0 || per >= len(t.Periods) {
			writeError(w, http.StatusBadRequest, fmt.Sprintf("period %q is not in the term's grid (0 to %d); pick a cell of the grid", q.Get("period"), len(t.Periods)-1))
			return
		}
		p := t.Periods[per]
		req = encode.Request{Section: sec, Day: p.Day, Start: p.Start, Room: room}
	}
	if _, ok := t.RoomIndex()[room]; room != "" && !ok {
		writeError(w, http.StatusBadRequest, fmt.Sprintf("there is no room %q in the term; pick one of the term's rooms", room))
		return
	}
	select {
	case s.explaining <- struct{}{}:
		defer func() { <-s.explaining }()
	default:
		writeError(w, http.StatusServiceUnavailable, "another search is running (a re-plan, where else or why not); wait for it or stop it, then ask again")
		return
	}
	ctx, cancel := context.WithTimeout(r.Context(), whyNotLimit)
	defer cancel()
	ex, err := encode.Explain(ctx, t, []encode.Request{req}, encode.ExplainOptions{Seed: 1, Alternatives: 2})
	if err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	out := whyNotJSON{Request: req.String(), Reasons: []reasonJSON{}, Places: []encode.Place{}, Relax: [][]reasonJSON{}, Uncertain: ex.Uncertain}
	if len(ex.Requests) == 1 {
		rr := ex.Requests[0]
		out.Granted = rr.Granted
		out.Places = append(out.Places, rr.Places...)
		out.Complete = rr.PlacesComplete
	}
	if ex.Conflict != nil {
		out.Reasons, out.Minimal = reasonsOf(ex.Conflict.Reasons), ex.Conflict.Minimal
	}
	for _, c := range ex.Corrections {
		out.Relax = append(out.Relax, reasonsOf(c.Relax))
	}
	writeJSON(w, http.StatusOK, out)
}
