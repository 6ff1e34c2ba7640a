package export

import (
	"fmt"
	"io"
	"strconv"

	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// LoadSheet is the name of the workbook's load and utilisation sheet.
const LoadSheet = "Load"

// WriteTimetableWorkbook writes the timetable workbook (.xlsx): the master
// sheet timetable.TimetableSheet with exactly timetable.TimetableColumns
// (one row per meeting sorted by day, start, section and meeting; frozen
// header, autofilter), one weekly grid sheet per staff member, room and
// cohort (days across, periods down, a merged block per meeting), the Load
// sheet, with sectioning (course requests in the term or sectioned
// students in s) the timetable.ClassListSheet (one row per sectioned
// student and section, timetable.ClassListColumns, sorted by section then
// student) and the SectioningSheet (opt.Findings, or else
// SectioningFindings with opt.Reasons),
// then opt.Extra. timetable.ReadSchedule reads the master sheet and the
// class lists back.
func WriteTimetableWorkbook(w io.Writer, t *timetable.Term, s *timetable.Schedule, opt Options) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return v.writeWorkbook(w, opt)
}

// workbook is one workbook being written, with its shared styles.
type workbook struct {
	v      *view
	f      *excelize.File
	st     styles
	paper  string       // "A4" or "Letter", for the sheets' page setup
	titles []printTitle // print titles to add when the workbook is written
}

func (v *view) writeWorkbook(w io.Writer, opt Options) (err error) {
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
	if err := f.SetSheetName("Sheet1", timetable.TimetableSheet); err != nil {
		return err
	}
	if err := wb.master(); err != nil {
		return err
	}
	subjects := v.gridSubjects()
	wanted := make([]string, 0, len(subjects)+len(opt.Extra))
	for _, who := range subjects {
		wanted = append(wanted, v.sheetTitle(who))
	}
	for _, x := range opt.Extra {
		wanted = append(wanted, x.Name)
	}
	reserved := []string{timetable.TimetableSheet, LoadSheet}
	if v.sectioning() {
		reserved = append(reserved, timetable.ClassListSheet, SectioningSheet)
	}
	names := SheetNames(wanted, reserved...)
	for i, who := range subjects {
		if err := wb.grid(names[i], who); err != nil {
			return fmt.Errorf("the sheet %q of the timetable workbook could not be written: %w", names[i], err)
		}
	}
	if err := wb.load(); err != nil {
		return fmt.Errorf("the sheet %q of the timetable workbook could not be written: %w", LoadSheet, err)
	}
	if v.sectioning() {
		if err := wb.classLists(); err != nil {
			return fmt.Errorf("the sheet %q of the timetable workbook could not be written: %w", timetable.ClassListSheet, err)
		}
		if err := wb.sectioningSheet(SectioningSheet, opt); err != nil {
			return fmt.Errorf("the sheet %q of the timetable workbook could not be written: %w", SectioningSheet, err)
		}
	}
	for i, x := range opt.Extra {
		if err := wb.extra(names[len(subjects)+i], x); err != nil {
			return fmt.Errorf("the sheet %q of the timetable workbook could not be written: %w", names[len(subjects)+i], err)
		}
	}
	gen := opt.generated().UTC().Format("2006-01-02T15:04:05Z")
	if err := f.SetDocProps(&excelize.DocProperties{
		Title: v.t.Name + " timetable", Creator: "termwright", Created: gen, Modified: gen,
	}); err != nil {
		return err
	}
	f.SetActiveSheet(0)
	return wb.writeTo(w)
}

// gridSubjects lists who gets a grid sheet (and a PDF): every staff member,
// room and cohort in term order.
func (v *view) gridSubjects() []Subject {
	out := make([]Subject, 0, len(v.t.Staff)+len(v.t.Rooms)+len(v.t.Cohorts))
	for _, s := range v.t.Staff {
		out = append(out, Subject{timetable.WhoStaff, s.ID})
	}
	for _, r := range v.t.Rooms {
		out = append(out, Subject{timetable.WhoRoom, r.ID})
	}
	for _, c := range v.t.Cohorts {
		out = append(out, Subject{timetable.WhoCohort, c.ID})
	}
	return out
}

// sheetTitle is the wanted (not yet Excel-safe) sheet name of a subject:
// a staff member's name, "Room R204", "Cohort C1".
func (v *view) sheetTitle(who Subject) string {
	switch who.Kind {
	case timetable.WhoStaff:
		if s := v.staff[who.ID]; s != nil && s.Name != "" {
			return s.Name
		}
		return who.ID
	case timetable.WhoRoom:
		return "Room " + who.ID
	case timetable.WhoCohort:
		return "Cohort " + who.ID
	}
	return who.ID
}

// master writes the Timetable sheet: a real AutoFilter over the header and
// every row (the autoFilter element, ECMA-376 Part 1 §18.3.1.2, besides
// the hidden _xlnm._FilterDatabase name), frozen header, page setup.
func (wb *workbook) master() error {
	f, sheet := wb.f, timetable.TimetableSheet
	items := wb.v.masterItems()
	last, _ := excelize.CoordinatesToCellName(len(timetable.TimetableColumns), len(items)+1)
	// The stream writer writes what the sheet holds when it starts (sheet
	// properties) and when it flushes (filter, page setup): set them first.
	if err := f.AutoFilter(sheet, "A1:"+last, nil); err != nil {
		return err
	}
	if err := wb.pageSetup(sheet, "$1:$1", ""); err != nil {
		return err
	}
	sw, err := f.NewStreamWriter(sheet)
	if err != nil {
		return err
	}
	widths := []float64{12, 40, 9, 6, 7, 7, 10, 14, 14, 12, 30}
	for i, wd := range widths {
		if err := sw.SetColWidth(i+1, i+1, wd); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	header := make([]any, len(timetable.TimetableColumns))
	for i, h := range timetable.TimetableColumns {
		header[i] = excelize.Cell{StyleID: wb.st.header, Value: h}
	}
	if err := sw.SetRow("A1", header); err != nil {
		return err
	}
	row := make([]any, len(timetable.TimetableColumns))
	for n, i := range items {
		m := &wb.v.meetings[i]
		for k, c := range wb.v.masterRow(m) {
			row[k] = c
		}
		row[2] = m.num
		cell, _ := excelize.CoordinatesToCellName(1, n+2)
		if err := sw.SetRow(cell, row); err != nil {
			return err
		}
	}
	return sw.Flush()
}

// extra writes one of Options.Extra.
func (wb *workbook) extra(name string, x ExtraSheet) error {
	f := wb.f
	if _, err := f.NewSheet(name); err != nil {
		return err
	}
	for i, h := range x.Header {
		cell, _ := excelize.CoordinatesToCellName(i+1, 1)
		if err := f.SetCellValue(name, cell, h); err != nil {
			return err
		}
	}
	if len(x.Header) > 0 {
		end, _ := excelize.CoordinatesToCellName(len(x.Header), 1)
		if err := f.SetCellStyle(name, "A1", end, wb.st.header); err != nil {
			return err
		}
		if err := f.SetPanes(name, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
			return err
		}
	}
	for r, cells := range x.Rows {
		if err := f.SetSheetRow(name, "A"+strconv.Itoa(r+2), &cells); err != nil {
			return err
		}
	}
	titles := ""
	if len(x.Header) > 0 {
		titles = "$1:$1"
	}
	return wb.pageSetup(name, titles, "")
}
