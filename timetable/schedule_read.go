package timetable

import (
	"bytes"
	"encoding/csv"
	"io"
	"path/filepath"
	"strings"

	"github.com/xuri/excelize/v2"
)

// schedMaxBytes bounds the size of a file read by readInput: a timetable,
// a class-list file or a requests file.
const schedMaxBytes = 200 << 20

// schedMaxRows bounds the rows read from a timetable sheet.
const schedMaxRows = 1_000_000

// ReadSchedule reads a timetable written for term t: the Timetable sheet of
// an .xlsx workbook (or, when the workbook has a single sheet, that sheet),
// or a .csv file with the same headers. The headers are
// TimetableColumns, matched without regard to case or surrounding spaces,
// in any order; Section, Day, Start and Room are required, Meeting may be
// left blank (blank meetings of a section take the lowest unused numbers in
// row order). Title, End, Staff and Cohorts are for reading only: the term
// decides them, and a cell that disagrees with the term gets a warning.
//
// A row of a section placed by meeting patterns (Section.Times) names its
// meeting time: Day holds all its days ("Mon Wed Fri"), Start its start,
// and End and Weeks, when filled in, pick among meeting times with the
// same days and start; the row gives a placement with Time set and Period
// -1, and a row that matches no meeting time (or several) is an error at
// the first cell that does not fit, listing the section's meeting times.
//
// A workbook's optional ClassListSheet ("Class lists") gives
// Schedule.Enrolments, the sectioned students, keyed on Section and
// Student (see schedParseClassList); a CSV timetable has none here (read
// its class-list file with ReadClassListCSV).
//
// Each placement's Src names its row ("Timetable row 12"). Rows with a
// cell that cannot be read (a day or time that is not in the grid, a
// meeting number that is not a whole number) are left out and reported as
// errors at the cell, e.g. Timetable!E12; sections and rooms unknown to the
// term are kept, for Check to report. The error is non-nil, and wraps
// ErrUnreadable, only when the file cannot be read at all.
func ReadSchedule(path string, t *Term) (*Schedule, Problems, error) {
	main, lists, err := schedFileSheets(path)
	if err != nil {
		return nil, nil, err
	}
	s, ps := schedFromSheets(t, main, lists)
	return s, ps, nil
}

// schedFromSheets reads a timetable's rows and, when there is one, its
// class-list sheet, for term t; the problems are sorted.
func schedFromSheets(t *Term, main schedSheet, lists *schedSheet) (*Schedule, Problems) {
	s, ps := schedParse(t, main.name, main.rows, main.lines)
	if lists != nil {
		var more Problems
		s.Enrolments, more = schedParseClassList(t, lists.name, lists.rows, lists.lines)
		ps = append(ps, more...)
	}
	ps.Sort()
	return s, ps
}

// schedFileSheets opens a timetable file (.csv, or an .xlsx workbook) and
// returns its timetable rows and, for a workbook with a class-list sheet,
// that sheet's rows (nil otherwise). The error wraps ErrUnreadable.
func schedFileSheets(path string) (main schedSheet, lists *schedSheet, err error) {
	data, err := readInput(path, timetableInput)
	if err != nil {
		return main, nil, err
	}
	name := filepath.Base(path)
	if strings.EqualFold(filepath.Ext(path), ".csv") {
		main.name = strings.TrimSuffix(name, filepath.Ext(name))
		main.rows, main.lines, err = schedCSVRows(data, name)
		return main, nil, err
	}
	return schedXLSXRows(data, name)
}

// ReadClassListCSV reads a class-list CSV file (the ClassListColumns
// headers; see schedParseClassList) written for term t, the CSV form of
// a timetable workbook's Class lists sheet. Problems name the file stem as
// the sheet. The error wraps ErrUnreadable only when the file cannot be
// read at all.
func ReadClassListCSV(path string, t *Term) ([]Enrolment, Problems, error) {
	data, err := readInput(path, classListInput)
	if err != nil {
		return nil, nil, err
	}
	name := filepath.Base(path)
	rows, lines, err := schedCSVRows(data, name)
	if err != nil {
		return nil, nil, err
	}
	es, ps := schedParseClassList(t, strings.TrimSuffix(name, filepath.Ext(name)), rows, lines)
	ps.Sort()
	return es, ps, nil
}

// schedSheet is one sheet's non-blank rows with their 1-based numbers.
type schedSheet struct {
	name  string
	rows  [][]string
	lines []int
}

// schedCSVRows splits CSV bytes into records with their 1-based line
// numbers; blank records are dropped.
func schedCSVRows(data []byte, name string) ([][]string, []int, error) {
	data = bytes.TrimPrefix(data, []byte("\xef\xbb\xbf"))
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1
	var rows [][]string
	var lines []int
	for {
		rec, err := r.Read()
		if err == io.EOF {
			break
		}
		if err != nil {
			return nil, nil, unreadablef("%s is not a readable CSV file (%s) — save it again as CSV (comma separated)", name, oneLineErr(err))
		}
		line, _ := r.FieldPos(0)
		if len(rows) >= schedMaxRows {
			return nil, nil, unreadablef("%s has more than %d rows — a timetable holds far fewer", name, schedMaxRows)
		}
		unguardCSVRecord(rec) // the quote SafeCSVCell put in front of formula-like cells
		if !schedBlank(rec) {
			rows = append(rows, rec)
			lines = append(lines, line)
		}
	}
	return rows, lines, nil
}

