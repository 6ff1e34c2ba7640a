package export

import (
	"strings"
	"sync"
	"unicode"

	"golang.org/x/image/font/gofont/gobold"
	"golang.org/x/image/font/gofont/goregular"
	"golang.org/x/image/font/sfnt"
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

// printable returns s with every character the embedded font cannot draw
// replaced by '?' (and control characters by spaces), so that nothing is
// silently dropped and the PDF library never sees a rune outside its tables.
func printable(s string) string {
	glyphs.once.Do(loadGlyphs)
	ok := true
	for _, r := range s {
		if r >= 0x10000 || !glyphs.has[r] {
			ok = false
			break
		}
	}
	if ok {
		return s
	}
	return strings.Map(func(r rune) rune {
		switch {
		case r < 0x10000 && glyphs.has[r]:
			return r
		case unicode.IsSpace(r) || unicode.IsControl(r):
			return ' '
		}
		return '?'
	}, s)
}

// fontBytes are the TrueType files embedded for the regular and bold style.
var fontBytes = map[string][]byte{"": goregular.TTF, "B": gobold.TTF}
