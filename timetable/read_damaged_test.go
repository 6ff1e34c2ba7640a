package timetable

import (
	"archive/zip"
	"bytes"
	"encoding/xml"
	"errors"
	"io"
	"os"
	"regexp"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// demoBook is the invented demo institution's workbook.
func demoBook(t testing.TB) []byte {
	t.Helper()
	data, err := os.ReadFile("../samples/demo-term.xlsx")
	require.NoError(t, err)
	return data
}

// demoPart is the worksheet part of a sheet of the demo workbook.
func demoPart(t testing.TB, book []byte, sheet string) string {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	require.NoError(t, err)
	parts := map[string]*zip.File{}
	for _, f := range zr.File {
		parts[f.Name] = f
	}
	named, err := sheetParts(parts)
	require.NoError(t, err)
	for _, n := range named {
		if n.name == sheet {
			return n.part
		}
	}
	t.Fatalf("no sheet %s in the demo workbook", sheet)
	return ""
}

// rewritePart returns a copy of the zip package with one part's bytes
// passed through edit; every other part is copied unchanged.
func rewritePart(t testing.TB, book []byte, part string, edit func([]byte) []byte) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	require.NoError(t, err)
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	found := false
	for _, f := range zr.File {
		rc, err := f.Open()
		require.NoError(t, err)
		data, err := io.ReadAll(rc)
		require.NoError(t, err)
		rc.Close()
		if f.Name == part {
			data, found = edit(data), true
		}
		w, err := zw.Create(f.Name)
		require.NoError(t, err)
		_, err = w.Write(data)
		require.NoError(t, err)
	}
	require.True(t, found, "no part %s", part)
	require.NoError(t, zw.Close())
	return buf.Bytes()
}

// independentRowCount counts the <row> elements of a worksheet part that
// hold a non-blank value, with encoding/xml alone (the worksheet grammar of
// ECMA-376 Part 1 §18.3.1.73 row, §18.3.1.4 c, §18.3.1.96 v, §18.4.12 t).
// Values of shared-string cells are looked up by index.
func independentRowCount(t testing.TB, part, shared []byte) int {
	t.Helper()
	var sst struct {
		SI []struct {
			T []string `xml:"t"`
			R []struct {
				T string `xml:"t"`
			} `xml:"r"`
		} `xml:"si"`
	}
	if shared != nil {
		require.NoError(t, xml.Unmarshal(shared, &sst))
	}
	var sheet struct {
		Rows []struct {
			C []struct {
				T  string `xml:"t,attr"`
				V  string `xml:"v"`
				IS struct {
					T string `xml:"t"`
					R []struct {
						T string `xml:"t"`
					} `xml:"r"`
				} `xml:"is"`
			} `xml:"c"`
		} `xml:"sheetData>row"`
	}
	require.NoError(t, xml.Unmarshal(part, &sheet))
	n := 0
	for _, r := range sheet.Rows {
		text := ""
		for _, c := range r.C {
			v := c.V
			switch c.T {
			case "inlineStr":
				v = c.IS.T
				for _, run := range c.IS.R {
					v += run.T
				}
			case "s":
				i, err := strconv.Atoi(strings.TrimSpace(c.V))
				if err == nil && i >= 0 && i < len(sst.SI) {
					si := sst.SI[i]
					v = strings.Join(si.T, "")
					for _, run := range si.R {
						v += run.T
					}
				}
			}
			text += strings.TrimSpace(v)
		}
		if text != "" {
			n++
		}
	}
	return n
}

