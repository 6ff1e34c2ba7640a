package solver

import (
	"context"
	"fmt"
	"math/rand/v2"
	"testing"
)

// Benchmarks of the live-solver API on a timetable-sized program
// (engTimetableLike): 600 sections over 40 periods with 250 resources,
// about 72 000 atoms and 10 600 bounds, with weak constraints.

func benchLiveProgram() *Program { return engTimetableLike(600, 40, 250, 7, true) }

// BenchmarkNew measures building a solver (completion, propagators,
// watches) for the timetable-sized program.
func BenchmarkNew(b *testing.B) {
	p := benchLiveProgram()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := New(p, DefaultOptions()); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkClone measures copying a built solver for the same program
// after one search (so that it holds learned clauses and a level-0
// assignment).
func BenchmarkClone(b *testing.B) {
	s, err := New(benchLiveProgram(), DefaultOptions())
	if err != nil {
		b.Fatal(err)
	}
	if s.Solve(context.Background()) != Satisfiable {
		b.Fatal("must be satisfiable")
	}
	b.ReportAllocs()
	for b.Loop() {
		s.Clone()
	}
}

// BenchmarkAddBound measures adding one at-most-one bound over 40 start
// atoms of a section to a built solver of the timetable-sized program
// (every iteration adds to the same solver, which keeps growing).
func BenchmarkAddBound(b *testing.B) {
	s, err := New(benchLiveProgram(), DefaultOptions())
	if err != nil {
		b.Fatal(err)
	}
	r := rand.New(rand.NewPCG(1, 2))
	lits := make([]Lit, 40)
	b.ReportAllocs()
	for b.Loop() {
		for i := range lits {
			lits[i] = Pos(Atom(1 + r.IntN(24000)))
		}
		if err := s.AddBound(lits, NoBound, 3); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkNeighbourhoodStep compares three ways to run one
// large-neighbourhood step (Shaw 1998) on the timetable-sized program: fix
// every section but a few to its period in a known model, then find a
// model ("solve") or optimise within a conflict budget ("optimize").
//   - new: build a solver from the program plus the fixed starts as facts
//     (what a caller without a live solver does);
//   - clone: clone a built solver and add the fixed starts as unit clauses;
//   - assume: one live solver, the fixed starts as assumptions;
//   - activation: one live solver, the fixed starts as clauses "not act ∨
//     start" over a fresh atom act (AddAtoms) that is assumed for the step
//     and retired by the clause "not act" afterwards.
func BenchmarkNeighbourhoodStep(b *testing.B) {
	const sections, periods, free = 600, 40, 12
	p := benchLiveProgram()
	base, err := New(p, DefaultOptions())
	if err != nil {
		b.Fatal(err)
	}
	if base.Solve(context.Background()) != Satisfiable {
		b.Fatal("must be satisfiable")
	}
	model := base.Model(nil)
	isStart := func(a Atom) bool { return int(a) <= sections*periods } // start atoms come first
	step := 0
	fixed := func() []Lit { // starts of the model outside a window of free sections
		lo := (step * free) % (sections - free)
		step++
		var out []Lit
		for _, a := range model {
			if isStart(a) {
				if sec := (int(a) - 1) / periods; sec < lo || sec >= lo+free {
					out = append(out, Pos(a))
				}
			}
		}
		return out
	}
	opts := DefaultOptions()
	opts.ConflictLimit = 2000
	run := func(b *testing.B, s *Solver, optimize bool) {
		if !optimize {
			if s.Solve(context.Background()) != Satisfiable {
				b.Fatal("the model's neighbourhood must be satisfiable")
			}
			return
		}
		if st, _, err := s.Optimize(context.Background(), nil); err != nil || st != Satisfiable {
			b.Fatal("optimize", st, err)
		}
	}
	live, err := New(p, opts)
	if err != nil {
		b.Fatal(err)
	}
	live.Solve(context.Background())
	for _, optimize := range []bool{false, true} {
		kind := map[bool]string{false: "solve", true: "optimize"}[optimize]
		b.Run(fmt.Sprintf("%s/new", kind), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				q := *p
				q.Rules = append([]Rule(nil), p.Rules...)
				for _, l := range fixed() {
					q.Rules = append(q.Rules, Rule{Head: l.Atom()})
				}
				s, err := New(&q, opts)
				if err != nil {
					b.Fatal(err)
				}
				run(b, s, optimize)
			}
		})
		b.Run(fmt.Sprintf("%s/clone", kind), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				s := live.Clone()
				for _, l := range fixed() {
					if err := s.AddClause(l); err != nil {
						b.Fatal(err)
					}
				}
				run(b, s, optimize)
			}
		})
		b.Run(fmt.Sprintf("%s/assume", kind), func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				live.Assume(fixed()...)
				run(b, live, optimize)
			}
		})
		b.Run(fmt.Sprintf("%s/activation", kind), func(b *testing.B) {
			s := live.Clone()
			b.ReportAllocs()
			for b.Loop() {
				act := Pos(s.AddAtoms(1))
				for _, l := range fixed() {
					if err := s.AddClause(act^1, l); err != nil {
						b.Fatal(err)
					}
				}
				s.Assume(act)
				run(b, s, optimize)
				if err := s.AddClause(act ^ 1); err != nil {
					b.Fatal(err)
				}
			}
		})
	}
}
