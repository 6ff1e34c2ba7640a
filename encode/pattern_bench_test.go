package encode

import (
	"errors"
	"testing"
)

// BenchmarkPatternCompile compiles a seeded random pattern term of 1,000
// sections with up to 40 meeting patterns and 40 rooms (the size of the
// largest public ITC-2019 instances), and reports atoms and bounds per
// section.
func BenchmarkPatternCompile(b *testing.B) {
	for _, n := range []int{250, 1000} {
		tm := patternTerm(7, n, 40, 40)
		for s := range tm.Sections {
			tm.Sections[s].Size = 10 // every room fits: the benchmark measures compilation
		}
		tm.Unavailable = tm.Unavailable[:len(tm.Unavailable)-1] // the staff row could leave a section no time
		if _, _, err := Compile(tm, Options{HardOnly: true}); err != nil {
			// A section whose few rooms are all taken at its few times
			// may use any room instead.
			var ce CompileError
			if !errors.As(err, &ce) {
				b.Fatal(err)
			}
			for _, e := range ce {
				tm.Sections[e.Src.Row-2].RoomChoices = nil
			}
		}
		b.Run(itoa(n), func(b *testing.B) {
			b.ReportAllocs()
			var st Stats
			for i := 0; i < b.N; i++ {
				p, cat, err := Compile(tm, Options{HardOnly: true})
				if err != nil {
					b.Fatal(err)
				}
				st = cat.Stats(p)
			}
			b.ReportMetric(st.AtomsPerSec, "atoms/section")
			b.ReportMetric(st.RulesPerSec, "rules/section")
			b.ReportMetric(st.BoundsPerSec, "bounds/section")
			b.ReportMetric(st.BoundLitsPerSc, "boundlits/section")
		})
	}
}

func itoa(n int) string {
	if n < 10 {
		return string(rune('0' + n))
	}
	return itoa(n/10) + string(rune('0'+n%10))
}
