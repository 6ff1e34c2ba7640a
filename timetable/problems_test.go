package timetable

import (
	"errors"
	"slices"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
)

func TestPositionString(t *testing.T) {
	for want, p := range map[string]Position{
		"Sections!D14":    {Sheet: "Sections", Row: 14, Col: "D"},
		"Sections row 14": {Sheet: "Sections", Row: 14},
		"Sections":        {Sheet: "Sections"},
		"":                {},
	} {
		assert.Equal(t, want, p.String())
	}
	// A record's row prints as the same place.
	assert.Equal(t, "Sections row 14", Source{Sheet: "Sections", Row: 14}.String())
	assert.Equal(t, "Sections", Source{Sheet: "Sections"}.String())
}

func TestProblemsSortAndFilter(t *testing.T) {
	ps := Problems{
		{Position{"Weights", 2, "A"}, Error, "w"},
		{Position{"Notes", 0, ""}, Warning, "unknown sheet"},
		{Position{"Sections", 14, "D"}, Warning, "repeat"},
		{Position{"Sections", 14, "D"}, Error, "first"},
		{Position{"Sections", 14, "D"}, Error, "consequence"},
		{Position{"Sections", 3, "AA"}, Error, "wide"},
		{Position{"Sections", 3, "B"}, Error, "narrow"},
		{Position{"Term", 0, ""}, Error, "a"},
		{Position{"Term", 0, ""}, Error, "a"},
		{Position{"Term", 0, ""}, Error, "b"},
	}
	ps.Sort()
	var got []string
	for _, p := range ps {
		got = append(got, p.String())
	}
	assert.Equal(t, []string{
		"Term: a", "Term: b",
		"Sections!B3: narrow", "Sections!AA3: wide",
		"Sections!D14: first", "Sections!D14: warning: repeat",
		"Weights!A2: w",
		"Notes: warning: unknown sheet",
	}, got)
	assert.Len(t, ps.Errors(), 6)
	assert.Len(t, ps.Warnings(), 2)

	err := ps.Err()
	require.Error(t, err)
	assert.Equal(t, "the term has 6 errors:\nTerm: a\nTerm: b\nSections!B3: narrow\nSections!AA3: wide\nSections!D14: first\nWeights!A2: w", err.Error())
	assert.NoError(t, ps.Warnings().Err(), "warnings alone are not an error")
	assert.NoError(t, Problems(nil).Err())
}

func TestErrUnreadableIs(t *testing.T) {
	err := unreadablef("%s is damaged — copy it again", "x.xlsx")
	assert.True(t, errors.Is(err, ErrUnreadable))
	assert.Equal(t, "x.xlsx is damaged — copy it again", err.Error())
}

// TestSourceOrder: sheets in workbook order, rows by number, unknown last.
func TestSourceOrder(t *testing.T) {
	srcs := []Source{{}, {Sheet: "Relations", Row: 10}, {Sheet: "Relations", Row: 2}, {Sheet: "Sections", Row: 14},
		{Sheet: "Requests", Row: 1}, {Sheet: "Rooms", Row: 3}}
	slices.SortFunc(srcs, Source.Compare)
	var got []string
	for _, s := range srcs {
		got = append(got, s.String())
	}
	assert.Equal(t, []string{"Rooms row 3", "Sections row 14", "Relations row 2", "Relations row 10", "Requests row 1", ""}, got)
}
