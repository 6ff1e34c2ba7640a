package timetable

import (
	"sort"
	"strings"
	"time"
)

// Bounds on numbers in cells, generous but small enough that counting
// arguments cannot overflow.
const (
	maxCount    = 1_000_000 // sizes, capacities
	maxMeetings = 100       // meetings per week, periods per meeting
	maxWeight   = 1_000_000_000
)

// termReader decodes matched tables into a Term, collecting problems.
type termReader struct {
	t        *Term
	ps       Problems
	lay      *layout
	date1904 bool              // the workbook uses the 1904 date base system
	tabs     map[string]*table // canonical sheet name -> table
	secIdx   map[string]int    // section ID -> position, once Sections is read
}

// buildTerm turns the raw sheets of a workbook or CSV folder into a Term and
// every problem found in it, validated and sorted.
func buildTerm(sheets []*rawSheet, date1904 bool, cfg *loadConfig) (*Term, Problems) {
	r := &termReader{t: &Term{}, lay: newLayout(), date1904: date1904, tabs: map[string]*table{}}
	r.match(sheets, cfg)
	r.readTerm()
	r.readPeriods()
	r.readRooms()
	r.readStaff()
	r.readCohorts()
	r.readSections()
	r.secIdx = r.t.SectionIndex()
	r.readMeetingTimes()
	r.readRoomChoices()
	r.checkPatternColumns()
	r.requirePeriods()
	r.readTravel()
	r.readEnrolments()
	r.readRequests()
	r.readUnavailable()
	r.readRelations()
	r.readWeights()
	r.ps = append(r.ps, validate(r.t, r.lay)...)
	r.ps.Sort()
	return r.t, r.ps
}

// match pairs sheets with specs and reports missing, repeated and unknown
// sheets. The Columns sheet is read first, so that its renames (with those
// of cfg) apply to the headers of the other sheets.
func (r *termReader) match(sheets []*rawSheet, cfg *loadConfig) {
	var specs []*sheetSpec
	for _, s := range sheets {
		spec := specFor(s.name)
		specs = append(specs, spec)
		if spec != nil && spec.name == shColumns && r.tabs[shColumns] == nil {
			r.addTable(s, spec, nil)
		}
	}
	var renames ColumnMap
	if t := r.tabs[shColumns]; t != nil {
		renames = readColumnRows(t)
	}
	if cfg != nil {
		renames = append(renames, cfg.columns...)
	}
	ren := checkColumns(renames, &r.ps)
	for i, s := range sheets {
		spec := specs[i]
		if spec == nil && normWords(s.name) == normWords(shLists) {
			continue // the template's hidden list of drop-down values
		}
		if spec == nil {
			r.ps.warnf(Position{Sheet: s.name}, "sheet %q is not part of the term workbook and is ignored — the sheets are %s", s.name, quoteList(specNames()))
			continue
		}
		if prev, dup := r.tabs[spec.name]; dup {
			if prev.sheet != s.name || spec.name != shColumns {
				r.ps.warnf(Position{Sheet: s.name}, "sheet %q repeats sheet %q and is ignored — merge them into one", s.name, prev.sheet)
			}
			continue
		}
		r.addTable(s, spec, ren[spec.name])
	}
	r.reportRenames(ren)
	for _, spec := range sheetSpecs {
		if _, ok := r.tabs[spec.name]; !ok && spec.required {
			r.ps.errorf(Position{Sheet: spec.name}, "the workbook has no %s sheet — add a sheet named %q with the headers %s", spec.name, spec.name, quoteList(spec.cols))
		}
	}
}

// addTable matches a raw sheet to its spec and records it.
func (r *termReader) addTable(s *rawSheet, spec *sheetSpec, ren map[string]*ColumnRename) {
	t := newTable(s, spec, &r.ps, ren)
	r.tabs[spec.name] = t
	r.lay.addTable(t)
}

