package export

import (
	"bufio"
	"io"
	"strings"
	"unicode/utf8"
)

// icsLineLimit is the longest content line in octets, CRLF excluded
// (RFC 5545 §3.1).
const icsLineLimit = 75

// icsWriter writes iCalendar content lines: CRLF line ends, lines longer
// than 75 octets folded (CRLF followed by one space) between, never inside,
// UTF-8 sequences (RFC 5545 §3.1). The first write error sticks.
type icsWriter struct {
	w   *bufio.Writer
	err error
}

func newICSWriter(w io.Writer) *icsWriter { return &icsWriter{w: bufio.NewWriter(w)} }

// line writes one unfolded content line (name, parameters, ':' and value).
func (w *icsWriter) line(s string) {
	if w.err != nil {
		return
	}
	limit := icsLineLimit
	for len(s) > limit {
		cut := limit
		for cut > 0 && !utf8.RuneStart(s[cut]) {
			cut--
		}
		w.w.WriteString(s[:cut])
		w.w.WriteString("\r\n ")
		s = s[cut:]
		limit = icsLineLimit - 1 // the leading space counts
	}
	w.w.WriteString(s)
	_, w.err = w.w.WriteString("\r\n")
}

// prop writes "NAME:value" with value escaped as TEXT.
func (w *icsWriter) prop(name, value string) { w.line(name + ":" + icsText(value)) }

func (w *icsWriter) flush() error {
	if w.err != nil {
		return w.err
	}
	return w.w.Flush()
}

// icsText escapes a TEXT value (RFC 5545 §3.3.11): backslash, semicolon and
// comma get a backslash, a line break becomes \n; other control characters
// (which TEXT does not allow) are dropped, and invalid UTF-8 is replaced.
func icsText(s string) string {
	s = strings.ToValidUTF8(s, "\uFFFD")
	var b strings.Builder
	b.Grow(len(s) + 8)
	for i := 0; i < len(s); i++ {
		c := s[i]
		switch {
		case c == '\\' || c == ';' || c == ',':
			b.WriteByte('\\')
			b.WriteByte(c)
		case c == '\r':
			if i+1 < len(s) && s[i+1] == '\n' {
				continue
			}
			b.WriteString(`\n`)
		case c == '\n':
			b.WriteString(`\n`)
		case c == '\t':
			b.WriteByte(c)
		case c < 0x20 || c == 0x7f:
		default:
			b.WriteByte(c)
		}
	}
	return b.String()
}

// icsParam makes a parameter value safe (RFC 5545 §3.2): values holding
// ':', ';' or ',' are quoted; DQUOTE and control characters are dropped.
func icsParam(s string) string {
	s = strings.Map(func(r rune) rune {
		if r == '"' || r < 0x20 || r == 0x7f {
			return -1
		}
		return r
	}, s)
	if strings.ContainsAny(s, ":;,") {
		return `"` + s + `"`
	}
	return s
}
