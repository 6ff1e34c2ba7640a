package export

import (
	"bytes"
	"strings"
	"testing"
	"time"
	"unicode"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// TestErrorsAreSentences: what the writers say about bad input reads as a
// sentence for the user: no package prefix such as "export:", a word
// first, the value at fault and what to do (the project's rule for every
// message: common practice of the Go standard library's parsers).
func TestErrorsAreSentences(t *testing.T) {
	cases := []struct {
		name string
		run  func() error
		want []string // words the message must hold
	}{
		{"paper", func() error {
			term, s := demoTerm()
			return WritePersonPDF(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "S1"}, Options{Paper: "A3"})
		}, []string{`"A3"`, "A4 or Letter"}},
		{"workbook paper", func() error {
			term, s := demoTerm()
			return WriteTimetableWorkbook(&bytes.Buffer{}, term, s, Options{Paper: "Legal"})
		}, []string{`"Legal"`, "A4 or Letter"}},
		{"unknown staff", func() error {
			term, s := demoTerm()
			return WriteICS(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "S99"}, Options{})
		}, []string{`"S99"`, "Staff sheet"}},
		{"unknown room", func() error {
			term, s := demoTerm()
			return WritePersonPDF(&bytes.Buffer{}, term, s, Subject{timetable.WhoRoom, "Z9"}, Options{})
		}, []string{`"Z9"`, "Rooms sheet"}},
		{"pattern choice out of range", func() error {
			term, s := patternTerm()
			s.Placements[len(s.Placements)-1].Time = 3 // EN130 has one meeting time
			return WriteTimetableCSV(&bytes.Buffer{}, term, s)
		}, []string{`"EN130"`, "meeting time 3", "it has 1 meeting time)", "meeting times sheet"}},
		{"pattern room unknown", func() error {
			term, s := patternTerm()
			s.Placements[len(s.Placements)-1].Room = "Z9"
			return WriteTimetableCSV(&bytes.Buffer{}, term, s)
		}, []string{`"EN130"`, `"Z9"`, "Rooms sheet"}},
		{"unknown student", func() error {
			term, s := demoTerm()
			return WriteICS(&bytes.Buffer{}, term, s, Subject{WhoStudent, "nobody"}, Options{})
		}, []string{`"nobody"`, "Enrolments sheet"}},
		{"time zone", func() error {
			term, s := demoTerm()
			term.TimeZone = "Mars/Olympus"
			return WriteICS(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "S1"}, Options{})
		}, []string{`"Mars/Olympus"`, "Time zone key of the Term sheet"}},
		{"term dates", func() error {
			term, s := demoTerm()
			term.LastDay = term.FirstDay.Add(-24 * time.Hour)
			return WriteICS(&bytes.Buffer{}, term, s, Subject{timetable.WhoStaff, "S1"}, Options{})
		}, []string{"First day and Last day", "Term sheet"}},
		{"no schedule", func() error {
			term, _ := demoTerm()
			return WriteTimetableCSV(&bytes.Buffer{}, term, nil)
		}, []string{"nothing to publish"}},
		{"bad placement", func() error {
			term, _ := demoTerm()
			return WriteTimetableCSV(&bytes.Buffer{}, term, &timetable.Schedule{Placements: []timetable.Placement{{Section: "NOPE", Meeting: 1}}})
		}, []string{`"NOPE"`, "Section column"}},
	}
	for _, c := range cases {
		t.Run(c.name, func(t *testing.T) {
			err := c.run()
			require.Error(t, err)
			msg := err.Error()
			assert.NotContains(t, msg, "export:", "no package name in what the user reads")
			first := []rune(msg)[0]
			assert.True(t, unicode.IsLower(first) || unicode.IsUpper(first), "starts with a word: %q", msg)
			for _, w := range c.want {
				assert.Contains(t, msg, w)
			}
			assert.False(t, strings.HasSuffix(strings.TrimSpace(msg), ":"), "no dangling colon: %q", msg)
		})
	}
}
