package sectioning

import "strings"

// reason says in one sentence why request r could not be met, option by
// option, from the final seating.
func (p *problem) reason(r int32) string {
	rq := &p.reqs[r]
	tr := &p.t.Requests[r]
	names := append([]string{tr.Course}, tr.Alternatives...)
	var parts []string
	for o, c := range rq.options {
		lead := "course " + names[o]
		if o > 0 {
			lead = "alternative " + names[o]
		}
		parts = append(parts, lead+" "+p.optionReason(r, c))
	}
	s := strings.Join(parts, "; ") + "."
	return strings.ToUpper(s[:1]) + s[1:]
}

// optionReason completes "course X …" for one option of r.
func (p *problem) optionReason(r, c int32) string {
	k := p.reqs[r].student
	if c < 0 {
		return "is not offered (no section teaches it)"
	}
	if p.holdsCourse(k, c, r) {
		return "is already the student's through another request"
	}
	var full []string
	for _, ai := range p.courseArr[c] {
		for _, pi := range p.arrs[ai].parts {
			room := false
			for _, x := range p.parts[pi].sections {
				if p.st.load[x] < p.limit[x] || p.isFixed(k, x) {
					room = true
					break
				}
			}
			if !room {
				full = append(full, p.partName(pi))
			}
		}
	}
	if len(full) > 0 && len(p.courseArr[c]) == 1 && len(p.arrs[p.courseArr[c][0]].parts) == 1 {
		return "is full (every section has reached its limit)"
	}
	if len(full) > 0 {
		return "has no place: every section of " + joinAnd(full) + " has reached its limit"
	}
	if len(p.fixedIn(k, c, nil)) > 0 {
		return "cannot be completed around the student's fixed sections in it (a part is full or a parent link cannot be met)"
	}
	return "has no combination of sections with room that keeps each section with its parent section"
}

// partName names part pi for a sentence: "part Lab", "part Lab of
// arrangement B", or "the course" for an unnamed only part.
func (p *problem) partName(pi int32) string {
	pt := p.parts[pi]
	a := p.arrs[pt.arr]
	sec := p.t.Sections[pt.sections[0]]
	name := "part " + sec.Part
	if sec.Part == "" {
		name = "the unnamed part"
	}
	if sec.Arrangement != "" && len(p.courseArr[a.course]) > 1 {
		name += " of arrangement " + sec.Arrangement
	}
	return name
}

func joinAnd(xs []string) string {
	if len(xs) == 1 {
		return xs[0]
	}
	return strings.Join(xs[:len(xs)-1], ", ") + " and " + xs[len(xs)-1]
}
