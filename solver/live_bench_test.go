package solver

import "testing"

// Benchmarks of the live-solver API on a timetable-sized program: 600
// sections over 40 periods with 250 resources, about 72 000 atoms and
// 10 600 bounds (engTimetableLike).

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
