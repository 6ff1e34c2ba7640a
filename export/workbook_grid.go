package export

import (
	"fmt"
	"strings"

	"github.com/xuri/excelize/v2"
)

// Grid sheet layout: title in A1, a note in A2, day headers in row
// gridHeaderRow, one row per grid row below it; column A holds the period
// times and column B onwards the days.
const (
	gridHeaderRow = 4
	gridMaxRowPt  = 409 // Excel's highest row
	gridLinePt    = 12  // height of one 9-point text line
	gridCharsLine = 30  // characters that fit on one line of a day column
	gridMinutePt  = 0.5 // row height per minute in a term with pattern placements
)

// gridCell names the cell of grid row r (0-based) and day column c
// (0-based) on a grid sheet.
func gridCell(c, r int) string {
	name, _ := excelize.CoordinatesToCellName(c+2, r+gridHeaderRow+1)
	return name
}

// grid writes one subject's weekly grid sheet.
func (wb *workbook) grid(sheet string, who Subject) error {
	f, v := wb.f, wb.v
	items, err := v.of(who)
	if err != nil {
		return err
	}
	if _, err := f.NewSheet(sheet); err != nil {
		return err
	}
	set := func(cell string, val any, style int) error {
		if err := f.SetCellValue(sheet, cell, val); err != nil {
			return err
		}
		return f.SetCellStyle(sheet, cell, cell, style)
	}
	if err := set("A1", v.title(who), wb.st.title); err != nil {
		return err
	}
	note := strings.Join(nonEmpty(v.detail(who), v.t.Name, termDates(v.t)), " · ")
	if err := set("A2", note, wb.st.note); err != nil {
		return err
	}
	if err := set(fmt.Sprintf("A%d", gridHeaderRow), "Time", wb.st.header); err != nil {
		return err
	}
	lastCol, _ := excelize.ColumnNumberToName(len(v.days) + 1)
	if err := f.SetColWidth(sheet, "A", "A", 13); err != nil {
		return err
	}
	if err := f.SetColWidth(sheet, "B", lastCol, 30); err != nil {
		return err
	}
	for c, d := range v.days {
		if err := set(gridCell(c, -1), d.String(), wb.st.header); err != nil {
			return err
		}
	}
	heights := make([]float64, len(v.rows))
	level, reason := v.unavailableCells(who)
	for r, row := range v.rows {
		heights[r] = 2 * gridLinePt
		if v.minutes { // rows of pattern terms are pieces of any length: drawn to scale, a line at least
			heights[r] = max(gridMinutePt*float64(row.to-row.from), gridLinePt)
		}
		if err := set(fmt.Sprintf("A%d", r+gridHeaderRow+1), row.from.String()+"–"+row.to.String(), wb.st.label); err != nil {
			return err
		}
		for c := range v.days {
			style := wb.st.free
			switch {
			case !v.has[r][c]:
				style = wb.st.closed
			case level[r][c] == unavailHard:
				style = wb.st.unavailable
			case level[r][c] == unavailSoft:
				style = wb.st.preferFree
			}
			if err := f.SetCellStyle(sheet, gridCell(c, r), gridCell(c, r), style); err != nil {
				return err
			}
			// The label shows once at the top of a run of equal cells, as on the PDF.
			if l := level[r][c]; l != unavailNone && (r == 0 || level[r-1][c] != l || reason[r-1][c] != reason[r][c]) {
				if err := f.SetCellValue(sheet, gridCell(c, r), unavailableLabel(l, reason[r][c])); err != nil {
					return err
				}
			}
		}
	}
	for _, cl := range v.clusters(items) {
		if err := wb.gridBlock(sheet, cl, who, heights); err != nil {
			return err
		}
	}
	for r, h := range heights {
		if err := f.SetRowHeight(sheet, r+gridHeaderRow+1, min(h, gridMaxRowPt)); err != nil {
			return err
		}
	}
	if err := wb.pageSetup(sheet, fmt.Sprintf("$%d:$%d", gridHeaderRow, gridHeaderRow), "$A:$A"); err != nil {
		return err
	}
	return f.SetPanes(sheet, &excelize.Panes{Freeze: true, XSplit: 1, YSplit: gridHeaderRow,
		TopLeftCell: gridCell(0, 0), ActivePane: "bottomRight"})
}

// gridBlock writes one cluster as a single (merged) cell and raises the
// heights of its rows so that its text shows.
func (wb *workbook) gridBlock(sheet string, cl cluster, who Subject, heights []float64) error {
	f, v := wb.f, wb.v
	parts := make([]string, 0, len(cl.items))
	for _, i := range cl.items {
		parts = append(parts, v.blockText(&v.meetings[i], who, len(cl.items) > 1))
	}
	text := strings.Join(parts, "\n\n")
	top, bottom := gridCell(cl.col, cl.r0), gridCell(cl.col, cl.r1)
	if cl.r1 > cl.r0 {
		if err := f.MergeCell(sheet, top, bottom); err != nil {
			return err
		}
	}
	if err := f.SetCellValue(sheet, top, text); err != nil {
		return err
	}
	if err := f.SetCellStyle(sheet, top, bottom, wb.st.block); err != nil {
		return err
	}
	lines := 0
	for _, l := range strings.Split(text, "\n") {
		lines += max(1, (len([]rune(l))+gridCharsLine-1)/gridCharsLine)
	}
	need := float64(lines*gridLinePt+4) / float64(cl.r1-cl.r0+1)
	for r := cl.r0; r <= cl.r1; r++ {
		heights[r] = max(heights[r], need)
	}
	return nil
}

// blockText is the text of one meeting in a grid cell: section (with its
// weeks when not all, and its times when it shares the cell), title, room,
// staff.
func (v *view) blockText(m *meeting, who Subject, shared bool) string {
	head := m.sec.ID
	if wk := v.weeks(m); wk != "" {
		head += " · " + wk
	}
	if shared || m.pattern() {
		head += " · " + m.from.String() + "–" + m.to.String()
	}
	lines := []string{head}
	if m.sec.Title != "" {
		lines = append(lines, m.sec.Title)
	}
	switch {
	case m.room != nil:
		lines = append(lines, roomText(m.room))
	case m.sec.NoRoom:
		lines = append(lines, "no room (online or off-site)")
	}
	if names := v.staffNames(m.sec); len(names) > 0 {
		lines = append(lines, strings.Join(names, ", "))
	}
	return strings.Join(lines, "\n")
}

func nonEmpty(ss ...string) []string {
	out := ss[:0:0]
	for _, s := range ss {
		if s != "" {
			out = append(out, s)
		}
	}
	return out
}
