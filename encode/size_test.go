package encode

import (
	"testing"
	"time"
)

// TestProgramSize keeps the program of the hard requirements near-linear in
// the data: per section, atoms, rules and bounds stay within fixed budgets as
// the term grows.
func TestProgramSize(t *testing.T) {
	sizes := []int{150, 600}
	if !testing.Short() {
		sizes = append(sizes, 2000)
	}
	for _, n := range sizes {
		term := syntheticTerm(n, 1)
		t0 := time.Now()
		p, cat, err := Compile(term, Options{HardOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		st := cat.Stats(p)
		t.Logf("%d sections: %v; atoms %d (%.1f/section), rules %d (%.1f), bounds %d (%.1f), bound literals %d (%.1f); families %d; by kind %v",
			n, time.Since(t0), st.Atoms, st.AtomsPerSec, st.Rules+st.Choices, st.RulesPerSec, st.Bounds, st.BoundsPerSec, st.BoundLits, st.BoundLitsPerSc, st.RoomFamilies, st.BoundsByKind)
		if st.AtomsPerSec > 120 || st.BoundsPerSec > 150 || st.BoundLitsPerSc > 3000 {
			t.Errorf("program grows too fast: %+v", st)
		}
	}
}
