package timetable

import (
	"strconv"
	"strings"
	"unicode/utf8"
)

// Limits that keep a damaged or hostile file from exhausting the machine.
const (
	maxFileBytes = 200 << 20 // largest workbook or CSV file read: 200 MB
	maxSheetRows = 1_000_000 // most rows read from one sheet or CSV file
)

// Cell length limits, in characters (docs/workbook.md, "Size limits").
const (
	// MaxCellChars bounds a cell holding one value: an ID, a name, a number,
	// a day or a time, and a header. No real ID or name comes near it.
	MaxCellChars = 1_000
	// MaxTextChars bounds a cell of free text or a list (a title, a reason,
	// a list of sections): the most a spreadsheet cell holds, 32,767
	// characters (Microsoft, "Excel specifications and limits").
	MaxTextChars = 32_767
)

// longColumns are the columns that may hold up to MaxTextChars.
var longColumns = map[string][]string{
	shTerm:        {"Value"},
	shRooms:       {"Features"},
	shSections:    {"Title", "Staff", "Cohorts", "Needs", "Rooms", "Fixed", "Weeks"},
	shUnavailable: {"Reason", "Weeks"},
	shRelations:   {"Sections"},
	shTimes:       {"Weeks"},
	shRequests:    {"Or instead"},
}

// sheetSpec describes one sheet of the layout in docs/workbook.md.
type sheetSpec struct {
	name     string   // canonical name, e.g. "Sections"
	required bool     // the workbook must have it
	cols     []string // canonical headers in template order
	need     []string // headers that must be present when the sheet is
	notes    []string // one note per column for the template, parallel to cols
}

// Sheet and column names of the term workbook (docs/workbook.md).
const (
	shTerm        = "Term"
	shPeriods     = "Periods"
	shRooms       = "Rooms"
	shStaff       = "Staff"
	shCohorts     = "Cohorts"
	shSections    = "Sections"
	shEnrolments  = "Enrolments"
	shUnavailable = "Unavailable"
	shRelations   = "Relations"
	shWeights     = "Weights"
	shTimes       = "Meeting times"
	shRoomChoices = "Room choices"
	shTravel      = "Travel"
	shRequests    = "Course requests"
)

// shLists is the hidden sheet of the template that holds the values of the
// drop-down lists too long to write into the list itself (a spreadsheet
// limits an inline list to 255 characters). Readers ignore it.
const shLists = "Lists"

