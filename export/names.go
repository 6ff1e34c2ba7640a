package export

import (
	"strconv"
	"strings"
	"unicode"
	"unicode/utf16"
	"unicode/utf8"

	"golang.org/x/text/unicode/norm"
)

// maxFileStem is the longest file stem (in bytes) SafeFileNames produces;
// every common file system allows 255 bytes per name.
const maxFileStem = 80

// SafeFileNames turns IDs into file stems that are safe on Windows, macOS
// and Linux and returns them parallel to ids. A stem keeps letters, digits,
// combining marks, '-', '_' and '.' (NFC-normalised); anything else becomes
// '_'. It never starts with '.', so "../x" cannot climb out of its folder,
// never ends with '.' or ' ', is never a Windows device name (CON, PRN, AUX,
// NUL, COM0-9, LPT0-9, also with an extension), is at most 80 bytes, and is
// unique ignoring case (so it survives case-insensitive file systems): a
// clash gets a "~2", "~3", ... suffix. IDs that are already safe keep their
// exact spelling; the result depends only on ids and their order.
func SafeFileNames(ids []string) []string {
	out := make([]string, len(ids))
	base := make([]string, len(ids))
	taken := map[string]bool{}
	for i, id := range ids {
		base[i] = safeStem(id)
		if base[i] == id && !taken[foldKey(id)] {
			out[i] = id
			taken[foldKey(id)] = true
		}
	}
	for i := range ids {
		if out[i] != "" {
			continue
		}
		out[i] = uniqueName(base[i], taken, func(s string, n int) string { return cutBytes(s, n) }, maxFileStem)
	}
	return out
}

// uniqueName returns name, or name shortened by cut to fit limit with a
// "~k" suffix, whichever is first free in taken; it marks the result taken.
func uniqueName(name string, taken map[string]bool, cut func(string, int) string, limit int) string {
	if !taken[foldKey(name)] {
		taken[foldKey(name)] = true
		return name
	}
	for k := 2; ; k++ {
		suffix := "~" + strconv.Itoa(k)
		cand := cut(name, limit-len(suffix)) + suffix
		if !taken[foldKey(cand)] {
			taken[foldKey(cand)] = true
			return cand
		}
	}
}

// foldKey is the case-insensitive identity of a name.
func foldKey(s string) string { return strings.ToLower(norm.NFC.String(s)) }

// safeStem maps one ID to a safe stem (not yet unique).
func safeStem(id string) string {
	var b strings.Builder
	for _, r := range norm.NFC.String(id) {
		switch {
		case unicode.IsLetter(r) || unicode.IsDigit(r) || unicode.IsMark(r) || r == '-' || r == '.':
			b.WriteRune(r)
		default:
			if s := b.String(); !strings.HasSuffix(s, "_") {
				b.WriteByte('_')
			}
		}
	}
	s := strings.TrimLeft(b.String(), "._")
	s = cutBytes(s, maxFileStem)
	s = strings.TrimRight(s, ". ")
	if s == "" || s == "_" {
		s = "unnamed"
	}
	if windowsReserved(s) {
		stem, ext, _ := strings.Cut(s, ".")
		s = stem + "_"
		if ext != "" {
			s += "." + ext
		}
	}
	return s
}

// windowsReserved reports whether a file name is a Windows device name,
// ignoring case and extension (Microsoft, "Naming Files, Paths, and
// Namespaces": CON, PRN, AUX, NUL, COM0-9, COM¹²³, LPT0-9, LPT¹²³).
func windowsReserved(name string) bool {
	stem, _, _ := strings.Cut(name, ".")
	stem = strings.ToUpper(stem)
	switch stem {
	case "CON", "PRN", "AUX", "NUL":
		return true
	}
	if len(stem) > 3 && (strings.HasPrefix(stem, "COM") || strings.HasPrefix(stem, "LPT")) {
		switch stem[3:] {
		case "0", "1", "2", "3", "4", "5", "6", "7", "8", "9", "¹", "²", "³":
			return true
		}
	}
	return false
}

// cutBytes shortens s to at most n bytes without splitting a UTF-8 sequence.
func cutBytes(s string, n int) string {
	if len(s) <= n {
		return s
	}
	for n > 0 && !utf8.RuneStart(s[n]) {
		n--
	}
	return s[:n]
}

// Excel's limits on sheet names ("Microsoft Excel specifications and
// limits"; the rename-sheet rules): at most 31 characters (counted, as Excel
// does, in UTF-16 code units), none of these characters, not blank, not
// starting or ending with an apostrophe, and "History" is reserved.
const (
	maxSheetName   = 31
	sheetForbidden = `[]:*?/\`
)

// SheetNames turns wanted sheet names into names Excel accepts and returns
// them parallel to wanted: forbidden characters become '_', control
// characters and leading/trailing apostrophes and spaces are dropped, a
// blank name becomes "Sheet", long names are cut to 31 UTF-16 code units,
// and names that clash ignoring case with an earlier name, with reserved or
// with "History" get a "~2", "~3", ... suffix (cut further to stay within
// 31). The result depends only on the arguments.
func SheetNames(wanted []string, reserved ...string) []string {
	taken := map[string]bool{foldKey("History"): true}
	for _, r := range reserved {
		taken[foldKey(r)] = true
	}
	out := make([]string, len(wanted))
	for i, w := range wanted {
		out[i] = uniqueName(cleanSheetName(w), taken, cutSheetName, maxSheetName)
	}
	return out
}

// cleanSheetName applies every rule but uniqueness.
func cleanSheetName(s string) string {
	var b strings.Builder
	for _, r := range s {
		switch {
		case strings.ContainsRune(sheetForbidden, r):
			b.WriteByte('_')
		case unicode.IsControl(r) || r == utf8.RuneError:
		default:
			b.WriteRune(r)
		}
	}
	name := cutSheetName(strings.TrimSpace(b.String()), maxSheetName)
	if name == "" {
		name = "Sheet"
	}
	return name
}

// cutSheetName shortens s to at most n UTF-16 code units (never splitting a
// surrogate pair) and drops apostrophes and spaces left at either end.
func cutSheetName(s string, n int) string {
	units := 0
	end := len(s)
	for i, r := range s {
		units += len(utf16.Encode([]rune{r}))
		if units > n {
			end = i
			break
		}
	}
	return strings.Trim(s[:end], "' ")
}
