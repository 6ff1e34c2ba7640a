package timetable

import (
	"fmt"
	"io"
	"strconv"
	"unicode/utf8"
)

// quoteKeep is how many characters of a long value Quote keeps.
const quoteKeep = 40

// Quote quotes a value for a message as %q does, shortened when it is long:
// a value of more than 60 characters keeps its first 40, followed by "…"
// and its length, so that a huge cell never makes a huge message. Every
// message that echoes a value from a file uses it.
func Quote(s string) string {
	short, n := shorten(s)
	if short == s {
		return strconv.Quote(s)
	}
	return strconv.Quote(short) + " (" + groupThousands(n) + " characters)"
}

// shorten returns s, or when it has more than 60 characters its first 40
// followed by "…"; n is the number of characters of s.
func shorten(s string) (short string, n int) {
	if len(s) <= 60 {
		return s, len(s)
	}
	if n = utf8.RuneCountInString(s); n <= 60 {
		return s, n
	}
	i := 0
	for k := 0; k < quoteKeep; k++ {
		_, w := utf8.DecodeRuneInString(s[i:])
		i += w
	}
	return s[:i] + "…", n
}

// groupThousands writes n with commas between groups of three digits.
func groupThousands(n int) string {
	s := strconv.Itoa(n)
	for i := len(s) - 3; i > 0 && s[i-1] != '-'; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}

// quotedArg is a message argument that prints through Quote under %q and
// as itself under every other verb.
type quotedArg string

// Format implements fmt.Formatter.
func (a quotedArg) Format(f fmt.State, verb rune) {
	if verb == 'q' && !f.Flag('#') && !f.Flag('+') {
		io.WriteString(f, Quote(string(a)))
		return
	}
	fmt.Fprintf(f, fmt.FormatString(f, verb), string(a))
}

// shortArgs makes every string argument of a message print through Quote
// under %q, so that no problem message echoes a long value whole.
func shortArgs(args []any) []any {
	for i, a := range args {
		if s, ok := a.(string); ok && len(s) > 60 {
			args[i] = quotedArg(s)
		}
	}
	return args
}
