package timetable

import (
	"archive/zip"
	"bytes"
	"errors"
	"io/fs"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

// assertOneSentence checks the contract for unreadable input: the error
// wraps ErrUnreadable and is a single line that names what to do.
func assertOneSentence(t *testing.T, err error, want string) {
	t.Helper()
	require.Error(t, err)
	assert.True(t, errors.Is(err, ErrUnreadable), "error must wrap ErrUnreadable: %v", err)
	msg := err.Error()
	assert.NotContains(t, msg, "\n")
	assert.NotContains(t, msg, "goroutine")
	assert.Contains(t, msg, want)
	assert.Contains(t, msg, " — ", "the sentence says what to do")
}

func TestUnreadableWorkbooks(t *testing.T) {
	good := xlsxBytes(t, goodSheets())
	var protected bytes.Buffer
	f, err := excelize.OpenReader(bytes.NewReader(good))
	require.NoError(t, err)
	_, err = f.WriteTo(&protected, excelize.Options{Password: "secret"})
	require.NoError(t, err)
	f.Close()

	oldXLS := append(append([]byte{}, cfbMagic...), make([]byte, 1024)...)
	for _, tc := range []struct {
		name string
		data []byte
		want string
	}{
		{"password-protected", protected.Bytes(), "book.xlsx is password-protected"},
		{"old xls", oldXLS, "book.xlsx is an old-format .xls workbook"},
		{"truncated", good[:len(good)/2], "book.xlsx is damaged or incomplete"},
		{"empty", nil, "book.xlsx is empty"},
		{"text", []byte("Room,Capacity\nR1,30\n"), "book.xlsx is a text file, not an .xlsx workbook"},
		{"binary", []byte{0x89, 'P', 'N', 'G', 0, 1, 2, 3}, "book.xlsx is not an .xlsx workbook"},
		{"zip without a workbook", zipOf(t, "hello.txt", "hi"), "book.xlsx is damaged or not an .xlsx workbook"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			term, ps, err := ReadWorkbook(bytes.NewReader(tc.data), "book.xlsx")
			assert.Nil(t, term)
			assert.Nil(t, ps)
			assertOneSentence(t, err, tc.want)
		})
	}
}

func zipOf(t *testing.T, name, body string) []byte {
	var buf bytes.Buffer
	zw := newZipWriter(&buf)
	w, err := zw.Create(name)
	require.NoError(t, err)
	_, err = w.Write([]byte(body))
	require.NoError(t, err)
	require.NoError(t, zw.Close())
	return buf.Bytes()
}

func TestLoadUnreadable(t *testing.T) {
	dir := t.TempDir()
	huge := filepath.Join(dir, "huge.xlsx")
	hf, err := os.Create(huge)
	require.NoError(t, err)
	require.NoError(t, hf.Truncate(maxFileBytes+1)) // sparse: takes no disk space
	hf.Close()
	single := filepath.Join(dir, "Rooms.csv")
	require.NoError(t, os.WriteFile(single, []byte("Room\n"), 0o644))
	emptyDir := filepath.Join(dir, "empty")
	require.NoError(t, os.Mkdir(emptyDir, 0o755))

	for _, tc := range []struct{ name, path, want string }{
		{"enormous", huge, "larger than the 200 MB"},
		{"missing", filepath.Join(dir, "nope.xlsx"), "does not exist"},
		{"single csv", single, "is a single CSV file"},
		{"folder without csv", emptyDir, "holds no .csv files"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, _, err := Load(tc.path)
			assertOneSentence(t, err, tc.want)
		})
	}
}

// TestTooManyRows refuses a sheet with more than a million rows (a stray
// value far down a sheet), with one sentence.
func TestTooManyRows(t *testing.T) {
	long := withSheetXML(t, xlsxBytes(t, []testSheet{{"Rooms", [][]string{{"Room"}}}}), "xl/worksheets/sheet1.xml",
		`<row r="1"><c r="A1" t="inlineStr"><is><t>Room</t></is></c></row>`+
			`<row r="1000001"><c r="A1000001" t="inlineStr"><is><t>R1</t></is></c></row>`)
	_, _, err := ReadWorkbook(bytes.NewReader(long), "long.xlsx")
	assertOneSentence(t, err, `long.xlsx: the "Rooms" sheet has more than 1000000 rows`)
}

