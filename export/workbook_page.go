package export

import (
	"fmt"

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
	if err := f.SetDefinedName(&excelize.DefinedName{Name: "_xlnm.Print_Titles", RefersTo: ref, Scope: sheet}); err != nil {
		return fmt.Errorf("print titles: %w", err)
	}
	return nil
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
