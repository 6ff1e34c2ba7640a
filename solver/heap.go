package solver

// varHeap is an indexed binary max-heap of variables ordered by activity
// (ties: smaller variable first). Insert, removal of the maximum and
// increase of a key are O(log n); membership is O(1).
type varHeap struct {
	heap     []uint32   // heap[i] is a variable; heap[0] has the highest activity
	index    []int32    // index[v] is v's position in heap, or -1 when absent
	activity *[]float64 // the solver's activity table (shared, not owned)
}

func (h *varHeap) less(a, b uint32) bool {
	act := *h.activity
	if act[a] != act[b] {
		return act[a] > act[b]
	}
	return a < b
}

// grow makes room for variables up to v (absent from the heap).
func (h *varHeap) grow(v uint32) {
	for uint32(len(h.index)) <= v {
		h.index = append(h.index, -1)
	}
}

func (h *varHeap) contains(v uint32) bool { return int(v) < len(h.index) && h.index[v] >= 0 }

func (h *varHeap) empty() bool { return len(h.heap) == 0 }

// insert adds v if absent.
func (h *varHeap) insert(v uint32) {
	if h.contains(v) {
		return
	}
	h.index[v] = int32(len(h.heap))
	h.heap = append(h.heap, v)
	h.up(len(h.heap) - 1)
}

// increased restores the heap after v's activity grew.
func (h *varHeap) increased(v uint32) {
	if h.contains(v) {
		h.up(int(h.index[v]))
	}
}

// removeMax removes and returns the most active variable; the heap must not
// be empty.
func (h *varHeap) removeMax() uint32 {
	v := h.heap[0]
	last := h.heap[len(h.heap)-1]
	h.heap = h.heap[:len(h.heap)-1]
	h.index[v] = -1
	if len(h.heap) > 0 {
		h.heap[0] = last
		h.index[last] = 0
		h.down(0)
	}
	return v
}

func (h *varHeap) up(i int) {
	v := h.heap[i]
	for i > 0 {
		parent := (i - 1) >> 1
		if !h.less(v, h.heap[parent]) {
			break
		}
		h.heap[i] = h.heap[parent]
		h.index[h.heap[i]] = int32(i)
		i = parent
	}
	h.heap[i] = v
	h.index[v] = int32(i)
}

func (h *varHeap) down(i int) {
	v := h.heap[i]
	n := len(h.heap)
	for {
		child := 2*i + 1
		if child >= n {
			break
		}
		if r := child + 1; r < n && h.less(h.heap[r], h.heap[child]) {
			child = r
		}
		if !h.less(h.heap[child], v) {
			break
		}
		h.heap[i] = h.heap[child]
		h.index[h.heap[i]] = int32(i)
		i = child
	}
	h.heap[i] = v
	h.index[v] = int32(i)
}

// keepOnly removes from the heap every variable for which keep is false and
// restores the heap property bottom-up: O(n), against O(k log n) for k
// removals of the maximum. The order of later removals is unchanged, since
// the order (activity, then variable) is total.
func (h *varHeap) keepOnly(keep func(v uint32) bool) {
	j := 0
	for _, v := range h.heap {
		if keep(v) {
			h.heap[j] = v
			h.index[v] = int32(j)
			j++
		} else {
			h.index[v] = -1
		}
	}
	h.heap = h.heap[:j]
	for i := j/2 - 1; i >= 0; i-- {
		h.down(i)
	}
}
