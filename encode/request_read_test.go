package encode

import (
	"archive/zip"
	"bytes"
	"errors"
	"io"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

func TestParseAt(t *testing.T) {
	cases := []struct {
		in    string
		day   time.Weekday
		start timetable.Clock
		err   string
	}{
		{"Tue 10:00", time.Tuesday, 600, ""},
		{"tuesday 9:30", time.Tuesday, 570, ""},
		{"  MON   08.15 ", time.Monday, 495, ""},
		{"Sun 23:59", time.Sunday, 23*60 + 59, ""},
		{"Tue", 0, 0, "not a day and a time"},
		{"Tue 10:00 extra", 0, 0, "not a day and a time"},
		{"Tu 10:00", 0, 0, "day name"},
		{"Tue 24:00", 0, 0, "24-hour time"},
		{"Tue 10:60", 0, 0, "24-hour time"},
		{"Tue 10", 0, 0, "24-hour time"},
		{"Tue +1:00", 0, 0, "24-hour time"},
		{"Tue 100:00", 0, 0, "24-hour time"},
	}
	for _, tc := range cases {
		t.Run(tc.in, func(t *testing.T) {
			d, c, err := ParseAt(tc.in)
			if tc.err != "" {
				require.Error(t, err)
				assert.Contains(t, err.Error(), tc.err)
				return
			}
			require.NoError(t, err)
			assert.Equal(t, tc.day, d)
			assert.Equal(t, tc.start, c)
		})
	}
}

func TestParseRequestsCSV(t *testing.T) {
	cases := []struct {
		name string
		in   string
		want []Request
		errs []string // "Requests row 3: ..." prefixes expected, in order
	}{
		{"plain", "Section,At,Room\nBIO-101,Tue 10:00,L2\nCHE-200,Wed 9:00,\n", []Request{
			{Section: "BIO-101", Day: time.Tuesday, Start: 600, Room: "L2", Src: timetable.Source{Sheet: "Requests", Row: 2}},
			{Section: "CHE-200", Day: time.Wednesday, Start: 540, Src: timetable.Source{Sheet: "Requests", Row: 3}},
		}, nil},
		{"columns in any order, any case, no room column, blank rows", "\ufeffAT,section,Note\n\nThu 14:00,X,moved by the dean\n", []Request{
			{Section: "X", Day: time.Thursday, Start: 840, Src: timetable.Source{Sheet: "Requests", Row: 3}},
		}, nil},
		{"missing columns", "Course,When\nX,Tue 10:00\n", nil, []string{"Requests row 1: the header has no \"Section\"", "Requests row 1: the header has no \"At\""}},
		{"every bad row reported", "Section,At\n,Tue 10:00\nX,Tuesday\nY,Tue 10:00\nZ,Xyz 10:00\n", nil,
			[]string{"Requests row 2: the Section is empty", "Requests row 3: At:", "Requests row 5: At:"}},
		{"empty", "", nil, []string{"Requests: there are no requests"}},
		{"header only", "Section,At\n", nil, []string{"Requests: there are no requests below the header"}},
		{"100 MB section ID quoted short, once", "Section,At\n" + strings.Repeat("S", 100<<20) + ",Tue 10:00\n", nil,
			[]string{`Requests row 2: a cell holds "` + strings.Repeat("S", 40) + `…" (104,857,600 characters), more than the 1000 characters`}},
		{"bad quotes", "Section,At\n\"X,Tue 10:00\n", nil, []string{"Requests row 2: the CSV text cannot be read"}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got, err := ParseRequestsCSV(strings.NewReader(tc.in), "Requests")
			if tc.errs == nil {
				require.NoError(t, err)
				assert.Equal(t, tc.want, got)
				return
			}
			var re RequestError
			require.True(t, errors.As(err, &re), "error %v", err)
			require.Len(t, re, len(tc.errs), "%v", err)
			for i, want := range tc.errs {
				line := re[i].Src.String() + ": " + re[i].Msg
				assert.True(t, strings.HasPrefix(line, want), "error %d is %q, want prefix %q", i, line, want)
			}
		})
	}
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
	got, err := ReadRequests(path)
	require.NoError(t, err)
	assert.Equal(t, []Request{{Section: "BIO-101", Day: time.Friday, Start: 660, Room: "L1", Src: timetable.Source{Sheet: "requests", Row: 2}}}, got)

	// A workbook without the sheet says what to add.
	g := excelize.NewFile()
	var buf bytes.Buffer
	require.NoError(t, g.Write(&buf))
	_, err = ParseRequestsWorkbook(&buf)
	require.ErrorContains(t, err, `no sheet named "Requests"`)

	// Other files are refused with the formats that work.
	other := filepath.Join(dir, "asks.txt")
	require.NoError(t, os.WriteFile(other, []byte("x"), 0o644))
	_, err = ReadRequests(other)
	require.ErrorContains(t, err, ".csv file or an .xlsx workbook")
	csvPath := filepath.Join(dir, "asks.csv")
	require.NoError(t, os.WriteFile(csvPath, []byte("Section,At\nA,Mon 9:00\nB,Mon 25:00\n"), 0o644))
	_, err = ReadRequests(csvPath)
	require.ErrorContains(t, err, "asks row 3: At:")

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
	_, err = ReadRequests(damaged)
	require.ErrorContains(t, err, `damaged.xlsx: the "requests" sheet is damaged`)

	// A device is refused instead of read without end.
	_, err = ReadRequests("/dev/zero")
	require.ErrorContains(t, err, "is not a regular file")
}

