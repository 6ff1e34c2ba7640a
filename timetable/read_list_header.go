package timetable

import "strings"

// listColumns describes the header of a list sheet that is read by its
// column names (a timetable, a class list, requests): the columns it may
// have, in the order messages name them, and the ones it must have.
type listColumns struct {
	noun     string   // the list in messages: "timetable" in "is not a timetable column"
	needs    string   // the sentence start for a missing column: "the timetable needs the columns"
	columns  []string // every known column
	required []string // the columns that must be there
}

// readListHeader maps the known headers of a list sheet to column indexes,
// matched without regard to case or runs of spaces; an unknown column is a
// warning, a repeated one an error at its cell. ok is false when a required
// column is missing (an error at the header row).
func readListHeader(l listColumns, sheet string, header []string, line int, ps *Problems) (map[string]int, bool) {
	col := map[string]int{}
	for i, h := range header {
		key := normHeader(strings.TrimPrefix(h, "\ufeff"))
		if key == "" {
			continue
		}
		pos := Position{Sheet: sheet, Row: line, Col: colLetter(i)}
		name := ""
		for _, c := range l.columns {
			if normHeader(c) == key {
				name = c
			}
		}
		switch _, dup := col[name]; {
		case name == "":
			ps.warnf(pos, "column %s is not a %s column and is ignored (the columns are %s)", Quote(strings.TrimSpace(h)), l.noun, strings.Join(l.columns, ", "))
		case dup:
			ps.errorf(pos, "column %s appears twice — delete one of them", name)
		default:
			col[name] = i
		}
	}
	ok := true
	for _, c := range l.required {
		if _, has := col[c]; !has {
			ps.errorf(Position{Sheet: sheet, Row: line}, "the header row has no %s column — %s %s", c, l.needs, strings.Join(l.columns, ", "))
			ok = false
		}
	}
	return col, ok
}
