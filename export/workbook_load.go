package export

import (
	"strconv"

	"github.com/xuri/excelize/v2"
)

// Column headers of the Load sheet's two tables.
var (
	loadStaffColumns = []string{"Staff ID", "Name", "Sections", "Meetings per week", "Weekly periods",
		"Busiest day (periods)", "Limit per day", "Periods over the term"}
	loadRoomColumns = []string{"Room", "Building", "Capacity", "Largest class", "Meetings",
		"Occupied periods", "Grid periods", "Utilisation"}
)

// loadCaution is printed under the Load tables.
const loadCaution = "Capacities and limits are as entered in the term workbook. Check room use against each room's posted legal occupancy and local codes, and teaching loads against local agreements and institution policy."

// load writes the Load sheet: per staff member the teaching load, per room
// its utilisation. "Weekly periods" counts the distinct grid periods a
// person teaches in at least one week; "Periods over the term" adds up
// every period actually taught, date by date (holidays and weeks outside a
// section's weeks left out). A room's utilisation is its occupied grid
// periods divided by the grid's periods. A timetable with pattern
// placements, whose meetings need not fill whole periods, gets the same
// tables in hours (staffLoadHours, roomLoadHours): the hours of the week
// a person or room is busy in at least one week, the busiest day's, the
// hours actually taught over the term date by date, and a room's busy
// hours over the grid's hours (the grid rows' minutes on each day).
func (wb *workbook) load() error {
	f, v, sheet := wb.f, wb.v, LoadSheet
	if _, err := f.NewSheet(sheet); err != nil {
		return err
	}
	row := 1
	put := func(cells []any, style int) error {
		cell := "A" + strconv.Itoa(row)
		if err := f.SetSheetRow(sheet, cell, &cells); err != nil {
			return err
		}
		if style != 0 {
			end, _ := excelize.CoordinatesToCellName(max(len(cells), 1), row)
			if err := f.SetCellStyle(sheet, cell, end, style); err != nil {
				return err
			}
		}
		row++
		return nil
	}
	header := func(cols []string) []any {
		out := make([]any, len(cols))
		for i, c := range cols {
			out[i] = c
		}
		return out
	}
	days, _ := v.termDays() // nil without term dates: that column stays blank
	if err := put([]any{"Teaching load per staff member"}, wb.st.bold); err != nil {
		return err
	}
	staffCols, roomCols := loadStaffColumns, loadRoomColumns
	staffLoad, roomLoad := v.staffLoad, v.roomLoad
	if v.minutes {
		staffCols, roomCols = loadStaffHourColumns, loadRoomHourColumns
		staffLoad, roomLoad = v.staffLoadHours, v.roomLoadHours
	}
	if err := put(header(staffCols), wb.st.header); err != nil {
		return err
	}
	for i := range v.t.Staff {
		s := &v.t.Staff[i]
		if err := put(staffLoad(s.ID, s.Name, s.MaxPerDay, days), 0); err != nil {
			return err
		}
	}
	row++
	if err := put([]any{"Room use"}, wb.st.bold); err != nil {
		return err
	}
	if err := put(header(roomCols), wb.st.header); err != nil {
		return err
	}
	for i := range v.t.Rooms {
		r := &v.t.Rooms[i]
		cells := roomLoad(r.ID)
		if err := put(cells, 0); err != nil {
			return err
		}
		if err := f.SetCellStyle(sheet, "H"+strconv.Itoa(row-1), "H"+strconv.Itoa(row-1), wb.st.percent); err != nil {
			return err
		}
	}
	row++
	if err := put([]any{loadCaution}, wb.st.note); err != nil {
		return err
	}
	if err := f.SetColWidth(sheet, "A", "A", 14); err != nil {
		return err
	}
	if err := f.SetColWidth(sheet, "B", "B", 26); err != nil {
		return err
	}
	if err := f.SetColWidth(sheet, "C", "H", 14); err != nil {
		return err
	}
	return wb.pageSetup(sheet, "", "")
}

// staffLoad is one row of the staff table.
func (v *view) staffLoad(id, name string, limit int, days *calendarInfo) []any {
	items := v.byStaff[id]
	sections := map[string]bool{}
	periods := map[int]bool{}
	perDay := map[int]int{}
	term := 0
	for _, i := range items {
		m := &v.meetings[i]
		sections[m.sec.ID] = true
		for p := m.first; p <= m.last; p++ {
			if !periods[p] {
				periods[p] = true
				perDay[int(m.day)]++
			}
		}
		if days != nil {
			on, _ := v.occurrences(days, m)
			term += len(on) * (m.last - m.first + 1)
		}
	}
	busiest := 0
	for _, n := range perDay {
		busiest = max(busiest, n)
	}
	out := []any{id, name, len(sections), len(items), len(periods), busiest, "", ""}
	if limit > 0 {
		out[6] = limit
	}
	if days != nil {
		out[7] = term
	}
	return out
}

// roomLoad is one row of the room table.
func (v *view) roomLoad(id string) []any {
	r := v.rooms[id]
	items := v.byRoom[id]
	periods := map[int]bool{}
	largest := 0
	for _, i := range items {
		m := &v.meetings[i]
		largest = max(largest, m.sec.Size)
		for p := m.first; p <= m.last; p++ {
			periods[p] = true
		}
	}
	util := 0.0
	if n := len(v.t.Periods); n > 0 {
		util = float64(len(periods)) / float64(n)
	}
	return []any{r.ID, r.Building, r.Capacity, largest, len(items), len(periods), len(v.t.Periods), util}
}
