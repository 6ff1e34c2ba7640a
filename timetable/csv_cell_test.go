package timetable

import (
	"testing"

	"github.com/stretchr/testify/assert"
)

// TestSafeCSVCell checks the guard against the trigger characters of
// OWASP's "CSV Injection" guidance: = + - @ tab (0x09) and carriage return
// (0x0D) at the start of a cell.
func TestSafeCSVCell(t *testing.T) {
	for _, c := range []struct{ in, want string }{
		{"", ""},
		{"Organic Chemistry", "Organic Chemistry"},
		{`=HYPERLINK("http://evil.example","x")`, `'=HYPERLINK("http://evil.example","x")`}, // OWASP
		{"@SUM(A1)", "'@SUM(A1)"},                                                           // OWASP
		{"+1+2", "'+1+2"},
		{"-2+3", "'-2+3"}, // a spreadsheet evaluates this: not a plain number
		{"\tx", "'\tx"},
		{"\rx", "'\rx"},
		{"-", "'-"},
		{"-5", "-5"}, // a plain number is read as that number, not a formula
		{"+7", "+7"},
		{"-0.25", "-0.25"},
		{"-5.", "'-5."},
		{"5", "5"},
		{"a=b", "a=b"},  // only the first character matters
		{"'=x", "''=x"}, // looks guarded already: one more quote, so it reads back
		{"''@x", "'''@x"},
		{"'quoted'", "'quoted'"},
		{"'", "'"},
	} {
		assert.Equal(t, c.want, SafeCSVCell(c.in), "%q", c.in)
		assert.Equal(t, c.in, unguardCSVCell(SafeCSVCell(c.in)), "round trip of %q", c.in)
	}
}

// FuzzSafeCSVCell: reading back what SafeCSVCell wrote gives the cell
// exactly, and a guarded cell never starts with a formula trigger unless
// it is a plain number (OWASP "CSV Injection").
func FuzzSafeCSVCell(f *testing.F) {
	for _, s := range []string{"", "=1+2", "@x", "'=x", "-5", "-", "'", "\t", "x"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		g := SafeCSVCell(s)
		if g != "" && csvTrigger(g[0]) && !csvPlainNumber(g) {
			t.Fatalf("SafeCSVCell(%q) = %q starts a formula", s, g)
		}
		if back := unguardCSVCell(g); back != s {
			t.Fatalf("SafeCSVCell(%q) = %q reads back as %q", s, g, back)
		}
	})
}