// FuzzParseRequestsCSV: any input gives requests or a RequestError, never
// a panic; requests read back the same when written out again.
func FuzzParseRequestsCSV(f *testing.F) {
	f.Add("Section,At,Room\nBIO-101,Tue 10:00,L2\n")
	f.Add("At,Section\nwed 9.30,X\n\n")
	f.Add("Section,At\n\"a,b\",Mon 00:00\n")
	f.Add("Section,At\n\"unterminated\n")
	f.Add("\ufeffSECTION,AT,ROOM,Other\nA,Sun 23:59,\n")
	f.Fuzz(func(t *testing.T, in string) {
		reqs, err := ParseRequestsCSV(strings.NewReader(in), "Requests")
		if err != nil {
			var re RequestError
			if errors.As(err, &re) && len(re) == 0 {
				t.Fatal("empty RequestError")
			}
			return
		}
		var b strings.Builder
		b.WriteString("Section,At,Room\n")
		for _, r := range reqs {
			if r.Section == "" {
				t.Fatal("request without a section")
			}
			b.WriteString(requestCSVField(r.Section) + "," + r.At() + "," + requestCSVField(r.Room) + "\n")
		}
		again, err := ParseRequestsCSV(strings.NewReader(b.String()), "Requests")
		if err != nil {
			t.Fatalf("written requests do not read back: %v\n%s", err, b.String())
		}
		if len(again) != len(reqs) {
			t.Fatalf("read back %d requests, want %d", len(again), len(reqs))
		}
		for i := range reqs {
			a, b := reqs[i], again[i]
			if a.Section != b.Section || a.Day != b.Day || a.Start != b.Start || a.Room != b.Room {
				t.Fatalf("request %d reads back as %+v, want %+v", i, b, a)
			}
		}
	})
}

func requestCSVField(s string) string { return `"` + strings.ReplaceAll(s, `"`, `""`) + `"` }

// FuzzParseAt: a time that reads prints back ("Tue 10:00") and reads the
// same again.
func FuzzParseAt(f *testing.F) {
	for _, s := range []string{"Tue 10:00", "monday 9:30", "Fri 23.59", "x", "Sun 00:00", "Wed 7:5"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, in string) {
		d, c, err := ParseAt(in)
		if err != nil {
			return
		}
		r := Request{Day: d, Start: c}
		d2, c2, err := ParseAt(r.At())
		if err != nil || d2 != d || c2 != c {
			t.Fatalf("%q reads as %s, which reads back as %v %v (%v)", in, r.At(), d2, c2, err)
		}
	})
}

// FuzzParseRequestsWorkbook: any bytes give requests or an error, never a
// panic.
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
		reqs, err := ParseRequestsWorkbook(bytes.NewReader(data))
		if err == nil && len(reqs) == 0 {
			t.Fatal("no error and no requests")
		}
	})
}
