package benchfmt

import (
	"bufio"
	"bytes"
	"os"
	"path/filepath"
	"strconv"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// itcDataDir finds the shared ITC-2007 instances: $TERMWRIGHT_DATA/itc2007
// (or $TERMWRIGHT_DATA itself), else shared/data/itc2007 in a directory
// above this package. It skips the test when they are absent; they are never
// copied into the repository.
func itcDataDir(t testing.TB) string {
	t.Helper()
	if d := itcDataDirOrEmpty(); d != "" {
		return d
	}
	t.Skip("ITC-2007 instances not found (set TERMWRIGHT_DATA or place them in ../shared/data/itc2007)")
	return ""
}

// itcDataDirOrEmpty is itcDataDir without skipping: "" when absent.
func itcDataDirOrEmpty() string { return DataDir("itc2007", ".ctt") }

// readShared reads one shared instance by name ("comp01").
func readShared(t testing.TB, dir, name string) *timetable.Term {
	t.Helper()
	f, err := os.Open(filepath.Join(dir, name+".ctt"))
	if os.IsNotExist(err) {
		t.Skipf("%s.ctt not found in %s", name, dir)
	}
	require.NoError(t, err)
	defer f.Close()
	term, err := ReadCTT(f, name+".ctt")
	require.NoError(t, err)
	return term
}

// cttHeaderCounts reads the header numbers of a .ctt file by hand, apart
// from ReadCTT, and counts the meetings in its COURSES section.
func cttHeaderCounts(t *testing.T, path string) (map[string]int, int) {
	f, err := os.Open(path)
	require.NoError(t, err)
	defer f.Close()
	counts := map[string]int{}
	meetings := 0
	inCourses := false
	sc := bufio.NewScanner(f)
	for sc.Scan() {
		line := strings.TrimSpace(sc.Text())
		if k, v, ok := strings.Cut(line, ":"); ok && k != "Name" && v != "" {
			if n, err := strconv.Atoi(strings.TrimSpace(v)); err == nil {
				counts[k] = n
			}
		}
		switch {
		case line == "COURSES:":
			inCourses = true
		case strings.HasSuffix(line, ":"), line == "END.":
			inCourses = false
		case inCourses && line != "":
			n, err := strconv.Atoi(strings.Fields(line)[2])
			require.NoError(t, err)
			meetings += n
		}
	}
	require.NoError(t, sc.Err())
	return counts, meetings
}

func TestReadCTTSharedInstances(t *testing.T) {
	dir := itcDataDir(t)
	files, err := filepath.Glob(filepath.Join(dir, "*.ctt"))
	require.NoError(t, err)
	for _, path := range files {
		t.Run(filepath.Base(path), func(t *testing.T) {
			f, err := os.Open(path)
			require.NoError(t, err)
			defer f.Close()
			term, err := ReadCTT(f, filepath.Base(path))
			require.NoError(t, err)
			h, meetings := cttHeaderCounts(t, path)
			assert.Len(t, term.Sections, h["Courses"])
			assert.Len(t, term.Rooms, h["Rooms"])
			assert.Len(t, term.Periods, h["Days"]*h["Periods_per_day"])
			assert.Len(t, term.Cohorts, h["Curricula"])
			assert.Len(t, term.Unavailable, h["Constraints"])
			assert.Len(t, term.Days(), h["Days"])
			total := 0
			for _, s := range term.Sections {
				total += s.Meetings
				require.Len(t, s.Staff, 1)
			}
			assert.Equal(t, meetings, total)
			assert.Empty(t, timetable.Validate(term).Errors(), "the term passes termwright's validation")
		})
	}
}

// Sizes of the first instance as published with the competition's
// instances (comp01: 30 courses, 160 meetings, 6 rooms, 30 periods,
// 14 curricula) — from memory; the file header agrees.
func TestReadCTTComp01Sizes(t *testing.T) {
	term := readShared(t, itcDataDir(t), "comp01")
	meetings := 0
	for _, s := range term.Sections {
		meetings += s.Meetings
	}
	assert.Equal(t, 30, len(term.Sections))
	assert.Equal(t, 160, meetings)
	assert.Equal(t, 6, len(term.Rooms))
	assert.Equal(t, 30, len(term.Periods))
	assert.Equal(t, 14, len(term.Cohorts))
}

func BenchmarkReadCTT(b *testing.B) {
	dir := itcDataDir(b)
	data, err := os.ReadFile(filepath.Join(dir, "comp07.ctt"))
	if err != nil {
		b.Skip("comp07.ctt not found")
	}
	b.ReportAllocs()
	b.SetBytes(int64(len(data)))
	for b.Loop() {
		if _, err := ReadCTT(bytes.NewReader(data), "comp07.ctt"); err != nil {
			b.Fatal(err)
		}
	}
}
