package export

import (
	"io"
	"os"
	"strconv"
	"testing"

	"github.com/termwright/termwright/samples"
)

// BenchmarkTimetableWorkbookScale writes the timetable workbook of a
// generated term with its witness timetable (TW_WORKBOOK_SECTIONS
// sections, default 2,000): one grid sheet per staff member, room and
// cohort, so its time shows how the writer scales with the sheet count.
func BenchmarkTimetableWorkbookScale(b *testing.B) {
	n := 2000
	if v, err := strconv.Atoi(os.Getenv("TW_WORKBOOK_SECTIONS")); err == nil && v > 0 {
		n = v
	}
	t, s := samples.GenerateWithWitness(samples.Config{Sections: n, Seed: 1})
	b.ResetTimer()
	for b.Loop() {
		if err := WriteTimetableWorkbook(io.Discard, t, s, Options{}); err != nil {
			b.Fatal(err)
		}
	}
}
