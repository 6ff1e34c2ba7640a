package encode

import (
	"bytes"
	"encoding/csv"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"
	"unicode/utf8"

	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

// RequestsSheet is the name of the sheet (or CSV file stem) that lists
// requests: columns Section, At ("Tue 10:00", or a meeting pattern's days
// and start, "Mon Wed Fri 9:00") and, optionally, Room.
const RequestsSheet = "Requests"

// maxRequests caps the rows of a requests sheet.
const maxRequests = 10000

// ReadRequests reads requests from a CSV file (.csv) or from the Requests
// sheet of a workbook (.xlsx). Every row with a problem is reported, each
// with its sheet and row, in one RequestError.
func ReadRequests(path string) ([]Request, error) {
	if fi, err := os.Stat(path); err == nil && !fi.Mode().IsRegular() {
		return nil, fmt.Errorf("%s is not a regular file (a device, pipe or folder) — give the requests .csv or .xlsx file itself", path)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, fmt.Errorf("cannot read the requests: %w", err)
	}
	switch strings.ToLower(filepath.Ext(path)) {
	case ".csv":
		return ParseRequestsCSV(bytes.NewReader(data), strings.TrimSuffix(filepath.Base(path), filepath.Ext(path)))
	case ".xlsx", ".xlsm":
		if err := timetable.CheckXLSX(data, filepath.Base(path)); err != nil {
			return nil, err
		}
		return ParseRequestsWorkbook(bytes.NewReader(data))
	}
	return nil, fmt.Errorf("%s: requests must be a .csv file or an .xlsx workbook with a sheet named %q", path, RequestsSheet)
}

// ParseRequestsCSV reads requests from CSV text; sheet names the rows in
// messages (the file's stem).
func ParseRequestsCSV(r io.Reader, sheet string) ([]Request, error) {
	cr := csv.NewReader(r)
	cr.FieldsPerRecord = -1
	cr.TrimLeadingSpace = true
	var rows [][]string
	var lines []int
	for {
		rec, err := cr.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				return nil, RequestError{{Src: timetable.Source{Sheet: sheet, Row: pe.Line}, Msg: "the CSV text cannot be read (" + pe.Err.Error() + ") — check the quotes on this line"}}
			}
			return nil, fmt.Errorf("cannot read the requests: %w", err)
		}
		line, _ := cr.FieldPos(0)
		rows = append(rows, rec)
		lines = append(lines, line)
		if len(rows) > maxRequests+1 {
			return nil, RequestError{{Src: timetable.Source{Sheet: sheet}, Msg: fmt.Sprintf("more than %d requests — split the list", maxRequests)}}
		}
	}
	return parseRequestRows(rows, lines, sheet)
}

// ParseRequestsWorkbook reads the Requests sheet of a workbook.
func ParseRequestsWorkbook(r io.Reader) ([]Request, error) {
	f, err := excelize.OpenReader(r)
	if err != nil {
		return nil, fmt.Errorf("the requests workbook cannot be read (%v) — save it again as .xlsx or use a CSV file", err)
	}
	defer f.Close()
	name := ""
	for _, s := range f.GetSheetList() {
		if strings.EqualFold(strings.TrimSpace(s), RequestsSheet) {
			name = s
			break
		}
	}
	if name == "" {
		return nil, RequestError{{Msg: fmt.Sprintf("the workbook has no sheet named %q — add one with the columns Section, At and Room", RequestsSheet)}}
	}
	rows, err := f.GetRows(name)
	if err != nil {
		return nil, fmt.Errorf("the %s sheet cannot be read: %v", name, err)
	}
	if len(rows) > maxRequests+1 {
		return nil, RequestError{{Src: timetable.Source{Sheet: name}, Msg: fmt.Sprintf("more than %d requests — split the list", maxRequests)}}
	}
	lines := make([]int, len(rows))
	for i := range lines {
		lines[i] = i + 1
	}
	return parseRequestRows(rows, lines, name)
}

// parseRequestRows reads a header row and request rows; lines[i] is the
// 1-based row number of rows[i] in the sheet or file.
func parseRequestRows(rows [][]string, lines []int, sheet string) ([]Request, error) {
	if len(rows) == 0 {
		return nil, RequestError{{Src: timetable.Source{Sheet: sheet}, Msg: "there are no requests — write a header row Section, At, Room and one row per request"}}
	}
	col := map[string]int{}
	for i, h := range rows[0] {
		h = strings.ToLower(strings.TrimSpace(strings.TrimPrefix(h, "\ufeff")))
		if _, dup := col[h]; !dup && h != "" {
			col[h] = i
		}
	}
	var errs RequestError
	for _, want := range []string{"section", "at"} {
		if _, ok := col[want]; !ok {
			errs = append(errs, InputError{Src: timetable.Source{Sheet: sheet, Row: lines[0]},
				Msg: fmt.Sprintf("the header has no %q column — the columns are Section, At (like \"Tue 10:00\") and Room (optional)", titleWord(want))})
		}
	}
	if len(errs) > 0 {
		return nil, errs
	}
	cell := func(row []string, name string) string {
		i, ok := col[name]
		if !ok || i >= len(row) {
			return ""
		}
		return strings.TrimSpace(row[i])
	}
	var out []Request
	for n, row := range rows[1:] {
		src := timetable.Source{Sheet: sheet, Row: lines[n+1]}
		sec, at, room := cell(row, "section"), cell(row, "at"), cell(row, "room")
		if sec == "" && at == "" && room == "" {
			continue
		}
		if sec == "" {
			errs = append(errs, InputError{Src: src, Msg: "the Section is empty — give the section ID"})
			continue
		}
		if long := longestCell(sec, at, room); long != "" {
			errs = append(errs, InputError{Src: src, Msg: fmt.Sprintf("a cell holds %s, more than the %d characters a request cell may hold — shorten it", timetable.Quote(long), timetable.MaxCellChars)})
			continue
		}
		req, err := NewRequest(sec, at, room)
		if err != nil {
			errs = append(errs, InputError{Src: src, Msg: "At: " + err.Error()})
			continue
		}
		req.Src = src
		out = append(out, req)
	}
	if len(errs) > 0 {
		return nil, errs
	}
	if len(out) == 0 {
		return nil, RequestError{{Src: timetable.Source{Sheet: sheet}, Msg: "there are no requests below the header — add one row per request"}}
	}
	return out, nil
}

// longestCell returns the first cell longer than timetable.MaxCellChars,
// or "".
func longestCell(cells ...string) string {
	for _, c := range cells {
		if utf8.RuneCountInString(c) > timetable.MaxCellChars {
			return c
		}
	}
	return ""
}

func titleWord(s string) string { return strings.ToUpper(s[:1]) + s[1:] }