// reportRenames records the renames applied, in workbook order, on the
// Term, and warns about renames whose column no sheet has.
func (r *termReader) reportRenames(ren map[string]map[string]*ColumnRename) {
	used := map[*ColumnRename]bool{}
	for _, spec := range sheetSpecs {
		if t := r.tabs[spec.name]; t != nil {
			r.t.Columns = append(r.t.Columns, t.renamed...)
			for _, rn := range t.renamedCol {
				used[rn] = true
			}
		}
	}
	var unused []*ColumnRename
	for sheet, m := range ren {
		if r.tabs[sheet] == nil {
			continue // the missing sheet is reported (or optional)
		}
		for _, rn := range m {
			if !used[rn] {
				unused = append(unused, rn)
			}
		}
	}
	sort.Slice(unused, func(i, j int) bool {
		a, b := unused[i], unused[j]
		if a.Src.Row != b.Src.Row {
			return a.Src.Row < b.Src.Row
		}
		return a.Sheet+"\x00"+a.From < b.Sheet+"\x00"+b.From
	})
	for _, rn := range unused {
		r.ps.warnf(rn.at(rn.fromCol), "%sthe %s sheet has no column %q, so this rename is not used — correct the header or delete the row", rn.prefix(), rn.Sheet, rn.From)
	}
}

func specNames() []string {
	out := make([]string, len(sheetSpecs))
	for i, s := range sheetSpecs {
		out[i] = s.name
	}
	return out
}

// rows calls fn for every data row of a sheet (nothing when it is absent).
func (r *termReader) rows(sheet string, fn func(t *table, row tableRow)) {
	t := r.tabs[sheet]
	if t == nil {
		return
	}
	for _, row := range t.rows {
		fn(t, row)
	}
}

// whole reads an optional whole number; blank gives def.
func (r *termReader) whole(t *table, row tableRow, header string, lo, hi, def int) int {
	s := t.get(row, header)
	if s == "" {
		return def
	}
	n, err := parseWhole(s, lo, hi)
	if err != nil {
		r.ps.errorf(t.pos(row, header), "%s %v", header, err)
		return def
	}
	return n
}

// id reads a required ID; blank gives "" and an error.
func (r *termReader) id(t *table, row tableRow, header, what string) string {
	s := t.get(row, header)
	if s == "" {
		r.ps.errorf(t.pos(row, header), "%s is blank — give the %s an ID or delete the row", header, what)
	}
	return s
}

// clock reads a time; blank gives def.
func (r *termReader) clock(t *table, row tableRow, header string, def Clock, required bool) (Clock, bool) {
	s := t.get(row, header)
	if s == "" && !required {
		return def, true
	}
	c, err := ParseClock(s)
	if err != nil {
		if s == "" {
			r.ps.errorf(t.pos(row, header), "%s is blank — write a time such as 09:00", header)
		} else {
			r.ps.errorf(t.pos(row, header), "%s %v", header, err)
		}
		return def, false
	}
	return c, true
}

// day reads a required day name.
func (r *termReader) day(t *table, row tableRow, header string) (time.Weekday, bool) {
	s := t.get(row, header)
	d, ok := ParseDay(s)
	if !ok {
		if s == "" {
			r.ps.errorf(t.pos(row, header), "%s is blank — write a day, Mon to Sun", header)
		} else {
			r.ps.errorf(t.pos(row, header), "%s %q is not a day — write Mon, Tue, Wed, Thu, Fri, Sat or Sun", header, s)
		}
	}
	return d, ok
}

func rowSource(t *table, row tableRow) Source { return Source{Sheet: t.sheet, Row: row.num} }

