package timetable

// CSV formula injection (OWASP, "CSV Injection"): a spreadsheet program
// that opens a CSV file takes a cell beginning with = + - @ tab or carriage
// return as a formula, so a section titled =HYPERLINK(...) would run when a
// registrar opens the file. Every CSV termwright writes passes its cells
// through SafeCSVCell, which puts a single quote in front of such a cell
// (the quote makes the spreadsheet read the rest as text); the CSV readers
// of this package take it off again with unguardCSVCell, so what was
// written reads back unchanged.

// csvTrigger reports whether c starts a formula in a spreadsheet program
// (OWASP "CSV Injection": = + - @ tab carriage return).
func csvTrigger(c byte) bool {
	switch c {
	case '=', '+', '-', '@', '\t', '\r':
		return true
	}
	return false
}

// csvGuarded reports whether s is one or more single quotes followed by a
// formula trigger, such as '=x: the form SafeCSVCell writes for a
// dangerous cell.
func csvGuarded(s string) bool {
	i := 0
	for i < len(s) && s[i] == '\'' {
		i++
	}
	return i > 0 && i < len(s) && csvTrigger(s[i])
}

// csvPlainNumber reports whether s is a plain decimal number with an
// optional sign ("-5", "+2", "-0.5"): spreadsheets read it as that number,
// not as a formula, so it needs no guard.
func csvPlainNumber(s string) bool {
	i := 0
	if i < len(s) && (s[i] == '-' || s[i] == '+') {
		i++
	}
	digits, dot := 0, false
	for ; i < len(s); i++ {
		switch c := s[i]; {
		case c >= '0' && c <= '9':
			digits++
		case c == '.' && !dot && digits > 0:
			dot = true
		default:
			return false
		}
	}
	return digits > 0 && s[len(s)-1] != '.'
}

// SafeCSVCell returns s as it must be written into a CSV cell so that a
// spreadsheet program shows it as text: a cell beginning with = + - @ tab
// or carriage return gets a single quote in front (OWASP "CSV Injection"),
// except a plain number such as -5; a cell that already looks guarded
// ("'=x") gets one more quote, so that reading it back (which removes one
// quote from such cells) gives s exactly.
func SafeCSVCell(s string) string {
	if s == "" || csvPlainNumber(s) {
		return s
	}
	if csvTrigger(s[0]) || csvGuarded(s) {
		return "'" + s
	}
	return s
}

// unguardCSVCell undoes SafeCSVCell: one leading quote goes from a cell
// made of quotes followed by a formula trigger. Every other cell is
// returned as it is.
func unguardCSVCell(s string) string {
	if csvGuarded(s) {
		return s[1:]
	}
	return s
}

// unguardCSVRecord applies unguardCSVCell to every cell of rec in place.
func unguardCSVRecord(rec []string) {
	for i, c := range rec {
		rec[i] = unguardCSVCell(c)
	}
}
