package benchfmt

import (
	"bytes"
	"math/rand/v2"
	"os"
	"path/filepath"
	"testing"
)

// xmlDataDir finds the shared ITC-2019 instances (never copied into the
// repository): $TERMWRIGHT_DATA/itc2019, or shared/data/itc2019 in the
// nearest directory above this package that has it; the test is skipped
// when absent.
func xmlDataDir(t testing.TB) string {
	t.Helper()
	if d := DataDir("itc2019", ".xml"); d != "" {
		return d
	}
	t.Skip("ITC-2019 instances not found (set TERMWRIGHT_DATA or place them in ../shared/data/itc2019)")
	return ""
}

// readSharedXML reads one shared instance by name ("wbg-fal10").
func readSharedXML(t testing.TB, name string) *XMLInstance {
	t.Helper()
	dir := xmlDataDir(t)
	f, err := os.Open(filepath.Join(dir, name+".xml"))
	if os.IsNotExist(err) {
		t.Skipf("%s.xml not in %s", name, dir)
	}
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	in, err := ReadXML(f, name+".xml")
	if err != nil {
		t.Fatal(err)
	}
	return in
}

// readSharedBest reads best-known.csv of the shared folder.
func readSharedBest(t testing.TB, dir string) map[string]XMLBest {
	t.Helper()
	f, err := os.Open(filepath.Join(dir, "best-known.csv"))
	if os.IsNotExist(err) {
		t.Skip("best-known.csv not in " + dir)
	}
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	best, err := ReadXMLBest(f, "best-known.csv")
	if err != nil {
		t.Fatal(err)
	}
	return best
}

// BenchmarkReadXML reads the largest small instance (pu-cs-fal07).
func BenchmarkReadXML(b *testing.B) {
	data, err := os.ReadFile(filepath.Join(xmlDataDir(b), "pu-cs-fal07.xml"))
	if err != nil {
		b.Skip(err)
	}
	b.ReportAllocs()
	b.SetBytes(int64(len(data)))
	for i := 0; i < b.N; i++ {
		if _, err := ReadXML(bytes.NewReader(data), "pu-cs-fal07.xml"); err != nil {
			b.Fatal(err)
		}
	}
}

// BenchmarkXMLCost evaluates a random timetable of pu-cs-fal07.
func BenchmarkXMLCost(b *testing.B) {
	in := readSharedXML(b, "pu-cs-fal07")
	sol, err := XMLSolutionOf(in, randomSchedule(in.Term(), rand.New(rand.NewPCG(1, 1))), XMLRunInfo{})
	if err != nil {
		b.Fatal(err)
	}
	b.ReportAllocs()
	for i := 0; i < b.N; i++ {
		XMLCost(in, sol)
	}
}
