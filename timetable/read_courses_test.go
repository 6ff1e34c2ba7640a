package timetable

import (
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// courseSheets is goodSheets with courses: the five course columns of
// Sections (M to Q) and a Course requests sheet. FND has two parts, a
// main class (SEC-1) and a reading group (SEC-4) whose parent is the main class;
// LAB and SEM have one section each, SEM with a limit of 20. Invented data.
func courseSheets() []testSheet {
	sheets := goodSheets()
	for i := range sheets {
		if sheets[i].name != "Sections" {
			continue
		}
		extra := [][]string{
			{"Course", "Arrangement", "Part", "Parent section", "Limit"},
			{"FND", "", "Main", "", ""},
			{"LAB", "", "", "", ""},
			{"SEM", "", "", "", "20"},
			{"FND", "", "Reading", "SEC-1", ""},
		}
		for r := range sheets[i].rows {
			sheets[i].rows[r] = append(sheets[i].rows[r], extra[r]...)
		}
	}
	return append(sheets, testSheet{"Course requests", [][]string{
		{"Student", "Course", "Priority", "Or instead"},
		{"ST3", "FND", "1", ""},
		{"ST3", "SEM", "", "LAB"},
		{"ST4", "LAB", "2", "SEM; FND"},
	}})
}

// TestReadCourses: the course cells and the requests arrive in the Term as
// written, and the term reads clean.
func TestReadCourses(t *testing.T) {
	term, ps := readSheets(t, courseSheets())
	require.Empty(t, ps)
	s := term.Sections
	assert.Equal(t, [5]any{"FND", "", "Main", "", 0}, [5]any{s[0].Course, s[0].Arrangement, s[0].Part, s[0].Parent, s[0].Limit})
	assert.Equal(t, [5]any{"SEM", "", "", "", 20}, [5]any{s[2].Course, s[2].Arrangement, s[2].Part, s[2].Parent, s[2].Limit})
	assert.Equal(t, [5]any{"FND", "", "Reading", "SEC-1", 0}, [5]any{s[3].Course, s[3].Arrangement, s[3].Part, s[3].Parent, s[3].Limit})
	src := func(row int) Source { return Source{Sheet: "Course requests", Row: row} }
	assert.Equal(t, []Request{
		{Student: "ST3", Course: "FND", Priority: 1, Src: src(2)},
		{Student: "ST3", Course: "SEM", Alternatives: []string{"LAB"}, Src: src(3)},
		{Student: "ST4", Course: "LAB", Priority: 2, Alternatives: []string{"SEM", "FND"}, Src: src(4)},
	}, term.Requests)
	cs := term.Courses()
	require.Len(t, cs, 3)
	assert.Equal(t, Counts{Sections: 4, Meetings: 7, Staff: 3, Rooms: 3, Cohorts: 2, Periods: 25, Students: 2, Enrolments: 3, Courses: 3, Requests: 3}, Summary(term))
	assert.Equal(t, []Part{{ID: "Main", Sections: []int{0}}, {ID: "Reading", Sections: []int{3}}}, cs[0].Arrangements[0].Parts)
}

// TestReadCoursesCSV: the CSV folder form reads the same requests from
// "Course requests.csv" (the file named after the sheet).
func TestReadCoursesCSV(t *testing.T) {
	files := csvFiles(courseSheets())
	assert.Equal(t, "Course requests.csv", files[len(files)-1].name)
	term, ps := readCSVFiles(files, nil)
	require.Empty(t, ps)
	assert.Len(t, term.Requests, 3)
	assert.Equal(t, []string{"SEM", "FND"}, term.Requests[2].Alternatives)
}

// TestCourseProblemsAtCells plants one mistake each in courseSheets and
// expects it at its cell with a message that says what to do.
func TestCourseProblemsAtCells(t *testing.T) {
	cases := []plantCase{
		{"clean", nil, "", 0, ""},
		{"renamed request column", []cellEdit{e("Course requests", "B1", "Wants"),
			e("Columns", "A1", "Sheet"), e("Columns", "B1", "Their column"), e("Columns", "C1", "Our column"),
			e("Columns", "A2", "Course requests"), e("Columns", "B2", "Wants"), e("Columns", "C2", "Course")}, "", 0, ""},
		{"request for unknown course", []cellEdit{e("Course requests", "B2", "XYZ")}, "", Error, `course "XYZ" is not the Course of any section on the Sections sheet — correct the course`},
		{"blank course", []cellEdit{e("Course requests", "B2", "")}, "", Error, "Course is blank — write a course from the Course column"},
		{"blank student", []cellEdit{e("Course requests", "A2", "")}, "", Error, "Student is blank"},
		{"negative priority", []cellEdit{e("Course requests", "C2", "-1")}, "", Error, "Priority -1 is below 0"},
		{"priority not a number", []cellEdit{e("Course requests", "C2", "high")}, "", Error, `Priority "high" is not a whole number`},
		{"same course twice", []cellEdit{e("Course requests", "A5", "ST3"), e("Course requests", "B5", "FND")}, "", Error, `student "ST3" requests course "FND" again (first in row 2) — keep one of the two rows`},
		{"unknown alternative", []cellEdit{e("Course requests", "D4", "SEM, NOPE")}, "", Error, `Or instead: course "NOPE" is not the Course of any section`},
		{"alternative is the course", []cellEdit{e("Course requests", "D4", "LAB")}, "", Warning, `Or instead lists the requested course "LAB" itself`},
		{"part without course", []cellEdit{e("Sections", "M4", ""), e("Sections", "O4", "Seminar")}, "", Error, `Part "Seminar" is given but Course is blank — write the section's course in Course, or clear Part`},
		{"arrangement without course", []cellEdit{e("Sections", "M4", ""), e("Sections", "N4", "A")}, "", Error, `Arrangement "A" is given but Course is blank`},
		{"limit without course", []cellEdit{e("Sections", "M4", "")}, "Sections!Q4", Warning, "Limit is used only for sections with a Course"},
		{"parent unknown", []cellEdit{e("Sections", "P5", "SEC-9")}, "", Error, `parent section "SEC-9" is not on the Sections sheet — correct the ID or clear Parent section`},
		{"parent of another course", []cellEdit{e("Sections", "P5", "SEC-2")}, "", Error, `parent section "SEC-2" belongs to course "LAB", not "FND"`},
		{"parent in another arrangement", []cellEdit{e("Sections", "N5", "B")}, "Sections!P5", Error, `parent section "SEC-1" is in arrangement "" of course "FND", not "B"`},
		{"parent in the same part", []cellEdit{e("Sections", "O5", "Main")}, "Sections!P5", Error, `parent section "SEC-1" is in the same part "Main"`},
		{"parent is itself", []cellEdit{e("Sections", "P5", "SEC-4")}, "", Error, "the section names itself as its parent"},
		{"parent cycle", []cellEdit{e("Sections", "P2", "SEC-4")}, "", Error, `parent sections go round in a circle ("SEC-1" → "SEC-4" → "SEC-1") — clear Parent section in one of them`},
		{"negative limit", []cellEdit{e("Sections", "Q4", "-1")}, "", Error, "Limit -1 is below 0"},
		{"zero limit", []cellEdit{e("Sections", "Q4", "0")}, "", Warning, "Limit 0 is read as no limit of its own"},
		// SEM: limit 2 less ST1's fixed seat = 1 place; ST3 (row 3) takes it, ST5 (row 5) is one too many.
		{"limits cannot hold the requests", []cellEdit{e("Sections", "Q4", "2"), e("Course requests", "A5", "ST5"), e("Course requests", "B5", "SEM")}, "",
			Warning, `course "SEM" is the first choice of 2 requests but its section limits hold at most 1 — 1 of them cannot be placed in it`},
		{"fixed students over the limit", []cellEdit{e("Enrolments", "A5", "ST9"), e("Enrolments", "B5", "SEC-3"), e("Sections", "Q4", "1")}, "", Error,
			`section "SEC-3" has 2 fixed students on the Enrolments sheet, more than its limit of 1`},
	}
	runPlantCases(t, courseSheets(), cases)
}
