package benchfmt

import (
	"bytes"
	"errors"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/termwright/termwright/timetable"
)

// checkITCErr checks that err lists problems at lines of the input (0 for
// the whole file, at most one past the last line) under the given name.
func checkITCErr(t *testing.T, err error, name string, input []byte) {
	t.Helper()
	if !errors.Is(err, ErrCTTFormat) {
		t.Fatalf("error does not match ErrCTTFormat: %v", err)
	}
	var list Errors
	if !errors.As(err, &list) || len(list) == 0 {
		t.Fatalf("error is not a non-empty Errors: %T %v", err, err)
	}
	lines := bytes.Count(input, []byte("\n")) + 1
	for _, e := range list {
		if e.Line < 0 || e.Line > lines+1 {
			t.Fatalf("line %d outside the input of %d lines: %v", e.Line, lines, e)
		}
		if e.File != name || !strings.HasPrefix(e.Error(), name+":") {
			t.Fatalf("error does not name the file: %v", e)
		}
	}
}

// stripSources zeroes every Src of t, for comparing terms read from
// differently laid out files.
func stripSources(t *timetable.Term) {
	for i := range t.Periods {
		t.Periods[i].Src = timetable.Source{}
	}
	for i := range t.Rooms {
		t.Rooms[i].Src = timetable.Source{}
	}
	for i := range t.Staff {
		t.Staff[i].Src = timetable.Source{}
	}
	for i := range t.Cohorts {
		t.Cohorts[i].Src = timetable.Source{}
	}
	for i := range t.Sections {
		t.Sections[i].Src = timetable.Source{}
	}
	for i := range t.Unavailable {
		t.Unavailable[i].Src = timetable.Source{}
	}
}

func FuzzReadCTT(f *testing.F) {
	if data, err := os.ReadFile(filepath.Join("testdata", "ctt", "tiny.ctt")); err == nil {
		f.Add(data)
		f.Add(bytes.ReplaceAll(data, []byte("\n"), []byte("\r\n")))
		f.Add(data[:len(data)/2])
	}
	f.Add([]byte("Name: X\nCourses: 1\nRooms: 1\nDays: 1\nPeriods_per_day: 1\nCurricula: 1\nConstraints: 0\nCOURSES:\nc t 1 1 1\nROOMS:\nr 1\nCURRICULA:\nq 1 c\nUNAVAILABILITY_CONSTRAINTS:\nEND.\n"))
	f.Add([]byte("name:  A b  \ncourses: +1\nrooms: 01\ndays: 7\nperiods_per_day: 96\ncurricula: 0\nconstraints: 2\nCOURSES:\nc t 3 9 0\nROOMS:\nr 0\nCURRICULA:\nUNAVAILABILITY_CONSTRAINTS:\nc 6 95\nc 6 95\nEND.\n"))
	f.Add([]byte("Name: X\nCourses: 1\nCOURSES:\nc t 1\nEND.\ntrailing\n"))
	f.Add([]byte(""))
	f.Add([]byte("Name: X\nCourses: 1\nRooms: 1\nDays: 1\nPeriods_per_day: 1\nCurricula: 1\nConstraints: 0\nCOURSES:\nc t 1 1 9223372036854775807\nROOMS:\nr 1000000\nCURRICULA:\nq 1 c\nUNAVAILABILITY_CONSTRAINTS:\nEND.\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		term, err := ReadCTT(bytes.NewReader(data), "fuzz.ctt")
		if err != nil {
			if term != nil {
				t.Fatal("a term and an error")
			}
			checkITCErr(t, err, "fuzz.ctt", data)
			return
		}
		// Every meeting in the first room at the first period: the cost
		// sums stay non-negative whatever numbers were read.
		if len(term.Rooms) > 0 && len(term.Periods) > 0 {
			var s timetable.Schedule
			for _, sec := range term.Sections {
				for m := 1; m <= sec.Meetings; m++ {
					s.Placements = append(s.Placements, timetable.Placement{Section: sec.ID, Meeting: m, Room: term.Rooms[0].ID})
				}
			}
			if total, _ := CTTCost(term, &s); total < 0 {
				t.Fatalf("negative ITC cost %d", total)
			}
		}
		var first bytes.Buffer
		if err := WriteCTT(&first, term); err != nil {
			t.Fatalf("a term read from .ctt cannot be written: %v", err)
		}
		again, err := ReadCTT(bytes.NewReader(first.Bytes()), "again.ctt")
		if err != nil {
			t.Fatalf("written file does not read back: %v\n%s", err, first.String())
		}
		var second bytes.Buffer
		if err := WriteCTT(&second, again); err != nil {
			t.Fatal(err)
		}
		if first.String() != second.String() {
			t.Fatalf("write, read, write differs:\n%s\n---\n%s", first.String(), second.String())
		}
		stripSources(term)
		stripSources(again)
		if !termsEqual(term, again) {
			t.Fatalf("read, write, read gives another term:\n%+v\n%+v", term, again)
		}
	})
}

