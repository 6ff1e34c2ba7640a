package sectioning

import (
	"github.com/termwright/termwright/timetable"
)

// clashTable answers "how many student clashes does one student in both
// sections a and b cost" as criterion "student clashes" defines it: for
// two grid sections with overlapping week sets, the number of periods both
// occupy; when either uses meeting patterns, 1 when some meetings of the
// two share a minute of a common day in a common week or leave less free
// time between them on such a day than the travel time between their
// rooms, else 0. Pairs are computed on first use and remembered: a dense
// lazily filled matrix for terms of up to denseMax sections (2 bytes a
// pair), a map beyond. Safe for one goroutine.
type clashTable struct {
	n      int
	dense  []int16 // n*n, -1 = not yet computed
	sparse map[uint64]int16
	meets  [][]meet // section -> its meetings, by day then start
	grid   [][]int  // grid section -> periods it occupies, ascending
	weeks  []timetable.WeekSet
	pat    []bool // section uses meeting patterns
	travel *timetable.TravelIndex
}

// meet is one meeting of a section with its room.
type meet struct {
	timetable.Occurrence
	room string
}

const denseMax = 4096

func newClashTable(t *timetable.Term, s *timetable.Schedule) *clashTable {
	n := len(t.Sections)
	ct := &clashTable{
		n:      n,
		meets:  make([][]meet, n),
		grid:   make([][]int, n),
		weeks:  make([]timetable.WeekSet, n),
		pat:    make([]bool, n),
		travel: timetable.NewTravelIndex(t),
	}
	if n <= denseMax {
		ct.dense = make([]int16, n*n)
		for i := range ct.dense {
			ct.dense[i] = -1
		}
	} else {
		ct.sparse = map[uint64]int16{}
	}
	idx := t.SectionIndex()
	for i := range t.Sections {
		ct.pat[i] = t.Sections[i].UsesTimes()
		ct.weeks[i] = t.Sections[i].Weeks
	}
	if s == nil {
		return ct
	}
	for _, pl := range s.Placements {
		si, ok := idx[pl.Section]
		if !ok {
			continue
		}
		sec := &t.Sections[si]
		for _, o := range t.SectionOccurrences(sec, pl) {
			ct.meets[si] = append(ct.meets[si], meet{Occurrence: o, room: pl.Room})
		}
		if !sec.UsesTimes() {
			if span, ok := t.Span(pl.Period, sec.Length); ok {
				ct.grid[si] = mergePeriods(ct.grid[si], span)
			}
		}
	}
	return ct
}

// mergePeriods adds span to the ascending distinct list ps.
func mergePeriods(ps, span []int) []int {
	for _, p := range span {
		i := len(ps)
		for i > 0 && ps[i-1] > p {
			i--
		}
		if i > 0 && ps[i-1] == p {
			continue
		}
		ps = append(ps, 0)
		copy(ps[i+1:], ps[i:])
		ps[i] = p
	}
	return ps
}

// get is the clash count of sections a and b (0 when a == b).
func (ct *clashTable) get(a, b int32) int {
	if a == b {
		return 0
	}
	if a > b {
		a, b = b, a
	}
	if ct.dense != nil {
		k := int(a)*ct.n + int(b)
		if v := ct.dense[k]; v >= 0 {
			return int(v)
		}
		v := ct.compute(a, b)
		ct.dense[k] = int16(v)
		return v
	}
	k := uint64(a)<<32 | uint64(b)
	if v, ok := ct.sparse[k]; ok {
		return int(v)
	}
	v := ct.compute(a, b)
	ct.sparse[k] = int16(v)
	return v
}

func (ct *clashTable) compute(a, b int32) int {
	if !ct.pat[a] && !ct.pat[b] {
		if !ct.weeks[a].Overlaps(ct.weeks[b]) {
			return 0
		}
		pa, pb := ct.grid[a], ct.grid[b]
		n, i, j := 0, 0, 0
		for i < len(pa) && j < len(pb) {
			switch {
			case pa[i] == pb[j]:
				n++
				i++
				j++
			case pa[i] < pb[j]:
				i++
			default:
				j++
			}
		}
		return min(n, 32767)
	}
	for _, m := range ct.meets[a] {
		for _, o := range ct.meets[b] {
			if m.Day != o.Day || !m.Weeks.Overlaps(o.Weeks) {
				continue
			}
			if m.Start < o.End && o.Start < m.End {
				return 1
			}
			gap := int(o.Start - m.End)
			if o.Start < m.Start {
				gap = int(m.Start - o.End)
			}
			if gap < ct.travel.Between(m.room, o.room) {
				return 1
			}
		}
	}
	return 0
}
