package timetable

import (
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
	if len(s) <= 60 || utf8.RuneCountInString(s) <= 60 {
		return strconv.Quote(s)
	}
	i, n := 0, 0
	for i < len(s) && n < quoteKeep {
		_, w := utf8.DecodeRuneInString(s[i:])
		i += w
		n++
	}
	return strconv.Quote(s[:i]+"…") + " (" + groupThousands(utf8.RuneCountInString(s)) + " characters)"
}

// groupThousands writes n with commas between groups of three digits.
func groupThousands(n int) string {
	s := strconv.Itoa(n)
	for i := len(s) - 3; i > 0 && s[i-1] != '-'; i -= 3 {
		s = s[:i] + "," + s[i:]
	}
	return s
}
