package export

import (
	"strings"

	"github.com/termwright/termwright/timetable"
)

// blockInfo is what a grid block can show about one meeting on one
// subject's page. Facts the page already gives are left out: the room on
// that room's page, the staff line on a page of its only staff member.
type blockInfo struct {
	m     *meeting
	weeks string // "wks 1-6", or "" when the section meets every week
	title string
	room  string   // room and building, "online / off-site", or ""
	staff []string // staff names, none when the page is that person's own
}

// blockContent gathers the text of meeting m for who's page.
func (v *view) blockContent(m *meeting, who Subject) blockInfo {
	b := blockInfo{m: m, weeks: v.weeks(m), title: m.sec.Title, room: roomText(m.room)}
	if m.room == nil && m.sec.NoRoom {
		b.room = "online / off-site"
	}
	if who.Kind == timetable.WhoRoom && m.room != nil && m.room.ID == who.ID {
		b.room = ""
	}
	if !(who.Kind == timetable.WhoStaff && len(m.sec.Staff) == 1 && m.sec.Staff[0] == who.ID) {
		b.staff = v.staffNames(m.sec)
	}
	return b
}

// blockLine is one line of block text: text in style, then tail in the
// regular style.
type blockLine struct {
	text  string
	style string // "" or "B"
	tail  string
}

// blockSizes are the font sizes (points) tried for block text, largest first.
var blockSizes = []float64{8.5, 8, 7.5, 7, 6.5, 6, 5.5}

// pageMinSize is the smallest text size (points) a whole page is set in;
// blockBar is the width (mm) of the bar on a block's left edge.
const (
	pageMinSize = 6.5
	blockBar    = 1.2
)

// lineHeight is the height (mm) of one line of block text at size points.
func lineHeight(size float64) float64 { return size * ptToMM * 1.2 }

// blockSize picks the text size for a block whose text area is w wide and
// h high: the largest size at which all the text fits; else the largest at
// which all of it fits with the weeks moved up into the section's line;
// else the largest giving at least four lines (three, two); else the
// smallest.
func (d *pdfDoc) blockSize(b blockInfo, w, h float64) float64 {
	for _, compact := range []bool{false, true} {
		for _, s := range blockSizes {
			full, short := d.blockNeed(b, s, w)
			need := full
			if compact {
				need = short
			}
			if int((h-1)/lineHeight(s)) >= need {
				return s
			}
		}
	}
	for _, want := range []int{4, 3, 2} {
		for _, s := range blockSizes {
			if int((h-1)/lineHeight(s)) >= want {
				return s
			}
		}
	}
	return blockSizes[len(blockSizes)-1]
}

// blockNeed counts the lines b takes in full at size points in width w:
// with the weeks on a line of their own (full) and in the section's line
// (short).
func (d *pdfDoc) blockNeed(b blockInfo, size, w float64) (full, short int) {
	d.font("", size)
	n := 1 + len(d.wrap(b.title, w, 12)) + len(d.wrapList(b.staff, w, 6)) + len(d.wrap(b.room, w, 3))
	if b.weeks != "" {
		return n + 1, n
	}
	return n, n
}

// blockLines chooses the text of a block with room for n lines of width w
// at size points. The section always shows, with its times when they fit.
// When the lines are too few for everything, the weeks move into the
// section's line in place of the times (the grid rows give the times).
// Then one line each for weeks, title, room and staff as they fit; lines
// left over continue the title, then the staff names, then the room.
func (d *pdfDoc) blockLines(b blockInfo, size, w float64, n int) []blockLine {
	m := b.m
	d.font("B", size)
	id := d.fit(m.sec.ID, w)
	head := blockLine{text: id, style: "B"}
	rest := w - d.f.GetStringWidth(id)
	d.font("", size)
	title := d.wrap(b.title, w, 12)
	staff := d.wrapList(b.staff, w, 6)
	room := d.wrap(b.room, w, 3)
	full, _ := d.blockNeed(b, size, w)
	weeksLine := b.weeks != ""
	if weeksLine && full > n {
		if tail := " · " + b.weeks; d.f.GetStringWidth(tail) <= rest {
			head.tail, weeksLine = tail, false
		}
	}
	if tail := " · " + m.from.String() + "–" + m.to.String(); head.tail == "" && d.f.GetStringWidth(tail) <= rest {
		head.tail = tail
	}
	left := n - 1
	take := func(ok bool) int {
		if ok && left > 0 {
			left--
			return 1
		}
		return 0
	}
	nWeeks := take(weeksLine)
	nTitle := take(len(title) > 0)
	nRoom := take(len(room) > 0)
	nStaff := take(len(staff) > 0)
	more := func(have, of int) int { // lines left over, given in turn
		if have == 0 {
			return 0
		}
		k := min(left, of-1)
		left -= k
		return have + k
	}
	nTitle = more(nTitle, len(title))
	nStaff = more(nStaff, len(staff))
	nRoom = more(nRoom, len(room))
	out := []blockLine{head}
	if nWeeks > 0 {
		out = append(out, blockLine{text: d.fit(b.weeks, w)})
	}
	for _, l := range d.wrapAt(b.title, w, nTitle) {
		out = append(out, blockLine{text: l})
	}
	for _, l := range d.wrapAt(b.room, w, nRoom) {
		out = append(out, blockLine{text: l})
	}
	if nStaff > 0 {
		for _, l := range d.wrapList(b.staff, w, nStaff) {
			out = append(out, blockLine{text: l})
		}
	}
	return out
}

