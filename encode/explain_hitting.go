package encode

import (
	"slices"
	"sort"
)

// hittingSetNodes caps the search nodes of one minimum hitting set search;
// past it the best set found so far is returned, flagged as not proven.
const hittingSetNodes = 200000

// hittingSet is one minimum-cost hitting set problem: choose elements so
// that every set in sets has a chosen member, no set in blocked is chosen
// entirely, and the summed cost is least (ties: fewer elements). Elements
// are non-negative integers; cost must be positive.
type hittingSet struct {
	sets    [][]int
	blocked [][]int
	cost    func(int) int

	chosen  map[int]bool
	banned  map[int]bool
	best    []int
	bestKey int
	nodes   int
}

// minHittingSet solves the problem by branch and bound: branch on the
// members of an unhit set with fewest open members, cheapest first (after
// a member's branch it is banned, so no set is visited twice); bound by the
// cost so far plus a packing of disjoint unhit sets, each needing its
// cheapest open member. It returns the set (sorted), whether one exists,
// and whether the search finished (so the set is proven least).
func minHittingSet(sets, blocked [][]int, cost func(int) int) (best []int, ok, proven bool) {
	h := &hittingSet{sets: sets, blocked: blocked, cost: cost,
		chosen: map[int]bool{}, banned: map[int]bool{}, bestKey: -1}
	for _, s := range sets {
		if len(s) == 0 {
			return nil, false, true
		}
	}
	h.search(0)
	if h.bestKey < 0 {
		return nil, false, h.nodes <= hittingSetNodes
	}
	slices.Sort(h.best)
	return h.best, true, h.nodes <= hittingSetNodes
}

// hsKey orders candidate solutions: cost first, then size.
func hsKey(cost, size int) int { return cost*1024 + size }

func (h *hittingSet) search(cost int) {
	h.nodes++
	if h.nodes > hittingSetNodes {
		return
	}
	if h.bestKey >= 0 && hsKey(cost+h.lowerBound(), len(h.chosen)) >= h.bestKey {
		return
	}
	for _, b := range h.blocked {
		all := len(b) > 0
		for _, e := range b {
			if !h.chosen[e] {
				all = false
				break
			}
		}
		if all {
			return
		}
	}
	var pick []int
	for _, s := range h.sets {
		if h.hit(s) {
			continue
		}
		open := h.open(s)
		if len(open) == 0 {
			return
		}
		if pick == nil || len(open) < len(pick) {
			pick = open
		}
	}
	if pick == nil {
		if k := hsKey(cost, len(h.chosen)); h.bestKey < 0 || k < h.bestKey {
			h.bestKey = k
			h.best = h.best[:0]
			for e := range h.chosen {
				h.best = append(h.best, e)
			}
		}
		return
	}
	sort.SliceStable(pick, func(i, j int) bool { return h.cost(pick[i]) < h.cost(pick[j]) })
	var banned []int
	for _, e := range pick {
		h.chosen[e] = true
		h.search(cost + h.cost(e))
		delete(h.chosen, e)
		h.banned[e] = true
		banned = append(banned, e)
	}
	for _, e := range banned {
		delete(h.banned, e)
	}
}

func (h *hittingSet) hit(s []int) bool {
	for _, e := range s {
		if h.chosen[e] {
			return true
		}
	}
	return false
}

// open lists the members of s that may still be chosen.
func (h *hittingSet) open(s []int) []int {
	var out []int
	for _, e := range s {
		if !h.banned[e] && !slices.Contains(out, e) {
			out = append(out, e)
		}
	}
	return out
}

// lowerBound packs unhit sets with no open member in common, each costing
// at least its cheapest open member.
func (h *hittingSet) lowerBound() int {
	used := map[int]bool{}
	lb := 0
	for _, s := range h.sets {
		if h.hit(s) {
			continue
		}
		cheapest, disjoint := -1, true
		for _, e := range s {
			if h.banned[e] {
				continue
			}
			if used[e] {
				disjoint = false
				break
			}
			if c := h.cost(e); cheapest < 0 || c < cheapest {
				cheapest = c
			}
		}
		if !disjoint || cheapest < 0 {
			continue
		}
		for _, e := range s {
			used[e] = true
		}
		lb += cheapest
	}
	return lb
}
