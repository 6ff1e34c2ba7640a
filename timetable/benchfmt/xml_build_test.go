package benchfmt

import (
	"fmt"
	"strings"
	"testing"

	"github.com/stretchr/testify/require"
)

// tc is one class of a hand-made instance with exactly one time (so its
// solution is forced): days bits, start slot, length, weeks bits, room ("" =
// no room).
type tc struct {
	days          string
	start, length int
	weeks         string
	room          string
}

// handInstance writes an instance of 7 days, 288 slots, 4 weeks and weights
// time 1, room 1, distribution 1, student 1; rooms R1 and R2 (capacity 50)
// with travel 3 slots between them; classes 1..n as given (each in one
// course, config, subpart); and the distributions given as raw XML.
func handInstance(classes []tc, dists string) string {
	var b strings.Builder
	b.WriteString("\ufeff<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n")
	b.WriteString("<problem name=\"hand\" nrDays=\"7\" slotsPerDay=\"288\" nrWeeks=\"4\">\n")
	b.WriteString("<optimization time=\"1\" room=\"1\" distribution=\"1\" student=\"1\"/>\n")
	b.WriteString("<rooms><room id=\"R1\" capacity=\"50\"/><room id=\"R2\" capacity=\"50\"><travel room=\"R1\" value=\"3\"/></room></rooms>\n")
	b.WriteString("<courses><course id=\"K\"><config id=\"1\"><subpart id=\"1\">\n")
	for i, c := range classes {
		if c.room == "" {
			fmt.Fprintf(&b, "<class id=\"%d\" limit=\"10\" room=\"false\">", i+1)
		} else {
			fmt.Fprintf(&b, "<class id=\"%d\" limit=\"10\"><room id=\"%s\" penalty=\"0\"/>", i+1, c.room)
		}
		fmt.Fprintf(&b, "<time days=\"%s\" start=\"%d\" length=\"%d\" weeks=\"%s\" penalty=\"0\"/></class>\n", c.days, c.start, c.length, c.weeks)
	}
	b.WriteString("</subpart></config></course></courses>\n<distributions>\n")
	b.WriteString(dists)
	b.WriteString("</distributions>\n</problem>\n")
	return b.String()
}

// distXML writes one distribution over classes 1..n.
func distXML(typ string, n int, strength string) string {
	var b strings.Builder
	fmt.Fprintf(&b, "<distribution type=\"%s\" %s>", typ, strength)
	for i := 1; i <= n; i++ {
		fmt.Fprintf(&b, "<class id=\"%d\"/>", i)
	}
	b.WriteString("</distribution>\n")
	return b.String()
}

// forcedSolution assigns every class its only time and its only room.
func forcedSolution(in *XMLInstance) *XMLSolution {
	sol := &XMLSolution{Name: in.Name}
	for _, c := range in.Classes {
		a := XMLAssignment{Class: c.ID, Days: c.Times[0].Days, Start: c.Times[0].Start, Weeks: c.Times[0].Weeks}
		if len(c.Rooms) > 0 {
			a.Room = c.Rooms[0].Room
		}
		sol.Classes = append(sol.Classes, a)
	}
	return sol
}

func readHand(t *testing.T, src string) *XMLInstance {
	t.Helper()
	in, err := ReadXML(strings.NewReader(src), "hand.xml")
	require.NoError(t, err)
	return in
}
