package encode

import (
	"context"
	"fmt"
	"testing"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// TestGeneratedTerms: the generator builds every term around a hidden
// timetable that meets all hard requirements, so Solve must find one; it
// must pass timetable.Check (Solve checks it, and so does this test).
func TestGeneratedTerms(t *testing.T) {
	type cfg struct{ sections, seeds int }
	cfgs := []cfg{{40, 6}, {150, 3}, {400, 2}}
	if testing.Short() {
		cfgs = []cfg{{40, 2}, {150, 1}}
	}
	for _, c := range cfgs {
		for seed := 1; seed <= c.seeds; seed++ {
			t.Run(fmt.Sprintf("sections=%d,seed=%d", c.sections, seed), func(t *testing.T) {
				term, witness := samples.GenerateWithWitness(samples.Config{Sections: c.sections, Seed: uint64(seed)})
				if hard := timetable.HardViolations(timetable.Check(term, witness)); len(hard) > 0 {
					t.Fatalf("the generator's witness breaks %d hard requirements (%s): the generator promises a feasible term", len(hard), hard[0].Msg)
				}
				res, err := Solve(context.Background(), term, SolveOptions{Seed: int64(seed)})
				if err != nil {
					t.Fatal(err)
				}
				if res.Status != solver.Satisfiable {
					t.Fatalf("status %v, want satisfiable (the generator's witness is a timetable)", res.Status)
				}
				if hard := timetable.HardViolations(timetable.Check(term, res.Schedule)); len(hard) > 0 {
					t.Fatalf("check: %s", hard[0].Msg)
				}
				t.Logf("%d rounds, %d room families added, %d room conflicts; %v", res.Rounds, res.HallCuts, res.Nogoods, res.Timings)
			})
		}
	}
}

// TestTightRooms: a generated term with most of its rooms taken away, so
// that room families run at capacity and meetings of several periods and
// week patterns must share rooms exactly; and with a few rooms fewer, where
// counting proves there is no timetable. Whatever Solve says must hold
// (a returned timetable passes Check inside Solve).
func TestTightRooms(t *testing.T) {
	if testing.Short() {
		t.Skip("a few seconds of search")
	}
	for _, tc := range []struct {
		keep int
		want solver.Status
	}{{45, solver.Satisfiable}, {40, solver.Unsatisfiable}} {
		t.Run(fmt.Sprintf("keep %d%% of rooms", tc.keep), func(t *testing.T) {
			term := samples.Generate(samples.Config{Sections: 400, Seed: 3})
			keepRooms(term, len(term.Rooms)*tc.keep/100)
			res, err := Solve(context.Background(), term, SolveOptions{Seed: 1})
			if err != nil {
				t.Fatal(err)
			}
			if res.Status != tc.want {
				t.Fatalf("status %v, want %v", res.Status, tc.want)
			}
			t.Logf("%d rounds, %d room families added, %d room conflicts, %d conflicts", res.Rounds, res.HallCuts, res.Nogoods, res.Engine.Conflicts)
		})
	}
}

// keepRooms removes all but the first n rooms and every reference to the
// others.
func keepRooms(term *timetable.Term, n int) {
	kept := map[string]bool{}
	for _, r := range term.Rooms[:n] {
		kept[r.ID] = true
	}
	term.Rooms = term.Rooms[:n]
	for i := range term.Sections {
		s := &term.Sections[i]
		var rs []string
		for _, r := range s.Rooms {
			if kept[r] {
				rs = append(rs, r)
			}
		}
		s.Rooms = rs
		for k := range s.Fixed {
			if !kept[s.Fixed[k].Room] {
				s.Fixed[k].Room = ""
			}
		}
	}
	var un []timetable.Unavailability
	for _, u := range term.Unavailable {
		if u.Kind != timetable.WhoRoom || kept[u.Who] {
			un = append(un, u)
		}
	}
	term.Unavailable = un
}
