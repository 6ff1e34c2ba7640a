package timetable

import (
	"math/bits"
	"strconv"
	"strings"
	"time"
)

// DaySet is a set of weekdays: bit d set means time.Weekday(d) (Sunday is
// bit 0, Monday bit 1, … Saturday bit 6).
type DaySet uint8

// DaysOf builds a set from days.
func DaysOf(days ...time.Weekday) DaySet {
	var s DaySet
	for _, d := range days {
		s |= 1 << (uint(d) % 7)
	}
	return s
}

// Has reports whether d is in the set.
func (s DaySet) Has(d time.Weekday) bool { return s&(1<<(uint(d)%7)) != 0 }

// Count is the number of days in the set.
func (s DaySet) Count() int { return bits.OnesCount8(uint8(s)) }

// List gives the days in week order (Monday first).
func (s DaySet) List() []time.Weekday {
	var out []time.Weekday
	for i := 0; i < 7; i++ {
		d := time.Weekday((i + 1) % 7)
		if s.Has(d) {
			out = append(out, d)
		}
	}
	return out
}

// First is the first day of the set in week order (Monday first), and false
// for the empty set.
func (s DaySet) First() (time.Weekday, bool) {
	l := s.List()
	if len(l) == 0 {
		return 0, false
	}
	return l[0], true
}

// String is the documented text form "Mon Wed Fri" (week order).
func (s DaySet) String() string {
	var b strings.Builder
	for i, d := range s.List() {
		if i > 0 {
			b.WriteByte(' ')
		}
		b.WriteString(DayName(d))
	}
	return b.String()
}

// First is the lowest teaching week of the set (1-based), and 0 for the
// empty set.
func (w WeekSet) First() int {
	if w == 0 {
		return 0
	}
	return bits.TrailingZeros64(uint64(w)) + 1
}

// Count is the number of teaching weeks in the set.
func (w WeekSet) Count() int { return bits.OnesCount64(uint64(w)) }

// Ranges lists the weeks of w as numbers and ranges: "1-6, 9, 11-12"
// ("" for the empty set).
func (w WeekSet) Ranges() string {
	var parts []string
	for n := 1; n <= 64; n++ {
		if !w.Has(n) {
			continue
		}
		end := n
		for end < 64 && w.Has(end+1) {
			end++
		}
		if end == n {
			parts = append(parts, strconv.Itoa(n))
		} else {
			parts = append(parts, strconv.Itoa(n)+"-"+strconv.Itoa(end))
		}
		n = end
	}
	return strings.Join(parts, ", ")
}

// TimeChoice is one acceptable meeting pattern of a section: it meets on
// every day of Days, from Start for Minutes minutes, in every week of Weeks.
// A section with Times chooses exactly one of them (its one placement).
type TimeChoice struct {
	Days    DaySet
	Start   Clock
	Minutes int     // length of each meeting, >= 1
	Weeks   WeekSet // teaching weeks; never empty
	Weight  int     // preference penalty when chosen (criterion "time choice"); 0 = fully acceptable
	Src     Source  // row of the meeting times sheet
}

// End is the clock time the meetings of the choice end.
func (c TimeChoice) End() Clock { return c.Start + Clock(c.Minutes) }

// RoomChoice is one acceptable room of a section with its preference
// penalty (criterion "room choice"; 0 = fully acceptable).
type RoomChoice struct {
	Room   string
	Weight int
	Src    Source
}

// Travel is the time needed to get from one place to another. From and To
// name rooms or buildings; the time holds in both directions.
type Travel struct {
	From, To string
	Minutes  int
	Src      Source
}

// LunchBreak guarantees a run of at least Minutes consecutive free minutes between From and To on
// every day a person or cohort teaches or is taught (hard). The zero value
// means no guarantee.
type LunchBreak struct {
	From, To Clock
	Minutes  int
}

// Set reports whether the break is given.
func (l LunchBreak) Set() bool { return l.Minutes > 0 }

// UsesTimes reports whether the section chooses among meeting patterns
// (Times) instead of meetings on the period grid.
func (s *Section) UsesTimes() bool { return len(s.Times) > 0 }

// TakesRoom reports whether a meeting of the section needs a room.
func (s *Section) TakesRoom() bool { return !s.NoRoom }

// Occurrence is one meeting of a placement on one weekday: from Start to End
// on Day in every week of Weeks. It is the common view of grid and pattern
// placements that Check, Cost and the exports share.
type Occurrence struct {
	Day   time.Weekday
	Start Clock
	End   Clock
	Weeks WeekSet
}

// Minutes is the length of the occurrence.
func (o Occurrence) Minutes() int { return int(o.End - o.Start) }

// Overlaps reports whether two occurrences share a minute of a day in a
// teaching week.
func (o Occurrence) Overlaps(p Occurrence) bool {
	return o.Day == p.Day && o.Weeks.Overlaps(p.Weeks) && o.Start < p.End && p.Start < o.End
}

// Occurrences gives the meetings placement pl stands for, in week order: one
// per day of its chosen pattern, or the one grid meeting from its start
// period over the section's Length periods. It returns nil when the placement
// does not name a known section and a valid choice or period run.
//
// It finds the section by a scan; callers that walk a whole schedule and
// have the section at hand call SectionOccurrences.
func (t *Term) Occurrences(pl Placement) []Occurrence {
	si, ok := t.sectionAt(pl.Section)
	if !ok {
		return nil
	}
	return t.SectionOccurrences(&t.Sections[si], pl)
}

// SectionOccurrences is Occurrences for a placement of section s (one of
// t.Sections).
func (t *Term) SectionOccurrences(s *Section, pl Placement) []Occurrence {
	if s.UsesTimes() {
		if pl.Time < 1 || pl.Time > len(s.Times) {
			return nil
		}
		c := s.Times[pl.Time-1]
		out := make([]Occurrence, 0, c.Days.Count())
		for _, d := range c.Days.List() {
			out = append(out, Occurrence{Day: d, Start: c.Start, End: c.End(), Weeks: c.Weeks})
		}
		return out
	}
	span, ok := t.Span(pl.Period, s.Length)
	if !ok {
		return nil
	}
	first, last := t.Periods[span[0]], t.Periods[span[len(span)-1]]
	return []Occurrence{{Day: first.Day, Start: first.Start, End: last.End, Weeks: s.Weeks}}
}

// sectionAt finds a section by ID without building an index (a term's
// section lists are short enough for the callers that use it once).
func (t *Term) sectionAt(id string) (int, bool) {
	for i := range t.Sections {
		if t.Sections[i].ID == id {
			return i, true
		}
	}
	return -1, false
}

// TravelMinutes is the travel time between rooms a and b: the largest Travel
// row naming both rooms, or their buildings, in either direction; 0 when
// none does or when a == b.
func (t *Term) TravelMinutes(a, b string) int {
	if a == "" || b == "" || a == b || len(t.Travel) == 0 {
		return 0
	}
	ba, bb := t.buildingOf(a), t.buildingOf(b)
	best := 0
	for _, tr := range t.Travel {
		if placeMatches(tr.From, a, ba) && placeMatches(tr.To, b, bb) ||
			placeMatches(tr.From, b, bb) && placeMatches(tr.To, a, ba) {
			if tr.Minutes > best {
				best = tr.Minutes
			}
		}
	}
	return best
}

func placeMatches(place, room, building string) bool {
	return place == room || (building != "" && place == building)
}

func (t *Term) buildingOf(room string) string {
	for i := range t.Rooms {
		if t.Rooms[i].ID == room {
			return t.Rooms[i].Building
		}
	}
	return ""
}
