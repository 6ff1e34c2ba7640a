package timetable

import (
	"strconv"
	"strings"
	"testing"
	"unicode/utf8"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestQuote(t *testing.T) {
	long := strings.Repeat("é", 10_000_000)
	for _, tc := range []struct{ in, want string }{
		{"R204", `"R204"`},
		{"tab\there", `"tab\there"`},
		{strings.Repeat("a", 60), strconv.Quote(strings.Repeat("a", 60))},
		{strings.Repeat("a", 61), `"` + strings.Repeat("a", 40) + `…" (61 characters)`},
		{long, `"` + strings.Repeat("é", 40) + `…" (10,000,000 characters)`},
	} {
		assert.Equal(t, tc.want, Quote(tc.in))
	}
}

// TestLongCells plants over-long cells (a 10 MB staff ID, a title above
// the 32,767 characters a spreadsheet cell holds, a long header) and checks
// one error at the cell, with every message of the run short.
func TestLongCells(t *testing.T) {
	huge := strings.Repeat("S", 10<<20)
	for _, tc := range []struct {
		name  string
		edits []cellEdit
		at    string
		msg   string
	}{
		{"10 MB staff ID", []cellEdit{e("Staff", "A2", huge)}, "Staff!A2", `the cell holds "SSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSSS…" (10,485,760 characters), more than the 1,000 characters a cell of this column may hold`},
		{"ID one over", []cellEdit{e("Rooms", "A3", strings.Repeat("r", MaxCellChars+1))}, "Rooms!A3", "more than the 1,000 characters"},
		{"ID at the limit is read", []cellEdit{e("Cohorts", "B2", strings.Repeat("n", MaxCellChars))}, "", ""},
		{"title over a spreadsheet cell", []cellEdit{e("Sections", "B2", strings.Repeat("t", MaxTextChars+1))}, "Sections!B2", "more than the 32,767 characters"},
		{"long unknown name is quoted short", []cellEdit{e("Unavailable", "A2", strings.Repeat("x", 900))}, "Unavailable!A2", `"` + strings.Repeat("x", 40) + `…" (900 characters) is not a staff ID, room, cohort or section`},
		{"long header", []cellEdit{e("Rooms", "E1", strings.Repeat("h", MaxCellChars+1))}, "Rooms!E1", "the header holds 1,001 characters"},
	} {
		t.Run(tc.name, func(t *testing.T) {
			sheets := applyEdits(t, goodSheets(), tc.edits...)
			forms := []string{"xlsx", "csv"}
			for _, ed := range tc.edits {
				if len(ed.value) > MaxTextChars {
					forms = forms[1:] // the workbook writer used to build the fixture stops at 32,767; see TestLongCellInWorkbook
				}
			}
			for _, form := range forms {
				var ps Problems
				if form == "xlsx" {
					_, ps = readSheets(t, sheets)
				} else {
					var err error
					_, ps, err = ReadCSVDir(csvDir(t, sheets))
					require.NoError(t, err)
				}
				for _, p := range ps {
					assert.Less(t, utf8.RuneCountInString(p.String()), 400, "%s: message too long", form)
				}
				if tc.at == "" {
					assert.Empty(t, ps.Errors(), "%s", form)
					continue
				}
				var at []Problem
				for _, p := range ps {
					if p.Pos.String() == tc.at {
						at = append(at, p)
					}
				}
				require.Len(t, at, 1, "%s: %s", form, ps)
				assert.Contains(t, at[0].Msg, tc.msg, form)
			}
		})
	}
}

// TestLongCellInWorkbook writes a 10 MB staff ID straight into the Staff
// sheet's XML of the demo workbook and expects one short error at its cell.
func TestLongCellInWorkbook(t *testing.T) {
	book := demoBook(t)
	huge := strings.Repeat("S", 10<<20)
	bad := rewritePart(t, book, demoPart(t, book, "Staff"), func(b []byte) []byte {
		i := strings.Index(string(b), `<c r="A2" t="inlineStr"><is><t>`)
		require.GreaterOrEqual(t, i, 0)
		i += len(`<c r="A2" t="inlineStr"><is><t>`)
		j := i + strings.Index(string(b[i:]), "</t>")
		return append(append(append([]byte{}, b[:i]...), huge...), b[j:]...)
	})
	_, ps, err := ReadWorkbook(strings.NewReader(string(bad)), "demo.xlsx")
	require.NoError(t, err)
	var at Problems
	for _, p := range ps {
		assert.Less(t, len(p.String()), 400)
		if p.Pos.String() == "Staff!A2" {
			at = append(at, p)
		}
	}
	require.Len(t, at, 1, "%s", ps)
	assert.Contains(t, at[0].Msg, "(10,485,760 characters), more than the 1,000 characters")
}
