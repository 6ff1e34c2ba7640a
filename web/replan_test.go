package web

import (
	"net/http"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func (d *demoFixture) current(t *testing.T) *timetable.Schedule {
	d.srv.mu.Lock()
	defer d.srv.mu.Unlock()
	return cloneSchedule(d.srv.cur)
}

func placementOf(s *timetable.Schedule, sec string, meeting int) (timetable.Placement, bool) {
	for _, p := range s.Placements {
		if p.Section == sec && p.Meeting == meeting {
			return p, true
		}
	}
	return timetable.Placement{}, false
}

// TestReplanKeepsLocks locks two meetings, forces a third onto a clash,
// re-plans and keeps the result: the kept timetable passes timetable.Check
// (our independent domain checker), the locked meetings are where they
// were and still locked, the number of moves matches timetable.Compare,
// and undo brings back the forced timetable.
func TestReplanKeepsLocks(t *testing.T) {
	d := newDemo(t)
	m, _, clash, _ := d.legalAndIllegal(t)
	var st stateJSON
	locked := []timetable.Placement{}
	for _, p := range d.sched.Placements {
		if p.Section != m.Section && len(locked) < 2 {
			locked = append(locked, p)
		}
	}
	v := 1
	for _, p := range locked {
		require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/lock", lockRequest{Version: v, Section: p.Section, Meeting: p.Meeting, Locked: true}, &st))
		v++
	}
	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: v, Section: m.Section, Meeting: m.Meeting, Period: clash, Force: true}, &res))
	require.True(t, res.Applied)
	v++
	forced := d.current(t)
	require.NotEmpty(t, timetable.HardViolations(timetable.Check(d.term, forced)), "the forced move breaks a requirement")

	j := d.replanFound(t, replanRequest{Version: v})
	assert.Equal(t, v, j.Base)
	r := jobResult[replanJSON](t, j)
	require.Equal(t, "found", r.Status, "notes: %v", r.Notes)
	assert.Equal(t, 2, r.Locked)
	assert.Equal(t, v, d.state(t).Version, "a finished re-plan changes nothing until kept")

	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: v, Job: j.ID, Keep: true}, &st))
	assert.Equal(t, v+1, st.Version)
	assert.Empty(t, st.Hard)
	kept := d.current(t)
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, kept)), "the kept re-plan passes timetable.Check")
	for _, p := range locked {
		found := false
		for _, q := range kept.Placements {
			if q.Section == p.Section && q.Period == p.Period && q.Room == p.Room {
				found = true
				assert.True(t, lockedIn(st, q.Section, q.Meeting), "%s stays locked", p.Section)
			}
		}
		assert.True(t, found, "locked %s %d stays at %s in %s", p.Section, p.Meeting, d.term.Periods[p.Period].Label(), p.Room)
	}
	c := timetable.Compare(timetable.MeetingsOf(d.term, forced), timetable.MeetingsOf(d.term, kept))
	assert.Equal(t, c.Count(timetable.ChangeMoved)+c.Count(timetable.ChangeAdded), len(r.Moves), "the moves listed are the meetings timetable.Compare finds moved")

	// The job is collected; undo brings back the forced timetable.
	var e apiError
	require.Equal(t, http.StatusNotFound, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: v + 1, Job: j.ID, Keep: true}, &e))
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/undo", versionRequest{Version: v + 1}, &st))
	assert.Equal(t, forced.Placements, d.current(t).Placements)
}

// TestReplanPlace fixes a meeting on a cell where it clashes alone and
// re-plans: the result has it there, locked, and breaks nothing.
func TestReplanPlace(t *testing.T) {
	d := newDemo(t)
	m, _, clash, _ := d.legalAndIllegal(t)
	j := d.replanFound(t, replanRequest{Version: 1, Place: &placeSpec{m.Section, m.Meeting, clash}})
	r := jobResult[replanJSON](t, j)
	require.Equal(t, "found", r.Status)
	assert.NotEmpty(t, r.Moves, "another meeting has to move")
	var st stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: 1, Job: j.ID, Keep: true}, &st))
	kept := d.current(t)
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, kept)))
	at := false
	for _, q := range kept.Placements {
		if q.Section == m.Section && q.Period == clash {
			at = true
			assert.True(t, lockedIn(st, q.Section, q.Meeting), "the placed meeting is locked there")
		}
	}
	assert.True(t, at, "%s meets at %s", m.Section, d.term.Periods[clash].Label())
}

