package sectioning

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

// TestClashTableForms: the dense matrix and the map (used beyond
// denseMax sections) give every pair the same count, and both agree with
// pairClash, written from the criterion's definition.
func TestClashTableForms(t *testing.T) {
	g := medium
	g.patterns, g.students = true, 20
	term, sched := genTerm(rand.New(rand.NewPCG(17, 17)), g)
	dense, sparse := newClashTableUpTo(term, sched, denseMax), newClashTableUpTo(term, sched, 0)
	require.NotNil(t, dense.dense)
	require.NotNil(t, sparse.sparse)
	n := int32(len(term.Sections))
	clashing := 0
	for a := int32(0); a < n; a++ {
		for b := int32(0); b < n; b++ {
			d := dense.get(a, b)
			require.Equal(t, d, sparse.get(b, a), "%d %d", a, b)
			if a < b && a%7 == 0 { // a sample against the slow definition
				require.Equal(t, pairClash(term, sched, int(a), int(b)), d, "%s %s", term.Sections[a].ID, term.Sections[b].ID)
			}
			if d > 0 {
				clashing++
			}
		}
	}
	require.Positive(t, clashing)
}
