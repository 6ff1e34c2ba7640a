package web

import (
	"net/http"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestWhereElseFull asks where else a meeting could go. Checked by brute
// force with timetable.Check: every start where the meeting alone can
// move in this timetable (a timetable that proves the place) is in the
// list and marked "alone"; every place marked alone really is legal
// alone; the meeting's own start is not listed; and a place that needs
// other meetings to move is confirmed by a re-plan with it fixed there.
func TestWhereElseFull(t *testing.T) {
	d := newDemo(t)
	m, _, _, _ := d.legalAndIllegal(t)
	var j jobJSON
	require.Equal(t, http.StatusAccepted, d.call(t, "POST", "/api/whereelse", whereElseRequest{Section: m.Section, Meeting: m.Meeting}, &j))
	r := jobResult[whereElseJSON](t, d.waitJob(t, j.ID))
	require.True(t, r.Complete)
	at := map[int]whereJSON{}
	for _, p := range r.Places {
		assert.NotEqual(t, m.Period, p.Period, "the meeting's own start is not another place")
		at[p.Period] = p
	}
	idx := -1
	for i, p := range d.sched.Placements {
		if p.Section == m.Section && p.Meeting == m.Meeting {
			idx = i
		}
	}
	before := len(timetable.HardViolations(timetable.Check(d.term, d.sched)))
	require.Zero(t, before)
	alone := 0
	for per := range d.term.Periods {
		if per == m.Period {
			continue
		}
		next := cloneSchedule(d.sched)
		next.Placements[idx].Period = per
		if len(timetable.HardViolations(timetable.Check(d.term, next))) > 0 {
			continue
		}
		alone++
		p, ok := at[per]
		if assert.True(t, ok, "%s works alone, so it is a place", d.term.Periods[per].Label()) {
			assert.True(t, p.Alone, "%s is marked alone", p.At)
		}
	}
	require.NotZero(t, alone, "the fixture has a legal lone move")
	t.Logf("%d places, %d of them alone", len(r.Places), alone)
	var other *whereJSON
	for _, p := range r.Places {
		if p.Alone {
			next := cloneSchedule(d.sched)
			next.Placements[idx].Period, next.Placements[idx].Room = p.Period, p.Room
			assert.Empty(t, timetable.HardViolations(timetable.Check(d.term, next)), "%s in %s alone breaks nothing", p.At, p.Room)
		} else if other == nil {
			other = &p
			assert.NotEmpty(t, p.Reason)
		}
	}
	if other != nil {
		rr := jobResult[replanJSON](t, d.replanFound(t, replanRequest{Version: 1, Place: &placeSpec{m.Section, m.Meeting, other.Period}}))
		assert.Equal(t, "found", rr.Status, "%s needs other moves, and a timetable has it there", other.At)
	}
}

func TestWhereElseBad(t *testing.T) {
	d := newDemo(t)
	for _, c := range []struct {
		name string
		body any
		code int
		want string
	}{
		{"unknown section", whereElseRequest{Section: "NOPE", Meeting: 1}, http.StatusBadRequest, `no section "NOPE"`},
		{"unknown meeting", whereElseRequest{Section: d.sched.Placements[0].Section, Meeting: 50}, http.StatusBadRequest, "has no meeting 50"},
		{"bad body", `{"section":1}`, http.StatusBadRequest, "not the JSON"},
		{"empty", ``, http.StatusBadRequest, "empty"},
	} {
		t.Run(c.name, func(t *testing.T) {
			var e apiError
			require.Equal(t, c.code, d.call(t, "POST", "/api/whereelse", c.body, &e))
			assert.Contains(t, e.Error, c.want)
		})
	}
}
