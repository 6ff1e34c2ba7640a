package encode

import (
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestRequestsCSVPatterns: a requests file names meeting times as the
// Meeting times sheet writes days ("Mon Wed Fri 9:00") or by one day and
// start; a bad time is reported at its cell.
func TestRequestsCSVPatterns(t *testing.T) {
	rows, ps, err := timetable.ParseRequests([]byte("Section,At,Room\nA,Mon Wed Fri 9:00,R1\nB,Tue 10:30,\n"), "Requests.csv")
	require.NoError(t, err)
	require.Empty(t, ps)
	reqs, ps := RequestsOf(rows)
	require.Empty(t, ps)
	require.Len(t, reqs, 2)
	assert.Equal(t, timetable.DaysOf(time.Monday, time.Wednesday, time.Friday), reqs[0].Days)
	assert.Equal(t, time.Monday, reqs[0].Day)
	assert.Equal(t, timetable.Clock(9*60), reqs[0].Start)
	assert.Equal(t, "Mon Wed Fri 09:00", reqs[0].At())
	assert.Equal(t, timetable.DaySet(0), reqs[1].Days)
	assert.Equal(t, "Tue 10:30", reqs[1].At())

	rows, _, err = timetable.ParseRequests([]byte("Section,At\nA,Mon Wed 9:00\nA,Mon Wed 25:00\n"), "Requests.csv")
	require.NoError(t, err)
	_, ps = RequestsOf(rows)
	require.Len(t, ps, 1)
	assert.Contains(t, ps[0].String(), "Requests!B3: At:")
}

// TestMatchTimes: which meeting times a request names (request.go's
// contract), on a section with Mon Wed 09:00, Mon 09:00 and Mon Wed 10:00.
func TestMatchTimes(t *testing.T) {
	sec := &timetable.Section{ID: "A", Times: []timetable.TimeChoice{
		{Days: dMonWe, Start: 9 * 60, Minutes: 50},
		{Days: dMon, Start: 9 * 60, Minutes: 50},
		{Days: dMonWe, Start: 10 * 60, Minutes: 50},
	}}
	for _, c := range []struct {
		when string
		time int
		want []int
		msg  string
	}{
		{when: "Mon Wed 9:00", want: []int{0}},
		{when: "Mon 9:00", want: []int{0, 1}},
		{when: "Wed 10:00", want: []int{2}},
		{when: "Mon Wed Fri 9:00", msg: "no meeting time of section A meets on exactly Mon Wed Fri at 09:00 — its meeting times are Mon Wed 09:00, Mon 09:00, Mon Wed 10:00"},
		{when: "Tue 9:00", msg: "no meeting time of section A meets on Tue at 09:00"},
		{when: "Mon 9:00", time: 3, want: []int{2}},
		{when: "Mon 9:00", time: 4, msg: "section A has 3 meeting times, not 4"},
	} {
		r, err := NewRequest("A", c.when, "")
		require.NoError(t, err)
		r.Time = c.time
		got, msg := matchTimes(sec, r)
		assert.Equal(t, c.want, got, c.when)
		if c.msg == "" {
			assert.Empty(t, msg)
		} else {
			assert.Contains(t, msg, c.msg)
		}
	}
}
