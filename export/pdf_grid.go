package export

import (
	"math"

	"github.com/termwright/termwright/timetable"
)

// gridGeo is the geometry of a weekly grid on a page, in mm.
type gridGeo struct {
	x0, y0 float64   // top-left corner (of the time label column)
	labelW float64   // width of the time label column
	colW   float64   // width of one day column
	headH  float64   // height of the day header row
	rowH   float64   // height of one grid row (uniform rows)
	ys     []float64 // with rows drawn to scale: top of each row, and the bottom of the last (len rows+1); nil for uniform rows
}

func (d *pdfDoc) geo() gridGeo {
	v := d.v
	g := gridGeo{x0: pdfMargin, y0: pdfGridTop, labelW: 16, headH: 6.5}
	g.colW = (d.w - 2*pdfMargin - g.labelW) / float64(max(len(v.days), 1))
	g.rowH = (d.h - pdfFootH - pdfGridTop - g.headH) / float64(max(len(v.rows), 1))
	if v.minutes {
		g.ys = scaledRows(v.rows, g.y0+g.headH, d.h-pdfFootH)
	}
	return g
}

// scaledRows places rows between top and bottom with heights in
// proportion to their minutes, so that a meeting's block is as tall as it
// is long whatever pieces the grid cut its time into.
func scaledRows(rows []gridRow, top, bottom float64) []float64 {
	total := 0
	for _, r := range rows {
		total += int(r.to - r.from)
	}
	ys := make([]float64, len(rows)+1)
	ys[0] = top
	per := (bottom - top) / float64(max(total, 1))
	for i, r := range rows {
		ys[i+1] = ys[i] + float64(r.to-r.from)*per
	}
	return ys
}

func (g gridGeo) colX(c int) float64 { return g.x0 + g.labelW + float64(c)*g.colW }
func (g gridGeo) rowY(r int) float64 {
	if g.ys != nil {
		return g.ys[r]
	}
	return g.y0 + g.headH + float64(r)*g.rowH
}

// height is the height of grid row r.
func (g gridGeo) height(r int) float64 {
	if g.ys != nil {
		return g.ys[r+1] - g.ys[r]
	}
	return g.rowH
}

// roomCaution is the footer note of room pages.
const roomCaution = "Seat counts are as entered; the room's posted legal occupancy and local codes take precedence."

// gridPage draws one subject's weekly grid on a new page.
func (d *pdfDoc) gridPage(who Subject, items []int) {
	note := ""
	if who.Kind == timetable.WhoRoom {
		note = roomCaution
	}
	d.page(note)
	detail := d.v.detail(who)
	if len(items) == 0 {
		detail += " · no meetings this term"
	}
	d.header(d.v.title(who), detail)
	g := d.geo()
	d.gridFrame(g)
	d.unavailable(g, who)
	var boxes []box
	for _, cl := range d.v.clusters(items) {
		boxes = append(boxes, d.v.boxes(cl)...)
	}
	// One text size for the page where possible: the largest that lets
	// every block show all its text, but not below pageMinSize; a block
	// that needs less still gets its own smaller size.
	sizes := make([]float64, len(boxes))
	page := blockSizes[0]
	for i, b := range boxes {
		_, _, w, h := d.boxRect(g, b)
		sizes[i] = d.blockSize(d.v.blockContent(&d.v.meetings[b.item], who), w-blockBar-1.8, h)
		page = min(page, max(sizes[i], pageMinSize))
	}
	for i, b := range boxes {
		d.block(g, b, who, min(sizes[i], page))
	}
}

