package benchfmt

import (
	"bufio"
	"fmt"
	"io"
	"strconv"
	"strings"
	"time"
	"unicode"
	"unicode/utf8"

	"github.com/termwright/termwright/timetable"
)

// The .ctt format is the instance format of the curriculum-based course
// timetabling track of the Second International Timetabling Competition
// (Di Gaspero, McCollum, Schaerf 2007, technical report
// QUB/IEEE/Tech/ITC2007/CurriculumCTT/v1.0): a header of "Key: value" lines
// (Name, Courses, Rooms, Days, Periods_per_day, Curricula, Constraints), then
// the sections COURSES: (id teacher meetings min_working_days students),
// ROOMS: (id capacity), CURRICULA: (id n course1 .. course_n) and
// UNAVAILABILITY_CONSTRAINTS: (course day period, both 0-based), then END.

// The header keys of a .ctt file, in file order.
var cttHeaderKeys = []string{"Name", "Courses", "Rooms", "Days", "Periods_per_day", "Curricula", "Constraints"}

// The section headers of a .ctt file, in file order.
const (
	cttCourses   = "COURSES:"
	cttRooms     = "ROOMS:"
	cttCurricula = "CURRICULA:"
	cttUnavail   = "UNAVAILABILITY_CONSTRAINTS:"
	cttEnd       = "END."
)

// ITC grid mapping: day 0 is Monday; slot 0 starts at cttFirstStart and
// slots of one day touch, so that the competition's "adjacent periods" are
// exactly Term.Consecutive.
const (
	cttFirstStart = timetable.Clock(8 * 60) // 08:00
	cttMaxDays    = 7
	cttMaxSlots   = 96 // slots of 10 minutes from 08:00 still end by midnight
)

// cttFirstDay is the first day of the nominal one-week term that ReadCTT
// gives an instance (the format has no dates): a Monday.
var cttFirstDay = time.Date(2024, time.January, 1, 0, 0, 0, 0, time.UTC)

// cttSlotLength is the length in minutes of one period of a day with
// perDay periods: an hour when they fit between 08:00 and midnight,
// otherwise the 16 hours shared equally.
func cttSlotLength(perDay int) timetable.Clock {
	if perDay <= 16 {
		return 60
	}
	return timetable.Clock(16 * 60 / perDay)
}

// ITC criterion weights of the competition's cost (Di Gaspero, McCollum,
// Schaerf 2007, section on soft constraints): room capacity 1 per student
// over, minimum working days 5 per missing day, curriculum compactness 2
// per isolated meeting, room stability 1 per extra room.
const (
	ITCWeightRoomCapacity   = 1
	ITCWeightMinWorkingDays = 5
	ITCWeightCompactness    = 2
	ITCWeightRoomStability  = 1
)

// CTTLevel is the one priority level at which ReadCTT sets every weight.
const CTTLevel = 1

// cttLine is one record line split into fields.
type cttLine struct {
	line   int
	fields []string
	cols   []int // 1-based column of each field; nil for header values
}

// col is the column of field i, or 0 when unknown.
func (l cttLine) col(i int) int {
	if i < len(l.cols) {
		return l.cols[i]
	}
	return 0
}

// cttFile is a .ctt file as read, before its records are resolved.
type cttFile struct {
	header    map[string]cttLine // key -> the line and its one value field
	sectionAt map[string]int     // section header -> line
	records   map[string][]cttLine
	endLine   int
}

// ReadCTT reads an instance in the ITC-2007 curriculum-based course
// timetabling format (.ctt) into a Term; name (usually the file name) is used
// in error messages and as the Src sheet of every record. On bad input it
// returns Errors naming every problem as "name:LINE: what is wrong".
//
// The mapping: a nominal one-week term from Monday 2024-01-01 (the format
// has no dates); Days × Periods_per_day one-hour periods from 08:00, Monday
// first, touching within a day; each course becomes a Section with its
// teacher as sole Staff, the curricula containing it as Cohorts, Size =
// students, Meetings = the course's count, Length 1, SameDay and MinDays =
// min_working_days; each unavailability line becomes a hard WhoSection row
// covering exactly that period; capacity is soft (SoftCapacity) and Weights
// set every criterion: room over capacity 1, spread days 5, cohort isolated
// 2, room stability 1, all others 0, all at level CTTLevel.
func ReadCTT(r io.Reader, name string) (*timetable.Term, error) {
	errs := &errList{file: name}
	f := scanCTT(r, errs)
	if err := errs.err(); err != nil {
		return nil, err
	}
	t := buildCTT(f, name, errs)
	if err := errs.err(); err != nil {
		return nil, err
	}
	return t, nil
}

