package samples

import "github.com/termwright/termwright/timetable"

//go:generate go test -run TestDemoFiles -update .

// Files of the checked-in demo term, relative to this package's directory.
// Both are written from Demo(); TestDemoFiles fails when they drift and
// rewrites them with -update (or run go generate ./samples).
const (
	DemoWorkbook = "demo-term.xlsx" // the demo term workbook
	DemoCSVDir   = "demo"           // the same tables as CSV files
)

// Demo returns the demo term of Quillmere Polytechnic: Generate(DemoConfig),
// about 150 sections, 30 rooms, 70 staff, 25 cohorts and 550 students on a
// Monday-to-Friday grid of nine periods.
func Demo() *timetable.Term { return Generate(DemoConfig) }
