package timetable

// ColumnNote is the explanation of one column of the term workbook, as
// the template shows it in the note on the column's header.
type ColumnNote struct {
	Sheet, Column, Note string
}

// TemplateNotes lists the note of every column of every sheet, in the
// template's order (sheets, then columns), for a term written as CSV files,
// where header cells cannot carry notes.
func TemplateNotes() []ColumnNote {
	var out []ColumnNote
	for _, spec := range sheetSpecs {
		for i, col := range spec.cols {
			if i < len(spec.notes) {
				out = append(out, ColumnNote{Sheet: spec.name, Column: col, Note: spec.notes[i]})
			}
		}
	}
	return out
}
