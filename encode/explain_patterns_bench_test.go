package encode

import (
	"context"
	"testing"

	"github.com/termwright/termwright/samples"
)

// BenchmarkExplainPatternRefused explains a refused meeting time on the
// second demo (MTH110-B on Mon Wed Fri at 14:00: a three-reason conflict,
// six places, two ways out), compile included.
func BenchmarkExplainPatternRefused(b *testing.B) {
	term := samples.Campus()
	req, err := NewRequest("MTH110-B", "Mon Wed Fri 14:00", "")
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		ex, err := Explain(context.Background(), term, []Request{req}, ExplainOptions{Seed: 1, NoCost: true})
		if err != nil || ex.Status != StatusRefused {
			b.Fatalf("%v %v", err, ex)
		}
	}
}

// BenchmarkExplainStudent explains the clashing student of studentTerm.
func BenchmarkExplainStudent(b *testing.B) {
	term, sched := studentTerm()
	b.ReportAllocs()
	b.ResetTimer()
	for i := 0; i < b.N; i++ {
		if ex, err := ExplainStudent(term, sched, "ST1"); err != nil || ex.Status != StudentClashes {
			b.Fatalf("%v %v", err, ex)
		}
	}
}