// TestDemoRowCounts compares, sheet by sheet, the rows the reader takes
// from the demo workbook with an independent count of non-blank <row>
// elements made with encoding/xml over the sheet part in the zip.
func TestDemoRowCounts(t *testing.T) {
	book := demoBook(t)
	census, err := checkPackage(book, "demo-term.xlsx")
	require.NoError(t, err)
	sheets, _, err := readXLSXSheets(book, "demo-term.xlsx", census)
	require.NoError(t, err)
	zr, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	require.NoError(t, err)
	files := map[string][]byte{}
	for _, f := range zr.File {
		rc, err := f.Open()
		require.NoError(t, err)
		files[f.Name], err = io.ReadAll(rc)
		require.NoError(t, err)
		rc.Close()
	}
	require.NotEmpty(t, sheets)
	for _, rs := range sheets {
		part := demoPart(t, book, rs.name)
		want := independentRowCount(t, files[part], files["xl/sharedStrings.xml"])
		assert.Equal(t, want, len(rs.rows), "sheet %s", rs.name)
		assert.Greater(t, want, 1, "sheet %s has data rows", rs.name)
	}
}

var rowRE = regexp.MustCompile(`<row r="\d+"[^>]*>.*?</row>`)

// swapRows stores a sheet's row 3 before its row 2.
func swapRows(b []byte) []byte {
	rows := rowRE.FindAllIndex(b, 3)
	r2, r3 := b[rows[1][0]:rows[1][1]], b[rows[2][0]:rows[2][1]]
	out := append([]byte{}, b[:rows[1][0]]...)
	out = append(append(append(out, r3...), r2...), b[rows[2][1]:]...)
	return out
}

// TestDamagedSheets rewrites one sheet's XML inside the demo workbook and
// expects one sentence naming the sheet instead of a term with rows missing.
func TestDamagedSheets(t *testing.T) {
	book := demoBook(t)
	afterFirstRow := func(insert string) func([]byte) []byte {
		return func(b []byte) []byte {
			i := bytes.Index(b, []byte("</row>")) + len("</row>")
			return append(append(append([]byte{}, b[:i]...), insert...), b[i:]...)
		}
	}
	for _, tc := range []struct {
		name, sheet string
		edit        func([]byte) []byte
		want        string
	}{
		{"unknown entity between rows", "Unavailable", afterFirstRow("&bogus;"), `the "Unavailable" sheet is damaged: its XML has an error on line 2 (invalid character entity &bogus;)`},
		{"control character reference", "Sections", afterFirstRow("&#x1;"), `the "Sections" sheet is damaged: its XML has an error on line 2 (illegal character code U+0001)`},
		{"control character in a cell", "Staff", func(b []byte) []byte { return bytes.Replace(b, []byte("</t>"), []byte("&#x1;</t>"), 3) }, `the "Staff" sheet is damaged`},
		{"mismatched end tag in the last row", "Rooms", func(b []byte) []byte {
			i := bytes.LastIndex(b, []byte("</c>"))
			return append(append(append([]byte{}, b[:i]...), "</x>"...), b[i:]...)
		}, `the "Rooms" sheet is damaged: its XML has an error on line 2 (element </x> closes an element it does not match)`},
		{"part ends inside the sheet", "Rooms", func(b []byte) []byte { return b[:bytes.LastIndex(b, []byte("</row>"))] }, `the "Rooms" sheet is damaged`},
		{"rows out of order", "Rooms", swapRows, `the "Rooms" sheet stores row 2 after row 3, out of order`},
		{"cells out of order", "Rooms", func(b []byte) []byte {
			return bytes.Replace(b, []byte(`<c r="B2">`), []byte(`<c r="A2"><v>1</v></c><c r="B2">`), 1)
		}, `the "Rooms" sheet stores the cells of row 2 out of order`},
		{"cell in the wrong row", "Rooms", func(b []byte) []byte { return bytes.Replace(b, []byte(`<c r="B2">`), []byte(`<c r="B9">`), 1) }, `the "Rooms" sheet has a cell "B9" in row 2`},
		{"another declared encoding", "Rooms", func(b []byte) []byte {
			return bytes.Replace(b, []byte(`encoding="UTF-8"`), []byte(`encoding="UTF-16"`), 1)
		}, `the "Rooms" sheet declares the character encoding "UTF-16", but a workbook's sheets are UTF-8`},
		{"declared UTF-8 holds Latin-1", "Rooms", func(b []byte) []byte { return bytes.Replace(b, []byte("Alder"), []byte("Ald\xe9r"), 1) }, `the "Rooms" sheet is damaged: its XML has an error on line 2 (invalid UTF-8)`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			bad := rewritePart(t, book, demoPart(t, book, tc.sheet), tc.edit)
			term, ps, err := ReadWorkbook(bytes.NewReader(bad), "demo.xlsx")
			assert.Nil(t, term)
			assert.Nil(t, ps)
			assertOneSentence(t, err, "demo.xlsx: "+tc.want)
		})
	}
}

