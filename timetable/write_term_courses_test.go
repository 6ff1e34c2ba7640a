package timetable_test

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"

	"github.com/termwright/termwright/timetable"
)

// courseTerm is handTerm with courses: CHM101 in two parts (a lecture and
// two labs that name it as parent), CHM102 in two arrangements (the
// tutorial, or the online elective), limits, and course requests with
// priorities and alternatives. Invented data.
func courseTerm() *timetable.Term {
	t := handTerm()
	set := func(i int, course, arr, part, parent string, limit int) {
		s := &t.Sections[i]
		s.Course, s.Arrangement, s.Part, s.Parent, s.Limit = course, arr, part, parent, limit
	}
	set(0, "CHM101", "", "Lecture", "", 0)
	set(1, "CHM101", "", "Lab", "CHM101-L", 22)
	set(2, "CHM101", "", "Lab", "CHM101-L", 18)
	set(3, "CHM102", "Tutored", "", "", 22)
	set(4, "CHM102", "Online", "", "", 0)
	t.Requests = []timetable.Request{
		{Student: "Q2700002", Course: "CHM101", Priority: 1},
		{Student: "Q2700002", Course: "CHM102", Alternatives: []string{"CHM101"}},
		{Student: "Q2700003", Course: "CHM102", Priority: 3, Alternatives: []string{"CHM101"}},
	}
	return t
}

// TestCourseTermValidates: the course term is valid, so the round trip of
// TestWriteTermReadBack compares like with like.
func TestCourseTermValidates(t *testing.T) {
	assert.Empty(t, timetable.Validate(courseTerm()))
}

// TestCourseColumnsWritten: a term with courses gets the five course
// columns and the Course requests sheet; blank limit and priority stay blank.
func TestCourseColumnsWritten(t *testing.T) {
	f := openTermWorkbook(t, courseTerm())
	assert.Equal(t, []string{"Term", "Periods", "Rooms", "Staff", "Cohorts", "Sections", "Enrolments", "Unavailable", "Relations", "Weights", "Course requests"}, f.GetSheetList())
	rows, err := f.GetRows("Sections")
	require.NoError(t, err)
	assert.Equal(t, []string{"Course", "Arrangement", "Part", "Parent section", "Limit"}, rows[0][12:])
	assert.Equal(t, []string{"CHM101", "", "Lab", "CHM101-L", "22"}, rows[2][12:])
	rows, err = f.GetRows("Course requests")
	require.NoError(t, err)
	assert.Equal(t, [][]string{
		{"Student", "Course", "Priority", "Or instead"},
		{"Q2700002", "CHM101", "1"},
		{"Q2700002", "CHM102", "", "CHM101"},
		{"Q2700003", "CHM102", "3", "CHM101"},
	}, rows)
}
