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
					t.Skipf("the generator's witness breaks %d hard requirements (%s): not a feasibility test", len(hard), hard[0].Msg)
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