// TestPartSizeLimits refuses packages whose zip directory announces parts
// larger than the limits, before anything is unpacked, naming the part.
func TestPartSizeLimits(t *testing.T) {
	book := demoBook(t)
	for _, tc := range []struct {
		name, part string
		size       int
		want       string
	}{
		{"huge non-sheet part", "docProps/custom.xml", maxOtherPart + 1, `holds a part "docProps/custom.xml" that unpacks to 32 MB, more than the 32 MB limit`},
		{"huge sheet part", "xl/worksheets/sheet11.xml", maxSheetPart + 1, `holds a part "xl/worksheets/sheet11.xml" that unpacks to 128 MB, more than the 128 MB limit`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			big := withExtraPart(t, book, tc.part, tc.size)
			_, _, err := ReadWorkbook(bytes.NewReader(big), "big.xlsx")
			assertOneSentence(t, err, "big.xlsx "+tc.want)
		})
	}
	t.Run("whole package", func(t *testing.T) {
		big := book
		for i := 0; i < 17; i++ {
			big = withClaimedPart(t, big, "xl/media/image"+itoa(i)+".bin", maxOtherPart)
		}
		_, _, err := ReadWorkbook(bytes.NewReader(big), "big.xlsx")
		assertOneSentence(t, err, "big.xlsx unpacks to more than 512 MB")
	})
}

// withExtraPart adds a part of size zero bytes (it compresses to almost
// nothing, as in a zip bomb).
func withExtraPart(t testing.TB, book []byte, name string, size int) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	require.NoError(t, err)
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, f := range zr.File {
		require.NoError(t, zw.Copy(f))
	}
	w, err := zw.Create(name)
	require.NoError(t, err)
	zeros := make([]byte, 1<<20)
	for left := size; left > 0; left -= len(zeros) {
		_, err = w.Write(zeros[:min(left, len(zeros))])
		require.NoError(t, err)
	}
	require.NoError(t, zw.Close())
	return buf.Bytes()
}

// withClaimedPart adds a stored part whose directory entry announces size
// bytes (APPNOTE.TXT §4.4.9, uncompressed size) while holding none; the
// limits are checked on the directory, before any part is unpacked.
func withClaimedPart(t testing.TB, book []byte, name string, size uint64) []byte {
	t.Helper()
	zr, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	require.NoError(t, err)
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, f := range zr.File {
		require.NoError(t, zw.Copy(f))
	}
	_, err = zw.CreateRaw(&zip.FileHeader{Name: name, Method: zip.Store, UncompressedSize64: size})
	require.NoError(t, err)
	require.NoError(t, zw.Close())
	return buf.Bytes()
}

// TestTooManyCells refuses a sheet of many blank cells, naming the limit.
func TestTooManyCells(t *testing.T) {
	var rows strings.Builder
	rows.WriteString(`<row r="1"><c r="A1" t="inlineStr"><is><t>Room</t></is></c></row>`)
	cell := 0
	for r := 2; cell <= maxSheetCells; r++ {
		rows.WriteString(`<row r="` + itoa(r) + `">`)
		for c := 0; c < 100; c++ {
			rows.WriteString("<c/>")
			cell++
		}
		rows.WriteString("</row>")
	}
	long := withSheetXML(t, xlsxBytes(t, []testSheet{{"Rooms", [][]string{{"Room"}}}}), "xl/worksheets/sheet1.xml", rows.String())
	_, _, err := ReadWorkbook(bytes.NewReader(long), "blank.xlsx")
	assertOneSentence(t, err, `blank.xlsx: the "Rooms" sheet has more than 5000000 cells (blank or not)`)
}

