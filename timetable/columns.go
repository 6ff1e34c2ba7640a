package timetable

import (
	"os"
	"path/filepath"
	"strings"
)

// shColumns is the optional sheet (or Columns.csv) that renames the
// columns of an export from another system to ours.
const shColumns = "Columns"

// Headers of the Columns sheet.
const (
	colMapSheet = "Sheet"
	colMapTheir = "Their column"
	colMapOur   = "Our column"
)

// ColumnRename reads a column headed From on a sheet as our column To.
type ColumnRename struct {
	Sheet string // one of our sheets, e.g. "Sections"
	From  string // the header as the file has it, e.g. "Crs Nbr"
	To    string // our column, e.g. "Section"
	Src   Source // the row of the Columns sheet or file it came from; zero when given in code

	// Column letters of the row's cells, for messages ("" when unknown).
	sheetCol, fromCol, toCol string
}

// String gives the line `check` prints: `Sections: column "Crs Nbr" read
// as "Section"`.
func (c ColumnRename) String() string {
	return c.Sheet + ": column " + Quote(c.From) + " read as " + Quote(c.To)
}

// ColumnMap is a list of column renames. The readers apply it, with the
// workbook's own Columns sheet, when they match headers.
type ColumnMap []ColumnRename

// LoadOption changes how Load, ReadWorkbook and ReadCSVDir read a term.
type LoadOption func(*loadConfig)

// loadConfig holds the options of one read.
type loadConfig struct {
	columns ColumnMap
}

// WithColumns adds column renames to those of the workbook's Columns sheet
// (for a --columns FILE read with ReadColumnMap). They are checked like the
// sheet's rows: problems name the file's rows, or the rename itself when
// it was built in code.
func WithColumns(m ColumnMap) LoadOption {
	return func(c *loadConfig) { c.columns = append(c.columns, m...) }
}

func newLoadConfig(opts []LoadOption) *loadConfig {
	c := &loadConfig{}
	for _, o := range opts {
		o(c)
	}
	return c
}

// ReadColumnMap reads column renames from a file: a CSV file with the
// headers Sheet, Their column and Our column, or an .xlsx workbook with a
// Columns sheet of those headers. Only the file's shape is checked here
// (the error wraps ErrUnreadable, or lists the problems of its header);
// Load checks the renames themselves, naming the file's rows (its stem is
// the sheet name in positions: "columns!C3").
func ReadColumnMap(path string) (ColumnMap, error) {
	fi, err := os.Stat(path)
	if err != nil {
		return nil, unreadableCause(err, "%s cannot be opened (%v) — check the path of the column names file", path, err)
	}
	if !fi.Mode().IsRegular() {
		return nil, notRegular(path, fi)
	}
	var raw *rawSheet
	if strings.EqualFold(filepath.Ext(path), ".xlsx") {
		f, err := os.Open(path)
		if err != nil {
			return nil, unreadableCause(err, "%s cannot be opened (%v) — check its permissions", path, err)
		}
		defer f.Close()
		sheets, _, err := readWorkbookSheets(f, filepath.Base(path))
		if err != nil {
			return nil, err
		}
		for _, s := range sheets {
			if normHeader(s.name) == normHeader(shColumns) {
				raw = s
			}
		}
		if raw == nil {
			return nil, unreadablef("%s has no Columns sheet — add one with the headers Sheet, Their column and Our column", path)
		}
	} else {
		data, err := readAtMost(path, maxFileBytes)
		if err != nil {
			return nil, err
		}
		stem := strings.TrimSuffix(filepath.Base(path), filepath.Ext(path))
		rs, p := readCSV(data, stem)
		if p != nil {
			return nil, Problems{*p}.Err()
		}
		raw = rs
	}
	var ps Problems
	t := newTable(raw, specFor(shColumns), &ps, nil)
	if err := ps.Err(); err != nil {
		return nil, err
	}
	return readColumnRows(t), nil
}

