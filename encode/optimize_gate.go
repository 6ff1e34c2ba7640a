package encode

import (
	"errors"
	"fmt"
	"slices"
	"strings"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// ErrCostMismatch wraps a disagreement between the engine's weak-constraint
// cost and timetable.Cost (the third gate): a defect of the encoder, never
// a result.
var ErrCostMismatch = errors.New("internal error: the engine's cost differs from the independent cost evaluation")

// roomCriteria are the criteria that depend on concrete rooms. The engine
// does not see them; room assignment improves them, and timetable.Cost
// evaluates them on the written timetable. ("avoid times", "soft relations"
// and "moved meetings" have room-dependent parts too: rows of rooms,
// same-room rows and changed rooms.)
var roomCriteria = []string{timetable.CritRoomStability, timetable.CritOverCapacity, timetable.CritWastedSeats, timetable.CritTravel}

// withoutRooms returns a copy of s with every room blank. timetable.Cost of
// such a schedule (and of the kept timetable without rooms) is exactly the
// part of the objective the engine encodes: every room-dependent unit is
// zero when no room is known.
//
// Rooms of pattern sections (Placement.Time set) stay: the engine chooses
// them (in(S,R) atoms).
func withoutRooms(s *timetable.Schedule) *timetable.Schedule {
	if s == nil {
		return nil
	}
	out := &timetable.Schedule{Placements: make([]timetable.Placement, len(s.Placements))}
	copy(out.Placements, s.Placements)
	for i := range out.Placements {
		if out.Placements[i].Time == 0 {
			out.Placements[i].Room = ""
		}
	}
	return out
}

// TimeCost is timetable.Cost of s and kept with their grid rooms left out:
// the part of the objective the engine's weak constraints encode.
func TimeCost(t *timetable.Term, s, kept *timetable.Schedule) timetable.CostReport {
	return timetable.Cost(t, withoutRooms(s), withoutRooms(kept))
}

// patternUngated are the criteria the third gate leaves out on terms with
// pattern sections: none since the encoder writes the student clashes of
// pattern sections (soft_students.go). Every criterion is encoded exactly
// for pattern sections (time and room choice, avoid times, seats, moved
// meetings, soft relations: times_rel*.go, rows encoded by a surrogate
// left out by exactTerm, student clashes) or counts grid meetings only.
var patternUngated []string

// EngineCost returns the cost of model under the weak constraints the soft
// criteria wrote into p, per criterion (indexed like timetable.Criteria).
// It reads the program, not the engine, so it is an independent sum.
func (c *Catalog) EngineCost(p *solver.Program, model []solver.Atom) []int64 {
	out := make([]int64, len(timetable.Criteria))
	if c.soft == nil {
		return out
	}
	in := make([]bool, p.NumAtoms()+1)
	for _, a := range model {
		if int(a) < len(in) {
			in[a] = true
		}
	}
	for i, w := range p.Weaks {
		if i >= len(c.soft.crit) || c.soft.crit[i] < 0 {
			continue
		}
		holds := true
		for _, l := range w.Body {
			if in[l.Atom()] == l.IsNeg() {
				holds = false
				break
			}
		}
		if holds {
			out[c.soft.crit[i]] += w.Weight
		}
	}
	return out
}

// thirdGate compares, criterion by criterion, the engine's cost of model
// with timetable.Cost of the decoded schedule without rooms, and returns an
// error wrapping ErrCostMismatch when they differ.
func (c *Catalog) thirdGate(t *timetable.Term, p *solver.Program, model []solver.Atom, s, kept *timetable.Schedule) error {
	eng := c.EngineCost(p, model)
	rep := TimeCost(t, s, kept)
	var diffs []string
	for k, cr := range timetable.Criteria {
		if c.hasPatterns() && slices.Contains(patternUngated, cr.Name) {
			continue
		}
		if cr.Name == timetable.CritUnplaced || cr.Name == timetable.CritMovedStudents {
			continue // the sectioner's criteria: the engine places meetings, planning.Plan counts these
		}
		if got, want := eng[k], rep.Criteria[k].Cost; got != want {
			diffs = append(diffs, fmt.Sprintf("%s: engine %d, independent %d", cr.Name, got, want))
		}
	}
	if len(diffs) > 0 {
		return fmt.Errorf("%w: %s", ErrCostMismatch, strings.Join(diffs, "; "))
	}
	return nil
}
