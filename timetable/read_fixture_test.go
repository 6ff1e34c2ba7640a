package timetable

import (
	"bytes"
	"encoding/csv"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/xuri/excelize/v2"
)

// testSheet is one sheet of a test workbook: cell texts by row, row 1 first.
// A cell written "#n:0.375" is stored in the .xlsx as the number 0.375 (in
// CSV as the text 0.375), as a spreadsheet stores time and date cells.
type testSheet struct {
	name string
	rows [][]string
}

// goodSheets is a small, valid term (no errors, no warnings) used as the
// base of reader and validation tests. Invented data.
func goodSheets() []testSheet {
	return []testSheet{
		{"Term", [][]string{
			{"Key", "Value"},
			{"Name", "Autumn 2027"},
			{"First day", "2027-09-13"}, // a Monday; with Last day: 14 teaching weeks
			{"Last day", "2027-12-17"},
			{"Time zone", "Europe/Dublin"},
			{"Holiday", "2027-10-25"},
		}},
		{"Periods", [][]string{
			{"Day", "Start", "End"},
			{"Mon", "09:00", "10:00"},
			{"Mon", "10:00", "11:00"},
			{"Mon", "11:00", "12:00"},
			{"Mon", "13:00", "14:00"},
			{"Mon", "14:00", "15:00"},
			{"Tue", "09:00", "10:00"}, {"Tue", "10:00", "11:00"}, {"Tue", "11:00", "12:00"}, {"Tue", "13:00", "14:00"}, {"Tue", "14:00", "15:00"},
			{"Wed", "09:00", "10:00"}, {"Wed", "10:00", "11:00"}, {"Wed", "11:00", "12:00"}, {"Wed", "13:00", "14:00"}, {"Wed", "14:00", "15:00"},
			{"Thu", "09:00", "10:00"}, {"Thu", "10:00", "11:00"}, {"Thu", "11:00", "12:00"}, {"Thu", "13:00", "14:00"}, {"Thu", "14:00", "15:00"},
			{"Fri", "09:00", "10:00"}, {"Fri", "10:00", "11:00"}, {"Fri", "11:00", "12:00"}, {"Fri", "13:00", "14:00"}, {"Fri", "14:00", "15:00"},
		}},
		{"Rooms", [][]string{
			{"Room", "Capacity", "Features", "Building"},
			{"R101", "40", "projector", "North"},
			{"R102", "25", "lab, projector", "North"},
			{"H1", "120", "projector, step-free", "South"},
		}},
		{"Staff", [][]string{
			{"Staff ID", "Name", "Email", "Max periods per day", "Max consecutive periods"},
			{"S-1", "Ada Quill", "ada@example.edu", "4", "3"},
			{"S-2", "Bram Oake", "", "", ""},
			{"S-3", "Cora Vell", "", "6", ""},
		}},
		{"Cohorts", [][]string{
			{"Cohort", "Name", "Size"},
			{"C-1", "First year", "100"},
			{"C-2", "Second year", "30"},
		}},
		{"Sections", [][]string{
			{"Section", "Title", "Staff", "Cohorts", "Expected size", "Meetings per week", "Periods per meeting", "Needs", "Rooms", "Fixed", "Weeks", "Min days"},
			{"SEC-1", "Foundations", "S-1", "C-1", "100", "2", "1", "projector", "", "Mon 09:00 H1", "", ""},
			{"SEC-2", "Lab Practice", "S-2", "C-2", "24", "1", "2", "lab", "", "", "odd", ""},
			{"SEC-3", "Seminar", "S-1, S-3", "C-2", "30", "3", "1", "", "R101; H1", "", "1-6", "2"},
			{"SEC-4", "Online Reading", "S-3", "C-1", "100", "1", "1", "no room", "", "", "", ""},
		}},
		{"Enrolments", [][]string{
			{"Student", "Section"},
			{"ST1", "SEC-1"},
			{"ST1", "SEC-3"},
			{"ST2", "SEC-2"},
		}},
		{"Unavailable", [][]string{
			{"Who", "Day", "From", "To", "Strength", "Reason"},
			{"S-2", "Fri", "", "", "hard", "research day"},
			{"R101", "Wed", "13:00", "15:00", "3", "cleaning"},
		}},
		{"Relations", [][]string{
			{"Kind", "Sections", "Strength"},
			{"not same time", "SEC-1, SEC-4", "hard"},
		}},
		{"Weights", [][]string{
			{"Criterion", "Weight", "Level"},
			{"staff gaps", "2", ""},
		}},
	}
}

// cellEdit changes one cell of a test workbook. An empty sheet list entry is
// created when the sheet is missing; remove deletes the whole sheet.
type cellEdit struct {
	sheet, cell, value string
	remove             bool
}

