package timetable

import "strings"

// schedClassRequired are the columns a class list must have.
var schedClassRequired = []string{"Section", "Student"}

// schedParseClassList turns the non-blank rows of a class-list sheet
// (header first, ClassListColumns in any order and case) into sectioned
// enrolments of term t, each with its row as Src. Section and Student are
// required; Course, Part and Title are for people and get a warning when
// they disagree with the term. A row with a blank student, a section the
// term does not have, or the same student and section as an earlier row is
// left out and reported as an error at its cell. Check judges the rest
// against the seating rule.
func schedParseClassList(t *Term, sheet string, rows [][]string, lines []int) ([]Enrolment, Problems) {
	var ps Problems
	if len(rows) == 0 {
		return nil, ps // an empty sheet: nobody was sectioned
	}
	col, ok := schedClassHeader(sheet, rows[0], lines[0], &ps)
	if !ok {
		return nil, ps
	}
	secs := t.SectionIndex()
	type pair struct{ student, section string }
	seen := make(map[pair]int, len(rows))
	out := make([]Enrolment, 0, len(rows)-1)
	for r := 1; r < len(rows); r++ {
		cell := schedCell(sheet, col, rows[r], lines[r])
		sec, spos := cell("Section")
		stu, upos := cell("Student")
		good := true
		si, known := secs[sec]
		switch {
		case sec == "":
			ps.errorf(spos, "the Section is blank — write the section ID from the Sections sheet, or delete the row")
			good = false
		case !known:
			ps.errorf(spos, "section %s is not on the Sections sheet of the term — correct the ID, or delete the row", Quote(sec))
			good = false
		}
		if stu == "" {
			ps.errorf(upos, "the Student is blank — write the student's ID, or delete the row")
			good = false
		}
		if !good {
			continue
		}
		k := pair{stu, sec}
		if first, dup := seen[k]; dup {
			ps.errorf(upos, "student %s is listed in section %s again (first in row %d) — delete the repeat", Quote(stu), Quote(sec), first)
			continue
		}
		seen[k] = lines[r]
		schedClassReadOnly(&t.Sections[si], cell, &ps)
		out = append(out, Enrolment{Student: stu, Section: sec, Src: Source{Sheet: sheet, Row: lines[r]}})
	}
	return out, ps
}

// schedClassHeader maps the class-list headers to column indexes, warning
// about unknown columns; ok is false when a required column is missing.
func schedClassHeader(sheet string, header []string, line int, ps *Problems) (map[string]int, bool) {
	return readListHeader(classListList, sheet, header, line, ps)
}

// classListList is the header of a class-list sheet.
var classListList = listColumns{noun: "class-list", needs: "a class list needs the columns", columns: ClassListColumns, required: schedClassRequired}

// schedClassReadOnly warns when the Course, Part or Title cell of a class
// list row disagrees with the section in the term (the term decides them).
func schedClassReadOnly(sec *Section, cell func(string) (string, Position), ps *Problems) {
	for _, c := range []struct{ col, want string }{{"Course", sec.Course}, {"Part", sec.Part}, {"Title", sec.Title}} {
		if v, pos := cell(c.col); v != "" && v != c.want {
			ps.warnf(pos, "%s %s differs from the Sections sheet, where section %s has %s; the term workbook decides it, so change it there — this cell is ignored",
				strings.ToLower(c.col), Quote(v), Quote(sec.ID), Quote(c.want))
		}
	}
}