// wrapAt is wrap with max lines, or nothing for max 0.
func (d *pdfDoc) wrapAt(s string, w float64, max int) []string {
	if max <= 0 {
		return nil
	}
	return d.wrap(s, w, max)
}

// wrapList sets items (names) as a comma-separated list in lines of width
// w in the current font, at most max lines, breaking between items where
// it can (inside an item only when it is wider than a line); when items
// are left over, the last line ends in "…".
func (d *pdfDoc) wrapList(items []string, w float64, max int) []string {
	var lines []string
	cur := ""
	for i := 0; i < len(items); i++ {
		item := printable(items[i])
		if i < len(items)-1 {
			item += ","
		}
		try := item
		if cur != "" {
			try = cur + " " + item
		}
		if d.f.GetStringWidth(try) <= w {
			cur = try
			continue
		}
		if cur != "" {
			if len(lines) == max-1 {
				return append(lines, d.fit(cur+" "+strings.Join(items[i:], ", "), w))
			}
			lines = append(lines, cur)
			cur = ""
		}
		if d.f.GetStringWidth(item) <= w {
			cur = item
			continue
		}
		// an item wider than a line: wrap it by words
		parts := d.wrap(item, w, max-len(lines))
		lines = append(lines, parts[:len(parts)-1]...)
		cur = parts[len(parts)-1]
		if len(lines) == max-1 && i < len(items)-1 {
			return append(lines, d.fit(cur+" "+strings.Join(items[i+1:], ", "), w))
		}
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}

// block draws one meeting with text of size points: a framed grey block
// with a dark bar on its left edge (white with a dashed frame and a lighter
// bar when the section meets only some weeks), holding section, times,
// weeks, title, room and staff as space allows.
func (d *pdfDoc) block(g gridGeo, bx box, who Subject, size float64) {
	f, v := d.f, d.v
	m := &v.meetings[bx.item]
	b := v.blockContent(m, who)
	x, y, w, h := d.boxRect(g, bx)
	f.SetLineWidth(0.3)
	f.SetDrawColor(0, 0, 0)
	if b.weeks != "" {
		f.SetFillColor(252, 252, 252)
		f.SetDashPattern([]float64{1.2, 0.8}, 0)
	} else {
		f.SetFillColor(226, 226, 226)
	}
	f.Rect(x, y, w, h, "FD")
	f.SetDashPattern(nil, 0)
	if b.weeks != "" {
		f.SetFillColor(150, 150, 150)
	} else {
		f.SetFillColor(60, 60, 60)
	}
	f.Rect(x, y, blockBar, h, "F")

	tx, tw := x+blockBar+1, w-blockBar-1.8
	lh := lineHeight(size)
	n := max(int((h-1)/lh), 1)
	lines := d.blockLines(b, size, tw, n)
	f.ClipRect(x, y, w, h, false)
	for i, l := range lines {
		base := y + 0.6 + float64(i)*lh + size*ptToMM*0.92
		d.font(l.style, size)
		d.text(tx, base, l.text)
		if l.tail != "" {
			at := tx + f.GetStringWidth(l.text)
			d.font("", size)
			d.text(at, base, l.tail)
		}
	}
	f.ClipEnd()
}