// schedXLSXRows opens an .xlsx workbook and returns the raw cell values of
// its Timetable sheet (or of its only sheet), and of its Class lists sheet
// when it has one (nil otherwise).
func schedXLSXRows(data []byte, name string) (main schedSheet, lists *schedSheet, err error) {
	if !bytes.HasPrefix(data, []byte("PK\x03\x04")) {
		return main, nil, unreadablef("%s is not an .xlsx workbook — save the timetable as an Excel Workbook (.xlsx) or as CSV", name)
	}
	err = withWorkbook(data, name, "save an unprotected copy as an Excel Workbook (.xlsx)", func(f *excelize.File, census map[string]sheetCensus) error {
		list := f.GetSheetList()
		sheet, classes := "", ""
		for _, sh := range list {
			switch {
			case strings.EqualFold(strings.TrimSpace(sh), TimetableSheet):
				sheet = sh
			case strings.EqualFold(strings.TrimSpace(sh), ClassListSheet):
				classes = sh
			}
		}
		if sheet == "" {
			if len(list) != 1 {
				return unreadablef("%s has no %s sheet — give the workbook that termwright wrote, or name the sheet with the timetable %q", name, TimetableSheet, TimetableSheet)
			}
			sheet = list[0]
		}
		var err error
		if main, err = schedReadSheet(f, census, name, sheet); err != nil {
			return err
		}
		if classes != "" {
			cl, err := schedReadSheet(f, census, name, classes)
			if err != nil {
				return err
			}
			lists = &cl
		}
		return nil
	})
	if err != nil {
		return schedSheet{}, nil, err
	}
	return main, lists, nil
}

// withWorkbook checks an .xlsx package (checkPackage), opens it and calls
// read with the open workbook and the census of its sheets. A workbook the
// spreadsheet library cannot open, or panics on, is refused with one
// sentence (fix says what to do) that wraps ErrUnreadable.
func withWorkbook(data []byte, name, fix string, read func(f *excelize.File, census map[string]sheetCensus) error) (err error) {
	census, err := checkPackage(data, name)
	if err != nil {
		return unreadablef("%s", err.Error())
	}
	defer func() {
		// The spreadsheet library may panic on malformed parts: a damaged
		// file must give a sentence, not a stack trace.
		if rec := recover(); rec != nil {
			err = unreadablef("%s is damaged (its contents are not a valid workbook) — open and save it again in your spreadsheet program", name)
		}
	}()
	f, err := excelize.OpenReader(bytes.NewReader(data), excelize.Options{
		RawCellValue: true, UnzipSizeLimit: maxUnzipped, UnzipXMLSizeLimit: 16 << 20,
	})
	if err != nil {
		return unreadablef("%s is damaged, password-protected or not an .xlsx workbook (%s) — %s", name, oneLineErr(err), fix)
	}
	defer f.Close()
	return read(f, census)
}

// schedReadSheet reads the non-blank rows of one sheet of an open
// workbook, refusing a sheet read short of the rows its XML holds.
func schedReadSheet(f *excelize.File, census map[string]sheetCensus, name, sheet string) (schedSheet, error) {
	out := schedSheet{name: sheet}
	it, err := f.Rows(sheet)
	if err != nil {
		return out, unreadablef("%s: sheet %q cannot be read (%s) — open and save the workbook again", name, sheet, oneLineErr(err))
	}
	defer it.Close()
	n := 0
	for it.Next() {
		n++
		if n > schedMaxRows {
			return out, unreadablef("%s: sheet %q has more than %d rows — a timetable holds far fewer", name, sheet, schedMaxRows)
		}
		cols, err := it.Columns(excelize.Options{RawCellValue: true})
		if err != nil {
			return out, unreadablef("%s: sheet %q row %d cannot be read (%s) — open and save the workbook again", name, sheet, n, oneLineErr(err))
		}
		if !schedBlank(cols) {
			out.rows = append(out.rows, cols)
			out.lines = append(out.lines, n)
		}
	}
	if err := it.Error(); err != nil {
		return out, unreadablef("%s: sheet %q cannot be read (%s) — open and save the workbook again", name, sheet, oneLineErr(err))
	}
	if c, ok := census[sheet]; ok && n != c.lastRow {
		return out, unreadablef("%s: the %s sheet could be read only up to row %d of its %d rows — open and save the workbook again in your spreadsheet program", name, Quote(sheet), n, c.lastRow)
	}
	return out, nil
}

// schedBlank reports whether every cell is blank.
func schedBlank(rec []string) bool {
	for _, c := range rec {
		if strings.TrimSpace(c) != "" {
			return false
		}
	}
	return true
}

// oneLineErr keeps the first line of an error text.
func oneLineErr(err error) string {
	s, _, _ := strings.Cut(err.Error(), "\n")
	return s
}
