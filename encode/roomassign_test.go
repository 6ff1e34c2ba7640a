package encode

import (
	"context"
	"errors"
	"slices"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// onlyModel is the model of a term whose every section has exactly one
// candidate start: every start atom and every selector.
func onlyModel(tb testing.TB, term *timetable.Term) ([]solver.Atom, *Catalog) {
	tb.Helper()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		tb.Fatal(err)
	}
	var model []solver.Atom
	starts := map[int]int{}
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		switch info := cat.AtomInfo(a); info.Kind {
		case AtomStart:
			starts[info.Section]++
			model = append(model, a)
		case AtomSelector:
			model = append(model, a)
		}
	}
	for s := range term.Sections {
		if starts[s] != 1 {
			tb.Fatalf("section %s has %d candidate starts, the test needs exactly 1", term.Sections[s].ID, starts[s])
		}
	}
	return model, cat
}

// Terms whose fast room assignment fails, so that Decode's repair runs.
var (
	// Y needs one room for Mon 09:00-11:00; R1 is taken at 10:00, R2 at
	// 09:00: each period has a free room, the two periods together none.
	roomsImpossible = func() *timetable.Term {
		return newTerm(1, 2).room("R1", 30).room("R2", 40).
			section("X", roomsOf("R1"), fixedAt(time.Monday, 10, "")).
			section("W", roomsOf("R2"), fixedAt(time.Monday, 9, "")).
			section("Y", meetings(1, 2), sized(25), fixedAt(time.Monday, 9, "")).t
	}
	// The fast assignment gives the same-room pair G1, G2 room R1, which
	// the two-period meeting Y needs; only moving the pair to R4 works.
	roomsRepairable = func() *timetable.Term {
		return newTerm(2, 2).room("R1", 30).room("R2", 30).room("R3", 30).room("R4", 30).
			section("G1", roomsOf("R1", "R4"), fixedAt(time.Monday, 9, "")).
			section("G2", roomsOf("R1", "R4"), fixedAt(time.Tuesday, 9, "")).
			section("V", roomsOf("R3"), fixedAt(time.Monday, 10, "")).
			section("Y", meetings(1, 2), roomsOf("R1", "R3"), fixedAt(time.Monday, 9, "")).
			relation(timetable.SameRoom, "G1", "G2").t
	}
)

// TestRoomRepairLastResort runs the last-resort paths of Decode's room
// repair — the exact search of a whole component and the unproved nogood
// over the failed meetings' neighbourhood when a component is too large —
// by switching the earlier steps off (no local repair, no isolated
// proofs). Feasibility is checked against an exhaustive search over every
// start and room that only timetable.Check judges (bruteFeasible).
func TestRoomRepairLastResort(t *testing.T) {
	lastResort := defaultRoomEffort
	lastResort.localHops, lastResort.isolatedHops = 0, 0
	lastResort.familyConflicts, lastResort.pressurePass = 0, false
	tooLarge := lastResort
	tooLarge.maxComponent = 0
	tests := []struct {
		name       string
		term       func() *timetable.Term
		effort     roomEffort
		feasible   bool // the rooms can be assigned
		incomplete bool // the nogood is not a proof
	}{
		{"component search finds rooms", roomsRepairable, lastResort, true, false},
		{"component search proves a conflict", roomsImpossible, lastResort, false, false},
		{"component too large: unproved nogood", roomsImpossible, tooLarge, false, true},
		{"component too large, rooms exist: unproved nogood", roomsRepairable, tooLarge, false, true},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			term := tc.term()
			model, cat := onlyModel(t, term)
			sched, err := decodeWith(context.Background(), term, cat, model, tc.effort)
			if tc.feasible {
				ok, _ := bruteFeasible(term)
				requireRooms(t, term, sched, err, ok)
				return
			}
			var rerr *RoomConflictError
			if !errors.As(err, &rerr) {
				t.Fatalf("decode error = %v, want a RoomConflictError", err)
			}
			if rerr.Incomplete != tc.incomplete {
				t.Fatalf("Incomplete = %v, want %v", rerr.Incomplete, tc.incomplete)
			}
			if !slices.Contains(rerr.Sections, "Y") || len(rerr.nogoods) == 0 {
				t.Fatalf("conflict %v (nogoods %v) does not name section Y", rerr.Sections, rerr.nogoods)
			}
			// Every nogood is a clause the model breaks: it forbids this
			// combination of starts.
			for _, ng := range rerr.nogoods {
				for _, l := range ng {
					if !l.IsNeg() || !slices.Contains(model, l.Atom()) {
						t.Fatalf("nogood %v is not a clause against the model's starts", ng)
					}
				}
			}
			if !tc.incomplete {
				if ok, _ := bruteFeasible(term); ok {
					t.Fatal("a proved room conflict, but exhaustive search finds a timetable")
				}
			}
		})
	}
}

// TestDecodeObeysContext: when ctx has ended, the exact room searches do
// not run and Decode returns ctx's error instead of an unproved conflict.
func TestDecodeObeysContext(t *testing.T) {
	term := roomsImpossible()
	model, cat := onlyModel(t, term)
	ctx, cancel := context.WithCancel(context.Background())
	cancel()
	_, err := DecodeContext(ctx, term, cat, model)
	if !errors.Is(err, context.Canceled) {
		t.Fatalf("decode error = %v, want context.Canceled", err)
	}
	if _, err := DecodeContext(context.Background(), term, cat, model); err == nil {
		t.Fatal("decode without a deadline found rooms for an impossible term")
	}
}

