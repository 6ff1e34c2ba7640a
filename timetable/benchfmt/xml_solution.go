package benchfmt

import (
	"bufio"
	"bytes"
	"encoding/xml"
	"fmt"
	"io"
	"strconv"

	"github.com/termwright/termwright/timetable"
)

// The ITC-2019 solution format: a root element "solution" naming the
// instance (with the run's time, cores, technique, author, institution and
// country), then one element per class with its days, start slot, weeks and
// room (none for a class without room), each holding the students enrolled.

// XMLSolution is a timetable in the competition's terms.
type XMLSolution struct {
	Name    string // instance name
	Info    XMLRunInfo
	Classes []XMLAssignment
}

// XMLRunInfo describes the run that made a solution.
type XMLRunInfo struct {
	Runtime     float64 // seconds
	Cores       int
	Technique   string
	Author      string
	Institution string
	Country     string
}

// XMLAssignment is one class's time, room and students.
type XMLAssignment struct {
	Class    string
	Days     uint8
	Start    int
	Weeks    uint64
	Room     string // "" when none
	Students []string
	Line     int
}

// bitString writes bits 0..n-1 as characters.
func bitString(b uint64, n int) string {
	out := make([]byte, n)
	for i := range out {
		out[i] = '0'
		if b&(1<<i) != 0 {
			out[i] = '1'
		}
	}
	return string(out)
}

// XMLSolutionOf turns a timetable of in.Term() into the competition's
// terms: one assignment per placed class, its chosen time and room, and
// its students from s.Enrolments (in their order there). It fails when a
// placement does not name a class and one of its times, or an enrolment
// names a class that is not placed.
func XMLSolutionOf(in *XMLInstance, s *timetable.Schedule, info XMLRunInfo) (*XMLSolution, error) {
	idx := in.classIndex()
	sol := &XMLSolution{Name: in.Name, Info: info}
	seen := map[string]bool{}
	for _, p := range s.Placements {
		ci, ok := idx[p.Section]
		if !ok {
			return nil, fmt.Errorf("section %q of the timetable is no class of instance %s", p.Section, in.Name)
		}
		c := in.Classes[ci]
		if p.Time < 1 || p.Time > len(c.Times) {
			return nil, fmt.Errorf("section %q of the timetable has meeting time %d of %d", p.Section, p.Time, len(c.Times))
		}
		if seen[c.ID] {
			return nil, fmt.Errorf("section %q is placed twice in the timetable", p.Section)
		}
		seen[c.ID] = true
		tm := c.Times[p.Time-1]
		sol.Classes = append(sol.Classes, XMLAssignment{Class: c.ID, Days: tm.Days, Start: tm.Start, Weeks: tm.Weeks, Room: p.Room})
	}
	if len(s.Enrolments) == 0 {
		return sol, nil
	}
	at := make(map[string]int, len(sol.Classes))
	for i, a := range sol.Classes {
		at[a.Class] = i
	}
	for _, e := range s.Enrolments {
		i, ok := at[e.Section]
		if !ok {
			return nil, fmt.Errorf("student %q is enrolled in section %q, which is no placed class of instance %s", e.Student, e.Section, in.Name)
		}
		sol.Classes[i].Students = append(sol.Classes[i].Students, e.Student)
	}
	return sol, nil
}

// WriteXMLSolution writes a solution of instance in, classes in instance
// order, in the competition's solution format.
func WriteXMLSolution(w io.Writer, in *XMLInstance, sol *XMLSolution) error {
	pos := in.classIndex()
	order := make([]*XMLAssignment, len(in.Classes))
	for i := range sol.Classes {
		a := &sol.Classes[i]
		if k, ok := pos[a.Class]; ok {
			order[k] = a
		}
	}
	bw := bufio.NewWriter(w)
	esc := func(s string) string {
		var b bytes.Buffer
		_ = xml.EscapeText(&b, []byte(s))
		return b.String()
	}
	fmt.Fprintf(bw, "<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n<solution name=\"%s\" runtime=\"%s\" cores=\"%d\" technique=\"%s\" author=\"%s\" institution=\"%s\" country=\"%s\">\n",
		esc(sol.Name), strconv.FormatFloat(sol.Info.Runtime, 'f', 1, 64), max(sol.Info.Cores, 1),
		esc(sol.Info.Technique), esc(sol.Info.Author), esc(sol.Info.Institution), esc(sol.Info.Country))
	for _, a := range order {
		if a == nil {
			continue
		}
		fmt.Fprintf(bw, "  <class id=\"%s\" days=\"%s\" start=\"%d\" weeks=\"%s\"", esc(a.Class), bitString(uint64(a.Days), in.Days), a.Start, bitString(a.Weeks, in.Weeks))
		if a.Room != "" {
			fmt.Fprintf(bw, " room=\"%s\"", esc(a.Room))
		}
		if len(a.Students) == 0 {
			bw.WriteString("/>\n")
			continue
		}
		bw.WriteString(">\n")
		for _, st := range a.Students {
			fmt.Fprintf(bw, "    <student id=\"%s\"/>\n", esc(st))
		}
		bw.WriteString("  </class>\n")
	}
	bw.WriteString("</solution>\n")
	return bw.Flush()
}

