package solver

import "slices"

// unfounded keeps source pointers for the atoms on positive cycles and finds
// unfounded sets (Van Gelder, Ross, Schlipf 1991) with the source-pointer
// method (Simons, Niemelä, Soininen 2002), learning Lin–Zhao (2004) loop
// formulas. The support graph has one node per pair (rule body, component)
// for every body that supports an atom of that component; its internal atoms
// are the body's positive atoms in the component.
//
// Invariant (outside ufsCheck): every cyclic atom that is not false and not
// in todo has src != 0; a node used as a source has a body that is not false
// and no internal atom without a source, so sources form no cycle.
type unfounded struct {
	comp []uint32 // per atom: component on a positive cycle (1..), 0 = none

	nodeBody      []Lit    // per node: literal true iff the body holds
	nodeIntStart  []uint32 // node n's internal atoms: nodeInt[nodeIntStart[n]:nodeIntStart[n+1]]
	nodeInt       []uint32 // internal atoms of all nodes
	nodeHeadStart []uint32 // node n's heads: nodeHeads[nodeHeadStart[n]:nodeHeadStart[n+1]]
	nodeHeads     []uint32 // cyclic atoms supported by each node (all in the node's component)
	unsourced     []int32  // per node: number of its internal atoms with src == 0

	supStart []uint32 // atom a's supporting nodes: sup[supStart[a]:supStart[a+1]]
	sup      []uint32 // nodes supporting each cyclic atom
	depStart []uint32 // nodes with atom a internal: dep[depStart[a]:depStart[a+1]]
	dep      []uint32 // dependent nodes of each cyclic atom

	src    []uint32 // per atom: 1 + its source node, 0 = no source
	todo   []uint32 // atoms that may lack a source (checked at the next fixpoint)
	inTodo []bool   // per atom: listed in todo

	bodyStart  []uint32 // per literal l: nodes with body l are bodyNodes[bodyStart[l]:bodyStart[l+1]]
	bodyNodes  []uint32 // nodes grouped by body literal
	falseQueue []Lit    // body literals falsified since the last check

	work     []uint32 // scratch of loseSource and setSource: atoms to process
	inSet    []bool   // per atom: member of the unfounded set being explained
	nodeMark []bool   // per node: visited while collecting external bodies
	marked   []uint32 // nodes with nodeMark set
	set      []uint32 // scratch of ufsCheck: the unfounded set of one component
	external []Lit    // scratch of ufsCheck: external body literals of set
	clause   []Lit    // scratch of ufsCheck: the loop formula being added
}

// ufsSupport describes, for building, the rule bodies of the program.
type ufsSupport struct {
	support [][]uint32 // per atom: ids of the bodies of its rules and choice rules
	bodyLit []Lit      // per body id: literal true iff the body holds
	bodyPos [][]uint32 // per body id: positive atoms of the body
}

