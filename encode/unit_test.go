package encode

import (
	"bytes"
	"errors"
	"fmt"
	"math/rand/v2"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

func TestWeekScopes(t *testing.T) {
	const (
		odd  = timetable.WeekSet(0b0101)
		even = timetable.WeekSet(0b1010)
		all  = timetable.WeekSet(0b1111)
	)
	cases := []struct {
		name string
		sets []timetable.WeekSet
		want [][]int
	}{
		{"all equal", []timetable.WeekSet{all, all, all}, [][]int{{0, 1, 2}}},
		{"odd and even apart", []timetable.WeekSet{odd, even}, [][]int{{0}, {1}}},
		{"all meets both", []timetable.WeekSet{odd, even, all}, [][]int{{0, 2}, {1, 2}}},
		{"nested ranges", []timetable.WeekSet{0b0011, 0b0111, 0b1111}, [][]int{{0, 1, 2}}},
		{"chain of overlaps", []timetable.WeekSet{0b0011, 0b0110, 0b1100}, [][]int{{0, 1}, {1, 2}}},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			got := weekScopes(tc.sets)
			assert.ElementsMatch(t, tc.want, got)
		})
	}
	// Property: two sets share a scope exactly when they overlap.
	rng := rand.New(rand.NewPCG(3, 4))
	for trial := 0; trial < 300; trial++ {
		n := 1 + rng.IntN(6)
		sets := make([]timetable.WeekSet, n)
		for i := range sets {
			sets[i] = timetable.WeekSet(1 + rng.IntN(255))
		}
		scopes := weekScopes(sets)
		for i := 0; i < n; i++ {
			for j := i + 1; j < n; j++ {
				together := false
				for _, sc := range scopes {
					hasI, hasJ := false, false
					for _, k := range sc {
						hasI = hasI || k == i
						hasJ = hasJ || k == j
					}
					together = together || (hasI && hasJ)
				}
				require.Equal(t, sets[i].Overlaps(sets[j]), together, "sets %b and %b, scopes %v", sets[i], sets[j], scopes)
			}
		}
	}
}

// TestMatchingHall: the maximum matching covers every meeting exactly when
// no set Z of meetings has fewer than |Z| rooms between them (Hall 1935);
// the deficient set reported has |N(Z)| < |Z|. Checked against brute force
// over all subsets on random small graphs.
func TestMatchingHall(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for trial := 0; trial < 500; trial++ {
		nl, nr := 1+rng.IntN(6), 1+rng.IntN(5)
		adj := make([][]int, nl)
		for l := range adj {
			for r := 0; r < nr; r++ {
				if rng.IntN(3) == 0 {
					adj[l] = append(adj[l], r)
				}
			}
		}
		hallHolds := true
		for mask := 1; mask < 1<<nl; mask++ {
			nb := map[int]bool{}
			size := 0
			for l := 0; l < nl; l++ {
				if mask&(1<<l) != 0 {
					size++
					for _, r := range adj[l] {
						nb[r] = true
					}
				}
			}
			if len(nb) < size {
				hallHolds = false
			}
		}
		g := newBipartite(adj, nr)
		full := g.maxMatching() == nl
		require.Equal(t, hallHolds, full, "adj %v", adj)
		z, nz := g.deficient()
		if full {
			require.Nil(t, z)
			continue
		}
		require.Less(t, len(nz), len(z), "deficient set %v with neighbours %v in %v", z, nz, adj)
		nb := map[int]bool{}
		for _, l := range z {
			for _, r := range adj[l] {
				nb[r] = true
			}
		}
		require.Equal(t, len(nb), len(nz), "N(Z) is the whole neighbourhood")
	}
}

func TestRoomSet(t *testing.T) {
	a, b := newRoomSet(130), newRoomSet(130)
	for _, r := range []int{0, 64, 129} {
		a.add(r)
	}
	b.add(64)
	assert.Equal(t, 3, a.count())
	assert.True(t, b.subsetOf(a))
	assert.False(t, a.subsetOf(b))
	assert.True(t, a.intersects(b))
	assert.Equal(t, []int{0, 64, 129}, a.members())
	assert.Equal(t, []int{64}, a.intersect(b).members())
	var tab setTable
	assert.Equal(t, tab.intern(a), tab.intern(a.clone()))
	assert.NotEqual(t, tab.intern(a), tab.intern(b))
}