// scanCTT splits the file into header values and section records, checking
// the layout but not the records' contents.
func scanCTT(r io.Reader, errs *errList) *cttFile {
	f := &cttFile{header: map[string]cttLine{}, sectionAt: map[string]int{}, records: map[string][]cttLine{}}
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 0, 64*1024), 1<<20)
	section := ""
	n := 0
	for sc.Scan() {
		n++
		text := strings.TrimSpace(sc.Text())
		if text == "" {
			continue
		}
		if f.endLine > 0 {
			errs.add(n, fmt.Sprintf("text after END. (line %d); remove it or check the file was not joined to another", f.endLine))
			break
		}
		if sec, ok := cttSectionHeader(text); ok {
			if prev, dup := f.sectionAt[sec]; dup {
				errs.add(n, fmt.Sprintf("section %s appears again (first on line %d); keep one", sec, prev))
				continue
			}
			if sec == cttEnd {
				f.endLine = n
				continue
			}
			f.sectionAt[sec] = n
			section = sec
			continue
		}
		if section == "" {
			scanCTTHeader(f, n, text, errs)
			continue
		}
		f.records[section] = append(f.records[section], cttLine{line: n, fields: strings.Fields(text), cols: fieldCols(text)})
	}
	if err := sc.Err(); err != nil {
		errs.add(n+1, "cannot read the line: "+err.Error()+"; lines of a .ctt file are short, so check this is the right file")
		return f
	}
	if f.endLine == 0 {
		errs.add(n, "the file ends without the END. line; the file may be cut short, so fetch it again")
	}
	return f
}

// cttSectionHeader recognises a section header line.
func cttSectionHeader(text string) (string, bool) {
	switch text {
	case cttCourses, cttRooms, cttCurricula, cttUnavail, cttEnd:
		return text, true
	}
	return "", false
}

// scanCTTHeader reads one "Key: value" line of the header.
func scanCTTHeader(f *cttFile, n int, text string, errs *errList) {
	key, val, ok := strings.Cut(text, ":")
	key, val = strings.TrimSpace(key), strings.TrimSpace(val)
	if !ok {
		errs.add(n, fmt.Sprintf("expected a header line \"Key: value\" or a section such as COURSES:, found %q", clip(text)))
		return
	}
	canon := ""
	for _, k := range cttHeaderKeys {
		if strings.EqualFold(k, key) {
			canon = k
		}
	}
	if canon == "" {
		if strings.HasSuffix(text, ":") && strings.ToUpper(text) == text {
			errs.add(n, fmt.Sprintf("section %s is not part of the ITC-2007 curriculum-based format (extended formulations are not read); remove it", clip(text)))
			return
		}
		errs.add(n, fmt.Sprintf("unknown header key %q; the header has %s", clip(key), strings.Join(cttHeaderKeys, ", ")))
		return
	}
	if prev, dup := f.header[canon]; dup {
		errs.add(n, fmt.Sprintf("header key %s appears again (first on line %d); keep one", canon, prev.line))
		return
	}
	if val == "" {
		errs.add(n, fmt.Sprintf("header key %s has no value; write \"%s: value\"", canon, canon))
		return
	}
	f.header[canon] = cttLine{line: n, fields: []string{val}}
}

// clip shortens text quoted in an error message as timetable.Quote does:
// more than 60 characters keep their first 40, followed by "…".
func clip(s string) string {
	if utf8.RuneCountInString(s) <= 60 {
		return s
	}
	i := 0
	for k := 0; k < 40; k++ {
		_, w := utf8.DecodeRuneInString(s[i:])
		i += w
	}
	return s[:i] + "…"
}

// maxITCNumber bounds every number of a benchmark file (students, capacities,
// counts, days, periods, costs): the published instances stay far below
// it, and with it no cost sum can overflow.
const maxITCNumber = 1_000_000 // the workbook reader's bound on sizes and capacities

