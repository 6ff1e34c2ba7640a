package benchfmt

import (
	"bytes"
	"errors"
	"strings"
	"testing"
)

// FuzzReadXML: any input either reads (and then maps to a term, writes a
// solution that reads back, and evaluates without panicking) or fails with
// a non-empty Errors matching ErrXMLFormat whose lines lie in the input.
func FuzzReadXML(f *testing.F) {
	f.Add(handInstance([]tc{{"1010100", 90, 10, "1010", "R1"}, {"0100000", 100, 12, "0001", ""}},
		distXML("MaxBreaks(1,2)", 2, `penalty="5"`)+distXML("SameAttendees", 2, `required="true"`)))
	f.Add(`<problem name="p" nrDays="7" slotsPerDay="288" nrWeeks="2"><students><student id="1"><course id="1"/></student></students></problem>`)
	f.Add(`<problem name="p" nrDays="5" slotsPerDay="288" nrWeeks="1"><distributions><distribution type="MaxDays(2)" penalty="1"/></distributions></problem>`)
	f.Add("\ufeff<problem")
	f.Add(courseXML)
	f.Fuzz(func(t *testing.T, src string) {
		in, err := ReadXML(strings.NewReader(src), "f.xml")
		if err != nil {
			if !errors.Is(err, ErrXMLFormat) {
				t.Fatalf("error does not match ErrXMLFormat: %v", err)
			}
			var list Errors
			if !errors.As(err, &list) || len(list) == 0 {
				t.Fatalf("error is not a non-empty Errors: %T %v", err, err)
			}
			lines := strings.Count(src, "\n") + 1
			for _, e := range list {
				if e.Line < 0 || e.Line > lines || !strings.HasPrefix(e.Error(), "f.xml:") {
					t.Fatalf("bad position or name in %v (input of %d lines)", e, lines)
				}
			}
			return
		}
		term := in.Term()
		if term.TeachingWeeks() != in.Weeks {
			t.Fatalf("term has %d weeks, instance %d", term.TeachingWeeks(), in.Weeks)
		}
		sol := forcedSolution(in)
		firstClassSeating(in, sol)
		var buf bytes.Buffer
		if err := WriteXMLSolution(&buf, in, sol); err != nil {
			t.Fatal(err)
		}
		back, err := ReadXMLSolution(&buf, "f.solution.xml", in)
		if err != nil {
			t.Fatalf("written solution does not read back: %v\n%s", err, buf.String())
		}
		c1, _ := XMLCost(in, sol)
		c2, _ := XMLCost(in, back)
		if c1 != c2 {
			t.Fatalf("cost %d before writing, %d after", c1, c2)
		}
		if h1, h2 := XMLHardViolations(in, sol), XMLHardViolations(in, back); h1 != h2 {
			t.Fatalf("hard counts %+v before writing, %+v after", h1, h2)
		}
	})
}

// firstClassSeating lists every student, for each wanted course, in the
// first class of every subpart of the course's first configuration.
func firstClassSeating(in *XMLInstance, sol *XMLSolution) {
	at := map[string]int{}
	for i, a := range sol.Classes {
		at[a.Class] = i
	}
	courses := map[string]XMLCourse{}
	for _, c := range in.Courses {
		courses[c.ID] = c
	}
	for _, st := range in.Students {
		for _, id := range st.Courses {
			c := courses[id]
			if len(c.Configs) == 0 {
				continue
			}
			for _, sp := range c.Configs[0].Subparts {
				if len(sp.Classes) > 0 {
					if i, ok := at[sp.Classes[0]]; ok {
						sol.Classes[i].Students = append(sol.Classes[i].Students, st.ID)
					}
				}
			}
		}
	}
}
