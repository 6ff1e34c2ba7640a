package export

import (
	"io"
	"testing"

	"github.com/termwright/termwright/timetable"
)

func BenchmarkPersonPDF(b *testing.B) {
	term, s := demoTerm()
	v, err := newView(term, s)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := v.writePersonPDF(io.Discard, Subject{timetable.WhoStaff, "S3"}, Options{Generated: fixedClock}); err != nil {
			b.Fatal(err)
		}
	}
}

func BenchmarkICS(b *testing.B) {
	term, s := demoTerm()
	v, err := newView(term, s)
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for b.Loop() {
		if err := v.writeICS(io.Discard, Subject{timetable.WhoStaff, "S1"}, Options{Generated: fixedClock}, nil); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkPatternView resolves the mixed grid and pattern term: meetings
// per day of each pattern and the grid rows cut at every clock time.
func BenchmarkPatternView(b *testing.B) {
	term, s := patternTerm()
	b.ReportAllocs()
	for b.Loop() {
		if _, err := newView(term, s); err != nil {
			b.Fatal(err)
		}
	}
}
