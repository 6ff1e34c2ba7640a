package timetable

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"path/filepath"
	"strings"

	"github.com/xuri/excelize/v2"
)

var (
	zipMagic = []byte("PK\x03\x04")
	cfbMagic = []byte{0xD0, 0xCF, 0x11, 0xE0, 0xA1, 0xB1, 0x1A, 0xE1} // OLE compound file: encrypted .xlsx or old .xls
	// encryptionInfo is the stream name of an encrypted OOXML package, in
	// UTF-16LE as it appears in the compound file's directory.
	encryptionInfo = []byte("E\x00n\x00c\x00r\x00y\x00p\x00t\x00i\x00o\x00n\x00I\x00n\x00f\x00o\x00")
)

// Load reads a term from path: an .xlsx workbook, or a directory of CSV files
// (one per sheet, named after the sheet). It returns the best Term that
// could be read and every problem of the whole workbook, sorted; the error
// is non-nil (and wraps ErrUnreadable) only when nothing could be read.
// Options such as WithColumns change how it reads.
func Load(path string, opts ...LoadOption) (*Term, Problems, error) {
	fi, err := os.Stat(path)
	if err != nil {
		if errors.Is(err, os.ErrNotExist) {
			return nil, nil, unreadableCause(err, "%s does not exist — give the path of a term workbook (.xlsx) or of a folder of CSV files", path)
		}
		return nil, nil, unreadableCause(err, "%s cannot be opened (%v) — check the path and its permissions", path, err)
	}
	if fi.IsDir() {
		return ReadCSVDir(path, opts...)
	}
	if !fi.Mode().IsRegular() {
		return nil, nil, notRegular(path, fi)
	}
	if strings.EqualFold(filepath.Ext(path), ".csv") {
		return nil, nil, unreadablef("%s is a single CSV file — give the folder that holds one CSV file per sheet (Term.csv, Periods.csv, ...)", path)
	}
	if fi.Size() > maxFileBytes {
		return nil, nil, unreadablef("%s is %d MB, larger than the %d MB a term workbook may be — remove unneeded sheets or data and try again", path, fi.Size()>>20, maxFileBytes>>20)
	}
	f, err := os.Open(path)
	if err != nil {
		return nil, nil, unreadableCause(err, "%s cannot be opened (%v) — check its permissions", path, err)
	}
	defer f.Close()
	return ReadWorkbook(f, filepath.Base(path), opts...)
}

// ReadWorkbook reads a term workbook in .xlsx form from r; name is used in
// messages. Like Load it returns a best-effort Term with all problems, and an
// error wrapping ErrUnreadable only when the bytes are not a readable
// workbook (not an .xlsx file, damaged, password-protected, too large).
func ReadWorkbook(r io.Reader, name string, opts ...LoadOption) (*Term, Problems, error) {
	sheets, date1904, err := readWorkbookSheets(r, name)
	if err != nil {
		return nil, nil, err
	}
	t, ps := buildTerm(sheets, date1904, newLoadConfig(opts))
	return t, ps, nil
}

// readWorkbookSheets reads, checks and unpacks an .xlsx workbook into raw
// sheets, and says whether it uses the 1904 date base system.
func readWorkbookSheets(r io.Reader, name string) (sheets []*rawSheet, date1904 bool, err error) {
	data, err := io.ReadAll(io.LimitReader(r, maxFileBytes+1))
	if err != nil {
		return nil, false, unreadablef("%s could not be read (%v) — check the file and try again", name, err)
	}
	if len(data) > maxFileBytes {
		return nil, false, unreadablef("%s is larger than the %d MB a term workbook may be — remove unneeded sheets or data and try again", name, maxFileBytes>>20)
	}
	if err := sniffWorkbook(data, name); err != nil {
		return nil, false, err
	}
	census, err := checkPackage(data, name)
	if err != nil {
		return nil, false, err
	}
	defer func() {
		// The spreadsheet library may panic on malformed package parts; a
		// damaged file must give a sentence, not a stack trace.
		if rec := recover(); rec != nil {
			sheets, date1904, err = nil, false, unreadablef("%s is damaged (its contents are not a valid workbook) — open and save it again in your spreadsheet program", name)
		}
	}()
	return readXLSXSheets(data, name, census)
}

// sniffWorkbook refuses, with one sentence each, the common kinds of file
// that are not an unprotected .xlsx workbook.
func sniffWorkbook(data []byte, name string) error {
	switch {
	case len(data) == 0:
		return unreadablef("%s is empty — save the term workbook again", name)
	case bytes.HasPrefix(data, cfbMagic):
		if bytes.Contains(data, encryptionInfo) {
			return unreadablef("%s is password-protected — save a copy without a password (File, Info, Protect Workbook) and check that copy", name)
		}
		return unreadablef("%s is an old-format .xls workbook — save it as an Excel Workbook (.xlsx) and try again", name)
	case !bytes.HasPrefix(data, zipMagic):
		if looksLikeText(data) {
			return unreadablef("%s is a text file, not an .xlsx workbook — for CSV files give the folder that holds them, one per sheet", name)
		}
		return unreadablef("%s is not an .xlsx workbook — save the term as an Excel Workbook (.xlsx) and try again", name)
	}
	return nil
}

