package benchfmt

import (
	"encoding/xml"
	"fmt"
	"io"
	"strconv"
	"strings"
)

// maxXMLNumber bounds every number of an instance file (capacities, limits,
// penalties, weights, slots): the published instances stay far below it, and
// with it no cost sum can overflow.
const maxXMLNumber = 1_000_000

// xmlChildren says which elements may appear inside which (the root is
// "problem"; "" is the document).
var xmlChildren = map[string][]string{
	"":              {"problem"},
	"problem":       {"optimization", "rooms", "courses", "distributions", "students"},
	"rooms":         {"room"},
	"room":          {"travel", "unavailable"},
	"courses":       {"course"},
	"course":        {"config"},
	"config":        {"subpart"},
	"subpart":       {"class"},
	"class":         {"room", "time"},
	"distributions": {"distribution"},
	"distribution":  {"class"},
	"students":      {"student"},
	"student":       {"course"},
}

// xmlReader holds the state of one read.
type xmlReader struct {
	d     *xml.Decoder
	errs  *errList
	in    *XMLInstance
	stack []string // element names from the root
	line  int      // line of the element being handled
	// current parents
	room    *XMLRoom
	course  *XMLCourse
	config  *XMLConfig
	subpart *XMLSubpart
	class   *XMLClass
	dist    *XMLDistribution
	student *XMLStudent
	classes []XMLClass // built here, then copied (pointers into a growing slice would move)
}

// ReadXML reads an ITC-2019 instance (the file may start with a UTF-8
// byte-order mark). name is used in messages. Every problem found is
// reported in Errors, as "name:LINE: what is wrong; what to do", matching
// ErrXMLFormat.
func ReadXML(r io.Reader, name string) (*XMLInstance, error) {
	errs := &errList{file: name, format: ErrXMLFormat}
	x := &xmlReader{errs: errs, in: &XMLInstance{}}
	sawRoot := false
	start := func(parent string, t xml.StartElement) bool {
		if !contains(xmlChildren[parent], t.Name.Local) {
			x.fail("element <%s> is not expected here; this is not an instance in the ITC-2019 format", clip(t.Name.Local))
			return false
		}
		if t.Name.Local == "problem" {
			if sawRoot {
				x.fail("the file holds a second instance; give one instance per file")
				return false
			}
			sawRoot = true
		}
		x.start(t)
		return true
	}
	if !x.walk(r, "repair or download the instance again", start, x.end) {
		return nil, errs.err()
	}
	if !sawRoot {
		errs.add(0, "the file holds no instance; give an ITC-2019 instance")
		return nil, errs.err()
	}
	x.in.Classes = x.classes
	x.check()
	if err := errs.err(); err != nil {
		return nil, err
	}
	return x.in, nil
}

func contains(list []string, s string) bool {
	for _, x := range list {
		if x == s {
			return true
		}
	}
	return false
}

func (x *xmlReader) fail(format string, args ...any) {
	x.errs.add(x.line, fmt.Sprintf(format, args...))
}

// attrs gathers the attributes of an element by name.
type attrs struct {
	x    *xmlReader
	what string // plain words for the element, e.g. "a room"
	m    map[string]string
}

func (x *xmlReader) attrs(t xml.StartElement, what string) attrs {
	m := make(map[string]string, len(t.Attr))
	for _, a := range t.Attr {
		m[a.Name.Local] = a.Value
	}
	return attrs{x: x, what: what, m: m}
}

// id is a required identifier.
func (a attrs) id(key, plain string) string {
	v, ok := a.m[key]
	if !ok || strings.TrimSpace(v) == "" {
		a.x.fail("%s has no %s; give one", a.what, plain)
		return ""
	}
	return v
}

// num is a whole number from min to maxXMLNumber; def is used when the
// attribute is absent and def >= 0, otherwise it is required.
func (a attrs) num(key, plain string, min, def int) int {
	v, ok := a.m[key]
	if !ok {
		if def >= 0 {
			return def
		}
		a.x.fail("%s has no %s; give a whole number", a.what, plain)
		return min
	}
	n, err := strconv.Atoi(strings.TrimSpace(v))
	if err != nil || n < min || n > maxXMLNumber {
		a.x.fail("%s has %s %s; it must be a whole number from %d to %d", a.what, plain, strconv.Quote(clip(v)), min, maxXMLNumber)
		return min
	}
	return n
}

