package benchfmt

import (
	"bytes"
	"math/rand/v2"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// randomSchedule places every section of a mapped term at a random listed
// time and room (valid-ish: clashes are left to chance).
func randomSchedule(term *timetable.Term, r *rand.Rand) *timetable.Schedule {
	s := &timetable.Schedule{}
	for _, sec := range term.Sections {
		p := timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: 1 + r.IntN(len(sec.Times))}
		if !sec.NoRoom {
			p.Room = sec.RoomChoices[r.IntN(len(sec.RoomChoices))].Room
		}
		s.Placements = append(s.Placements, p)
	}
	return s
}

// TestXMLSolutionRoundTrip writes a timetable of a mapped term in the
// competition's solution format (the format page's Fig. 9: one element per
// class with days, start, weeks and room, students inside) and reads it back
// to the same assignments, schedule and cost.
func TestXMLSolutionRoundTrip(t *testing.T) {
	in := readHand(t, handInstance([]tc{{"1010100", 90, 10, "1010", "R1"}, {"0100000", 100, 12, "0001", ""}, {"0000100", 120, 6, "1111", "R2"}},
		distXML("NotOverlap", 3, `penalty="2"`)))
	term := in.Term()
	sched := randomSchedule(term, rand.New(rand.NewPCG(1, 2)))
	sched.Enrolments = []timetable.Enrolment{{Student: "s1", Section: "1"}, {Student: "s9", Section: "3"}, {Student: "s2", Section: "1"}}
	sol, err := XMLSolutionOf(in, sched, XMLRunInfo{Runtime: 1.25, Cores: 2, Technique: "stable models", Author: "a & b", Institution: "Example College", Country: "Nowhere"})
	require.NoError(t, err)
	assert.Equal(t, []string{"s1", "s2"}, sol.Classes[0].Students, "each class lists its students in enrolment order")
	assert.Equal(t, []string{"s9"}, sol.Classes[2].Students)
	var buf bytes.Buffer
	require.NoError(t, WriteXMLSolution(&buf, in, sol))
	text := buf.String()
	assert.Contains(t, text, `<solution name="hand" runtime="1.2" cores="2" technique="stable models" author="a &amp; b" institution="Example College" country="Nowhere">`)
	assert.Contains(t, text, `<class id="1" days="1010100" start="90" weeks="1010" room="R1">`)
	assert.Contains(t, text, `<student id="s1"/>`)
	assert.Contains(t, text, `<class id="2" days="0100000" start="100" weeks="0001"/>`, "a class without room has no room attribute")

	back, err := ReadXMLSolution(strings.NewReader("\ufeff"+text), "hand.solution.xml", in)
	require.NoError(t, err)
	for i := range back.Classes {
		back.Classes[i].Line = 0
	}
	sol.Info.Runtime = 1.2 // written with one decimal
	assert.Equal(t, sol, back)
	s2, err := back.Schedule(in)
	require.NoError(t, err)
	assert.Equal(t, sched.Placements, s2.Placements)
	assert.ElementsMatch(t, sched.Enrolments, s2.Enrolments, "the same students, listed class by class")
	c1, p1 := XMLCost(in, sol)
	c2, p2 := XMLCost(in, back)
	assert.Equal(t, c1, c2)
	assert.Equal(t, p1, p2)
}

func TestReadXMLSolutionErrors(t *testing.T) {
	in := readHand(t, handInstance([]tc{{"1000000", 90, 10, "1111", "R1"}}, ""))
	cases := []struct{ name, src, want string }{
		{"other instance", `<solution name="x"/>`, `s.xml:1: the solution is for instance "x", not "hand"`},
		{"unknown class", `<solution name="hand"><class id="9" days="1000000" start="90" weeks="1111"/></solution>`, `class "9" is not in instance "hand"`},
		{"twice", `<solution name="hand"><class id="1" days="1000000" start="90" weeks="1111"/>` + "\n" + `<class id="1" days="1000000" start="90" weeks="1111"/></solution>`, `s.xml:2: class "1" is given twice (first on line 1)`},
		{"bad days", `<solution name="hand"><class id="1" days="10" start="90" weeks="1111"/></solution>`, "of 2 characters; it must have 7"},
		{"stray element", `<solution name="hand"><room id="1"/></solution>`, "element <room> is not expected here"},
		{"nothing", ``, "the file holds no solution"},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			_, err := ReadXMLSolution(strings.NewReader(c.src), "s.xml", in)
			require.Error(t, err)
			assert.ErrorIs(t, err, ErrXMLFormat)
			assert.Contains(t, err.Error(), c.want)
		})
	}
	sol, err := ReadXMLSolution(strings.NewReader(`<solution name="hand"><class id="1" days="1000000" start="91" weeks="1111"/></solution>`), "s.xml", in)
	require.NoError(t, err, "a time outside the list is a hard violation, not a format error")
	_, err = sol.Schedule(in)
	assert.ErrorContains(t, err, `class "1" meets at a time it does not list`)
	assert.Equal(t, 1, XMLHardViolations(in, sol).NotListed)
}

// TestXMLSolutionOfRejects: a placement that is no class or no listed time.
func TestXMLSolutionOfRejects(t *testing.T) {
	in := readHand(t, handInstance([]tc{{"1000000", 90, 10, "1111", "R1"}}, ""))
	for _, p := range []timetable.Placement{{Section: "x", Time: 1}, {Section: "1", Time: 2}} {
		_, err := XMLSolutionOf(in, &timetable.Schedule{Placements: []timetable.Placement{p}}, XMLRunInfo{})
		assert.Error(t, err)
	}
}
