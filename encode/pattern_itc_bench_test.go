package encode

import (
	"context"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"
	"time"

	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/timetable/benchfmt"
)

// itc2019Dir holds the public ITC-2019 instances (read from there only;
// "" when absent, and the tests and benchmarks that need them skip).
var itc2019Dir = benchfmt.DataDir("itc2019", ".xml")

// BenchmarkITC2019 compiles and solves every public ITC-2019 instance in
// itc2019Dir (skipped when absent) to a first timetable within 5 minutes:
// run one instance per process (-bench 'ITC2019/NAME$' -benchtime 1x) to
// read its peak memory. Relations whose kinds the program cannot compile
// yet make it fall back to the term without relations (reported as
// "norel" = 1).
func BenchmarkITC2019(b *testing.B) {
	files, _ := filepath.Glob(filepath.Join(itc2019Dir, "*.xml"))
	if len(files) == 0 {
		b.Skip("no ITC-2019 instances in " + itc2019Dir)
	}
	if v, err := strconv.Atoi(os.Getenv("LAZY_ROOM_BUDGET")); err == nil {
		saved := lazyRoomBudget
		lazyRoomBudget = v // for measuring other budgets
		defer func() { lazyRoomBudget = saved }()
	}
	for _, f := range files {
		name := strings.TrimSuffix(filepath.Base(f), ".xml")
		b.Run(name, func(b *testing.B) {
			fh, err := os.Open(f)
			if err != nil {
				b.Fatal(err)
			}
			in, err := benchfmt.ReadXML(fh, f)
			fh.Close()
			if err != nil {
				b.Fatal(err)
			}
			tm := in.Term()
			norel := 0.0
			if _, _, err := Compile(tm, Options{HardOnly: true}); err != nil {
				b.Logf("%s: %v: solving without relations", name, firstLine(err))
				tm.Relations, norel = nil, 1
			}
			for i := 0; i < b.N; i++ {
				ctx, cancel := context.WithTimeout(context.Background(), 5*time.Minute)
				t0 := time.Now()
				res, err := Solve(ctx, tm, SolveOptions{Seed: 1})
				cancel()
				if err != nil {
					b.Fatal(err)
				}
				wall := time.Since(t0)
				if res.Status != solver.Satisfiable {
					b.Logf("%s: %v after %v", name, res.Status, wall)
				} else if hard := timetable.HardViolations(timetable.Check(tm, res.Schedule)); len(hard) > 0 {
					b.Fatalf("%s: %d hard violations: %v", name, len(hard), hard[0].Msg)
				}
				st := res.Size
				b.ReportMetric(float64(st.PatternSecs), "sections")
				b.ReportMetric(float64(st.Atoms), "atoms")
				b.ReportMetric(float64(st.Rules+st.Choices), "rules")
				b.ReportMetric(float64(st.Bounds), "bounds")
				b.ReportMetric(float64(st.BoundLits), "boundlits")
				b.ReportMetric(res.Timings.Compile.Seconds(), "compile-s")
				b.ReportMetric(wall.Seconds(), "first-s")
				b.ReportMetric(float64(peakRSS())/(1<<20), "peakRSS-MiB")
				b.ReportMetric(norel, "norel")
				b.ReportMetric(float64(res.Rounds), "rounds")
				b.ReportMetric(float64(res.Nogoods), "nogoods")
				b.ReportMetric(float64(st.LazyRooms), "lazyrooms")
				if res.Status == solver.Satisfiable {
					b.ReportMetric(1, "valid")
				} else {
					b.ReportMetric(0, "valid")
				}
			}
		})
	}
}

func firstLine(err error) string {
	s := err.Error()
	if i := strings.Index(s, "\n  "); i >= 0 {
		rest := s[i+3:]
		if j := strings.IndexByte(rest, '\n'); j >= 0 {
			rest = rest[:j]
		}
		return rest
	}
	return s
}

// peakRSS is the process's peak resident set (VmHWM, bytes; 0 when
// unknown).
func peakRSS() int64 {
	data, err := os.ReadFile("/proc/self/status")
	if err != nil {
		return 0
	}
	for _, line := range strings.Split(string(data), "\n") {
		if strings.HasPrefix(line, "VmHWM:") {
			f := strings.Fields(line)
			if len(f) >= 2 {
				kb, _ := strconv.ParseInt(f[1], 10, 64)
				return kb << 10
			}
		}
	}
	return 0
}

// readSmallITC2019 reads one shared instance by name into a term,
// skipping the test when the instances are absent.
func readSmallITC2019(t *testing.T, name string) *timetable.Term {
	t.Helper()
	f := filepath.Join(itc2019Dir, name+".xml")
	fh, err := os.Open(f)
	if itc2019Dir == "" || err != nil {
		t.Skip("no ITC-2019 instances in " + itc2019Dir)
	}
	defer fh.Close()
	in, err := benchfmt.ReadXML(fh, f)
	if err != nil {
		t.Fatal(err)
	}
	return in.Term()
}
