package export

import (
	"fmt"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// listCol is one column of the master list.
type listCol struct {
	head  string
	share float64 // share of the page width
}

var listCols = []listCol{
	{"Day", 0.045}, {"Time", 0.075}, {"Section", 0.08}, {"Title", 0.29}, {"Room", 0.13},
	{"Staff", 0.21}, {"Cohorts", 0.10}, {"Weeks", 0.07},
}

// Master list geometry (mm).
const (
	listTop   = pdfGridTop
	listHeadH = 6.0
	listRowH  = 4.6
)

// listRowsPerPage is how many meetings fit on one master list page.
func (d *pdfDoc) listRowsPerPage() int {
	return max(int((d.h-pdfFootH-listTop-listHeadH)/listRowH), 1)
}

// listPageCount is the number of master list pages.
func (d *pdfDoc) listPageCount() int {
	per := d.listRowsPerPage()
	return max((len(d.v.meetings)+per-1)/per, 1)
}

// cover draws the first page of the combined document: the term, counts,
// contents with page numbers, and the usual caution.
func (d *pdfDoc) cover(listPages int) {
	v, f := d.v, d.f
	t := v.t
	d.page("")
	y := 45.0
	d.font("B", 26)
	d.text(pdfMargin+10, y, d.fit(t.Name, d.w-2*pdfMargin-20))
	d.font("", 13)
	y += 10
	d.text(pdfMargin+10, y, "Timetable · "+termDates(t))
	f.SetLineWidth(0.8)
	f.Line(pdfMargin+10, y+5, d.w-pdfMargin-10, y+5)
	y += 16
	facts := [][2]string{
		{"Sections", fmt.Sprint(len(t.Sections))},
		{"Meetings each week", fmt.Sprint(len(v.meetings))},
		{"Staff", fmt.Sprint(len(t.Staff))},
		{"Rooms", fmt.Sprint(len(t.Rooms))},
		{"Cohorts", fmt.Sprint(len(t.Cohorts))},
		{"Teaching weeks", v.teachingWeeksValue()},
		{"Time zone", t.TimeZone},
	}
	if hs := v.holidayTexts(); len(hs) > 0 {
		facts = append(facts, [2]string{"No teaching", strings.Join(hs, ", ")})
	}
	valueW := d.w/2 - pdfMargin - 60
	for _, fct := range facts {
		d.font("", 10)
		d.text(pdfMargin+10, y, fct[0])
		d.font("B", 10)
		// Long values (many days without teaching) wrap over lines.
		for _, l := range d.wrap(fct[1], valueW, 8) {
			d.text(pdfMargin+60, y, l)
			y += 5
		}
		y++
	}
	staffPage := 2 + listPages
	contents := [][2]string{
		{"Master list of meetings, by day and time", "2"},
		{fmt.Sprintf("Staff timetables (%d)", len(t.Staff)), fmt.Sprint(staffPage)},
		{fmt.Sprintf("Room timetables (%d)", len(t.Rooms)), fmt.Sprint(staffPage + len(t.Staff))},
		{fmt.Sprintf("Cohort timetables (%d)", len(t.Cohorts)), fmt.Sprint(staffPage + len(t.Staff) + len(t.Rooms))},
	}
	cx, cy := d.w/2+5, 71.0
	d.font("B", 11)
	d.text(cx, cy, "Contents")
	cy += 7
	for _, c := range contents {
		d.font("", 10)
		d.text(cx, cy, c[0])
		d.text(d.w-pdfMargin-10-f.GetStringWidth(c[1]), cy, c[1])
		cy += 6
	}
	d.font("", 8.5)
	d.gray(60)
	caution := "Every timetable in this document was checked against the room capacities, availabilities and teaching limits entered in the term workbook. " +
		"Those figures are only as good as their entry: room occupancy must stay within each room's posted legal limit and local codes, " +
		"accessibility needs must be confirmed with the people concerned, and teaching loads must follow local agreements and institution policy."
	ly := d.h - pdfFootH - 18
	for _, l := range d.wrap(caution, d.w-2*pdfMargin-20, 4) {
		d.text(pdfMargin+10, ly, l)
		ly += 4
	}
	d.gray(0)
}

// masterList draws every meeting sorted by day, time, section and meeting,
// repeating the column headers on each page and marking each new day.
func (d *pdfDoc) masterList() {
	v, f := d.v, d.f
	per := d.listRowsPerPage()
	width := d.w - 2*pdfMargin
	xs := make([]float64, len(listCols)+1)
	xs[0] = pdfMargin
	for i, c := range listCols {
		xs[i+1] = xs[i] + c.share*width
	}
	var y float64
	for i := range v.meetings {
		if i%per == 0 {
			d.page("")
			d.header("Master list", fmt.Sprintf("All %d meetings each week, by day and time", len(v.meetings)))
			y = listTop
			f.SetFillColor(215, 215, 215)
			f.SetDrawColor(120, 120, 120)
			f.SetLineWidth(0.2)
			f.Rect(pdfMargin, y, width, listHeadH, "FD")
			d.font("B", 8)
			for k, c := range listCols {
				d.text(xs[k]+1, y+4.2, c.head)
			}
			y += listHeadH
		}
		m := &v.meetings[i]
		newDay := i == 0 || v.meetings[i-1].day != m.day
		if i%2 == 1 {
			f.SetFillColor(244, 244, 244)
			f.Rect(pdfMargin, y, width, listRowH, "F")
		}
		if newDay && i%per != 0 {
			f.SetDrawColor(0, 0, 0)
			f.SetLineWidth(0.5)
			f.Line(pdfMargin, y, pdfMargin+width, y)
		}
		weeks := v.weekRanges(m)
		if weeks == "" {
			weeks = "all"
		}
		room := roomText(m.room)
		if m.room == nil && m.sec.NoRoom {
			room = "online / off-site"
		}
		cells := []string{timetable.DayName(m.day), m.from.String() + "–" + m.to.String(), m.sec.ID, m.sec.Title,
			room, strings.Join(v.staffNames(m.sec), ", "), strings.Join(m.sec.Cohorts, ", "), weeks}
		for k, c := range cells {
			style := ""
			if k == 2 || (k == 0 && (newDay || i%per == 0)) {
				style = "B"
			}
			if k == 0 && !newDay && i%per != 0 {
				continue // the day shows once per day and page
			}
			// A long cell is set smaller before it is cut with "…".
			size := 7.5
			for size > 6 && d.widthAt(style, size, c) > xs[k+1]-xs[k]-2 {
				size -= 0.5
			}
			d.font(style, size)
			d.text(xs[k]+1, y+3.3, d.fit(c, xs[k+1]-xs[k]-2))
		}
		y += listRowH
	}
	if len(v.meetings) == 0 {
		d.page("")
		d.header("Master list", "No meetings")
	}
}

// widthAt is the width of s in style at size points.
func (d *pdfDoc) widthAt(style string, size float64, s string) float64 {
	d.font(style, size)
	return d.width(s)
}
