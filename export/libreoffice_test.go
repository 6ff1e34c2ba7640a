package export

import (
	"archive/zip"
	"bytes"
	"context"
	"encoding/csv"
	"encoding/xml"
	"fmt"
	"io"
	"os"
	"os/exec"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// The tests in this file open every workbook termwright writes in a real
// spreadsheet program, headless LibreOffice Calc (scripts/test installs
// Debian's libreoffice-calc), and compare what it reads with what was
// meant. They skip, saying so, where soffice is not installed.

// sofficeCSVFilter exports every sheet of a workbook as its own UTF-8 CSV
// file named "<file>-<sheet>.csv", cells as shown. The tokens of
// LibreOffice's CSV filter options: field separator 44 (,), text delimiter
// 34 ("), character set 76 (UTF-8), start row 1, no column formats,
// language 0, quoted fields as text false, detect special numbers true,
// save cell contents as shown true, export formulas false, remove spaces
// false, sheet -1 (every sheet to its own file; LibreOffice 7.2 and later).
const sofficeCSVFilter = "csv:Text - txt - csv (StarCalc):44,34,76,1,,0,false,true,true,false,false,-1"

// soffice converts files into outDir with LibreOffice's --convert-to
// filter, using a profile of its own in a temporary folder (so it neither
// needs nor touches a user's profile); it skips the test when soffice is
// not installed.
func soffice(t *testing.T, filter, outDir string, files ...string) {
	t.Helper()
	tool, err := exec.LookPath("soffice")
	if err != nil {
		t.Skip("soffice (LibreOffice) is not installed: apt-get install libreoffice-calc, or run scripts/test")
	}
	profile := filepath.Join(t.TempDir(), "lo-profile")
	ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
	defer cancel()
	args := append([]string{"--headless", "--norestore", "--nolockcheck",
		"-env:UserInstallation=file://" + filepath.ToSlash(profile), "--convert-to", filter, "--outdir", outDir}, files...)
	out, err := exec.CommandContext(ctx, tool, args...).CombinedOutput()
	require.NoError(t, err, "soffice: %s", out)
}

// readCSVFile reads a CSV file LibreOffice wrote, trailing empty cells of
// each row and trailing empty rows dropped (LibreOffice pads every row to
// the sheet's used width).
func readCSVFile(t *testing.T, path string) [][]string {
	t.Helper()
	data, err := os.ReadFile(path)
	require.NoError(t, err, "LibreOffice wrote no %s", filepath.Base(path))
	r := csv.NewReader(bytes.NewReader(data))
	r.FieldsPerRecord = -1
	rows, err := r.ReadAll()
	require.NoError(t, err, path)
	return trimRows(rows)
}

func trimRows(rows [][]string) [][]string {
	out := make([][]string, len(rows))
	for i, row := range rows {
		n := len(row)
		for n > 0 && row[n-1] == "" {
			n--
		}
		out[i] = append([]string{}, row[:n]...)
	}
	for len(out) > 0 && len(out[len(out)-1]) == 0 {
		out = out[:len(out)-1]
	}
	return out
}

// clientFiles writes every kind of workbook termwright makes into dir:
// the timetable workbook, the published timetable.xlsx, a term workbook
// and the empty template.
func clientFiles(t *testing.T, dir string, term *timetable.Term, s *timetable.Schedule) map[string]string {
	t.Helper()
	files := map[string]string{}
	write := func(name string, fn func(io.Writer) error) {
		path := filepath.Join(dir, name)
		f, err := os.Create(path)
		require.NoError(t, err)
		require.NoError(t, fn(f))
		require.NoError(t, f.Close())
		files[name] = path
	}
	write("timetable.xlsx", func(w io.Writer) error {
		return WriteTimetableWorkbook(w, term, s, Options{Generated: fixedClock,
			Extra: []ExtraSheet{{Name: "Quality", Header: []string{"Criterion", "Cost"}, Rows: [][]any{{"staff gaps", 3}}}}})
	})
	pub := filepath.Join(t.TempDir(), "published")
	_, err := Publish(pub, term, s, Options{Generated: fixedClock})
	require.NoError(t, err)
	data, err := os.ReadFile(filepath.Join(pub, "timetable.xlsx"))
	require.NoError(t, err, "Publish writes timetable.xlsx")
	require.NoError(t, os.WriteFile(filepath.Join(dir, "published.xlsx"), data, 0o644))
	files["published.xlsx"] = filepath.Join(dir, "published.xlsx")
	write("term.xlsx", func(w io.Writer) error { return timetable.WriteTermWorkbook(term, w) })
	write("template.xlsx", timetable.WriteTemplate)
	return files
}

// TestLibreOfficeReadsWorkbooks opens every workbook termwright writes in
// LibreOffice Calc and compares each sheet, as LibreOffice shows it, with
// what was meant: the Timetable sheet holds exactly one row per meeting
// (and a title such as =HYPERLINK(...) stays text: a formula would show its
// result); every grid sheet has its meetings in the right day and period
// cells; the term workbook shows the same cells as the term's CSV form;
// the template has every sheet with its headers and the Term keys.
func TestLibreOfficeReadsWorkbooks(t *testing.T) {
	term, s := busyTerm()
	term.Sections[0].Title = `=HYPERLINK("http://evil.example/","Click")` // OWASP "CSV Injection" example
	term.Sections[1].Title = "@SUM(1+1)*2"
	dir := t.TempDir()
	files := clientFiles(t, dir, term, s)
	out := filepath.Join(dir, "csv")
	soffice(t, sofficeCSVFilter, out, files["timetable.xlsx"], files["published.xlsx"], files["term.xlsx"], files["template.xlsx"])
	sheet := func(file, name string) [][]string {
		return readCSVFile(t, filepath.Join(out, strings.TrimSuffix(file, ".xlsx")+"-"+name+".csv"))
	}
	v, err := newView(term, s)
	require.NoError(t, err)

	master := [][]string{timetable.TimetableColumns}
	for _, i := range v.masterItems() {
		master = append(master, v.masterRow(&v.meetings[i]))
	}
	master = trimRows(master)
	for _, file := range []string{"timetable.xlsx", "published.xlsx"} {
		t.Run(file+"/Timetable", func(t *testing.T) {
			got := sheet(file, timetable.TimetableSheet)
			assert.Equal(t, master, got)
			assert.Contains(t, strings.Join(flatten(got), "\n"), `=HYPERLINK("http://evil.example/","Click")`, "the title stays text")
		})
	}

	subjects, names := gridSheets(v)
	for k, who := range subjects {
		t.Run("timetable.xlsx/"+names[k], func(t *testing.T) {
			assert.Equal(t, expectedGrid(v, who), sheet("timetable.xlsx", names[k]))
		})
	}
	t.Run("timetable.xlsx/Quality", func(t *testing.T) {
		assert.Equal(t, [][]string{{"Criterion", "Cost"}, {"staff gaps", "3"}}, sheet("timetable.xlsx", "Quality"))
	})
	t.Run("timetable.xlsx/Load", func(t *testing.T) {
		load := sheet("timetable.xlsx", LoadSheet)
		require.Greater(t, len(load), 3)
		assert.Equal(t, loadStaffColumns, load[1])
		// L2 holds CH201/CH202 in 3 periods and CH210/CH211 in 1 of 35: 11.4 %, shown as a percentage.
		assert.Contains(t, load, []string{"L2", "Science Wing", "24", "20", "4", "4", "35", "11.4%"})
	})

	t.Run("term.xlsx", func(t *testing.T) {
		csvDir := filepath.Join(dir, "termcsv")
		require.NoError(t, timetable.WriteTermCSV(term, csvDir))
		for _, name := range timetable.TermCSVFiles() {
			if _, err := os.Stat(filepath.Join(csvDir, name)); err != nil {
				continue // a sheet the term does not use (meeting times, room choices, travel)
			}
			want := readCSVFile(t, filepath.Join(csvDir, name))
			for _, row := range want {
				for i, c := range row {
					// the CSV form guards formula-like cells with a quote; the workbook holds them as text
					row[i] = strings.TrimPrefix(c, "'")
				}
			}
			assert.Equal(t, want, sheet("term.xlsx", strings.TrimSuffix(name, ".csv")), name)
		}
	})

	t.Run("template.xlsx", func(t *testing.T) {
		empty := filepath.Join(dir, "emptycsv")
		require.NoError(t, timetable.WriteTemplateCSV(empty))
		for _, name := range timetable.TermCSVFiles() {
			header := readCSVFile(t, filepath.Join(empty, name))[0]
			got := sheet("template.xlsx", strings.TrimSuffix(name, ".csv"))
			require.NotEmpty(t, got, name)
			assert.Equal(t, header, got[0], name)
		}
		var keys []string
		for _, row := range sheet("template.xlsx", "Term")[1:] {
			keys = append(keys, row[0])
		}
		// WriteTemplate's documentation: the Term sheet's keys ready for their values.
		assert.Equal(t, []string{"Name", "First day", "Last day", "Time zone"}, keys)
	})
}

// expectedGrid is a grid sheet as it is meant to read: title, blank or
// note line, the day headers in row 4, then one row per distinct period
// time with its label and, in the top cell of each cluster, the text of
// its meetings (merged cells show their text once).
func expectedGrid(v *view, who Subject) [][]string {
	items, _ := v.of(who)
	rows := make([][]string, gridHeaderRow+len(v.rows))
	rows[0] = []string{v.title(who)}
	rows[1] = []string{strings.Join(nonEmpty(v.detail(who), v.t.Name, termDates(v.t)), " · ")}
	head := []string{"Time"}
	for _, d := range v.days {
		head = append(head, d.String())
	}
	rows[gridHeaderRow-1] = head
	for r, row := range v.rows {
		cells := make([]string, 1+len(v.days))
		cells[0] = row.from.String() + "–" + row.to.String()
		rows[gridHeaderRow+r] = cells
	}
	// the subject's unavailable times from the Unavailable sheet, labelled at the top of each run
	for _, u := range v.t.Unavailable {
		if u.Kind != who.Kind || u.Who != who.ID {
			continue
		}
		label := "Preferably free"
		if u.Hard {
			label = "Unavailable"
		}
		for r, row := range v.rows {
			if row.from < u.To && u.From < row.to {
				rows[gridHeaderRow+r][1+v.dayCol[u.Day]] = label + ": " + u.Reason
				break
			}
		}
	}
	for _, cl := range v.clusters(items) {
		var parts []string
		for _, i := range cl.items {
			parts = append(parts, v.blockText(&v.meetings[i], who, len(cl.items) > 1))
		}
		rows[gridHeaderRow+cl.r0][1+cl.col] = strings.Join(parts, "\n\n")
	}
	return trimRows(rows)
}

// TestLibreOfficeFilterAndPageSetup converts the timetable workbook to
// OpenDocument with LibreOffice and reads what LibreOffice made of it: the
// Timetable sheet has an AutoFilter with its buttons shown over the header
// and every meeting row (a database range with display-filter-buttons,
// ODF 1.2 §9.4.1), every sheet prints landscape, scaled to one page wide
// (style:print-orientation, style:scale-to-X, ODF 1.2 §20.354, §20.360),
// with its header rows repeated (table:table-header-rows, §9.1.7).
func TestLibreOfficeFilterAndPageSetup(t *testing.T) {
	term, s := busyTerm()
	dir := t.TempDir()
	path := writeTimetableXLSX(t, dir, term, s)
	soffice(t, "ods", dir, path)
	doc := readODS(t, filepath.Join(dir, "timetable.ods"))

	last := fmt.Sprintf("Timetable.A1:Timetable.%c%d", 'A'+len(timetable.TimetableColumns)-1, len(s.Placements)+1)
	assert.Contains(t, doc.filters, last, "an AutoFilter with its buttons over the whole Timetable sheet")
	require.NotEmpty(t, doc.tables)
	for _, tb := range doc.tables {
		layout := doc.layouts[doc.masterLayout[doc.tableMaster[tb.style]]]
		assert.Equal(t, "landscape", layout.orientation, "sheet %q", tb.name)
		assert.Equal(t, "1", layout.scaleX, "sheet %q prints one page wide", tb.name)
		if tb.name != LoadSheet { // Load holds two tables, one under the other: no single header row
			assert.True(t, tb.headerRows, "sheet %q repeats its header row", tb.name)
		}
	}
}

// odsDoc is what TestLibreOfficeFilterAndPageSetup reads from an .ods.
type odsDoc struct {
	filters      []string // target ranges of database ranges with filter buttons
	tables       []odsTable
	tableMaster  map[string]string // table style -> master page
	masterLayout map[string]string // master page -> page layout
	layouts      map[string]odsLayout
}

type odsTable struct {
	name, style string
	headerRows  bool
}

type odsLayout struct{ orientation, scaleX string }

func attr(se xml.StartElement, local string) string {
	for _, a := range se.Attr {
		if a.Name.Local == local {
			return a.Value
		}
	}
	return ""
}

// readODS reads content.xml and styles.xml of an OpenDocument spreadsheet.
func readODS(t *testing.T, path string) odsDoc {
	t.Helper()
	zr, err := zip.OpenReader(path)
	require.NoError(t, err, "LibreOffice wrote no %s", filepath.Base(path))
	defer zr.Close()
	doc := odsDoc{tableMaster: map[string]string{}, masterLayout: map[string]string{}, layouts: map[string]odsLayout{}}
	for _, zf := range zr.File {
		if zf.Name != "content.xml" && zf.Name != "styles.xml" {
			continue
		}
		rc, err := zf.Open()
		require.NoError(t, err)
		dec := xml.NewDecoder(rc)
		style, layout := "", ""
		depth, tableDepth := 0, -1
		for {
			tok, err := dec.Token()
			if err == io.EOF {
				break
			}
			require.NoError(t, err)
			switch el := tok.(type) {
			case xml.StartElement:
				depth++
				switch el.Name.Local {
				case "database-range":
					if attr(el, "display-filter-buttons") == "true" {
						doc.filters = append(doc.filters, attr(el, "target-range-address"))
					}
				case "table":
					if el.Name.Space == "urn:oasis:names:tc:opendocument:xmlns:table:1.0" {
						doc.tables = append(doc.tables, odsTable{name: attr(el, "name"), style: attr(el, "style-name")})
						tableDepth = depth
					}
				case "table-header-rows":
					if tableDepth > 0 && len(doc.tables) > 0 {
						doc.tables[len(doc.tables)-1].headerRows = true
					}
				case "style":
					style = attr(el, "name")
					if m := attr(el, "master-page-name"); m != "" {
						doc.tableMaster[style] = m
					}
				case "master-page":
					doc.masterLayout[attr(el, "name")] = attr(el, "page-layout-name")
				case "page-layout":
					layout = attr(el, "name")
				case "page-layout-properties":
					doc.layouts[layout] = odsLayout{orientation: attr(el, "print-orientation"), scaleX: attr(el, "scale-to-X")}
				}
			case xml.EndElement:
				if depth == tableDepth && el.Name.Local == "table" {
					tableDepth = -1
				}
				depth--
			}
		}
		_ = style
		rc.Close()
	}
	return doc
}

// TestLibreOfficeReadsPatternWorkbook opens the timetable workbook of a
// term with meeting patterns in LibreOffice Calc: the Timetable sheet
// holds one row per placement ("Mon Wed Fri" for a pattern), and every
// grid sheet has each meeting in the cell of its day and of the row where
// its clock time starts, on rows cut at every period and pattern time.
func TestLibreOfficeReadsPatternWorkbook(t *testing.T) {
	term, s := patternTerm()
	dir := t.TempDir()
	path := writeTimetableXLSX(t, dir, term, s)
	out := filepath.Join(dir, "csv")
	soffice(t, sofficeCSVFilter, out, path)
	sheet := func(name string) [][]string { return readCSVFile(t, filepath.Join(out, "timetable-"+name+".csv")) }
	v, err := newView(term, s)
	require.NoError(t, err)
	master := [][]string{timetable.TimetableColumns}
	for _, i := range v.masterItems() {
		master = append(master, v.masterRow(&v.meetings[i]))
	}
	got := sheet(timetable.TimetableSheet)
	assert.Equal(t, trimRows(master), got)
	assert.Contains(t, flatten(got), "Mon Wed Fri")
	subjects, names := gridSheets(v)
	for k, who := range subjects {
		t.Run(names[k], func(t *testing.T) {
			assert.Equal(t, expectedGrid(v, who), sheet(names[k]))
		})
	}
	// Ines Valcárcel's sheet: MA110 on Monday in the 09:00-09:50 row, with its times.
	grid := sheet("Ines Valcárcel")
	require.Greater(t, len(grid), gridHeaderRow)
	assert.Equal(t, "09:00–09:50", grid[gridHeaderRow][0])
	assert.True(t, strings.HasPrefix(grid[gridHeaderRow][1], "MA110 · 09:00–09:50\nCalculus I"), grid[gridHeaderRow][1])
}

// TestLibreOfficeReadsSectionedWorkbooks opens the timetable workbook of
// the sectioned term and a staff member's class-list workbook in
// LibreOffice Calc: the Class lists sheet shows exactly the class-list
// rows under its header (the student ID "=cmd" as text, not a formula's
// result), the Sectioning sheet one row per finding with its numbers, and
// the class-list workbook its overview and each section's sheet with the
// heading lines above the students.
func TestLibreOfficeReadsSectionedWorkbooks(t *testing.T) {
	term, s := sectionedTerm()
	dir := t.TempDir()
	var b bytes.Buffer
	require.NoError(t, WriteTimetableWorkbook(&b, term, s, Options{Generated: fixedClock, Reasons: sectionedReasons}))
	tt := filepath.Join(dir, "timetable.xlsx")
	require.NoError(t, os.WriteFile(tt, b.Bytes(), 0o644))
	b.Reset()
	require.NoError(t, WriteStaffClassLists(&b, term, s, "S5", Options{Generated: fixedClock}))
	cl := filepath.Join(dir, "S5.xlsx")
	require.NoError(t, os.WriteFile(cl, b.Bytes(), 0o644))
	out := filepath.Join(dir, "csv")
	soffice(t, sofficeCSVFilter, out, tt, cl)
	sheet := func(file, name string) [][]string { return readCSVFile(t, filepath.Join(out, file+"-"+name+".csv")) }
	v, err := newView(term, s)
	require.NoError(t, err)

	lists := append([][]string{timetable.ClassListColumns}, v.classListRows()...)
	got := sheet("timetable", timetable.ClassListSheet)
	assert.Equal(t, trimRows(lists), got)
	assert.Contains(t, flatten(got), "=cmd")

	want := [][]string{SectioningColumns}
	for _, f := range v.sectioningFindings(sectionedReasons) {
		n, l := "", ""
		if f.Kind == FindingFull || f.Kind == FindingNearlyFull {
			n, l = fmt.Sprint(f.Students), fmt.Sprint(f.Limit)
		}
		want = append(want, []string{f.Kind, f.Student, f.Course, f.Section, n, l, f.Details, f.Where})
	}
	assert.Equal(t, trimRows(want), sheet("timetable", SectioningSheet))

	overview := sheet("S5", ClassListsSheet)
	require.Len(t, overview, 5)
	assert.Equal(t, StaffClassListColumns, overview[0])
	assert.Equal(t, []string{"MA110-T1", "MA110", "Tutorial", "Calculus I tutorial", "=cmd", "sectioned"}, overview[1])
	t1 := sheet("S5", "MA110-T1")
	assert.Equal(t, [][]string{
		{"MA110-T1 Calculus I tutorial"},
		{"Course MA110, part Tutorial, taught by Grete Strauß"},
		{"Meeting 1: Mon 10:00–11:00, R999"},
		{"2 students (limit 2)"},
		{},
		StaffClassListColumns,
		{"MA110-T1", "MA110", "Tutorial", "Calculus I tutorial", "=cmd", "sectioned"},
		{"MA110-T1", "MA110", "Tutorial", "Calculus I tutorial", "st-001", "sectioned"},
	}, t1)
}