// Terms whose fast room assignment fails for want of a laboratory.
var (
	// T (two periods from 09:00, any room) takes a laboratory, its best
	// fit, at 09:00; at 10:00 the laboratory sections P and Q need both
	// laboratories. Every period passes Hall's condition; moving T to the
	// classroom C1 rooms everyone.
	roomsLabTaken = func() *timetable.Term {
		return newTerm(1, 3).room("L1", 30, "lab").room("L2", 30, "lab").room("C1", 40).
			section("T", meetings(1, 2), sized(30), fixedAt(time.Monday, 9, "")).
			section("P", needs("lab"), sized(20), fixedAt(time.Monday, 10, "")).
			section("Q", needs("lab"), sized(20), fixedAt(time.Monday, 10, "")).t
	}
	// The laboratory sections A (L1 only, 10:00), B (L2 only, 09:00) and
	// the two-period Y (09:00-11:00) cannot all get laboratories, though
	// each period on its own has enough; T and U, which may use the
	// classroom, are not part of the conflict.
	roomsLabConflict = func() *timetable.Term {
		return newTerm(1, 3).room("L1", 30, "lab").room("L2", 30, "lab").room("C1", 40).
			section("A", roomsOf("L1"), needs("lab"), fixedAt(time.Monday, 10, "")).
			section("B", roomsOf("L2"), needs("lab"), fixedAt(time.Monday, 9, "")).
			section("Y", meetings(1, 2), needs("lab"), fixedAt(time.Monday, 9, "")).
			section("T", sized(25), fixedAt(time.Monday, 9, "")).
			section("U", sized(25), fixedAt(time.Monday, 11, "")).t
	}
)

// TestRoomRepairSteps runs each step of Decode's room repair on its own
// (the others switched off): the second pass of the fast assignment by
// room pressure, the family repair (a room family's own meetings solved
// exactly, the others placed around them), the isolated neighbourhood
// proof and the local repair. Feasibility is checked against an
// exhaustive search over every start and room that only timetable.Check
// judges (bruteFeasible); a proved conflict must be one that exhaustive
// search confirms, and must name only the sections given.
func TestRoomRepairSteps(t *testing.T) {
	// Without any step the last resort gives an unproved conflict (no
	// component is searched whole): each step below must do better.
	none := roomEffort{maxIsolated: 800, maxFamily: 1500}
	pressure := none
	pressure.pressurePass = true
	family := none
	family.familyConflicts = 50000
	isolated := none
	isolated.isolatedHops, isolated.localConflicts = 4, 20000
	local := none
	local.localHops, local.localConflicts, local.eachConflicts = 3, 20000, 1000
	tests := []struct {
		name     string
		term     func() *timetable.Term
		effort   roomEffort
		feasible bool     // Decode assigns rooms
		only     []string // a proved conflict names only these sections
	}{
		{"no repair fails", roomsLabTaken, none, false, nil},
		{"pressure pass keeps the laboratories", roomsLabTaken, pressure, true, nil},
		{"family repair moves T out", roomsLabTaken, family, true, nil},
		{"family repair proves the laboratories short", roomsLabConflict, family, false, []string{"A", "B", "Y"}},
		{"isolated neighbourhood proves a conflict", roomsImpossible, isolated, false, []string{"X", "W", "Y"}},
		{"local repair moves the same-room pair", roomsRepairable, local, true, nil},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			term := tc.term()
			feasible, _ := bruteFeasible(term)
			model, cat := onlyModel(t, term)
			sched, err := decodeWith(context.Background(), term, cat, model, tc.effort)
			if tc.feasible {
				requireRooms(t, term, sched, err, feasible)
				return
			}
			var rerr *RoomConflictError
			if !errors.As(err, &rerr) {
				t.Fatalf("decode error = %v, want a RoomConflictError", err)
			}
			if tc.only == nil {
				if !rerr.Incomplete {
					t.Fatal("an unproved conflict is not marked Incomplete")
				}
				if !feasible {
					t.Fatal("the term has no timetable: the case must be a feasible one")
				}
				return
			}
			if rerr.Incomplete {
				t.Fatalf("conflict %v not proved", rerr.Sections)
			}
			if feasible {
				t.Fatal("a proved room conflict, but exhaustive search finds a timetable")
			}
			for _, s := range rerr.Sections {
				if !slices.Contains(tc.only, s) {
					t.Fatalf("conflict %v names %s, want only sections of %v", rerr.Sections, s, tc.only)
				}
			}
		})
	}
}

// requireRooms fails unless Decode assigned rooms (no error) to a
// timetable that passes timetable.Check, on a term exhaustive search
// finds feasible.
func requireRooms(t *testing.T, term *timetable.Term, sched *timetable.Schedule, err error, feasible bool) {
	t.Helper()
	if err != nil {
		t.Fatalf("decode: %v, want rooms", err)
	}
	if hard := timetable.HardViolations(timetable.Check(term, sched)); len(hard) > 0 {
		t.Fatalf("check: %s", hard[0].Msg)
	}
	if !feasible {
		t.Fatal("exhaustive search finds no timetable, but Decode assigned rooms")
	}
}
