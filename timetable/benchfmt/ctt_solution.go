package benchfmt

import (
	"bufio"
	"fmt"
	"io"
	"sort"
	"strconv"
	"strings"
	"unicode"

	"github.com/termwright/termwright/timetable"
)

// The competition's solution format (Di Gaspero, McCollum, Schaerf 2007,
// section "Output format"): one line per meeting, "course room day period",
// day and period 0-based, fields separated by white space, in any order.

// WriteCTTSolution writes s in the competition's solution format, one line
// "course room day period" per placement, sorted by the course's position in
// t and then by period. Every placement must name a section of t, a room and
// a period of t's grid.
func WriteCTTSolution(w io.Writer, t *timetable.Term, s *timetable.Schedule) error {
	g := newITCGrid(t)
	sec := t.SectionIndex()
	ps := make([]timetable.Placement, len(s.Placements))
	copy(ps, s.Placements)
	for _, p := range ps {
		if _, ok := sec[p.Section]; !ok {
			return fmt.Errorf("write solution: meeting %d of section %q: the section is not in the term", p.Meeting, p.Section)
		}
		if p.Room == "" {
			return fmt.Errorf("write solution: meeting %d of section %q has no room; the benchmark format needs one for every meeting", p.Meeting, p.Section)
		}
		if strings.IndexFunc(p.Room, unicode.IsSpace) >= 0 || strings.IndexFunc(p.Section, unicode.IsSpace) >= 0 {
			return fmt.Errorf("write solution: meeting %d of section %q: IDs with spaces cannot be written in the benchmark format", p.Meeting, p.Section)
		}
		if p.Period < 0 || p.Period >= len(t.Periods) {
			return fmt.Errorf("write solution: meeting %d of section %q: period %d is outside the term's grid", p.Meeting, p.Section, p.Period)
		}
	}
	sort.SliceStable(ps, func(i, j int) bool {
		a, b := ps[i], ps[j]
		if sec[a.Section] != sec[b.Section] {
			return sec[a.Section] < sec[b.Section]
		}
		return a.Period < b.Period
	})
	bw := bufio.NewWriter(w)
	for _, p := range ps {
		bw.WriteString(p.Section)
		bw.WriteByte(' ')
		bw.WriteString(p.Room)
		bw.WriteByte(' ')
		bw.WriteString(strconv.Itoa(g.day[p.Period]))
		bw.WriteByte(' ')
		bw.WriteString(strconv.Itoa(g.slot[p.Period]))
		bw.WriteByte('\n')
	}
	return bw.Flush()
}

// ReadCTTSolution reads a solution in the competition's format for term t;
// name (usually the file name) is used in error messages and as the Src
// sheet of each placement. Meetings of a course are numbered 1.. in
// start-period order and placements come out in the course order of t. It
// reports malformed lines, unknown courses and rooms and days or periods
// outside the grid, every one as "name:LINE: ..." in Errors; it accepts
// too few or too many meetings and clashes, which CTTHardViolations counts.
func ReadCTTSolution(r io.Reader, name string, t *timetable.Term) (*timetable.Schedule, error) {
	g := newITCGrid(t)
	sec := t.SectionIndex()
	rooms := t.RoomIndex()
	errs := &errList{file: name}
	var ps []timetable.Placement
	sc := bufio.NewScanner(r)
	sc.Buffer(make([]byte, 0, 4096), 1<<16)
	n := 0
	for sc.Scan() {
		n++
		f := strings.Fields(sc.Text())
		if len(f) == 0 {
			continue
		}
		if len(f) != 4 {
			errs.add(n, fmt.Sprintf("a solution line has 4 fields (course room day period), found %d", len(f)))
			continue
		}
		ok := true
		if _, known := sec[f[0]]; !known {
			errs.add(n, fmt.Sprintf("course %q is not in the instance; check the solution belongs to this instance", clip(f[0])))
			ok = false
		}
		if _, known := rooms[f[1]]; !known {
			errs.add(n, fmt.Sprintf("room %q is not in the instance; check the solution belongs to this instance", clip(f[1])))
			ok = false
		}
		day, ok1 := cttInt(errs, n, 0, "day", f[2], 0)
		slot, ok2 := cttInt(errs, n, 0, "period", f[3], 0)
		if !ok || !ok1 || !ok2 {
			continue
		}
		p := g.period(day, slot)
		if p < 0 {
			errs.add(n, fmt.Sprintf("day %d period %d is outside the grid of %d days; days and periods count from 0", day, slot, g.days))
			continue
		}
		ps = append(ps, timetable.Placement{Section: f[0], Period: p, Room: f[1], Src: timetable.Source{Sheet: name, Row: n}})
	}
	if err := sc.Err(); err != nil {
		errs.add(n+1, "cannot read the line: "+err.Error())
	}
	if err := errs.err(); err != nil {
		return nil, err
	}
	sort.SliceStable(ps, func(i, j int) bool {
		a, b := ps[i], ps[j]
		if sec[a.Section] != sec[b.Section] {
			return sec[a.Section] < sec[b.Section]
		}
		return a.Period < b.Period
	})
	for i := range ps {
		ps[i].Meeting = 1
		if i > 0 && ps[i-1].Section == ps[i].Section {
			ps[i].Meeting = ps[i-1].Meeting + 1
		}
	}
	return &timetable.Schedule{Placements: ps}, nil
}
