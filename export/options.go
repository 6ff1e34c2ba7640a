package export

import (
	"time"

	"github.com/termwright/termwright/timetable"
)

// Options controls every writer of this package.
type Options struct {
	// Paper is the PDF paper size: "A4" (default when empty) or "Letter".
	Paper string
	// Generated is the publication time printed in PDF footers, used as the
	// PDF creation date and as DTSTAMP in calendars. Inject it for
	// reproducible output; the zero time means "now".
	Generated time.Time
	// Students asks Publish for one weekly grid PDF and one calendar per
	// student (fixed and sectioned enrolments).
	Students bool
	// Force lets Publish replace an existing output directory, but only one
	// that holds nothing except the files of an earlier publication.
	Force bool
	// Extra sheets are appended to the timetable workbook after Load, in
	// order (for example a Quality sheet from the optimiser). Their names
	// go through SheetNames after the grid sheets' names, so a clash gets a
	// "~2" suffix.
	Extra []ExtraSheet
	// Reasons say, by index into Term.Requests, why the sectioner could
	// not meet a request (sectioning.Result.Unplaced); the sectioning
	// report lists an unmet request without one as "not placed".
	Reasons map[int]string
	// Findings, when not nil, are the sectioning report's lines as the
	// caller has them (for example from the sectioner's own report, which
	// also knows clashes by travel time); otherwise the report is
	// SectioningFindings of the timetable.
	Findings []Finding
}

// ExtraSheet is an additional sheet of the timetable workbook: a header row
// and rows of cells (strings, numbers, booleans or time.Time values).
type ExtraSheet struct {
	Name   string
	Header []string
	Rows   [][]any
}

// WhoStudent is the Subject kind of one student (identified by the student
// ID used on the Enrolments sheet). It extends timetable.WhoKind, whose own
// values stop at timetable.WhoSection.
const WhoStudent timetable.WhoKind = 100

// Subject names whose schedule a writer prints: a staff member, room or
// cohort of the term (Kind timetable.WhoStaff, WhoRoom, WhoCohort) or a
// student (Kind WhoStudent).
type Subject struct {
	Kind timetable.WhoKind
	ID   string
}

// generated returns opt.Generated, or the current time when it is zero.
func (opt Options) generated() time.Time {
	if opt.Generated.IsZero() {
		return time.Now()
	}
	return opt.Generated
}

// kindWord names a subject kind in plain words ("staff", "room", "cohort",
// "student").
func kindWord(k timetable.WhoKind) string {
	if k == WhoStudent {
		return "student"
	}
	return k.String()
}

// kindDir is the directory name Publish uses for a kind.
func kindDir(k timetable.WhoKind) string {
	switch k {
	case timetable.WhoStaff:
		return "staff"
	case timetable.WhoRoom:
		return "rooms"
	case timetable.WhoCohort:
		return "cohorts"
	case WhoStudent:
		return "students"
	}
	return "other"
}