// TestReplanStaleAndBad: a re-plan kept after another edit is refused,
// and bad requests change nothing.
func TestReplanStaleAndBad(t *testing.T) {
	d := newDemo(t)
	m := d.sched.Placements[0]
	var j jobJSON
	require.Equal(t, http.StatusAccepted, d.call(t, "POST", "/api/replan", replanRequest{Version: 1, Seconds: int(replanMax.Seconds())}, &j))
	// While it runs (it runs until stopped below): a second search is refused, keeping is refused.
	var e apiError
	require.Equal(t, http.StatusServiceUnavailable, d.call(t, "POST", "/api/replan", replanRequest{Version: 1, Seconds: 2}, &e))
	assert.Contains(t, e.Error, "another search is running")
	require.Equal(t, http.StatusConflict, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: 1, Job: j.ID, Keep: true}, &e))
	assert.Contains(t, e.Error, "still running")
	// An edit meanwhile makes the re-plan stale.
	var st stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/lock", lockRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Locked: true}, &st))
	j = d.stopWhenFound(t, j.ID)
	require.Equal(t, "found", jobResult[replanJSON](t, j).Status)
	require.Equal(t, http.StatusConflict, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: 2, Job: j.ID, Keep: true}, &e))
	assert.Contains(t, e.Error, "started from version 1")
	assert.Equal(t, 2, e.Version)
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: 2, Job: j.ID, Keep: false}, &st))
	assert.Equal(t, 2, st.Version, "discarding changes nothing")

	for _, c := range []struct {
		name, path string
		body       any
		code       int
		want       string
	}{
		{"stale", "/api/replan", replanRequest{Version: 1}, http.StatusConflict, "made on version 1"},
		{"negative seconds", "/api/replan", replanRequest{Version: 2, Seconds: -1}, http.StatusBadRequest, "out of range"},
		{"too long", "/api/replan", replanRequest{Version: 2, Seconds: 100000}, http.StatusBadRequest, "out of range"},
		{"place locked", "/api/replan", replanRequest{Version: 2, Place: &placeSpec{m.Section, m.Meeting, 0}}, http.StatusBadRequest, "is locked"},
		{"place unknown", "/api/replan", replanRequest{Version: 2, Place: &placeSpec{"NOPE", 1, 0}}, http.StatusBadRequest, "section NOPE has no meeting 1"},
		{"place off grid", "/api/replan", replanRequest{Version: 2, Place: &placeSpec{d.sched.Placements[1].Section, d.sched.Placements[1].Meeting, 999}}, http.StatusBadRequest, "not in the term's grid"},
		{"unknown job", "/api/replan/decide", decideRequest{Version: 2, Job: 99, Keep: true}, http.StatusNotFound, "no search 99"},
		{"decide stale", "/api/replan/decide", decideRequest{Version: 1, Job: 1, Keep: true}, http.StatusConflict, "made on version 1"},
		{"cancel unknown", "/api/job/cancel", jobRequest{ID: 42}, http.StatusNotFound, "no search 42"},
		{"cancel bad body", "/api/job/cancel", `{"job":1}`, http.StatusBadRequest, "unknown field"},
	} {
		t.Run(c.name, func(t *testing.T) {
			var e apiError
			require.Equal(t, c.code, d.call(t, "POST", c.path, c.body, &e))
			assert.Contains(t, e.Error, c.want)
		})
	}
	var e2 apiError
	require.Equal(t, http.StatusBadRequest, d.call(t, "GET", "/api/job?id=x", nil, &e2))
	require.Equal(t, http.StatusNotFound, d.call(t, "GET", "/api/job?id=77", nil, &e2))
	assert.Equal(t, 2, d.state(t).Version, "no bad request changed anything")
}

// TestReplanCancel stops a long re-plan: it ends at once, marked stopped,
// and still answers (with the best timetable so far, or none).
func TestReplanCancel(t *testing.T) {
	d := newDemo(t)
	var j jobJSON
	require.Equal(t, http.StatusAccepted, d.call(t, "POST", "/api/replan", replanRequest{Version: 1, Seconds: 300}, &j))
	// One search at a time: why not and where else wait their turn.
	var e apiError
	m := d.sched.Placements[0]
	require.Equal(t, http.StatusServiceUnavailable, d.call(t, "GET", "/api/whynot?section="+m.Section+"&period=0", nil, &e))
	require.Equal(t, http.StatusServiceUnavailable, d.call(t, "POST", "/api/whereelse", whereElseRequest{Section: m.Section, Meeting: m.Meeting}, &e))
	assert.Contains(t, e.Error, "another search is running")
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/job/cancel", jobRequest{ID: j.ID}, &j))
	j = d.waitJob(t, j.ID)
	assert.True(t, j.Stopped)
	r := jobResult[replanJSON](t, j)
	assert.Contains(t, []string{"found", "unknown"}, r.Status)
}

// TestCloseStopsJobs: Close (serve's shutdown) ends a running re-plan.
func TestCloseStopsJobs(t *testing.T) {
	d := newDemo(t)
	var j jobJSON
	require.Equal(t, http.StatusAccepted, d.call(t, "POST", "/api/replan", replanRequest{Version: 1, Seconds: 300}, &j))
	d.srv.Close()
	j = d.waitJob(t, j.ID)
	assert.NotEqual(t, jobRunning, j.State)
}
