package main

import (
	"encoding/json"
	"net/http"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"sync"
	"syscall"
	"testing"
	"time"

	"github.com/stretchr/testify/assert"
	"github.com/stretchr/testify/require"
	"github.com/termwright/termwright/timetable"
)

// lockedBuffer is a bytes.Buffer safe for the server goroutine and the test.
type lockedBuffer struct {
	mu sync.Mutex
	b  strings.Builder
}

func (l *lockedBuffer) Write(p []byte) (int, error) {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.Write(p)
}

func (l *lockedBuffer) String() string {
	l.mu.Lock()
	defer l.mu.Unlock()
	return l.b.String()
}

var servedAt = regexp.MustCompile(`at (http://[^ ]+/) `)

// startServe runs `termwright serve args...` in the background and waits
// for the address it prints; stop sends SIGTERM and returns the exit code.
func startServe(t *testing.T, args ...string) (url string, stderr *lockedBuffer, stop func() int) {
	t.Helper()
	e, _, _ := checkEnv()
	errb := &lockedBuffer{}
	e.stderr = errb
	sig := make(chan os.Signal, 1)
	e.signals = func() (<-chan os.Signal, func()) { return sig, func() {} }
	code := make(chan int, 1)
	go func() { code <- run(append([]string{"serve"}, args...), e) }()
	deadline := time.Now().Add(60 * time.Second)
	for time.Now().Before(deadline) {
		if m := servedAt.FindStringSubmatch(errb.String()); m != nil {
			return m[1], errb, func() int { sig <- syscall.SIGTERM; return <-code }
		}
		select {
		case c := <-code:
			t.Fatalf("serve ended with %d before serving: %s", c, errb.String())
		case <-time.After(20 * time.Millisecond):
		}
	}
	t.Fatalf("serve printed no address: %s", errb.String())
	return "", nil, nil
}

func getState(t *testing.T, url string) (version, meetings, hard int) {
	t.Helper()
	resp, err := http.Get(url + "api/state")
	require.NoError(t, err)
	defer resp.Body.Close()
	require.Equal(t, http.StatusOK, resp.StatusCode)
	var st struct {
		Version  int   `json:"version"`
		Meetings []any `json:"meetings"`
		Hard     []any `json:"hard"`
	}
	require.NoError(t, json.NewDecoder(resp.Body).Decode(&st))
	return st.Version, len(st.Meetings), len(st.Hard)
}

// TestServeTimetable serves a term with its timetable, saves a version
// beside it and stops on SIGTERM.
func TestServeTimetable(t *testing.T) {
	dir := t.TempDir()
	termPath, _, newPath, term, _, cur := diffFiles(t, dir)
	url, errb, stop := startServe(t, termPath, newPath, "--addr", "127.0.0.1:0")
	assert.True(t, strings.HasPrefix(url, "http://127.0.0.1:"), url)
	v, n, hard := getState(t, url)
	assert.Equal(t, 1, v)
	assert.Equal(t, len(cur.Placements), n)
	assert.Equal(t, len(timetable.HardViolations(timetable.Check(term, cur))), hard)

	resp, err := http.Post(url+"api/save", "application/json", strings.NewReader(`{"version":1}`))
	require.NoError(t, err)
	resp.Body.Close()
	require.Equal(t, http.StatusOK, resp.StatusCode)
	saved := filepath.Join(dir, "new-2.xlsx")
	s, ps, err := timetable.ReadSchedule(saved, term)
	require.NoError(t, err)
	require.Empty(t, ps.Errors())
	assert.ElementsMatch(t, placesOf(cur), placesOf(s), "the saved version is the timetable served")

	assert.Equal(t, exitOK, stop())
	assert.Contains(t, errb.String(), "stopped serving (SIGTERM)")
	assert.NotContains(t, errb.String(), "warning")
}

func placesOf(s *timetable.Schedule) []timetable.Placement {
	out := make([]timetable.Placement, len(s.Placements))
	for i, p := range s.Placements {
		p.Src = timetable.Source{}
		out[i] = p
	}
	return out
}

// TestServeSolves serves a term without a timetable: it solves first.
func TestServeSolves(t *testing.T) {
	termPath := tinyTerm(t, nil)
	url, errb, stop := startServe(t, termPath, "--addr", "localhost:0", "--time-limit", "20s")
	_, n, hard := getState(t, url)
	assert.Positive(t, n)
	assert.Zero(t, hard)
	assert.Equal(t, exitOK, stop())
	assert.Contains(t, errb.String(), "serving "+termPath)
}

