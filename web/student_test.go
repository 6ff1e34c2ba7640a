package web

import (
	"net/http"
	"strings"
	"testing"

	"github.com/chromedp/chromedp"
	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/timetable"
)

// studentTutorial is the tutorial student st is sectioned in.
func studentTutorial(t *testing.T, s *timetable.Schedule, st string) string {
	t.Helper()
	for _, e := range s.Enrolments {
		if e.Student == st && e.Section != "STA100-L" {
			return e.Section
		}
	}
	t.Fatalf("student %s has no tutorial", st)
	return ""
}

// TestStudentExplain asks /api/student about S1 on the sectioned term
// (four students, two tutorials of limit 2, so each tutorial holds two):
// on the planned timetable S1 fits, with the main class and a tutorial at
// different periods. After S1's tutorial is forced onto the main class's
// period, S1 cannot get the course: its tutorial clashes with the main
// class and the other tutorial holds its limit of two other students,
// worked out by hand; timetable.Check (independent of the explanation)
// reports S1's clash too. An unknown student is a 404, no ID a 400.
func TestStudentExplain(t *testing.T) {
	d := sectionedFixture(t)
	var a studentJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/student?id=S1", nil, &a))
	require.Equal(t, encode.StudentFits, a.Status)
	assert.Equal(t, 1, a.Version)
	assert.Equal(t, 1, a.AllRequests)
	require.Len(t, a.Choice, 2)
	assert.Equal(t, "STA100-L", a.Choice[0].Section)
	assert.NotEqual(t, a.Choice[0].When, a.Choice[1].When, "the main class and the tutorial meet at different times")

	cur := d.current(t)
	tut := studentTutorial(t, cur, "S1")
	other := "STA100-T1"
	if tut == other {
		other = "STA100-T2"
	}
	main, ok := placementOf(cur, "STA100-L", 1)
	require.True(t, ok)
	busy := map[string]bool{}
	for _, p := range cur.Placements {
		if p.Period == main.Period {
			busy[p.Room] = true
		}
	}
	room := ""
	for _, r := range d.term.Rooms {
		if !busy[r.ID] {
			room = r.ID
			break
		}
	}
	require.NotEmpty(t, room, "a room free at the main class's period")
	var moved moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: tut, Meeting: 1, Period: main.Period, Room: &room, Force: true}, &moved))
	require.True(t, moved.Applied, "%+v", moved)
	clashNamed := false
	for _, v := range timetable.Check(d.term, d.current(t)) {
		if v.Rule == timetable.RuleStudentClash && strings.Contains(v.Msg, "S1") {
			clashNamed = true
		}
	}
	require.True(t, clashNamed, "timetable.Check sees S1's clash")

	a = studentJSON{}
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/student?id=S1", nil, &a))
	require.Equal(t, encode.StudentClashes, a.Status)
	assert.Equal(t, 2, a.Version, "the answer is for the version after the move")
	require.Len(t, a.Clashes, 1)
	assert.ElementsMatch(t, []string{"STA100-L", tut}, []string{a.Clashes[0].A.Section, a.Clashes[0].B.Section})
	require.Len(t, a.Full, 1)
	assert.Equal(t, other, a.Full[0].Section.Section)
	assert.Equal(t, 2, a.Full[0].Held)
	assert.Equal(t, 2, a.Full[0].Limit)

	var e map[string]string
	assert.Equal(t, http.StatusNotFound, d.call(t, "GET", "/api/student?id=S9", nil, &e))
	assert.Contains(t, e["error"], `student "S9" has no row on the Course requests or Enrolments sheets`)
	assert.Equal(t, http.StatusBadRequest, d.call(t, "GET", "/api/student", nil, nil))
}

// TestBrowserStudentExplain opens S1's week on the sectioned term and asks
// the page whether S1 gets every requested course: yes, with the main
// class among the sections listed.
func TestBrowserStudentExplain(t *testing.T) {
	exe := chromium(t)
	d := sectionedFixture(t)
	b := newBrowser(t, exe)
	require.NoError(t, chromedp.Do(b.ctx,
		chromedp.Navigate(d.ts.URL+"/?find=S1"),
		chromedp.WaitVisible(`#master tbody tr`),
		chromedp.Click(`#matches button[data-kind="student"][data-id="S1"]`),
		chromedp.WaitVisible(`#student-why`),
		chromedp.Click(`#student-why`),
		chromedp.WaitVisible(`#student-choice li`),
	))
	out := b.text(`#student-out`)
	b.shot("s1-student-why")
	assert.Contains(t, out, "Yes. Student S1 can get all 1 requested course without a clash on this version (edit 1)")
	assert.Contains(t, out, "STA100-L (")
}
