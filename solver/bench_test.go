package solver

import (
	"context"
	"fmt"
	"testing"
)

// Benchmarks of the engine. Setup (generation, building the program) is
// outside the timed loop where it is not what is measured; "solve" timings
// include New (completion) since a caller always pays it.

// benchSATInstances are the fixed random 3-SAT instances (ratio 4.26) shared
// by the engine and gophersat benchmarks.
var benchSATInstances = []struct {
	n    int
	seed uint64
}{
	{200, 1}, {200, 2}, {200, 3}, {200, 4}, {200, 5},
	{225, 1}, {225, 2}, {225, 3}, {225, 4}, {225, 5},
	{250, 1}, {250, 2}, {250, 3}, {250, 4}, {250, 5},
}

func BenchmarkRandom3SAT(b *testing.B) {
	for _, inst := range benchSATInstances {
		cls := engRandom3SAT(inst.n, 4.26, inst.seed)
		p := engSATProgram(inst.n, cls)
		name := fmt.Sprintf("n%d-s%d", inst.n, inst.seed)
		b.Run(name+"/engine", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				s, err := New(p, DefaultOptions())
				if err != nil {
					b.Fatal(err)
				}
				if s.Solve(context.Background()) == Unknown {
					b.Fatal("unknown")
				}
			}
		})
		b.Run(name+"/gophersat", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				gophersatSolve(inst.n, cls)
			}
		})
	}
}

// BenchmarkPigeonhole9into8 proves that 9 pigeons do not fit in 8 holes
// (hard for resolution: Haken 1985).
func BenchmarkPigeonhole9into8(b *testing.B) {
	p := engPigeonhole(9, 8)
	b.ReportAllocs()
	for b.Loop() {
		s, err := New(p, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		if s.Solve(context.Background()) != Unsatisfiable {
			b.Fatal("pigeonhole 9->8 must be unsatisfiable")
		}
	}
}

// BenchmarkQueens10All enumerates the 724 solutions of 10 queens (OEIS
// A000170).
func BenchmarkQueens10All(b *testing.B) {
	p := engQueens(10)
	b.ReportAllocs()
	for b.Loop() {
		s, err := New(p, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		n, _ := s.Enumerate(context.Background(), 0, nil, func([]Atom) bool { return true })
		if n != 724 {
			b.Fatalf("%d solutions, want 724", n)
		}
	}
}

// BenchmarkHamiltonianK8 enumerates the 5040 = 7! directed Hamiltonian
// cycles of the complete graph on 8 vertices with the non-tight
// reachability encoding.
func BenchmarkHamiltonianK8(b *testing.B) {
	p, arcs := engHamiltonian(8, engCompleteArcs(8))
	b.ReportAllocs()
	for b.Loop() {
		s, err := New(p, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		n, _ := s.Enumerate(context.Background(), 0, arcs, func([]Atom) bool { return true })
		if n != 5040 {
			b.Fatalf("%d cycles, want 5040", n)
		}
	}
}

// BenchmarkTimetableLike builds and solves a synthetic program with 2000
// sections over 40 periods and 700 resources (about 240 000 atoms).
func BenchmarkTimetableLike(b *testing.B) {
	p := engTimetableLike(2000, 40, 700, 1, false)
	b.ReportAllocs()
	for b.Loop() {
		s, err := New(p, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		if s.Solve(context.Background()) != Satisfiable {
			b.Fatal("must be satisfiable")
		}
	}
}

// BenchmarkHamiltonianPlanted200 finds one Hamiltonian cycle in a random
// 200-vertex digraph (4 arcs per vertex) with a planted cycle, non-tight.
func BenchmarkHamiltonianPlanted200(b *testing.B) {
	p, _ := engHamiltonian(200, engPlantedArcs(200, 4, 1))
	b.ReportAllocs()
	for b.Loop() {
		s, err := New(p, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		if s.Solve(context.Background()) != Satisfiable {
			b.Fatal("a cycle was planted")
		}
	}
}

// BenchmarkOptimizeTimetableLike proves the optimum of a synthetic weekly
// timetable (300 sections, 20 periods, 120 resources) with disliked periods
// on two priority levels, with the default strategy (core-guided lower
// bounds, then model-improving search).
func BenchmarkOptimizeTimetableLike(b *testing.B) {
	p := engTimetableLike(300, 20, 120, 3, true)
	b.ReportAllocs()
	for b.Loop() {
		s, err := New(p, DefaultOptions())
		if err != nil {
			b.Fatal(err)
		}
		st, _, err := s.Optimize(context.Background(), nil)
		if err != nil || st != Satisfiable || !s.Proven() {
			b.Fatal("the optimum must be proven", st, err)
		}
	}
}
