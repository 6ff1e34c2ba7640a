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
