package encode

import (
	"fmt"
	"math/rand/v2"
	"testing"

	"github.com/termwright/termwright/timetable"
)

// classTeacher builds a class–teacher term: n teachers, n classes, one day
// of P periods, no rooms; the sections are the edges of a bipartite
// multigraph in which every teacher and class has exactly load meetings (a
// union of load random perfect matchings), plus extra edges.
func classTeacher(rng *rand.Rand, n, periods, load int, extra [][2]int) *timetable.Term {
	b := newTerm(1, periods)
	k := 0
	add := func(tch, cls int) {
		k++
		b.section(fmt.Sprintf("S%d", k), noRoom, staffOf(fmt.Sprintf("T%d", tch)), cohortsOf(fmt.Sprintf("C%d", cls)))
	}
	for m := 0; m < load; m++ {
		for tch, cls := range rng.Perm(n) {
			add(tch, cls)
		}
	}
	for _, e := range extra {
		add(e[0], e[1])
	}
	return b.t
}

// TestKonigEdgeColouring: a bipartite multigraph's edges can be coloured
// with Δ colours (König 1916, bipartite graphs are class 1). A class–teacher
// term with unlimited rooms and no unavailability is therefore feasible with
// P periods exactly when no teacher and no class has more than P meetings.
func TestKonigEdgeColouring(t *testing.T) {
	rng := rand.New(rand.NewPCG(1, 2))
	for trial := 0; trial < 6; trial++ {
		n := 4 + rng.IntN(3)
		p := 3 + rng.IntN(3)
		t.Run(fmt.Sprintf("n=%d,P=%d,#%d", n, p, trial), func(t *testing.T) {
			// Load exactly P everywhere, plus random edges between a
			// teacher and a class that still have room: feasible.
			term := classTeacher(rng, n, p, p-1, nil)
			tl := make([]int, n)
			cl := make([]int, n)
			for _, s := range term.Sections {
				tl[s.Staff[0][1]-'0']++
				cl[s.Cohorts[0][1]-'0']++
			}
			var extra [][2]int
			for tch := 0; tch < n; tch++ {
				extra = append(extra, [2]int{tch, (tch + trial) % n})
			}
			term = classTeacher(rand.New(rand.NewPCG(uint64(trial), 9)), n, p, p-1, extra)
			out := solveBoth(t, term)
			if !out.feasible {
				t.Fatalf("load %d with %d periods: infeasible, want feasible (König)", p, p)
			}
			// One more meeting for teacher 0: load P+1.
			term = classTeacher(rand.New(rand.NewPCG(uint64(trial), 9)), n, p, p-1, append(extra, [2]int{0, 1}))
			if out := solveBoth(t, term); out.feasible {
				t.Fatalf("teacher load %d with %d periods: feasible, want infeasible", p+1, p)
			}
		})
	}
}

// mycielski returns the edges of the Mycielskian of a graph on n vertices
// (Mycielski 1955): vertices v_i, u_i and w; u_i is joined to the
// neighbours of v_i and w to every u_i. It raises the chromatic number by
// one and keeps the graph triangle-free.
func mycielski(n int, edges [][2]int) (int, [][2]int) {
	out := append([][2]int(nil), edges...)
	for _, e := range edges {
		out = append(out, [2]int{e[0], n + e[1]}, [2]int{e[1], n + e[0]})
	}
	w := 2 * n
	for i := 0; i < n; i++ {
		out = append(out, [2]int{n + i, w})
	}
	return 2*n + 1, out
}

// colouringTerm: sections are the vertices, each edge a cohort shared by
// its two end sections, one day of the given number of periods, no rooms.
func colouringTerm(n int, edges [][2]int, periods int) *timetable.Term {
	b := newTerm(1, periods)
	coh := make([][]string, n)
	for k, e := range edges {
		id := fmt.Sprintf("E%d", k)
		coh[e[0]] = append(coh[e[0]], id)
		coh[e[1]] = append(coh[e[1]], id)
	}
	for v := 0; v < n; v++ {
		b.section(fmt.Sprintf("V%d", v), noRoom, cohortsOf(coh[v]...))
	}
	return b.t
}

