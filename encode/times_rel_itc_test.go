package encode

import (
	"testing"
	"time"
)

// TestITC2019RelationSizes compiles the four small public ITC-2019
// instances (skipped when absent) with and without their relation rows
// and logs what the rows add per row: atoms, rules + bounds + weak
// constraints, literals; hard and soft rows together, weekly limits and
// lunch breaks not involved. It fails when a row costs more than 5,000
// statements on average (our limit for "near-linear", DESIGN.md).
func TestITC2019RelationSizes(t *testing.T) {
	for _, name := range []string{"bet-sum18", "lums-sum17", "pu-cs-fal07", "wbg-fal10"} {
		tm := readSmallITC2019(t, name)
		kinds := map[string]int{}
		hard := 0
		for _, r := range tm.Relations {
			kinds[r.Kind.String()]++
			if r.Hard {
				hard++
			}
		}
		bare := *tm
		bare.Relations = nil
		p0, _, err := Compile(&bare, Options{})
		if err != nil {
			t.Fatal(err)
		}
		t0 := time.Now()
		p, _, err := Compile(tm, Options{})
		if err != nil {
			t.Fatal(err)
		}
		el := time.Since(t0)
		s0, s := sizeOf(p0), sizeOf(p)
		rows := max(len(tm.Relations), 1)
		st := float64(s.rules+s.bounds+s.weaks-s0.rules-s0.bounds-s0.weaks) / float64(rows)
		t.Logf("%s: %d sections, %d relation rows (%d hard): %.1f atoms, %.1f statements, %.1f literals per row; whole compile %v (shared machine)\n  rows: %s",
			name, len(tm.Sections), len(tm.Relations), hard, float64(s.atoms-s0.atoms)/float64(rows), st, float64(s.lits-s0.lits)/float64(rows), el, sortedCounts(kinds))
		if st > 5000 {
			t.Errorf("%s: %.0f statements per relation row", name, st)
		}
	}
}
