package export

import (
	"bytes"
	"flag"
	"fmt"
	"os"
	"os/exec"
	"path/filepath"
	"regexp"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

var renderDir = flag.String("render", "", "also write the sample PDFs and their PNG renderings into this directory, to look at")

func writePDF(t *testing.T, term *timetable.Term, s *timetable.Schedule, who *Subject, opt Options) []byte {
	t.Helper()
	var buf bytes.Buffer
	if who == nil {
		require.NoError(t, WriteCombinedPDF(&buf, term, s, opt))
	} else {
		require.NoError(t, WritePersonPDF(&buf, term, s, *who, opt))
	}
	return buf.Bytes()
}

var (
	pageObj  = regexp.MustCompile(`/Type /Page\b[^s]`)
	mediaBox = regexp.MustCompile(`/MediaBox \[0 0 ([0-9.]+) ([0-9.]+)\]`)
)

// pdfStructure describes a PDF by page count and page size, read from the
// file's page objects (ISO 32000-1 §7.7.3: /Type /Page, /MediaBox).
func pdfStructure(b []byte) string {
	size := "?"
	if m := mediaBox.FindSubmatch(b); m != nil {
		size = string(m[1]) + " x " + string(m[2]) + " pt"
	}
	return fmt.Sprintf("%d page(s), %s", len(pageObj.FindAll(b, -1)), size)
}

// TestPDFStructure is a golden test of structure, not bytes: page counts
// and sizes. Landscape A4 is 841.89 x 595.28 pt (ISO 216: 297 x 210 mm at
// 72 pt per inch); landscape US Letter is 792 x 612 pt (11 x 8.5 in).
func TestPDFStructure(t *testing.T) {
	term, s := demoTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	var b strings.Builder
	for _, paper := range []string{"A4", "Letter"} {
		opt := Options{Generated: fixedClock, Paper: paper}
		for _, who := range v.gridSubjects() {
			fmt.Fprintf(&b, "%s %s %s: %s\n", paper, kindWord(who.Kind), who.ID, pdfStructure(writePDF(t, term, s, &who, opt)))
		}
		fmt.Fprintf(&b, "%s combined: %s\n", paper, pdfStructure(writePDF(t, term, s, nil, opt)))
	}
	golden(t, "pdf-structure.txt", []byte(b.String()))
	assert.Contains(t, b.String(), "A4 combined: 13 page(s), 841.89 x 595.28 pt") // cover + 1 list page + 11 grids
	assert.Contains(t, b.String(), "Letter combined: 13 page(s), 792.00 x 612.00 pt")
}

func TestPDFPaper(t *testing.T) {
	term, s := demoTerm()
	err := WritePersonPDF(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "S1"}, Options{Paper: "A3"})
	assert.ErrorContains(t, err, "choose A4 or Letter")
	err = WritePersonPDF(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "nobody"}, Options{})
	assert.ErrorContains(t, err, `"nobody"`)
}

// pdfText extracts the text of a PDF with pdftotext (poppler-utils), or
// skips the test when it is not installed.
func pdfText(t *testing.T, pdf []byte) string {
	t.Helper()
	tool, err := exec.LookPath("pdftotext")
	if err != nil {
		t.Skip("pdftotext not installed (apt-get install poppler-utils)")
	}
	cmd := exec.Command(tool, "-enc", "UTF-8", "-", "-")
	cmd.Stdin = bytes.NewReader(pdf)
	out, err := cmd.Output()
	require.NoError(t, err)
	return string(out)
}

// sectionIDs finds section IDs of the term in text as whole words.
func sectionIDs(term *timetable.Term, text string) map[string]bool {
	found := map[string]bool{}
	for _, sec := range term.Sections {
		if regexp.MustCompile(`(^|[^\pL\pN])` + regexp.QuoteMeta(sec.ID) + `($|[^\pL\pN])`).MatchString(text) {
			found[sec.ID] = true
		}
	}
	return found
}

// TestPDFText reads every person's PDF back as text: it holds each of that
// person's meetings (section, room) and no other section, and names in
// Latin with accents, Greek and Cyrillic come back unchanged.
func TestPDFText(t *testing.T) {
	term, s := demoTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	for _, who := range v.gridSubjects() {
		t.Run(kindWord(who.Kind)+"/"+who.ID, func(t *testing.T) {
			text := pdfText(t, writePDF(t, term, s, &who, Options{Generated: fixedClock}))
			items, _ := v.of(who)
			want := map[string]bool{}
			for _, i := range items {
				m := &v.meetings[i]
				want[m.sec.ID] = true
				if m.room != nil {
					assert.Contains(t, text, m.room.ID)
				}
			}
			assert.Equal(t, want, sectionIDs(term, text))
			assert.Contains(t, text, "Generated 30 Aug 2027 15:05 IST")
			assert.Contains(t, text, "Page 1 of 1")
			assert.Contains(t, text, strings.Fields(v.title(who))[0])
		})
	}
	for id, name := range map[string]string{"S1": "Zoë Ó Briain", "S2": "Łukasz Wróbel", "S3": "Ελένη Παπαδοπούλου", "S4": "Дмитрий Соколов", "S5": "Grete Strauß"} {
		text := pdfText(t, writePDF(t, term, s, &Subject{timetable.WhoStaff, id}, Options{}))
		assert.Contains(t, text, name)
	}
}