// sheetSpecs lists every sheet in workbook order.
var sheetSpecs = []sheetSpec{
	{name: shTerm, required: true, cols: []string{"Key", "Value"}, need: []string{"Key", "Value"}, notes: []string{
		"Name, First day, Last day, Time zone, Holiday (may repeat) or Holidays (a list).",
		"The value: a date as YYYY-MM-DD or a date cell; an IANA time zone such as Europe/Dublin.",
	}},
	{name: shPeriods, cols: []string{"Day", "Start", "End"}, need: []string{"Day", "Start", "End"}, notes: []string{
		"Mon to Sun.",
		"Start time, HH:MM on the 24-hour clock (or a time cell).",
		"End time, after Start. Periods that touch (one ends when the next starts) are consecutive.",
	}},
	{name: shRooms, required: true, cols: []string{"Room", "Capacity", "Features", "Building"}, need: []string{"Room", "Capacity"}, notes: []string{
		"Unique room code, e.g. R204.",
		"Seats. Must not exceed the room's posted legal occupancy.",
		"Comma list of features, e.g. lab, projector, step-free.",
		"Building name or code (optional).",
	}},
	{name: shStaff, required: true, cols: []string{"Staff ID", "Name", "Email", "Max periods per day", "Max consecutive periods",
		"Max periods per week", "Max minutes per week", "Max days per week", "Lunch from", "Lunch to", "Lunch minutes"}, need: []string{"Staff ID"}, notes: []string{
		"Unique staff ID.",
		"Display name.",
		"Email address (optional).",
		"Most teaching periods in one day; blank = no limit. Follow local agreements.",
		"Most teaching periods in a row; blank = no limit. Follow local agreements.",
		"Most grid periods in one teaching week (part-time contracts); blank = no limit. Follow the contract and local agreements.",
		"Most teaching minutes in one teaching week, every meeting counted; blank = no limit. Follow the contract and local agreements.",
		"Most days with teaching in one week; blank = no limit.",
		"Lunch window start HH:MM (optional): with Lunch to and Lunch minutes, a guaranteed free break on every teaching day.",
		"Lunch window end HH:MM.",
		"Free minutes guaranteed inside the lunch window.",
	}},
	{name: shCohorts, required: true, cols: []string{"Cohort", "Name", "Size", "Lunch from", "Lunch to", "Lunch minutes"}, need: []string{"Cohort"}, notes: []string{
		"Unique cohort ID: students who must never have two classes at once.",
		"Display name.",
		"Number of students (optional).",
		"Lunch window start HH:MM (optional): with Lunch to and Lunch minutes, a guaranteed free break on every day the cohort has class.",
		"Lunch window end HH:MM.",
		"Free minutes guaranteed inside the lunch window.",
	}},
	{name: shSections, required: true, cols: []string{"Section", "Title", "Staff", "Cohorts", "Expected size", "Meetings per week", "Periods per meeting", "Needs", "Rooms", "Fixed", "Weeks", "Min days",
		"Course", "Arrangement", "Part", "Parent section", "Limit"}, need: []string{"Section"}, notes: []string{
		"Unique section ID.",
		"Title shown on schedules.",
		"Staff IDs (comma list); all attend every meeting.",
		"Cohort IDs (comma list); all attend every meeting.",
		"Expected number of students.",
		"Meetings each week (default 1).",
		"Consecutive periods per meeting (default 1).",
		"Room features required (comma list), or: no room.",
		"Allowed rooms (comma list; blank = any that fits), or: no room.",
		"Pre-assigned meetings separated by ;, e.g. Tue 10:00 R204; Thu 10:00",
		"all (default), odd, even, or weeks and ranges such as 1-4, 6, 9-12.",
		"Blank: meetings fall on different days. A number: meetings may share a day; fewer days than this costs.",
		"Course students request on the Course requests sheet (optional); blank = the section is not requested.",
		"With Course: the way of taking the course this section belongs to, when it has more than one (e.g. A, B); blank = the only one.",
		"With Course: its part, e.g. Main class or Lab; a student takes one section of every part. Blank = the only part.",
		"With Course: a section every student of this one also takes: same course and arrangement, another part.",
		"Most students, fixed enrolments included; blank = Expected size. Must not exceed what the room may legally hold.",
	}},
	{name: shEnrolments, cols: []string{"Student", "Section"}, need: []string{"Student", "Section"}, notes: []string{
		"Student ID.",
		"Section ID the student is enrolled in.",
	}},
	{name: shUnavailable, cols: []string{"Who", "Day", "From", "To", "Strength", "Reason", "Weeks"}, need: []string{"Who", "Day"}, notes: []string{
		"A staff ID, room, cohort or section.",
		"Mon to Sun.",
		"Start time HH:MM; blank From and To = the whole day.",
		"End time HH:MM.",
		"hard (default: must not be scheduled) or a whole-number weight (would rather not).",
		"Reason (optional, shown in explanations).",
		"Teaching weeks the row holds in: blank = every week, or odd, even, or weeks and ranges such as 1-4, 6.",
	}},
	{name: shRelations, cols: []string{"Kind", "Sections", "Strength", "N", "M"}, need: []string{"Kind", "Sections"}, notes: []string{
		"A relation kind from the drop-down list (see docs/workbook.md, Relations).",
		"Two or more section IDs (comma list).",
		"hard (default) or a whole-number weight.",
		"The kind's number N: minutes for day span, minimum gap, at most minutes a day and longest block; days for at most days; breaks for at most breaks. Blank for the other kinds.",
		"The kind's second number M, for at most breaks and longest block: a gap of at most M minutes joins two meetings into one block. Blank for the other kinds.",
	}},
	{name: shWeights, cols: []string{"Criterion", "Weight", "Level"}, need: []string{"Criterion", "Weight"}, notes: []string{
		"A soft criterion name.",
		"Whole number from 0 (off) upwards.",
		"Priority level (optional); higher levels are minimised first.",
	}},
	{name: shTimes, cols: []string{"Section", "Days", "Start", "Minutes", "Weeks", "Weight"}, need: []string{"Section", "Days", "Start", "Minutes"}, notes: []string{
		"Section ID. One row per acceptable meeting time; a section with rows here is placed at one of them, not on the Periods grid.",
		"The days it meets, e.g. Mon Wed Fri or Tue Thu.",
		"Start time HH:MM, on a 5-minute step (09:00, 09:05, ...).",
		"Length of each meeting in minutes, a multiple of 5, e.g. 50 or 75.",
		"Teaching weeks: blank = the section's Weeks; or all, odd, even, or weeks and ranges such as 3-6.",
		"Preference: blank or 0 = fully acceptable; a higher whole number = less wanted.",
	}},
	{name: shRoomChoices, cols: []string{"Section", "Room", "Weight"}, need: []string{"Section", "Room"}, notes: []string{
		"Section ID. Rows here are the section's complete list of acceptable rooms (they replace its Rooms column).",
		"A room from the Rooms sheet that can hold the section.",
		"Preference: blank or 0 = fully acceptable; a higher whole number = less wanted.",
	}},
	{name: shTravel, cols: []string{"From", "To", "Minutes"}, need: []string{"From", "To", "Minutes"}, notes: []string{
		"A room or a building (Building column of Rooms).",
		"Another room or building; the time holds both ways.",
		"Minutes needed to get from one to the other; staff and cohorts always get this much free time between meetings there.",
	}},
	{name: shRequests, cols: []string{"Student", "Course", "Priority", "Or instead"}, need: []string{"Student", "Course"}, notes: []string{
		"Student ID. One row per course the student asks for.",
		"A course named in the Course column of the Sections sheet.",
		"Who gets scarce places first: 1 is the most important; blank comes after every number.",
		"Courses taken instead, most wanted first (comma list), when the course cannot be placed.",
	}},
	{name: shColumns, cols: []string{colMapSheet, colMapTheir, colMapOur}, need: []string{colMapSheet, colMapTheir, colMapOur}, notes: []string{
		"Optional. The sheet whose column is renamed, e.g. Sections.",
		"The header as your export has it, e.g. Crs Nbr.",
		"Our column it holds, e.g. Section.",
	}},
}

