package timetable

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"fmt"
	"io"
	"path"
	"strconv"
	"strings"
)

// Limits on the parts of a workbook package, checked in the zip directory
// before the spreadsheet library unpacks anything (docs/workbook.md, "Size
// limits"). The largest term planned for (10,000 sections, 400 rooms,
// 300,000 enrolment rows) needs a sheet part of about 25 MB; the limits
// leave five times that and more.
const (
	maxSheetPart = 128 << 20 // unpacked bytes of one worksheet or the shared strings
	maxOtherPart = 32 << 20  // unpacked bytes of any other part (styles, pictures, ...)
	maxUnzipped  = 512 << 20 // unpacked bytes of the whole package
	// maxSheetCells bounds the cell elements of one sheet, blank or not: a
	// sheet of 1,000,000 rows (maxSheetRows) and five columns.
	maxSheetCells = 5_000_000
)

// sheetCensus is what an independent pass over one worksheet's XML found,
// used to confirm that the spreadsheet library read every row.
type sheetCensus struct {
	lastRow int // number of the last <row> element (rows are numbered as ECMA-376 §18.3.1.73 says)
	rows    int // number of <row> elements
}

// checkPackage refuses packages whose parts unpack to more than the limits,
// then reads every worksheet's XML with a strict XML decoder, refusing
// damaged XML (unknown entities, characters XML forbids, text that is not
// UTF-8, another declared encoding), rows or cells stored out of order, and
// sheets with more than maxSheetRows rows or maxSheetCells cells. It returns
// the census of each sheet by its name in the workbook. Every error is one
// sentence naming the workbook and the sheet or part.
func checkPackage(data []byte, name string) (map[string]sheetCensus, error) {
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	if err != nil {
		return nil, unreadablef("%s is damaged or incomplete (it is not a complete .xlsx archive) — copy or download it again", name)
	}
	parts := map[string]*zip.File{}
	var total uint64
	for _, f := range zr.File {
		limit := uint64(maxOtherPart)
		if isSheetPart(f.Name) {
			limit = maxSheetPart
		}
		if f.UncompressedSize64 > limit {
			return nil, unreadablef("%s holds a part %s that unpacks to %d MB, more than the %d MB limit for such a part — a term workbook needs far less; copy the term's sheets into a new workbook and try again",
				name, Quote(f.Name), f.UncompressedSize64>>20, limit>>20)
		}
		total += f.UncompressedSize64
		if total > maxUnzipped {
			return nil, unreadablef("%s unpacks to more than %d MB, the limit for a term workbook — copy the term's sheets into a new workbook and try again", name, maxUnzipped>>20)
		}
		parts[strings.TrimPrefix(f.Name, "/")] = f
	}
	sheets, err := sheetParts(parts)
	if err != nil || len(sheets) == 0 {
		return nil, nil // the spreadsheet library gives the sentence for a package it cannot open
	}
	out := map[string]sheetCensus{}
	for _, s := range sheets {
		f := parts[s.part]
		if f == nil {
			continue
		}
		c, err := censusSheet(f)
		if err != nil {
			return nil, unreadablef("%s: the %s sheet %s", name, Quote(s.name), err.Error())
		}
		out[s.name] = c
	}
	return out, nil
}

// isSheetPart reports whether a part is a worksheet or the shared strings,
// the parts that grow with the term.
func isSheetPart(name string) bool {
	n := strings.ToLower(strings.TrimPrefix(name, "/"))
	return strings.HasPrefix(n, "xl/worksheets/") || n == "xl/sharedstrings.xml"
}

// namedPart is a worksheet's name and the path of its part.
type namedPart struct{ name, part string }

// sheetParts finds the worksheets of the package through its relationships
// (ECMA-376 Part 2 §9: the package relationship to the office document,
// then the workbook's relationships to its sheets).
func sheetParts(parts map[string]*zip.File) ([]namedPart, error) {
	book := "xl/workbook.xml"
	if rels, err := readRels(parts, "_rels/.rels", ""); err == nil {
		for _, r := range rels {
			if strings.HasSuffix(r.Type, "/officeDocument") {
				book = r.Target
			}
		}
	}
	dir, file := path.Split(book)
	rels, err := readRels(parts, dir+"_rels/"+file+".rels", dir)
	if err != nil {
		return nil, err
	}
	target := map[string]string{}
	for _, r := range rels {
		target[r.ID] = r.Target
	}
	var wb struct {
		Sheets []struct {
			Name  string     `xml:"name,attr"`
			Attrs []xml.Attr `xml:",any,attr"`
		} `xml:"sheets>sheet"`
	}
	if err := unmarshalPart(parts[book], &wb); err != nil {
		return nil, err
	}
	var out []namedPart
	for _, s := range wb.Sheets {
		for _, a := range s.Attrs {
			if a.Name.Local == "id" && strings.Contains(a.Name.Space, "relationships") {
				out = append(out, namedPart{name: s.Name, part: target[a.Value]})
			}
		}
	}
	return out, nil
}

// rel is one relationship of a package part.
type rel struct {
	ID     string `xml:"Id,attr"`
	Type   string `xml:"Type,attr"`
	Target string `xml:"Target,attr"`
}

// readRels reads a relationships part; targets are resolved against dir.
func readRels(parts map[string]*zip.File, name, dir string) ([]rel, error) {
	var doc struct {
		Rels []rel `xml:"Relationship"`
	}
	if err := unmarshalPart(parts[name], &doc); err != nil {
		return nil, err
	}
	for i, r := range doc.Rels {
		if strings.HasPrefix(r.Target, "/") {
			doc.Rels[i].Target = strings.TrimPrefix(r.Target, "/")
		} else {
			doc.Rels[i].Target = path.Join(dir, r.Target)
		}
	}
	return doc.Rels, nil
}