// bits reads a bit string of exactly n characters 0 and 1; bit i of the
// result is character i.
func (a attrs) bits(key, plain string, n int) uint64 {
	v, ok := a.m[key]
	if !ok {
		a.x.fail("%s has no %s; give a string of %d zeros and ones", a.what, plain, n)
		return 0
	}
	if len(v) != n {
		a.x.fail("%s has %s %s of %d characters; it must have %d, one per %s", a.what, plain, strconv.Quote(clip(v)), len(v), n, strings.TrimSuffix(plain, "s"))
		return 0
	}
	var out uint64
	for i := 0; i < n; i++ {
		switch v[i] {
		case '1':
			out |= 1 << i
		case '0':
		default:
			a.x.fail("%s has %s %s; use only 0 and 1", a.what, plain, strconv.Quote(clip(v)))
			return 0
		}
	}
	return out
}

// time reads days, start, length and weeks (and a penalty when withPenalty).
func (a attrs) time(withPenalty bool) XMLTime {
	in := a.x.in
	t := XMLTime{
		Days:   uint8(a.bits("days", "days", in.Days)),
		Start:  a.num("start", "start slot", 0, -1),
		Length: a.num("length", "length", 1, -1),
		Weeks:  a.bits("weeks", "weeks", in.Weeks),
	}
	if withPenalty {
		t.Penalty = a.num("penalty", "penalty", 0, 0)
	}
	if t.End() > in.SlotsPerDay {
		a.x.fail("%s ends at slot %d, after the day's %d slots; shorten it or start it earlier", a.what, t.End(), in.SlotsPerDay)
	}
	return t
}