// specFor finds the spec of a sheet by name, in any case, with '-' or '_'
// for a space ("meeting_times.csv").
func specFor(name string) *sheetSpec {
	n := normWords(name)
	for i := range sheetSpecs {
		if normWords(sheetSpecs[i].name) == n {
			return &sheetSpecs[i]
		}
	}
	return nil
}

// rawSheet is a sheet as read from a file: cell texts by row. rows[i] is
// spreadsheet row firstRow+i; rows may be ragged.
type rawSheet struct {
	name string     // as the registrar sees it
	rows [][]string // raw cell texts
	line []int      // 1-based row number of each entry of rows
}

// table is a sheet matched to its spec: which column holds which header.
type table struct {
	spec       *sheetSpec
	sheet      string                // name as the registrar sees it
	col        map[string]int        // canonical header (normalised) -> 0-based column
	rows       []tableRow            // non-blank data rows
	renamed    []ColumnRename        // renames applied, with From as the header reads, in column order
	renamedCol map[int]*ColumnRename // 0-based column -> the rename that gave its header
}

// tableRow is one non-blank data row.
type tableRow struct {
	num   int      // 1-based spreadsheet row
	cells []string // raw cell texts
}

// newTable matches the header row of raw against spec, reporting missing
// required headers, duplicate and unknown headers. ren renames headers
// (normalised header as the file has it -> rename) before they are matched.
func newTable(raw *rawSheet, spec *sheetSpec, ps *Problems, ren map[string]*ColumnRename) *table {
	t := &table{spec: spec, sheet: raw.name, col: map[string]int{}, renamedCol: map[int]*ColumnRename{}}
	known := map[string]string{}
	for _, c := range spec.cols {
		known[normHeader(c)] = c
	}
	headerRow := -1
	for i, r := range raw.rows {
		if !blankRow(r) {
			headerRow = i
			break
		}
	}
	if headerRow < 0 {
		ps.errorf(Position{Sheet: raw.name}, "the %s sheet is empty — put the headers %s in row 1", raw.name, quoteList(spec.cols))
		return t
	}
	hdrNum := raw.line[headerRow]
	if hdrNum != 1 {
		ps.warnf(Position{Sheet: raw.name, Row: hdrNum}, "the headers are in row %d, not row 1 — rows above them are ignored", hdrNum)
	}
	for i, h := range raw.rows[headerRow] {
		pos := Position{Sheet: raw.name, Row: hdrNum, Col: colLetter(i)}
		if len(h) > MaxCellChars && utf8.RuneCountInString(h) > MaxCellChars {
			ps.errorf(pos, "the header holds %s characters, more than the %s a header may hold — write one of %s", groupThousands(utf8.RuneCountInString(h)), groupThousands(MaxCellChars), quoteList(spec.cols))
			continue
		}
		n := normHeader(h)
		if n == "" {
			continue
		}
		rn := ren[n]
		if rn != nil {
			n = normHeader(rn.To)
		}
		if _, ok := known[n]; !ok {
			ps.warnf(pos, "column %q is not part of the %s sheet and is ignored — the columns are %s", strings.TrimSpace(h), spec.name, quoteList(spec.cols))
			continue
		}
		if prev, dup := t.col[n]; dup {
			if rn != nil || t.renamedCol[prev] != nil {
				ps.errorf(pos, "column %q and column %s would both be read as %q (a rename on the Columns sheet) — delete one of the two columns or the rename", strings.TrimSpace(h), colLetter(prev), known[n])
				continue
			}
			ps.warnf(pos, "column %q appears twice — only the first (column %s) is read", strings.TrimSpace(h), colLetter(prev))
			continue
		}
		t.col[n] = i
		if rn != nil {
			applied := *rn
			applied.From = strings.TrimSpace(h)
			t.renamed = append(t.renamed, applied)
			t.renamedCol[i] = rn
		}
	}
	for _, c := range spec.need {
		if _, ok := t.col[normHeader(c)]; !ok {
			ps.errorf(Position{Sheet: raw.name, Row: hdrNum}, "the %s sheet has no %q column — add a column headed %q", raw.name, c, c)
		}
	}
	limits := t.cellLimits(len(raw.rows[headerRow]))
	for i := headerRow + 1; i < len(raw.rows); i++ {
		if !blankRow(raw.rows[i]) {
			row := tableRow{num: raw.line[i], cells: raw.rows[i]}
			capCells(row, raw.name, limits, ps)
			t.rows = append(t.rows, row)
		}
	}
	return t
}

