package timetable_test

import (
	"strconv"
	"testing"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// BenchmarkCountingBound measures CountingBound on generated terms of
// 2,000 and 10,000 sections (it runs once per solve).
func BenchmarkCountingBound(b *testing.B) {
	for _, n := range []int{2000, 10000} {
		term := samples.Generate(samples.Config{Sections: n, Seed: 1})
		b.Run(strconv.Itoa(n)+" sections", func(b *testing.B) {
			for b.Loop() {
				timetable.CountingBound(term, nil)
			}
		})
	}
}
