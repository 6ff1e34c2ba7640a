package timetable

import (
	"fmt"
	"math/rand"
	"os"
	"path/filepath"
	"testing"
)

// syntheticSheets makes a seeded term of about n sections with the
// proportions of a university (invented data): n/5 rooms, n*9/20 staff,
// n/6 cohorts, 45 periods, 2.5n students with four enrolments each, some
// unavailability, fixed meetings and relations.
func syntheticSheets(n int, seed int64) []testSheet {
	r := rand.New(rand.NewSource(seed))
	rooms, staff, cohorts, students := max(n/5, 3), max(n*9/20, 2), max(n/6, 2), max(n*5/2, 2)
	days := []string{"Mon", "Tue", "Wed", "Thu", "Fri"}
	starts := []string{"09:00", "10:00", "11:00", "12:00", "14:00", "15:00", "16:00", "17:00", "18:00"}
	ends := []string{"10:00", "11:00", "12:00", "13:00", "15:00", "16:00", "17:00", "18:00", "19:00"}

	sh := func(name string, header ...string) testSheet { return testSheet{name, [][]string{header}} }
	term := sh("Term", "Key", "Value")
	term.rows = append(term.rows, []string{"Name", "Synthetic"}, []string{"First day", "2027-09-13"},
		[]string{"Last day", "2027-12-17"}, []string{"Time zone", "Europe/Dublin"})
	periods := sh("Periods", "Day", "Start", "End")
	for _, d := range days {
		for i := range starts {
			periods.rows = append(periods.rows, []string{d, starts[i], ends[i]})
		}
	}
	roomSheet := sh("Rooms", "Room", "Capacity", "Features", "Building")
	caps := []int{20, 30, 40, 60, 80, 120, 200}
	for i := 0; i < rooms; i++ {
		feat := "projector"
		if r.Intn(10) == 0 {
			feat = "lab, projector"
		}
		if r.Intn(3) == 0 {
			feat += ", step-free"
		}
		roomSheet.rows = append(roomSheet.rows, []string{fmt.Sprintf("R%03d", i), fmt.Sprint(caps[r.Intn(len(caps))]), feat, fmt.Sprintf("B%d", i%12)})
	}
	staffSheet := sh("Staff", "Staff ID", "Name", "Email", "Max periods per day", "Max consecutive periods")
	for i := 0; i < staff; i++ {
		staffSheet.rows = append(staffSheet.rows, []string{fmt.Sprintf("S%04d", i), fmt.Sprintf("Staff %d", i), "", "6", ""})
	}
	cohortSheet := sh("Cohorts", "Cohort", "Name", "Size")
	for i := 0; i < cohorts; i++ {
		cohortSheet.rows = append(cohortSheet.rows, []string{fmt.Sprintf("C%03d", i), fmt.Sprintf("Cohort %d", i), fmt.Sprint(15 + r.Intn(60))})
	}
	sections := sh("Sections", "Section", "Title", "Staff", "Cohorts", "Expected size", "Meetings per week", "Periods per meeting", "Needs", "Rooms", "Fixed", "Weeks", "Min days")
	weeks := []string{"", "", "", "", "odd", "even", "1-7"}
	for i := 0; i < n; i++ {
		st := fmt.Sprintf("S%04d", i%staff)
		if r.Intn(10) == 0 {
			st += fmt.Sprintf(", S%04d", (i+7)%staff)
		}
		needs, fixed := "", ""
		if r.Intn(20) == 0 {
			needs = "lab"
		}
		if r.Intn(20) == 0 {
			fixed = days[r.Intn(5)] + " " + starts[r.Intn(3)]
		}
		sections.rows = append(sections.rows, []string{
			fmt.Sprintf("SEC%05d", i), fmt.Sprintf("Course %d", i), st, fmt.Sprintf("C%03d", i%cohorts),
			fmt.Sprint(10 + r.Intn(50)), fmt.Sprint(1 + r.Intn(3)), fmt.Sprint(1 + r.Intn(2)), needs, "", fixed, weeks[r.Intn(len(weeks))], "",
		})
	}
	enrol := sh("Enrolments", "Student", "Section")
	for s := 0; s < students; s++ {
		for k := 0; k < 4; k++ {
			enrol.rows = append(enrol.rows, []string{fmt.Sprintf("P%06d", s), fmt.Sprintf("SEC%05d", r.Intn(n))})
		}
	}
	unav := sh("Unavailable", "Who", "Day", "From", "To", "Strength", "Reason")
	for i := 0; i < staff/3; i++ {
		strength := "hard"
		if r.Intn(2) == 0 {
			strength = "2"
		}
		unav.rows = append(unav.rows, []string{fmt.Sprintf("S%04d", r.Intn(staff)), days[r.Intn(5)], "09:00", "12:00", strength, "other duties"})
	}
	rel := sh("Relations", "Kind", "Sections", "Strength")
	for i := 0; i+1 < n && i < n/40*2; i += 2 {
		rel.rows = append(rel.rows, []string{"not same time", fmt.Sprintf("SEC%05d, SEC%05d", i, i+1), "hard"})
	}
	weights := sh("Weights", "Criterion", "Weight", "Level")
	weights.rows = append(weights.rows, []string{"staff gaps", "2", ""})
	return []testSheet{term, periods, roomSheet, staffSheet, cohortSheet, sections, enrol, unav, rel, weights}
}

