package export

import (
	"fmt"
	"io"
	"sort"
	"strings"

	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// A staff member's class lists are a workbook rather than a CSV file: a
// teacher prints a roster per section to take attendance and keeps marks
// beside it, so each section gets its own titled sheet (times, room,
// students against the limit) that prints on its own with the header
// repeated, and the first sheet lists them all for filtering. One CSV
// would mix every section into one untitled table, and spreadsheet
// programs opening a CSV turn IDs such as "007" into numbers; workbook
// cells stay text.

// ClassListsSheet is the first sheet of a staff member's class-list
// workbook: every student of every section they teach.
const ClassListsSheet = "All students"

// StaffClassListColumns are the headers of a staff member's class-list
// workbook, on the first sheet and on each section's sheet.
var StaffClassListColumns = []string{"Section", "Course", "Part", "Title", "Student", "Enrolment"}

// Enrolment kinds in the Enrolment column of a staff member's class lists.
const (
	EnrolmentFixed     = "fixed"     // Term.Enrolments
	EnrolmentSectioned = "sectioned" // Schedule.Enrolments
)

// classStudent is one student of a section, with how they came to it.
type classStudent struct{ id, how string }

// sectionStudents lists the students of each section (fixed enrolments,
// then sectioned ones not already fixed there), each list sorted by ID.
// It is made once per view (Publish's workers share it) and read-only.
func (v *view) sectionStudents() map[string][]classStudent {
	v.classOnce.Do(func() { v.classStudents = v.makeSectionStudents() })
	return v.classStudents
}

func (v *view) makeSectionStudents() map[string][]classStudent {
	out := map[string][]classStudent{}
	type pair struct{ sec, st string }
	seen := map[pair]bool{}
	nFixed := len(v.t.Enrolments)
	for i, e := range v.enrolments {
		if seen[pair{e.Section, e.Student}] {
			continue
		}
		seen[pair{e.Section, e.Student}] = true
		how := EnrolmentSectioned
		if i < nFixed {
			how = EnrolmentFixed
		}
		out[e.Section] = append(out[e.Section], classStudent{e.Student, how})
	}
	for _, list := range out {
		sort.Slice(list, func(i, j int) bool { return list[i].id < list[j].id })
	}
	return out
}

// classListStaff lists the staff members (term order) who teach a section
// with at least one student.
func (v *view) classListStaff() []string {
	students := v.sectionStudents()
	var out []string
	for _, st := range v.t.Staff {
		for _, i := range v.byStaff[st.ID] {
			if len(students[v.meetings[i].sec.ID]) > 0 {
				out = append(out, st.ID)
				break
			}
		}
	}
	return out
}

// WriteStaffClassLists writes the class lists of staff member staffID as a
// workbook (.xlsx): the sheet ClassListsSheet with StaffClassListColumns,
// one row per student of each of their sections (fixed and sectioned
// enrolments; Enrolment says which), sorted by section then student, then
// one sheet per section (named after it through SheetNames) headed by the
// section, title, course and part, its meetings (day, time, room, weeks)
// and its number of students against its limit, above the same columns.
// Sections without students are left out. Every sheet prints landscape on
// opt.Paper with its header rows repeated.
func WriteStaffClassLists(w io.Writer, t *timetable.Term, s *timetable.Schedule, staffID string, opt Options) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	if v.staff[staffID] == nil {
		return fmt.Errorf("there is no staff member %q in the term; use an ID from the Staff sheet", staffID)
	}
	return v.writeStaffClassLists(w, staffID, opt)
}

func (v *view) writeStaffClassLists(w io.Writer, staffID string, opt Options) (err error) {
	f := excelize.NewFile()
	defer func() {
		if cerr := f.Close(); err == nil {
			err = cerr
		}
	}()
	wb := &workbook{v: v, f: f}
	if wb.paper, err = paperSize(opt.Paper); err != nil {
		return err
	}
	if wb.st, err = newStyles(f); err != nil {
		return err
	}
	students := v.sectionStudents()
	var secs []*timetable.Section
	seen := map[string]bool{}
	for _, i := range v.byStaff[staffID] {
		sec := v.meetings[i].sec
		if !seen[sec.ID] && len(students[sec.ID]) > 0 {
			seen[sec.ID] = true
			secs = append(secs, sec)
		}
	}
	sort.Slice(secs, func(i, j int) bool { return secs[i].ID < secs[j].ID })
	if err := f.SetSheetName("Sheet1", ClassListsSheet); err != nil {
		return err
	}
	var all [][]any
	for _, sec := range secs {
		all = append(all, v.staffClassRows(sec, students[sec.ID])...)
	}
	if err := wb.fillTable(ClassListsSheet, 1, StaffClassListColumns, staffClassWidths, all); err != nil {
		return err
	}
	ids := make([]string, len(secs))
	for i, sec := range secs {
		ids[i] = sec.ID
	}
	names := SheetNames(ids, ClassListsSheet)
	for i, sec := range secs {
		if err := wb.sectionSheet(names[i], sec, students[sec.ID]); err != nil {
			return fmt.Errorf("the sheet %q of the class lists could not be written: %w", names[i], err)
		}
	}
	gen := opt.generated().UTC().Format("2006-01-02T15:04:05Z")
	title := "Class lists of " + v.title(Subject{timetable.WhoStaff, staffID})
	if v.t.Name != "" {
		title += " — " + v.t.Name
	}
	if err := f.SetDocProps(&excelize.DocProperties{Title: title, Creator: "termwright", Created: gen, Modified: gen}); err != nil {
		return err
	}
	f.SetActiveSheet(0)
	return wb.writeTo(w)
}