func (r *termReader) readTerm() {
	t := r.tabs[shTerm]
	if t == nil {
		return
	}
	r.t.TimeZone = "UTC"
	seen := map[string]int{}
	for _, row := range t.rows {
		key, val := normHeader(t.get(row, "Key")), t.get(row, "Value")
		vpos := t.pos(row, "Value")
		if key != "holiday" && key != "holidays" {
			if first, dup := seen[key]; dup {
				r.ps.errorf(t.pos(row, "Key"), "key %q appears again (first in row %d) — keep one of the two rows", t.get(row, "Key"), first)
				continue
			}
			seen[key] = row.num
		}
		switch key {
		case "name":
			r.t.Name = val
			r.lay.termKey["name"] = vpos
		case "first day", "last day":
			r.lay.termKey[key] = vpos
			if val == "" {
				continue // Validate reports the missing date at this cell
			}
			d, err := parseDate(val, r.date1904)
			if err != nil {
				r.ps.errorf(vpos, "%s %v", t.get(row, "Key"), err)
				continue
			}
			if key == "first day" {
				r.t.FirstDay = d
			} else {
				r.t.LastDay = d
			}
		case "time zone":
			r.lay.termKey[key] = vpos
			if val != "" {
				r.t.TimeZone = val
			}
		case "holiday", "holidays":
			for _, item := range splitList(val) {
				d, err := parseDate(item, r.date1904)
				if err != nil {
					r.ps.errorf(vpos, "holiday %v", err)
					continue
				}
				r.t.Holidays = append(r.t.Holidays, d)
				r.lay.holidays = append(r.lay.holidays, vpos)
			}
		case "":
			r.ps.errorf(t.pos(row, "Key"), "Key is blank — write Name, First day, Last day, Time zone or Holiday")
		default:
			r.ps.warnf(t.pos(row, "Key"), "key %q is not known and is ignored — the keys are Name, First day, Last day, Time zone and Holiday", t.get(row, "Key"))
		}
	}
}

func (r *termReader) readPeriods() {
	r.rows(shPeriods, func(t *table, row tableRow) {
		d, okD := r.day(t, row, "Day")
		s, okS := r.clock(t, row, "Start", 0, true)
		e, okE := r.clock(t, row, "End", 0, true)
		if okD && okS && okE {
			r.t.Periods = append(r.t.Periods, Period{Day: d, Start: s, End: e, Src: rowSource(t, row)})
		}
	})
	sortPeriods(r.t.Periods)
}

// sortPeriods orders periods by day (Monday first), start and end, and
// numbers them.
func sortPeriods(ps []Period) {
	sort.SliceStable(ps, func(i, j int) bool {
		a, b := ps[i], ps[j]
		if WeekOrder(a.Day) != WeekOrder(b.Day) {
			return WeekOrder(a.Day) < WeekOrder(b.Day)
		}
		if a.Start != b.Start {
			return a.Start < b.Start
		}
		return a.End < b.End
	})
	for i := range ps {
		ps[i].Index = i
	}
}

// lowerList splits a list cell and lower-cases its items.
func lowerList(s string) []string {
	l := splitList(s)
	for i := range l {
		l[i] = strings.ToLower(l[i])
	}
	return l
}

func (r *termReader) readRooms() {
	r.rows(shRooms, func(t *table, row tableRow) {
		rm := Room{
			ID:       r.id(t, row, "Room", "room"),
			Features: lowerList(t.get(row, "Features")),
			Building: t.get(row, "Building"),
			Src:      rowSource(t, row),
		}
		if t.get(row, "Capacity") == "" {
			r.ps.errorf(t.pos(row, "Capacity"), "Capacity is blank — write the number of seats (not above the posted legal occupancy)")
		} else {
			rm.Capacity = r.whole(t, row, "Capacity", 1, maxCount, 0)
		}
		r.t.Rooms = append(r.t.Rooms, rm)
	})
}

func (r *termReader) readStaff() {
	r.rows(shStaff, func(t *table, row tableRow) {
		r.t.Staff = append(r.t.Staff, Staff{
			ID:             r.id(t, row, "Staff ID", "staff member"),
			Name:           t.get(row, "Name"),
			Email:          t.get(row, "Email"),
			MaxPerDay:      r.whole(t, row, "Max periods per day", 1, 1000, 0),
			MaxConsecutive: r.whole(t, row, "Max consecutive periods", 1, 1000, 0),
			MaxWeekPeriods: r.whole(t, row, "Max periods per week", 1, 10_000, 0),
			MaxWeekMinutes: r.whole(t, row, "Max minutes per week", 1, 7*24*60, 0),
			MaxWeekDays:    r.whole(t, row, "Max days per week", 1, 7, 0),
			Lunch:          r.lunch(t, row),
			Src:            rowSource(t, row),
		})
	})
}

