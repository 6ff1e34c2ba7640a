package encode

import (
	"slices"
	"strings"

	"github.com/termwright/termwright/timetable"
)

// Change kinds of a Move.
const (
	ChangeMoved   = "moved"   // the meeting starts at another period or uses another room
	ChangeNew     = "new"     // a meeting with no kept meeting to pair with (a new section or an extra meeting)
	ChangeDropped = "dropped" // a kept meeting with no meeting to pair with (a section removed or meeting fewer times)
)

// Move is one meeting that differs between the kept timetable and the new
// one. Meetings pair as "moved meetings" pairs them: per section, both
// sides sorted by start period, room and meeting number, the i-th with the
// i-th.
type Move struct {
	Section string               `json:"section"`
	Change  string               `json:"change"`         // ChangeMoved, ChangeNew or ChangeDropped
	From    *timetable.Placement `json:"from,omitempty"` // the kept meeting (nil for new ones)
	To      *timetable.Placement `json:"to,omitempty"`   // the new meeting (nil for dropped ones)
}

// Moves lists every meeting of s that differs from kept, section by
// section in the order of the term (sections of kept that the term no
// longer has come last), meetings in start order.
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
		a, b := old[id], cur[id]
		for k := 0; k < max(len(a), len(b)); k++ {
			switch {
			case k >= len(a):
				out = append(out, Move{Section: id, Change: ChangeNew, To: &b[k]})
			case k >= len(b):
				out = append(out, Move{Section: id, Change: ChangeDropped, From: &a[k]})
			case a[k].Period != b[k].Period || a[k].Room != b[k].Room:
				out = append(out, Move{Section: id, Change: ChangeMoved, From: &a[k], To: &b[k]})
			}
		}
	}
	return out
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
