package benchfmt

import (
	"bytes"
	"errors"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// readTinySolution reads testdata/ctt/<name>.sol for the tiny instance.
func readTinySolution(t testing.TB, term *timetable.Term, name string) *timetable.Schedule {
	t.Helper()
	data, err := os.ReadFile(filepath.Join("testdata", "ctt", name+".sol"))
	require.NoError(t, err)
	s, err := ReadCTTSolution(bytes.NewReader(data), name+".sol", term)
	require.NoError(t, err)
	return s
}

func TestReadITCSolution(t *testing.T) {
	term := readTiny(t)
	s := readTinySolution(t, term, "tiny-a")
	// Sorted by course order, then period; meetings numbered per course.
	assert.Equal(t, []timetable.Placement{
		{Section: "alg", Meeting: 1, Period: 0, Room: "big", Src: timetable.Source{Sheet: "tiny-a.sol", Row: 1}},
		{Section: "alg", Meeting: 2, Period: 1, Room: "small", Src: timetable.Source{Sheet: "tiny-a.sol", Row: 2}},
		{Section: "geo", Meeting: 1, Period: 2, Room: "small", Src: timetable.Source{Sheet: "tiny-a.sol", Row: 3}},
		{Section: "geo", Meeting: 2, Period: 5, Room: "big", Src: timetable.Source{Sheet: "tiny-a.sol", Row: 5}},
		{Section: "his", Meeting: 1, Period: 3, Room: "big", Src: timetable.Source{Sheet: "tiny-a.sol", Row: 4}},
	}, s.Placements)
}

func TestITCSolutionRoundTrip(t *testing.T) {
	term := readTiny(t)
	for _, name := range []string{"tiny-a", "tiny-b", "tiny-c"} {
		t.Run(name, func(t *testing.T) {
			s := readTinySolution(t, term, name)
			var first bytes.Buffer
			require.NoError(t, WriteCTTSolution(&first, term, s))
			again, err := ReadCTTSolution(bytes.NewReader(first.Bytes()), "again.sol", term)
			require.NoError(t, err)
			var second bytes.Buffer
			require.NoError(t, WriteCTTSolution(&second, term, again))
			assert.Equal(t, first.String(), second.String())
			require.Len(t, again.Placements, len(s.Placements))
			for i := range s.Placements {
				a, b := s.Placements[i], again.Placements[i]
				a.Src, b.Src = timetable.Source{}, timetable.Source{}
				assert.Equal(t, a, b)
			}
		})
	}
}

func TestWriteITCSolutionFormat(t *testing.T) {
	term := readTiny(t)
	s := &timetable.Schedule{Placements: []timetable.Placement{
		{Section: "his", Meeting: 1, Period: 3, Room: "big"},
		{Section: "alg", Meeting: 2, Period: 4, Room: "small"},
		{Section: "alg", Meeting: 1, Period: 2, Room: "big"},
	}}
	var b bytes.Buffer
	require.NoError(t, WriteCTTSolution(&b, term, s))
	// "course room day period", 0-based (Di Gaspero, McCollum, Schaerf 2007, output format).
	assert.Equal(t, "alg big 0 2\nalg small 1 1\nhis big 1 0\n", b.String())
}

func TestWriteITCSolutionErrors(t *testing.T) {
	term := readTiny(t)
	tests := []struct {
		name string
		p    timetable.Placement
		want string
	}{
		{"unknown section", timetable.Placement{Section: "zz", Meeting: 1, Period: 0, Room: "big"}, "not in the term"},
		{"no room", timetable.Placement{Section: "alg", Meeting: 1, Period: 0}, "has no room"},
		{"period outside", timetable.Placement{Section: "alg", Meeting: 1, Period: 6, Room: "big"}, "outside the term's grid"},
		{"room with space", timetable.Placement{Section: "alg", Meeting: 1, Period: 0, Room: "big hall"}, "spaces"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			err := WriteCTTSolution(&bytes.Buffer{}, term, &timetable.Schedule{Placements: []timetable.Placement{tc.p}})
			require.Error(t, err)
			assert.Contains(t, err.Error(), tc.want)
		})
	}
}

func TestReadITCSolutionErrors(t *testing.T) {
	term := readTiny(t)
	tests := []struct {
		name string
		src  string // a line starting with "!" is expected to carry an error
		want string
	}{
		{"three fields", "alg big 0 0\n!alg big 0\n", "4 fields"},
		{"unknown course", "!zz big 0 0\n", "course \"zz\" is not in the instance"},
		{"unknown room", "alg big 0 0\n\n!alg hall 0 1\n", "room \"hall\""},
		{"day outside", "!alg big 2 0\n", "outside the grid"},
		{"period outside", "!alg big 0 3\n", "outside the grid"},
		{"negative day", "!alg big -1 0\n", "it must be from 0 to 1000000"},
		{"not a number", "!alg big x 0\n", "not a whole number"},
	}
	for _, tc := range tests {
		t.Run(tc.name, func(t *testing.T) {
			src, marks := markedCTT(strings.Split(strings.TrimSuffix(tc.src, "\n"), "\n")...)
			_, err := ReadCTTSolution(strings.NewReader(src), "x.sol", term)
			require.Error(t, err)
			assert.True(t, errors.Is(err, ErrCTTFormat))
			var list Errors
			require.True(t, errors.As(err, &list))
			var got []int
			for _, e := range list {
				got = append(got, e.Line)
			}
			assert.Equal(t, marks, got, "%v", err)
			assert.Contains(t, err.Error(), tc.want)
		})
	}
}

func TestReadITCSolutionAcceptsWrongCounts(t *testing.T) {
	term := readTiny(t)
	s, err := ReadCTTSolution(strings.NewReader("alg big 0 0\nalg big 0 0\nalg big 0 1\n"), "x.sol", term)
	require.NoError(t, err)
	assert.Len(t, s.Placements, 3)
	assert.Equal(t, []int{1, 2, 3}, []int{s.Placements[0].Meeting, s.Placements[1].Meeting, s.Placements[2].Meeting})
}
