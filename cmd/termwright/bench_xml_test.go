package main

import (
	"context"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
)

// tinyXML is a hand-made ITC-2019 instance (2 weeks, weights time 2, room 1,
// distribution 3, student 5): class 1 in room 1 or 2 (penalty 4) at Monday
// 08:00 or (penalty 1) Tuesday 08:00; class 2 without room, Monday 08:30;
// a soft NotOverlap (penalty 2) between them.
const tinyXML = "\ufeff<?xml version=\"1.0\" encoding=\"UTF-8\"?>\n" +
	`<problem name="mini" nrDays="5" slotsPerDay="288" nrWeeks="2">
<optimization time="2" room="1" distribution="3" student="5"/>
<rooms><room id="1" capacity="30"/><room id="2" capacity="40"/></rooms>
<courses><course id="1"><config id="1"><subpart id="1">
<class id="1" limit="25"><room id="2" penalty="4"/><room id="1" penalty="0"/>
<time days="10000" start="96" length="12" weeks="11" penalty="0"/>
<time days="01000" start="96" length="12" weeks="11" penalty="1"/></class>
<class id="2" limit="25" room="false"><time days="10000" start="102" length="12" weeks="11" penalty="0"/></class>
</subpart></config></course></courses>
<distributions><distribution type="NotOverlap" penalty="2"><class id="1"/><class id="2"/></distribution></distributions>
<students><student id="s"><course id="1"/></student></students>
</problem>
`

// benchXMLDir makes a folder holding tinyXML as mini.xml.
func benchXMLDir(t *testing.T) string {
	t.Helper()
	dir := t.TempDir()
	require.NoError(t, os.WriteFile(filepath.Join(dir, "mini.xml"), []byte(tinyXML), 0o644))
	return dir
}

// firstChoices answers every pattern section with its first time and
// first listed room: class 1 Monday 08:00 in room 2 (room penalty 4),
// class 2 Monday 08:30: they overlap (distribution 2); it seats student s
// in class 1 (the course's only part: no clash). Cost by the
// competition's weights: 2*0 + 1*4 + 3*2 = 10.
func firstChoices(ctx context.Context, term *timetable.Term, seed int64, threads int) (*encode.OptimizeResult, error) {
	s := &timetable.Schedule{Enrolments: []timetable.Enrolment{{Student: "s", Section: "1"}}}
	for _, sec := range term.Sections {
		p := timetable.Placement{Section: sec.ID, Meeting: 1, Period: -1, Time: 1}
		if !sec.NoRoom {
			p.Room = sec.RoomChoices[0].Room
		}
		s.Placements = append(s.Placements, p)
	}
	return &encode.OptimizeResult{Result: encode.Result{Status: solver.Satisfiable, Schedule: s}}, nil
}

func TestBenchXMLTable(t *testing.T) {
	dir := benchXMLDir(t)
	best := filepath.Join(t.TempDir(), "best.csv")
	// best known 10 (1 student conflict x 5 among it): ratio (10+1)/(10+1);
	// reference without students: 2*1 + 1*0 + 3*1 = 5, ratio (10+1)/(5+1).
	require.NoError(t, os.WriteFile(best, []byte("instance,best,time,room,distribution,student_conflicts\nmini,10,1,0,1,1\n"), 0o644))
	code, out, stderr := runBenchWith(t, firstChoices, dir, "--time-limit", "5s", "--best", best)
	require.Equal(t, exitOK, code, stderr)
	want := "" +
		"instance  sections/rooms/relations/students  valid  cost  time  room  relations  students  first valid  best at  best known  ratio  ratio w/o students\n" +
		"mini      2/2/1/1                            yes    10    0     4     2          0         1.50s        1.50s    10          1.00   1.83\n" +
		"geometric mean of (cost+1)/(best known+1): 1.00 over 1 of 1 instances\n" +
		"geometric mean without students, (cost-students+1)/(reference+1): 1.83 over 1 of 1 instances\n"
	assert.Equal(t, want, out)
	assert.Contains(t, stderr, "bench: mini: cost 10 (student part 0, 1 students seated) after 1.50s")
	assert.NotContains(t, stderr, "differs", "timetable.Cost agrees with the competition's cost")
}

func TestBenchXMLWritesSolution(t *testing.T) {
	dir := benchXMLDir(t)
	out := filepath.Join(t.TempDir(), "sols")
	code, js, stderr := runBenchWith(t, firstChoices, dir, "--out", out, "--json")
	require.Equal(t, exitOK, code, stderr)
	data, err := os.ReadFile(filepath.Join(out, "mini.solution.xml"))
	require.NoError(t, err)
	text := string(data)
	assert.Contains(t, text, `<solution name="mini" runtime="1.5" cores="1"`)
	assert.Contains(t, text, `<class id="1" days="10000" start="96" weeks="11" room="2">`+"\n"+`    <student id="s"/>`+"\n  </class>", "the class lists its student")
	assert.Contains(t, text, `<class id="2" days="10000" start="102" weeks="11"/>`)
	var rep benchReport
	require.NoError(t, json.Unmarshal([]byte(js), &rep))
	require.Len(t, rep.Instances, 1)
	r := rep.Instances[0]
	assert.Equal(t, "patterns", r.Format)
	require.NotNil(t, r.Pattern)
	assert.Equal(t, 2, r.Pattern.Sections)
	assert.Equal(t, 1, r.Pattern.Students)
	require.NotNil(t, r.Pattern.Parts)
	assert.Equal(t, 4, r.Pattern.Parts.Room)
	assert.Zero(t, r.Pattern.Hard.Total())

	code, _, stderr = runBenchWith(t, firstChoices, dir, "--out", out)
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, "mini.solution.xml already exists")
}

func TestBenchXMLBadInput(t *testing.T) {
	dir := t.TempDir()
	require.NoError(t, os.WriteFile(filepath.Join(dir, "bad.xml"), []byte(strings.Replace(tinyXML, `nrWeeks="2"`, `nrWeeks="x"`, 1)), 0o644))
	code, out, stderr := runBenchWith(t, firstChoices, dir)
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, `bad.xml:2: the instance has number of weeks "x"`)
	assert.Contains(t, out, "bad       0/0/0/0                            error")

	best := filepath.Join(t.TempDir(), "best.csv")
	require.NoError(t, os.WriteFile(best, []byte("instance,best\nmini,3\n"), 0o644))
	code, _, stderr = runBenchWith(t, firstChoices, benchXMLDir(t), "--best", best)
	assert.Equal(t, exitError, code)
	assert.Contains(t, stderr, `best.csv:1: the header has no "time" column`)
}

// TestBenchXMLRealSolve runs the real pipeline on tinyXML. By hand: class 1
// on Monday overlaps class 2 (2 x distribution weight 3 = 6), so the best
// is class 1 on Tuesday (time penalty 1 x weight 2) in room 1 (penalty 0):
// cost 2.
func TestBenchXMLRealSolve(t *testing.T) {
	code, out, stderr := runBenchWith(t, nil, benchXMLDir(t), "--json", "--time-limit", "60s")
	require.Equal(t, exitOK, code, stderr)
	var rep benchReport
	require.NoError(t, json.Unmarshal([]byte(out), &rep))
	require.Len(t, rep.Instances, 1)
	r := rep.Instances[0]
	assert.True(t, r.Feasible, stderr)
	require.NotNil(t, r.Cost)
	assert.Equal(t, 2, *r.Cost)
	assert.NotContains(t, stderr, "differs")
	assert.NotContains(t, stderr, "please report")
}
