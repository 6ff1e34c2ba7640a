package benchfmt

import (
	"math/bits"
	"sort"
)

// The published cost of an ITC-2019 solution (https://www.itc2019.org/format,
// sections "Solution" and "Distribution Constraints"), evaluated here from
// the instance and the solution alone, independently of timetable.Cost and
// of the encoder. All quantities are in slots.

// XMLParts are the four unweighted cost parts of a solution: the penalties
// of the chosen times, of the chosen rooms, of the broken soft
// distributions, and the student conflicts.
type XMLParts struct {
	Time         int `json:"time"`
	Room         int `json:"room"`
	Distribution int `json:"relations"`
	Student      int `json:"students"`
}

// Weighted is the total cost: each part times its weight.
func (p XMLParts) Weighted(w XMLWeights) int {
	return p.Time*w.Time + p.Room*w.Room + p.Distribution*w.Distribution + p.Student*w.Student
}

// XMLHard counts the broken hard requirements of a solution; a valid
// solution has all of them 0.
type XMLHard struct {
	Unplaced        int `json:"unplaced"`         // classes without an assignment
	NotListed       int `json:"not_listed"`       // assignments to a time or room the class does not list
	RoomClashes     int `json:"room_clashes"`     // pairs of classes in one room that overlap
	RoomUnavailable int `json:"room_unavailable"` // classes meeting while their room is unavailable
	Distributions   int `json:"relations"`        // broken required distributions
	// Sectioning counts broken student rules (see sectioning): students
	// not seated in a wanted course as the rules require, students in a
	// class of a course they do not want, and students over a class's limit.
	Sectioning int `json:"sectioning"`
}

// Total is the number of broken hard requirements.
func (h XMLHard) Total() int {
	return h.Unplaced + h.NotListed + h.RoomClashes + h.RoomUnavailable + h.Distributions + h.Sectioning
}

// placed is one class's assignment as the evaluator sees it.
type placed struct {
	ok    bool
	days  uint8
	start int
	end   int
	weeks uint64
	room  string
}

// overlaps is the rules' overlap of two classes: a common day, a common
// week and a common slot of the day.
func (a placed) overlaps(b placed) bool {
	return a.days&b.days != 0 && a.weeks&b.weeks != 0 && a.start < b.end && b.start < a.end
}

// evaluation is a solution laid out per class.
type evaluation struct {
	in     *XMLInstance
	at     []placed // by class index
	travel map[[2]string]int
	hard   XMLHard
	parts  XMLParts
}

// evaluate lays out sol and adds up every part.
func evaluate(in *XMLInstance, sol *XMLSolution) *evaluation {
	e := &evaluation{in: in, at: make([]placed, len(in.Classes)), travel: in.travelTable()}
	idx := in.classIndex()
	given := make([]bool, len(in.Classes))
	for _, a := range sol.Classes {
		ci, ok := idx[a.Class]
		if !ok {
			continue
		}
		given[ci] = true
		c := in.Classes[ci]
		k := timeChoice(c, a)
		if k < 0 {
			e.hard.NotListed++
			continue
		}
		tm := c.Times[k]
		e.parts.Time += tm.Penalty
		p := placed{ok: true, days: tm.Days, start: tm.Start, end: tm.End(), weeks: tm.Weeks, room: a.Room}
		switch {
		case c.NoRoom || len(c.Rooms) == 0:
			if a.Room != "" {
				e.hard.NotListed++
			}
		default:
			found := false
			for _, rc := range c.Rooms {
				if rc.Room == a.Room {
					e.parts.Room += rc.Penalty
					found = true
					break
				}
			}
			if !found {
				e.hard.NotListed++
			}
		}
		e.at[ci] = p
	}
	for _, g := range given {
		if !g {
			e.hard.Unplaced++
		}
	}
	e.rooms()
	e.distributions()
	e.students(sol)
	e.sectioning(sol)
	return e
}

