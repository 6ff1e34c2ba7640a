package web

import (
	"io"
	"net/http"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func TestPageAndAssets(t *testing.T) {
	d := newDemo(t)
	for _, c := range []struct{ path, ctype, has string }{
		{"/", "text/html", `<script src="/assets/app.js"`},
		{"/assets/app.js", "javascript", "/api/move"},
		{"/assets/style.css", "text/css", "@media print"},
	} {
		resp, err := http.Get(d.ts.URL + c.path)
		require.NoError(t, err)
		body, err := io.ReadAll(resp.Body)
		require.NoError(t, err)
		resp.Body.Close()
		assert.Equal(t, http.StatusOK, resp.StatusCode, c.path)
		assert.Contains(t, resp.Header.Get("Content-Type"), c.ctype, c.path)
		assert.Contains(t, resp.Header.Get("Content-Security-Policy"), "default-src 'self'", c.path)
		assert.Contains(t, string(body), c.has, c.path)
	}
	resp, err := http.Get(d.ts.URL + "/assets/nothing.js")
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusNotFound, resp.StatusCode)
}

func TestTermAndState(t *testing.T) {
	d := newDemo(t)
	var tj termJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/term", nil, &tj))
	assert.Equal(t, d.term.Name, tj.Name)
	assert.Len(t, tj.Periods, len(d.term.Periods))
	assert.Len(t, tj.Staff, len(d.term.Staff))
	assert.Len(t, tj.Rooms, len(d.term.Rooms))
	assert.Len(t, tj.Cohorts, len(d.term.Cohorts))
	assert.NotEmpty(t, tj.Students, "the demo has enrolments")
	assert.Equal(t, []string{"Mon", "Tue", "Wed", "Thu", "Fri"}, tj.Days)
	// Every period is a cell of the grid: a day column and a time row.
	for _, p := range tj.Periods {
		assert.Contains(t, tj.Days, p.Day)
		found := false
		for _, r := range tj.Times {
			found = found || (r.Start == p.Start && r.End == p.End)
		}
		assert.True(t, found, "period %s has a row", p.Label)
	}

	st := d.state(t)
	assert.Equal(t, 1, st.Version)
	assert.False(t, st.CanUndo)
	assert.Len(t, st.Meetings, len(d.sched.Placements))
	assert.Empty(t, st.Hard, "the reference timetable breaks no hard requirement (timetable.Check)")
	want := timetable.Cost(d.term, d.sched, nil)
	for _, l := range st.Cost.Levels {
		assert.Equal(t, want.ByLevel[l.Level], l.Cost, "level %d is timetable.Cost's", l.Level)
	}
	for _, m := range st.Meetings {
		p := d.sched.Placements[m.Index]
		assert.Equal(t, p.Section, m.Section)
		assert.Equal(t, d.term.Periods[p.Period].Start.String(), m.Start)
		assert.NotEmpty(t, m.Periods)
	}
}

func TestMove(t *testing.T) {
	d := newDemo(t)
	m, legal, clash, staff := d.legalAndIllegal(t)

	// An illegal move is judged and not applied.
	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: clash}, &res))
	assert.False(t, res.Legal)
	assert.False(t, res.Applied)
	require.NotEmpty(t, res.Reasons)
	rules := []string{}
	for _, r := range res.Reasons {
		rules = append(rules, r.Rule)
	}
	assert.Contains(t, rules, timetable.RuleStaffClash)
	assert.Contains(t, strings.Join([]string{res.Reasons[0].Msg}, ""), staff, "the reason names the staff member")
	assert.Equal(t, 1, res.State.Version, "nothing changed")

	// A legal move is applied; the cost change is timetable.Cost's.
	res = moveResult{}
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: legal}, &res))
	assert.True(t, res.Legal)
	assert.True(t, res.Applied)
	assert.Empty(t, res.Reasons)
	assert.Equal(t, 2, res.State.Version)
	assert.True(t, res.State.CanUndo)
	assert.Empty(t, res.State.Hard)
	moved := cloneSchedule(d.sched)
	for i := range moved.Placements {
		if moved.Placements[i].Section == m.Section && moved.Placements[i].Meeting == m.Meeting {
			moved.Placements[i].Period = legal
		}
	}
	before, after := timetable.Cost(d.term, d.sched, nil), timetable.Cost(d.term, moved, nil)
	for _, c := range res.Cost {
		assert.Equal(t, before.Criterion(c.Name).Cost, c.Before, c.Name)
		assert.Equal(t, after.Criterion(c.Name).Cost, c.After, c.Name)
	}
	for _, c := range after.Criteria {
		if c.Cost != before.Criterion(c.Name).Cost {
			assert.Contains(t, res.Cost, costChange{c.Name, before.Criterion(c.Name).Cost, c.Cost}, "every changed criterion is listed")
		}
	}

	// Forcing the illegal move applies it and Check sees the clash; undo
	// takes it back.
	res = moveResult{}
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 2, Section: m.Section, Meeting: m.Meeting, Period: clash, Force: true}, &res))
	assert.True(t, res.Applied)
	assert.False(t, res.Legal)
	assert.NotEmpty(t, res.State.Hard)
	var st stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/undo", versionRequest{Version: 3}, &st))
	assert.Equal(t, 4, st.Version)
	assert.Empty(t, st.Hard)
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/undo", versionRequest{Version: 4}, &st))
	assert.False(t, st.CanUndo)
	for i, mj := range st.Meetings {
		assert.Equal(t, d.sched.Placements[i].Period, mj.Period, "two undos restore the timetable as loaded")
	}
	var e apiError
	assert.Equal(t, http.StatusBadRequest, d.call(t, "POST", "/api/undo", versionRequest{Version: 5}, &e))
	assert.Contains(t, e.Error, "nothing to undo")
}

