package solver

import (
	"strings"
	"unicode/utf8"
)

// tokKind classifies the tokens of the text form.
type tokKind uint8

const (
	tEOF       tokKind = iota
	tIdent             // constant or function name: p, start, _a17, busy'
	tVar               // a variable (upper case or "_" start): not allowed in ground programs
	tNum               // unsigned decimal integer
	tString            // "quoted", text kept with its quotes and escapes
	tNot               // the keyword "not"
	tDirective         // #show, #atoms (text includes the '#')
	tPunct             // :- :~ . , ; { } ( ) [ ] @ - = < <= > >= !=
	tBad               // a character or construct that cannot start a token
)

// token is one lexeme with the 1-based line and column (in characters) of
// its first character.
type token struct {
	kind      tokKind
	text      string
	line, col int
}

// scanner splits text into tokens. Errors (unclosed strings or comments,
// stray characters) are reported through onError and scanning goes on.
type scanner struct {
	src       string
	off       int // byte offset of the next character
	line, col int // position of the next character
	onError   func(line, col int, msg string)
}

func newScanner(src string, onError func(line, col int, msg string)) *scanner {
	return &scanner{src: src, line: 1, col: 1, onError: onError}
}

// advance moves past n bytes of the current line (no newlines among them).
func (s *scanner) advance(n int) {
	s.col += utf8.RuneCountInString(s.src[s.off : s.off+n])
	s.off += n
}

// skipSpace skips blanks and comments: "% to end of line" and "%* block *%".
func (s *scanner) skipSpace() {
	for s.off < len(s.src) {
		c := s.src[s.off]
		switch {
		case c == '\n':
			s.off++
			s.line++
			s.col = 1
		case c == ' ' || c == '\t' || c == '\r' || c == '\f' || c == '\v':
			s.advance(1)
		case c == '%' && strings.HasPrefix(s.src[s.off:], "%*"):
			line, col := s.line, s.col
			end := strings.Index(s.src[s.off+2:], "*%")
			if end < 0 {
				s.onError(line, col, "block comment \"%*\" is not closed: add \"*%\" where it ends")
				s.skipText(len(s.src) - s.off)
				return
			}
			s.skipText(end + 4)
		case c == '%':
			end := strings.IndexByte(s.src[s.off:], '\n')
			if end < 0 {
				end = len(s.src) - s.off
			}
			s.advance(end)
		default:
			return
		}
	}
}

// skipText moves past n bytes that may contain newlines.
func (s *scanner) skipText(n int) {
	stop := s.off + n
	for s.off < stop {
		i := strings.IndexByte(s.src[s.off:stop], '\n')
		if i < 0 {
			s.advance(stop - s.off)
			return
		}
		s.advance(i)
		s.off++
		s.line++
		s.col = 1
	}
}

func isLower(c byte) bool  { return 'a' <= c && c <= 'z' }
func isUpper(c byte) bool  { return 'A' <= c && c <= 'Z' }
func isDigit(c byte) bool  { return '0' <= c && c <= '9' }
func isIdent(c byte) bool  { return isLower(c) || isUpper(c) || isDigit(c) || c == '_' || c == '\'' }
func isSymbol(c byte) bool { return strings.IndexByte(":.,;{}()[]@-=<>!", c) >= 0 }

// next returns the next token.
func (s *scanner) next() token {
	s.skipSpace()
	t := token{line: s.line, col: s.col}
	if s.off >= len(s.src) {
		return t
	}
	rest := s.src[s.off:]
	c := rest[0]
	n := 1
	switch {
	case isLower(c) || isUpper(c) || c == '_':
		for n < len(rest) && isIdent(rest[n]) {
			n++
		}
		word := rest[:n]
		u := strings.TrimLeft(word, "_")
		switch {
		case word == "not":
			t.kind = tNot
		case u == "" || isUpper(u[0]) || isDigit(u[0]) || u[0] == '\'':
			t.kind = tVar
		default:
			t.kind = tIdent
		}
	case isDigit(c):
		for n < len(rest) && isDigit(rest[n]) {
			n++
		}
		t.kind = tNum
	case c == '"':
		t.kind = tString
		for n < len(rest) && rest[n] != '"' && rest[n] != '\n' {
			if rest[n] == '\\' && n+1 < len(rest) && rest[n+1] != '\n' {
				n++
			}
			n++
		}
		if n >= len(rest) || rest[n] != '"' {
			s.onError(t.line, t.col, "string is not closed: add '\"' before the end of the line")
			t.kind = tBad
		} else {
			n++
		}
	case c == '#':
		for n < len(rest) && isIdent(rest[n]) {
			n++
		}
		t.kind = tDirective
	case isSymbol(c):
		t.kind = tPunct
		if len(rest) > 1 {
			switch rest[:2] {
			case ":-", ":~", "<=", ">=", "!=":
				n = 2
			}
		}
	default:
		_, n = utf8.DecodeRuneInString(rest)
		t.kind = tBad
	}
	t.text = rest[:n]
	s.advance(n)
	return t
}

// describe names a token for messages: `"."`, `end of input`, `name p`.
func (t token) describe() string {
	switch t.kind {
	case tEOF:
		return "end of input"
	case tIdent:
		return "name " + shortText(t.text)
	case tVar:
		return "variable " + shortText(t.text)
	case tNum:
		return "number " + shortText(t.text)
	case tString:
		return "string " + shortText(t.text)
	case tNot:
		return `"not"`
	case tDirective:
		return "directive " + shortText(t.text)
	}
	return `"` + t.text + `"`
}
