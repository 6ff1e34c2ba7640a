package benchfmt

// The competition's student rules (Müller, Rudová, Müllerová, PATAT 2018,
// section on student sectioning; the solution is invalid when one is
// broken): a student of a course attends exactly one of its
// configurations and exactly one class of each subpart of it; a student
// in a class with a parent attends the parent too; no class holds more
// students than its limit. Students attend only classes of courses they
// want. Evaluated here from the instance and the solution alone,
// independently of timetable.Check and of the sectioner.

// sectioning counts the broken student rules into e.hard.Sectioning: 1 per
// student and wanted course whose classes are not one configuration with
// one class of each subpart and every parent; 1 per listing of a student
// in a class of a course they do not want (or a student the instance does
// not have, or a student listed twice in one class); and per class, the
// students over its limit.
func (e *evaluation) sectioning(sol *XMLSolution) {
	idx := e.in.classIndex()
	wants := make(map[string]map[string]bool, len(e.in.Students))
	for _, st := range e.in.Students {
		w := make(map[string]bool, len(st.Courses))
		for _, c := range st.Courses {
			w[c] = true
		}
		wants[st.ID] = w
	}
	type key struct{ student, course string }
	held := map[key][]int{}
	count := make([]int, len(e.in.Classes))
	for _, a := range sol.Classes {
		ci, ok := idx[a.Class]
		if !ok {
			continue
		}
		c := e.in.Classes[ci]
		listed := make(map[string]bool, len(a.Students))
		for _, st := range a.Students {
			if listed[st] {
				e.hard.Sectioning++ // listed twice
				continue
			}
			listed[st] = true
			count[ci]++
			if !wants[st][c.Course] {
				e.hard.Sectioning++
				continue
			}
			k := key{st, c.Course}
			held[k] = append(held[k], ci)
		}
	}
	for ci, n := range count {
		e.hard.Sectioning += max(n-e.in.Classes[ci].Limit, 0)
	}
	courses := make(map[string]*XMLCourse, len(e.in.Courses))
	for i := range e.in.Courses {
		courses[e.in.Courses[i].ID] = &e.in.Courses[i]
	}
	for _, st := range e.in.Students {
		for _, c := range st.Courses {
			if !e.seated(courses[c], held[key{st.ID, c}]) {
				e.hard.Sectioning++
			}
		}
	}
}

// seated reports whether the classes a student holds in course c (indexes
// into Classes, each once) are exactly one class of every subpart of one
// configuration, with every parent held.
func (e *evaluation) seated(c *XMLCourse, classes []int) bool {
	if c == nil || len(classes) == 0 {
		return false
	}
	config := e.in.Classes[classes[0]].Config
	bySubpart := map[string]int{}
	ids := make(map[string]bool, len(classes))
	for _, ci := range classes {
		cl := e.in.Classes[ci]
		if cl.Config != config {
			return false
		}
		bySubpart[cl.Subpart]++
		ids[cl.ID] = true
	}
	for _, cf := range c.Configs {
		if cf.ID != config {
			continue
		}
		if len(bySubpart) != len(cf.Subparts) {
			return false
		}
		for _, sp := range cf.Subparts {
			if bySubpart[sp.ID] != 1 {
				return false
			}
		}
	}
	for _, ci := range classes {
		if p := e.in.Classes[ci].Parent; p != "" && !ids[p] {
			return false
		}
	}
	return true
}
