package web

import (
	"context"
	"net/http"
	"net/http/httptest"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/timetable"
)

// sectionedFixture is a small grid term in which students S1..S4 ask for
// STA100 (a lecture and two tutorials of limit 2 that belong to it), with
// a timetable from planning.Plan, and a server over both.
func sectionedFixture(t *testing.T) *demoFixture {
	t.Helper()
	term := &timetable.Term{
		Name:     "Sectioned",
		FirstDay: time.Date(2027, 9, 6, 0, 0, 0, 0, time.UTC),
		LastDay:  time.Date(2027, 9, 24, 0, 0, 0, 0, time.UTC),
		TimeZone: "UTC",
		Rooms:    []timetable.Room{{ID: "R1", Capacity: 30}, {ID: "R2", Capacity: 30}, {ID: "R3", Capacity: 30}},
		Staff:    []timetable.Staff{{ID: "P1"}, {ID: "P2"}, {ID: "P3"}},
	}
	for k := 0; k < 4; k++ {
		start := timetable.Clock(9*60 + 60*k)
		term.Periods = append(term.Periods, timetable.Period{Index: k, Day: time.Monday, Start: start, End: start + 60})
	}
	sec := func(id, staff, part, parent string, limit int) timetable.Section {
		return timetable.Section{ID: id, Title: "Statistics " + part, Staff: []string{staff}, Size: 10, Meetings: 1, Length: 1,
			Weeks: term.AllWeeks(), Course: "STA100", Part: part, Parent: parent, Limit: limit}
	}
	term.Sections = []timetable.Section{sec("STA100-L", "P1", "Lecture", "", 5), sec("STA100-T1", "P2", "Tutorial", "STA100-L", 2), sec("STA100-T2", "P3", "Tutorial", "STA100-L", 2)}
	for _, st := range []string{"S1", "S2", "S3", "S4"} {
		term.Requests = append(term.Requests, timetable.Request{Student: st, Course: "STA100"})
	}
	require.Empty(t, timetable.Validate(term).Errors())
	ctx, cancel := context.WithTimeout(context.Background(), time.Minute)
	defer cancel()
	res, err := planning.Plan(ctx, term, planning.Options{})
	require.NoError(t, err)
	require.NotNil(t, res.Schedule)
	require.Len(t, res.Schedule.Enrolments, 8, "four students, a lecture and a tutorial each")
	dir := t.TempDir()
	srv, err := New(Options{Term: term, Schedule: res.Schedule, OutDir: dir, BaseName: "sectioned",
		Now: func() time.Time { return time.Date(2027, 9, 1, 10, 0, 0, 0, time.UTC) }})
	require.NoError(t, err)
	ts := httptest.NewServer(srv)
	t.Cleanup(ts.Close)
	return &demoFixture{term: term, sched: res.Schedule, dir: dir, srv: srv, ts: ts}
}

// TestSectionedStateAndReplan serves a term whose students are sectioned:
// the state lists every sectioned student with their two sections (the
// page's student grids draw from it), a re-plan on the term finds a
// timetable with its students seated again, and keeping it gives a state
// that passes timetable.Check (its seating rule included) and still lists
// the four students.
func TestSectionedStateAndReplan(t *testing.T) {
	d := sectionedFixture(t)
	st := d.state(t)
	require.Len(t, st.Students, 4)
	for _, s := range st.Students {
		secs := st.Enrolled[s.ID]
		assert.Len(t, secs, 2, s.ID)
		assert.Contains(t, secs, "STA100-L", s.ID)
	}
	assert.Empty(t, st.Hard)

	j := d.replanFound(t, replanRequest{Version: st.Version})
	r := jobResult[replanJSON](t, j)
	require.Equal(t, "found", r.Status, "notes: %v", r.Notes)
	var kept stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/replan/decide", decideRequest{Version: st.Version, Job: j.ID, Keep: true}, &kept))
	assert.Empty(t, kept.Hard)
	cur := d.current(t)
	assert.Len(t, cur.Enrolments, 8, "the re-planned timetable seats the students again")
	assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, cur)))
	assert.Len(t, kept.Students, 4)
}

// TestBrowserSectionedStudent opens the page on the sectioned term and
// finds a sectioned student (who is on no Enrolments sheet): their week
// shows the lecture and their one tutorial, taken from the timetable's
// sectioned students.
func TestBrowserSectionedStudent(t *testing.T) {
	exe := chromium(t)
	d := sectionedFixture(t)
	var tutorial string
	for _, e := range d.sched.Enrolments {
		if e.Student == "S1" && e.Section != "STA100-L" {
			tutorial = e.Section
		}
	}
	require.NotEmpty(t, tutorial)
	b := newBrowser(t, exe)
	require.NoError(t, chromedp.Do(b.ctx,
		chromedp.Navigate(d.ts.URL+"/?find=S1"),
		chromedp.WaitVisible(`#master tbody tr`),
		chromedp.Click(`#matches button[data-kind="student"][data-id="S1"]`),
		chromedp.WaitVisible(`#grid`),
	))
	shown := b.eval(`[...new Set([...document.querySelectorAll("#grid button.mtg")].map((x) => x.dataset.section))].sort().join(" ")`)
	assert.Equal(t, "STA100-L "+tutorial, shown)
	b.shot("s1-sectioned-student")
}
