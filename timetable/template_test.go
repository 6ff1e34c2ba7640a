package timetable

import (
	"bytes"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/xuri/excelize/v2"
)

func TestWriteTemplate(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, WriteTemplate(&buf))
	f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
	require.NoError(t, err)
	defer f.Close()

	var names []string
	for _, s := range sheetSpecs {
		names = append(names, s.name)
	}
	assert.Equal(t, append(names, shLists), f.GetSheetList(), "every sheet, in layout order, then the hidden Lists sheet")
	visible, err := f.GetSheetVisible(shLists)
	require.NoError(t, err)
	assert.False(t, visible, "the Lists sheet is hidden")

	for _, spec := range sheetSpecs {
		t.Run(spec.name, func(t *testing.T) {
			rows, err := f.GetRows(spec.name)
			require.NoError(t, err)
			require.NotEmpty(t, rows)
			assert.Equal(t, spec.cols, rows[0], "headers in row 1")
			comments, err := f.GetComments(spec.name)
			require.NoError(t, err)
			require.Len(t, comments, len(spec.cols), "one note per column")
			for i, c := range comments {
				assert.Equal(t, colLetter(i)+"1", c.Cell)
				text := c.Text
				for _, p := range c.Paragraph {
					text += p.Text
				}
				assert.NotEmpty(t, strings.TrimSpace(text))
			}
		})
	}

	for _, d := range dropDowns {
		dvs, err := f.GetDataValidations(d.sheet)
		require.NoError(t, err)
		col := colLetter(indexOf(specFor(d.sheet).cols, d.col))
		found := false
		for _, dv := range dvs {
			if strings.HasPrefix(dv.Sqref, col+"2:") {
				found = true
				assert.Equal(t, "list", dv.Type)
				assert.Equal(t, d.values, listValues(t, f, dv.Formula1), "%s.%s offers exactly its values", d.sheet, d.col)
			}
		}
		assert.True(t, found, "drop-down for %s.%s", d.sheet, d.col)
	}
}

func indexOf(list []string, s string) int {
	for i, x := range list {
		if x == s {
			return i
		}
	}
	return -1
}

// TestTemplateReadsBack: the empty template is a workbook of the right
// shape; the only problems are the data it still lacks.
func TestTemplateReadsBack(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, WriteTemplate(&buf))
	term, ps, err := ReadWorkbook(&buf, "new.xlsx")
	require.NoError(t, err)
	assert.Equal(t, "UTC", term.TimeZone)
	assert.Empty(t, ps.Warnings(), "no unknown sheets or columns:\n%s", ps)
	var got []string
	for _, p := range ps {
		got = append(got, p.Pos.String())
	}
	assert.Equal(t, []string{"Term!B3", "Term!B4", "Periods"}, got, "%s", ps)
}

// listValues reads the values a list validation offers: its formula1 is
// either the values in quotes, separated by commas, or a reference to the
// cells holding them, here a column range of the hidden Lists sheet
// (ECMA-376 Part 1 §18.3.1.32 dataValidation, formula1). An inline list
// holds at most 255 characters (Microsoft, "Excel specifications and
// limits").
func listValues(t *testing.T, f *excelize.File, formula string) []string {
	t.Helper()
	formula = strings.TrimSpace(formula)
	if strings.HasPrefix(formula, `"`) {
		inner := strings.Trim(formula, `"`)
		require.LessOrEqual(t, len(inner), 255, "an inline list fits the 255-character limit")
		return strings.Split(inner, ",")
	}
	sheet, rng, ok := strings.Cut(strings.TrimPrefix(formula, "="), "!")
	require.True(t, ok, "a list formula is inline or a sheet range: %q", formula)
	from, to, ok := strings.Cut(strings.ReplaceAll(rng, "$", ""), ":")
	require.True(t, ok, "a range: %q", formula)
	c1, r1, err := excelize.CellNameToCoordinates(from)
	require.NoError(t, err)
	c2, r2, err := excelize.CellNameToCoordinates(to)
	require.NoError(t, err)
	require.Equal(t, c1, c2, "one column")
	var out []string
	for r := r1; r <= r2; r++ {
		cell, _ := excelize.CoordinatesToCellName(c1, r)
		v, err := f.GetCellValue(strings.Trim(sheet, "'"), cell)
		require.NoError(t, err)
		out = append(out, v)
	}
	return out
}

