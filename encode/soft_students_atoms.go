package encode

import (
	"slices"
	"strconv"

	"github.com/termwright/termwright/solver"
)

// The interned atoms and groupings of the pattern student clashes
// (soft_students.go).

// travel is the travel time between rooms a and c: from a table of every
// pair of rooms built on first use (each pair of sections asks for many),
// or from the travel index on terms with very many rooms.
func (sc *studentClasher) travel(a, c int) int {
	n := len(sc.sb.t.Rooms)
	if n > maxTravelTable {
		return sc.sb.travelMinutes(a, c)
	}
	if sc.table == nil {
		sc.table = make([]int32, n*n)
		for x := 0; x < n; x++ {
			for y := 0; y < n; y++ {
				sc.table[x*n+y] = int32(sc.sb.travelMinutes(x, y))
			}
		}
	}
	return int(sc.table[a*n+c])
}

// maxTravelTable is the most rooms for which studentClasher.travel keeps
// a table (4 MB at most).
const maxTravelTable = 1000

// room returns "section s is in one of its candidate rooms ks" (positions
// in patModel.rooms): the room atom for one, else an interned any_room atom.
func (sc *studentClasher) room(s int, ks []int) solver.Lit {
	pm := &sc.sb.c.pats[s]
	if len(ks) == 1 {
		return solver.Pos(pm.room[ks[0]])
	}
	key := setKey(s, ks)
	if l, ok := sc.anyRoom[key]; ok {
		return l
	}
	sc.nAny++
	a := sc.sb.newAtom("any_room("+quote(sc.sb.t.Sections[s].ID)+","+strconv.Itoa(sc.nAny)+")", aux(s, -1))
	for _, k := range ks {
		sc.sb.rule(a, solver.Pos(pm.room[k]))
	}
	sc.anyRoom[key] = solver.Pos(a)
	return solver.Pos(a)
}

// starts returns "grid section g starts a meeting at one of its candidate
// starts ks" (positions in secModel.starts), interned.
func (sc *studentClasher) starts(g int, ks []int) solver.Lit {
	gm := &sc.sb.c.secs[g]
	if len(ks) == 1 {
		return solver.Pos(gm.start[gm.starts[ks[0]]])
	}
	key := setKey(g, ks)
	if l, ok := sc.orStarts[key]; ok {
		return l
	}
	sc.nAny++
	a := sc.sb.newAtom("any_start("+quote(sc.sb.t.Sections[g].ID)+","+strconv.Itoa(sc.nAny)+")", aux(g, -1))
	for _, k := range ks {
		sc.sb.rule(a, solver.Pos(gm.start[gm.starts[k]]))
	}
	sc.orStarts[key] = solver.Pos(a)
	return solver.Pos(a)
}

// clashGroups groups members (times or rooms of one section) by the set
// they clash with, in order of first appearance; empty sets are dropped.
type clashGroups struct {
	sets    [][]int
	members [][]int
	index   map[string]int
}

func (cg *clashGroups) add(member int, set []int) {
	if len(set) == 0 {
		return
	}
	if cg.index == nil {
		cg.index = map[string]int{}
	}
	key := setKey(0, set)
	k, ok := cg.index[key]
	if !ok {
		k = len(cg.sets)
		cg.index[key] = k
		cg.sets = append(cg.sets, slices.Clone(set))
		cg.members = append(cg.members, nil)
	}
	cg.members[k] = append(cg.members[k], member)
}

// setKey is a map key for section s and the ascending list xs.
func setKey(s int, xs []int) string {
	key := make([]byte, 0, 4+4*len(xs))
	key = strconv.AppendInt(key, int64(s), 10)
	key = append(key, ':')
	for _, x := range xs {
		key = strconv.AppendInt(key, int64(x), 10)
		key = append(key, ',')
	}
	return string(key)
}