// TestStaleEdit: two tabs both showing version 1; the second tab's edit
// is refused, not applied on top of the first.
func TestStaleEdit(t *testing.T) {
	d := newDemo(t)
	m, legal, _, _ := d.legalAndIllegal(t)
	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: legal}, &res))
	require.True(t, res.Applied)
	for _, c := range []struct {
		path string
		body any
	}{
		{"/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: m.Period}},
		{"/api/undo", versionRequest{Version: 1}},
		{"/api/save", versionRequest{Version: 1}},
		{"/api/move", moveRequest{Version: 0, Section: m.Section, Meeting: m.Meeting, Period: m.Period}},
	} {
		var e apiError
		assert.Equal(t, http.StatusConflict, d.call(t, "POST", c.path, c.body, &e), c.path)
		assert.Equal(t, 2, e.Version)
		assert.Contains(t, e.Error, "version")
		assert.Contains(t, e.Error, "2")
	}
	st := d.state(t)
	assert.Equal(t, 2, st.Version, "no stale edit changed anything")
	files, _ := filepath.Glob(filepath.Join(d.dir, "*.xlsx"))
	assert.Len(t, files, 1, "no stale save wrote a file")
}

func TestBadRequests(t *testing.T) {
	d := newDemo(t)
	m := d.sched.Placements[0]
	room := func(s string) *string { return &s }
	secs := d.term.SectionIndex()
	var noRoom, roomSec timetable.Placement
	for _, p := range d.sched.Placements {
		if d.term.Sections[secs[p.Section]].NoRoom {
			noRoom = p
		} else {
			roomSec = p
		}
	}
	cases := []struct {
		name, method, path string
		body               any
		code               int
		says               string
	}{
		{"not JSON", "POST", "/api/move", "{version: 1", 400, "not the JSON"},
		{"empty body", "POST", "/api/move", "", 400, "empty"},
		{"unknown field", "POST", "/api/move", `{"version":1,"section":"X","meeting":1,"period":0,"colour":"red"}`, 400, "colour"},
		{"two objects", "POST", "/api/undo", `{"version":1}{"version":1}`, 400, "more than one"},
		{"too big", "POST", "/api/move", `{"section":"` + strings.Repeat("x", maxBody) + `"}`, 400, "over"},
		{"unknown section", "POST", "/api/move", moveRequest{Version: 1, Section: "NOPE-1", Meeting: 1, Period: 0}, 400, "no section"},
		{"unknown meeting", "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: 99, Period: 0}, 400, "no meeting 99"},
		{"period below grid", "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: -1}, 400, "not in the term's grid"},
		{"period past grid", "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: len(d.term.Periods)}, 400, "not in the term's grid"},
		{"unknown room", "POST", "/api/move", moveRequest{Version: 1, Section: roomSec.Section, Meeting: roomSec.Meeting, Period: 0, Room: room("NO-SUCH-ROOM")}, 400, "no room"},
		{"same place", "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: m.Period}, 400, "already at"},
		{"unknown version to compare", "GET", "/api/compare?old=7&new=current", nil, 400, "no version"},
		{"compare without versions", "GET", "/api/compare", nil, 400, "no version"},
	}
	if noRoom.Section != "" {
		cases = append(cases, struct {
			name, method, path string
			body               any
			code               int
			says               string
		}{"room for a no-room section", "POST", "/api/move", moveRequest{Version: 1, Section: noRoom.Section, Meeting: noRoom.Meeting, Period: 0, Room: room(d.term.Rooms[0].ID)}, 400, "takes no room"})
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			var e apiError
			assert.Equal(t, c.code, d.call(t, c.method, c.path, c.body, &e))
			assert.Contains(t, e.Error, c.says)
			assert.NotContains(t, e.Error, "\n", "one sentence")
		})
	}
	st := d.state(t)
	assert.Equal(t, 1, st.Version, "no bad request changed anything")
	for i, mj := range st.Meetings {
		assert.Equal(t, d.sched.Placements[i].Period, mj.Period)
	}
}

// TestRefusedOrigins: requests under another Host name (DNS rebinding,
// OWASP "DNS rebinding" guidance) and form posts that are not JSON (a
// cross-site form; OWASP CSRF Prevention Cheat Sheet) are refused.
func TestRefusedOrigins(t *testing.T) {
	d := newDemo(t)
	req, _ := http.NewRequest("GET", d.ts.URL+"/api/state", nil)
	req.Host = "attacker.example:80"
	resp, err := http.DefaultClient.Do(req)
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusForbidden, resp.StatusCode)

	resp, err = http.Post(d.ts.URL+"/api/save", "application/x-www-form-urlencoded", strings.NewReader("version=1"))
	require.NoError(t, err)
	resp.Body.Close()
	assert.Equal(t, http.StatusUnsupportedMediaType, resp.StatusCode)
	files, _ := filepath.Glob(filepath.Join(d.dir, "*.xlsx"))
	assert.Len(t, files, 1, "nothing saved")

	for _, h := range []string{"localhost:1", "127.0.0.1", "[::1]:8080"} {
		assert.True(t, d.srv.allowedHost(h), h)
	}
	assert.False(t, d.srv.allowedHost("192.0.2.1:8080"))
}

func TestSaveAndCompare(t *testing.T) {
	d := newDemo(t)
	m, legal, _, staff := d.legalAndIllegal(t)
	// Someone else's file already holds the first free name: it is kept.
	taken := filepath.Join(d.dir, "autumn-2.xlsx")
	require.NoError(t, os.WriteFile(taken, []byte("not ours"), 0o644))
	orig, err := os.ReadFile(d.source)
	require.NoError(t, err)

	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: legal}, &res))
	var sr saveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/save", versionRequest{Version: 2}, &sr))
	assert.Equal(t, "autumn-3.xlsx", sr.Saved.File)
	assert.Equal(t, 2, sr.Saved.ID)
	assert.Len(t, sr.Versions, 2)
	data, _ := os.ReadFile(taken)
	assert.Equal(t, "not ours", string(data), "an existing file is never replaced")
	now, _ := os.ReadFile(d.source)
	assert.Equal(t, orig, now, "the timetable the server started from is unchanged")

	// The saved workbook reads back as the edited timetable and passes Check.
	saved, ps, err := timetable.ReadSchedule(filepath.Join(d.dir, "autumn-3.xlsx"), d.term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, saved)))
	for _, p := range saved.Placements {
		if p.Section == m.Section && p.Meeting == m.Meeting {
			assert.Equal(t, legal, p.Period)
		}
	}
	var sr2 saveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/save", versionRequest{Version: 2}, &sr2))
	assert.Equal(t, "autumn-4.xlsx", sr2.Saved.File, "saving again makes another version")

	var c compareJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/compare?old=1&new=2", nil, &c))
	assert.Equal(t, 1, c.Moved)
	assert.Equal(t, len(d.sched.Placements)-1, c.Same)
	var kinds []string
	found := false
	for _, a := range c.Affected {
		kinds = append(kinds, a.Kind)
		if a.Kind == timetable.SubjectStaff && a.ID == staff {
			found = true
			require.Len(t, a.Changes, 1)
			assert.Equal(t, m.Section, a.Changes[0].Section)
			assert.Equal(t, timetable.ChangeMoved, a.Changes[0].Change)
			assert.True(t, strings.HasPrefix(a.Changes[0].From, d.term.Periods[m.Period].Label()), a.Changes[0].From)
			assert.True(t, strings.HasPrefix(a.Changes[0].To, d.term.Periods[legal].Label()), a.Changes[0].To)
		}
	}
	assert.True(t, found, "the staff member of the moved meeting is affected")
	assert.Contains(t, kinds, timetable.SubjectCohort)
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/compare?old=2&new=current", nil, &c))
	assert.Zero(t, c.Moved+c.Added+c.Dropped)
	assert.Empty(t, c.Affected)

	var vs struct {
		Versions []savedVersion `json:"versions"`
		Current  int            `json:"current"`
	}
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/versions", nil, &vs))
	assert.Len(t, vs.Versions, 3)
	assert.Equal(t, 2, vs.Current)
}

func TestNewRefuses(t *testing.T) {
	_, err := New(Options{})
	assert.Error(t, err)
	d := newDemo(t)
	_, err = New(Options{Term: d.term, Schedule: d.sched})
	assert.ErrorContains(t, err, "folder")
}
