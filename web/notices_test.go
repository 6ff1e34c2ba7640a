package web

import (
	"io"
	"net/http"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func (d *demoFixture) raw(t *testing.T, path string) (*http.Response, string) {
	t.Helper()
	resp, err := http.Get(d.ts.URL + path)
	require.NoError(t, err)
	defer resp.Body.Close()
	b, err := io.ReadAll(resp.Body)
	require.NoError(t, err)
	return resp, string(b)
}

// TestNotices moves a meeting legally and asks for the change notices
// between the loaded version and the current one: the staff of the moved
// section get a text naming the section, its old and new day and time,
// and a calendar that is an iCalendar object (RFC 5545 §3.4 BEGIN:VCALENDAR,
// §3.1 CRLF line ends and lines of at most 75 octets) sent as an
// attachment (RFC 6266 Content-Disposition).
func TestNotices(t *testing.T) {
	d := newDemo(t)
	m, legal, _, staff := d.legalAndIllegal(t)
	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: legal}, &res))
	require.True(t, res.Applied)

	var n noticesJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/notices?old=1&new=current", nil, &n))
	var mine *noticeJSON
	for i := range n.Notices {
		assert.NotEqual(t, timetable.SubjectRoom, n.Notices[i].Kind, "rooms get no notice")
		if n.Notices[i].Kind == timetable.SubjectStaff && n.Notices[i].ID == staff {
			mine = &n.Notices[i]
		}
	}
	require.NotNil(t, mine, "staff %s is told", staff)
	oldP, newP := d.term.Periods[m.Period], d.term.Periods[legal]
	assert.Contains(t, mine.Text, "Subject: Timetable change")
	assert.Contains(t, mine.Text, m.Section)
	assert.Contains(t, mine.Text, "was: "+oldP.Day.String()+"s "+oldP.Start.String())
	assert.Contains(t, mine.Text, "now: "+newP.Day.String()+"s "+newP.Start.String())
	assert.Contains(t, mine.Text, mine.File, "the text names the calendar file")
	assert.True(t, strings.HasSuffix(mine.File, ".ics"))

	resp, body := d.raw(t, mine.Calendar)
	require.Equal(t, http.StatusOK, resp.StatusCode, body)
	assert.Contains(t, resp.Header.Get("Content-Type"), "text/calendar")
	assert.Equal(t, `attachment; filename=`+mine.File, resp.Header.Get("Content-Disposition"))
	assert.True(t, strings.HasPrefix(body, "BEGIN:VCALENDAR\r\n"))
	for _, line := range strings.SplitAfter(strings.TrimSuffix(body, "\r\n"), "\r\n") {
		assert.LessOrEqual(t, len(strings.TrimSuffix(line, "\r\n")), 75, "RFC 5545 §3.1 line length")
		assert.False(t, strings.Contains(strings.TrimSuffix(line, "\r\n"), "\n"), "RFC 5545 §3.1: CRLF only")
	}
	assert.Contains(t, body, "SUMMARY:"+m.Section)
}

func TestNoticesBad(t *testing.T) {
	d := newDemo(t)
	m, _, clash, _ := d.legalAndIllegal(t)
	for _, c := range []struct {
		name, path string
		code       int
		want       string
	}{
		{"unknown old", "/api/notices?old=9&new=current", http.StatusBadRequest, "old: there is no version"},
		{"no new", "/api/notices?old=1", http.StatusBadRequest, "new: there is no version"},
		{"calendar not affected", "/api/notices/calendar?old=1&new=current&kind=staff&id=nobody", http.StatusNotFound, "not affected"},
	} {
		t.Run(c.name, func(t *testing.T) {
			var e apiError
			require.Equal(t, c.code, d.call(t, "GET", c.path, nil, &e))
			assert.Contains(t, e.Error, c.want)
		})
	}
	// A version that breaks a hard requirement gets no notices (as notify).
	var res moveResult
	require.Equal(t, http.StatusOK, d.call(t, "POST", "/api/move", moveRequest{Version: 1, Section: m.Section, Meeting: m.Meeting, Period: clash, Force: true}, &res))
	var e apiError
	require.Equal(t, http.StatusConflict, d.call(t, "GET", "/api/notices?old=1&new=current", nil, &e))
	assert.Contains(t, e.Error, "breaks 1 hard requirement ")
	require.Equal(t, http.StatusConflict, d.call(t, "GET", "/api/notices/calendar?old=1&new=current&kind=staff&id=x", nil, &e))
}