// newUnfounded builds the support graph for the cyclic atoms; numLits is the
// size of the literal tables when it is built. Every cyclic atom starts
// without a source and in todo.
func newUnfounded(numAtoms, numLits int, comp []uint32, in ufsSupport) *unfounded {
	u := &unfounded{comp: comp}
	type key struct{ body, comp uint32 }
	nodeOf := map[key]uint32{}
	var heads [][]uint32
	supLists := make([][]uint32, numAtoms+1)
	for a := 1; a <= numAtoms; a++ {
		c := comp[a]
		if c == 0 {
			continue
		}
		for _, b := range in.support[a] {
			k := key{b, c}
			n, ok := nodeOf[k]
			if !ok {
				n = uint32(len(u.nodeBody))
				nodeOf[k] = n
				u.nodeBody = append(u.nodeBody, in.bodyLit[b])
				u.nodeIntStart = append(u.nodeIntStart, uint32(len(u.nodeInt)))
				for _, x := range in.bodyPos[b] {
					if comp[x] == c {
						u.nodeInt = append(u.nodeInt, x)
					}
				}
				heads = append(heads, nil)
			}
			heads[n] = append(heads[n], uint32(a))
			supLists[a] = append(supLists[a], n)
		}
	}
	numNodes := len(u.nodeBody)
	u.nodeIntStart = append(u.nodeIntStart, uint32(len(u.nodeInt)))
	u.unsourced = make([]int32, numNodes)
	depLists := make([][]uint32, numAtoms+1)
	for n := 0; n < numNodes; n++ {
		u.nodeHeadStart = append(u.nodeHeadStart, uint32(len(u.nodeHeads)))
		u.nodeHeads = append(u.nodeHeads, heads[n]...)
		ints := u.nodeInt[u.nodeIntStart[n]:u.nodeIntStart[n+1]]
		u.unsourced[n] = int32(len(ints))
		for _, x := range ints {
			depLists[x] = append(depLists[x], uint32(n))
		}
	}
	u.nodeHeadStart = append(u.nodeHeadStart, uint32(len(u.nodeHeads)))
	u.supStart, u.sup = flatten(supLists)
	u.depStart, u.dep = flatten(depLists)
	bodyLists := make([][]uint32, numLits)
	for n, l := range u.nodeBody {
		bodyLists[l] = append(bodyLists[l], uint32(n))
	}
	u.bodyStart, u.bodyNodes = flatten(bodyLists)
	u.src = make([]uint32, numAtoms+1)
	u.inTodo = make([]bool, numAtoms+1)
	u.inSet = make([]bool, numAtoms+1)
	u.nodeMark = make([]bool, numNodes)
	for a := 1; a <= numAtoms; a++ {
		if comp[a] != 0 {
			u.todo = append(u.todo, uint32(a))
			u.inTodo[a] = true
		}
	}
	return u
}

// flatten turns lists into the compressed form start, flat with list i at
// flat[start[i]:start[i+1]].
func flatten(lists [][]uint32) (start, flat []uint32) {
	start = make([]uint32, len(lists)+1)
	for i, l := range lists {
		start[i] = uint32(len(flat))
		flat = append(flat, l...)
	}
	start[len(lists)] = uint32(len(flat))
	return start, flat
}

func (u *unfounded) heads(n uint32) []uint32 {
	return u.nodeHeads[u.nodeHeadStart[n]:u.nodeHeadStart[n+1]]
}

func (u *unfounded) internal(n uint32) []uint32 {
	return u.nodeInt[u.nodeIntStart[n]:u.nodeIntStart[n+1]]
}

// falsified records that literal l became false (called for every
// propagated literal's complement); O(1).
func (u *unfounded) falsified(l Lit) {
	if int(l)+1 < len(u.bodyStart) && u.bodyStart[l] != u.bodyStart[l+1] {
		u.falseQueue = append(u.falseQueue, l)
	}
}

// unassigned is called for every atom unassigned by backtracking: a cyclic
// atom without a source must get one (or be found unfounded) again.
func (u *unfounded) unassigned(a uint32) {
	if u.comp[a] != 0 && u.src[a] == 0 && !u.inTodo[a] {
		u.inTodo[a] = true
		u.todo = append(u.todo, a)
	}
}

// pending reports whether the next check has anything to do.
func (u *unfounded) pending() bool { return len(u.falseQueue) > 0 || len(u.todo) > 0 }

// loseSource removes h's source and, transitively, the sources of atoms
// whose source node depends on h; all of them are queued in todo.
func (u *unfounded) loseSource(h uint32) {
	u.src[h] = 0
	u.queue(h)
	work := append(u.work[:0], h)
	for len(work) > 0 {
		a := work[len(work)-1]
		work = work[:len(work)-1]
		for _, n := range u.dep[u.depStart[a]:u.depStart[a+1]] {
			u.unsourced[n]++
			for _, h2 := range u.heads(n) {
				if u.src[h2] == n+1 {
					u.src[h2] = 0
					u.queue(h2)
					work = append(work, h2)
				}
			}
		}
	}
	u.work = work
}

func (u *unfounded) queue(a uint32) {
	if !u.inTodo[a] {
		u.inTodo[a] = true
		u.todo = append(u.todo, a)
	}
}

