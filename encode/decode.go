package encode

import (
	"context"
	"fmt"
	"sort"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// HallError says that in some period the meetings that can only use the
// rooms of a set U outnumber the rooms of U available then, so no room
// assignment exists for the model (Hall 1935). Search.Cut adds the Hall
// constraints of every such U to the program and searches again.
type HallError struct {
	Period   int               // index into Term.Periods
	Weeks    timetable.WeekSet // the weeks in which the meetings clash
	Rooms    []string          // the room set U
	Sections []string          // sections whose meetings at Period can only use rooms of U
	sets     []roomSet         // every deficient room set found by this decode, Rooms first
	label    string
}

// Error names the period, the meetings and the rooms they are short of.
func (e *HallError) Error() string {
	return fmt.Sprintf("%s: %d meetings (%s) can only use %d room(s) (%s)",
		e.label, len(e.Sections), strings.Join(e.Sections, ", "), len(e.Rooms), strings.Join(e.Rooms, ", "))
}

// RoomConflictError says that rooms cannot be assigned although every period
// on its own has enough rooms: meetings of several periods (or of several
// week patterns, or tied by a same-room relation) need one room each for
// their whole length and cannot all get one. Solve forbids the combination
// of starts named here and searches again.
type RoomConflictError struct {
	Sections []string // sections whose meetings are involved
	// Incomplete is true when the conflict was not proved (the exact room
	// search ran out of budget): forbidding the combination may then cut
	// off a timetable, so a later "no timetable" is not a proof.
	Incomplete bool
	nogoods    [][]solver.Lit // each a clause: not all of these starts
}

// Error names the sections whose meetings cannot all get rooms.
func (e *RoomConflictError) Error() string {
	return fmt.Sprintf("no room assignment for the meetings of %s", strings.Join(e.Sections, ", "))
}

// meeting is one placed meeting while decoding.
type meeting struct {
	sec, start, end int // section index, first and last period
	weeks           timetable.WeekSet
	cand            int // candidate room set id; -1 for no-room sections
	group           int // same-room group, -1
	room            int // assigned room, -1
	atom            solver.Atom
}

// decoder turns one model into a schedule.
type decoder struct {
	// ctx bounds the exact room searches; when it ends, decoding stops
	// with its error.
	ctx    context.Context
	effort roomEffort // limits of the exact room searches
	t      *timetable.Term
	c      *Catalog
	ms     []meeting
	pats   []timetable.Placement // placements of pattern sections (pattern_decode.go)
	// members caches the member list of each room set.
	members map[int][]int
	marks   []bool // marks[a]: atom a is in the model (modelMarks; explicit grid rooms only)
}

// Decode turns a stable model of a program compiled by Compile into a
// schedule: start periods from the start atoms, meeting numbers in period
// order, and rooms by matching. Room assignment first checks every period
// (and week scope) with a maximum bipartite matching; a period whose
// meetings cannot all be matched gives a *HallError. Otherwise rooms are
// assigned meeting by meeting in grid order, each batch of meetings starting
// together by augmenting paths that try rooms in order of preference: the
// room this section already uses (room stability), then the best fit (fewest
// empty seats; under SoftCapacity, rooms that are too small come last,
// fewest students over first). A batch that cannot be completed is solved
// exactly; when that fails too, the result is a *RoomConflictError.
func Decode(t *timetable.Term, c *Catalog, model []solver.Atom) (*timetable.Schedule, error) {
	return DecodeContext(context.Background(), t, c, model)
}

// DecodeContext is Decode within ctx: the exact room searches stop when
// ctx ends, and then it returns ctx's error.
func DecodeContext(ctx context.Context, t *timetable.Term, c *Catalog, model []solver.Atom) (*timetable.Schedule, error) {
	return decodeWith(ctx, t, c, model, defaultRoomEffort)
}

// decodeWith is DecodeContext with the given effort limits.
func decodeWith(ctx context.Context, t *timetable.Term, c *Catalog, model []solver.Atom, effort roomEffort) (*timetable.Schedule, error) {
	d := &decoder{ctx: ctx, effort: effort, t: t, c: c, members: map[int][]int{}}
	if err := d.readStarts(model); err != nil {
		return nil, err
	}
	if err := d.readPatterns(model); err != nil {
		return nil, err
	}
	if err := d.lazyRoomClashes(); err != nil {
		return nil, err
	}
	if err := d.hallCheck(); err != nil {
		return nil, err
	}
	if err := d.assignRooms(); err != nil {
		return nil, err
	}
	return d.schedule(), nil
}

// readStarts collects the meetings from the model's start atoms.
func (d *decoder) readStarts(model []solver.Atom) error {
	count := make([]int, len(d.t.Sections))
	for _, a := range model {
		if int(a) >= len(d.c.atoms) || d.c.atoms[a].Kind != AtomStart {
			continue
		}
		info := d.c.atoms[a]
		m := &d.c.secs[info.Section]
		d.ms = append(d.ms, meeting{
			sec: info.Section, start: info.Period, end: info.Period + m.length - 1,
			weeks: m.weeks, cand: -1, group: m.sameRoom, room: -1, atom: a,
		})
		if m.takesRoom {
			d.ms[len(d.ms)-1].cand = m.candAt(info.Period)
			if one, ok := d.c.explicitCand(info.Section, info.Period, d.modelMarks(model)); ok {
				d.ms[len(d.ms)-1].cand = one // grid_in chosen by the search (rooms_grid.go)
			}
		}
		count[info.Section]++
	}
	for s, n := range count {
		if n != d.c.secs[s].meetings {
			return fmt.Errorf("the model places %d meetings of section %s, not %d: the model does not belong to this program", n, d.t.Sections[s].ID, d.c.secs[s].meetings)
		}
	}
	sort.Slice(d.ms, func(i, j int) bool {
		if d.ms[i].sec != d.ms[j].sec {
			return d.ms[i].sec < d.ms[j].sec
		}
		return d.ms[i].start < d.ms[j].start
	})
	return nil
}

// secIndex is the index of the section with the given ID.
func (d *decoder) secIndex(id string) int {
	for i := range d.t.Sections {
		if d.t.Sections[i].ID == id {
			return i
		}
	}
	return -1
}

func (d *decoder) setMembers(id int) []int {
	if m, ok := d.members[id]; ok {
		return m
	}
	m := d.c.rooms.sets.sets[id].members()
	d.members[id] = m
	return m
}

func (d *decoder) blocked(r, p int) bool {
	b := d.c.rooms.blocked[r]
	return b != nil && b[p]
}

// hallCheck matches, in every period and week scope, the meetings there to
// their available candidate rooms, and reports every deficient room set.
func (d *decoder) hallCheck() error {
	nP := len(d.t.Periods)
	byPeriod := make([][]int, nP)
	for i, m := range d.ms {
		if m.cand < 0 {
			continue
		}
		for q := m.start; q <= m.end; q++ {
			byPeriod[q] = append(byPeriod[q], i)
		}
	}
	var herr *HallError
	seen := map[string]bool{}
	for p := 0; p < nP; p++ {
		here := byPeriod[p]
		if len(here) == 0 {
			continue
		}
		weeks := make([]timetable.WeekSet, len(here))
		for i, mi := range here {
			weeks[i] = d.ms[mi].weeks
		}
		for _, scope := range weekScopes(weeks) {
			adj := make([][]int, len(scope))
			for k, i := range scope {
				for _, r := range d.setMembers(d.ms[here[i]].cand) {
					if !d.blocked(r, p) {
						adj[k] = append(adj[k], r)
					}
				}
			}
			g := newBipartite(adj, d.c.rooms.n)
			if g.maxMatching() == len(scope) {
				continue
			}
			z, _ := g.deficient()
			u := newRoomSet(d.c.rooms.n)
			var secs []string
			var w timetable.WeekSet = ^timetable.WeekSet(0)
			for _, k := range z {
				m := &d.ms[here[scope[k]]]
				u = u.union(d.c.rooms.sets.sets[m.cand])
				secs = append(secs, d.t.Sections[m.sec].ID)
				w &= m.weeks
			}
			if seen[u.key()] {
				continue
			}
			seen[u.key()] = true
			if herr == nil {
				herr = &HallError{Period: p, Weeks: w, Sections: secs, label: d.t.Periods[p].Label()}
				for _, r := range u.members() {
					herr.Rooms = append(herr.Rooms, d.t.Rooms[r].ID)
				}
			}
			herr.sets = append(herr.sets, u)
		}
	}
	if herr != nil {
		return herr
	}
	return nil
}

// schedule builds the result, meetings numbered in period order.
func (d *decoder) schedule() *timetable.Schedule {
	s := &timetable.Schedule{Placements: make([]timetable.Placement, 0, len(d.ms))}
	n := 0
	for i, m := range d.ms {
		if i == 0 || d.ms[i-1].sec != m.sec {
			n = 0
		}
		n++
		room := ""
		if m.room >= 0 {
			room = d.t.Rooms[m.room].ID
		}
		s.Placements = append(s.Placements, timetable.Placement{
			Section: d.t.Sections[m.sec].ID, Meeting: n, Period: m.start, Room: room,
		})
	}
	s.Placements = append(s.Placements, d.pats...)
	return s
}
