package timetable

import (
	"path/filepath"
	"strings"
	"unicode/utf8"

	"github.com/xuri/excelize/v2"
)

// RequestsSheet is the name of the sheet (or CSV file stem) that lists
// requests for an explanation: columns RequestColumns.
const RequestsSheet = "Requests"

// RequestColumns are the headers of a requests sheet: Section, At (a day
// and start, "Tue 10:00", or a meeting pattern's days and start, "Mon Wed
// Fri 9:00") and, optionally, Room.
var RequestColumns = []string{"Section", "At", "Room"}

// maxRequests caps the rows of a requests sheet.
const maxRequests = 10_000

// requestsList is the header of a requests sheet.
var requestsList = listColumns{noun: "request", needs: "the requests need the columns", columns: RequestColumns, required: []string{"Section", "At"}}

// RequestRow is one row of a requests sheet, as written: what the
// explanation package reads into a request.
type RequestRow struct {
	Section string   // section ID, never ""
	At      string   // the At cell: day(s) and start as written
	Room    string   // room ID; "" for any suitable room
	Src     Source   // the row
	AtPos   Position // the At cell, for a problem with the time
}

// ReadRequests reads the rows of a requests file: a .csv file, or the
// Requests sheet of an .xlsx workbook (matched without regard to case).
// Every problem of a row (a blank Section, a cell longer than
// MaxCellChars, a missing column) is reported at its place and the row
// left out; the other rows are returned even then, so that the caller
// reading their At cells reports every problem in one run. The error is
// non-nil, and wraps ErrUnreadable, only when the file cannot be read.
func ReadRequests(path string) ([]RequestRow, Problems, error) {
	data, err := readInput(path, requestsInput)
	if err != nil {
		return nil, nil, err
	}
	return ParseRequests(data, filepath.Base(path))
}

// ParseRequests reads requests from the bytes of a file called name: CSV
// when the name ends in .csv (the stem names the sheet in problems), an
// .xlsx workbook when it ends in .xlsx or .xlsm. Otherwise as ReadRequests.
func ParseRequests(data []byte, name string) ([]RequestRow, Problems, error) {
	ext := filepath.Ext(name)
	var sh schedSheet
	var err error
	switch strings.ToLower(ext) {
	case ".csv":
		sh.name = strings.TrimSuffix(name, ext)
		sh.rows, sh.lines, err = schedCSVRows(data, name)
	case ".xlsx", ".xlsm":
		sh, err = requestsXLSXSheet(data, name)
	default:
		return nil, nil, unreadablef("%s: requests must be a .csv file or an .xlsx workbook with a sheet named %q", name, RequestsSheet)
	}
	if err != nil {
		return nil, nil, err
	}
	rows, ps := requestRows(sh)
	ps.Sort()
	return rows, ps, nil
}

// requestsXLSXSheet reads the non-blank rows of a workbook's Requests sheet.
func requestsXLSXSheet(data []byte, name string) (sh schedSheet, err error) {
	err = withWorkbook(data, name, "save an unprotected copy as an Excel Workbook (.xlsx) or use a CSV file", func(f *excelize.File, census map[string]sheetCensus) error {
		for _, s := range f.GetSheetList() {
			if strings.EqualFold(strings.TrimSpace(s), RequestsSheet) {
				var err error
				sh, err = schedReadSheet(f, census, name, s)
				return err
			}
		}
		return unreadablef("%s has no sheet named %q — add one with the columns %s", name, RequestsSheet, strings.Join(RequestColumns, ", "))
	})
	return sh, err
}

// requestRows reads the header and the request rows of a sheet.
func requestRows(sh schedSheet) ([]RequestRow, Problems) {
	var ps Problems
	whole := Position{Sheet: sh.name}
	switch {
	case len(sh.rows) == 0:
		ps.errorf(whole, "there are no requests — write a header row %s and one row per request", strings.Join(RequestColumns, ", "))
		return nil, ps
	case len(sh.rows) > maxRequests+1:
		ps.errorf(whole, "there are more than %d requests — split the list", maxRequests)
		return nil, ps
	}
	col, ok := readListHeader(requestsList, sh.name, sh.rows[0], sh.lines[0], &ps)
	if !ok {
		return nil, ps
	}
	var out []RequestRow
	for r := 1; r < len(sh.rows); r++ {
		cell := schedCell(sh.name, col, sh.rows[r], sh.lines[r])
		sec, spos := cell("Section")
		at, apos := cell("At")
		room, rpos := cell("Room")
		good := true
		for _, c := range []struct {
			v   string
			pos Position
		}{{sec, spos}, {at, apos}, {room, rpos}} {
			if utf8.RuneCountInString(c.v) > MaxCellChars {
				ps.errorf(c.pos, "the cell holds %s, more than the %d characters a request cell may hold — shorten it", Quote(c.v), MaxCellChars)
				good = false
			}
		}
		if sec == "" {
			ps.errorf(spos, "the Section is blank — write the section ID, or delete the row")
			good = false
		}
		if good {
			out = append(out, RequestRow{Section: sec, At: at, Room: room, Src: Source{Sheet: sh.name, Row: sh.lines[r]}, AtPos: apos})
		}
	}
	if len(out) == 0 && len(ps.Errors()) == 0 {
		ps.errorf(whole, "there are no requests below the header — add one row per request")
	}
	return out, ps
}
