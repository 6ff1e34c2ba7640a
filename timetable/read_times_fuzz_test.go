package timetable

import (
	"reflect"
	"strings"
	"testing"
)

// FuzzParseDays: a Days cell either gives one sentence of error or a
// non-empty day set whose written form reads back as the same set.
func FuzzParseDays(f *testing.F) {
	for _, s := range []string{"Mon Wed Fri", "Tue, Thu", "monday/WEDNESDAY", "MWF", "", "Sun Sat Sun", "Mon;;Tue", "Mo Tu", "ſun"} {
		f.Add(s)
	}
	f.Fuzz(func(t *testing.T, s string) {
		d, err := parseDays(s)
		if err != nil {
			if strings.Contains(err.Error(), "\n") {
				t.Fatalf("error of more than one line: %q", err)
			}
			return
		}
		if d == 0 || d >= 1<<7 {
			t.Fatalf("%q gave the day set %b", s, d)
		}
		again, err := parseDays(d.String())
		if err != nil || again != d {
			t.Fatalf("%q → %q → %v, %v", s, d.String(), again, err)
		}
	})
}

// FuzzPatternSheets puts arbitrary cells into one row of each new sheet of
// the pattern base and reads it as a CSV folder: the result must be
// well formed (checkReadResult), and whatever was read must survive writing
// the term and reading it back unchanged.
func FuzzPatternSheets(f *testing.F) {
	f.Add("SEC-5", "Mon Wed", "13:05", "55", "3-6", "4", "H1", "1", "North", "R102", "7", "at most breaks", "2", "10")
	f.Add("SEC-9", "MWF", "9.00", "47", "0-3", "-1", "R999", "x", "West", "West", "-5", "day span", "", "3")
	f.Add("SEC-1", "Sun", "23:55", "5", "all", "", "R101", "", "R101", "R101", "0", "same room", "1", "")
	f.Add("", "", "", "", "", "", "", "", "", "", "", "", "", "")
	f.Fuzz(func(t *testing.T, sec, days, start, minutes, weeks, weight, room, roomWeight, from, to, travel, kind, n, m string) {
		sheets := applyEdits(t, patternSheets(t),
			e("Meeting times", "A4", sec), e("Meeting times", "B4", days), e("Meeting times", "C4", start),
			e("Meeting times", "D4", minutes), e("Meeting times", "E4", weeks), e("Meeting times", "F4", weight),
			e("Room choices", "A4", sec), e("Room choices", "B4", room), e("Room choices", "C4", roomWeight),
			e("Travel", "A3", from), e("Travel", "B3", to), e("Travel", "C3", travel),
			e("Relations", "A4", kind), e("Relations", "B4", "SEC-1, SEC-5"), e("Relations", "D4", n), e("Relations", "E4", m),
		)
		for _, s := range sheets {
			for _, row := range s.rows {
				for _, c := range row {
					if strings.ContainsAny(c, "\x00\r") || !validUTF8(c) {
						t.Skip("cells a CSV file cannot hold as written")
					}
				}
			}
		}
		term, ps, err := ReadCSVDir(csvDir(t, sheets))
		checkReadResult(t, term, ps, err)
		if err != nil || len(ps.Errors()) > 0 {
			return
		}
		dir := t.TempDir()
		if err := WriteTermCSV(term, dir); err != nil {
			t.Fatal(err)
		}
		again, ps2, err := ReadCSVDir(dir)
		if err != nil || len(ps2.Errors()) > 0 {
			t.Fatalf("a valid term written and read back has problems: %v\n%s", err, ps2)
		}
		for i := range term.Sections {
			a, b := term.Sections[i], again.Sections[i]
			if !sameChoices(a.Times, b.Times) || !reflect.DeepEqual(roomsOf(a.RoomChoices), roomsOf(b.RoomChoices)) {
				t.Fatalf("section %s changed in the round trip:\n%+v\n%+v", a.ID, a, b)
			}
		}
		if len(term.Travel) != len(again.Travel) || len(term.Relations) != len(again.Relations) {
			t.Fatalf("travel or relations changed: %+v / %+v", term.Travel, again.Travel)
		}
		for i := range term.Relations {
			x, y := term.Relations[i], again.Relations[i]
			if x.Kind != y.Kind || x.N != y.N || x.M != y.M || x.Hard != y.Hard || x.Weight != y.Weight {
				t.Fatalf("relation changed: %+v / %+v", x, y)
			}
		}
	})
}

func validUTF8(s string) bool { return strings.ToValidUTF8(s, "\uFFFD") == s }

// sameChoices compares meeting times without their Sources.
func sameChoices(a, b []TimeChoice) bool {
	if len(a) != len(b) {
		return false
	}
	for i := range a {
		x, y := a[i], b[i]
		x.Src, y.Src = Source{}, Source{}
		if x != y {
			return false
		}
	}
	return true
}

// roomsOf lists room choices without their Sources.
func roomsOf(cs []RoomChoice) []RoomChoice {
	out := make([]RoomChoice, len(cs))
	for i, c := range cs {
		out[i] = RoomChoice{Room: c.Room, Weight: c.Weight}
	}
	return out
}