func TestCombinedPDFText(t *testing.T) {
	term, s := demoTerm()
	text := pdfText(t, writePDF(t, term, s, nil, Options{Generated: fixedClock}))
	pages := strings.Split(text, "\f")
	require.GreaterOrEqual(t, len(pages), 13)
	assert.Contains(t, pages[0], "Contents")
	assert.Contains(t, pages[0], "posted legal limit")
	assert.Contains(t, pages[12], "Page 13 of 13")
	// The master list holds every meeting, in day and time order.
	list := pages[1]
	last := -1
	for _, id := range []string{"CS101", "CS102", "CH201", "CH202", "CH203", "CS103"} {
		i := strings.Index(list, id)
		require.GreaterOrEqual(t, i, 0, id)
		if id != "CH202" && id != "CH203" { // same Thursday rows as CH201
			assert.Greater(t, i, last, id)
			last = i
		}
	}
	assert.Contains(t, pages[2], "Zoë Ó Briain (S1)")
	assert.Contains(t, pages[7], "Room R101")
	assert.Contains(t, pages[11], "First year computing (C1)")
}

// TestPDFRenders renders every page with pdftoppm (poppler-utils) to catch
// files a real reader refuses; with -render DIR the PNGs are kept to look at.
func TestPDFRenders(t *testing.T) {
	tool, err := exec.LookPath("pdftoppm")
	if err != nil {
		t.Skip("pdftoppm not installed (apt-get install poppler-utils)")
	}
	term, s := demoTerm()
	busy, busyS := busyTerm()
	pat, patS := patternTerm()
	dir := *renderDir
	if dir == "" {
		dir = t.TempDir()
	}
	docs := map[string][]byte{
		"staff-S3":          writePDF(t, term, s, &Subject{timetable.WhoStaff, "S3"}, Options{Generated: fixedClock}),
		"cohort-C2":         writePDF(t, term, s, &Subject{timetable.WhoCohort, "C2"}, Options{Generated: fixedClock}),
		"combined-a4":       writePDF(t, term, s, nil, Options{Generated: fixedClock}),
		"room-R101-letter":  writePDF(t, term, s, &Subject{timetable.WhoRoom, "R101"}, Options{Generated: fixedClock, Paper: "Letter"}),
		"combined-unknown1": writePDF(t, term, &timetable.Schedule{}, nil, Options{Generated: fixedClock}),
		"busy-combined":     writePDF(t, busy, busyS, nil, Options{Generated: fixedClock}),
		"pattern-combined":  writePDF(t, pat, patS, nil, Options{Generated: fixedClock}),
		"pattern-staff-S6":  writePDF(t, pat, patS, &Subject{timetable.WhoStaff, "S6"}, Options{Generated: fixedClock, Paper: "Letter"}),
	}
	for name, pdf := range docs {
		path := filepath.Join(dir, name+".pdf")
		require.NoError(t, os.WriteFile(path, pdf, 0o644))
		out, err := exec.Command(tool, "-png", "-r", "60", path, filepath.Join(dir, name)).CombinedOutput()
		require.NoError(t, err, string(out))
		assert.Empty(t, strings.TrimSpace(string(out)), "pdftoppm complained about %s", name)
	}
}

func TestPDFTextFitting(t *testing.T) {
	term, s := demoTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	d, err := v.newPDF(Options{}, "x")
	require.NoError(t, err)
	d.f.AddPage()
	d.font("", 8)
	long := "Organic Chemistry Laboratory Techniques with a Very Long Title That Must Wrap Across Several Lines"
	for _, w := range []float64{5, 20, 40, 200} {
		for _, max := range []int{1, 2, 3, 10} {
			lines := d.wrap(long, w, max)
			assert.LessOrEqual(t, len(lines), max)
			for _, l := range lines {
				assert.LessOrEqual(t, d.f.GetStringWidth(l), w+0.01, "%q at width %v", l, w)
			}
			joined := strings.Join(lines, " ")
			if !strings.HasSuffix(joined, "…") {
				assert.Equal(t, strings.ReplaceAll(long, " ", ""), strings.ReplaceAll(joined, " ", ""), "nothing lost when not cut")
			}
		}
	}
	assert.Equal(t, []string{long}, d.wrap(long, 1000, 3))
	assert.Equal(t, "short", d.fit("short", 50))
	assert.True(t, strings.HasSuffix(d.fit(long, 30), "…"))
	assert.LessOrEqual(t, d.f.GetStringWidth(d.fit(long, 30)), 30.0)
}

