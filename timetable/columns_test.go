package timetable

import (
	"os"
	"path/filepath"
	"strings"
	"testing"
	"unicode"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

// renamedSheets is the good term as another system exports it: two
// Sections headers and one Staff header under other names, with the
// Columns sheet that maps them back.
func renamedSheets(t testing.TB, mapping [][]string) []testSheet {
	t.Helper()
	sheets := applyEdits(t, goodSheets(), e("Sections", "A1", "Crs Nbr"), e("Sections", "E1", "Enrl Cap"), e("Staff", "A1", "Emplid"))
	return append(sheets, testSheet{"Columns", append([][]string{{"Sheet", "Their column", "Our column"}}, mapping...)})
}

var goodMapping = [][]string{
	{"Sections", "Crs Nbr", "Section"},
	{"sections", "enrl cap", "expected size"}, // any case, as headers are matched
	{"Staff", "Emplid", "Staff ID"},
}

// TestColumnsSheet reads a renamed export with its Columns sheet, in both
// forms, and checks that the term equals the one with our headers, and
// that the renames are reported for check.
func TestColumnsSheet(t *testing.T) {
	want, ps := readSheets(t, goodSheets())
	require.Empty(t, ps)
	sheets := renamedSheets(t, goodMapping)
	xt, xps := readSheets(t, sheets)
	ct, cps, err := ReadCSVDir(csvDir(t, sheets))
	require.NoError(t, err)
	for form, got := range map[string]*Term{"xlsx": xt, "csv": ct} {
		var lines []string
		for _, c := range got.Columns {
			lines = append(lines, c.String())
		}
		assert.Equal(t, []string{
			`Staff: column "Emplid" read as "Staff ID"`,
			`Sections: column "Crs Nbr" read as "Section"`,
			`Sections: column "Enrl Cap" read as "Expected size"`,
		}, lines, form)
		got.Columns = nil
		assert.Equal(t, want, got, form)
	}
	assert.Empty(t, xps)
	assert.Empty(t, cps)
}

// TestColumnsProblems plants one mistake per case in the Columns sheet (or
// in the renamed sheet) and checks the problem at its cell.
func TestColumnsProblems(t *testing.T) {
	for _, tc := range []struct {
		name    string
		mapping [][]string
		at      string
		sev     Severity
		msg     string
	}{
		{"unknown target", [][]string{goodMapping[0], goodMapping[1], {"Staff", "Emplid", "Staff number"}}, "Columns!C4", Error, `"Staff number" is not a column of the Staff sheet — write one of "Staff ID", "Name"`},
		{"unknown sheet", [][]string{{"Courses", "Crs Nbr", "Section"}}, "Columns!A2", Error, `sheet "Courses" is not a sheet of the term workbook`},
		{"the Columns sheet itself", [][]string{{"Columns", "Sheet", "Sheet"}}, "Columns!A2", Error, `sheet "Columns" is not a sheet of the term workbook`},
		{"blank their column", [][]string{{"Sections", "", "Section"}}, "Columns!B2", Error, "Their column is blank"},
		{"blank our column", [][]string{{"Sections", "Crs Nbr", ""}}, "Columns!C2", Error, "Our column is blank"},
		{"two sources for one column", append(append([][]string{}, goodMapping...), []string{"Sections", "Class Nbr", "Section"}), "Columns!C5", Error, `both "Crs Nbr" and "Class Nbr" would be read as "Section" on the Sections sheet (Columns row 2)`},
		{"one source, two targets", append(append([][]string{}, goodMapping...), []string{"Sections", "Crs Nbr", "Title"}), "Columns!B5", Error, `column "Crs Nbr" of the Sections sheet is already renamed (Columns row 2)`},
		{"rename onto a column the sheet has", append(append([][]string{}, goodMapping...), []string{"Sections", "Title", "Enrolment"}), "Columns!C5", Error, `"Enrolment" is not a column`},
		{"collides with our own header", append(append([][]string{}, goodMapping...), []string{"Sections", "Needs", "Rooms"}), "Sections!I1", Error, `column "Rooms" and column H would both be read as "Rooms"`},
		{"unused rename", append(append([][]string{}, goodMapping...), []string{"Rooms", "Bldg", "Building"}), "Columns!B5", Warning, `the Rooms sheet has no column "Bldg", so this rename is not used`},
	} {
		t.Run(tc.name, func(t *testing.T) {
			_, ps := readSheets(t, renamedSheets(t, tc.mapping))
			found := false
			for _, p := range ps {
				if p.Pos.String() == tc.at && p.Severity == tc.sev && strings.Contains(p.Msg, tc.msg) {
					found = true
				}
			}
			assert.True(t, found, "want %s %s: %s\ngot:\n%s", tc.sev, tc.at, tc.msg, ps)
		})
	}
}

// TestReadColumnMapOption reads renames from a separate CSV file (for
// --columns FILE), passes them with WithColumns and checks the term and
// positions that name the file.
func TestReadColumnMapOption(t *testing.T) {
	sheets := renamedSheets(t, nil)
	sheets = sheets[:len(sheets)-1] // no Columns sheet in the term
	dir := csvDir(t, sheets)
	file := filepath.Join(t.TempDir(), "sis-names.csv")
	require.NoError(t, os.WriteFile(file, []byte("Sheet,Their column,Our column\nSections,Crs Nbr,Section\nSections,Enrl Cap,Expected size\nStaff,Emplid,Staff ID\nStaff,Emplid,Name\n"), 0o644))
	m, err := ReadColumnMap(file)
	require.NoError(t, err)
	require.Len(t, m, 4)
	term, ps, err := Load(dir, WithColumns(m))
	require.NoError(t, err)
	require.Len(t, ps, 1, "%s", ps)
	assert.Equal(t, "sis-names!B5: column \"Emplid\" of the Staff sheet is already renamed (sis-names row 4) — keep one of the two rows", ps[0].String())
	assert.Len(t, term.Columns, 3)

	_, err = ReadColumnMap(filepath.Join(t.TempDir(), "none.csv"))
	assertOneSentence(t, err, "none.csv cannot be opened")
	bad := filepath.Join(t.TempDir(), "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("From,To\nA,B\n"), 0o644))
	_, err = ReadColumnMap(bad)
	require.Error(t, err)
	assert.Contains(t, err.Error(), `bad row 1: the bad sheet has no "Sheet" column`)

	// A rename built in code has no row; its problems name it.
	_, ps, err = Load(dir, WithColumns(ColumnMap{{Sheet: "Sections", From: "Crs Nbr", To: "Catalog number"}}))
	require.NoError(t, err)
	assert.Contains(t, ps.String(), `column rename "Crs Nbr" → "Catalog number": "Catalog number" is not a column of the Sections sheet`)
}

// FuzzColumnRename renames one header of the good CSV term to an arbitrary
// name and maps it back through Columns.csv. Round trip: whenever the read
// has no errors, the term equals the original; and a plain new name (letters
// and spaces, unlike every other header of the sheet) must read without
// errors (a header on two lines excepted, which moves the rows down).
func FuzzColumnRename(f *testing.F) {
	f.Add(uint8(5), uint8(0), "Crs Nbr")
	f.Add(uint8(3), uint8(0), "Emplid")
	f.Add(uint8(5), uint8(1), "Section")
	f.Add(uint8(2), uint8(1), " seats ")
	f.Add(uint8(7), uint8(5), "Why, \"quoted\"\n")
	base := goodSheets()
	want, _ := readCSVFiles(csvFiles(base), nil)
	f.Fuzz(func(t *testing.T, sheet, col uint8, name string) {
		sheets := applyEdits(t, base)
		s := &sheets[int(sheet)%len(sheets)]
		c := int(col) % len(s.rows[0])
		our := s.rows[0][c]
		s.rows[0][c] = name
		sheets = append(sheets, testSheet{"Columns", [][]string{{"Sheet", "Their column", "Our column"}, {s.name, name, our}}})
		term, ps := readCSVFiles(csvFiles(sheets), nil)
		checkReadResult(t, term, ps, nil)
		// A header over two lines moves every row down one line; rows are
		// numbered by the line they start on.
		if len(ps.Errors()) == 0 && !strings.ContainsAny(name, "\r\n") {
			term.Columns = nil
			if !assert.ObjectsAreEqual(want, term) {
				t.Fatalf("renaming %s.%s to %q and back changed the term", s.name, our, name)
			}
		}
		plain := strings.TrimSpace(name) != "" && len(name) < 100 && strings.IndexFunc(name, func(r rune) bool { return !(r == ' ' || unicode.IsLetter(r) && r < 128) }) < 0
		for i, h := range s.rows[0] {
			if i != c && normHeader(h) == normHeader(name) {
				plain = false
			}
		}
		if plain && len(ps.Errors()) > 0 {
			t.Fatalf("a plain rename %q of %s.%s gave errors:\n%s", name, s.name, our, ps.Errors())
		}
	})
}
