package encode

import (
	"errors"
	"slices"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// studentTerm: one student (ST1) asks for four courses on a pattern term
// with two buildings 25 minutes apart. By construction: BIO is a main class
// with labs, each lab tied to its main class (Parent); MTH-1 meets with
// BIO-L1 (Mon 09:00), and CHM-1 starts ten minutes after BIO-LAB2 ends,
// in the other building; so BIO with MTH needs L2+LAB2, BIO with CHM needs
// L1+LAB1, and the three together always clash. ART is free on Friday.
func studentTerm() (*timetable.Term, *timetable.Schedule) {
	b := patTerm().room("N1", 40).room("S1", 40)
	b.t.Rooms[0].Building, b.t.Rooms[1].Building = "North", "South"
	b.t.Travel = []timetable.Travel{{From: "North", To: "South", Minutes: 25, Src: timetable.Source{Sheet: "Travel", Row: 2}}}
	row := 1
	add := func(id, course, part, parent string, room string, tc timetable.TimeChoice) {
		row++
		tc.Src = timetable.Source{Sheet: "Meeting times", Row: row}
		b.section(id, roomChoices(room), patTimes(b.t, tc), func(s *timetable.Section) {
			s.Course, s.Part, s.Parent, s.Limit = course, part, parent, 30
		})
	}
	dWed, dFri := timetable.DaysOf(time.Wednesday), timetable.DaysOf(time.Friday)
	add("BIO-L1", "BIO", "Main", "", "N1", at(dMon, 9, 0, 50, 0))
	add("BIO-L2", "BIO", "Main", "", "N1", at(dTue, 9, 0, 50, 0))
	add("BIO-LAB1", "BIO", "Lab", "BIO-L1", "N1", at(dMon, 14, 0, 50, 0))
	add("BIO-LAB2", "BIO", "Lab", "BIO-L2", "N1", at(dWed, 14, 0, 50, 0))
	add("MTH-1", "MTH", "", "", "S1", at(dMon, 9, 0, 50, 0))
	add("CHM-1", "CHM", "", "", "S1", at(dWed, 15, 0, 50, 0))
	add("ART-1", "ART", "", "", "S1", at(dFri, 9, 0, 50, 0))
	for i, c := range []string{"BIO", "MTH", "CHM", "ART"} {
		b.t.Requests = append(b.t.Requests, timetable.Request{Student: "ST1", Course: c, Src: timetable.Source{Sheet: "Course requests", Row: i + 2}})
	}
	s := &timetable.Schedule{}
	for i, sec := range b.t.Sections {
		s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: 1, Room: sec.RoomChoices[0].Room,
			Src: timetable.Source{Sheet: "Timetable", Row: i + 2}})
	}
	return b.t, s
}

// TestExplainStudentClashes: the explanation names exactly the three
// clashing requests and the two clashes built in (one overlap, one short
// of travel time), with times and rows; brute force over every set of
// sections the student could hold (judged by timetable.Check's seating
// rule and timetable.Cost's "student clashes" and "unplaced requests")
// confirms that those three requests cannot be placed without a clash and
// any two of them can, and that each listed pair clashes by Cost.
func TestExplainStudentClashes(t *testing.T) {
	term, sched := studentTerm()
	require.Empty(t, timetable.Validate(term).Errors())
	require.Empty(t, timetable.HardViolations(timetable.Check(term, sched)))
	ex, err := ExplainStudent(term, sched, "ST1")
	require.NoError(t, err)
	require.Equal(t, StudentClashes, ex.Status)
	var courses []string
	for _, r := range ex.Requests {
		courses = append(courses, r.Course)
	}
	assert.Equal(t, []string{"BIO", "MTH", "CHM"}, courses)
	assert.Equal(t, 4, ex.AllRequests)
	assert.Equal(t, [][]string{{"BIO-L1", "BIO-LAB1"}, {"BIO-L2", "BIO-LAB2"}}, ex.Requests[0].Options, "a lab only with its own main class")
	var pairs []string
	for _, c := range ex.Clashes {
		pairs = append(pairs, c.A.Section+"/"+c.B.Section+": "+c.Why)
	}
	assert.ElementsMatch(t, []string{
		"BIO-L1/MTH-1: both meet Mon 09:00-09:50",
		"BIO-LAB2/CHM-1: only 10 free minutes on Wed between N1 and S1, 25 needed to get from one room to the other",
	}, pairs)
	assert.Equal(t, "Mon 09:00-09:50", ex.Clashes[0].A.When)
	assert.Contains(t, ex.Clashes[0].A.Sources, "Meeting times row 2")
	assert.Contains(t, ex.Clashes[0].A.Sources, "Timetable row 2")
	assert.Empty(t, ex.Full)

	// Brute force on the model's own rules.
	assert.False(t, studentBrute(t, term, sched, "ST1", []string{"BIO", "MTH", "CHM"}), "the three cannot be combined")
	for _, two := range [][]string{{"BIO", "MTH"}, {"BIO", "CHM"}, {"MTH", "CHM"}} {
		assert.True(t, studentBrute(t, term, sched, "ST1", two), "%v can be combined", two)
	}
	for _, c := range ex.Clashes {
		assert.Positive(t, pairClashCost(term, sched, c.A.Section, c.B.Section), "%s and %s clash by timetable.Cost", c.A.Section, c.B.Section)
	}

	// Without MTH the student fits, and the choice given passes the
	// model's check and costs no clash.
	term.Requests = slices.DeleteFunc(term.Requests, func(r timetable.Request) bool { return r.Course == "MTH" })
	ex, err = ExplainStudent(term, sched, "ST1")
	require.NoError(t, err)
	require.Equal(t, StudentFits, ex.Status)
	got := *sched
	for _, st := range ex.Choice {
		got.Enrolments = append(got.Enrolments, timetable.Enrolment{Student: "ST1", Section: st.Section})
	}
	require.Empty(t, timetable.HardViolations(timetable.Check(term, &got)))
	rep := timetable.Cost(term, &got, nil)
	assert.Zero(t, rep.Criterion(timetable.CritStudentClash).Cost)
	assert.Zero(t, rep.Criterion(timetable.CritUnplaced).Cost)
}