// rooms counts room clashes and meetings in unavailable rooms.
func (e *evaluation) rooms() {
	byRoom := map[string][]int{}
	for i, p := range e.at {
		if p.ok && p.room != "" {
			byRoom[p.room] = append(byRoom[p.room], i)
		}
	}
	unavailable := map[string][]XMLTime{}
	for _, r := range e.in.Rooms {
		unavailable[r.ID] = r.Unavailable
	}
	for room, list := range byRoom {
		for x, i := range list {
			for _, j := range list[x+1:] {
				if e.at[i].overlaps(e.at[j]) {
					e.hard.RoomClashes++
				}
			}
			for _, u := range unavailable[room] {
				if e.at[i].overlaps(placed{days: u.Days, start: u.Start, end: u.End(), weeks: u.Weeks}) {
					e.hard.RoomUnavailable++
					break
				}
			}
		}
	}
}

// travelBetween is the travel time between two assigned rooms (0 when
// either class has no room).
func (e *evaluation) travelBetween(a, b string) int {
	if a == "" || b == "" || a == b {
		return 0
	}
	return e.travel[[2]string{a, b}]
}

// distributions adds the hard and soft distribution parts.
func (e *evaluation) distributions() {
	idx := e.in.classIndex()
	for _, d := range e.in.Distributions {
		var cs []placed
		for _, id := range d.Classes {
			if p := e.at[idx[id]]; p.ok {
				cs = append(cs, p)
			}
		}
		broken, cost := e.distribution(d, cs)
		if d.Required {
			if broken > 0 {
				e.hard.Distributions++
			}
			continue
		}
		e.parts.Distribution += cost
	}
}

// distribution evaluates one distribution over its placed classes (in
// order): how many pairs (or counted units) break it, and its soft cost.
func (e *evaluation) distribution(d XMLDistribution, cs []placed) (broken, cost int) {
	nw := e.in.Weeks
	switch d.Type {
	case "MaxDays":
		var all uint8
		for _, c := range cs {
			all |= c.days
		}
		over := max(bits.OnesCount8(all)-d.Params[0], 0)
		return over, d.Penalty * over
	case "MaxDayLoad", "MaxBreaks", "MaxBlock":
		over := e.perDay(d, cs)
		return over, d.Penalty * over / nw // the division last, as the rules say
	}
	for i := range cs {
		for j := i + 1; j < len(cs); j++ {
			if !e.pairHolds(d, cs[i], cs[j]) {
				broken++
			}
		}
	}
	return broken, broken * d.Penalty
}

// pairHolds is the rules' condition of a pairwise distribution on Ci, Cj
// (i < j in the listed order).
func (e *evaluation) pairHolds(d XMLDistribution, ci, cj placed) bool {
	shareDay := ci.days&cj.days != 0 && ci.weeks&cj.weeks != 0
	switch d.Type {
	case "SameStart":
		return ci.start == cj.start
	case "SameTime":
		return (ci.start <= cj.start && cj.end <= ci.end) || (cj.start <= ci.start && ci.end <= cj.end)
	case "DifferentTime":
		return ci.end <= cj.start || cj.end <= ci.start
	case "SameDays":
		return ci.days|cj.days == ci.days || ci.days|cj.days == cj.days
	case "DifferentDays":
		return ci.days&cj.days == 0
	case "SameWeeks":
		return ci.weeks|cj.weeks == ci.weeks || ci.weeks|cj.weeks == cj.weeks
	case "DifferentWeeks":
		return ci.weeks&cj.weeks == 0
	case "Overlap":
		return ci.overlaps(cj)
	case "NotOverlap":
		return !ci.overlaps(cj)
	case "SameRoom":
		return ci.room == cj.room
	case "DifferentRoom":
		return ci.room != cj.room
	case "SameAttendees":
		t := e.travelBetween(ci.room, cj.room)
		return !shareDay || ci.end+t <= cj.start || cj.end+t <= ci.start
	case "Precedence":
		wi, wj := bits.TrailingZeros64(ci.weeks), bits.TrailingZeros64(cj.weeks)
		di, dj := bits.TrailingZeros8(ci.days), bits.TrailingZeros8(cj.days)
		return wi < wj || (wi == wj && (di < dj || (di == dj && ci.end <= cj.start)))
	case "WorkDay":
		return !shareDay || max(ci.end, cj.end)-min(ci.start, cj.start) <= d.Params[0]
	case "MinGap":
		g := d.Params[0]
		return !shareDay || ci.end+g <= cj.start || cj.end+g <= ci.start
	}
	return true
}

