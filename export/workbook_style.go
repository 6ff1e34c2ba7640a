package export

import "github.com/xuri/excelize/v2"

// styles are the cell styles of a workbook: greys and borders only, so the
// sheets print legibly in black and white.
type styles struct {
	title  int // sheet title
	note   int // small grey text under the title
	header int // column headers
	label  int // period labels of a grid
	free   int // a grid period with nothing in it
	closed int // a day without that period
	block  int // a grid block holding one or more meetings
	// unavailable and preferFree mark a subject's hard and preferred
	// unavailable times on its grid
	unavailable, preferFree int
	percent                 int // 0.0 %
	bold                    int
}

func newStyles(f *excelize.File) (styles, error) {
	thin := func(color string) []excelize.Border {
		return []excelize.Border{
			{Type: "left", Color: color, Style: 1}, {Type: "right", Color: color, Style: 1},
			{Type: "top", Color: color, Style: 1}, {Type: "bottom", Color: color, Style: 1},
		}
	}
	solid := func(color string) excelize.Fill {
		return excelize.Fill{Type: "pattern", Pattern: 1, Color: []string{color}}
	}
	pct := "0.0%"
	var st styles
	defs := []struct {
		dst *int
		s   *excelize.Style
	}{
		{&st.title, &excelize.Style{Font: &excelize.Font{Bold: true, Size: 14}}},
		{&st.note, &excelize.Style{Font: &excelize.Font{Size: 9, Color: "595959"}}},
		{&st.header, &excelize.Style{Font: &excelize.Font{Bold: true}, Fill: solid("D0D0D0"), Border: thin("808080"),
			Alignment: &excelize.Alignment{Horizontal: "center", Vertical: "center", WrapText: true}}},
		{&st.label, &excelize.Style{Font: &excelize.Font{Bold: true, Size: 9}, Fill: solid("EDEDED"), Border: thin("808080"),
			Alignment: &excelize.Alignment{Horizontal: "center", Vertical: "top"}}},
		{&st.free, &excelize.Style{Border: thin("BFBFBF")}},
		// closed: light upward diagonal hatching (pattern "lightUp"), as in the PDF
		{&st.closed, &excelize.Style{Fill: excelize.Fill{Type: "pattern", Pattern: 14, Color: []string{"A6A6A6"}}, Border: thin("BFBFBF")}},
		{&st.block, &excelize.Style{Font: &excelize.Font{Size: 9}, Fill: solid("E4E4E4"),
			Border: []excelize.Border{
				{Type: "left", Color: "000000", Style: 5}, {Type: "right", Color: "000000", Style: 2},
				{Type: "top", Color: "000000", Style: 2}, {Type: "bottom", Color: "000000", Style: 2},
			},
			Alignment: &excelize.Alignment{Vertical: "top", WrapText: true}}},
		// unavailable: cross-hatched (pattern "lightGrid"), as in the PDF
		{&st.unavailable, &excelize.Style{Font: &excelize.Font{Size: 8, Color: "404040"}, Fill: excelize.Fill{Type: "pattern", Pattern: 15, Color: []string{"A6A6A6"}},
			Border: thin("BFBFBF"), Alignment: &excelize.Alignment{Vertical: "top", WrapText: true}}},
		{&st.preferFree, &excelize.Style{Font: &excelize.Font{Size: 8, Color: "404040"}, Fill: solid("F0F0F0"),
			Border: thin("BFBFBF"), Alignment: &excelize.Alignment{Vertical: "top", WrapText: true}}},
		{&st.percent, &excelize.Style{CustomNumFmt: &pct}},
		{&st.bold, &excelize.Style{Font: &excelize.Font{Bold: true}}},
	}
	for _, d := range defs {
		id, err := f.NewStyle(d.s)
		if err != nil {
			return st, err
		}
		*d.dst = id
	}
	return st, nil
}
