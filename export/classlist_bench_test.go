package export_test

import (
	"io"
	"testing"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// sectionedSynthetic is the 2,000-section synthetic term with its
// witness timetable, its enrolments taken as sectioned students (each
// section its own course), so that every class-list writer has work.
func sectionedSynthetic() (*timetable.Term, *timetable.Schedule) {
	term, s := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	for i := range term.Sections {
		term.Sections[i].Course = term.Sections[i].ID
	}
	s.Enrolments, term.Enrolments = term.Enrolments, nil
	for _, e := range s.Enrolments {
		term.Requests = append(term.Requests, timetable.Request{Student: e.Student, Course: e.Section})
	}
	return term, s
}

// BenchmarkClassLists writes the class-list CSV and computes the
// sectioning report (requests met, full sections, every student's
// clashing pairs) for the sectioned synthetic term. Run it with:
// go test ./export -run '^$' -bench ClassLists -benchtime 3x
func BenchmarkClassLists(b *testing.B) {
	term, s := sectionedSynthetic()
	b.ReportAllocs()
	for b.Loop() {
		if err := export.WriteClassListCSV(io.Discard, term, s); err != nil {
			b.Fatal(err)
		}
		if _, err := export.SectioningFindings(term, s, nil); err != nil {
			b.Fatal(err)
		}
	}
	b.ReportMetric(float64(len(s.Enrolments)), "enrolments")
}
