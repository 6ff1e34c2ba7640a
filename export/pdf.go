package export

import (
	"fmt"
	"io"
	"strings"

	"github.com/go-pdf/fpdf"
	"github.com/termwright/termwright/timetable"
)

// Page geometry in millimetres (landscape pages).
const (
	pdfMargin  = 10.0
	pdfGridTop = 25.0 // top of the grid, under the page header
	pdfFootH   = 12.0 // space kept for the footer
	ptToMM     = 25.4 / 72
)

// paperSize maps Options.Paper to the PDF library's size name.
func paperSize(p string) (string, error) {
	switch strings.ToLower(strings.TrimSpace(p)) {
	case "", "a4":
		return "A4", nil
	case "letter", "us letter":
		return "Letter", nil
	}
	return "", fmt.Errorf("the paper size %q is not supported; choose A4 or Letter", p)
}

// WritePersonPDF writes one landscape page with who's weekly grid: days
// across, periods down, one block per meeting.
func WritePersonPDF(w io.Writer, t *timetable.Term, s *timetable.Schedule, who Subject, opt Options) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return v.writePersonPDF(w, who, opt)
}

func (v *view) writePersonPDF(w io.Writer, who Subject, opt Options) error {
	items, err := v.of(who)
	if err != nil {
		return err
	}
	d, err := v.newPDF(opt, v.title(who)+" — "+v.t.Name)
	if err != nil {
		return err
	}
	d.total = 1
	d.gridPage(who, items)
	return d.output(w)
}

// WriteCombinedPDF writes the whole timetable as one document: a cover
// page, the master list of meetings sorted by day and time, and every staff
// member's, room's and cohort's weekly grid.
func WriteCombinedPDF(w io.Writer, t *timetable.Term, s *timetable.Schedule, opt Options) error {
	v, err := newView(t, s)
	if err != nil {
		return err
	}
	return v.writeCombinedPDF(w, opt)
}

func (v *view) writeCombinedPDF(w io.Writer, opt Options) error {
	d, err := v.newPDF(opt, v.t.Name+" — timetable")
	if err != nil {
		return err
	}
	subjects := v.gridSubjects()
	listPages := d.listPageCount()
	d.total = 1 + listPages + len(subjects)
	d.cover(listPages)
	d.masterList()
	for _, who := range subjects {
		items, _ := v.of(who)
		d.gridPage(who, items)
	}
	return d.output(w)
}

// pdfDoc is one PDF being drawn.
type pdfDoc struct {
	f     *fpdf.Fpdf
	v     *view
	w, h  float64 // page width and height in mm (landscape)
	stamp string  // "Generated ..." footer text
	total int     // number of pages the document will have
	note  string  // extra footer text of the current page
}

// newPDF starts a landscape document with the Unicode fonts registered.
func (v *view) newPDF(opt Options, title string) (*pdfDoc, error) {
	size, err := paperSize(opt.Paper)
	if err != nil {
		return nil, err
	}
	f := fpdf.NewCustom(&fpdf.InitType{OrientationStr: "L", UnitStr: "mm", SizeStr: size})
	for style, ttf := range fontBytes {
		f.AddUTF8FontFromBytes(pdfFamily, style, ttf)
	}
	gen := opt.generated()
	f.SetCreationDate(gen)
	f.SetModificationDate(gen)
	f.SetCatalogSort(true)
	f.SetTitle(printable(title), true)
	f.SetCreator("termwright", false)
	f.SetProducer("termwright", false)
	f.SetAutoPageBreak(false, 0)
	f.SetMargins(pdfMargin, pdfMargin, pdfMargin)
	w, h := f.GetPageSize()
	d := &pdfDoc{f: f, v: v, w: w, h: h}
	when := gen
	if loc, _, err := termLocation(v.t); err == nil {
		when = gen.In(loc)
	}
	d.stamp = "Generated " + when.Format("2 Jan 2006 15:04 MST") + " by termwright"
	f.SetFooterFunc(d.footer)
	return d, nil
}

// output finishes the document.
func (d *pdfDoc) output(w io.Writer) error {
	if err := d.f.Output(w); err != nil {
		return fmt.Errorf("the PDF could not be written (%w); check that there is room on the disk and try again", err)
	}
	return nil
}

// page starts a new page with footer note (may be "").
func (d *pdfDoc) page(note string) {
	d.f.AddPage()
	d.note = note
}