// termsEqual compares the parts of a Term that ReadCTT fills.
func termsEqual(a, b *timetable.Term) bool {
	var x, y bytes.Buffer
	dump := func(w *bytes.Buffer, t *timetable.Term) {
		w.WriteString(t.Name)
		for _, v := range []any{t.Periods, t.Rooms, t.Staff, t.Cohorts, t.Sections, t.Unavailable, t.Weights, t.SoftCapacity} {
			w.WriteString(strings.ReplaceAll(strings.TrimSpace(sprintAny(v)), "\n", " "))
		}
	}
	dump(&x, a)
	dump(&y, b)
	return x.String() == y.String()
}

func FuzzReadITCSolution(f *testing.F) {
	for _, n := range []string{"tiny-a", "tiny-b", "tiny-c"} {
		if data, err := os.ReadFile(filepath.Join("testdata", "ctt", n+".sol")); err == nil {
			f.Add(data)
		}
	}
	f.Add([]byte("alg big 0\nzz hall 9 -1\n\n"))
	f.Add([]byte("his small +1 00\r\n"))
	term := readTiny(f)
	f.Fuzz(func(t *testing.T, data []byte) {
		s, err := ReadCTTSolution(bytes.NewReader(data), "fuzz.sol", term)
		if err != nil {
			checkITCErr(t, err, "fuzz.sol", data)
			return
		}
		var first, second bytes.Buffer
		if err := WriteCTTSolution(&first, term, s); err != nil {
			t.Fatalf("a read solution cannot be written: %v", err)
		}
		again, err := ReadCTTSolution(bytes.NewReader(first.Bytes()), "again.sol", term)
		if err != nil {
			t.Fatal(err)
		}
		if err := WriteCTTSolution(&second, term, again); err != nil {
			t.Fatal(err)
		}
		if first.String() != second.String() {
			t.Fatalf("write, read, write differs:\n%s---\n%s", first.String(), second.String())
		}
		// The evaluators accept anything read and agree with themselves.
		c1, _ := CTTCost(term, s)
		c2, _ := CTTCost(term, again)
		if c1 != c2 || CTTHardViolations(term, s) != CTTHardViolations(term, again) {
			t.Fatal("cost changed across a round trip")
		}
	})
}

func FuzzReadITCBest(f *testing.F) {
	f.Add([]byte("instance,best,lower_bound,source\ncomp01,5,5,\"a, b\"\ntoy,0,,x\n"))
	f.Add([]byte("Instance,Best\na,1\na,2\n"))
	f.Add([]byte("instance,best\n\"unterminated,1\n"))
	f.Add([]byte("x,y\n"))
	f.Fuzz(func(t *testing.T, data []byte) {
		m, err := ReadCTTBest(bytes.NewReader(data), "fuzz.csv")
		if err != nil {
			checkITCErr(t, err, "fuzz.csv", data)
			return
		}
		for k, b := range m {
			if k != b.Instance || k == "" || b.Best < 0 || b.LowerBound < -1 || b.Line < 2 {
				t.Fatalf("bad entry %q: %+v", k, b)
			}
		}
	})
}

func sprintAny(v any) string { return fmt.Sprintf("%#v", v) }
