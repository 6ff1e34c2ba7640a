package timetable

import (
	"fmt"
	"io"
	"strings"

	"github.com/xuri/excelize/v2"
)

// templateAuthor signs the notes of the template's header cells.
const templateAuthor = "termwright"

// templateKeys are the keys written on an empty template's Term sheet.
var templateKeys = []string{"Name", "First day", "Last day", "Time zone"}

// dropDowns lists, per sheet and column, the values offered in a drop-down
// list. strict lists refuse other values; the others only advise (a
// Strength may also be a number).
var dropDowns = []struct {
	sheet, col string
	values     []string
	strict     bool
}{
	{shTerm, "Key", append(append([]string{}, templateKeys...), "Holiday", "Holidays"), false},
	{shPeriods, "Day", spellings(mondayFirst(dayChoices)), true},
	{shUnavailable, "Day", spellings(mondayFirst(dayChoices)), true},
	{shUnavailable, "Strength", []string{"hard"}, false},
	{shRelations, "Kind", spellings(relationChoices), true},
	{shRelations, "Strength", []string{"hard"}, false},
	{shWeights, "Criterion", spellings(criterionChoices), true},
}

// WriteTemplate writes an empty term workbook: every sheet of the layout with
// its headers in row 1, a note on each header cell explaining the column,
// drop-down lists where the values are fixed (days, strength, relation
// kinds, criteria, Term keys), frozen header rows, and the Term sheet's keys
// ready for their values. Data rows start at row 2.
func WriteTemplate(w io.Writer) error {
	f := excelize.NewFile()
	defer f.Close()
	bold, err := f.NewStyle(&excelize.Style{Font: &excelize.Font{Bold: true}})
	if err != nil {
		return err
	}
	for i, spec := range sheetSpecs {
		if err := templateSheet(f, i, spec, bold); err != nil {
			return fmt.Errorf("writing the %s sheet of the template: %w", spec.name, err)
		}
	}
	lists := 0 // columns used on the hidden Lists sheet
	for _, d := range dropDowns {
		if err := addDropDown(f, d.sheet, d.col, d.values, d.strict, &lists); err != nil {
			return fmt.Errorf("adding the %s drop-down list of the template: %w", d.col, err)
		}
	}
	for i, k := range templateKeys {
		if err := f.SetCellStr(shTerm, fmt.Sprintf("A%d", i+2), k); err != nil {
			return err
		}
	}
	if err := f.SetCellStr(shTerm, "B5", "UTC"); err != nil {
		return err
	}
	f.SetActiveSheet(0)
	_, err = f.WriteTo(w)
	return err
}

// templateSheet writes one sheet's headers, notes, widths and frozen row.
func templateSheet(f *excelize.File, i int, spec sheetSpec, bold int) error {
	if i == 0 {
		if err := f.SetSheetName(f.GetSheetName(0), spec.name); err != nil {
			return err
		}
	} else if _, err := f.NewSheet(spec.name); err != nil {
		return err
	}
	for c, h := range spec.cols {
		cell := colLetter(c) + "1"
		if err := f.SetCellStr(spec.name, cell, h); err != nil {
			return err
		}
		width := float64(max(len(h), 12) + 4)
		if err := f.SetColWidth(spec.name, colLetter(c), colLetter(c), width); err != nil {
			return err
		}
		note := spec.notes[c]
		if spec.required && listHas(spec.need, h) {
			note = "Required. " + note
		}
		if err := f.AddComment(spec.name, excelize.Comment{
			Cell: cell, Author: templateAuthor,
			Paragraph: []excelize.RichTextRun{{Text: note}},
		}); err != nil {
			return err
		}
	}
	last := colLetter(len(spec.cols)-1) + "1"
	if err := f.SetCellStyle(spec.name, "A1", last, bold); err != nil {
		return err
	}
	return f.SetPanes(spec.name, &excelize.Panes{Freeze: true, YSplit: 1, TopLeftCell: "A2", ActivePane: "bottomLeft"})
}

// maxInlineList is the most characters of a list written into the
// drop-down itself, separators included (Microsoft, "Excel specifications
// and limits": 255 characters for a data validation list source; excelize
// refuses longer ones). Longer lists go on the hidden Lists sheet.
const maxInlineList = 255

// addDropDown offers values in every data cell of a column. A list too long
// to write inline is written down a column of the hidden Lists sheet and
// the drop-down refers to that range (ECMA-376 Part 1 §18.3.1.32: formula1
// of a list validation may be a cell range); lists counts the columns used.
func addDropDown(f *excelize.File, sheet, col string, values []string, strict bool, lists *int) error {
	spec := specFor(sheet)
	idx := -1
	for i, c := range spec.cols {
		if c == col {
			idx = i
		}
	}
	if idx < 0 {
		return fmt.Errorf("no column %q", col)
	}
	dv := excelize.NewDataValidation(true)
	letter := colLetter(idx)
	dv.SetSqref(fmt.Sprintf("%s2:%s%d", letter, letter, excelize.TotalRows))
	if utf16Len(strings.Join(values, ",")) <= maxInlineList {
		if err := dv.SetDropList(values); err != nil {
			return err
		}
	} else {
		ref, err := writeList(f, values, lists)
		if err != nil {
			return err
		}
		dv.SetSqrefDropList(ref)
	}
	switch {
	case strict && utf16Len(strings.Join(values, ", ")) > maxInlineList:
		dv.SetError(excelize.DataValidationErrorStyleStop, col, "Choose a value from the drop-down list.")
	case strict:
		dv.SetError(excelize.DataValidationErrorStyleStop, col, "Choose one of: "+strings.Join(values, ", ")+".")
	default:
		dv.SetError(excelize.DataValidationErrorStyleInformation, col, "Usual values: "+strings.Join(values, ", ")+". Other values are allowed.")
	}
	return f.AddDataValidation(sheet, dv)
}

// writeList writes values down the next free column of the hidden Lists
// sheet (made on first use) and returns the absolute reference of the cells.
func writeList(f *excelize.File, values []string, lists *int) (string, error) {
	if *lists == 0 {
		if _, err := f.NewSheet(shLists); err != nil {
			return "", err
		}
		if err := f.SetSheetVisible(shLists, false); err != nil {
			return "", err
		}
	}
	letter := colLetter(*lists)
	*lists++
	for i, v := range values {
		if err := f.SetCellStr(shLists, fmt.Sprintf("%s%d", letter, i+1), v); err != nil {
			return "", err
		}
	}
	return fmt.Sprintf("%s!$%s$1:$%s$%d", shLists, letter, letter, len(values)), nil
}

// utf16Len counts s in UTF-16 code units, as spreadsheet limits do.
func utf16Len(s string) int {
	n := 0
	for _, r := range s {
		n++
		if r >= 0x10000 {
			n++
		}
	}
	return n
}

func listHas(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}
