package export

import (
	"strings"
	"sync"
	"unicode"

	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
	"golang.org/x/text/unicode/norm"
)

// pdfFamily is the font family name registered in every PDF: the Go fonts
// (golang.org/x/image/font/gofont, BSD-style licence), which cover the WGL4
// repertoire: Latin with its accents, Greek and Cyrillic among others.
const pdfFamily = "go"

// glyphs records which BMP runes the regular Go font can draw.
var glyphs struct {
	once sync.Once
	has  []bool // indexed by rune, len 0x10000
}

func loadGlyphs() {
	glyphs.has = make([]bool, 0x10000)
	f, err := sfnt.Parse(goregular.TTF)
	if err != nil {
		return // leaves has all false: every letter becomes '?', visibly
	}
	var buf sfnt.Buffer
	for r := rune(0x20); r < 0x10000; r++ {
		if gi, err := f.GlyphIndex(&buf, r); err == nil && gi != 0 {
			glyphs.has[r] = true
		}
	}
}

// printable returns s as the embedded font can draw it: a letter the font
// lacks is decomposed (NFD) and rebuilt from the parts the font has, so
// that "ọ́" prints as "ó" rather than vanishing; what still cannot be drawn
// becomes '?', and control characters become spaces. Nothing is silently
// dropped, and the PDF library never sees a rune outside its tables.
func printable(s string) string {
	glyphs.once.Do(loadGlyphs)
	ok := true
	for _, r := range s {
		if !hasGlyph(r) {
			ok = false
			break
		}
	}
	if ok {
		return s
	}
	var b strings.Builder
	rs := []rune(norm.NFD.String(s))
	for i := 0; i < len(rs); {
		j := i + 1 // rs[i:j] is one letter with its combining marks
		for j < len(rs) && unicode.Is(unicode.Mn, rs[j]) {
			j++
		}
		b.WriteString(approximate(rs[i:j]))
		i = j
	}
	return b.String()
}

func hasGlyph(r rune) bool { return r < 0x10000 && glyphs.has[r] }

// approximate draws one decomposed letter (a base and its combining marks)
// with what the font has: the marks that compose with the base into a
// letter of the font are kept, the others dropped; a base the font lacks
// becomes '?', a space or control character a space.
func approximate(cluster []rune) string {
	base := cluster[0]
	switch {
	case unicode.IsSpace(base) || unicode.IsControl(base):
		return " "
	case !hasGlyph(base):
		return "?"
	}
	kept := []rune{base}
	for _, mark := range cluster[1:] {
		c := []rune(norm.NFC.String(string(append(append([]rune{}, kept...), mark))))
		if len(c) == 1 && hasGlyph(c[0]) {
			kept = c
		}
	}
	return string(kept)
}

// fontBytes are the TrueType files embedded for the regular and bold style.
var fontBytes = map[string][]byte{"": goregular.TTF, "B": gobold.TTF}
