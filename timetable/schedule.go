package timetable

// Placement puts one meeting of a section at a start period and a room.
type Placement struct {
	Section string // section ID
	Meeting int    // 1-based meeting number within the section
	Period  int    // index into Term.Periods of the first period of the meeting; -1 for a pattern section
	Time    int    // 1-based index into Section.Times for a pattern section; 0 for a grid meeting
	Room    string // room ID; "" for sections that take no room
	Src     Source // row of the timetable workbook it was read from, if any
}

// Schedule is a timetable: one placement per meeting. A complete schedule
// has exactly Section.Meetings placements for every grid section of its Term
// and exactly one (Meeting 1, Period -1, Time set) for every pattern section.
type Schedule struct {
	Placements []Placement
	// Enrolments are the students the sectioner placed (each names a
	// section with a Course); Term.Enrolments, the fixed ones, are not
	// repeated here. Empty when the term has no Requests.
	Enrolments []Enrolment
}

// Timetable sheet layout shared by the writer (export) and the reader
// (ReadSchedule): one row per meeting, these headers in this order. Title,
// Weeks and Staff names are for people reading the sheet; the reader
// ignores them (the term decides them). A pattern placement is one row
// with all its days in Day ("Mon Wed Fri"); its Day, Start, End and Weeks
// name the chosen meeting time.
var TimetableColumns = []string{"Section", "Title", "Meeting", "Day", "Start", "End", "Room", "Staff", "Cohorts", "Weeks", "Staff names"}

// ClassListSheet is the sheet of a timetable workbook that lists the
// sectioned students (Schedule.Enrolments), one row per student and
// section, with ClassListColumns in this order. Course, Part and Title are
// for people; the reader keys on Section and Student. Fixed enrolments
// (Term.Enrolments) are term data and are not listed here.
const ClassListSheet = "Class lists"

// ClassListColumns are the headers of the class-list sheet and CSV file.
var ClassListColumns = []string{"Section", "Course", "Part", "Title", "Student"}

// TimetableSheet is the name of the master sheet of a timetable workbook.
const TimetableSheet = "Timetable"
