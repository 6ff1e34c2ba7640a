package timetable

// This file reads the course columns of the Sections sheet and the Course
// requests sheet (docs/workbook.md, "Courses and course requests").

// readCourseCells reads the Course, Arrangement, Part, Parent section and
// Limit cells of a Sections row into s. A Limit is read whatever its sign
// (Validate reports one below 0 at its cell); 0 warns, because it reads as
// "no limit of its own" while a registrar may have meant a closed section.
func (r *termReader) readCourseCells(t *table, row tableRow, s *Section) {
	s.Course = t.get(row, "Course")
	s.Arrangement = t.get(row, "Arrangement")
	s.Part = t.get(row, "Part")
	s.Parent = t.get(row, "Parent section")
	s.Limit = r.whole(t, row, "Limit", -maxCount, maxCount, 0)
	if t.get(row, "Limit") != "" && s.Limit == 0 {
		r.ps.warnf(t.pos(row, "Limit"), "Limit 0 is read as no limit of its own, so the section takes up to its Expected size — write the most students it may take, or leave the cell blank")
	}
}

// readRequests reads the Course requests sheet into Term.Requests.
func (r *termReader) readRequests() {
	r.rows(shRequests, func(t *table, row tableRow) {
		course := t.get(row, "Course")
		if course == "" {
			r.ps.errorf(t.pos(row, "Course"), "Course is blank — write a course from the Course column of the Sections sheet, or delete the row")
		}
		var alts []string // nil when none: most requests have no alternative
		if s := t.get(row, "Or instead"); s != "" {
			alts = splitList(s)
		}
		r.t.Requests = append(r.t.Requests, Request{
			Student:      r.id(t, row, "Student", "student"),
			Course:       course,
			Alternatives: alts,
			Priority:     r.whole(t, row, "Priority", -maxCount, maxCount, 0),
			Src:          rowSource(t, row),
		})
	})
}
