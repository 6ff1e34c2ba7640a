package encode

import (
	"errors"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestRoomConflictAcrossPeriods: a two-period meeting needs one room for
// both periods. Each period on its own has enough rooms, but the only rooms
// are taken in one period each, so the combination is impossible and
// Decode's exact search proves it; with a second day the meeting moves.
func TestRoomConflictAcrossPeriods(t *testing.T) {
	build := func(days int) *timetable.Term {
		return newTerm(days, 2).room("R1", 30).room("R2", 40).
			section("X", roomsOf("R1"), fixedAt(time.Monday, 10, "")).
			section("W", roomsOf("R2"), fixedAt(time.Monday, 9, "")).
			section("Y", meetings(1, 2), sized(25)).t
	}
	out := solveBoth(t, build(1))
	if out.feasible {
		t.Fatalf("one day: feasible, want infeasible")
	}
	if out.nogoods == 0 {
		t.Fatalf("one day: no room conflict was found, want one")
	}
	out = solveBoth(t, build(2))
	if !out.feasible {
		t.Fatalf("two days: infeasible, want feasible")
	}
}

// TestDecodeHallError: a model that puts more meetings in a period than
// their rooms can hold is refused with the deficient room set.
func TestDecodeHallError(t *testing.T) {
	term := newTerm(1, 2).room("R1", 30).room("R2", 30).room("R3", 30).
		section("A", roomsOf("R1", "R2")).section("B", roomsOf("R1", "R2")).section("C", roomsOf("R1", "R2")).
		section("D", roomsOf("R3")).t
	p, cat, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	// Everything at Mon 09:00 (the program forbids it; Decode must notice
	// on its own).
	var model []solver.Atom
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		info := cat.AtomInfo(a)
		if info.Kind == AtomSelector || (info.Kind == AtomStart && info.Period == 0) {
			model = append(model, a)
		}
	}
	_, err = Decode(term, cat, model)
	var herr *HallError
	if !errors.As(err, &herr) {
		t.Fatalf("Decode error = %v, want a HallError", err)
	}
	if herr.Period != 0 || len(herr.Rooms) != 2 || herr.Rooms[0] != "R1" || herr.Rooms[1] != "R2" || len(herr.Sections) != 3 {
		t.Fatalf("HallError = %+v, want period 0, rooms R1 R2 and sections A, B, C", herr)
	}
	if herr.Error() == "" {
		t.Fatal("empty message")
	}
}

// TestDecodeMeetingNumbersAndStability: meetings are numbered in period
// order, and a section keeps one room when it can.
func TestDecodeMeetingNumbersAndStability(t *testing.T) {
	term := newTerm(3, 2).room("R1", 30).room("R2", 50).room("R3", 40).
		section("A", meetings(3, 1), sized(35)).section("B", meetings(2, 1), sized(20)).t
	out := solveBoth(t, term)
	if !out.feasible {
		t.Fatal("infeasible")
	}
	rooms := map[string]map[string]bool{}
	last := map[string]int{}
	for _, pl := range out.sched.Placements {
		if rooms[pl.Section] == nil {
			rooms[pl.Section] = map[string]bool{}
		}
		rooms[pl.Section][pl.Room] = true
		if pl.Meeting != last[pl.Section]+1 {
			t.Fatalf("meeting numbers out of order: %+v", out.sched.Placements)
		}
		last[pl.Section] = pl.Meeting
	}
	if len(rooms["A"]) != 1 || !rooms["A"]["R3"] {
		t.Errorf("section A (35 students) uses rooms %v, want only R3 (best fit)", rooms["A"])
	}
	if len(rooms["B"]) != 1 || !rooms["B"]["R1"] {
		t.Errorf("section B (20 students) uses rooms %v, want only R1 (best fit)", rooms["B"])
	}
}

// TestDecodeRejectsForeignModel: a model with the wrong number of meetings
// is an error, not a timetable.
func TestDecodeRejectsForeignModel(t *testing.T) {
	term := newTerm(1, 2).room("R1", 30).section("A", meetings(1, 1)).t
	_, cat, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Decode(term, cat, nil); err == nil {
		t.Fatal("Decode accepted a model without meetings")
	}
}

// TestRoomRepairKeepsSameRoom: the fast assignment puts a same-room group
// in the room a two-period meeting needs; repairing that must move the
// whole group, not just its meeting in the way.
func TestRoomRepairKeepsSameRoom(t *testing.T) {
	term := newTerm(2, 2).room("R1", 30).room("R2", 30).room("R3", 30).room("R4", 30).
		section("G1", roomsOf("R1", "R4"), fixedAt(time.Monday, 9, "")).
		section("G2", roomsOf("R1", "R4"), fixedAt(time.Tuesday, 9, "")).
		section("V", roomsOf("R3"), fixedAt(time.Monday, 10, "")).
		section("Y", meetings(1, 2), roomsOf("R1", "R3"), fixedAt(time.Monday, 9, "")).
		relation(timetable.SameRoom, "G1", "G2").t
	out := solveBoth(t, term)
	if !out.feasible {
		t.Fatal("infeasible, want feasible (G1 and G2 in R4, Y in R1)")
	}
	rooms := map[string]string{}
	for _, pl := range out.sched.Placements {
		rooms[pl.Section] = pl.Room
	}
	if rooms["G1"] != "R4" || rooms["G2"] != "R4" || rooms["Y"] != "R1" {
		t.Fatalf("rooms %v, want G1 and G2 in R4, Y in R1", rooms)
	}
}