// start handles one opening element.
func (x *xmlReader) start(t xml.StartElement) {
	in := x.in
	parent := ""
	if len(x.stack) > 1 {
		parent = x.stack[len(x.stack)-2]
	}
	switch t.Name.Local {
	case "problem":
		a := x.attrs(t, "the instance")
		in.Name = a.id("name", "name")
		in.Days = a.num("nrDays", "number of days", 1, -1)
		in.SlotsPerDay = a.num("slotsPerDay", "number of slots per day", 1, -1)
		in.Weeks = a.num("nrWeeks", "number of weeks", 1, -1)
		if in.Days > 7 {
			x.fail("the instance has %d days a week; at most 7 are supported", in.Days)
			in.Days = 7
		}
		if in.SlotsPerDay > 288 {
			x.fail("the instance has %d slots a day; slots are 5 minutes, so at most 288", in.SlotsPerDay)
			in.SlotsPerDay = 288
		}
		if in.Weeks > 64 {
			x.fail("the instance has %d weeks; at most 64 are supported", in.Weeks)
			in.Weeks = 64
		}
	case "optimization":
		a := x.attrs(t, "the weights")
		in.Weights = XMLWeights{
			Time:         a.num("time", "time weight", 0, 0),
			Room:         a.num("room", "room weight", 0, 0),
			Distribution: a.num("distribution", "constraint weight", 0, 0),
			Student:      a.num("student", "student weight", 0, 0),
		}
	case "room":
		if parent == "class" {
			a := x.attrs(t, "a room choice of class "+strconv.Quote(clip(x.class.ID)))
			x.class.Rooms = append(x.class.Rooms, XMLRoomChoice{Room: a.id("id", "room"), Penalty: a.num("penalty", "penalty", 0, 0)})
			return
		}
		a := x.attrs(t, "a room")
		in.Rooms = append(in.Rooms, XMLRoom{ID: a.id("id", "id"), Capacity: a.num("capacity", "capacity", 0, -1), Line: x.line})
		x.room = &in.Rooms[len(in.Rooms)-1]
	case "travel":
		a := x.attrs(t, "a travel time of room "+strconv.Quote(clip(x.room.ID)))
		x.room.Travel = append(x.room.Travel, XMLTravel{Room: a.id("room", "room"), Slots: a.num("value", "value", 0, -1)})
	case "unavailable":
		a := x.attrs(t, "an unavailable time of room "+strconv.Quote(clip(x.room.ID)))
		x.room.Unavailable = append(x.room.Unavailable, a.time(false))
	case "course":
		if parent == "student" {
			a := x.attrs(t, "a wanted course of student "+strconv.Quote(clip(x.student.ID)))
			x.student.Courses = append(x.student.Courses, a.id("id", "course"))
			return
		}
		a := x.attrs(t, "a course")
		in.Courses = append(in.Courses, XMLCourse{ID: a.id("id", "id")})
		x.course = &in.Courses[len(in.Courses)-1]
	case "config":
		a := x.attrs(t, "a configuration of course "+strconv.Quote(clip(x.course.ID)))
		x.course.Configs = append(x.course.Configs, XMLConfig{ID: a.id("id", "id")})
		x.config = &x.course.Configs[len(x.course.Configs)-1]
	case "subpart":
		a := x.attrs(t, "a part of course "+strconv.Quote(clip(x.course.ID)))
		x.config.Subparts = append(x.config.Subparts, XMLSubpart{ID: a.id("id", "id")})
		x.subpart = &x.config.Subparts[len(x.config.Subparts)-1]
	case "class":
		if parent == "distribution" {
			a := x.attrs(t, "a class of a constraint")
			x.dist.Classes = append(x.dist.Classes, a.id("id", "class"))
			return
		}
		a := x.attrs(t, "a class")
		c := XMLClass{ID: a.id("id", "id"), Course: x.course.ID, Config: x.config.ID, Subpart: x.subpart.ID,
			Parent: a.m["parent"], Limit: a.num("limit", "limit", 0, -1), Line: x.line}
		switch a.m["room"] {
		case "", "true":
		case "false":
			c.NoRoom = true
		default:
			x.fail("class %s has room %s; write true or false", strconv.Quote(clip(c.ID)), strconv.Quote(clip(a.m["room"])))
		}
		x.subpart.Classes = append(x.subpart.Classes, c.ID)
		x.classes = append(x.classes, c)
		x.class = &x.classes[len(x.classes)-1]
	case "time":
		a := x.attrs(t, "a time of class "+strconv.Quote(clip(x.class.ID)))
		x.class.Times = append(x.class.Times, a.time(true))
	case "distribution":
		a := x.attrs(t, "a constraint")
		x.startDistribution(a)
	case "student":
		a := x.attrs(t, "a student")
		in.Students = append(in.Students, XMLStudent{ID: a.id("id", "id"), Line: x.line})
		x.student = &in.Students[len(in.Students)-1]
	}
}

// startDistribution reads a distribution's type, parameters and strength.
func (x *xmlReader) startDistribution(a attrs) {
	d := XMLDistribution{Line: x.line}
	typ := a.id("type", "type")
	base, params, ok := strings.Cut(typ, "(")
	d.Type = base
	want, known := xmlKinds[base]
	switch {
	case typ == "":
	case !known:
		x.fail("a constraint has type %s, which the ITC-2019 rules do not define; correct it", strconv.Quote(clip(typ)))
	case ok != (want > 0) || (ok && !strings.HasSuffix(params, ")")):
		x.fail("a constraint of type %s takes %d numbers in parentheses; write it as the rules do", strconv.Quote(clip(typ)), want)
	case ok:
		for _, p := range strings.Split(strings.TrimSuffix(params, ")"), ",") {
			n, err := strconv.Atoi(strings.TrimSpace(p))
			if err != nil || n < 0 || n > maxXMLNumber {
				x.fail("a constraint of type %s has number %s; it must be a whole number from 0 to %d", strconv.Quote(clip(typ)), strconv.Quote(clip(p)), maxXMLNumber)
				n = 0
			}
			d.Params = append(d.Params, n)
		}
		if len(d.Params) != want {
			x.fail("a constraint of type %s takes %d numbers but has %d; write it as the rules do", strconv.Quote(clip(typ)), want, len(d.Params))
		}
	}
	switch a.m["required"] {
	case "true":
		d.Required = true
		if _, has := a.m["penalty"]; has {
			x.fail("a required constraint also has a penalty; give one or the other")
		}
	case "", "false":
		d.Penalty = a.num("penalty", "penalty", 0, -1)
	default:
		x.fail("a constraint has required %s; write true or false", strconv.Quote(clip(a.m["required"])))
	}
	x.in.Distributions = append(x.in.Distributions, d)
	x.dist = &x.in.Distributions[len(x.in.Distributions)-1]
}

