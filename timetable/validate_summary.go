package timetable

// Counts summarises the size of a term.
type Counts struct {
	Sections   int `json:"sections"`
	Meetings   int `json:"meetings"` // sum of meetings per week over sections (a pattern section: the fewest days of its meeting times)
	Staff      int `json:"staff"`
	Rooms      int `json:"rooms"`
	Cohorts    int `json:"cohorts"`
	Periods    int `json:"periods"`
	Students   int `json:"students"` // distinct students on the Enrolments sheet
	Enrolments int `json:"enrolments"`
	Courses    int `json:"courses,omitempty"`  // requestable courses (Term.Courses)
	Requests   int `json:"requests,omitempty"` // rows of the Course requests sheet
}

// Summary counts the records of a term.
func Summary(t *Term) Counts {
	c := Counts{
		Sections: len(t.Sections), Staff: len(t.Staff), Rooms: len(t.Rooms),
		Cohorts: len(t.Cohorts), Periods: len(t.Periods), Enrolments: len(t.Enrolments),
		Courses: len(t.Courses()), Requests: len(t.Requests),
	}
	for i := range t.Sections {
		s := &t.Sections[i]
		if !s.UsesTimes() {
			c.Meetings += s.Meetings
			continue
		}
		fewest := s.Times[0].Days.Count()
		for _, tc := range s.Times[1:] {
			fewest = min(fewest, tc.Days.Count())
		}
		c.Meetings += fewest
	}
	students := make(map[string]struct{}, len(t.Enrolments)/4+1)
	for _, e := range t.Enrolments {
		students[e.Student] = struct{}{}
	}
	c.Students = len(students)
	return c
}
