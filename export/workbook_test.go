package export

import (
	"archive/zip"
	"bytes"
	"fmt"
	"io"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
	"github.com/xuri/excelize/v2"
)

func openWorkbook(t *testing.T, term *timetable.Term, s *timetable.Schedule, opt Options) *excelize.File {
	t.Helper()
	var buf bytes.Buffer
	require.NoError(t, WriteTimetableWorkbook(&buf, term, s, opt))
	f, err := excelize.OpenReader(&buf)
	require.NoError(t, err)
	t.Cleanup(func() { f.Close() })
	return f
}

func TestWorkbookSheets(t *testing.T) {
	term, s := demoTerm()
	term.Staff[4].Name = "Grete Strauß-Hohenberg von Allmendingen zu Wiesenthal"  // longer than 31
	term.Staff = append(term.Staff, timetable.Staff{ID: "S6", Name: "Room R101"}) // clashes with a room sheet
	term.Staff = append(term.Staff, timetable.Staff{ID: "S7", Name: "A/B [test]: *?"})
	extra := []ExtraSheet{{Name: "Quality", Header: []string{"Criterion", "Cost"}, Rows: [][]any{{"staff gaps", 3}, {"travel", 0}}}, {Name: "load"}}
	f := openWorkbook(t, term, s, Options{Extra: extra})
	want := []string{"Timetable",
		"Zoë Ó Briain", "Łukasz Wróbel", "Ελένη Παπαδοπούλου", "Дмитрий Соколов", "Grete Strauß-Hohenberg von Allm", "Room R101", "A_B _test__ __",
		"Room R101~2", "Room L2", "Room A1", "Room R999", "Cohort C1", "Cohort C2",
		"Load", "Quality", "load~2"}
	assert.Equal(t, want, f.GetSheetList())
	for _, n := range f.GetSheetList() {
		checkSheetName(t, n) // Microsoft Excel specifications and limits
	}
	rows, err := f.GetRows("Quality")
	require.NoError(t, err)
	assert.Equal(t, [][]string{{"Criterion", "Cost"}, {"staff gaps", "3"}, {"travel", "0"}}, rows)
}

func TestWorkbookMaster(t *testing.T) {
	term, s := demoTerm()
	f := openWorkbook(t, term, s, Options{})
	v, err := newView(term, s)
	require.NoError(t, err)
	rows, err := f.GetRows(timetable.TimetableSheet)
	require.NoError(t, err)
	require.Len(t, rows, 1+len(s.Placements))
	assert.Equal(t, timetable.TimetableColumns, rows[0])
	for i := range v.meetings {
		want := v.masterRow(&v.meetings[i])
		got := append(rows[i+1], make([]string, len(want))...)[:len(want)] // GetRows drops trailing blanks
		assert.Equal(t, want, got)
	}
	assert.Equal(t, []string{"CS103", "Online Seminar", "1", "Fri", "12:00", "13:00", "", "S1, S2", "C1", "all", "Zoë Ó Briain, Łukasz Wróbel"}, rows[len(rows)-1])
	panes, err := f.GetPanes(timetable.TimetableSheet)
	require.NoError(t, err)
	assert.True(t, panes.Freeze)
	assert.Equal(t, 1, panes.YSplit)
}

// TestWorkbookGrids re-opens the workbook and checks every grid against the
// schedule: each meeting sits in its day's column at its first period's
// row, merged down over its periods, and no other section appears.
func TestWorkbookGrids(t *testing.T) {
	term, s := demoTerm()
	f := openWorkbook(t, term, s, Options{})
	v, err := newView(term, s)
	require.NoError(t, err)
	subjects, names := gridSheets(v)
	for k, who := range subjects {
		sheet := names[k]
		t.Run(sheet, func(t *testing.T) {
			items, _ := v.of(who)
			mine := map[string]bool{}
			merges, err := f.GetMergeCells(sheet)
			require.NoError(t, err)
			mergeAt := map[string]string{}
			for _, mc := range merges {
				mergeAt[mc.GetStartAxis()] = mc.GetEndAxis()
			}
			for _, i := range items {
				m := &v.meetings[i]
				mine[m.sec.ID] = true
				col, r0, r1 := v.dayCol[m.day], v.rowOf[m.first], v.rowOf[m.last]
				// a meeting sharing its cell sits in its cluster's top cell
				for _, cl := range v.clusters(items) {
					if cl.col == col && cl.r0 <= r0 && r1 <= cl.r1 {
						r0, r1 = cl.r0, cl.r1
					}
				}
				cell := gridCell(col, r0)
				val, err := f.GetCellValue(sheet, cell)
				require.NoError(t, err)
				assert.Contains(t, val, m.sec.ID, cell)
				assert.Contains(t, val, m.sec.Title, cell)
				if r1 > r0 {
					assert.Equal(t, gridCell(col, r1), mergeAt[cell], "merge of %s", m.sec.ID)
				} else {
					assert.NotContains(t, mergeAt, cell)
				}
			}
			rows, err := f.GetRows(sheet)
			require.NoError(t, err)
			shown := map[string]bool{}
			for _, cell := range flatten(rows[gridHeaderRow:]) {
				for _, part := range strings.Split(cell, "\n\n") {
					if id, _, _ := strings.Cut(part, " "); strings.Contains(part, "\n") {
						shown[strings.Split(id, "\n")[0]] = true
					}
				}
			}
			assert.Equal(t, mine, shown, "sections shown are exactly the subject's")
			assert.Equal(t, "Time", rows[gridHeaderRow-1][0])
			assert.Equal(t, []string{"Monday", "Tuesday", "Wednesday", "Thursday", "Friday"}, rows[gridHeaderRow-1][1:])
			assert.Equal(t, "09:00–10:00", rows[gridHeaderRow][0])
		})
	}
}