// TestNotRegularFile refuses a FIFO and a link to a device with one
// sentence instead of blocking or reading without end.
func TestNotRegularFile(t *testing.T) {
	dir := t.TempDir()
	link := dir + "/zero.xlsx"
	require.NoError(t, os.Symlink("/dev/zero", link))
	_, _, err := Load(link)
	assertOneSentence(t, err, "zero.xlsx is a device, not a regular file")

	fifo := dir + "/pipe.xlsx"
	if err := mkfifo(fifo); err != nil {
		t.Skipf("cannot make a FIFO here: %v", err)
	}
	_, _, err = Load(fifo)
	assertOneSentence(t, err, "pipe.xlsx is a pipe (FIFO), not a regular file")
	require.True(t, errors.Is(err, ErrUnreadable))
}

// TestCSVNotRegular refuses a CSV term file that links to /dev/zero or is a
// FIFO, naming the file.
func TestCSVNotRegular(t *testing.T) {
	dir := csvDir(t, goodSheets())
	require.NoError(t, os.Remove(dir+"/Sections.csv"))
	require.NoError(t, os.Symlink("/dev/zero", dir+"/Sections.csv"))
	_, _, err := Load(dir)
	assertOneSentence(t, err, "Sections.csv is a device, not a regular file")

	require.NoError(t, os.Remove(dir+"/Sections.csv"))
	if err := mkfifo(dir + "/Sections.csv"); err != nil {
		t.Skipf("cannot make a FIFO here: %v", err)
	}
	_, _, err = Load(dir)
	assertOneSentence(t, err, "Sections.csv is a pipe (FIFO), not a regular file")
}

// FuzzSheetXML inserts arbitrary text after the first row of the Rooms
// sheet's XML in a small workbook. Either the reader refuses the workbook
// with one sentence naming a sheet, or it read exactly as many non-blank
// rows as an independent count with encoding/xml finds in that part.
func FuzzSheetXML(f *testing.F) {
	book := xlsxBytes(f, goodSheets())
	part := demoPart(f, book, "Rooms")
	for _, s := range []string{"", "&bogus;", "&#x1;", `<row r="9"><c r="A9" t="inlineStr"><is><t>X</t></is></c></row>`,
		`<row r="1"/>`, `<row><c><v>1</v></c></row>`, "\xe9", `<row r="20"><c r="B20"/><c r="A20"/></row>`} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, insert string) {
		bad := rewritePart(t, book, part, func(b []byte) []byte {
			i := bytes.Index(b, []byte("</row>")) + len("</row>")
			return append(append(append([]byte{}, b[:i]...), insert...), b[i:]...)
		})
		census, err := checkPackage(bad, "fuzz.xlsx")
		if err == nil {
			var sheets []*rawSheet
			sheets, _, err = readXLSXSheets(bad, "fuzz.xlsx", census)
			if err == nil {
				files := map[string][]byte{}
				zr, zerr := zip.NewReader(bytes.NewReader(bad), int64(len(bad)))
				require.NoError(t, zerr)
				for _, zf := range zr.File {
					rc, _ := zf.Open()
					files[zf.Name], _ = io.ReadAll(rc)
					rc.Close()
				}
				for _, rs := range sheets {
					if rs.name == "Rooms" {
						want := independentRowCount(t, files[part], files["xl/sharedStrings.xml"])
						require.Equal(t, want, len(rs.rows), "rows read from the Rooms sheet after inserting %q", insert)
					}
				}
				return
			}
		}
		require.True(t, errors.Is(err, ErrUnreadable), "%v", err)
		require.NotContains(t, err.Error(), "\n")
		require.Contains(t, err.Error(), "sheet")
	})
}