var staffClassWidths = []float64{12, 12, 10, 40, 16, 11}

// staffClassRows are the rows of one section's students.
func (v *view) staffClassRows(sec *timetable.Section, students []classStudent) [][]any {
	rows := make([][]any, len(students))
	for i, st := range students {
		rows[i] = []any{sec.ID, sec.Course, sec.Part, sec.Title, st.id, st.how}
	}
	return rows
}

// sectionSheet writes one section's sheet: a title, a note with the
// course and part, one line per meeting, the head count, a blank row,
// then the table of its students.
func (wb *workbook) sectionSheet(name string, sec *timetable.Section, students []classStudent) error {
	f, v := wb.f, wb.v
	if _, err := f.NewSheet(name); err != nil {
		return err
	}
	head := []string{strings.TrimSpace(sec.ID + " " + sec.Title)}
	var about []string
	if sec.Course != "" {
		about = append(about, "Course "+sec.Course)
	}
	if sec.Arrangement != "" {
		about = append(about, "arrangement "+sec.Arrangement)
	}
	if sec.Part != "" {
		about = append(about, "part "+sec.Part)
	}
	if names := v.staffNames(sec); len(names) > 0 {
		about = append(about, "taught by "+strings.Join(names, ", "))
	}
	head = append(head, strings.Join(about, ", "))
	for i := range v.meetings {
		if m := &v.meetings[i]; m.sec == sec {
			head = append(head, v.classMeetingText(m))
		}
	}
	si := v.t.SectionIndex()[sec.ID]
	count := fmt.Sprintf("%d students", len(students))
	if len(students) == 1 {
		count = "1 student"
	}
	if limit := v.t.SectionLimit(si); limit > 0 {
		count += fmt.Sprintf(" (limit %d)", limit)
	}
	head = append(head, count)
	for r, text := range head {
		cell := fmt.Sprintf("A%d", r+1)
		if err := f.SetCellStr(name, cell, text); err != nil {
			return err
		}
		style := wb.st.note
		if r == 0 {
			style = wb.st.title
		}
		if err := f.SetCellStyle(name, cell, cell, style); err != nil {
			return err
		}
	}
	return wb.fillTable(name, len(head)+2, StaffClassListColumns, staffClassWidths, v.staffClassRows(sec, students))
}

// classMeetingText is "Meeting 1: Mon 09:00–11:00, R101, Main Building,
// weeks 1-6" (a pattern day: "Meeting 1: Mon 09:00–09:50 ...").
func (v *view) classMeetingText(m *meeting) string {
	s := fmt.Sprintf("Meeting %d: %s %s–%s", m.num, timetable.DayName(m.day), m.from, m.to)
	if r := roomText(m.room); r != "" {
		s += ", " + r
	} else {
		s += ", online / off-site"
	}
	if w := v.weekRanges(m); w != "" {
		s += ", weeks " + w
	}
	return s
}

// fillTable writes header and rows into an existing sheet from row top
// (1-based): a header row in the header style, text and number cells
// below, an AutoFilter over them, column widths, and page setup with the
// rows down to the header repeated on each page.
func (wb *workbook) fillTable(sheet string, top int, header []string, widths []float64, rows [][]any) error {
	f := wb.f
	for i, wd := range widths {
		col, _ := excelize.ColumnNumberToName(i + 1)
		if err := f.SetColWidth(sheet, col, col, wd); err != nil {
			return err
		}
	}
	first, _ := excelize.CoordinatesToCellName(1, top)
	end, _ := excelize.CoordinatesToCellName(len(header), top)
	hdr := make([]any, len(header))
	for i, h := range header {
		hdr[i] = h
	}
	if err := f.SetSheetRow(sheet, first, &hdr); err != nil {
		return err
	}
	if err := f.SetCellStyle(sheet, first, end, wb.st.header); err != nil {
		return err
	}
	for r, row := range rows {
		cell, _ := excelize.CoordinatesToCellName(1, top+1+r)
		if err := f.SetSheetRow(sheet, cell, &row); err != nil {
			return err
		}
	}
	last, _ := excelize.CoordinatesToCellName(len(header), top+len(rows))
	if err := f.AutoFilter(sheet, first+":"+last, nil); err != nil {
		return err
	}
	split := top
	if err := f.SetPanes(sheet, &excelize.Panes{Freeze: true, YSplit: split, TopLeftCell: fmt.Sprintf("A%d", top+1), ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	return wb.pageSetup(sheet, fmt.Sprintf("$1:$%d", top), "")
}
