package timetable

import (
	"bytes"
	"errors"
	"reflect"
	"strings"
	"testing"
)

// checkReadResult holds for every result of a reader: either one sentence
// wrapping ErrUnreadable, or a Term with sorted, well-formed problems.
func checkReadResult(t *testing.T, term *Term, ps Problems, err error) {
	t.Helper()
	if err != nil {
		if !errors.Is(err, ErrUnreadable) {
			t.Fatalf("error does not wrap ErrUnreadable: %v", err)
		}
		if strings.Contains(err.Error(), "\n") {
			t.Fatalf("error is more than one line: %q", err)
		}
		return
	}
	if term == nil {
		t.Fatal("nil Term without an error")
	}
	for _, p := range ps {
		if p.Msg == "" || strings.Contains(p.Msg, "\n") {
			t.Fatalf("bad message at %s: %q", p.Pos, p.Msg)
		}
		if p.Severity != Error && p.Severity != Warning {
			t.Fatalf("bad severity %d", p.Severity)
		}
	}
	again := append(Problems(nil), ps...)
	again.Sort()
	if !reflect.DeepEqual(again, ps) {
		t.Fatalf("problems are not sorted:\n%s", ps)
	}
	_ = Validate(term) // must not panic on whatever was read
	_ = Summary(term)
}

// FuzzReadWorkbook feeds arbitrary bytes to ReadWorkbook: it must never
// panic, must give one sentence for unreadable input, and must be
// deterministic.
func FuzzReadWorkbook(f *testing.F) {
	good := xlsxBytes(f, goodSheets())
	bad := xlsxBytes(f, applyEdits(f, goodSheets(),
		e("Sections", "C2", "S-117"), e("Periods", "B3", "#n:0.9999999"), e("Term", "B3", "#n:60"),
		e("Rooms", "B2", "#n:1e308"), e("Sections", "K2", "1-64"), e("Sections", "F2", "100"), e("Sections", "G2", "#n:-1")))
	courses := xlsxBytes(f, courseSheets())
	badCourses := xlsxBytes(f, applyEdits(f, courseSheets(),
		e("Sections", "P2", "SEC-4"), e("Sections", "Q3", "-5"), e("Course requests", "B2", "NOPE"),
		e("Course requests", "C3", "#n:1e300"), e("Course requests", "D4", ";;, ,SEM;SEM")))
	f.Add(good)
	f.Add(bad)
	f.Add(courses)
	f.Add(badCourses)
	f.Add(good[:len(good)/3])
	f.Add([]byte{})
	f.Add([]byte("Key,Value\nName,x\n"))
	f.Add(append(append([]byte{}, cfbMagic...), encryptionInfo...))
	f.Add([]byte("PK\x03\x04garbage"))
	f.Fuzz(func(t *testing.T, data []byte) {
		term, ps, err := ReadWorkbook(bytes.NewReader(data), "fuzz.xlsx")
		checkReadResult(t, term, ps, err)
		term2, ps2, err2 := ReadWorkbook(bytes.NewReader(data), "fuzz.xlsx")
		if (err == nil) != (err2 == nil) || !reflect.DeepEqual(ps, ps2) || !reflect.DeepEqual(term, term2) {
			t.Fatal("reading the same bytes twice gave different results")
		}
	})
}

// FuzzReadCSV replaces one file of a valid CSV folder (with courses and
// course requests) with arbitrary bytes: the reader must never panic, must
// name only real rows of that file, and must be deterministic.
func FuzzReadCSV(f *testing.F) {
	base := courseSheets()
	files := csvFiles(base)
	for i := range files {
		f.Add(uint8(i), files[i].data)
	}
	f.Add(uint8(5), []byte("Section,Staff,Fixed,Weeks\nA,\"S-1\nS-2\",Mon 09:00 R1;Sun 25:00,3-1\n"))
	f.Add(uint8(1), []byte("Day;Start;End\nMon;0.375;0.4166\n"))
	f.Add(uint8(0), []byte("\xEF\xBB\xBFKey,Value\nFirst day,2027-02-29\nLast day,99999999\n"))
	f.Add(uint8(7), []byte("Who,Day,From,To\nS-1,Mon,\"unterminated\n"))
	f.Add(uint8(2), []byte("Room,Capacity\n\xff\xfe,1\n"))
	f.Add(uint8(10), []byte("Student,Course,Priority,Or instead\nST3,FND,-1,\"FND, FND\"\n,,,\nST3,FND,x,SEM\n"))
	f.Add(uint8(5), []byte("Section,Course,Part,Parent section,Limit\nA,X,P,B,0\nB,X,Q,A,-1\nC,,Lab,,3\n"))
	f.Fuzz(func(t *testing.T, which uint8, data []byte) {
		set := csvFiles(base)
		k := int(which) % len(set)
		set[k].data = data
		term, ps := readCSVFiles(set, nil)
		checkReadResult(t, term, ps, nil)
		lines := bytes.Count(data, []byte("\n")) + 1
		stem := strings.TrimSuffix(set[k].name, ".csv")
		for _, p := range ps {
			if p.Pos.Sheet == stem && p.Pos.Row > lines {
				t.Fatalf("problem names row %d of a %d-line file: %s", p.Pos.Row, lines, p)
			}
		}
		_, ps2 := readCSVFiles(csvFiles2(set), nil)
		if !reflect.DeepEqual(ps, ps2) {
			t.Fatal("reading the same files twice gave different problems")
		}
	})
}

// csvFiles renders test sheets as CSV files in memory.
func csvFiles(sheets []testSheet) []csvFile {
	out := make([]csvFile, len(sheets))
	for i, s := range sheets {
		var b strings.Builder
		for _, row := range s.rows {
			for j, v := range row {
				if j > 0 {
					b.WriteByte(',')
				}
				v = strings.TrimPrefix(v, "#n:")
				if strings.ContainsAny(v, ",\"\n;") {
					v = `"` + strings.ReplaceAll(v, `"`, `""`) + `"`
				}
				b.WriteString(v)
			}
			b.WriteByte('\n')
		}
		out[i] = csvFile{name: s.name + ".csv", data: []byte(b.String())}
	}
	return out
}

// csvFiles2 copies a file set (the reader may reorder its argument).
func csvFiles2(set []csvFile) []csvFile { return append([]csvFile(nil), set...) }