func TestCompileErrors(t *testing.T) {
	term := newTerm(1, 2).room("R1", 30).
		section("A", staffOf("T1"), roomsOf("R9")).
		section("B", func(s *timetable.Section) {
			s.Fixed = []timetable.Fixed{{Day: time.Sunday, Start: 9 * 60, Text: "Sun 09:00"}}
		}).
		relation(timetable.SameTime, "A", "GHOST").t
	term.Sections[0].Cohorts = []string{"NOPE"}
	_, _, err := Compile(term, Options{})
	var ce CompileError
	require.True(t, errors.As(err, &ce), "error %v", err)
	msg := err.Error()
	for _, want := range []string{
		`Sections row 2: section A: cohort "NOPE" is not on the Cohorts sheet`,
		`Sections row 2: section A: room "R9" is not on the Rooms sheet`,
		`Sections row 3: section B: fixed meeting "Sun 09:00" is not at the start of a period of the grid`,
		`Relations row 2: relation "same time" names section "GHOST"`,
	} {
		assert.Contains(t, msg, want)
	}
}

func TestCatalog(t *testing.T) {
	term := newTerm(2, 2).room("R1", 30).
		section("A", staffOf("T"), meetings(2, 1)).section("B", staffOf("T")).t
	p, cat, err := Compile(term, Options{})
	require.NoError(t, err)
	// Start atoms by section and period.
	require.Equal(t, []int{0, 1, 2, 3}, cat.Candidates(0))
	a := cat.StartAtom(0, 2)
	require.NotZero(t, a)
	info := cat.AtomInfo(a)
	assert.Equal(t, AtomStart, info.Kind)
	assert.Equal(t, 0, info.Section)
	assert.Equal(t, 2, info.Period)
	assert.Equal(t, `start("A",tue_09_00)`, p.Name(a))
	assert.Zero(t, cat.StartAtom(0, 99))
	assert.Equal(t, AtomNone, cat.AtomInfo(0).Kind)
	// Every group's selector maps back to it, and every statement of a
	// group's constraints mentions its selector.
	kinds := map[string]bool{}
	for i, g := range cat.Groups {
		got, ok := cat.GroupOf(g.Selector)
		require.True(t, ok)
		assert.Equal(t, i, got.ID)
		kinds[g.Kind] = true
	}
	assert.True(t, kinds[KindStaffNoOverlap] && kinds[KindSectionDays], "kinds %v", kinds)
	_, ok := cat.GroupOf(a)
	assert.False(t, ok)
	for i, b := range p.Bounds {
		g := cat.statementGroup(solver.KindBound, i)
		if g < 0 {
			continue
		}
		sel := cat.Groups[g].Selector
		found := false
		for _, l := range b.Cond {
			found = found || l == solver.Pos(sel)
		}
		assert.True(t, found, "bound %d of group %q lacks its selector", i, cat.Groups[g].Kind)
	}
	assert.Len(t, cat.Selectors(), len(cat.Groups))
	st := cat.Stats(p)
	assert.Equal(t, p.NumAtoms(), st.Atoms)
	assert.Equal(t, 8, st.StartAtoms) // A and B: 4 periods each
	assert.Equal(t, "", cat.Comment(solver.KindBound, 0), "exactly-m bounds belong to no group")
	assert.Contains(t, cat.Comment(solver.KindBound, len(p.Bounds)-1), "[room supply] room R1 holds one meeting at a time")
}

// TestDemoProgramPrints: the demo's program prints in the text form (atom
// names are unique ground terms) and reads back to the same size.
func TestDemoProgramPrints(t *testing.T) {
	term := samples.Demo()
	for _, explain := range []bool{false, true} {
		t.Run(fmt.Sprint("explain=", explain), func(t *testing.T) {
			p, cat, err := Compile(term, Options{Explain: explain})
			require.NoError(t, err)
			var buf bytes.Buffer
			require.NoError(t, solver.WriteProgramComments(&buf, p, cat.Commenter()))
			text := buf.String()
			assert.Contains(t, text, "% [cohort no-overlap]")
			q, err := solver.ReadProgram(strings.NewReader(text), "demo.lp")
			require.NoError(t, err)
			assert.Equal(t, p.NumAtoms(), q.NumAtoms())
			assert.Equal(t, len(p.Bounds), len(q.Bounds))
		})
	}
}