// templateList reads the values of the strict drop-down list of a column
// from the written template (see listValues).
func templateList(t *testing.T, f *excelize.File, sheet, col string) []string {
	t.Helper()
	dvs, err := f.GetDataValidations(sheet)
	require.NoError(t, err)
	letter := colLetter(indexOf(specFor(sheet).cols, col))
	for _, dv := range dvs {
		if strings.HasPrefix(dv.Sqref, letter+"2:") {
			require.Equal(t, "list", dv.Type)
			require.NotNil(t, dv.ErrorStyle)
			require.Equal(t, "stop", *dv.ErrorStyle, "a strict list")
			return listValues(t, f, dv.Formula1)
		}
	}
	t.Fatalf("no drop-down list for %s.%s", sheet, col)
	return nil
}

// TestDropDownsAgreeWithReader writes the template and checks, for each
// strict drop-down list, that a value passes the list exactly when the
// reader accepts it. A spreadsheet's list validation compares text without
// regard to case (from memory, for Excel and LibreOffice Calc), so the
// emulated list check is a case-insensitive comparison. The candidates are
// every listed value in several cases, and near misses.
func TestDropDownsAgreeWithReader(t *testing.T) {
	var buf bytes.Buffer
	require.NoError(t, WriteTemplate(&buf))
	f, err := excelize.OpenReader(bytes.NewReader(buf.Bytes()))
	require.NoError(t, err)
	defer f.Close()

	day := func(s string) bool { _, ok := ParseDay(s); return ok }
	readers := map[string]func(string) bool{
		"Periods.Day":       day,
		"Unavailable.Day":   day,
		"Relations.Kind":    func(s string) bool { return pickChoice(relationChoices, s) >= 0 },
		"Weights.Criterion": func(s string) bool { return pickChoice(criterionChoices, s) >= 0 },
	}
	// Spellings people write, which must be read and offered alike.
	musts := map[string][]string{
		"Periods.Day": {"Monday", "Mon", "Sunday"}, "Unavailable.Day": {"Friday"},
		"Relations.Kind": {"Back-to-back", "back to back"}, "Weights.Criterion": {"room stability"},
	}
	for _, d := range dropDowns {
		if !d.strict {
			continue
		}
		key := d.sheet + "." + d.col
		t.Run(key, func(t *testing.T) {
			list := templateList(t, f, d.sheet, d.col)
			accepts := readers[key]
			require.NotNil(t, accepts, "a reader for every strict list")
			passes := func(s string) bool {
				for _, v := range list {
					//lint:ignore SA6005 the list compares lower-cased text, not Unicode case folding (which folds "ſ" to "s")
					if strings.ToLower(v) == strings.ToLower(s) {
						return true
					}
				}
				return false
			}
			var cands []string
			for _, v := range list {
				cands = append(cands, v, strings.ToUpper(v), strings.ToLower(v), titleCase(v),
					v[:len(v)-1], v+"s", strings.ReplaceAll(v, " ", "_"), strings.ReplaceAll(v, " ", "  "), strings.ReplaceAll(v, "-", " "))
			}
			cands = append(cands, musts[key]...)
			cands = append(cands, "", "Tues", "Thurs", "Mo", "sometimes", "ſun", "ſame time")
			for _, c := range cands {
				assert.Equal(t, passes(c), accepts(c), "%q: list passes %v, reader accepts %v", c, passes(c), accepts(c))
			}
			for _, m := range musts[key] {
				assert.True(t, passes(m) && accepts(m), "%q is offered and read", m)
			}
		})
	}
}

// titleCase capitalises the first letter of each space-separated word
// (the list values are ASCII).
func titleCase(s string) string {
	words := strings.Split(s, " ")
	for i, w := range words {
		if w != "" {
			words[i] = strings.ToUpper(w[:1]) + w[1:]
		}
	}
	return strings.Join(words, " ")
}