// cttInt parses a whole number field from min to maxITCNumber at line and
// col (0 when unknown), reporting problems.
func cttInt(errs *errList, line, col int, what, s string, min int) (int, bool) {
	v, err := strconv.Atoi(s)
	if err != nil && !isDigitRun(s) {
		errs.addAt(line, col, fmt.Sprintf("%s %q is not a whole number; write digits only", what, clip(s)))
		return 0, false
	}
	if err != nil || v < min || v > maxITCNumber {
		errs.addAt(line, col, fmt.Sprintf("%s is %s; it must be from %d to %d", what, clip(s), min, maxITCNumber))
		return 0, false
	}
	return v, true
}

// isDigitRun reports whether s is an optionally signed run of digits.
func isDigitRun(s string) bool {
	s = strings.TrimPrefix(strings.TrimPrefix(s, "-"), "+")
	return s != "" && strings.Trim(s, "0123456789") == ""
}

// fieldCols gives the 1-based column (in characters) of each field of
// text, as strings.Fields splits it.
func fieldCols(text string) []int {
	var cols []int
	col, in := 0, false
	for _, r := range text {
		col++
		space := unicode.IsSpace(r)
		if !space && !in {
			cols = append(cols, col)
		}
		in = !space
	}
	return cols
}

// cttHeader holds the header's numbers.
type cttHeader struct {
	name                                                 string
	courses, rooms, days, perDay, curricula, constraints int
	daysLine                                             int
}

// readCTTHeader checks the header values.
func readCTTHeader(f *cttFile, errs *errList) (cttHeader, bool) {
	var h cttHeader
	ok := true
	firstLine := 1
	if l, has := f.sectionAt[cttCourses]; has {
		firstLine = l
	}
	for _, k := range cttHeaderKeys {
		if _, has := f.header[k]; !has {
			errs.add(firstLine, fmt.Sprintf("the header has no %s line; add \"%s: ...\" before COURSES:", k, k))
			ok = false
		}
	}
	if !ok {
		return h, false
	}
	h.name = f.header["Name"].fields[0]
	num := func(key string, min, max int) int {
		l := f.header[key]
		v, good := cttInt(errs, l.line, 0, key, l.fields[0], min)
		if good && v > max {
			errs.add(l.line, fmt.Sprintf("%s is %d; at most %d is supported", key, v, max))
			good = false
		}
		ok = ok && good
		return v
	}
	const big = 1 << 20
	h.courses = num("Courses", 0, big)
	h.rooms = num("Rooms", 0, big)
	h.days = num("Days", 1, cttMaxDays)
	h.perDay = num("Periods_per_day", 1, cttMaxSlots)
	h.curricula = num("Curricula", 0, big)
	h.constraints = num("Constraints", 0, big)
	h.daysLine = f.header["Days"].line
	return h, ok
}

// buildCTT resolves the records into a Term.
func buildCTT(f *cttFile, name string, errs *errList) *timetable.Term {
	h, ok := readCTTHeader(f, errs)
	for _, sec := range []string{cttCourses, cttRooms, cttCurricula, cttUnavail} {
		if _, has := f.sectionAt[sec]; !has {
			errs.add(f.endLine, fmt.Sprintf("section %s is missing; add it (it may be empty) before END.", sec))
			ok = false
		}
	}
	if !ok {
		return nil
	}
	t := &timetable.Term{Name: h.name, TimeZone: "UTC", SoftCapacity: true, FirstDay: cttFirstDay, LastDay: cttFirstDay.AddDate(0, 0, h.days-1)}
	t.Periods = cttPeriods(h, name)
	checkCTTCount(f, errs, cttCourses, "Courses", h.courses)
	checkCTTCount(f, errs, cttRooms, "Rooms", h.rooms)
	checkCTTCount(f, errs, cttCurricula, "Curricula", h.curricula)
	checkCTTCount(f, errs, cttUnavail, "Constraints", h.constraints)
	courses := cttSections(t, f.records[cttCourses], name, errs)
	cttRoomList(t, f.records[cttRooms], name, errs)
	cttCohorts(t, f.records[cttCurricula], courses, name, errs)
	cttUnavailable(t, f.records[cttUnavail], courses, h, name, errs)
	t.Weights = CTTWeights()
	weeks := t.AllWeeks()
	for i := range t.Sections {
		t.Sections[i].Weeks = weeks
	}
	return t
}

