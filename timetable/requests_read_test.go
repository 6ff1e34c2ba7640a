package timetable

import (
	"archive/zip"
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

func TestParseRequestsCSV(t *testing.T) {
	cases := []struct {
		name string
		in   string
		want []RequestRow
		errs []string // the problems expected, in order, as "place: message" prefixes
	}{
		{"plain", "Section,At,Room\nBIO-101,Tue 10:00,L2\nCHE-200,Wed 9:00,\n", []RequestRow{
			{Section: "BIO-101", At: "Tue 10:00", Room: "L2", Src: Source{Sheet: "Requests", Row: 2}, AtPos: Position{Sheet: "Requests", Row: 2, Col: "B"}},
			{Section: "CHE-200", At: "Wed 9:00", Src: Source{Sheet: "Requests", Row: 3}, AtPos: Position{Sheet: "Requests", Row: 3, Col: "B"}},
		}, nil},
		{"columns in any order, any case, no room column, blank rows", "\ufeffAT,section\n\nThu 14:00,X\n", []RequestRow{
			{Section: "X", At: "Thu 14:00", Src: Source{Sheet: "Requests", Row: 3}, AtPos: Position{Sheet: "Requests", Row: 3, Col: "A"}},
		}, nil},
		{"missing columns", "Course,When\nX,Tue 10:00\n", nil, []string{
			"Requests row 1: the header row has no Section column",
			"Requests row 1: the header row has no At column",
			`Requests!A1: warning: column "Course" is not a request column`,
			`Requests!B1: warning: column "When" is not a request column`}},
		{"every bad row reported, the others kept", "Section,At\n,Tue 10:00\nX,Tuesday\n,Xyz 10:00\n",
			[]RequestRow{{Section: "X", At: "Tuesday", Src: Source{Sheet: "Requests", Row: 3}, AtPos: Position{Sheet: "Requests", Row: 3, Col: "B"}}},
			[]string{"Requests!A2: the Section is blank", "Requests!A4: the Section is blank"}},
		{"empty", "", nil, []string{"Requests: there are no requests"}},
		{"header only", "Section,At\n", nil, []string{"Requests: there are no requests below the header"}},
		{"100 MB section ID quoted short, once", "Section,At\n" + strings.Repeat("S", 100<<20) + ",Tue 10:00\n", nil,
			[]string{`Requests!A2: the cell holds "` + strings.Repeat("S", 40) + `…" (104,857,600 characters), more than the 1000 characters`}},
		{"repeated column", "Section,At,section\nX,Tue 10:00,Y\n", []RequestRow{
			{Section: "X", At: "Tue 10:00", Src: Source{Sheet: "Requests", Row: 2}, AtPos: Position{Sheet: "Requests", Row: 2, Col: "B"}},
		}, []string{"Requests!C1: column Section appears twice"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, ps, err := ParseRequests([]byte(tc.in), "Requests.csv")
			require.NoError(t, err)
			if tc.errs == nil {
				require.Empty(t, ps)
				assert.Equal(t, tc.want, got)
				return
			}
			assert.Equal(t, tc.want, got)
			require.Len(t, ps, len(tc.errs), "%v", ps)
			for i, want := range tc.errs {
				assert.True(t, strings.HasPrefix(ps[i].String(), want), "problem %d is %q, want prefix %q", i, ps[i].String(), want)
			}
		})
	}

	// A CSV file whose quotes do not close cannot be read at all.
	_, _, err := ParseRequests([]byte("Section,At\n\"X,Tue 10:00\n"), "Requests.csv")
	require.ErrorIs(t, err, ErrUnreadable)
	assert.Contains(t, err.Error(), "Requests.csv is not a readable CSV file")
}

func TestReadRequestsWorkbook(t *testing.T) {
	f := excelize.NewFile()
	require.NoError(t, f.SetSheetName("Sheet1", "Notes"))
	_, err := f.NewSheet("requests")
	require.NoError(t, err)
	require.NoError(t, f.SetSheetRow("requests", "A1", &[]any{"Section", "At", "Room"}))
	require.NoError(t, f.SetSheetRow("requests", "A2", &[]any{"BIO-101", "Fri 11:00", "L1"}))
	dir := t.TempDir()
	path := filepath.Join(dir, "asks.xlsx")
	require.NoError(t, f.SaveAs(path))
	got, ps, err := ReadRequests(path)
	require.NoError(t, err)
	require.Empty(t, ps)
	assert.Equal(t, []RequestRow{{Section: "BIO-101", At: "Fri 11:00", Room: "L1", Src: Source{Sheet: "requests", Row: 2}, AtPos: Position{Sheet: "requests", Row: 2, Col: "B"}}}, got)

	// A workbook without the sheet says what to add.
	g := excelize.NewFile()
	var buf bytes.Buffer
	require.NoError(t, g.Write(&buf))
	_, _, err = ParseRequests(buf.Bytes(), "other.xlsx")
	require.ErrorIs(t, err, ErrUnreadable)
	require.ErrorContains(t, err, `other.xlsx has no sheet named "Requests"`)

	// Other files are refused with the formats that work.
	other := filepath.Join(dir, "asks.txt")
	require.NoError(t, os.WriteFile(other, []byte("x"), 0o644))
	_, _, err = ReadRequests(other)
	require.ErrorContains(t, err, ".csv file or an .xlsx workbook")
	csvPath := filepath.Join(dir, "asks.csv")
	require.NoError(t, os.WriteFile(csvPath, []byte("Section,At\nA,Mon 9:00\n,Mon 25:00\n"), 0o644))
	_, ps, err = ReadRequests(csvPath)
	require.NoError(t, err)
	require.Len(t, ps, 1)
	assert.Equal(t, "asks!A3: the Section is blank — write the section ID, or delete the row", ps[0].String())

	// A damaged Requests sheet (an unknown entity between its rows) is
	// refused by name, not read in part.
	data, err := os.ReadFile(path)
	require.NoError(t, err)
	zr, err := zip.NewReader(bytes.NewReader(data), int64(len(data)))
	require.NoError(t, err)
	var out bytes.Buffer
	zw := zip.NewWriter(&out)
	for _, zf := range zr.File {
		rc, err := zf.Open()
		require.NoError(t, err)
		body, err := io.ReadAll(rc)
		require.NoError(t, err)
		rc.Close()
		if zf.Name == "xl/worksheets/sheet2.xml" {
			body = bytes.Replace(body, []byte("</row>"), []byte("</row>&bogus;"), 1)
		}
		w, err := zw.Create(zf.Name)
		require.NoError(t, err)
		_, err = w.Write(body)
		require.NoError(t, err)
	}
	require.NoError(t, zw.Close())
	damaged := filepath.Join(dir, "damaged.xlsx")
	require.NoError(t, os.WriteFile(damaged, out.Bytes(), 0o644))
	_, _, err = ReadRequests(damaged)
	require.ErrorContains(t, err, `damaged.xlsx: the "requests" sheet is damaged`)

	// A missing file and a device are refused instead of read.
	_, _, err = ReadRequests(filepath.Join(dir, "none.csv"))
	require.ErrorIs(t, err, os.ErrNotExist)
	require.ErrorIs(t, err, ErrUnreadable)
	_, _, err = ReadRequests("/dev/zero")
	require.ErrorContains(t, err, "not a regular file")
}

// FuzzParseRequestsCSV: any input gives rows or problems, never a panic;
// rows read back the same when written out again.
func FuzzParseRequestsCSV(f *testing.F) {
	f.Add("Section,At,Room\nBIO-101,Tue 10:00,L2\n")
	f.Add("At,Section\nwed 9.30,X\n\n")
	f.Add("Section,At\n\"a,b\",Mon 00:00\n")
	f.Add("Section,At\n\"unterminated\n")
	f.Add("\ufeffSECTION,AT,ROOM,Other\nA,Sun 23:59,\n")
	f.Fuzz(func(t *testing.T, in string) {
		rows, ps, err := ParseRequests([]byte(in), "Requests.csv")
		if err != nil {
			if !errors.Is(err, ErrUnreadable) {
				t.Fatalf("error %v does not wrap ErrUnreadable", err)
			}
			return
		}
		if len(ps.Errors()) > 0 {
			return
		}
		if len(rows) == 0 {
			t.Fatal("no rows and no errors")
		}
		var b strings.Builder
		b.WriteString("Section,At,Room\n")
		for _, r := range rows {
			if r.Section == "" {
				t.Fatal("a row without a section")
			}
			b.WriteString(csvField(r.Section) + "," + csvField(r.At) + "," + csvField(r.Room) + "\n")
		}
		again, ps, err := ParseRequests([]byte(b.String()), "Requests.csv")
		if err != nil || len(ps) > 0 {
			t.Fatalf("written rows do not read back: %v %v\n%s", err, ps, b.String())
		}
		if len(again) != len(rows) {
			t.Fatalf("read back %d rows, want %d", len(again), len(rows))
		}
		for i := range rows {
			a, b := rows[i], again[i]
			if a.Section != b.Section || a.At != b.At || a.Room != b.Room {
				t.Fatalf("row %d reads back as %+v, want %+v", i, b, a)
			}
		}
	})
}

func csvField(s string) string { return `"` + strings.ReplaceAll(s, `"`, `""`) + `"` }

// FuzzParseRequestsWorkbook: any bytes give rows, problems or an error that
// wraps ErrUnreadable, never a panic.
func FuzzParseRequestsWorkbook(f *testing.F) {
	wb := excelize.NewFile()
	_ = wb.SetSheetName("Sheet1", RequestsSheet)
	_ = wb.SetSheetRow(RequestsSheet, "A1", &[]any{"Section", "At", "Room"})
	_ = wb.SetSheetRow(RequestsSheet, "A2", &[]any{"BIO-101", "Tue 10:00", "L2"})
	var buf bytes.Buffer
	_ = wb.Write(&buf)
	f.Add(buf.Bytes())
	f.Add([]byte("PK\x03\x04 not really a workbook"))
	f.Add([]byte{})
	f.Fuzz(func(t *testing.T, data []byte) {
		rows, ps, err := ParseRequests(data, "Requests.xlsx")
		switch {
		case err != nil && !errors.Is(err, ErrUnreadable):
			t.Fatalf("error %v does not wrap ErrUnreadable", err)
		case err == nil && len(rows) == 0 && len(ps.Errors()) == 0:
			t.Fatal("no error, no problems and no rows")
		}
	})
}
