package sectioning

import (
	"context"
	"testing"

	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// TestUnplacedReasons checks the one-sentence reason of each kind of
// unmet request on small hand-made terms.
func TestUnplacedReasons(t *testing.T) {
	sec := func(id, course, part, parent string, limit int) timetable.Section {
		return timetable.Section{ID: id, Course: course, Part: part, Parent: parent, Limit: limit, Meetings: 1, Length: 1, NoRoom: true, Weeks: 1}
	}
	cases := []struct {
		name     string
		sections []timetable.Section
		fixed    []timetable.Enrolment
		requests []timetable.Request
		want     string // reason of the last request
	}{
		{"unknown course", []timetable.Section{sec("A-1", "A", "", "", 5)},
			nil, []timetable.Request{{Student: "s", Course: "Z"}},
			"Course Z is not offered (no section teaches it)."},
		{"full one-part course", []timetable.Section{sec("A-1", "A", "", "", 1)},
			nil, []timetable.Request{{Student: "s", Course: "A"}, {Student: "t", Course: "A"}},
			"Course A is full (every section has reached its limit)."},
		{"full part", []timetable.Section{sec("A-L", "A", "Main", "", 5), sec("A-P", "A", "Lab", "", 1)},
			nil, []timetable.Request{{Student: "s", Course: "A"}, {Student: "t", Course: "A"}},
			"Course A has no place: every section of part Lab has reached its limit."},
		{"parents", []timetable.Section{sec("A-L1", "A", "Main", "", 1), sec("A-L2", "A", "Main", "", 1),
			sec("A-P1", "A", "Lab", "A-L1", 1), sec("A-P2", "A", "Lab", "A-L1", 1)},
			nil, []timetable.Request{{Student: "s", Course: "A"}, {Student: "t", Course: "A"}},
			"Course A has no combination of sections with room that keeps each section with its parent section."},
		{"alternative full too", []timetable.Section{sec("A-1", "A", "", "", 1), sec("B-1", "B", "", "", 1)},
			nil, []timetable.Request{{Student: "s", Course: "A", Priority: 1}, {Student: "t", Course: "B", Priority: 1}, {Student: "u", Course: "A", Alternatives: []string{"B"}, Priority: 2}},
			"Course A is full (every section has reached its limit); alternative B is full (every section has reached its limit)."},
		{"asked twice", []timetable.Section{sec("A-1", "A", "", "", 5)},
			nil, []timetable.Request{{Student: "s", Course: "A"}, {Student: "s", Course: "A"}},
			"Course A is already the student's through another request."},
		{"fixed elsewhere", []timetable.Section{sec("A-L1", "A", "Main", "", 5), sec("A-P1", "A", "Lab", "A-L1", 5),
			sec("A-L2", "A", "Main", "", 5)},
			[]timetable.Enrolment{{Student: "s", Section: "A-L2"}}, []timetable.Request{{Student: "s", Course: "A"}},
			"Course A cannot be completed around the student's fixed sections in it (a part is full or a parent link cannot be met)."},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			term := &timetable.Term{Periods: []timetable.Period{{Day: 1, Start: 540, End: 600}}, Sections: tc.sections,
				Enrolments: tc.fixed, Requests: tc.requests}
			s := &timetable.Schedule{}
			for _, sc := range tc.sections {
				s.Placements = append(s.Placements, timetable.Placement{Section: sc.ID, Meeting: 1, Period: 0})
			}
			res, err := Section(context.Background(), term, s, Options{})
			require.NoError(t, err)
			require.NotEmpty(t, res.Unplaced)
			last := res.Unplaced[len(res.Unplaced)-1]
			require.Equal(t, len(tc.requests)-1, last.Request)
			require.Equal(t, tc.want, last.Reason)
			require.Empty(t, allSeatingErrors(term, s, res))
		})
	}
}
