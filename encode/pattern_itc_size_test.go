package encode

import (
	"sort"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
)

// TestITC2019Sizes compiles the four small public ITC-2019 instances
// (skipped when absent) and checks that the program stays near-linear: at
// most 1,000 atoms and 2,000 rules and bounds per section, and logs the
// breakdown by atom and bound kind. (The limits are ours: "near-linear in
// the data" of DESIGN.md; the instances have up to a few hundred time
// choices per section.)
func TestITC2019Sizes(t *testing.T) {
	for _, name := range []string{"bet-sum18", "lums-sum17", "pu-cs-fal07", "wbg-fal10"} {
		tm := readSmallITC2019(t, name)
		t0 := time.Now()
		p, cat, err := Compile(tm, Options{HardOnly: true})
		if err != nil {
			t.Fatal(err)
		}
		el := time.Since(t0)
		st := cat.Stats(p)
		t.Logf("%s: %d sections, %d time atoms, %d room atoms, %d atoms (%.0f/section), %d rules+choices (%.0f/section), %d bounds (%.1f/section, %.0f literals/section), compiled in %v (shared machine)\n  %s\n  %s",
			name, len(tm.Sections), st.TimeAtoms, st.RoomAtoms, st.Atoms, st.AtomsPerSec, st.Rules+st.Choices, st.RulesPerSec, st.Bounds, st.BoundsPerSec, st.BoundLitsPerSc, el,
			atomBreakdown(cat, p), boundBreakdown(st))
		if st.AtomsPerSec > 1000 || st.RulesPerSec > 2000 || st.BoundsPerSec > 2000 {
			t.Errorf("%s: program not near-linear: %+v", name, st)
		}
	}
}

func atomBreakdown(cat *Catalog, p *solver.Program) string {
	count := map[string]int{}
	for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
		k := cat.AtomInfo(a).Kind.String()
		if k == "aux" {
			name := p.Name(a)
			if i := strings.IndexByte(name, '('); i > 0 {
				k = name[:i]
			}
		}
		count[k]++
	}
	return "atoms: " + sortedCounts(count)
}

func boundBreakdown(st Stats) string { return "bounds: " + sortedCounts(st.BoundsByKind) }

func sortedCounts(m map[string]int) string {
	keys := make([]string, 0, len(m))
	for k := range m {
		keys = append(keys, k)
	}
	sort.Strings(keys)
	var parts []string
	for _, k := range keys {
		parts = append(parts, k+" "+itoa(m[k]))
	}
	return strings.Join(parts, ", ")
}
