package encode

import (
	"testing"
)

// BenchmarkPatternCompile compiles a seeded random pattern term of 1,000
// sections with up to 40 meeting patterns and 40 rooms (the size of the
// largest public ITC-2019 instances), and reports atoms and bounds per
// section.
func BenchmarkPatternCompile(b *testing.B) {
	for _, n := range []int{250, 1000} {
		tm := patternTerm(7, n, 40, 40)
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
