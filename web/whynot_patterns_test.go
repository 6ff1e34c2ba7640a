package web

import (
	"context"
	"fmt"
	"net/http"
	"net/http/httptest"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// newCampusFile serves the second demo as its workbook says
// (samples/campus-term.xlsx) with a first timetable of the engine.
func newCampusFile(t *testing.T) *demoFixture {
	t.Helper()
	term, ps, err := timetable.Load(filepath.Join("..", "samples", samples.CampusWorkbook))
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	ctx, cancel := context.WithTimeout(context.Background(), time.Minute)
	defer cancel()
	res, err := encode.Solve(ctx, term, encode.SolveOptions{Seed: 1})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	dir := t.TempDir()
	srv, err := New(Options{Term: term, Schedule: res.Schedule, OutDir: dir, BaseName: "campus"})
	require.NoError(t, err)
	ts := httptest.NewServer(srv)
	t.Cleanup(ts.Close)
	return &demoFixture{term: term, sched: res.Schedule, dir: dir, srv: srv, ts: ts}
}

// timeIndex is the 1-based meeting time of section id with the given
// days and start.
func timeIndex(t *testing.T, term *timetable.Term, id, days string, start timetable.Clock) int {
	t.Helper()
	sec := term.Sections[term.SectionIndex()[id]]
	for k, tc := range sec.Times {
		if tc.Days.String() == days && tc.Start == start {
			return k + 1
		}
	}
	t.Fatalf("section %s has no meeting time %s %v", id, days, start)
	return 0
}

// provedPlace checks a place independently of the page: an explanation
// granting the section exactly there, whose timetable passes
// timetable.Check and has the section at that meeting time and room.
func provedPlace(t *testing.T, term *timetable.Term, id string, k int, room string) {
	t.Helper()
	sec := &term.Sections[term.SectionIndex()[id]]
	req := encode.PatternRequest(sec, k, room)
	ex, err := encode.Explain(context.Background(), term, []encode.Request{req}, encode.ExplainOptions{Seed: 1, NoCost: true, NoPlaces: true, Alternatives: -1})
	require.NoError(t, err)
	require.Equal(t, encode.StatusGranted, ex.Status, "%s at %d in %s", id, k, room)
	require.Empty(t, timetable.HardViolations(timetable.Check(term, ex.Schedule)))
	pl, ok := placementOf(ex.Schedule, id, 1)
	require.True(t, ok)
	assert.Equal(t, k, pl.Time)
	assert.Equal(t, room, pl.Room)
}

// TestWhyNotPattern asks the second demo for MTH110-B on Mon Wed Fri at
// 14:00: refused, because it must start with MTH110-A (Relations row 2),
// whose teacher is away on Friday afternoons in weeks 9-10 (Unavailable
// row 2) — worked out from the workbook's sheets. Every other place it
// lists is granted by an explanation of its own with a checked timetable.
func TestWhyNotPattern(t *testing.T) {
	d := newCampusFile(t)
	k := timeIndex(t, d.term, "MTH110-B", "Mon Wed Fri", 14*60)
	var a whyNotJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", fmt.Sprintf("/api/whynot?section=MTH110-B&time=%d", k), nil, &a))
	assert.False(t, a.Granted)
	assert.True(t, a.Minimal)
	var where []string
	for _, r := range a.Reasons {
		where = append(where, r.Where)
	}
	assert.Equal(t, []string{"Meeting times row 33", "Relations row 2", "Staff row 7; Unavailable row 2"}, where)
	require.NotEmpty(t, a.Places)
	assert.True(t, a.Complete)
	for i, p := range a.Places {
		assert.Equal(t, -1, p.Period)
		assert.NotEqual(t, k, p.Time)
		if i > 0 {
			assert.LessOrEqual(t, a.Places[i-1].Cost, p.Cost, "cheapest first")
		}
		provedPlace(t, d.term, "MTH110-B", p.Time, p.Room)
	}

	// Where it is now is granted; a room the section does not list is refused by the request itself.
	cur, ok := placementOf(d.sched, "MTH110-B", 1)
	require.True(t, ok)
	var g struct {
		whyNotJSON
		Error string `json:"error"`
	}
	code := d.call(t, "GET", fmt.Sprintf("/api/whynot?section=MTH110-B&time=%d&room=%s", cur.Time, cur.Room), nil, &g)
	require.Equal(t, http.StatusOK, code, "%+v", g)
	assert.True(t, g.Granted)
	var n whyNotJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", fmt.Sprintf("/api/whynot?section=MTH110-B&time=%d&room=DUN-S1", cur.Time), nil, &n))
	assert.False(t, n.Granted)
	require.Len(t, n.Reasons, 1)
	assert.Contains(t, n.Reasons[0].Sentence, "room DUN-S1 is not one of its acceptable rooms")

	for _, c := range []struct{ q, says string }{
		{"section=MTH110-B", "not one of section MTH110-B's meeting times (1 to 4)"},
		{"section=MTH110-B&time=0", "not one of section MTH110-B's meeting times"},
		{"section=MTH110-B&time=5", "not one of section MTH110-B's meeting times"},
		{"section=MTH110-B&time=1&room=NOPE", "no room"},
	} {
		var e apiError
		require.Equal(t, http.StatusBadRequest, d.call(t, "GET", "/api/whynot?"+c.q, nil, &e), c.q)
		assert.Contains(t, e.Error, c.says, c.q)
	}
}

// TestWhereElsePattern: where else for a pattern section of the second
// demo lists meeting times and rooms proved by full timetables (each
// granted again by an explanation of its own, timetable.Check clean),
// cheapest first, never where it is now; moves that work alone are judged
// by timetable.Check on this timetable.
func TestWhereElsePattern(t *testing.T) {
	d := newCampusFile(t)
	const sec = "BIO201-L"
	var j jobJSON
	require.Equal(t, http.StatusAccepted, d.call(t, "POST", "/api/whereelse", whereElseRequest{Section: sec, Meeting: 1}, &j))
	r := jobResult[whereElseJSON](t, d.waitJob(t, j.ID))
	assert.True(t, r.Complete)
	assert.Contains(t, r.Basis, "full timetable")
	require.NotEmpty(t, r.Places)
	cur, ok := placementOf(d.sched, sec, 1)
	require.True(t, ok)
	idx := -1
	for i, p := range d.sched.Placements {
		if p.Section == sec {
			idx = i
		}
	}
	for _, p := range r.Places {
		assert.Equal(t, -1, p.Period)
		assert.False(t, p.Time == cur.Time && p.Room == cur.Room, "not where it is")
		provedPlace(t, d.term, sec, p.Time, p.Room)
		next := cloneSchedule(d.sched)
		next.Placements[idx].Time, next.Placements[idx].Room = p.Time, p.Room
		hard := timetable.HardViolations(timetable.Check(d.term, next))
		assert.Equal(t, len(hard) == 0, p.Alone, "%s in %s: alone iff the lone move is clean", p.At, p.Room)
		if !p.Alone {
			assert.True(t, strings.Contains(p.Reason, ":"), "a lone move that breaks something says what")
		}
	}
}