// TestServeAddress: loopback addresses pass; a missing host is refused;
// another address is served only when named, with a warning.
func TestServeAddress(t *testing.T) {
	for _, c := range []struct {
		addr, extra, err string
	}{
		{"127.0.0.1:8080", "", ""},
		{"localhost:0", "", ""},
		{"[::1]:8080", "", ""},
		{"127.0.0.2:80", "", ""},
		{":8080", "", "leaves the host out"},
		{"8080", "", "not HOST:PORT"},
		{"0.0.0.0:8080", "0.0.0.0", ""},
		{"192.0.2.7:8080", "192.0.2.7", ""},
	} {
		extra, err := serveHost(c.addr)
		if c.err != "" {
			assert.ErrorContains(t, err, c.err, c.addr)
			continue
		}
		assert.NoError(t, err, c.addr)
		assert.Equal(t, c.extra, extra, c.addr)
	}
	e, _, errb := checkEnv()
	assert.Equal(t, exitError, run([]string{"serve", "t.xlsx", "--addr", ":0"}, e))
	assert.Contains(t, errb.String(), "name the address in full")

	termPath := tinyTerm(t, nil)
	_, werr, stop := startServe(t, termPath, "--addr", "0.0.0.0:0", "--time-limit", "20s")
	assert.Equal(t, exitOK, stop())
	assert.Contains(t, werr.String(), "warning: serving on ")
}

func TestServeBadInput(t *testing.T) {
	dir := t.TempDir()
	termPath, _, _, _, _, _ := diffFiles(t, dir)
	bad := filepath.Join(dir, "bad.csv")
	require.NoError(t, os.WriteFile(bad, []byte("Section,Meeting,Day,Start,Room\nA,1,Funday,09:00,R1\n"), 0o644))
	for _, c := range []struct {
		name string
		args []string
		says string
	}{
		{"missing term", []string{"serve", filepath.Join(dir, "none.xlsx")}, "does not exist"},
		{"bad timetable", []string{"serve", termPath, bad, "--addr", "127.0.0.1:0"}, "leave TIMETABLE out"},
		{"no out folder", []string{"serve", termPath, filepath.Join(dir, "new.xlsx"), "--addr", "127.0.0.1:0", "--out-dir", filepath.Join(dir, "nope")}, "is not a folder"},
	} {
		t.Run(c.name, func(t *testing.T) {
			e, _, errb := checkEnv()
			assert.Equal(t, exitError, run(c.args, e))
			assert.Contains(t, errb.String(), c.says)
		})
	}
}

func TestServeBaseName(t *testing.T) {
	for _, c := range []struct{ term, tt, want string }{
		{"a/term.xlsx", "b/spring.xlsx", "spring"},
		{"a/term.xlsx", "b/spring-3.xlsx", "spring"},
		{"a/term.xlsx", "b/2027.xlsx", "2027"},
		{"a/term.xlsx", "", "term-timetable"},
	} {
		assert.Equal(t, c.want, serveBaseName(c.term, c.tt), c.tt)
	}
}

// TestServeHelp compares `serve --help` with its golden file (rewrite
// with -update).
func TestServeHelp(t *testing.T) {
	e, out, errb := checkEnv()
	require.Equal(t, exitOK, run([]string{"serve", "--help"}, e), errb.String())
	golden := filepath.Join("testdata", "serve-help.golden")
	if updateGolden() {
		require.NoError(t, os.WriteFile(golden, out.Bytes(), 0o644))
	}
	want, err := os.ReadFile(golden)
	require.NoError(t, err, "run go test ./cmd/termwright -run TestServeHelp -update")
	assert.Equal(t, string(want), out.String())
}

// TestServeOptions checks flag parsing alone (env.parsed).
func TestServeOptions(t *testing.T) {
	e, _, _ := checkEnv()
	var got *serveOptions
	var args []string
	e.parsed = func(o any, a []string) { got, args = o.(*serveOptions), a }
	require.Equal(t, exitOK, run([]string{"serve", "t.xlsx", "tt.xlsx", "--addr", "127.0.0.1:9000", "--out-dir", "o", "--time-limit", "5s", "--seed", "7", "--quiet"}, e))
	assert.Equal(t, &serveOptions{addr: "127.0.0.1:9000", outDir: "o", timeLimit: 5 * time.Second, seed: 7, quiet: true}, got)
	assert.Equal(t, []string{"t.xlsx", "tt.xlsx"}, args)
}
