package web

import (
	"fmt"
	"net/http"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestWhyNot asks for a section at a time its staff member is unavailable
// (a hard Unavailable row of the demo workbook): refused, with that row
// among the reasons and other places, none of them in the unavailable
// time. The section at its own place is granted (the timetable proves it).
func TestWhyNot(t *testing.T) {
	if testing.Short() {
		t.Skip("runs the explanation engine")
	}
	d := newDemo(t)
	var u timetable.Unavailability
	var sec timetable.Section
	per := -1
	for _, x := range d.term.Unavailable {
		if !x.Hard || x.Kind != timetable.WhoStaff {
			continue
		}
		for _, s := range d.term.Sections {
			if contains(s.Staff, x.Who) && len(s.Fixed) == 0 && s.Length == 1 {
				for i, p := range d.term.Periods {
					if x.Covers(p) {
						u, sec, per = x, s, i
						break
					}
				}
			}
			if per >= 0 {
				break
			}
		}
		if per >= 0 {
			break
		}
	}
	require.GreaterOrEqual(t, per, 0, "the demo has a hard staff unavailability")

	var a whyNotJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", fmt.Sprintf("/api/whynot?section=%s&period=%d", sec.ID, per), nil, &a))
	assert.False(t, a.Granted)
	require.NotEmpty(t, a.Reasons)
	var where []string
	for _, r := range a.Reasons {
		where = append(where, r.Where)
	}
	assert.Contains(t, strings.Join(where, "; "), "Unavailable row "+strconv.Itoa(u.Src.Row), "the staff member's Unavailable row is a reason")
	assert.NotEmpty(t, a.Places)
	for _, p := range a.Places {
		assert.False(t, u.Covers(d.term.Periods[p.Period]), "no other place is in the unavailable time: %s", p.At)
	}

	var cur timetable.Placement
	for _, p := range d.sched.Placements {
		if p.Section == sec.ID {
			cur = p
		}
	}
	var g whyNotJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", fmt.Sprintf("/api/whynot?section=%s&period=%d", sec.ID, cur.Period), nil, &g))
	assert.True(t, g.Granted, "the timetable itself has the section there")
	assert.Empty(t, g.Reasons)

	for _, c := range []struct{ q, says string }{
		{"section=NOPE&period=0", "no section"},
		{"section=" + sec.ID + "&period=x", "not in the term's grid"},
		{"section=" + sec.ID + "&period=9999", "not in the term's grid"},
		{"section=" + sec.ID + "&period=0&room=NOPE", "no room"},
	} {
		var e apiError
		assert.Equal(t, http.StatusBadRequest, d.call(t, "GET", "/api/whynot?"+c.q, nil, &e), c.q)
		assert.Contains(t, e.Error, c.says, c.q)
	}
}
