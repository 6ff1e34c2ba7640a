package export

import "strings"

// Shading of a subject's unavailable times on its grid, as on the
// Unavailable sheet: hard means the subject must not be booked then,
// otherwise it is a preference that costs when broken.
const (
	unavailNone = iota
	unavailSoft
	unavailHard
)

// unavailableCells gives, for each grid row and day column, how strongly
// who is unavailable there (unavailNone, unavailSoft, unavailHard) and the
// reason of the strongest entry (with its weeks when it holds only in
// some weeks: "conference, wks 9-10"). Only cells of existing periods count.
func (v *view) unavailableCells(who Subject) (level [][]int, reason [][]string) {
	level = make([][]int, len(v.rows))
	reason = make([][]string, len(v.rows))
	for r := range v.rows {
		level[r] = make([]int, len(v.days))
		reason[r] = make([]string, len(v.days))
	}
	for _, u := range v.t.Unavailable {
		if u.Kind != who.Kind || u.Who != who.ID {
			continue
		}
		c := v.dayCol[u.Day]
		if c < 0 {
			continue
		}
		l := unavailSoft
		if u.Hard {
			l = unavailHard
		}
		why := u.Reason
		if wk := v.weeksLabel(u.Weeks); wk != "" { // only in some weeks: say which
			why = strings.Join(nonEmpty(why, wk), ", ")
		}
		for r, row := range v.rows {
			if v.has[r][c] && row.from < u.To && u.From < row.to && l > level[r][c] {
				level[r][c], reason[r][c] = l, why
			}
		}
	}
	return level, reason
}

// unavailable shades who's unavailable times on the grid: cross-hatched
// for hard ones, labelled "Unavailable", light grey for preferences,
// labelled "Preferably free", with the reason when one was entered; the
// label shows once at the top of each run of equal cells in a day. Both
// differ from the single hatching of "no such period" and from the grey
// of a meeting block, in black and white too.
func (d *pdfDoc) unavailable(g gridGeo, who Subject) {
	if who.Kind == WhoStudent {
		return
	}
	f, v := d.f, d.v
	level, reason := v.unavailableCells(who)
	for c := range v.days {
		for r := 0; r < len(v.rows); r++ {
			l := level[r][c]
			if l == unavailNone {
				continue
			}
			end := r
			for end+1 < len(v.rows) && level[end+1][c] == l && reason[end+1][c] == reason[r][c] {
				end++
			}
			label := unavailableLabel(l, reason[r][c])
			f.SetFillColor(240, 240, 240)
			for k := r; k <= end; k++ {
				if !v.has[k][c] {
					continue
				}
				x, y, w, h := g.colX(c)+0.15, g.rowY(k)+0.15, g.colW-0.3, g.height(k)-0.3
				f.Rect(x, y, w, h, "F")
				if l == unavailHard {
					d.crossHatch(x, y, w, h)
				}
			}
			d.font("", 6)
			d.gray(70)
			for i, line := range d.wrap(label, g.colW-2, 2) {
				y := g.rowY(r) + 2.4 + float64(i)*2.6
				f.SetFillColor(248, 248, 248) // a plain ground keeps the label legible on hatching
				f.Rect(g.colX(c)+0.6, y-2.0, f.GetStringWidth(line)+0.8, 2.6, "F")
				d.text(g.colX(c)+1, y, line)
			}
			d.gray(0)
			r = end
		}
	}
}

// crossHatch fills a rectangle with lines in both diagonal directions.
func (d *pdfDoc) crossHatch(x, y, w, h float64) {
	f := d.f
	f.ClipRect(x, y, w, h, false)
	f.SetDrawColor(165, 165, 165)
	f.SetLineWidth(0.12)
	for s := -h; s < w; s += 1.6 {
		f.Line(x+s, y+h, x+s+h, y)
		f.Line(x+s, y, x+s+h, y+h)
	}
	f.ClipEnd()
}

// unavailableLabel is the text on a run of unavailable cells:
// "Unavailable: reason" or "Preferably free: reason".
func unavailableLabel(level int, reason string) string {
	label := "Preferably free"
	if level == unavailHard {
		label = "Unavailable"
	}
	if reason != "" {
		label += ": " + reason
	}
	return label
}
