package encode

import "math/bits"

// roomSet is a set of rooms as a bitset over Term.Rooms indexes. All sets of
// one compilation have the same length (words for len(Term.Rooms)).
type roomSet []uint64

func newRoomSet(nRooms int) roomSet { return make(roomSet, (nRooms+63)/64) }

func (s roomSet) add(r int) { s[r>>6] |= 1 << (uint(r) & 63) }

// has reports whether room r is in the set.
func (s roomSet) has(r int) bool { return s[r>>6]&(1<<(uint(r)&63)) != 0 }

// count is |s|.
func (s roomSet) count() int {
	n := 0
	for _, w := range s {
		n += bits.OnesCount64(w)
	}
	return n
}

// subsetOf reports s ⊆ o.
func (s roomSet) subsetOf(o roomSet) bool {
	for i, w := range s {
		if w&^o[i] != 0 {
			return false
		}
	}
	return true
}

// intersects reports s ∩ o ≠ ∅.
func (s roomSet) intersects(o roomSet) bool {
	for i, w := range s {
		if w&o[i] != 0 {
			return true
		}
	}
	return false
}

func (s roomSet) clone() roomSet { return append(roomSet(nil), s...) }

// union returns s ∪ o as a new set.
func (s roomSet) union(o roomSet) roomSet {
	u := s.clone()
	for i, w := range o {
		u[i] |= w
	}
	return u
}

// intersect returns s ∩ o as a new set.
func (s roomSet) intersect(o roomSet) roomSet {
	u := s.clone()
	for i, w := range o {
		u[i] &= w
	}
	return u
}

// each calls fn for every member in increasing order.
func (s roomSet) each(fn func(r int)) {
	for i, w := range s {
		for w != 0 {
			b := bits.TrailingZeros64(w)
			fn(i*64 + b)
			w &= w - 1
		}
	}
}

// members lists the members in increasing order.
func (s roomSet) members() []int {
	out := make([]int, 0, s.count())
	s.each(func(r int) { out = append(out, r) })
	return out
}

// key is a map key for the set's contents.
func (s roomSet) key() string {
	b := make([]byte, 0, len(s)*8)
	for _, w := range s {
		for k := 0; k < 8; k++ {
			b = append(b, byte(w>>(8*k)))
		}
	}
	return string(b)
}

// setTable interns room sets: equal sets get one id.
type setTable struct {
	sets []roomSet
	ids  map[string]int
}

func (t *setTable) intern(s roomSet) int {
	if t.ids == nil {
		t.ids = map[string]int{}
	}
	k := s.key()
	if id, ok := t.ids[k]; ok {
		return id
	}
	t.ids[k] = len(t.sets)
	t.sets = append(t.sets, s)
	return len(t.sets) - 1
}