// BenchmarkLoad reads and validates a synthetic 2,000-section term from an
// .xlsx file and from a folder of CSV files.
// Run: go test ./timetable -run '^$' -bench BenchmarkLoad -benchtime 5x
func BenchmarkLoad(b *testing.B) {
	sheets := syntheticSheets(2000, 7)
	dir := b.TempDir()
	path := filepath.Join(dir, "synthetic.xlsx")
	if err := os.WriteFile(path, xlsxBytes(b, sheets), 0o644); err != nil {
		b.Fatal(err)
	}
	csv := csvDir(b, sheets)
	for _, tc := range []struct{ name, path string }{{"xlsx", path}, {"csv", csv}} {
		b.Run(tc.name+"/2000-sections", func(b *testing.B) {
			b.ReportAllocs()
			for b.Loop() {
				term, ps, err := Load(tc.path)
				if err != nil || len(term.Sections) != 2000 {
					b.Fatalf("load: %v (%d problems)", err, len(ps))
				}
			}
		})
	}
}

// BenchmarkValidate times Validate alone on the same synthetic term.
func BenchmarkValidate(b *testing.B) {
	term, _ := readSheets(b, syntheticSheets(2000, 7))
	b.ReportAllocs()
	for b.Loop() {
		Validate(term)
	}
}

// TestSyntheticTermReads keeps the benchmark's generator honest under plain
// go test, at a small size.
func TestSyntheticTermReads(t *testing.T) {
	term, ps := readSheets(t, syntheticSheets(60, 1))
	if len(term.Sections) != 60 || len(term.Periods) != 45 {
		t.Fatalf("got %d sections, %d periods", len(term.Sections), len(term.Periods))
	}
	for _, p := range ps {
		if p.Severity == Error && p.Pos.Sheet != "Sections" && p.Pos.Sheet != "Staff" && p.Pos.Sheet != "Cohorts" {
			t.Errorf("unexpected error in generated data: %s", p)
		}
	}
}

// BenchmarkCheckPackage measures the independent pass over every sheet's
// XML that runs before the spreadsheet library reads a workbook, on the
// same synthetic 2,000-section workbook as BenchmarkLoad.
func BenchmarkCheckPackage(b *testing.B) {
	data := xlsxBytes(b, syntheticSheets(2000, 7))
	b.ReportAllocs()
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, err := checkPackage(data, "synthetic.xlsx"); err != nil {
			b.Fatal(err)
		}
	}
}