func (r *termReader) readCohorts() {
	r.rows(shCohorts, func(t *table, row tableRow) {
		r.t.Cohorts = append(r.t.Cohorts, Cohort{
			ID:    r.id(t, row, "Cohort", "cohort"),
			Name:  t.get(row, "Name"),
			Size:  r.whole(t, row, "Size", 0, maxCount, 0),
			Lunch: r.lunch(t, row),
			Src:   rowSource(t, row),
		})
	})
}

func (r *termReader) readSections() {
	all := r.t.AllWeeks()
	r.rows(shSections, func(t *table, row tableRow) {
		s := Section{
			ID:       r.id(t, row, "Section", "section"),
			Title:    t.get(row, "Title"),
			Staff:    splitList(t.get(row, "Staff")),
			Cohorts:  splitList(t.get(row, "Cohorts")),
			Size:     r.whole(t, row, "Expected size", 0, maxCount, 0),
			Meetings: r.whole(t, row, "Meetings per week", 1, maxMeetings, 1),
			Length:   r.whole(t, row, "Periods per meeting", 1, maxMeetings, 1),
			Src:      rowSource(t, row),
		}
		for _, n := range lowerList(t.get(row, "Needs")) {
			if normWords(n) == noRoomMarker {
				s.NoRoom = true
			} else {
				s.Needs = append(s.Needs, n)
			}
		}
		for _, n := range splitList(t.get(row, "Rooms")) {
			if normWords(n) == noRoomMarker {
				s.NoRoom = true
			} else {
				s.Rooms = append(s.Rooms, n)
			}
		}
		for _, f := range splitList(t.get(row, "Fixed")) {
			fx, err := parseFixed(f)
			if err != nil {
				r.ps.errorf(t.pos(row, "Fixed"), "Fixed %v", err)
				continue
			}
			s.Fixed = append(s.Fixed, fx)
		}
		w, err := parseWeeks(t.get(row, "Weeks"), all)
		if err != nil {
			r.ps.errorf(t.pos(row, "Weeks"), "Weeks %v", err)
			w = all
		}
		s.Weeks = w
		if t.get(row, "Min days") != "" {
			s.SameDay = true
			s.MinDays = r.whole(t, row, "Min days", 0, 7, 0)
		}
		r.readCourseCells(t, row, &s)
		r.t.Sections = append(r.t.Sections, s)
	})
}

func (r *termReader) readEnrolments() {
	r.rows(shEnrolments, func(t *table, row tableRow) {
		r.t.Enrolments = append(r.t.Enrolments, Enrolment{
			Student: r.id(t, row, "Student", "student"),
			Section: r.id(t, row, "Section", "enrolment's section"),
			Src:     rowSource(t, row),
		})
	})
}

func (r *termReader) readUnavailable() {
	r.rows(shUnavailable, func(t *table, row tableRow) {
		u := Unavailability{Who: r.id(t, row, "Who", "unavailability's staff, room, cohort or section"), Reason: t.get(row, "Reason"), Src: rowSource(t, row)}
		d, okD := r.day(t, row, "Day")
		from, okF := r.clock(t, row, "From", 0, false)
		to, okT := r.clock(t, row, "To", 24*60, false)
		hard, w, err := parseStrength(t.get(row, "Strength"))
		if err != nil {
			r.ps.errorf(t.pos(row, "Strength"), "Strength %v", err)
		}
		if ws := t.get(row, "Weeks"); ws != "" {
			weeks, werr := parseWeeks(ws, r.t.AllWeeks())
			if werr != nil {
				r.ps.errorf(t.pos(row, "Weeks"), "Weeks %v", werr)
				return
			}
			u.Weeks = weeks
		}
		if !okD || !okF || !okT || err != nil {
			return
		}
		u.Day, u.From, u.To, u.Hard, u.Weight = d, from, to, hard, w
		r.t.Unavailable = append(r.t.Unavailable, u)
	})
	r.resolveWho()
}