// readColumnRows reads the renames of a matched Columns table as written;
// checkColumns judges them.
func readColumnRows(t *table) ColumnMap {
	var out ColumnMap
	for _, row := range t.rows {
		out = append(out, ColumnRename{
			Sheet: t.get(row, colMapSheet), From: t.get(row, colMapTheir), To: t.get(row, colMapOur),
			Src:      rowSource(t, row),
			sheetCol: t.letter(colMapSheet), fromCol: t.letter(colMapTheir), toCol: t.letter(colMapOur),
		})
	}
	return out
}

// at is the position of one cell of the rename's row.
func (c ColumnRename) at(col string) Position { return posOf(c.Src, col) }

// prefix names a rename without a row in messages.
func (c ColumnRename) prefix() string {
	if c.Src.Sheet != "" {
		return ""
	}
	return "column rename " + Quote(c.From) + " → " + Quote(c.To) + ": "
}

// checkColumns validates renames and returns the usable ones by canonical
// sheet name and normalised From header: the sheet must be one of ours
// (not Columns), both columns must be given, the target must be a column of
// that sheet, no column may have two sources and no source two targets.
func checkColumns(m ColumnMap, ps *Problems) map[string]map[string]*ColumnRename {
	out := map[string]map[string]*ColumnRename{}
	target := map[string]map[string]*ColumnRename{} // sheet -> normalised To -> first rename
	for i := range m {
		c := &m[i]
		spec := specFor(c.Sheet)
		switch {
		case c.Sheet == "":
			ps.errorf(c.at(c.sheetCol), "%sSheet is blank — write the sheet the column is on, e.g. Sections", c.prefix())
			continue
		case spec == nil || spec.name == shColumns:
			ps.errorf(c.at(c.sheetCol), "%ssheet %q is not a sheet of the term workbook — write one of %s", c.prefix(), c.Sheet, quoteList(termSheetNames()))
			continue
		case c.From == "":
			ps.errorf(c.at(c.fromCol), "%sTheir column is blank — write the header as your file has it", c.prefix())
			continue
		case c.To == "":
			ps.errorf(c.at(c.toCol), "%sOur column is blank — write one of %s", c.prefix(), quoteList(spec.cols))
			continue
		}
		to := ""
		for _, col := range spec.cols {
			if normHeader(col) == normHeader(c.To) {
				to = col
			}
		}
		if to == "" {
			ps.errorf(c.at(c.toCol), "%s%q is not a column of the %s sheet — write one of %s", c.prefix(), c.To, spec.name, quoteList(spec.cols))
			continue
		}
		c.Sheet, c.To = spec.name, to
		from := normHeader(c.From)
		if prev := out[spec.name][from]; prev != nil {
			ps.errorf(c.at(c.fromCol), "%scolumn %q of the %s sheet is already renamed%s — keep one of the two rows", c.prefix(), c.From, spec.name, renameRowNote(prev))
			continue
		}
		if prev := target[spec.name][normHeader(to)]; prev != nil {
			ps.errorf(c.at(c.toCol), "%sboth %q and %q would be read as %q on the %s sheet%s — keep one of the two rows", c.prefix(), prev.From, c.From, to, spec.name, renameRowNote(prev))
			continue
		}
		if out[spec.name] == nil {
			out[spec.name], target[spec.name] = map[string]*ColumnRename{}, map[string]*ColumnRename{}
		}
		out[spec.name][from], target[spec.name][normHeader(to)] = c, c
	}
	return out
}

// renameRowNote says where an earlier rename came from: " (Columns row 3)"
// or "".
func renameRowNote(c *ColumnRename) string {
	if c.Src.Row == 0 || c.Src.Sheet == "" {
		return ""
	}
	return " (" + c.Src.String() + ")"
}

// termSheetNames lists the sheets a column may be renamed on.
func termSheetNames() []string {
	var out []string
	for _, s := range sheetSpecs {
		if s.name != shColumns {
			out = append(out, s.name)
		}
	}
	return out
}
