package benchfmt

import (
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
	var tries []string
	if d := os.Getenv("TERMWRIGHT_DATA"); d != "" {
		tries = append(tries, filepath.Join(d, "itc2019"), d)
	}
	if wd, err := os.Getwd(); err == nil {
		for dir := wd; ; dir = filepath.Dir(dir) {
			tries = append(tries, filepath.Join(dir, "shared", "data", "itc2019"))
			if filepath.Dir(dir) == dir {
				break
			}
		}
	}
	for _, d := range tries {
		if m, _ := filepath.Glob(filepath.Join(d, "*.xml")); len(m) > 0 {
			return d
		}
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