// perDay sums, over every week and day, the excess the per-day kinds count:
// slots over S (MaxDayLoad), blocks over R+1 (MaxBreaks), blocks of two or
// more classes longer than M (MaxBlock).
func (e *evaluation) perDay(d XMLDistribution, cs []placed) int {
	total := 0
	var day []placed
	for w := 0; w < e.in.Weeks; w++ {
		for dd := 0; dd < e.in.Days; dd++ {
			day = day[:0]
			for _, c := range cs {
				if c.days&(1<<dd) != 0 && c.weeks&(1<<w) != 0 {
					day = append(day, c)
				}
			}
			if len(day) == 0 {
				continue
			}
			switch d.Type {
			case "MaxDayLoad":
				load := 0
				for _, c := range day {
					load += c.end - c.start
				}
				total += max(load-d.Params[0], 0)
			case "MaxBreaks":
				total += max(len(mergeBlocks(day, d.Params[1]))-d.Params[0]-1, 0)
			case "MaxBlock":
				for _, b := range mergeBlocks(day, d.Params[1]) {
					if b.n >= 2 && b.end-b.start > d.Params[0] {
						total++
					}
				}
			}
		}
	}
	return total
}

// block is a run of classes merged by the rules' MergeBlocks.
type block struct{ start, end, n int }

// mergeBlocks merges classes whose times overlap or are at most s slots
// apart (the rules: Ba.end + S >= Bb.start and Bb.end + S >= Ba.start).
func mergeBlocks(day []placed, s int) []block {
	sorted := append([]placed(nil), day...)
	sort.Slice(sorted, func(i, j int) bool { return sorted[i].start < sorted[j].start })
	var out []block
	for _, c := range sorted {
		if n := len(out); n > 0 && out[n-1].end+s >= c.start {
			out[n-1].end = max(out[n-1].end, c.end)
			out[n-1].n++
			continue
		}
		out = append(out, block{start: c.start, end: c.end, n: 1})
	}
	return out
}

// students counts, per student, the pairs of their classes they cannot
// attend both of: overlapping, or too close for the travel between rooms.
func (e *evaluation) students(sol *XMLSolution) {
	idx := e.in.classIndex()
	of := map[string][]int{}
	for _, a := range sol.Classes {
		ci, ok := idx[a.Class]
		if !ok || !e.at[ci].ok {
			continue
		}
		for _, s := range a.Students {
			of[s] = append(of[s], ci)
		}
	}
	for _, list := range of {
		for x, i := range list {
			for _, j := range list[x+1:] {
				a, b := e.at[i], e.at[j]
				if a.days&b.days == 0 || a.weeks&b.weeks == 0 {
					continue
				}
				t := e.travelBetween(a.room, b.room)
				if !(a.end+t <= b.start || b.end+t <= a.start) {
					e.parts.Student++
				}
			}
		}
	}
}

// XMLCost is the published cost of a solution of in: the parts and their
// weighted total (the student part is 0 when the solution enrols nobody).
func XMLCost(in *XMLInstance, sol *XMLSolution) (total int, parts XMLParts) {
	e := evaluate(in, sol)
	return e.parts.Weighted(in.Weights), e.parts
}

// XMLHardViolations counts the hard requirements a solution of in breaks.
func XMLHardViolations(in *XMLInstance, sol *XMLSolution) XMLHard {
	return evaluate(in, sol).hard
}