// CTTWeights is the Weights map that makes Cost the competition's cost: a
// weight for every criterion in Criteria, all at level CTTLevel.
func CTTWeights() map[string]timetable.Weight {
	w := make(map[string]timetable.Weight, len(timetable.Criteria))
	for _, c := range timetable.Criteria {
		w[c.Name] = timetable.Weight{Level: CTTLevel}
	}
	w[timetable.CritOverCapacity] = timetable.Weight{Weight: ITCWeightRoomCapacity, Level: CTTLevel}
	w[timetable.CritSpreadDays] = timetable.Weight{Weight: ITCWeightMinWorkingDays, Level: CTTLevel}
	w[timetable.CritCohortIsolated] = timetable.Weight{Weight: ITCWeightCompactness, Level: CTTLevel}
	w[timetable.CritRoomStability] = timetable.Weight{Weight: ITCWeightRoomStability, Level: CTTLevel}
	return w
}

// cttPeriods makes the grid: days from Monday, slots touching.
func cttPeriods(h cttHeader, name string) []timetable.Period {
	length := cttSlotLength(h.perDay)
	out := make([]timetable.Period, 0, h.days*h.perDay)
	for d := 0; d < h.days; d++ {
		day := time.Weekday((int(time.Monday) + d) % 7)
		for s := 0; s < h.perDay; s++ {
			start := cttFirstStart + timetable.Clock(s)*length
			out = append(out, timetable.Period{Index: len(out), Day: day, Start: start, End: start + length, Src: timetable.Source{Sheet: name, Row: h.daysLine}})
		}
	}
	return out
}

// checkCTTCount compares a section's number of lines with its header count.
func checkCTTCount(f *cttFile, errs *errList, sec, key string, want int) {
	if got := len(f.records[sec]); got != want {
		errs.add(f.sectionAt[sec], fmt.Sprintf("section %s has %d lines but the header says %s: %d (line %d); correct whichever is wrong",
			sec, got, key, want, f.header[key].line))
	}
}

// cttSections reads the COURSES lines into sections and staff; it returns
// the course index by ID.
func cttSections(t *timetable.Term, recs []cttLine, name string, errs *errList) map[string]int {
	index := map[string]int{} // -1 for a course named on a line that had errors
	lineOf := map[string]int{}
	staffAt := map[string]bool{}
	for _, r := range recs {
		if len(r.fields) != 5 {
			errs.add(r.line, fmt.Sprintf("a course line has 5 fields (course teacher meetings min_working_days students), found %d", len(r.fields)))
			if _, dup := index[r.fields[0]]; !dup {
				index[r.fields[0]], lineOf[r.fields[0]] = -1, r.line
			}
			continue
		}
		id, teacher := r.fields[0], r.fields[1]
		meetings, ok1 := cttInt(errs, r.line, r.col(2), "meetings of course "+clip(id), r.fields[2], 1)
		minDays, ok2 := cttInt(errs, r.line, r.col(3), "min_working_days of course "+clip(id), r.fields[3], 0)
		students, ok3 := cttInt(errs, r.line, r.col(4), "students of course "+clip(id), r.fields[4], 0)
		if _, dup := index[id]; dup {
			errs.add(r.line, fmt.Sprintf("course %q is already defined on line %d; course IDs must be unique", clip(id), lineOf[id]))
			continue
		}
		lineOf[id] = r.line
		if !ok1 || !ok2 || !ok3 {
			index[id] = -1 // named, but already reported as wrong
			continue
		}
		index[id] = len(t.Sections)
		t.Sections = append(t.Sections, timetable.Section{
			ID: id, Title: id, Staff: []string{teacher}, Size: students,
			Meetings: meetings, Length: 1, SameDay: true, MinDays: minDays,
			Src: timetable.Source{Sheet: name, Row: r.line},
		})
		if !staffAt[teacher] {
			staffAt[teacher] = true
			t.Staff = append(t.Staff, timetable.Staff{ID: teacher, Name: teacher, Src: timetable.Source{Sheet: name, Row: r.line}})
		}
	}
	return index
}