func flatten(rows [][]string) []string {
	var out []string
	for _, r := range rows {
		out = append(out, r...)
	}
	return out
}

func TestWorkbookLoad(t *testing.T) {
	term, s := demoTerm()
	f := openWorkbook(t, term, s, Options{})
	rows, err := f.GetRows(LoadSheet)
	require.NoError(t, err)
	assert.Equal(t, loadStaffColumns, rows[1])
	// S1 teaches CS101 twice for 2 periods (Mon, Wed) and CS103 once: 5
	// weekly periods; over the term 12 Mondays (one holiday) x2 + 13
	// Wednesdays x2 + 13 Fridays x1 = 63.
	assert.Equal(t, []string{"S1", "Zoë Ó Briain", "2", "3", "5", "2", "", "63"}, rows[2])
	// S3 teaches CH201 (3 periods, weeks 1-6) and CH203 (1 period, weeks
	// 7-13) on Thursdays: 3 distinct weekly periods; term 6x3 + 7x1 = 25.
	assert.Equal(t, []string{"S3", "Ελένη Παπαδοπούλου", "2", "2", "3", "3", "", "25"}, rows[4])
	var l2 []string
	for _, r := range rows {
		if len(r) > 0 && r[0] == "L2" {
			l2 = r
		}
	}
	// L2 holds CH201 and CH202 in the same 3 periods out of 35: 8.6 %.
	assert.Equal(t, []string{"L2", "Science Wing", "24", "20", "2", "3", "35", "8.6%"}, l2)
	assert.Contains(t, rows[len(rows)-1][0], "posted legal occupancy")
}

// TestWorkbookFilterAndPrint reads the sheet parts themselves: the
// Timetable sheet holds an autoFilter element over the header and every
// row (ECMA-376 Part 1 §18.3.1.2; the hidden _xlnm._FilterDatabase name
// alone shows no filter buttons), and every sheet is set up to print
// landscape, one page wide (§18.3.1.64 pageSetup, fitToPage §18.3.1.65),
// with its header rows as print titles (§18.2.6 _xlnm.Print_Titles). The
// LibreOffice test checks the same in a real spreadsheet program.
func TestWorkbookFilterAndPrint(t *testing.T) {
	term, s := busyTerm()
	var buf bytes.Buffer
	require.NoError(t, WriteTimetableWorkbook(&buf, term, s, Options{Paper: "Letter"}))
	zr, err := zip.NewReader(bytes.NewReader(buf.Bytes()), int64(buf.Len()))
	require.NoError(t, err)
	var sheet1 []byte
	for _, zf := range zr.File {
		if zf.Name == "xl/worksheets/sheet1.xml" {
			rc, err := zf.Open()
			require.NoError(t, err)
			sheet1, err = io.ReadAll(rc)
			require.NoError(t, err)
			rc.Close()
		}
	}
	assert.Contains(t, string(sheet1), fmt.Sprintf(`<autoFilter ref="$A$1:$K$%d"`, len(s.Placements)+1))

	f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
	require.NoError(t, err)
	defer f.Close()
	titles := map[string]string{}
	for _, dn := range f.GetDefinedName() {
		if dn.Name == "_xlnm.Print_Titles" {
			titles[dn.Scope] = dn.RefersTo
		}
	}
	for _, name := range f.GetSheetList() {
		pl, err := f.GetPageLayout(name)
		require.NoError(t, err)
		assert.Equal(t, "landscape", *pl.Orientation, name)
		assert.Equal(t, 1, *pl.FitToWidth, name)
		assert.Equal(t, 1, *pl.Size, "%s: paper size 1 is US Letter", name)
		props, err := f.GetSheetProps(name)
		require.NoError(t, err)
		assert.True(t, *props.FitToPage, name)
		switch name {
		case timetable.TimetableSheet:
			assert.Equal(t, "'Timetable'!$1:$1", titles[name])
		case LoadSheet:
		default:
			assert.Equal(t, quoteSheet(name)+"!$A:$A,"+quoteSheet(name)+"!$4:$4", titles[name], name)
		}
	}
}
