package web

import (
	"context"
	"net/http"
	"net/http/httptest"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// newCampusDemo serves the second demo term (meeting patterns only) with
// a first timetable of the engine, and names a section with at least two
// meeting times.
func newCampusDemo(t *testing.T) (*demoFixture, string) {
	t.Helper()
	term := samples.Campus()
	ctx, cancel := context.WithTimeout(context.Background(), time.Minute)
	defer cancel()
	res, err := encode.Solve(ctx, term, encode.SolveOptions{})
	require.NoError(t, err)
	require.Equal(t, solver.Satisfiable, res.Status)
	sec := ""
	for _, s := range term.Sections {
		if len(s.Times) >= 2 && !s.NoRoom && sec == "" {
			sec = s.ID
		}
	}
	require.NotEmpty(t, sec)
	dir := t.TempDir()
	srv, err := New(Options{Term: term, Schedule: res.Schedule, OutDir: dir, BaseName: "campus"})
	require.NoError(t, err)
	ts := httptest.NewServer(srv)
	t.Cleanup(ts.Close)
	return &demoFixture{term: term, sched: res.Schedule, dir: dir, srv: srv, ts: ts}, sec
}

// TestReplanPatternLock moves a pattern section of the second demo to
// another meeting time (forced, so it may clash), locks it and re-plans: the kept timetable passes
// timetable.Check (our independent domain checker) on the real term, and
// the locked section is still at that meeting time and room — its choice
// numbered as in the real term, not the narrowed working copy.
func TestReplanPatternLock(t *testing.T) {
	d, sec := newCampusDemo(t)
	was, ok := placementOf(d.sched, sec, 1)
	require.True(t, ok)
	to := 1 + was.Time%2 // another of its meeting times, in the same room
	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: sec, Meeting: 1, Time: to, Force: true}, &res))
	require.True(t, res.Applied)
	var st stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/lock", lockRequest{Version: 2, Section: sec, Meeting: 1, Locked: true}, &st))

	j := d.replanFound(t, replanRequest{Version: 3})
	r := jobResult[replanJSON](t, j)
	require.Equal(t, "found", r.Status, "notes: %v", r.Notes)
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: 3, Job: j.ID, Keep: true}, &st))
	kept := d.current(t)
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, kept)), "the kept re-plan passes timetable.Check")
	p, ok := placementOf(kept, sec, 1)
	require.True(t, ok)
	assert.Equal(t, to, p.Time, "the locked section keeps its meeting time")
	assert.Equal(t, was.Room, p.Room, "the locked section keeps its room")
	assert.True(t, lockedIn(st, sec, 1), "and stays locked")

	var e apiError
	require.Equal(t, http.StatusBadRequest, d.call(t, "POST", "/api/replan", replanRequest{Version: st.Version, Place: &placeSpec{sec, 1, 0}}, &e))
	assert.Contains(t, e.Error, "meets by meeting times")
}