// setSource gives h the source node n and, transitively, gives sources to
// atoms (not false) that lack one and are supported by a node that thereby
// becomes usable.
func (u *unfounded) setSource(h, n uint32, vals []int8) {
	u.src[h] = n + 1
	work := append(u.work[:0], h)
	for len(work) > 0 {
		a := work[len(work)-1]
		work = work[:len(work)-1]
		for _, m := range u.dep[u.depStart[a]:u.depStart[a+1]] {
			u.unsourced[m]--
			if u.unsourced[m] != 0 || vals[u.nodeBody[m]] == -1 {
				continue
			}
			for _, h2 := range u.heads(m) {
				if u.src[h2] == 0 && vals[Pos(Atom(h2))] != -1 {
					u.src[h2] = m + 1
					work = append(work, h2)
				}
			}
		}
	}
	u.work = work
}

// ufsCheck runs at a unit-propagation fixpoint. It withdraws the sources
// whose body became false, finds new sources where possible, and if atoms
// that are not false remain without a source (an unfounded set), adds the
// loop formula of the part of that set in one component for each of its
// atoms: either asserting the atoms false (changed) or, when one is true,
// reporting the conflict (its formula is in s.conflict).
func (s *Solver) ufsCheck() (changed, conflict bool) {
	u := s.ufs
	for _, l := range u.falseQueue {
		if s.vals[l] != -1 {
			continue
		}
		for _, n := range u.bodyNodes[u.bodyStart[l]:u.bodyStart[l+1]] {
			for _, h := range u.heads(n) {
				if u.src[h] == n+1 {
					u.loseSource(h)
				}
			}
		}
	}
	u.falseQueue = u.falseQueue[:0]

	for _, h := range u.todo {
		if u.src[h] != 0 || s.vals[Pos(Atom(h))] == -1 {
			continue
		}
		for _, n := range u.sup[u.supStart[h]:u.supStart[h+1]] {
			if u.unsourced[n] == 0 && s.vals[u.nodeBody[n]] != -1 {
				u.setSource(h, n, s.vals)
				break
			}
		}
	}
	j := 0
	var pick uint32 // an atom of the unfounded set, true ones preferred
	for _, h := range u.todo {
		if u.src[h] != 0 || s.vals[Pos(Atom(h))] == -1 {
			u.inTodo[h] = false
			continue
		}
		u.todo[j] = h
		j++
		if pick == 0 || (s.vals[Pos(Atom(h))] == 1 && s.vals[Pos(Atom(pick))] != 1) {
			pick = h
		}
	}
	u.todo = u.todo[:j]
	if j == 0 {
		return false, false
	}

	// The unfounded atoms of pick's component and their external bodies.
	c := u.comp[pick]
	u.set = u.set[:0]
	for _, h := range u.todo {
		if u.comp[h] == c {
			u.set = append(u.set, h)
			u.inSet[h] = true
		}
	}
	u.external = u.external[:0]
	for _, h := range u.set {
		for _, n := range u.sup[u.supStart[h]:u.supStart[h+1]] {
			if u.nodeMark[n] {
				continue
			}
			u.nodeMark[n] = true
			u.marked = append(u.marked, n)
			ext := true
			for _, x := range u.internal(n) {
				if u.inSet[x] {
					ext = false
					break
				}
			}
			if ext {
				u.external = append(u.external, u.nodeBody[n])
			}
		}
	}
	for _, n := range u.marked {
		u.nodeMark[n] = false
	}
	u.marked = u.marked[:0]
	for _, h := range u.set {
		u.inSet[h] = false
	}
	slices.Sort(u.external)
	u.external = slices.Compact(u.external)

	if s.vals[Pos(Atom(pick))] == 1 {
		return true, s.addLoopFormula(pick)
	}
	for _, h := range u.set {
		if s.vals[Pos(Atom(h))] == 0 && s.addLoopFormula(h) {
			return true, true
		}
	}
	return true, false
}

// addLoopFormula adds not h ∨ external bodies (all false) as a learned
// clause; it returns true when h is true (a conflict).
func (s *Solver) addLoopFormula(h uint32) bool {
	u := s.ufs
	u.clause = append(u.clause[:0], Neg(Atom(h)))
	for _, l := range u.external {
		if l != Neg(Atom(h)) { // from a rule "h :- not h"
			u.clause = append(u.clause, l)
		}
	}
	s.stats.LoopFormulas++
	lbd := s.computeLBD(u.clause)
	return s.addClauseInSearch(u.clause, true, lbd)
}
