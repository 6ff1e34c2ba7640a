package encode

import (
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

func TestParseAt(t *testing.T) {
	cases := []struct {
		in    string
		day   time.Weekday
		start timetable.Clock
		err   string
	}{
		{"Tue 10:00", time.Tuesday, 600, ""},
		{"tuesday 9:30", time.Tuesday, 570, ""},
		{"  MON   08.15 ", time.Monday, 495, ""},
		{"Sun 23:59", time.Sunday, 23*60 + 59, ""},
		{"Tue", 0, 0, "not a day and a time"},
		{"Tue 10:00 extra", 0, 0, "not a day and a time"},
		{"Tu 10:00", 0, 0, "day name"},
		{"Tue 24:00", 0, 0, "24-hour time"},
		{"Tue 10:60", 0, 0, "24-hour time"},
		{"Tue 10", 0, 0, "24-hour time"},
		{"Tue +1:00", 0, 0, "24-hour time"},
		{"Tue 100:00", 0, 0, "24-hour time"},
	}
	for _, tc := range cases {
		t.Run(tc.in, func(t *testing.T) {
			d, c, err := ParseAt(tc.in)
			if tc.err != "" {
				require.Error(t, err)
				assert.Contains(t, err.Error(), tc.err)
				return
			}
			require.NoError(t, err)
			assert.Equal(t, tc.day, d)
			assert.Equal(t, tc.start, c)
		})
	}
}

// TestRequestsOf: rows of a requests sheet become requests with their
// rows; every At that cannot be read is an error at its cell, and then
// there are no requests.
func TestRequestsOf(t *testing.T) {
	rows, ps, err := timetable.ParseRequests([]byte("Section,At,Room\nBIO-101,Tue 10:00,L2\nCHE-200,wed 9.30,\n"), "Requests.csv")
	require.NoError(t, err)
	require.Empty(t, ps)
	reqs, ps := RequestsOf(rows)
	require.Empty(t, ps)
	assert.Equal(t, []Request{
		{Section: "BIO-101", Day: time.Tuesday, Start: 600, Room: "L2", Src: timetable.Source{Sheet: "Requests", Row: 2}},
		{Section: "CHE-200", Day: time.Wednesday, Start: 570, Src: timetable.Source{Sheet: "Requests", Row: 3}},
	}, reqs)

	rows, ps, err = timetable.ParseRequests([]byte("Room,At,Section\n,Tuesday,X\n,Tue 10:00,Y\n,Xyz 10:00,Z\n"), "asks.csv")
	require.NoError(t, err)
	require.Empty(t, ps)
	reqs, ps = RequestsOf(rows)
	assert.Nil(t, reqs)
	require.Len(t, ps, 2)
	assert.True(t, strings.HasPrefix(ps[0].String(), "asks!B2: At: "), ps[0].String())
	assert.True(t, strings.HasPrefix(ps[1].String(), "asks!B4: At: "), ps[1].String())
}

// FuzzParseAt: a time that reads prints back ("Tue 10:00") and reads the
// same again.
func FuzzParseAt(f *testing.F) {
	for _, s := range []string{"Tue 10:00", "monday 9:30", "Fri 23.59", "x", "Sun 00:00", "Wed 7:5"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, in string) {
		d, c, err := ParseAt(in)
		if err != nil {
			return
		}
		r := Request{Day: d, Start: c}
		d2, c2, err := ParseAt(r.At())
		if err != nil || d2 != d || c2 != c {
			t.Fatalf("%q reads as %s, which reads back as %v %v (%v)", in, r.At(), d2, c2, err)
		}
	})
}