// cttRoomList reads the ROOMS lines.
func cttRoomList(t *timetable.Term, recs []cttLine, name string, errs *errList) {
	seen := map[string]int{}
	for _, r := range recs {
		if len(r.fields) != 2 {
			errs.add(r.line, fmt.Sprintf("a room line has 2 fields (room capacity), found %d", len(r.fields)))
			continue
		}
		id := r.fields[0]
		capacity, ok := cttInt(errs, r.line, r.col(1), "capacity of room "+clip(id), r.fields[1], 0)
		if prev, dup := seen[id]; dup {
			errs.add(r.line, fmt.Sprintf("room %q is already defined on line %d; room IDs must be unique", clip(id), prev))
			continue
		}
		if !ok {
			continue
		}
		seen[id] = r.line
		t.Rooms = append(t.Rooms, timetable.Room{ID: id, Capacity: capacity, Src: timetable.Source{Sheet: name, Row: r.line}})
	}
}

// cttCohorts reads the CURRICULA lines into cohorts and section membership.
func cttCohorts(t *timetable.Term, recs []cttLine, courses map[string]int, name string, errs *errList) {
	seen := map[string]int{}
	for _, r := range recs {
		if len(r.fields) < 2 {
			errs.add(r.line, fmt.Sprintf("a curriculum line has the curriculum, the number of courses and the courses; found %d fields", len(r.fields)))
			continue
		}
		id := r.fields[0]
		n, ok := cttInt(errs, r.line, r.col(1), "number of courses of curriculum "+clip(id), r.fields[1], 0)
		if ok && n != len(r.fields)-2 {
			errs.add(r.line, fmt.Sprintf("curriculum %q says it has %d courses but lists %d; correct the count or the list", clip(id), n, len(r.fields)-2))
			ok = false
		}
		if prev, dup := seen[id]; dup {
			errs.add(r.line, fmt.Sprintf("curriculum %q is already defined on line %d; curriculum IDs must be unique", clip(id), prev))
			continue
		}
		listed := map[string]bool{}
		var members []int
		for _, c := range r.fields[2:] {
			i, known := courses[c]
			switch {
			case listed[c]:
				errs.add(r.line, fmt.Sprintf("curriculum %q lists course %q twice; list it once", clip(id), clip(c)))
				ok = false
			case !known:
				errs.add(r.line, fmt.Sprintf("curriculum %q lists course %q, which is not in COURSES; add the course or correct the name", clip(id), clip(c)))
				ok = false
			case i >= 0:
				members = append(members, i)
			}
			listed[c] = true
		}
		if !ok {
			continue
		}
		seen[id] = r.line
		t.Cohorts = append(t.Cohorts, timetable.Cohort{ID: id, Name: id, Src: timetable.Source{Sheet: name, Row: r.line}})
		for _, i := range members {
			t.Sections[i].Cohorts = append(t.Sections[i].Cohorts, id)
		}
	}
}

// cttUnavailable reads the UNAVAILABILITY_CONSTRAINTS lines into hard rows.
func cttUnavailable(t *timetable.Term, recs []cttLine, courses map[string]int, h cttHeader, name string, errs *errList) {
	for _, r := range recs {
		if len(r.fields) != 3 {
			errs.add(r.line, fmt.Sprintf("an unavailability line has 3 fields (course day period), found %d", len(r.fields)))
			continue
		}
		c := r.fields[0]
		day, ok1 := cttInt(errs, r.line, r.col(1), "day", r.fields[1], 0)
		slot, ok2 := cttInt(errs, r.line, r.col(2), "period", r.fields[2], 0)
		if ok1 && day >= h.days {
			errs.add(r.line, fmt.Sprintf("day %d is outside the week: days are numbered 0 to %d (Days: %d)", day, h.days-1, h.days))
			ok1 = false
		}
		if ok2 && slot >= h.perDay {
			errs.add(r.line, fmt.Sprintf("period %d is outside the day: periods are numbered 0 to %d (Periods_per_day: %d)", slot, h.perDay-1, h.perDay))
			ok2 = false
		}
		if _, known := courses[c]; !known {
			errs.add(r.line, fmt.Sprintf("course %q is not in COURSES; add the course or correct the name", clip(c)))
			continue
		}
		if !ok1 || !ok2 {
			continue
		}
		p := t.Periods[day*h.perDay+slot]
		t.Unavailable = append(t.Unavailable, timetable.Unavailability{
			Who: c, Kind: timetable.WhoSection, Day: p.Day, From: p.Start, To: p.End, Hard: true,
			Reason: "unavailable in the benchmark instance", Src: timetable.Source{Sheet: name, Row: r.line},
		})
	}
}