// ReadXMLSolution reads a solution of instance in (a leading byte-order
// mark is skipped). It checks the format and that every class named exists
// and is given once, not whether the solution is valid (see XMLHard).
// Problems are reported in Errors matching ErrXMLFormat.
func ReadXMLSolution(r io.Reader, name string, in *XMLInstance) (*XMLSolution, error) {
	errs := &errList{file: name, format: ErrXMLFormat}
	x := &xmlReader{errs: errs, in: in}
	sol := &XMLSolution{}
	idx := in.classIndex()
	seen := map[string]int{}
	root := false
	start := func(parent string, t xml.StartElement) bool {
		want := map[string]string{"": "solution", "solution": "class", "class": "student"}[parent]
		if t.Name.Local != want || (want == "solution" && root) {
			x.fail("element <%s> is not expected here; this is not a solution in the ITC-2019 format", clip(t.Name.Local))
			return false
		}
		switch want {
		case "solution":
			root = true
			a := x.attrs(t, "the solution")
			sol.Name = a.m["name"]
			if sol.Name != in.Name {
				x.fail("the solution is for instance %s, not %s; give the solution of this instance", strconv.Quote(clip(sol.Name)), strconv.Quote(clip(in.Name)))
			}
			sol.Info.Runtime, _ = strconv.ParseFloat(a.m["runtime"], 64)
			sol.Info.Cores, _ = strconv.Atoi(a.m["cores"])
			sol.Info.Technique, sol.Info.Author = a.m["technique"], a.m["author"]
			sol.Info.Institution, sol.Info.Country = a.m["institution"], a.m["country"]
		case "class":
			a := x.attrs(t, "a class of the solution")
			as := XMLAssignment{Class: a.id("id", "class"), Room: a.m["room"], Line: x.line}
			as.Days = uint8(a.bits("days", "days", in.Days))
			as.Start = a.num("start", "start slot", 0, -1)
			as.Weeks = a.bits("weeks", "weeks", in.Weeks)
			if _, ok := idx[as.Class]; !ok && as.Class != "" {
				x.fail("class %s is not in instance %s; correct the class", strconv.Quote(clip(as.Class)), strconv.Quote(clip(in.Name)))
			} else if l, dup := seen[as.Class]; dup {
				x.fail("class %s is given twice (first on line %d); give each class once", strconv.Quote(clip(as.Class)), l)
			}
			seen[as.Class] = x.line
			sol.Classes = append(sol.Classes, as)
		case "student":
			a := x.attrs(t, "a student of the solution")
			c := &sol.Classes[len(sol.Classes)-1]
			c.Students = append(c.Students, a.id("id", "student"))
		}
		return true
	}
	if !x.walk(r, "repair it", start, nil) {
		return nil, errs.err()
	}
	if !root {
		errs.add(0, "the file holds no solution; give an ITC-2019 solution")
	}
	if err := errs.err(); err != nil {
		return nil, err
	}
	return sol, nil
}

// Schedule turns a solution into a timetable of in.Term(): each assignment
// becomes the placement of its class at the matching time choice, and each
// of its students an enrolment (Schedule.Enrolments, in solution order).
// It fails when a class's time is not one of its listed times.
func (sol *XMLSolution) Schedule(in *XMLInstance) (*timetable.Schedule, error) {
	idx := in.classIndex()
	s := &timetable.Schedule{}
	for _, a := range sol.Classes {
		ci, ok := idx[a.Class]
		if !ok {
			return nil, fmt.Errorf("class %q is not in instance %s", a.Class, in.Name)
		}
		k := timeChoice(in.Classes[ci], a)
		if k < 0 {
			return nil, fmt.Errorf("class %q meets at a time it does not list (line %d)", a.Class, a.Line)
		}
		s.Placements = append(s.Placements, timetable.Placement{Section: a.Class, Meeting: 1, Period: -1, Time: k + 1, Room: a.Room})
		for _, st := range a.Students {
			s.Enrolments = append(s.Enrolments, timetable.Enrolment{Student: st, Section: a.Class})
		}
	}
	return s, nil
}

// timeChoice finds the listed time of class c that assignment a takes, or -1.
func timeChoice(c XMLClass, a XMLAssignment) int {
	for i, t := range c.Times {
		if t.Days == a.Days && t.Start == a.Start && t.Weeks == a.Weeks {
			return i
		}
	}
	return -1
}
