package web

import (
	"context"
	"net/http"
	"net/http/httptest"
	"path/filepath"
	"sort"
	"testing"
	"time"

	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/timetable"
)

// sectionedFixture is a small grid term in which students S1..S4 ask for
// STA100 (a main class and two tutorials of limit 2 that belong to it), with
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
	term.Sections = []timetable.Section{sec("STA100-L", "P1", "Main", "", 5), sec("STA100-T1", "P2", "Tutorial", "STA100-L", 2), sec("STA100-T2", "P3", "Tutorial", "STA100-L", 2)}
	for _, st := range []string{"S1", "S2", "S3", "S4"} {
		term.Requests = append(term.Requests, timetable.Request{Student: st, Course: "STA100"})
	}
	require.Empty(t, timetable.Validate(term).Errors())
	// No deadline: Plan runs its default rounds and stops (with one it
	// would go on with more rounds while time is left).
	res, err := planning.Plan(context.Background(), term, planning.Options{})
	require.NoError(t, err)
	require.NotNil(t, res.Schedule)
	require.Len(t, res.Schedule.Enrolments, 8, "four students, a main class and a tutorial each")
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
// shows the main class and their one tutorial, taken from the timetable's
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

// TestSectionedCompareAndNotices saves the sectioned timetable, swaps two
// students between the tutorials (both stay within the limits), and
// compares the saved version with the current one: no meeting moved, the
// two students are affected with their change of section, and their
// notices say which tutorial they are in now. The saved workbook holds the
// class lists: it reads back with the same sectioned students.
func TestSectionedCompareAndNotices(t *testing.T) {
	d := sectionedFixture(t)
	var sr saveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/save", versionRequest{Version: 1}, &sr))
	saved, ps, err := timetable.ReadSchedule(filepath.Join(d.dir, sr.Saved.File), d.term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.ElementsMatch(t, d.sched.Enrolments, stripEnrolmentSrc(saved.Enrolments))

	in := map[string]string{} // tutorial of each student
	d.srv.mu.Lock()
	for _, e := range d.srv.cur.Enrolments {
		if e.Section != "STA100-L" {
			in[e.Student] = e.Section
		}
	}
	var a, b string // a student of T1 and one of T2
	for st, sec := range in {
		if sec == "STA100-T1" && (a == "" || st < a) {
			a = st
		}
		if sec == "STA100-T2" && (b == "" || st < b) {
			b = st
		}
	}
	for i, e := range d.srv.cur.Enrolments {
		switch {
		case e.Student == a && e.Section == "STA100-T1":
			d.srv.cur.Enrolments[i].Section = "STA100-T2"
		case e.Student == b && e.Section == "STA100-T2":
			d.srv.cur.Enrolments[i].Section = "STA100-T1"
		}
	}
	d.srv.mu.Unlock()
	require.NotEmpty(t, a)
	require.NotEmpty(t, b)

	var c compareJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/compare?old=1&new=current", nil, &c))
	assert.Equal(t, 0, c.Moved)
	require.Len(t, c.Students, 2)
	var ids []string
	for _, af := range c.Affected {
		ids = append(ids, af.ID)
		assert.Equal(t, timetable.SubjectStudent, af.Kind)
		require.Len(t, af.Sections, 1)
		assert.Equal(t, "Tutorial", af.Sections[0].Part)
		assert.NotNil(t, af.Changes, "an empty list, not null, for the page")
	}
	assert.Equal(t, []string{a, b}, sortedCopy(ids))

	var n noticesJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/notices?old=1&new=current", nil, &n))
	require.Len(t, n.Notices, 2)
	for _, nj := range n.Notices {
		assert.Equal(t, 1, nj.Changes)
		want := "STA100 Tutorial: your section is now STA100-T2 instead of STA100-T1"
		if nj.ID == b {
			want = "STA100 Tutorial: your section is now STA100-T1 instead of STA100-T2"
		}
		assert.Contains(t, nj.Text, want)
	}
}

func stripEnrolmentSrc(es []timetable.Enrolment) []timetable.Enrolment {
	out := make([]timetable.Enrolment, len(es))
	for i, e := range es {
		out[i] = timetable.Enrolment{Student: e.Student, Section: e.Section}
	}
	return out
}

func sortedCopy(xs []string) []string {
	out := append([]string(nil), xs...)
	sort.Strings(out)
	return out
}