// footer draws the generation time, the page's note and the page number.
func (d *pdfDoc) footer() {
	y := d.h - pdfMargin + 2
	d.font("", 7)
	d.gray(90)
	d.text(pdfMargin, y, d.stamp)
	right := fmt.Sprintf("Page %d of %d", d.f.PageNo(), d.total)
	d.text(d.w-pdfMargin-d.f.GetStringWidth(right), y, right)
	if d.note != "" {
		note := d.fit(d.note, d.w-2*pdfMargin-140)
		d.text((d.w-d.f.GetStringWidth(note))/2, y, note)
	}
	d.gray(0)
}

// header draws a page header: big title and detail line on the left, the
// term's name, dates, teaching weeks and the days without teaching (as
// ranges, as many as fit) on the right, a rule underneath.
func (d *pdfDoc) header(title, detail string) {
	t := d.v.t
	right := []string{t.Name, termDates(t)}
	if !t.FirstDay.IsZero() {
		right[1] += fmt.Sprintf(" · %d teaching week%s", d.v.weeksWithTeaching(), plural(d.v.weeksWithTeaching()))
	}
	half := (d.w - 2*pdfMargin) / 2
	d.font("", 7.5)
	if hs := d.v.holidayTexts(); len(hs) > 0 {
		right = append(right, listThatFits("No teaching: ", hs, half, d.width))
	}
	d.font("B", 9.5)
	rw := d.f.GetStringWidth(d.fit(right[0], half))
	d.text(d.w-pdfMargin-rw, pdfMargin+3, d.fit(right[0], half))
	d.font("", 7.5)
	for i, line := range right[1:] {
		line = d.fit(line, half)
		d.text(d.w-pdfMargin-d.f.GetStringWidth(line), pdfMargin+7+float64(i)*3.3, line)
	}
	d.font("B", 15)
	d.text(pdfMargin, pdfMargin+5, d.fit(title, d.w-2*pdfMargin-half-5))
	d.font("", 8)
	d.gray(60)
	d.text(pdfMargin, pdfMargin+10.5, d.fit(detail, d.w-2*pdfMargin-half-5))
	d.gray(0)
	d.f.SetLineWidth(0.4)
	d.f.Line(pdfMargin, pdfGridTop-3, d.w-pdfMargin, pdfGridTop-3)
}

// width is the width of s in the current font.
func (d *pdfDoc) width(s string) float64 { return d.f.GetStringWidth(printable(s)) }

// font selects the Go font in style "" or "B" at size points.
func (d *pdfDoc) font(style string, size float64) { d.f.SetFont(pdfFamily, style, size) }

// gray sets the text colour to a grey level (0 black .. 255 white).
func (d *pdfDoc) gray(g int) { d.f.SetTextColor(g, g, g) }

// text draws s with its baseline at (x, y).
func (d *pdfDoc) text(x, y float64, s string) { d.f.Text(x, y, printable(s)) }

// fit shortens s with "…" until it is at most w wide in the current font.
func (d *pdfDoc) fit(s string, w float64) string {
	s = printable(s)
	if d.f.GetStringWidth(s) <= w {
		return s
	}
	r := []rune(s)
	lo, hi := 0, len(r) // longest prefix that fits with the ellipsis
	for lo < hi {
		mid := (lo + hi + 1) / 2
		if d.f.GetStringWidth(string(r[:mid])+"…") <= w {
			lo = mid
		} else {
			hi = mid - 1
		}
	}
	return strings.TrimRight(string(r[:lo]), " ") + "…"
}

// wrap breaks s into at most max lines of width w in the current font,
// breaking at spaces (or inside a word too long for a line); when text is
// left over, the last line ends in "…".
func (d *pdfDoc) wrap(s string, w float64, max int) []string {
	words := strings.Fields(printable(s))
	var lines []string
	cur := ""
	for len(words) > 0 {
		try := words[0]
		if cur != "" {
			try = cur + " " + words[0]
		}
		if d.f.GetStringWidth(try) <= w {
			cur, words = try, words[1:]
			continue
		}
		if cur == "" { // one word wider than the line: split it
			r := []rune(words[0])
			n := 1
			for n < len(r) && d.f.GetStringWidth(string(r[:n+1])) <= w {
				n++
			}
			cur, words[0] = string(r[:n]), string(r[n:])
		}
		if len(lines) == max-1 {
			return append(lines, d.fit(strings.Join(append([]string{cur}, words...), " "), w))
		}
		lines = append(lines, cur)
		cur = ""
	}
	if cur != "" {
		lines = append(lines, cur)
	}
	return lines
}