// cellLimits gives the length limit of each of the first n columns
// (columns beyond n get MaxTextChars: they are not read).
func (t *table) cellLimits(n int) []int {
	lim := make([]int, n)
	for i := range lim {
		lim[i] = MaxTextChars
	}
	for h, i := range t.col {
		if i < n {
			lim[i] = MaxCellChars
			for _, long := range longColumns[t.spec.name] {
				if normHeader(long) == h {
					lim[i] = MaxTextChars
				}
			}
		}
	}
	return lim
}

// capCells reports every cell of row longer than its limit and blanks it,
// so that no later message echoes it and no record holds it.
func capCells(row tableRow, sheet string, limits []int, ps *Problems) {
	for i, c := range row.cells {
		lim := MaxTextChars
		if i < len(limits) {
			lim = limits[i]
		}
		if len(c) > lim && utf8.RuneCountInString(c) > lim {
			ps.errorf(Position{Sheet: sheet, Row: row.num, Col: colLetter(i)},
				"the cell holds %s, more than the %s characters a cell of this column may hold — shorten it",
				Quote(c), groupThousands(lim))
			row.cells[i] = ""
		}
	}
}

// letter is the column letter of header, or "" when the column is absent.
func (t *table) letter(header string) string {
	if i, ok := t.col[normHeader(header)]; ok {
		return colLetter(i)
	}
	return ""
}

// get returns the trimmed text of header in row r ("" when absent).
func (t *table) get(r tableRow, header string) string {
	i, ok := t.col[normHeader(header)]
	if !ok || i >= len(r.cells) {
		return ""
	}
	return strings.TrimSpace(r.cells[i])
}

// pos is the position of header in row r.
func (t *table) pos(r tableRow, header string) Position {
	return Position{Sheet: t.sheet, Row: r.num, Col: t.letter(header)}
}

func blankRow(r []string) bool {
	for _, c := range r {
		if strings.TrimSpace(c) != "" {
			return false
		}
	}
	return true
}

// quoteList formats names as "A", "B" and "C".
func quoteList(names []string) string {
	q := make([]string, len(names))
	for i, n := range names {
		q[i] = strconv.Quote(n)
	}
	switch len(q) {
	case 0:
		return ""
	case 1:
		return q[0]
	}
	return strings.Join(q[:len(q)-1], ", ") + " and " + q[len(q)-1]
}
