// Package timetable is termwright's domain: a Term (the weekly grid, rooms,
// staff, cohorts, sections, enrolments, course requests, unavailability,
// relations and weights of one academic term), a Schedule (one placement
// per meeting, and the students the sectioner placed), the readers that
// build a Term from a term workbook, and the checks that judge both.
//
// # Reading
//
// Load reads a term workbook: one .xlsx file (ReadWorkbook) or a folder of
// CSV files, one per sheet (ReadCSVDir). The layout is documented in
// docs/workbook.md. Every sheet is first turned into a table of raw cell
// texts (for .xlsx the raw stored value, independent of display formats, so
// Excel time and date cells arrive as serial numbers and are decoded by the
// convention of ECMA-376 Part 1 §18.17.4), then each row is decoded into the
// Term's records. Each record carries its Source (sheet and 1-based row).
//
// Before the spreadsheet library opens an .xlsx file, checkPackage reads its
// zip directory (part sizes against the limits) and every worksheet's XML
// with a strict XML decoder of its own, counting rows and cells; the
// library stops silently at damaged XML, so a sheet it reads fewer rows of
// than were counted is refused. Cells longer than MaxCellChars (one value)
// or MaxTextChars (text and lists) are errors at the cell, and Quote
// shortens every long value a message echoes. Headers may be renamed before
// they are matched: by the optional Columns sheet (Columns.csv) and by
// WithColumns; Term.Columns lists the renames applied.
//
// The sheets of meeting patterns (read_times.go) are read after Sections
// and attach to its sections by ID: Meeting times gives Section.Times,
// Room choices gives Section.RoomChoices; Travel gives Term.Travel. A
// section with meeting times is a pattern section (Meetings and Length are
// set to 1, and its grid cells only warn). The course columns of Sections
// (read_courses.go) give Section.Course, Arrangement, Part, Parent and
// Limit, and the Course requests sheet Term.Requests; Term.Courses builds
// the courses from the sections. The writers (write_term.go)
// write those sheets, and the new columns of Staff, Cohorts, Unavailable
// and Relations, the course columns of Sections and the Course requests
// sheet, only when a term uses them, so a grid term's workbook is
// byte for byte what it was before they existed; WriteTemplate and
// WriteTemplateCSV have every sheet and column.
//
// # Problems
//
// Readers and Validate never stop at the first mistake: they return a
// best-effort Term together with Problems, a list of every error and warning
// of the whole workbook, each with a Position in one text form used by
// every message of the tool: "Sections!D14" for a cell (sheet, column
// letter, row), "Sections row 14" for a whole row (a Source prints the
// same), "Sections" for a whole sheet; and a message that says what is
// wrong and what to do. The other readers work the same way on their own
// files: ReadSchedule and ReadMeetings (a timetable and its class lists),
// ReadClassListCSV, and ReadRequests (the rows of a requests file for an
// explanation; the explanation package reads their At cells). Only a file that cannot be read at all (not a
// workbook, damaged, password-protected, enormous) gives an error, which
// wraps ErrUnreadable and is one sentence.
//
// # Validation
//
// Validate checks any Term, read or built in code: references between
// sheets, duplicate IDs, the period grid, whether every section can be held
// by some room and fits some run of consecutive periods, fixed meetings,
// weeks, relations and weights, and cheap counting arguments that prove a
// term infeasible before any search (a staff member or cohort who must teach
// or attend more periods than they are available, more simultaneous fixed
// meetings than rooms). Pattern sections (validate_times.go) are checked
// for their meeting times (5-minute steps, within the day and the term),
// room choices, and whether any of their times can be used at all; the grid
// counting arguments leave them out, and a term of pattern sections only
// needs no period grid. Courses and requests (validate_courses.go) are
// checked for their links (parents, arrangements, known courses) and, by
// counting, whether each course's limits can seat the students who ask for
// it first (a warning: registrars may over-request on purpose). Positions
// come from each record's Source; column letters are known only for terms
// that were read from a workbook.
//
// # Checking students
//
// Check and Cost see every student's sections as Term.StudentEnrolments:
// the fixed Enrolments and the sectioned Schedule.Enrolments (read back
// from a timetable workbook's Class lists sheet). seatIndex groups them,
// and the course requests, by a dense student number in flat slices, so
// the seating rule (Course's doc comment, check_seating.go), the student
// clashes and the sectioning criteria run in time near-linear in
// enrolments.
//
// # Local naming
//
// "sheet" is a worksheet or a CSV file stem; "row" is 1-based with the
// header in row 1; "col" is a column letter ("A", "AB"); "header" is the
// canonical lower-case column name of docs/workbook.md.
package timetable
