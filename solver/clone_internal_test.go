package solver

import (
	"context"
	"reflect"
	"testing"

	"github.com/stretchr/testify/require"
)

// engSharedBacking lists, by field path, the slices Clone may share: the
// weak constraints and the unfounded-set checker's support graph,
// read-only after New.
var engSharedBacking = map[string]bool{
	"weaks": true, "levels": true,
	"ufs.comp": true, "ufs.nodeBody": true, "ufs.nodeIntStart": true, "ufs.nodeInt": true,
	"ufs.nodeHeadStart": true, "ufs.nodeHeads": true, "ufs.supStart": true, "ufs.sup": true,
	"ufs.depStart": true, "ufs.dep": true, "ufs.bodyStart": true, "ufs.bodyNodes": true,
}

// engSharedSlices walks two values of the same struct type and reports the
// fields (paths) whose slices, or whose lists' slices, use the same memory.
func engSharedSlices(path string, a, b reflect.Value, out *[]string) {
	switch a.Kind() {
	case reflect.Struct:
		for i := range a.NumField() {
			name := a.Type().Field(i).Name
			if path != "" {
				name = path + "." + name
			}
			engSharedSlices(name, a.Field(i), b.Field(i), out)
		}
	case reflect.Pointer:
		if a.IsNil() || b.IsNil() {
			return
		}
		if a.Pointer() == b.Pointer() {
			*out = append(*out, path)
			return
		}
		if a.Elem().Kind() == reflect.Struct && path == "ufs" {
			engSharedSlices(path, a.Elem(), b.Elem(), out)
		}
	case reflect.Slice:
		if a.Cap() > 0 && b.Cap() > 0 && a.Pointer() == b.Pointer() {
			*out = append(*out, path)
			return
		}
		if a.Type().Elem().Kind() == reflect.Slice {
			for i := range min(a.Len(), b.Len()) {
				x, y := a.Index(i), b.Index(i)
				if x.Cap() > 0 && y.Cap() > 0 && x.Pointer() == y.Pointer() {
					*out = append(*out, path+"[i]")
					return
				}
			}
		}
	}
}

// TestCloneSharesNoMutableTable: after Clone, every slice, list and pointer
// of the solver is the clone's own except the read-only weak constraints
// and support graph (a new field that Clone forgets to copy fails here).
func TestCloneSharesNoMutableTable(t *testing.T) {
	p, _ := engHamiltonian(6, engCompleteArcs(6)) // non-tight: the checker exists
	s := engNew(t, p)
	require.NotNil(t, s.ufs)
	s.AddAtoms(2)
	require.NoError(t, s.AddWeightSum([]Lit{Pos(1), Pos(2), Pos(3)}, []int64{1, 2, 3}, 4, Pos(4)))
	require.NoError(t, s.AddBound([]Lit{Pos(1), Pos(2), Pos(3)}, 1, 2, Pos(5), Neg(6)))
	require.Equal(t, Satisfiable, s.Solve(context.Background()))
	s.Assume(Pos(1))
	c := s.Clone()
	var shared []string
	engSharedSlices("", reflect.ValueOf(s).Elem(), reflect.ValueOf(c).Elem(), &shared)
	for _, f := range shared {
		if !engSharedBacking[f] {
			t.Errorf("Clone shares %s with the original", f)
		}
	}
	require.Same(t, &c.activity, c.order.activity, "the clone's heap orders by the clone's activities")
}

// TestPropagateAllocsLive: propagation on a clone, through bounds and sums
// added after New, allocates nothing once its tables have their size
// (STYLE: hot loops allocate nothing).
func TestPropagateAllocsLive(t *testing.T) {
	s := engNew(t, engQueens(12))
	c := s.Clone()
	lits := make([]Lit, 0, 24)
	w := make([]int64, 0, 24)
	for a := 1; a <= 24; a++ {
		lits = append(lits, Pos(Atom(a)))
		w = append(w, int64(1+a%3))
	}
	require.NoError(t, c.AddBound(lits, 2, 5, Neg(30), Neg(40)))
	require.NoError(t, c.AddWeightSum(lits, w, 9, Neg(50)))
	require.False(t, c.propagate())
	run := func() {
		for v := 1; v <= 60; v += 7 {
			if d := Neg(Atom(v)); c.value(d) == 0 && engDecide(c, d) {
				break
			}
		}
		c.cancelUntil(0)
	}
	run()
	require.Zero(t, testing.AllocsPerRun(100, run))
}
