package improve

import (
	"math/rand/v2"
	"testing"

	"github.com/termwright/termwright/samples"
)

// benchMoves measures propose + legality + incremental cost + annealing
// decision at a fixed temperature, one move per iteration.
func benchMoves(b *testing.B, cfg samples.Config) {
	term, wit := samples.GenerateWithWitness(cfg)
	x, err := New(term, wit, nil)
	if err != nil {
		b.Fatal(err)
	}
	a := newAnnealer(x, Options{Seed: 1})
	a.temp = 2
	rng := rand.New(rand.NewPCG(1, 1))
	accepted := 0
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if x.propose(a.pick(), rng) && x.apply(x.chs, rng, a.accept) {
			accepted++
			x.levelCosts(&x.cur, a.curCost)
		}
	}
	b.ReportMetric(float64(b.N)/b.Elapsed().Seconds(), "moves/s")
	b.ReportMetric(float64(accepted)/float64(b.N), "accepted/move")
}

// BenchmarkMovesDemo is the move rate on the demo term.
func BenchmarkMovesDemo(b *testing.B) { benchMoves(b, samples.DemoConfig) }

// BenchmarkMoves2000 is the move rate on the 2,000-section generated term (seed 1).
func BenchmarkMoves2000(b *testing.B) { benchMoves(b, samples.Config{Sections: 2000, Seed: 1}) }

// BenchmarkNew2000 is the cost of building a state (including the
// starting timetable.Check) on the 2,000-section term.
func BenchmarkNew2000(b *testing.B) {
	term, wit := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	b.ReportAllocs()
	for b.Loop() {
		if _, err := New(term, wit, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkMovesITC is the move rate on comp07 (skipped without the shared data).

// TestMovesAllocateNothing checks that, once the occupancy lists have
// grown, proposing, checking, costing and deciding a move allocates
// nothing (common practice for hot paths; STYLE.md item 6).
func TestMovesAllocateNothing(t *testing.T) {
	term, wit := samples.GenerateWithWitness(samples.DemoConfig)
	x, err := New(term, wit, nil)
	if err != nil {
		t.Fatal(err)
	}
	a := newAnnealer(x, Options{Seed: 1})
	a.temp = 2
	// Through try, the path Run takes: its accept closure once made the
	// cost difference escape to the heap on every legal move. The warm-up
	// is long enough for every occupancy list to reach the longest it gets
	// (a list grows only past its longest so far).
	for range 1_000_000 {
		a.try()
	}
	// One run of many moves: testing.AllocsPerRun rounds the mean down,
	// so an allocation on a share of the moves would read as zero.
	batch := func() {
		for range 5000 {
			a.try()
		}
	}
	if n := testing.AllocsPerRun(1, batch); n != 0 {
		t.Fatalf("5,000 moves allocate %v times", n)
	}
}