// applyEdits returns a copy of sheets with the edits applied.
func applyEdits(t testing.TB, sheets []testSheet, edits ...cellEdit) []testSheet {
	out := make([]testSheet, 0, len(sheets)+1)
	for _, s := range sheets {
		rows := make([][]string, len(s.rows))
		for i, r := range s.rows {
			rows[i] = append([]string(nil), r...)
		}
		out = append(out, testSheet{s.name, rows})
	}
	for _, e := range edits {
		idx := -1
		for i := range out {
			if out[i].name == e.sheet {
				idx = i
			}
		}
		if e.remove {
			if idx >= 0 {
				out = append(out[:idx], out[idx+1:]...)
			}
			continue
		}
		if idx < 0 {
			out = append(out, testSheet{name: e.sheet})
			idx = len(out) - 1
		}
		col, row, err := excelize.CellNameToCoordinates(e.cell)
		if err != nil {
			t.Fatalf("bad test cell %q: %v", e.cell, err)
		}
		s := &out[idx]
		for len(s.rows) < row {
			s.rows = append(s.rows, nil)
		}
		for len(s.rows[row-1]) < col {
			s.rows[row-1] = append(s.rows[row-1], "")
		}
		s.rows[row-1][col-1] = e.value
	}
	return out
}

// xlsxBytes builds an .xlsx workbook holding the sheets.
func xlsxBytes(t testing.TB, sheets []testSheet) []byte {
	f := excelize.NewFile()
	defer f.Close()
	for i, s := range sheets {
		if i == 0 {
			if err := f.SetSheetName("Sheet1", s.name); err != nil {
				t.Fatal(err)
			}
		} else if _, err := f.NewSheet(s.name); err != nil {
			t.Fatal(err)
		}
		for r, row := range s.rows {
			for c, v := range row {
				if v == "" {
					continue
				}
				cell, _ := excelize.CoordinatesToCellName(c+1, r+1)
				var err error
				if num, ok := strings.CutPrefix(v, "#n:"); ok {
					x, perr := strconv.ParseFloat(num, 64)
					if perr != nil {
						t.Fatalf("bad number cell %q", v)
					}
					err = f.SetCellFloat(s.name, cell, x, -1, 64)
				} else {
					err = f.SetCellStr(s.name, cell, v)
				}
				if err != nil {
					t.Fatal(err)
				}
			}
		}
	}
	var buf bytes.Buffer
	if _, err := f.WriteTo(&buf); err != nil {
		t.Fatal(err)
	}
	return buf.Bytes()
}

// csvDir writes the sheets as CSV files (one per sheet) into a new folder.
func csvDir(t testing.TB, sheets []testSheet) string {
	dir := t.TempDir()
	for _, s := range sheets {
		var buf bytes.Buffer
		w := csv.NewWriter(&buf)
		for _, row := range s.rows {
			rec := make([]string, len(row))
			for i, v := range row {
				rec[i] = strings.TrimPrefix(v, "#n:")
			}
			if err := w.Write(rec); err != nil {
				t.Fatal(err)
			}
		}
		w.Flush()
		if err := os.WriteFile(filepath.Join(dir, s.name+".csv"), buf.Bytes(), 0o644); err != nil {
			t.Fatal(err)
		}
	}
	return dir
}

// plantCase is one mistake planted into a base workbook and the problem
// it must give.
type plantCase struct {
	name  string
	edits []cellEdit
	at    string // expected position; "" = the last edited cell
	sev   Severity
	msg   string // expected part of the message; "" = the term reads clean
}

// runPlantCases reads base with each case's edits applied and checks that
// a problem of the case's severity whose message contains its msg is
// reported at exactly its cell, or, for a case without msg, that the term
// reads clean.
func runPlantCases(t *testing.T, base []testSheet, cases []plantCase) {
	t.Helper()
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			_, ps := readSheets(t, applyEdits(t, base, tc.edits...))
			if tc.msg == "" {
				assert.Empty(t, ps, "expected a clean term")
				return
			}
			at := tc.at
			if at == "" {
				last := tc.edits[len(tc.edits)-1]
				at = last.sheet + "!" + last.cell
			}
			for _, p := range ps {
				if p.Pos.String() == at && p.Severity == tc.sev && strings.Contains(p.Msg, tc.msg) {
					return
				}
			}
			t.Errorf("want %s at %s: %q\ngot:\n%s", tc.sev, at, tc.msg, ps)
		})
	}
}

// readSheets reads the sheets through ReadWorkbook.
func readSheets(t testing.TB, sheets []testSheet) (*Term, Problems) {
	term, ps, err := ReadWorkbook(bytes.NewReader(xlsxBytes(t, sheets)), "test.xlsx")
	if err != nil {
		t.Fatalf("ReadWorkbook: %v", err)
	}
	return term, ps
}