// TestExplainStudentFull: a section holding its limit of other students
// cannot be taken; the explanation says so when it is the only way left.
func TestExplainStudentFull(t *testing.T) {
	term, sched := studentTerm()
	term.Requests = term.Requests[:2] // BIO and MTH: L2+LAB2 is the only way
	i := term.SectionIndex()["BIO-LAB2"]
	term.Sections[i].Limit = 1
	term.Enrolments = append(term.Enrolments, timetable.Enrolment{Student: "ST9", Section: "BIO-LAB2", Src: timetable.Source{Sheet: "Enrolments", Row: 2}},
		timetable.Enrolment{Student: "ST9", Section: "BIO-L2", Src: timetable.Source{Sheet: "Enrolments", Row: 3}})
	ex, err := ExplainStudent(term, sched, "ST1")
	require.NoError(t, err)
	require.Equal(t, StudentClashes, ex.Status)
	require.Len(t, ex.Full, 1)
	assert.Equal(t, "BIO-LAB2", ex.Full[0].Section.Section)
	assert.Equal(t, 1, ex.Full[0].Limit)
	assert.Equal(t, 1, ex.Full[0].Held)
	assert.False(t, studentBrute(t, term, sched, "ST1", []string{"BIO", "MTH"}), "brute force agrees")

	_, err = ExplainStudent(term, sched, "NOBODY")
	assert.True(t, errors.Is(err, ErrNoStudent))
}

// studentBrute reports whether student can be placed in every course of
// courses (their requests, the others dropped) without a clash: every set
// of the courses' sections is tried as the student's sectioned
// enrolments; a set counts when timetable.Check finds no hard violation
// (the seating rule) and timetable.Cost no unplaced request and no
// student clash.
func studentBrute(t *testing.T, term *timetable.Term, sched *timetable.Schedule, student string, courses []string) bool {
	t.Helper()
	c := *term
	c.Requests = slices.DeleteFunc(slices.Clone(term.Requests), func(r timetable.Request) bool {
		return r.Student == student && !slices.Contains(courses, r.Course)
	})
	var secs []string
	for _, s := range term.Sections {
		if slices.Contains(courses, s.Course) {
			secs = append(secs, s.ID)
		}
	}
	require.Less(t, len(secs), 16, "brute force stays small")
	for mask := 0; mask < 1<<len(secs); mask++ {
		got := *sched
		got.Enrolments = nil
		for i, id := range secs {
			if mask&(1<<i) != 0 {
				got.Enrolments = append(got.Enrolments, timetable.Enrolment{Student: student, Section: id})
			}
		}
		if len(timetable.HardViolations(timetable.Check(&c, &got))) > 0 {
			continue
		}
		rep := timetable.Cost(&c, &got, nil)
		if rep.Criterion(timetable.CritUnplaced).Cost == 0 && rep.Criterion(timetable.CritStudentClash).Cost == 0 {
			return true
		}
	}
	return false
}

// pairClashCost is timetable.Cost's "student clashes" for one student
// fixed in sections a and b alone.
func pairClashCost(term *timetable.Term, sched *timetable.Schedule, a, b string) int64 {
	c := *term
	c.Requests = nil
	c.Enrolments = []timetable.Enrolment{{Student: "X", Section: a}, {Student: "X", Section: b}}
	return timetable.Cost(&c, sched, nil).Criterion(timetable.CritStudentClash).Cost
}
