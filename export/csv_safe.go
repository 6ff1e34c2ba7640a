package export

import (
	"encoding/csv"
	"io"

	"github.com/termwright/termwright/timetable"
)

// writeSafeCSV writes header and rows as RFC 4180 CSV (UTF-8, CRLF line
// ends) with timetable.SafeCSVCell applied to every data cell, so that a
// spreadsheet program shows a cell such as "=1+1" as text (OWASP "CSV
// Injection"). Every CSV export goes through it. The rows' cells are
// rewritten in place.
func writeSafeCSV(w io.Writer, header []string, rows [][]string) error {
	cw := csv.NewWriter(w)
	cw.UseCRLF = true
	if err := cw.Write(header); err != nil {
		return err
	}
	for _, row := range rows {
		for k, c := range row {
			row[k] = timetable.SafeCSVCell(c)
		}
		if err := cw.Write(row); err != nil {
			return err
		}
	}
	cw.Flush()
	return cw.Error()
}
