package web

import (
	"net/http"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// waitJob polls a job until it has finished.
func (d *demoFixture) waitJob(t *testing.T, id int) jobJSON {
	t.Helper()
	deadline := time.Now().Add(3 * time.Minute)
	for time.Now().Before(deadline) {
		var j jobJSON
		require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/job?id="+itoa(id), nil, &j))
		if j.State != jobRunning {
			return j
		}
		time.Sleep(100 * time.Millisecond)
	}
	t.Fatalf("job %d did not finish", id)
	return jobJSON{}
}

// replanFound starts a re-plan with a long limit, waits until it has a
// verified timetable (or has ended), stops it and returns the finished
// job: no test depends on how fast the machine is.
func (d *demoFixture) replanFound(t *testing.T, req replanRequest) jobJSON {
	t.Helper()
	req.Seconds = int(replanMax.Seconds())
	var j jobJSON
	require.Equal(t, http.StatusAccepted, d.call(t, "POST", "/api/replan", req, &j))
	return d.stopWhenFound(t, j.ID)
}

// stopWhenFound waits until a running re-plan has a verified timetable
// (or has ended), stops it and returns the finished job.
func (d *demoFixture) stopWhenFound(t *testing.T, id int) jobJSON {
	t.Helper()
	var j jobJSON
	deadline := time.Now().Add(5 * time.Minute)
	for time.Now().Before(deadline) {
		require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/job?id="+itoa(id), nil, &j))
		if j.State != jobRunning || j.Progress.Cost != nil {
			break
		}
		time.Sleep(100 * time.Millisecond)
	}
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/job/cancel", jobRequest{ID: id}, &j))
	return d.waitJob(t, id)
}

func lockedIn(st stateJSON, section string, meeting int) bool {
	for _, m := range st.Meetings {
		if m.Section == section && m.Meeting == meeting {
			return m.Locked
		}
	}
	return false
}

func TestLockUnlockUndo(t *testing.T) {
	d := newDemo(t)
	m, legal, _, _ := d.legalAndIllegal(t)
	var st stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/lock", lockRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Locked: true}, &st))
	assert.Equal(t, 2, st.Version, "a lock is a versioned edit")
	assert.Equal(t, 1, st.Locked)
	assert.True(t, lockedIn(st, m.Section, m.Meeting))

	// A locked meeting does not move, and nothing changes.
	var e apiError
	require.Equal(t, http.StatusBadRequest, d.call(t, "POST", "/api/move", moveRequest{Version: 2, Section: m.Section, Meeting: m.Meeting, Period: legal}, &e))
	assert.Contains(t, e.Error, "is locked; unlock it first")
	assert.Equal(t, 2, d.state(t).Version)

	// Locking twice is refused; undo takes the lock back like a move.
	require.Equal(t, http.StatusBadRequest, d.call(t, "POST", "/api/lock", lockRequest{Version: 2, Section: m.Section, Meeting: m.Meeting, Locked: true}, &e))
	assert.Contains(t, e.Error, "already locked")
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/undo", versionRequest{Version: 2}, &st))
	assert.False(t, lockedIn(st, m.Section, m.Meeting), "undo unlocks")
	assert.Equal(t, 0, st.Locked)

	// Lock, then unlock by request.
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/lock", lockRequest{Version: 3, Section: m.Section, Meeting: m.Meeting, Locked: true}, &st))
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/lock", lockRequest{Version: 4, Section: m.Section, Meeting: m.Meeting, Locked: false}, &st))
	assert.False(t, lockedIn(st, m.Section, m.Meeting))
	assert.Equal(t, 5, st.Version)
}

func TestLockBadInput(t *testing.T) {
	d := newDemo(t)
	m := d.sched.Placements[0]
	for _, c := range []struct {
		name string
		body any
		code int
		want string
	}{
		{"stale", lockRequest{Version: 7, Section: m.Section, Meeting: m.Meeting, Locked: true}, http.StatusConflict, "made on version 7"},
		{"no version", lockRequest{Section: m.Section, Meeting: m.Meeting, Locked: true}, http.StatusConflict, "names no version"},
		{"unknown section", lockRequest{Version: 1, Section: "NOPE-1", Meeting: 1, Locked: true}, http.StatusBadRequest, `no section "NOPE-1"`},
		{"unknown meeting", lockRequest{Version: 1, Section: m.Section, Meeting: 99, Locked: true}, http.StatusBadRequest, "has no meeting 99"},
		{"not locked", lockRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Locked: false}, http.StatusBadRequest, "already not locked"},
		{"unknown field", `{"version":1,"section":"x","meeting":1,"lock":true}`, http.StatusBadRequest, "unknown field"},
		{"not JSON", `lock it`, http.StatusBadRequest, "not the JSON"},
	} {
		t.Run(c.name, func(t *testing.T) {
			var e apiError
			require.Equal(t, c.code, d.call(t, "POST", "/api/lock", c.body, &e))
			assert.Contains(t, e.Error, c.want)
		})
	}
	st := d.state(t)
	assert.Equal(t, 1, st.Version, "no refused lock changed anything")
	assert.Equal(t, 0, st.Locked)
}
