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
	assert.Equal(t, names, f.GetSheetList(), "every sheet, in layout order")

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
				assert.Contains(t, dv.Formula1, d.values[0])
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
