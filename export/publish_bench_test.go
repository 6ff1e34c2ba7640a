package export_test

import (
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/samples"
)

// BenchmarkPublish publishes everything (every staff member's, room's and
// cohort's PDF and calendar, the combined PDF, the workbook, CSV and JSON)
// for the 2,000-section synthetic term and its witness timetable. Run it
// with: go test ./export -run '^$' -bench Publish -benchtime 1x
func BenchmarkPublish(b *testing.B) {
	term, s := samples.GenerateWithWitness(samples.Config{Sections: 2000, Seed: 1})
	opt := export.Options{Generated: time.Date(2027, 8, 30, 14, 5, 0, 0, time.UTC)}
	parent := b.TempDir()
	b.ReportAllocs()
	var files int
	for i := 0; b.Loop(); i++ {
		dir := filepath.Join(parent, "out")
		m, err := export.Publish(dir, term, s, opt)
		if err != nil {
			b.Fatal(err)
		}
		files = len(m.Files)
		b.StopTimer()
		os.RemoveAll(dir)
		b.StartTimer()
	}
	b.ReportMetric(float64(files), "files")
	b.ReportMetric(float64(len(s.Placements)), "meetings")
}