// gridFrame draws the empty grid: day headers, time labels, cells, hatched
// cells where a day has no such period, and a heavy rule at breaks.
func (d *pdfDoc) gridFrame(g gridGeo) {
	f, v := d.f, d.v
	bottom := g.rowY(len(v.rows))
	right := g.colX(len(v.days))
	f.SetFillColor(215, 215, 215)
	f.SetDrawColor(120, 120, 120)
	f.SetLineWidth(0.2)
	f.Rect(g.x0, g.y0, right-g.x0, g.headH, "FD")
	d.font("B", 8.5)
	for c, day := range v.days {
		name := day.String()
		if d.f.GetStringWidth(name) > g.colW-2 {
			name = timetable.DayName(day)
		}
		d.text(g.colX(c)+(g.colW-f.GetStringWidth(name))/2, g.y0+g.headH-2, name)
	}
	f.SetFillColor(242, 242, 242)
	f.Rect(g.x0, g.y0+g.headH, g.labelW, bottom-g.y0-g.headH, "FD")
	for r, row := range v.rows {
		y := g.rowY(r)
		if g.ys != nil {
			d.scaledLabel(g, r, row)
			continue
		}
		if g.rowH >= 6.5 {
			d.fromToLabel(g, y, row)
		} else {
			size := math.Min(6, g.rowH/ptToMM*0.8)
			d.font("", size)
			d.text(g.x0+1, y+size*ptToMM+0.3, row.from.String()+"–"+row.to.String())
		}
		for c := range v.days {
			if !v.has[r][c] {
				d.hatch(g.colX(c), y, g.colW, g.rowH)
			}
		}
	}
	f.SetDrawColor(170, 170, 170)
	f.SetLineWidth(0.15)
	for r := 1; r < len(v.rows); r++ {
		f.Line(g.x0, g.rowY(r), right, g.rowY(r))
	}
	for c := 0; c <= len(v.days); c++ {
		f.Line(g.colX(c), g.y0, g.colX(c), bottom)
	}
	f.SetDrawColor(0, 0, 0)
	f.SetLineWidth(0.6)
	for r := 1; r < len(v.rows); r++ {
		if v.rows[r-1].to != v.rows[r].from { // a break (lunch, ...) between periods
			f.Line(g.x0, g.rowY(r), right, g.rowY(r))
		}
	}
	f.SetLineWidth(0.3)
	f.Rect(g.x0, g.y0, right-g.x0, bottom-g.y0, "D")
}

// hatch fills a cell with thin diagonal lines: "no such period that day".
func (d *pdfDoc) hatch(x, y, w, h float64) {
	f := d.f
	f.ClipRect(x, y, w, h, false)
	f.SetDrawColor(200, 200, 200)
	f.SetLineWidth(0.15)
	for s := -h; s < w; s += 2.2 {
		f.Line(x+s, y+h, x+s+h, y)
	}
	f.ClipEnd()
}

// boxRect is the rectangle (mm) of a box on the page.
func (d *pdfDoc) boxRect(g gridGeo, b box) (x, y, w, h float64) {
	m := &d.v.meetings[b.item]
	areaH := float64(b.r1-b.r0+1) * g.rowH
	if g.ys != nil {
		areaH = g.ys[b.r1+1] - g.ys[b.r0]
	}
	x = g.colX(d.v.dayCol[m.day]) + b.x0*g.colW + 0.5
	w = (b.x1-b.x0)*g.colW - 1
	y = g.rowY(b.r0) + b.y0*areaH + 0.5
	h = (b.y1-b.y0)*areaH - 1
	return x, y, w, h
}

// scaledLabel labels a row of a grid drawn to scale with its start time,
// and its end when the row is tall enough; a row too short for text (a
// few minutes between two other times) stays unlabelled, the blocks give
// their own times.
func (d *pdfDoc) scaledLabel(g gridGeo, r int, row gridRow) {
	y, h := g.rowY(r), g.height(r)
	switch {
	case h >= 6.5:
		d.fromToLabel(g, y, row)
	case h >= 2.4:
		size := math.Min(6.5, h/ptToMM*0.85)
		d.font("", size)
		d.text(g.x0+1, y+size*ptToMM+0.2, row.from.String())
	}
}

// fromToLabel writes a row label on two lines at the row's top y: its
// start in bold and, smaller and grey, "to" its end; a row at least 6.5 mm
// tall has room for it.
func (d *pdfDoc) fromToLabel(g gridGeo, y float64, row gridRow) {
	d.font("B", 8)
	d.text(g.x0+1.5, y+3.4, row.from.String())
	d.font("", 6.5)
	d.gray(80)
	d.text(g.x0+1.5, y+6.2, "to "+row.to.String())
	d.gray(0)
}