func TestPrintable(t *testing.T) {
	// The Go fonts cover WGL4 (Latin, Greek, Cyrillic) but no emoji or CJK.
	assert.Equal(t, "Zoë Łódź Straße Ελένη Дмитрий", printable("Zoë Łódź Straße Ελένη Дмитрий"))
	assert.Equal(t, "a ? b ?", printable("a 😀 b 漢"))
	assert.Equal(t, "tab here", printable("tab\there"))
	// Yoruba letters with a dot below (U+1ECD, U+1EB9) are not in WGL4: the
	// dot goes, the tone marks the font has stay (Unicode canonical decomposition).
	assert.Equal(t, "Bámìdélé Ògúnlóyè", printable("Bámìdélé Ògúnlọ́yẹ̀"))
	assert.Equal(t, "o", printable("ọ"))
}

// TestPDFWrapList: staff names wrap between names (a name is split only
// when it is wider than a line), no line is wider than the block, and
// nothing is lost unless the last line ends in "…".
func TestPDFWrapList(t *testing.T) {
	term, s := demoTerm()
	v, err := newView(term, s)
	require.NoError(t, err)
	d, err := v.newPDF(Options{}, "x")
	require.NoError(t, err)
	d.f.AddPage()
	d.font("", 7)
	names := []string{"Zoë Ó Briain", "Łukasz Wróbel", "Grete Strauß-Hohenberg von Allmendingen", "Ελένη Παπαδοπούλου"}
	for _, w := range []float64{12, 25, 40, 60, 400} {
		for _, max := range []int{1, 2, 3, 8} {
			lines := d.wrapList(names, w, max)
			require.NotEmpty(t, lines)
			assert.LessOrEqual(t, len(lines), max, "width %v", w)
			for _, l := range lines {
				assert.LessOrEqual(t, d.f.GetStringWidth(l), w+0.01, "%q at width %v", l, w)
			}
			joined := strings.Join(lines, " ")
			if strings.HasSuffix(joined, "…") {
				continue
			}
			assert.Equal(t, strings.Join(names, ", "), joined, "nothing lost at width %v, %d lines", w, max)
			if w >= 60 { // every name fits a line: none is split
				for _, l := range lines {
					for _, part := range strings.Split(strings.TrimSuffix(l, ","), ", ") {
						assert.Contains(t, names, part)
					}
				}
			}
		}
	}
}

// squash collapses runs of white space (pdftotext breaks lines where the
// PDF does) to one space.
func squash(s string) string { return strings.Join(strings.Fields(s), " ") }

// TestPDFBusyTermText reads back the combined PDF of a term with a break
// week, unavailable times and sections in odd and even weeks sharing one
// period: the cover and headers list the days without teaching as ranges
// and count only weeks with teaching; the room page labels its unavailable
// times; the stacked odd/even blocks keep their titles and staff names, and
// staff names are not cut where there is room.
func TestPDFBusyTermText(t *testing.T) {
	term, s := busyTerm()
	assert.Empty(t, timetable.HardViolations(timetable.Check(term, s)), "the fixture is a valid timetable")
	text := pdfText(t, writePDF(t, term, s, nil, Options{Generated: fixedClock}))
	pages := strings.Split(text, "\f")
	require.GreaterOrEqual(t, len(pages), 13)
	cover := squash(pages[0])
	// 25-29 Oct (Mon-Fri) and Mon 1 Nov are joined over the weekend; 8 Dec stands alone.
	assert.Contains(t, cover, "25 Oct – 1 Nov, 8 Dec")
	// 13 Sep to 10 Dec 2027 spans 13 Monday-to-Sunday weeks; 25-31 Oct has no teaching day.
	assert.Contains(t, cover, "12 (weeks 1–13, 1 without teaching)")
	for i, p := range pages[1:13] {
		p = squash(p)
		assert.Contains(t, p, "12 teaching weeks", "page %d", i+2)
		assert.Contains(t, p, "No teaching: 25 Oct – 1 Nov, 8 Dec", "page %d", i+2)
	}
	room := squash(pages[7])
	require.Contains(t, room, "Room R101")
	assert.Contains(t, room, "Unavailable: Maintenance")
	assert.Contains(t, room, "Preferably free: Open day")
	staff := squash(pages[2])
	require.Contains(t, staff, "Zoë Ó Briain (S1)")
	assert.Contains(t, staff, "Unavailable: Research")
	c2 := squash(pages[12])
	require.Contains(t, c2, "Second year chemistry (C2)")
	for _, want := range []string{"CH210", "odd weeks", "Organic Synthesis Workshop", "Ελένη Παπαδοπούλου, Grete Strauß",
		"CH211", "even weeks", "Spectroscopy Problem Class", "Дмитрий Соколов"} {
		assert.Contains(t, c2, want)
	}
	c1 := squash(pages[11])
	require.Contains(t, c1, "First year computing (C1)")
	assert.Contains(t, c1, "Zoë Ó Briain, Łukasz Wróbel, Grete Strauß")
	assert.NotContains(t, c1, "…")
}