// resolveWho sets the Kind of each unavailability by looking its ID up among
// staff, rooms, cohorts and sections, in that order; a name found in more
// than one place gets a warning. Unknown names keep Kind 0 for Validate.
func (r *termReader) resolveWho() {
	idx := []struct {
		kind WhoKind
		m    map[string]int
	}{{WhoStaff, r.t.StaffIndex()}, {WhoRoom, r.t.RoomIndex()}, {WhoCohort, r.t.CohortIndex()}, {WhoSection, r.t.SectionIndex()}}
	for i := range r.t.Unavailable {
		u := &r.t.Unavailable[i]
		var kinds []string
		for _, x := range idx {
			if _, ok := x.m[u.Who]; ok {
				if u.Kind == 0 {
					u.Kind = x.kind
				}
				kinds = append(kinds, x.kind.String())
			}
		}
		if len(kinds) > 1 {
			r.ps.warnf(r.lay.at(u.Src, "Who"), "%q is both a %s — it is taken as the %s; rename one of them to be sure", u.Who, strings.Join(kinds, " and a "), kinds[0])
		}
	}
}

func (r *termReader) readRelations() {
	r.rows(shRelations, func(t *table, row tableRow) {
		kindText := t.get(row, "Kind")
		var kind RelationKind
		if i := pickChoice(relationChoices, kindText); i >= 0 {
			kind = RelationKinds[i].Kind
		}
		if kind == 0 {
			r.ps.errorf(t.pos(row, "Kind"), "Kind %q is not a relation — choose one from the Kind drop-down list (the %d kinds are listed in docs/workbook.md, Relations)", kindText, len(RelationKinds))
		}
		hard, w, err := parseStrength(t.get(row, "Strength"))
		if err != nil {
			r.ps.errorf(t.pos(row, "Strength"), "Strength %v", err)
		}
		if kind == 0 || err != nil {
			return
		}
		n, m, ok := r.relationNumbers(t, row, kind)
		if !ok {
			return
		}
		r.t.Relations = append(r.t.Relations, Relation{Kind: kind, Sections: splitList(t.get(row, "Sections")), Hard: hard, Weight: w, N: n, M: m, Src: rowSource(t, row)})
	})
}

// relationNames are the canonical spellings of the relation kinds.
func relationNames() []string { return canonical(relationChoices) }

// criterionNames are the canonical names of the soft criteria.
func criterionNames() []string { return canonical(criterionChoices) }

// canonical lists the first spelling of each choice.
func canonical(choices []choice) []string {
	out := make([]string, len(choices))
	for i, c := range choices {
		out[i] = c[0]
	}
	return out
}

func (r *termReader) readWeights() {
	seen := map[string]int{}
	r.rows(shWeights, func(t *table, row tableRow) {
		text := t.get(row, "Criterion")
		var crit *Criterion
		if i := pickChoice(criterionChoices, text); i >= 0 {
			crit = &Criteria[i]
		}
		if crit == nil {
			r.ps.errorf(t.pos(row, "Criterion"), "Criterion %q is not known — write one of %s", text, quoteList(criterionNames()))
			return
		}
		if first, dup := seen[crit.Name]; dup {
			r.ps.errorf(t.pos(row, "Criterion"), "criterion %q appears again (first in row %d) — keep one of the two rows", crit.Name, first)
			return
		}
		seen[crit.Name] = row.num
		if t.get(row, "Weight") == "" {
			r.ps.errorf(t.pos(row, "Weight"), "Weight is blank — write a whole number, 0 to switch the criterion off")
			return
		}
		w := Weight{
			Weight: r.whole(t, row, "Weight", -maxWeight, maxWeight, crit.Weight),
			Level:  r.whole(t, row, "Level", -100, 100, crit.Level),
			Src:    rowSource(t, row),
		}
		if r.t.Weights == nil {
			r.t.Weights = map[string]Weight{}
		}
		r.t.Weights[crit.Name] = w
		if crit.Name == CritOverCapacity {
			r.t.SoftCapacity = true
		}
	})
}

// describe gives a short label for error messages about a record that has
// no position (a Term built in code): `section "X": `.
func subjectPrefix(src Source, kind, id string) string {
	if src.Sheet != "" {
		return ""
	}
	return kind + " " + Quote(id) + ": "
}
