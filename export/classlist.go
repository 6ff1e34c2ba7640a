package export

import (
	"io"
	"sort"

	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// sectioning reports whether the timetable has a sectioning to show: the
// term has course requests or the timetable holds sectioned students. The
// class lists and the sectioning report are written only then, so that a
// term without requests publishes exactly what it did before.
func (v *view) sectioning() bool { return len(v.t.Requests) > 0 || len(v.sectioned) > 0 }

// classListRows are the rows of the class-list sheet and CSV: one per
// sectioned student (Schedule.Enrolments) and section, cells in the order
// of timetable.ClassListColumns, sorted by section ID, then student ID; a
// repeated (student, section) pair is listed once.
func (v *view) classListRows() [][]string {
	secIdx := v.t.SectionIndex()
	type pair struct{ sec, st string }
	seen := map[pair]bool{}
	var pairs []pair
	for _, e := range v.sectioned {
		k := pair{e.Section, e.Student}
		if !seen[k] {
			seen[k] = true
			pairs = append(pairs, k)
		}
	}
	sort.Slice(pairs, func(i, j int) bool {
		if pairs[i].sec != pairs[j].sec {
			return pairs[i].sec < pairs[j].sec
		}
		return pairs[i].st < pairs[j].st
	})
	rows := make([][]string, len(pairs))
	for i, p := range pairs {
		row := []string{p.sec, "", "", "", p.st}
		if si, ok := secIdx[p.sec]; ok {
			s := &v.t.Sections[si]
			row[1], row[2], row[3] = s.Course, s.Part, s.Title
		}
		rows[i] = row
	}
	return rows
}

// WriteClassListCSV writes the class lists of s as RFC 4180 CSV (UTF-8,
// CRLF line ends, header row timetable.ClassListColumns): one row per
// sectioned student and section, sorted by section, then student, with
// timetable.SafeCSVCell applied to every cell (OWASP "CSV Injection").
// Fixed enrolments are term data and are not listed.
func WriteClassListCSV(w io.Writer, t *timetable.Term, s *timetable.Schedule) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return writeClassListCSV(w, v)
}

func writeClassListCSV(w io.Writer, v *view) error {
	return writeSafeCSV(w, timetable.ClassListColumns, v.classListRows())
}

// classLists writes the timetable.ClassListSheet sheet: the header
// timetable.ClassListColumns, the rows of classListRows as text cells,
// frozen header, a real AutoFilter (ECMA-376 Part 1 §18.3.1.2), page setup
// with the header repeated.
func (wb *workbook) classLists() error {
	rows := wb.v.classListRows()
	cells := make([][]any, len(rows))
	for i, row := range rows {
		cells[i] = make([]any, len(row))
		for k, c := range row {
			cells[i][k] = c
		}
	}
	return wb.table(timetable.ClassListSheet, timetable.ClassListColumns, []float64{12, 12, 10, 40, 16}, cells)
}

// table writes a new sheet holding one table (cells are strings or
// numbers, never formulas): header row,
// frozen header, AutoFilter over every row, column widths, landscape page
// setup with the header repeated on every page.
func (wb *workbook) table(sheet string, header []string, widths []float64, rows [][]any) error {
	f := wb.f
	if _, err := f.NewSheet(sheet); err != nil {
		return err
	}
	last, _ := excelize.CoordinatesToCellName(len(header), len(rows)+1)
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
	for i, wd := range widths {
		if err := sw.SetColWidth(i+1, i+1, wd); err != nil {
			return err
		}
	}
	if err := sw.SetPanes(&excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"}); err != nil {
		return err
	}
	cells := make([]any, len(header))
	for i, h := range header {
		cells[i] = excelize.Cell{StyleID: wb.st.header, Value: h}
	}
	if err := sw.SetRow("A1", cells); err != nil {
		return err
	}
	for n, row := range rows {
		cell, _ := excelize.CoordinatesToCellName(1, n+2)
		if err := sw.SetRow(cell, row); err != nil {
			return err
		}
	}
	return sw.Flush()
}