// unmarshalPart decodes a small part (its size was bounded by checkPackage).
func unmarshalPart(f *zip.File, v any) error {
	if f == nil {
		return errors.New("missing part")
	}
	rc, err := f.Open()
	if err != nil {
		return err
	}
	defer rc.Close()
	return xml.NewDecoder(rc).Decode(v)
}

// censusSheet streams one worksheet part and counts its rows; its error
// completes the sentence "the "Rooms" sheet ...".
func censusSheet(f *zip.File) (sheetCensus, error) {
	rc, err := f.Open()
	if err != nil {
		return sheetCensus{}, fmt.Errorf("cannot be unpacked (%s) — open and save the workbook again in your spreadsheet program", oneLine(err))
	}
	defer rc.Close()
	d := xml.NewDecoder(rc)
	declared := ""
	d.CharsetReader = func(label string, input io.Reader) (io.Reader, error) {
		declared = label
		return nil, errors.New("not UTF-8")
	}
	var c sheetCensus
	cells, lastCol := 0, 0
	// RawToken skips namespace work (twice as fast as Token); the stack of
	// open elements keeps the check of nesting that Token would make.
	var open []xml.Name
	for {
		tok, err := d.RawToken()
		if errors.Is(err, io.EOF) {
			if len(open) > 0 {
				return c, xmlProblem(&xml.SyntaxError{Msg: "unexpected end of the part inside <" + open[len(open)-1].Local + ">", Line: lineOf(d)}, "")
			}
			return c, nil
		}
		if err != nil {
			return c, xmlProblem(err, declared)
		}
		if ee, ok := tok.(xml.EndElement); ok {
			if len(open) == 0 || open[len(open)-1] != ee.Name {
				return c, xmlProblem(&xml.SyntaxError{Msg: "element </" + ee.Name.Local + "> closes an element it does not match", Line: lineOf(d)}, "")
			}
			open = open[:len(open)-1]
			continue
		}
		se, ok := tok.(xml.StartElement)
		if !ok {
			continue
		}
		parent := ""
		if len(open) > 0 {
			parent = open[len(open)-1].Local
		}
		open = append(open, se.Name)
		switch {
		case se.Name.Local == "row" && parent == "sheetData":
			n := c.lastRow + 1
			if v := attr(se, "r"); v != "" {
				if n, err = strconv.Atoi(v); err != nil || n < 1 {
					return c, fmt.Errorf("has a row numbered %s, which is not a row number — open and save the workbook again in your spreadsheet program", Quote(v))
				}
			}
			if n <= c.lastRow {
				return c, fmt.Errorf("stores row %d after row %d, out of order, so its rows cannot be read reliably — open and save the workbook again in your spreadsheet program", n, c.lastRow)
			}
			if n > maxSheetRows {
				return c, fmt.Errorf("has more than %d rows — a term workbook holds far fewer; delete unused rows", maxSheetRows)
			}
			c.lastRow, c.rows, lastCol = n, c.rows+1, 0
		case se.Name.Local == "c" && parent == "row":
			if cells++; cells > maxSheetCells {
				return c, fmt.Errorf("has more than %d cells (blank or not) — a term workbook holds far fewer; delete unused rows and columns", maxSheetCells)
			}
			col := lastCol + 1
			if ref := attr(se, "r"); ref != "" {
				var row int
				col, row = splitCellRef(ref)
				if col == 0 || row != c.lastRow {
					return c, fmt.Errorf("has a cell %s in row %d, where it does not belong — open and save the workbook again in your spreadsheet program", Quote(ref), c.lastRow)
				}
			}
			if col <= lastCol {
				return c, fmt.Errorf("stores the cells of row %d out of order, so they cannot be read reliably — open and save the workbook again in your spreadsheet program", c.lastRow)
			}
			lastCol = col
		}
	}
}

// lineOf is the decoder's current line.
func lineOf(d *xml.Decoder) int {
	line, _ := d.InputPos()
	return line
}

// xmlProblem turns an XML decoding error into the end of a sentence.
func xmlProblem(err error, declared string) error {
	if declared != "" {
		return fmt.Errorf("declares the character encoding %s, but a workbook's sheets are UTF-8 — open and save the workbook again in your spreadsheet program", Quote(declared))
	}
	var se *xml.SyntaxError
	if errors.As(err, &se) {
		return fmt.Errorf("is damaged: its XML has an error on line %d (%s) — open and save the workbook again in your spreadsheet program, or restore it from a copy", se.Line, strings.TrimPrefix(se.Msg, "xml: "))
	}
	return fmt.Errorf("is damaged (%s) — open and save the workbook again in your spreadsheet program, or restore it from a copy", oneLine(err))
}

// attr returns the value of an attribute without namespace, or "".
func attr(se xml.StartElement, local string) string {
	for _, a := range se.Attr {
		if a.Name.Local == local && a.Name.Space == "" {
			return a.Value
		}
	}
	return ""
}

// splitCellRef splits an A1 reference into a 1-based column and row; both
// are 0 when ref is not one.
func splitCellRef(ref string) (col, row int) {
	i := 0
	for i < len(ref) && ref[i] >= 'A' && ref[i] <= 'Z' {
		col = col*26 + int(ref[i]-'A'+1)
		if i++; i > 3 {
			return 0, 0
		}
	}
	row, err := strconv.Atoi(ref[i:])
	if i == 0 || err != nil || row < 1 {
		return 0, 0
	}
	return col, row
}