// looksLikeText reports whether the first bytes are printable text.
func looksLikeText(data []byte) bool {
	head := data[:min(len(data), 512)]
	for _, b := range head {
		if b < 0x09 || (b > 0x0D && b < 0x20) {
			return false
		}
	}
	return true
}

// readXLSXSheets opens the package and returns every worksheet's raw cell
// values (stored values, not display text) and whether the workbook uses
// the 1904 date base system. census is what checkPackage counted in each
// sheet; a sheet the library reads fewer rows of is refused.
func readXLSXSheets(data []byte, name string, census map[string]sheetCensus) ([]*rawSheet, bool, error) {
	f, err := excelize.OpenReader(bytes.NewReader(data), excelize.Options{
		// Sheets above 16 MB are unpacked to temporary files, not memory.
		RawCellValue: true, UnzipSizeLimit: maxUnzipped, UnzipXMLSizeLimit: 16 << 20,
	})
	if err != nil {
		if errors.Is(err, excelize.ErrWorkbookFileFormat) {
			return nil, false, unreadablef("%s is password-protected or not an .xlsx workbook — save an unprotected copy as an Excel Workbook (.xlsx)", name)
		}
		return nil, false, unreadablef("%s is damaged or not an .xlsx workbook (%s) — open and save it again in your spreadsheet program", name, oneLine(err))
	}
	defer f.Close()
	date1904 := false
	if props, err := f.GetWorkbookProps(); err == nil && props.Date1904 != nil {
		date1904 = *props.Date1904
	}
	var out []*rawSheet
	list := f.GetSheetList()
	if len(list) == 0 {
		return nil, false, unreadablef("%s has no worksheets — save the term workbook again", name)
	}
	for _, sheet := range list {
		rs, err := readXLSXSheet(f, sheet, census)
		if err != nil {
			return nil, false, unreadablef("%s: the %s sheet %s", name, Quote(sheet), err.Error())
		}
		out = append(out, rs)
	}
	return out, date1904, nil
}

// readXLSXSheet streams one sheet's rows, refusing sheets longer than
// maxSheetRows and sheets of which fewer rows were read than census counted
// (the library stops without an error at damaged XML).
func readXLSXSheet(f *excelize.File, sheet string, census map[string]sheetCensus) (*rawSheet, error) {
	tooLong := fmt.Errorf("has more than %d rows — a term workbook holds far fewer; delete unused rows", maxSheetRows)
	if dim, err := f.GetSheetDimension(sheet); err == nil {
		_, last, _ := strings.Cut(dim, ":")
		if _, row, err := excelize.CellNameToCoordinates(last); err == nil && row > maxSheetRows {
			return nil, tooLong // the sheet says how far it reaches; refuse before streaming
		}
	}
	rows, err := f.Rows(sheet)
	if err != nil {
		return nil, fmt.Errorf("cannot be read (%s) — open and save the workbook again", oneLine(err))
	}
	defer rows.Close()
	rs := &rawSheet{name: sheet}
	n := 0
	for rows.Next() {
		n++
		if n > maxSheetRows {
			return nil, tooLong
		}
		cols, err := rows.Columns(excelize.Options{RawCellValue: true})
		if err != nil {
			return nil, fmt.Errorf("row %d cannot be read (%s) — open and save the workbook again", n, oneLine(err))
		}
		if !blankRow(cols) {
			rs.rows = append(rs.rows, cols)
			rs.line = append(rs.line, n)
		}
	}
	if err := rows.Error(); err != nil {
		return nil, fmt.Errorf("cannot be read (%s) — open and save the workbook again", oneLine(err))
	}
	if c, ok := census[sheet]; ok && n != c.lastRow {
		return nil, fmt.Errorf("could be read only up to row %d of its %d rows — open and save the workbook again in your spreadsheet program, or restore it from a copy", n, c.lastRow)
	}
	return rs, nil
}

// oneLine keeps the first line of an error text.
func oneLine(err error) string {
	s, _, _ := strings.Cut(err.Error(), "\n")
	return s
}

// notRegular refuses a path that is neither a folder nor a regular file
// (a device, a pipe, a socket): reading one could block or never end.
func notRegular(path string, fi os.FileInfo) error {
	what := "not a regular file"
	switch m := fi.Mode(); {
	case m&os.ModeNamedPipe != 0:
		what = "a pipe (FIFO)"
	case m&os.ModeDevice != 0 || m&os.ModeCharDevice != 0:
		what = "a device"
	case m&os.ModeSocket != 0:
		what = "a socket"
	}
	return unreadablef("%s is %s, not a regular file — give the path of a term workbook (.xlsx) or of a folder of CSV files", path, what)
}