// withSheetXML returns a copy of the workbook whose worksheet part name has
// sheetData replaced by rows.
func withSheetXML(t *testing.T, book []byte, name, rows string) []byte {
	zr, err := zip.NewReader(bytes.NewReader(book), int64(len(book)))
	require.NoError(t, err)
	var buf bytes.Buffer
	zw := zip.NewWriter(&buf)
	for _, f := range zr.File {
		rc, err := f.Open()
		require.NoError(t, err)
		var body bytes.Buffer
		_, err = body.ReadFrom(rc)
		require.NoError(t, err)
		rc.Close()
		data := body.String()
		if f.Name == name {
			start := strings.Index(data, "<sheetData")
			end := strings.Index(data, "</sheetData>")
			require.True(t, start >= 0 && end > start, "no sheetData in %s", name)
			data = data[:start] + "<sheetData>" + rows + data[end:]
			data = strings.Replace(data, `<dimension ref="A1"/>`, "", 1)
		}
		w, err := zw.Create(f.Name)
		require.NoError(t, err)
		_, err = w.Write([]byte(data))
		require.NoError(t, err)
	}
	require.NoError(t, zw.Close())
	return buf.Bytes()
}

func TestLoadBothForms(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "term.xlsx")
	require.NoError(t, os.WriteFile(path, xlsxBytes(t, goodSheets()), 0o644))
	xt, xps, err := Load(path)
	require.NoError(t, err)
	assert.Empty(t, xps)
	ct, cps, err := Load(csvDir(t, goodSheets()))
	require.NoError(t, err)
	assert.Empty(t, cps)
	assert.Equal(t, xt, ct)
}

// TestDate1904Workbook reads a workbook that uses the 1904 date base system
// (ECMA-376 Part 1 §18.17.4.1), where the same date has a serial 1462 lower.
func TestDate1904Workbook(t *testing.T) {
	f, err := excelize.OpenReader(bytes.NewReader(xlsxBytes(t, applyEdits(t, goodSheets(), e("Term", "B3", "#n:45181")))))
	require.NoError(t, err)
	yes := true
	require.NoError(t, f.SetWorkbookProps(&excelize.WorkbookPropsOptions{Date1904: &yes}))
	var buf bytes.Buffer
	_, err = f.WriteTo(&buf)
	require.NoError(t, err)
	term, ps, err := ReadWorkbook(&buf, "mac.xlsx")
	require.NoError(t, err)
	assert.Empty(t, ps)
	assert.Equal(t, "2027-09-13", dateText(term.FirstDay))
}

func TestHeaderRowNotFirst(t *testing.T) {
	sheets := goodSheets()
	sheets[2].rows = append([][]string{{}, {}}, sheets[2].rows...) // Rooms headers in row 3
	term, ps := readSheets(t, sheets)
	require.Len(t, ps, 1, "%s", ps)
	assert.Equal(t, "Rooms row 3: warning: the headers are in row 3, not row 1 — rows above them are ignored", ps[0].String())
	assert.Equal(t, Source{"Rooms", 4}, term.Rooms[0].Src)
	assert.True(t, strings.HasPrefix(ps[0].Msg, "the headers"))
}

func newZipWriter(w *bytes.Buffer) *zip.Writer { return zip.NewWriter(w) }

// A missing term or timetable keeps the file system's error in the chain,
// so callers can tell "no such file" (fs.ErrNotExist) from a damaged one,
// and the sentence for the user stays the same.
func TestMissingFileKeepsItsCause(t *testing.T) {
	missing := filepath.Join(t.TempDir(), "nope.xlsx")
	_, _, err := Load(missing)
	require.Error(t, err)
	assert.ErrorIs(t, err, ErrUnreadable)
	assert.ErrorIs(t, err, fs.ErrNotExist)
	assert.Contains(t, err.Error(), "does not exist")

	_, _, err = ReadSchedule(missing, nil)
	require.Error(t, err)
	assert.ErrorIs(t, err, ErrUnreadable)
	assert.ErrorIs(t, err, fs.ErrNotExist)

	_, err = ReadColumnMap(missing)
	assert.ErrorIs(t, err, fs.ErrNotExist)
}
