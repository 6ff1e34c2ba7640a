package timetable

import (
	"bytes"
	"errors"
	"os"
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
	fi, err := os.Stat(path)
	switch {
	case errors.Is(err, os.ErrNotExist):
		return nil, nil, unreadableCause(err, "%s does not exist — give the path of the requests .csv file or .xlsx workbook", path)
	case err != nil:
		return nil, nil, unreadableCause(err, "%s cannot be opened (%v) — check the path and its permissions", path, err)
	case fi.IsDir():
		return nil, nil, unreadablef("%s is a folder — give the requests .csv file or .xlsx workbook itself", path)
	case !fi.Mode().IsRegular():
		return nil, nil, unreadablef("%s", notRegular(path, fi).Error())
	case fi.Size() > schedMaxBytes:
		return nil, nil, unreadablef("%s is %d MB, larger than the %d MB a requests file may be", path, fi.Size()>>20, schedMaxBytes>>20)
	}
	data, err := os.ReadFile(path)
	if err != nil {
		return nil, nil, unreadableCause(err, "%s cannot be read (%v) — check its permissions", path, err)
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
	census, err := checkPackage(data, name)
	if err != nil {
		return sh, err
	}
	defer func() {
		// The spreadsheet library may panic on malformed parts.
		if rec := recover(); rec != nil {
			sh, err = schedSheet{}, unreadablef("%s is damaged (its contents are not a valid workbook) — open and save it again in your spreadsheet program", name)
		}
	}()
	f, err := excelize.OpenReader(bytes.NewReader(data), excelize.Options{
		RawCellValue: true, UnzipSizeLimit: maxUnzipped, UnzipXMLSizeLimit: 16 << 20,
	})
	if err != nil {
		return sh, unreadablef("%s is damaged, password-protected or not an .xlsx workbook (%s) — save an unprotected copy as an Excel Workbook (.xlsx) or use a CSV file", name, oneLineErr(err))
	}
	defer f.Close()
	for _, s := range f.GetSheetList() {
		if strings.EqualFold(strings.TrimSpace(s), RequestsSheet) {
			return schedReadSheet(f, census, name, s)
		}
	}
	return sh, unreadablef("%s has no sheet named %q — add one with the columns %s", name, RequestsSheet, strings.Join(RequestColumns, ", "))
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