// end checks what needs the element's children.
func (x *xmlReader) end(name string) {
	parent := ""
	if len(x.stack) > 1 {
		parent = x.stack[len(x.stack)-2]
	}
	if name == "class" && parent == "subpart" && len(x.class.Times) == 0 {
		x.errs.add(x.class.Line, fmt.Sprintf("class %s has no time; give it at least one", strconv.Quote(clip(x.class.ID))))
	}
}

// check validates references and identifiers once everything is read.
func (x *xmlReader) check() {
	in := x.in
	rooms := map[string]bool{}
	for _, r := range in.Rooms {
		if rooms[r.ID] {
			x.errs.add(r.Line, fmt.Sprintf("room %s is given twice; give each room once", strconv.Quote(clip(r.ID))))
		}
		rooms[r.ID] = true
	}
	for _, r := range in.Rooms {
		for _, t := range r.Travel {
			if !rooms[t.Room] {
				x.errs.add(r.Line, fmt.Sprintf("room %s has a travel time to room %s, which is not given; correct the room", strconv.Quote(clip(r.ID)), strconv.Quote(clip(t.Room))))
			}
		}
	}
	classes := map[string]bool{}
	for _, c := range in.Classes {
		if classes[c.ID] {
			x.errs.add(c.Line, fmt.Sprintf("class %s is given twice; give each class once", strconv.Quote(clip(c.ID))))
		}
		classes[c.ID] = true
	}
	where := in.classIndex()
	for _, c := range in.Classes {
		if c.Parent != "" && !classes[c.Parent] {
			x.errs.add(c.Line, fmt.Sprintf("class %s has parent %s, which is not given; correct the parent", strconv.Quote(clip(c.ID)), strconv.Quote(clip(c.Parent))))
		} else if p := in.Classes[where[c.Parent]]; c.Parent != "" && (p.Course != c.Course || p.Config != c.Config || p.Subpart == c.Subpart) {
			x.errs.add(c.Line, fmt.Sprintf("class %s has parent %s, which is not of another part of its configuration; correct the parent", strconv.Quote(clip(c.ID)), strconv.Quote(clip(c.Parent))))
		}
		for _, rc := range c.Rooms {
			if !rooms[rc.Room] {
				x.errs.add(c.Line, fmt.Sprintf("class %s may use room %s, which is not given; correct the room", strconv.Quote(clip(c.ID)), strconv.Quote(clip(rc.Room))))
			}
		}
		if c.NoRoom && len(c.Rooms) > 0 {
			x.errs.add(c.Line, fmt.Sprintf("class %s takes no room but lists rooms; remove one or the other", strconv.Quote(clip(c.ID))))
		}
	}
	x.checkStudents()
	for _, d := range in.Distributions {
		for _, id := range d.Classes {
			if !classes[id] {
				x.errs.add(d.Line, fmt.Sprintf("a constraint names class %s, which is not given; correct the class", strconv.Quote(clip(id))))
			}
		}
	}
}

// checkStudents checks that every student is given once and wants only
// courses that are given, each once.
func (x *xmlReader) checkStudents() {
	courses := map[string]bool{}
	for _, c := range x.in.Courses {
		courses[c.ID] = true
	}
	students := map[string]bool{}
	for _, st := range x.in.Students {
		if students[st.ID] {
			x.errs.add(st.Line, fmt.Sprintf("student %s is given twice; give each student once", strconv.Quote(clip(st.ID))))
		}
		students[st.ID] = true
		wants := map[string]bool{}
		for _, c := range st.Courses {
			switch {
			case !courses[c]:
				x.errs.add(st.Line, fmt.Sprintf("student %s wants course %s, which is not given; correct the course", strconv.Quote(clip(st.ID)), strconv.Quote(clip(c))))
			case wants[c]:
				x.errs.add(st.Line, fmt.Sprintf("student %s wants course %s twice; give it once", strconv.Quote(clip(st.ID)), strconv.Quote(clip(c))))
			}
			wants[c] = true
		}
	}
}
