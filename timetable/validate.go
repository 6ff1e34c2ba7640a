package timetable

import (
	"fmt"
	"sort"
)

// layout remembers where a read Term's data sits in its workbook, so that
// Validate can name column letters and the cells of the Term sheet. A nil
// layout (a Term built in code) gives positions from Sources only.
type layout struct {
	cols     map[string]map[string]string // sheet as seen -> normalised header -> column letter
	termKey  map[string]Position          // normalised Term key -> its Value cell
	holidays []Position                   // Value cell of each of Term.Holidays, in order
}

func newLayout() *layout {
	return &layout{cols: map[string]map[string]string{}, termKey: map[string]Position{}}
}

func (l *layout) addTable(t *table) {
	m := map[string]string{}
	for h, i := range t.col {
		m[h] = colLetter(i)
	}
	l.cols[t.sheet] = m
}

// at is the position of header in the row a record came from.
func (l *layout) at(src Source, header string) Position {
	if l == nil {
		return posOf(src, "")
	}
	return posOf(src, l.cols[src.Sheet][normHeader(header)])
}

// term is the position of a Term key's value; for a Term built in code it
// is the zero Position. When the key has no row, it is the Term sheet.
func (l *layout) term(key string) Position {
	if l == nil {
		return Position{}
	}
	if p, ok := l.termKey[key]; ok {
		return p
	}
	return Position{Sheet: shTerm}
}

// validator runs the semantic checks of Validate.
type validator struct {
	t                               *Term
	lay                             *layout
	ps                              Problems
	staff, rooms, cohorts, sections map[string]int
	datesOK                         bool  // FirstDay and LastDay are set and in order
	runs                            []int // runs[i]: consecutive periods from period i to the end of its run
	maxRun                          int   // longest run of consecutive periods
	hardStaff, hardCohort, hardRoom map[string][]bool
	hardSection                     map[string][]bool
	largest                         map[string]int              // largestRoom cache: needs and allowed rooms -> capacity, -1 for none
	hardRows                        map[whoKey][]Unavailability // hard unavailability by who, built by blocks
}

// Validate checks a Term — read from a workbook or built in code — and
// returns every problem found, sorted. Positions come from each record's
// Source (column letters are known only to the readers, which call the same
// checks). Validate never modifies the Term and never panics on a Term whose
// slices and maps are well formed.
func Validate(t *Term) Problems {
	ps := validate(t, nil)
	ps.Sort()
	return ps
}

func validate(t *Term, lay *layout) Problems {
	v := &validator{
		t: t, lay: lay,
		staff: t.StaffIndex(), rooms: t.RoomIndex(), cohorts: t.CohortIndex(), sections: t.SectionIndex(),
	}
	v.checkTerm()
	v.checkPeriods()
	v.checkRooms()
	v.checkStaff()
	v.checkCohorts()
	v.checkUnavailable()
	v.buildHard()
	v.checkSections()
	v.checkEnrolments()
	v.checkCourses()
	v.checkRequests()
	v.checkRelations()
	v.checkTravel()
	v.checkWeights()
	v.checkLoads()
	v.checkWeekMinutes()
	v.checkFixedTogether()
	return v.ps
}

// at is the position of header in a record's row.
func (v *validator) at(src Source, header string) Position { return v.lay.at(src, header) }

// idList formats IDs as "A", "B" and "C".
func idList(ids []string) string { return quoteList(ids) }

// unknownIDs returns the IDs of list not in index, in order, without repeats.
func unknownIDs(list []string, index map[string]int) []string {
	var out []string
	seen := map[string]bool{}
	for _, id := range list {
		if _, ok := index[id]; !ok && !seen[id] {
			out = append(out, id)
			seen[id] = true
		}
	}
	return out
}

// repeated returns the IDs that occur more than once in list.
func repeated(list []string) []string {
	var out []string
	count := map[string]int{}
	for _, id := range list {
		count[id]++
		if count[id] == 2 {
			out = append(out, id)
		}
	}
	return out
}

// plural returns "1 period" or "3 periods".
func countNoun(n int, noun string) string {
	if n == 1 {
		return fmt.Sprintf("%d %s", n, noun)
	}
	return fmt.Sprintf("%d %ss", n, noun)
}

// isAre gives "is" or "are" for a list of n items.
func isAre(n int) string {
	if n == 1 {
		return "is"
	}
	return "are"
}

// checkDuplicates reports IDs used by more than one record.
func checkDuplicates[T any](v *validator, xs []T, what, header string, id func(T) (string, Source)) {
	first := map[string]Source{}
	for _, x := range xs {
		key, src := id(x)
		if key == "" {
			if src.Sheet == "" {
				v.ps.errorf(Position{}, "a %s has a blank ID — give every %s an ID", what, what)
			}
			continue
		}
		if f, dup := first[key]; dup {
			where := "another row"
			if f.Row != 0 {
				where = fmt.Sprintf("row %d", f.Row)
			}
			v.ps.errorf(v.at(src, header), "%s%s ID %q is already used in %s — give each %s its own ID", subjectPrefix(src, what, key), what, key, where, what)
			continue
		}
		first[key] = src
	}
}

// sortedKeys returns the keys of m in order.
func sortedNames[V any](m map[string]V) []string {
	out := make([]string, 0, len(m))
	for k := range m {
		out = append(out, k)
	}
	sort.Strings(out)
	return out
}