// TestMycielskiColouring: the Mycielski graphs M4 (the Grötzsch graph, 11
// vertices) and M5 (23 vertices) have chromatic numbers 4 and 5 (Mycielski
// 1955): the colouring term is feasible with χ periods and not with χ−1.
func TestMycielskiColouring(t *testing.T) {
	n, edges := 2, [][2]int{{0, 1}} // M2 = K2
	n, edges = mycielski(n, edges)  // M3 = C5
	n4, e4 := mycielski(n, edges)   // M4, Grötzsch graph
	n5, e5 := mycielski(n4, e4)     // M5
	if n4 != 11 || len(e4) != 20 || n5 != 23 || len(e5) != 71 {
		t.Fatalf("Mycielski graphs have %d/%d and %d/%d vertices/edges, want 11/20 and 23/71", n4, len(e4), n5, len(e5))
	}
	cases := []struct {
		name  string
		n     int
		edges [][2]int
		chi   int
	}{
		{"Grötzsch M4", n4, e4, 4},
		{"M5", n5, e5, 5},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			if testing.Short() && tc.chi > 4 {
				t.Skip("M5 with 4 periods takes a few seconds")
			}
			if out := solveBoth(t, colouringTerm(tc.n, tc.edges, tc.chi)); !out.feasible {
				t.Fatalf("%d periods: infeasible, want feasible", tc.chi)
			}
			if out := solveBoth(t, colouringTerm(tc.n, tc.edges, tc.chi-1)); out.feasible {
				t.Fatalf("%d periods: feasible, want infeasible", tc.chi-1)
			}
		})
	}
}

// TestHallRooms: meetings held at one time can be given distinct rooms that
// suit them exactly when every k of them have at least k suitable rooms
// between them (Hall 1935).
func TestHallRooms(t *testing.T) {
	type sec struct {
		size  int
		rooms []string
	}
	cases := []struct {
		name     string
		rooms    []int // capacities of R1, R2, ...
		secs     []sec
		feasible bool
		lazy     bool // needs a room family found by Decode
	}{
		{"k in k rooms", []int{30, 30, 30}, []sec{{20, nil}, {20, nil}, {20, nil}}, true, false},
		{"k+1 in k rooms", []int{30, 30, 30}, []sec{{20, nil}, {20, nil}, {20, nil}, {20, nil}}, false, false},
		{"nested capacities fit", []int{10, 20, 30, 40, 50}, []sec{{45, nil}, {35, nil}, {25, nil}, {15, nil}, {5, nil}}, true, false},
		{"nested capacities short at 35", []int{10, 20, 30, 40, 50}, []sec{{45, nil}, {35, nil}, {35, nil}, {15, nil}, {5, nil}}, false, false},
		{"nested capacities short at 45", []int{10, 20, 30, 40, 50}, []sec{{45, nil}, {45, nil}}, false, false},
		// Allowed lists A={R1,R2} (twice), B={R2,R3}, C={R3,R4} (twice),
		// D={R4,R5,R6}: the deficient set {R1..R4} (five meetings, four
		// rooms) is no candidate set, no pairwise union and not the
		// component's union, so Decode must find it.
		{"crossing sets need a lazy family", []int{30, 30, 30, 30, 30, 30}, []sec{
			{10, []string{"R1", "R2"}}, {10, []string{"R1", "R2"}}, {10, []string{"R2", "R3"}},
			{10, []string{"R3", "R4"}}, {10, []string{"R3", "R4"}}, {10, []string{"R4", "R5", "R6"}}}, false, true},
		{"crossing sets fit", []int{30, 30, 30, 30, 30}, []sec{
			{10, []string{"R1", "R2"}}, {10, []string{"R1", "R2"}}, {10, []string{"R2", "R3"}},
			{10, []string{"R3", "R4"}}, {10, []string{"R4", "R5"}}}, true, false},
	}
	for _, tc := range cases {
		t.Run(tc.name, func(t *testing.T) {
			b := newTerm(1, 1)
			for i, c := range tc.rooms {
				b.room(fmt.Sprintf("R%d", i+1), c)
			}
			for i, s := range tc.secs {
				b.section(fmt.Sprintf("S%d", i+1), sized(s.size), roomsOf(s.rooms...))
			}
			out := solveBoth(t, b.t)
			if out.feasible != tc.feasible {
				t.Fatalf("feasible = %v, want %v", out.feasible, tc.feasible)
			}
			if tc.lazy && out.hallCuts == 0 {
				t.Fatalf("no lazy Hall family was needed, want one")
			}
		})
	}
}
