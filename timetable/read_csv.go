package timetable

import (
	"bufio"
	"bytes"
	"encoding/csv"
	"errors"
	"io"
	"os"
	"path/filepath"
	"sort"
	"strings"
	"unicode/utf8"
)

// csvFile is one CSV file of a term folder.
type csvFile struct {
	name string // file name, e.g. "Sections.csv"
	data []byte
}

// ReadCSVDir reads a term from a folder holding one CSV file per sheet,
// named after the sheet ("Sections.csv", any case), with the same headers as
// the workbook. Problems name the file stem as the sheet ("Sections!D14",
// where the row is the line of the file). The error wraps ErrUnreadable only
// when the folder cannot be read or holds no CSV files. Options such as
// WithColumns change how it reads; a Columns.csv file renames columns like
// the workbook's Columns sheet.
func ReadCSVDir(dir string, opts ...LoadOption) (*Term, Problems, error) {
	entries, err := os.ReadDir(dir)
	if err != nil {
		return nil, nil, unreadablef("the folder %s cannot be read (%v) — check the path and its permissions", dir, err)
	}
	var files []csvFile
	for _, e := range entries {
		if e.IsDir() || !strings.EqualFold(filepath.Ext(e.Name()), ".csv") {
			continue
		}
		p := filepath.Join(dir, e.Name())
		fi, err := os.Stat(p)
		if err != nil {
			return nil, nil, unreadablef("%s cannot be read (%v) — check its permissions", p, err)
		}
		if !fi.Mode().IsRegular() {
			return nil, nil, notRegular(p, fi)
		}
		if fi.Size() > maxFileBytes {
			return nil, nil, unreadablef("%s is %d MB, larger than the %d MB a term file may be — remove unneeded rows and try again", p, fi.Size()>>20, maxFileBytes>>20)
		}
		data, err := readAtMost(p, maxFileBytes)
		if err != nil {
			return nil, nil, err
		}
		files = append(files, csvFile{name: e.Name(), data: data})
	}
	if len(files) == 0 {
		return nil, nil, unreadablef("the folder %s holds no .csv files — put one CSV file per sheet in it (Term.csv, Periods.csv, Rooms.csv, ...)", dir)
	}
	t, ps := readCSVFiles(files, newLoadConfig(opts))
	return t, ps, nil
}

// readCSVFiles decodes CSV files into raw sheets and builds the term.
func readCSVFiles(files []csvFile, cfg *loadConfig) (*Term, Problems) {
	sort.Slice(files, func(i, j int) bool { return files[i].name < files[j].name })
	var sheets []*rawSheet
	var ps Problems
	for _, f := range files {
		stem := strings.TrimSuffix(f.name, filepath.Ext(f.name))
		rs, err := readCSV(f.data, stem)
		if err != nil {
			ps = append(ps, *err)
		}
		if rs != nil {
			sheets = append(sheets, rs)
		}
	}
	t, more := buildTerm(sheets, false, cfg)
	ps = append(ps, more...)
	ps.Sort()
	return t, ps
}

var utf8BOM = []byte{0xEF, 0xBB, 0xBF}

// readCSV parses one CSV file. The delimiter is a comma, or a semicolon when
// the first line has semicolons and no commas (as spreadsheet programs write
// in locales with a decimal comma). A UTF-8 byte-order mark is skipped. Rows
// are numbered by the line on which they start. On a syntax error the rows
// before it are kept and the problem is returned.
func readCSV(data []byte, sheet string) (*rawSheet, *Problem) {
	data = bytes.TrimPrefix(data, utf8BOM)
	if !utf8.Valid(data) {
		return nil, &Problem{Pos: Position{Sheet: sheet}, Severity: Error,
			Msg: "the file is not UTF-8 text — save it again as \"CSV UTF-8\" and check it"}
	}
	first, _, _ := bytes.Cut(data, []byte("\n"))
	cr := csv.NewReader(bufio.NewReader(bytes.NewReader(data)))
	if bytes.Count(first, []byte(";")) > 0 && !bytes.Contains(first, []byte(",")) {
		cr.Comma = ';'
	}
	cr.FieldsPerRecord = -1
	cr.ReuseRecord = false
	rs := &rawSheet{name: sheet}
	for {
		rec, err := cr.Read()
		if errors.Is(err, io.EOF) {
			return rs, nil
		}
		if err != nil {
			line := 0
			var pe *csv.ParseError
			if errors.As(err, &pe) {
				line = pe.Line
				err = pe.Err
			}
			return rs, &Problem{Pos: Position{Sheet: sheet, Row: line}, Severity: Error,
				Msg: "the line cannot be read as CSV (" + err.Error() + ") — fix the quotes on this line; rows after it were not read"}
		}
		line, _ := cr.FieldPos(0)
		if line > maxSheetRows {
			return nil, &Problem{Pos: Position{Sheet: sheet}, Severity: Error,
				Msg: "the file has more than 1000000 lines — a term file holds far fewer; delete unused rows"}
		}
		unguardCSVRecord(rec) // the quote SafeCSVCell put in front of formula-like cells
		if !blankRow(rec) {
			rs.rows = append(rs.rows, rec)
			rs.line = append(rs.line, line)
		}
	}
}

// readAtMost reads a regular file, refusing it when it holds more than
// limit bytes by the time it is read (it may grow after the size check).
func readAtMost(p string, limit int64) ([]byte, error) {
	f, err := os.Open(p)
	if err != nil {
		return nil, unreadablef("%s cannot be read (%v) — check its permissions", p, err)
	}
	defer f.Close()
	data, err := io.ReadAll(io.LimitReader(f, limit+1))
	if err != nil {
		return nil, unreadablef("%s cannot be read (%v) — check the file and try again", p, err)
	}
	if int64(len(data)) > limit {
		return nil, unreadablef("%s is larger than the %d MB a term file may be — remove unneeded rows and try again", p, limit>>20)
	}
	return data, nil
}
