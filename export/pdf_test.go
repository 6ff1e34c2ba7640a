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
