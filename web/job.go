package web

import (
	"context"
	"fmt"
	"net/http"
	"strconv"
	"sync"
	"time"
)

// A job is a search that runs for seconds (re-planning, where else): it
// is started by one request, watched by polling GET /api/job (the page
// asks twice a second) and stopped by POST /api/job/cancel. One job or
// explanation runs at a time.
type job struct {
	ID      int
	Kind    string // "replan" or "whereelse"
	Base    int    // the edit version it started from
	Started time.Time
	cancel  context.CancelFunc

	mu       sync.Mutex
	state    string // jobRunning, jobDone, jobFailed
	stopped  bool   // cancelled by the user
	progress jobProgress
	result   any    // the answer, when done
	err      string // why it failed
	ended    time.Time
	// keep is what a finished re-plan would make the current state.
	keep *snapshot
}

// Job states.
const (
	jobRunning = "running"
	jobDone    = "done"
	jobFailed  = "failed"
)

// maxJobsKept bounds the finished jobs remembered for their answers.
const maxJobsKept = 4

// jobProgress is what the page shows while a job runs.
type jobProgress struct {
	Phase string  `json:"phase"`          // in plain words
	Cost  []int64 `json:"cost,omitempty"` // best cost per level so far
	Found int     `json:"found"`          // timetables found that improved on the best
	Steps int     `json:"steps"`          // neighbourhood steps
}

// jobJSON is a job as GET /api/job answers.
type jobJSON struct {
	ID       int         `json:"id"`
	Kind     string      `json:"kind"`
	Base     int         `json:"base"` // the edit version it started from
	State    string      `json:"state"`
	Stopped  bool        `json:"stopped,omitempty"`
	Elapsed  int64       `json:"elapsed_ms"`
	Progress jobProgress `json:"progress"`
	Result   any         `json:"result,omitempty"`
	Error    string      `json:"error,omitempty"`
}

func (j *job) json() jobJSON {
	j.mu.Lock()
	defer j.mu.Unlock()
	end := j.ended
	if end.IsZero() {
		end = time.Now()
	}
	return jobJSON{ID: j.ID, Kind: j.Kind, Base: j.Base, State: j.state, Stopped: j.stopped,
		Elapsed: end.Sub(j.Started).Milliseconds(), Progress: j.progress, Result: j.result, Error: j.err}
}

func (j *job) setProgress(p jobProgress) {
	j.mu.Lock()
	j.progress = p
	j.mu.Unlock()
}

// finish records the answer (or the failure) of a job.
func (j *job) finish(result any, keep *snapshot, err error) {
	j.mu.Lock()
	defer j.mu.Unlock()
	j.ended = time.Now()
	if err != nil {
		j.state, j.err = jobFailed, err.Error()
		return
	}
	j.state, j.result, j.keep = jobDone, result, keep
}

// startJobLocked takes the engine token and registers a job running run
// in the background for at most limit; it fails, with a sentence for the
// page, when another search is running. The caller holds s.mu.
func (s *Server) startJobLocked(kind string, limit time.Duration, run func(ctx context.Context, j *job)) (*job, error) {
	select {
	case s.explaining <- struct{}{}:
	default:
		return nil, fmt.Errorf("another search is running (a re-plan, where else or why not); wait for it or stop it, then ask again")
	}
	ctx, cancel := context.WithTimeout(context.Background(), limit)
	s.lastJob++
	j := &job{ID: s.lastJob, Kind: kind, Base: s.version, Started: time.Now(), cancel: cancel, state: jobRunning,
		progress: jobProgress{Phase: "starting"}}
	for id := range s.jobs {
		if id <= s.lastJob-maxJobsKept {
			delete(s.jobs, id) // long finished: only the last few are kept
		}
	}
	s.jobs[j.ID] = j
	go func() {
		defer func() { <-s.explaining }()
		defer cancel()
		run(ctx, j)
	}()
	return j, nil
}

// jobLocked finds a job by the ID the page sent.
func (s *Server) jobLocked(id int) (*job, error) {
	j, ok := s.jobs[id]
	if !ok {
		return nil, fmt.Errorf("there is no search %d (it finished long ago or the server restarted); start it again", id)
	}
	return j, nil
}

func (s *Server) handleJob(w http.ResponseWriter, r *http.Request) {
	id, err := strconv.Atoi(r.URL.Query().Get("id"))
	if err != nil {
		writeError(w, http.StatusBadRequest, fmt.Sprintf("id %q is not a number; give the id of a search the page started", r.URL.Query().Get("id")))
		return
	}
	s.mu.Lock()
	j, err := s.jobLocked(id)
	s.mu.Unlock()
	if err != nil {
		writeError(w, http.StatusNotFound, err.Error())
		return
	}
	writeJSON(w, http.StatusOK, j.json())
}

// jobRequest names a job.
type jobRequest struct {
	ID int `json:"id"`
}

// handleJobCancel stops a running job; a re-plan then answers with the
// best timetable found so far, if any.
func (s *Server) handleJobCancel(w http.ResponseWriter, r *http.Request) {
	var req jobRequest
	if err := readBody(w, r, &req); err != nil {
		writeError(w, http.StatusBadRequest, err.Error())
		return
	}
	s.mu.Lock()
	j, err := s.jobLocked(req.ID)
	s.mu.Unlock()
	if err != nil {
		writeError(w, http.StatusNotFound, err.Error())
		return
	}
	j.mu.Lock()
	if j.state == jobRunning {
		j.stopped = true
	}
	j.mu.Unlock()
	j.cancel()
	writeJSON(w, http.StatusOK, j.json())
}

// Close stops every running job; the server answers requests still.
func (s *Server) Close() {
	s.mu.Lock()
	defer s.mu.Unlock()
	for _, j := range s.jobs {
		j.cancel()
	}
}
