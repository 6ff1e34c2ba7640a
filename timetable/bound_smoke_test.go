package timetable_test

import (
	"fmt"
	"os"
	"path/filepath"
	"testing"
	"time"

	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

func TestBoundSmoke(t *testing.T) {
	dir := benchfmt.DataDir("itc2007", ".ctt")
	for _, n := range []string{"comp01", "comp02", "comp03", "comp04", "comp05", "comp06", "comp07"} {
		f, err := os.Open(filepath.Join(dir, n+".ctt"))
		if err != nil {
			t.Skip()
		}
		term, err := benchfmt.ReadCTT(f, n)
		f.Close()
		if err != nil {
			t.Fatal(err)
		}
		r := timetable.CountingBound(term, nil)
		fmt.Println(n, r.ByLevel)
		for _, c := range r.Criteria {
			if c.Count != 0 {
				fmt.Println("  ", c.Name, c.Count, c.Cost)
			}
		}
	}
	for _, n := range []int{150, 2000, 10000} {
		term := samples.Generate(samples.Config{Sections: n, Seed: 1})
		st := time.Now()
		r := timetable.CountingBound(term, nil)
		fmt.Println(n, time.Since(st), r.ByLevel)
		for _, c := range r.Criteria {
			if c.Count != 0 {
				fmt.Println("  ", c.Name, c.Count, c.Cost)
			}
		}
	}
}
