package solver

import (
	"testing"

	"github.com/stretchr/testify/require"
)

// engGraph builds the compressed adjacency of a graph on 1..n.
func engGraph(n int, edges [][2]uint32) ([]uint32, []uint32) {
	lists := make([][]uint32, n+1)
	for _, e := range edges {
		lists[e[0]] = append(lists[e[0]], e[1])
	}
	start, flat := flatten(lists)
	return append(start, start[len(start)-1]), flat
}

func TestCyclicComponents(t *testing.T) {
	cases := []struct {
		name   string
		n      int
		edges  [][2]uint32
		cyclic [][]uint32 // groups of vertices in one cyclic component
	}{
		{"acyclic chain", 4, [][2]uint32{{1, 2}, {2, 3}, {3, 4}}, nil},
		{"self loop", 3, [][2]uint32{{1, 2}, {2, 2}}, [][]uint32{{2}}},
		{"two cycles joined by a bridge", 6, [][2]uint32{{1, 2}, {2, 1}, {2, 3}, {3, 4}, {4, 5}, {5, 3}, {5, 6}},
			[][]uint32{{1, 2}, {3, 4, 5}}},
		{"nested", 5, [][2]uint32{{1, 2}, {2, 3}, {3, 1}, {3, 4}, {4, 3}, {4, 5}}, [][]uint32{{1, 2, 3, 4}}},
		{"empty", 0, nil, nil},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			start, adj := engGraph(c.n, c.edges)
			comp, k := cyclicComponents(c.n, start, adj)
			require.Equal(t, len(c.cyclic), k)
			inCycle := map[uint32]bool{}
			for _, g := range c.cyclic {
				for _, v := range g {
					inCycle[v] = true
					require.NotZero(t, comp[v])
					require.Equal(t, comp[g[0]], comp[v])
				}
			}
			for v := 1; v <= c.n; v++ {
				if !inCycle[uint32(v)] {
					require.Zero(t, comp[v], "vertex %d is on no cycle", v)
				}
			}
		})
	}
}

// TestCyclicComponentsDeep: a cycle of a million vertices needs no deep
// recursion.
func TestCyclicComponentsDeep(t *testing.T) {
	n := 1_000_000
	if testing.Short() {
		n = 50_000
	}
	edges := make([][2]uint32, n)
	for v := 1; v <= n; v++ {
		edges[v-1] = [2]uint32{uint32(v), uint32(v%n + 1)}
	}
	start, adj := engGraph(n, edges)
	comp, k := cyclicComponents(n, start, adj)
	require.Equal(t, 1, k)
	require.Equal(t, uint32(1), comp[n])
}
