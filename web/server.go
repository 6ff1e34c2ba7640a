package web

import (
	"embed"
	"errors"
	"io/fs"
	"net"
	"net/http"
	"path/filepath"
	"slices"
	"strings"
	"sync"
	"time"

	"github.com/termwright/termwright/timetable"
)

//go:embed assets
var assetFS embed.FS

// Options say what a Server shows and where it may write.
type Options struct {
	Term     *timetable.Term     // the term, validated
	Schedule *timetable.Schedule // the timetable to start from
	// Source is the timetable file the schedule was read from; "" when it
	// was solved by the command.
	Source string
	// OutDir is the only folder saved versions are written to.
	OutDir string
	// BaseName is the stem of saved files: BaseName-2.xlsx, -3, ...
	BaseName string
	// Host is a non-loopback host the user named explicitly (--addr):
	// requests naming it are answered too.
	Host string
	// Now is the clock for saved files' generation time; nil means time.Now.
	Now func() time.Time
}

// Server is the web page and its JSON API over one term. It is safe for
// concurrent use: every request runs under one lock.
type Server struct {
	mu      sync.Mutex
	opt     Options
	version int                 // number of the current state; starts at 1
	cur     *timetable.Schedule // current state
	locks   map[meetingKey]bool // locked meetings of the current state (never written to)
	undo    []snapshot          // earlier states, most recent last
	saved   []savedVersion      // versions on file, in order of saving
	mux     *http.ServeMux
	// explaining holds a token while an explanation or a job runs
	// (capacity 1): each takes the engine for seconds, on a shared machine.
	explaining chan struct{}
	jobs       map[int]*job // jobs by ID, the running one and finished ones not yet collected
	lastJob    int          // ID of the last job started
}

// New makes a Server for opt. It fails when the term or the timetable is
// missing or the output folder is not a folder.
func New(opt Options) (*Server, error) {
	if opt.Term == nil || opt.Schedule == nil {
		return nil, errors.New("the web page needs a term and a timetable")
	}
	if opt.OutDir == "" {
		return nil, errors.New("the web page needs a folder to save timetable versions in")
	}
	if opt.BaseName == "" {
		opt.BaseName = "timetable"
	}
	if opt.Now == nil {
		opt.Now = time.Now
	}
	abs, err := filepath.Abs(opt.OutDir)
	if err != nil {
		return nil, err
	}
	opt.OutDir = abs
	s := &Server{opt: opt, version: 1, cur: cloneSchedule(opt.Schedule), explaining: make(chan struct{}, 1), jobs: map[int]*job{}}
	if opt.Source != "" {
		s.saved = append(s.saved, savedVersion{ID: 1, File: filepath.Base(opt.Source), Path: opt.Source, Edit: 1, sched: cloneSchedule(opt.Schedule)})
	}
	s.routes()
	return s, nil
}

func (s *Server) routes() {
	sub, _ := fs.Sub(assetFS, "assets")
	m := http.NewServeMux()
	m.Handle("GET /assets/", http.StripPrefix("/assets/", http.FileServerFS(sub)))
	m.HandleFunc("GET /{$}", func(w http.ResponseWriter, r *http.Request) {
		http.ServeFileFS(w, r, sub, "index.html")
	})
	m.HandleFunc("GET /api/term", s.handleTerm)
	m.HandleFunc("GET /api/state", s.handleState)
	m.HandleFunc("POST /api/move", s.handleMove)
	m.HandleFunc("POST /api/undo", s.handleUndo)
	m.HandleFunc("POST /api/save", s.handleSave)
	m.HandleFunc("GET /api/versions", s.handleVersions)
	m.HandleFunc("GET /api/compare", s.handleCompare)
	m.HandleFunc("GET /api/whynot", s.handleWhyNot)
	m.HandleFunc("GET /api/student", s.handleStudent)
	m.HandleFunc("POST /api/lock", s.handleLock)
	m.HandleFunc("POST /api/replan", s.handleReplan)
	m.HandleFunc("POST /api/replan/decide", s.handleReplanDecide)
	m.HandleFunc("POST /api/whereelse", s.handleWhereElse)
	m.HandleFunc("GET /api/job", s.handleJob)
	m.HandleFunc("POST /api/job/cancel", s.handleJobCancel)
	m.HandleFunc("GET /api/notices", s.handleNotices)
	m.HandleFunc("GET /api/notices/calendar", s.handleNoticeCalendar)
	s.mux = m
}

// ServeHTTP serves the page and the API. It answers only requests whose
// Host is a loopback name or address (a page elsewhere cannot reach it by
// a rebound DNS name, OWASP's advice against DNS rebinding) and, for
// POST, only JSON bodies (a form on another site cannot post one without
// the browser asking first: CORS preflight).
func (s *Server) ServeHTTP(w http.ResponseWriter, r *http.Request) {
	if !s.allowedHost(r.Host) {
		writeError(w, http.StatusForbidden, "this page answers only on the loopback address it was started on (127.0.0.1 or localhost); open it from the address termwright serve printed")
		return
	}
	if r.Method == http.MethodPost && !strings.HasPrefix(r.Header.Get("Content-Type"), "application/json") {
		writeError(w, http.StatusUnsupportedMediaType, "send the request body as JSON with Content-Type: application/json")
		return
	}
	w.Header().Set("X-Content-Type-Options", "nosniff")
	w.Header().Set("Content-Security-Policy", "default-src 'self'; frame-ancestors 'none'")
	w.Header().Set("Cache-Control", "no-store")
	s.mux.ServeHTTP(w, r)
}

// allowedHost says the Host header names a loopback host or the host
// the user named with --addr.
func (s *Server) allowedHost(hostport string) bool {
	host := hostport
	if h, _, err := net.SplitHostPort(hostport); err == nil {
		host = h
	}
	host = strings.Trim(strings.ToLower(host), "[]")
	if host == "localhost" {
		return true
	}
	if s.opt.Host != "" && host == strings.Trim(strings.ToLower(s.opt.Host), "[]") {
		return true
	}
	ip := net.ParseIP(host)
	return ip != nil && ip.IsLoopback()
}

func cloneSchedule(s *timetable.Schedule) *timetable.Schedule {
	out := &timetable.Schedule{Placements: make([]timetable.Placement, len(s.Placements)), Enrolments: slices.Clone(s.Enrolments)}
	copy(out.Placements, s.Placements)
	return out
}
