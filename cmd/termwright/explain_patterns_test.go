package main

import (
	"path/filepath"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// campusTerm is the second demo, a term with meeting patterns only.
var campusTerm = filepath.Join("..", "..", "samples", "campus-term.xlsx")

// TestExplainPatternRefused: requests for meeting times on the second demo,
// as golden text. The reasons were worked out from its sheets: MTH110-A and
// MTH110-B must start together (Relations row 2) and MTH110-A's teacher is
// away on Friday afternoons in weeks 9-10 (Unavailable row 2), so neither
// meets Mon Wed Fri 14:00; room CED-1 is closed on Tuesday mornings in
// weeks 1-2 (Unavailable row 3); HIS202-S lists only ASH-102 and CED-2.
func TestExplainPatternRefused(t *testing.T) {
	for _, tc := range []struct {
		golden string
		args   []string
	}{
		{"pattern-same-start.golden.txt", []string{"--section", "MTH110-B", "--at", "Mon Wed Fri 14:00"}},
		{"pattern-room-closed.golden.txt", []string{"--section", "BIO201-L", "--at", "Tue Thu 11:00", "--room", "CED-1"}},
		{"pattern-room-not-listed.golden.txt", []string{"--section", "HIS202-S", "--at", "Wed 13:00", "--room", "ASH-201"}},
		{"pattern-same-start.golden.json", []string{"--section", "MTH110-B", "--at", "Mon Wed Fri 14:00", "--json"}},
	} {
		t.Run(tc.golden, func(t *testing.T) {
			code, stdout, stderr := runExplainCmd(append([]string{campusTerm}, tc.args...)...)
			require.Equal(t, exitNone, code, stderr)
			explainGolden(t, tc.golden, stdout)
		})
	}
}

// TestExplainPatternGranted: a granted meeting time on the second demo is
// written as a timetable that reads back, passes the domain check and has
// the section at the requested time and room.
func TestExplainPatternGranted(t *testing.T) {
	out := filepath.Join(t.TempDir(), "granted.xlsx")
	code, _, stderr := runExplainCmd(campusTerm, "--section", "MTH110-A", "--at", "Mon Wed Fri 09:00", "--room", "ASH-101", "-o", out)
	require.Equal(t, exitOK, code, stderr)
	tm, _, err := timetable.Load(campusTerm)
	require.NoError(t, err)
	s, ps, err := timetable.ReadSchedule(out, tm)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.Empty(t, timetable.HardViolations(timetable.Check(tm, s)))
	found := false
	for _, pl := range s.Placements {
		if pl.Section == "MTH110-A" {
			tc := tm.Sections[tm.SectionIndex()["MTH110-A"]].Times[pl.Time-1]
			found = tc.Start == 9*60 && tc.Days.String() == "Mon Wed Fri" && pl.Room == "ASH-101"
		}
	}
	assert.True(t, found, "the written timetable grants the request")
}

// TestExplainPatternBadRequest: a meeting time the section does not have,
// and several days for a grid section, are refused with one sentence.
func TestExplainPatternBadRequest(t *testing.T) {
	code, _, stderr := runExplainCmd(campusTerm, "--section", "ART150-X", "--at", "Tue 9:00")
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "no meeting time of section ART150-X meets on Tue at 09:00 — its meeting times are Mon Tue Wed Thu 13:00")
	code, _, stderr = runExplainCmd(filepath.Join(explainDir, "term"), "--section", "CHM110", "--at", "Tue Thu 10:00")
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "section CHM110 meets on the period grid, one meeting at a time")
}
