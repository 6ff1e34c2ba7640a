package solver

import (
	"math/rand/v2"
	"testing"

	"github.com/stretchr/testify/require"
)

func TestVarHeapOrder(t *testing.T) {
	r := rand.New(rand.NewPCG(1, 1))
	act := make([]float64, 201)
	h := varHeap{activity: &act}
	h.grow(200)
	for v := uint32(1); v <= 200; v++ {
		act[v] = float64(r.IntN(50))
		h.insert(v)
	}
	h.insert(7) // already present: no effect
	for k := 0; k < 30; k++ {
		v := uint32(1 + r.IntN(200))
		act[v] += 10
		h.increased(v)
	}
	prev := uint32(0)
	n := 0
	for !h.empty() {
		v := h.removeMax()
		require.False(t, h.contains(v))
		if prev != 0 {
			require.True(t, act[prev] > act[v] || (act[prev] == act[v] && prev < v),
				"most active first, ties by smaller variable")
		}
		prev = v
		n++
	}
	require.Equal(t, 200, n)
}

// TestVarHeapKeepOnly: after keepOnly the heap holds exactly the kept
// variables and yields them in the order of removeMax on the full heap
// with the others skipped.
func TestVarHeapKeepOnly(t *testing.T) {
	for seed := range uint64(20) {
		r := rand.New(rand.NewPCG(seed, 3))
		act := make([]float64, 301)
		a, b := varHeap{activity: &act}, varHeap{activity: &act}
		a.grow(300)
		b.grow(300)
		keep := make([]bool, 301)
		for v := uint32(1); v <= 300; v++ {
			act[v] = float64(r.IntN(40))
			keep[v] = r.IntN(3) != 0
			a.insert(v)
			b.insert(v)
		}
		a.keepOnly(func(v uint32) bool { return keep[v] })
		for v := uint32(1); v <= 300; v++ {
			require.Equal(t, keep[v], a.contains(v))
		}
		for !b.empty() {
			v := b.removeMax()
			if keep[v] {
				require.Equal(t, v, a.removeMax(), "seed %d", seed)
			}
		}
		require.True(t, a.empty())
	}
}
