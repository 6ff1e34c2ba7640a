package encode

import (
	"context"
	"fmt"
	"slices"
	"strings"
	"testing"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/solver"
)

// TestSplitProgramSameModels: a neighbourhood step's program cut down to
// what can change (splitProgram) has, joined with the incumbent's fixed
// part, exactly the stable models of the whole program with the other
// sections' starts as facts (Splitting Set Theorem, Lifschitz and Turner
// 1994). On the demo term, for random neighbourhoods, both are enumerated
// completely on the free sections' starts, and the step's models joined
// with the fixed part pass solver.Verify on the whole program.
func TestSplitProgramSameModels(t *testing.T) {
	term := samples.Demo()
	p, cat, err := Compile(term, Options{})
	if err != nil {
		t.Fatal(err)
	}
	x := NewSearch(term, p, cat, SearchOptions{Engine: solver.DefaultOptions()})
	if st, err := x.Solve(context.Background()); err != nil || st != solver.Satisfiable {
		t.Fatalf("solve: %v %v", st, err)
	}
	incumbent := x.Model()
	o := &optRun{t: term, p: p, cat: cat}
	rng := newRand(5)
	all := func(int) bool { return true }
	enumerate := func(q *solver.Program, project []solver.Atom) ([]string, bool) {
		s, err := solver.New(q, solver.DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		var out []string
		n, complete := s.Enumerate(context.Background(), 20000, project, func(m []solver.Atom) bool {
			out = append(out, fmt.Sprint(m))
			return true
		})
		return out, complete && n < 20000
	}
	models, compared := 0, 0
	for trial := 0; trial < 40 && compared < 6; trial++ {
		isFree := make([]bool, len(term.Sections))
		var free []string
		for k := 0; k < 2; k++ {
			s := rng.IntN(len(term.Sections))
			isFree[s] = true
			free = append(free, term.Sections[s].ID)
		}
		reach := o.reachable(isFree)
		var project []solver.Atom // the free sections' starts
		for a := solver.Atom(1); int(a) <= p.NumAtoms(); a++ {
			if info := cat.AtomInfo(a); info.Kind == AtomStart && isFree[info.Section] {
				project = append(project, a)
			}
		}
		whole := *p
		whole.Rules = slices.Clip(p.Rules)
		for _, a := range incumbent {
			if !reach[a] && cat.AtomInfo(a).Kind == AtomStart {
				whole.Rules = append(whole.Rules, solver.Rule{Head: a})
			}
		}
		want, ok := enumerate(&whole, project)
		if !ok {
			continue // too many placements to compare in a test
		}
		split, ok := splitProgram(p, &stmtIndex{}, reach, incumbent, all)
		if !ok {
			t.Fatalf("free %v: the fixed atoms are no splitting set", free)
		}
		if len(split.q.Rules)+len(split.q.Bounds) >= len(p.Rules)+len(p.Bounds) {
			t.Fatalf("free %v: the step's program is not smaller than the whole", free)
		}
		var got []string
		s, err := solver.New(split.q, solver.DefaultOptions())
		if err != nil {
			t.Fatal(err)
		}
		var local []solver.Atom // project in the step's numbering
		for i, a := range split.orig {
			if i > 0 && slices.Contains(project, a) {
				local = append(local, solver.Atom(i))
			}
		}
		_, complete := s.Enumerate(context.Background(), 20000, local, func(m []solver.Atom) bool {
			back := make([]solver.Atom, len(m))
			for i, a := range m {
				back[i] = split.orig[a]
			}
			slices.Sort(back)
			got = append(got, fmt.Sprint(back))
			return true
		})
		// Every model of the step's program, joined with the fixed part,
		// is a stable model of the whole program.
		if st := s.Solve(context.Background()); st == solver.Satisfiable {
			if err := solver.Verify(p, split.model(s.Model(nil))); err != nil {
				t.Fatalf("free %v: a joined model fails the verifier: %v", free, err)
			}
		}
		if !complete {
			t.Fatalf("free %v: enumeration of the step's program incomplete", free)
		}
		slices.Sort(want)
		slices.Sort(got)
		if !slices.Equal(want, got) {
			t.Fatalf("free %v: %d models of the whole program, %d of the step's program joined\nwant %s\ngot  %s",
				free, len(want), len(got), strings.Join(want[:min(2, len(want))], "; "), strings.Join(got[:min(2, len(got))], "; "))
		}
		models += len(want)
		compared++
	}
	if compared < 6 || models == 0 {
		t.Fatal("no models at all: the test compares nothing")
	}
	t.Logf("%d models compared", models)
}
