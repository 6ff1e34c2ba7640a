package export

import (
	"strings"
	"testing"
	"unicode/utf16"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestSafeFileNames(t *testing.T) {
	tests := []struct {
		name string
		ids  []string
		want []string
	}{
		{"plain IDs stay", []string{"S001", "R-204", "cs1.a"}, []string{"S001", "R-204", "cs1.a"}},
		{"path traversal", []string{"../x", "..", "a/b", `a\b`, "/etc/passwd"}, []string{"x", "unnamed", "a_b", "a_b~2", "etc_passwd"}},
		// Microsoft, "Naming Files, Paths, and Namespaces": reserved device names, also with an extension.
		{"windows devices", []string{"CON", "con.txt", "Lpt1", "COM¹", "COM10", "AUX_1"}, []string{"CON_", "con_.txt", "Lpt1_", "COM_", "COM10", "AUX_1"}},
		// Microsoft, same page: names must not end in a space or a period; '<>:"/\|?*' are reserved.
		{"trailing dots and reserved chars", []string{"a.", "b ", `x<>:"|?*y`}, []string{"a", "b_", "x_y"}},
		{"case-insensitive clash", []string{"ab", "AB", "Ab"}, []string{"ab", "AB~2", "Ab~3"}},
		{"exact IDs win their spelling", []string{"a b", "a_b"}, []string{"a_b~2", "a_b"}},
		{"unicode kept", []string{"Łódź", "Ελένη", "Жуков"}, []string{"Łódź", "Ελένη", "Жуков"}},
		{"empty", []string{"", "   "}, []string{"unnamed", "unnamed~2"}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := SafeFileNames(tc.ids)
			assert.Equal(t, tc.want, got)
			assert.Equal(t, got, SafeFileNames(tc.ids), "deterministic")
		})
	}
}

func TestSafeFileNamesLong(t *testing.T) {
	long := strings.Repeat("é", 100)
	got := SafeFileNames([]string{long, long + "x"})
	for _, g := range got {
		assert.LessOrEqual(t, len(g), maxFileStem)
		assert.True(t, utf8Valid(g))
	}
	assert.NotEqual(t, strings.ToLower(got[0]), strings.ToLower(got[1]))
}

func utf8Valid(s string) bool { return strings.ToValidUTF8(s, "\uFFFD") == s }

// checkSheetName applies Excel's documented limits ("Microsoft Excel
// specifications and limits" and Excel's rename-sheet rules): at most 31
// characters, none of []:*?/\, not blank, no apostrophe first or last.
func checkSheetName(t *testing.T, name string) {
	t.Helper()
	assert.NotEmpty(t, name)
	assert.LessOrEqual(t, len(utf16.Encode([]rune(name))), 31, name)
	assert.False(t, strings.ContainsAny(name, `[]:*?/\`), name)
	assert.False(t, strings.HasPrefix(name, "'") || strings.HasSuffix(name, "'"), name)
}

func TestSheetNames(t *testing.T) {
	tests := []struct {
		name     string
		wanted   []string
		reserved []string
		want     []string
	}{
		{"plain", []string{"Room R204", "Ada Byrne"}, nil, []string{"Room R204", "Ada Byrne"}},
		{"forbidden characters", []string{"A/B: [x]*?\\"}, nil, []string{"A_B_ _x____"}},
		{"apostrophes", []string{"'quoted'", "O'Brien"}, nil, []string{"quoted", "O'Brien"}},
		{"reserved", []string{"Timetable", "load", "history"}, []string{"Timetable", "Load"}, []string{"Timetable~2", "load~2", "history~2"}},
		{"case clash", []string{"Room a", "ROOM A"}, nil, []string{"Room a", "ROOM A~2"}},
		{"long", []string{strings.Repeat("x", 40), strings.Repeat("x", 35)}, nil,
			[]string{strings.Repeat("x", 31), strings.Repeat("x", 29) + "~2"}},
		{"blank", []string{"", "''"}, nil, []string{"Sheet", "Sheet~2"}},
		{"surrogates not split", []string{strings.Repeat("a", 30) + "😀"}, nil, []string{strings.Repeat("a", 30)}},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			got := SheetNames(tc.wanted, tc.reserved...)
			require.Equal(t, tc.want, got)
			seen := map[string]bool{}
			for _, r := range tc.reserved {
				seen[strings.ToLower(r)] = true
			}
			for _, g := range got {
				checkSheetName(t, g)
				assert.False(t, seen[strings.ToLower(g)], "unique ignoring case: %q", g)
				seen[strings.ToLower(g)] = true
			}
		})
	}
}

func FuzzSheetNames(f *testing.F) {
	for _, s := range []string{"", "'", "Timetable", "a/b", strings.Repeat("ä", 40), "😀😀", "'x'"} {
		f.Add(s, s+"x")
	}
	f.Fuzz(func(t *testing.T, a, b string) {
		got := SheetNames([]string{a, b, a}, "Timetable", "Load")
		seen := map[string]bool{"timetable": true, "load": true, "history": true}
		for _, g := range got {
			checkSheetName(t, g)
			if seen[foldKey(g)] {
				t.Fatalf("duplicate %q in %q", g, got)
			}
			seen[foldKey(g)] = true
		}
	})
}

func FuzzSafeFileNames(f *testing.F) {
	for _, s := range []string{"", "..", "../x", "CON", "a.", "Łódź", strings.Repeat("é", 90)} {
		f.Add(s, strings.ToUpper(s))
	}
	f.Fuzz(func(t *testing.T, a, b string) {
		got := SafeFileNames([]string{a, b, a})
		seen := map[string]bool{}
		for _, g := range got {
			if g == "" || strings.HasPrefix(g, ".") || strings.ContainsAny(g, `/\:*?"<>|`) || windowsReserved(g) || len(g) > maxFileStem || !utf8Valid(g) {
				t.Fatalf("unsafe name %q from %q", g, []string{a, b})
			}
			if strings.HasSuffix(g, ".") || strings.HasSuffix(g, " ") {
				t.Fatalf("bad ending %q", g)
			}
			if seen[foldKey(g)] {
				t.Fatalf("duplicate %q in %q", g, got)
			}
			seen[foldKey(g)] = true
		}
	})
}
