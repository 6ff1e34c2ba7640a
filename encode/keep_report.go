package encode

import (
	"slices"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// Change kinds of a Move.
const (
	ChangeMoved   = "moved"   // a kept meeting no meeting of its section holds any more, paired with the meeting that replaces it
	ChangeNew     = "new"     // a meeting with no kept meeting to pair with (a new section or an extra meeting)
	ChangeDropped = "dropped" // a kept meeting with no meeting to pair with (a section removed or meeting fewer times)
)

// Move is one meeting that differs between the kept timetable and the new
// one. A kept meeting is unchanged when a meeting of its section sits at
// its day, start time and room; the others of the section (in both
// timetables) pair up as closely as they can: see Moves.
type Move struct {
	Section string               `json:"section"`
	Change  string               `json:"change"`         // ChangeMoved, ChangeNew or ChangeDropped
	From    *timetable.Placement `json:"from,omitempty"` // the kept meeting (nil for new ones)
	To      *timetable.Placement `json:"to,omitempty"`   // the new meeting (nil for dropped ones)
}

// Moves lists every meeting of s that differs from kept, section by
// section in the order of the term (sections of kept that the term no
// longer has come last). Per section, kept meetings that s holds at the
// same period and room are matched to those meetings (a maximum matching,
// so as many as possible stay unchanged); of the rest, kept and new
// meetings pair by a minimum-cost assignment (moveCost: a change of day
// costs most, then of start time, then of room) as ChangeMoved, and what
// is left is ChangeDropped or ChangeNew. Within a section, moves come in
// the start order of the kept meeting, new meetings last. The moved and
// dropped meetings of the term's sections are exactly what the criterion
// "moved meetings" counts (timetable.Cost).
func Moves(t *timetable.Term, kept, s *timetable.Schedule) []Move {
	if kept == nil || s == nil {
		return nil
	}
	group := func(sc *timetable.Schedule) map[string][]timetable.Placement {
		m := map[string][]timetable.Placement{}
		for _, p := range sc.Placements {
			m[p.Section] = append(m[p.Section], p)
		}
		for id := range m {
			sortMeetings(m[id])
		}
		return m
	}
	old, cur := group(kept), group(s)
	var order []string
	seen := map[string]bool{}
	for _, sec := range t.Sections {
		order = append(order, sec.ID)
		seen[sec.ID] = true
	}
	var gone []string
	for _, p := range kept.Placements {
		if !seen[p.Section] {
			seen[p.Section] = true
			gone = append(gone, p.Section)
		}
	}
	slices.Sort(gone)
	order = append(order, gone...)
	var out []Move
	for _, id := range order {
		out = append(out, sectionMoves(t, id, old[id], cur[id])...)
	}
	return out
}

// sectionMoves is Moves for one section's kept meetings a and new
// meetings b (both in start order).
func sectionMoves(t *timetable.Term, id string, a, b []timetable.Placement) []Move {
	left, right := unchanged(a, b)
	cost := make([][]int64, len(left))
	for i, x := range left {
		cost[i] = make([]int64, len(right))
		for j, y := range right {
			cost[i][j] = moveCost(t, a[x], b[y])
		}
	}
	pair := timetable.LeastCostPairs(cost)
	var out []Move
	paired := make([]bool, len(right))
	for i, x := range left {
		if len(right) > 0 && pair[i] >= 0 {
			y := right[pair[i]]
			paired[pair[i]] = true
			out = append(out, Move{Section: id, Change: ChangeMoved, From: &a[x], To: &b[y]})
		} else {
			out = append(out, Move{Section: id, Change: ChangeDropped, From: &a[x]})
		}
	}
	for j, y := range right {
		if !paired[j] {
			out = append(out, Move{Section: id, Change: ChangeNew, To: &b[y]})
		}
	}
	return out
}

// unchanged matches kept meetings a to new meetings b at the same period
// (or meeting time) and room (a maximum matching: Hopcroft–Karp on the equal-slot edges) and
// returns the indexes left unmatched on each side, ascending.
func unchanged(a, b []timetable.Placement) (left, right []int) {
	adj := make([][]int, len(a))
	for i, x := range a {
		for j, y := range b {
			if x.Period == y.Period && x.Time == y.Time && x.Room == y.Room {
				adj[i] = append(adj[i], j)
			}
		}
	}
	g := newBipartite(adj, len(b))
	g.maxMatching()
	for i, r := range g.matchL {
		if r < 0 {
			left = append(left, i)
		}
	}
	for j, l := range g.matchR {
		if l < 0 {
			right = append(right, j)
		}
	}
	return left, right
}

// moveCost is how far meeting y is from kept meeting x, for pairing the
// moved ones: 4 for another day, 2 for another start time, 1 for another
// room (so a meeting that stays on its day pairs before one that does not).
func moveCost(t *timetable.Term, x, y timetable.Placement) int64 {
	var c int64
	if x.Room != y.Room {
		c++
	}
	if x.Time != y.Time { // pattern sections: another meeting time
		c += 6
	}
	n := len(t.Periods)
	if x.Period < 0 || x.Period >= n || y.Period < 0 || y.Period >= n {
		if x.Period != y.Period {
			c += 6
		}
		return c
	}
	px, py := t.Periods[x.Period], t.Periods[y.Period]
	if px.Day != py.Day {
		c += 4
	}
	if px.Start != py.Start {
		c += 2
	}
	return c
}

// Affected is one person or room touched by moves, with the moves (indexes
// into the list given to Affect).
type Affected struct {
	Kind  timetable.WhoKind `json:"-"`
	What  string            `json:"kind"` // "staff", "cohort" or "room"
	ID    string            `json:"id"`
	Name  string            `json:"name,omitempty"`
	Moves []int             `json:"moves"`
}

// Affect lists who must hear of the moves: every staff member and cohort
// of a moved section, and every room a moved meeting leaves or enters, in
// that order (staff, cohorts, rooms), each sorted by ID.
func Affect(t *timetable.Term, moves []Move) []Affected {
	secIdx := t.SectionIndex()
	staffIdx, cohIdx := t.StaffIndex(), t.CohortIndex()
	type key struct {
		kind timetable.WhoKind
		id   string
	}
	lists := map[key][]int{}
	add := func(k key, i int) {
		if l := lists[k]; len(l) == 0 || l[len(l)-1] != i {
			lists[k] = append(l, i)
		}
	}
	for i, mv := range moves {
		if s, ok := secIdx[mv.Section]; ok {
			sec := &t.Sections[s]
			for _, id := range uniq(sec.Staff) {
				add(key{timetable.WhoStaff, id}, i)
			}
			for _, id := range uniq(sec.Cohorts) {
				add(key{timetable.WhoCohort, id}, i)
			}
		}
		for _, p := range []*timetable.Placement{mv.From, mv.To} {
			if p != nil && p.Room != "" {
				add(key{timetable.WhoRoom, p.Room}, i)
			}
		}
	}
	keys := make([]key, 0, len(lists))
	for k := range lists {
		keys = append(keys, k)
	}
	rank := map[timetable.WhoKind]int{timetable.WhoStaff: 0, timetable.WhoCohort: 1, timetable.WhoRoom: 2}
	slices.SortFunc(keys, func(a, b key) int {
		if rank[a.kind] != rank[b.kind] {
			return rank[a.kind] - rank[b.kind]
		}
		return strings.Compare(a.id, b.id)
	})
	out := make([]Affected, 0, len(keys))
	for _, k := range keys {
		a := Affected{Kind: k.kind, What: k.kind.String(), ID: k.id, Moves: lists[k]}
		switch k.kind {
		case timetable.WhoStaff:
			if i, ok := staffIdx[k.id]; ok {
				a.Name = t.Staff[i].Name
			}
		case timetable.WhoCohort:
			if i, ok := cohIdx[k.id]; ok {
				a.Name = t.Cohorts[i].Name
			}
		}
		out = append(out, a)
	}
	return out
}
