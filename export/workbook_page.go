package export

import (
	"fmt"
	"io"

	"github.com/xuri/excelize/v2"
)

// ECMA-376 Part 1 §18.3.1.64 (pageSetup paperSize): 1 is US Letter, 9 is A4.
const (
	xlsxPaperLetter = 1
	xlsxPaperA4     = 9
)

// pageSetup makes a sheet print well: landscape on the chosen paper, scaled
// to one page wide (as many pages down as it needs), with the rows (and
// columns) titleRows and titleCols, such as "$1:$1" and "$A:$A", repeated
// on every printed page (the _xlnm.Print_Titles name, ECMA-376 Part 1
// §18.2.6). Call it before a stream writer is made for the sheet: the
// stream writer writes the sheet properties when it starts.
func (wb *workbook) pageSetup(sheet, titleRows, titleCols string) error {
	f := wb.f
	paper := xlsxPaperA4
	if wb.paper == "Letter" {
		paper = xlsxPaperLetter
	}
	landscape, wide, tall := "landscape", 1, 0 // fitToHeight 0: as many pages as needed
	if err := f.SetPageLayout(sheet, &excelize.PageLayoutOptions{
		Size: &paper, Orientation: &landscape, FitToWidth: &wide, FitToHeight: &tall,
	}); err != nil {
		return err
	}
	fit := true
	if err := f.SetSheetProps(sheet, &excelize.SheetPropsOptions{FitToPage: &fit}); err != nil {
		return err
	}
	ref := ""
	q := quoteSheet(sheet)
	switch {
	case titleRows != "" && titleCols != "":
		ref = q + "!" + titleCols + "," + q + "!" + titleRows
	case titleRows != "":
		ref = q + "!" + titleRows
	case titleCols != "":
		ref = q + "!" + titleCols
	default:
		return nil
	}
	wb.titles = append(wb.titles, printTitle{sheet: sheet, ref: ref})
	return nil
}

// printTitle is one sheet's _xlnm.Print_Titles, added when the workbook
// is written (addPrintTitles).
type printTitle struct{ sheet, ref string }

// addPrintTitles adds the collected print titles as sheet-scoped defined
// names. excelize's SetDefinedName scans every existing name and lists
// every sheet for each, which made a workbook of a few thousand grid
// sheets take most of an hour; so only the first goes through it (and its
// checks), and the rest are copies of it with their own reference and
// sheet index, all indexes taken from one sheet list.
func (wb *workbook) addPrintTitles() error {
	if len(wb.titles) == 0 {
		return nil
	}
	f := wb.f
	first := wb.titles[0]
	if err := f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", RefersTo: first.ref, Scope: first.sheet}); err != nil {
		return fmt.Errorf("print titles: %w", err)
	}
	if len(wb.titles) == 1 {
		return nil
	}
	index := map[string]int{}
	for i, name := range f.GetSheetList() {
		index[name] = i
	}
	names := &f.WorkBook.DefinedNames.DefinedName
	template := (*names)[len(*names)-1]
	seen := map[string]bool{first.sheet: true}
	for _, pt := range wb.titles[1:] {
		id, ok := index[pt.sheet]
		if !ok || seen[pt.sheet] {
			return fmt.Errorf("print titles: sheet %q is missing or has its titles twice", pt.sheet)
		}
		seen[pt.sheet] = true
		d := template
		d.Data = pt.ref
		d.LocalSheetID = &id
		*names = append(*names, d)
	}
	return nil
}

// writeTo adds the print titles and writes the workbook to w.
func (wb *workbook) writeTo(w io.Writer) error {
	if err := wb.addPrintTitles(); err != nil {
		return err
	}
	_, err := wb.f.WriteTo(w)
	return err
}

// quoteSheet quotes a sheet name for a formula reference: 'Room R1',
// with a quote inside doubled.
func quoteSheet(name string) string {
	out := []rune{'\''}
	for _, r := range name {
		out = append(out, r)
		if r == '\'' {
			out = append(out, '\'')
		}
	}
	return string(append(out, '\''))
}
