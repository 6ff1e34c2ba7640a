package web

import (
	"bytes"
	"encoding/json"
	"io"
	"net/http"
	"net/http/httptest"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"

	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/export"
	"github.com/termwright/termwright/samples"
	"github.com/termwright/termwright/timetable"
)

// demoFixture is the demo term read from samples/demo-term.xlsx with its
// reference timetable (samples.GenerateWithWitness) written as a
// timetable workbook in a temporary folder, and a server over both.
type demoFixture struct {
	term   *timetable.Term
	sched  *timetable.Schedule
	dir    string // the output folder
	source string // the timetable workbook the server started from
	srv    *Server
	ts     *httptest.Server
}

func newDemo(t *testing.T) *demoFixture {
	t.Helper()
	term, ps, err := timetable.Load(filepath.Join("..", "samples", samples.DemoWorkbook))
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	_, witness := samples.GenerateWithWitness(samples.DemoConfig)
	require.Empty(t, timetable.HardViolations(timetable.Check(term, witness)), "the reference timetable fits the demo workbook")
	dir := t.TempDir()
	source := filepath.Join(dir, "autumn.xlsx")
	var buf bytes.Buffer
	require.NoError(t, export.WriteTimetableWorkbook(&buf, term, witness, export.Options{Generated: time.Date(2027, 8, 1, 9, 0, 0, 0, time.UTC)}))
	require.NoError(t, os.WriteFile(source, buf.Bytes(), 0o644))
	sched, ps, err := timetable.ReadSchedule(source, term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	srv, err := New(Options{Term: term, Schedule: sched, Source: source, OutDir: dir, BaseName: "autumn",
		Now: func() time.Time { return time.Date(2027, 9, 1, 10, 0, 0, 0, time.UTC) }})
	require.NoError(t, err)
	ts := httptest.NewServer(srv)
	t.Cleanup(ts.Close)
	return &demoFixture{term: term, sched: sched, dir: dir, source: source, srv: srv, ts: ts}
}

// call sends one request and decodes the JSON answer into out (when not
// nil); it returns the status code.
func (d *demoFixture) call(t *testing.T, method, path string, body any, out any) int {
	t.Helper()
	var rd io.Reader
	if s, ok := body.(string); ok {
		rd = strings.NewReader(s)
	} else if body != nil {
		b, err := json.Marshal(body)
		require.NoError(t, err)
		rd = bytes.NewReader(b)
	}
	req, err := http.NewRequest(method, d.ts.URL+path, rd)
	require.NoError(t, err)
	if body != nil {
		req.Header.Set("Content-Type", "application/json")
	}
	resp, err := http.DefaultClient.Do(req)
	require.NoError(t, err)
	defer resp.Body.Close()
	data, err := io.ReadAll(resp.Body)
	require.NoError(t, err)
	if out != nil {
		require.NoError(t, json.Unmarshal(data, out), "answer: %s", data)
	}
	return resp.StatusCode
}

func (d *demoFixture) state(t *testing.T) stateJSON {
	var st stateJSON
	require.Equal(t, http.StatusOK, d.call(t, "GET", "/api/state", nil, &st))
	return st
}

// legalAndIllegal finds, for the first meeting of a section taught by a
// member of staff who has another meeting, a start period where the
// meeting alone breaks nothing (judged by timetable.Check) and the start
// period of that other meeting (a staff clash).
func (d *demoFixture) legalAndIllegal(t *testing.T) (m timetable.Placement, legal, clash int, staff string) {
	t.Helper()
	secs := d.term.SectionIndex()
	for i, p := range d.sched.Placements {
		sec := d.term.Sections[secs[p.Section]]
		if len(sec.Staff) == 0 || sec.Length != 1 {
			continue
		}
		other := -1
		for j, q := range d.sched.Placements {
			qs := d.term.Sections[secs[q.Section]]
			if j != i && q.Section != p.Section && qs.Length == 1 && contains(qs.Staff, sec.Staff[0]) && qs.Weeks&sec.Weeks != 0 {
				other = j
				break
			}
		}
		if other < 0 {
			continue
		}
		for per := range d.term.Periods {
			if per == p.Period {
				continue
			}
			next := cloneSchedule(d.sched)
			next.Placements[i].Period = per
			if len(timetable.HardViolations(timetable.Check(d.term, next))) == 0 {
				return p, per, d.sched.Placements[other].Period, sec.Staff[0]
			}
		}
	}
	t.Fatal("the demo timetable has no meeting with a legal move and a clash")
	return
}

func contains(xs []string, x string) bool {
	for _, y := range xs {
		if y == x {
			return true
		}
	}
	return false
}

// jobResult decodes the answer of a finished job (a re-plan's replanJSON,
// a where-else search's whereElseJSON) into T; the job must be done.
func jobResult[T any](t *testing.T, j jobJSON) T {
	t.Helper()
	require.Equal(t, jobDone, j.State, "job error: %s", j.Error)
	b, err := json.Marshal(j.Result)
	require.NoError(t, err)
	var r T
	require.NoError(t, json.Unmarshal(b, &r))
	return r
}

// staffName is the name of staff member id in the demo term ("" when
// there is none).
func (d *demoFixture) staffName(id string) string {
	var name string
	for _, s := range d.term.Staff {
		if s.ID == id {
			name = s.Name
		}
	}
	return name
}
