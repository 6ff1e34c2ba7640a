package main

import (
	"context"
	"errors"
	"fmt"
	"net"
	"net/http"
	"os"
	"path/filepath"
	"regexp"
	"strings"
	"time"

	"github.com/spf13/cobra"
	"github.com/termwright/termwright/encode"
	"github.com/termwright/termwright/planning"
	"github.com/termwright/termwright/solver"
	"github.com/termwright/termwright/timetable"
	"github.com/termwright/termwright/web"
)

func init() { register("serve", newServeCmd) }

// serveOptions are the flags of `termwright serve`.
type serveOptions struct {
	addr      string        // host:port to listen on
	outDir    string        // folder saved versions go to ("" = the timetable's or term's folder)
	timeLimit time.Duration // solve time limit without a timetable
	seed      int64         // solve seed
	quiet     bool          // no solve progress
}

// defaultServeAddr is the loopback address served when --addr is not given.
const defaultServeAddr = "127.0.0.1:8080"

func newServeCmd(e *env) *cobra.Command {
	o := &serveOptions{}
	cmd := &cobra.Command{
		Use:   "serve TERM [TIMETABLE]",
		Short: "Open a local web page to look at, check, move and save a term's timetable",
		Long: "serve starts a web page on this machine for the term and its timetable: week\n" +
			"grids per staff member, room, cohort and student, the master list, the broken\n" +
			"hard requirements and the cost per preference. Moves are checked at once (allowed\n" +
			"or not, with the reasons and the change in cost) and can be undone; meetings can\n" +
			"be locked and the rest re-planned with as few changes as possible; Save writes a\n" +
			"new timetable workbook beside the old one (NAME-2.xlsx, NAME-3.xlsx, ...; nothing\n" +
			"is overwritten), versions can be compared per person, room and cohort, and each\n" +
			"affected person gets a change notice and an updated calendar to download.\n\n" +
			"Without TIMETABLE it solves the term first (progress on standard error, at most\n" +
			"--time-limit). The page listens on the loopback address 127.0.0.1:8080 unless\n" +
			"--addr names another; an address other machines can reach must be named in full\n" +
			"(for example 192.0.2.7:8080) and is served with a warning, as the page has no\n" +
			"login. Everything the page needs is inside the program: it uses no network.\n" +
			"It serves until Ctrl-C, SIGTERM or SIGHUP.",
		Args: cobra.RangeArgs(1, 2),
		RunE: e.runner(o, func(cmd *cobra.Command, args []string) error {
			tt := ""
			if len(args) == 2 {
				tt = args[1]
			}
			return runServe(cmd.Context(), e, o, args[0], tt)
		}),
	}
	f := cmd.Flags()
	f.StringVar(&o.addr, "addr", defaultServeAddr, "`HOST:PORT` to serve on (loopback unless named explicitly)")
	f.StringVar(&o.outDir, "out-dir", "", "folder to save timetable versions in (default: the timetable's folder, or the term's)")
	f.DurationVar(&o.timeLimit, "time-limit", 30*time.Second, "without TIMETABLE: stop solving after this long")
	f.Int64Var(&o.seed, "seed", 1, "without TIMETABLE: seed of the search")
	f.BoolVar(&o.quiet, "quiet", false, "show no progress while solving")
	addColumnsFlag(cmd, e)
	return cmd
}

// serveHost checks the address to serve on: loopback names pass; an
// address reachable from elsewhere passes only when named in full, and
// is returned as the host the page must also answer to.
func serveHost(addr string) (extra string, err error) {
	host, _, err := net.SplitHostPort(addr)
	if err != nil {
		return "", fmt.Errorf("--addr %q is not HOST:PORT (%v); write it like 127.0.0.1:8080", addr, err)
	}
	if host == "localhost" {
		return "", nil
	}
	if ip := net.ParseIP(host); ip != nil && ip.IsLoopback() {
		return "", nil
	}
	if host == "" {
		return "", fmt.Errorf("--addr %q leaves the host out, which would serve every network the machine is on; name the address in full (127.0.0.1%s for this machine only)", addr, addr)
	}
	return host, nil
}

func runServe(ctx context.Context, e *env, o *serveOptions, termPath, ttPath string) error {
	if ctx == nil {
		ctx = context.Background()
	}
	extra, err := serveHost(o.addr)
	if err != nil {
		return wrapCode(exitError, err)
	}
	term, problems, err := readTerm(e, termPath)
	if err != nil {
		return wrapCode(exitError, err)
	}
	for _, p := range problems {
		fmt.Fprintln(e.stderr, p.String())
	}
	if n := len(problems.Errors()); n > 0 {
		return withCode(exitError, fmt.Sprintf("%s has %s — fix them first (termwright check %s lists them)", termPath, checkCount(n, "error"), termPath))
	}
	var sched *timetable.Schedule
	if ttPath != "" {
		sched, err = serveRead(e, term, ttPath)
	} else {
		sched, err = serveSolve(ctx, e, o, term, termPath)
	}
	if err != nil {
		return err
	}
	dir := o.outDir
	if dir == "" {
		dir = filepath.Dir(termPath)
		if ttPath != "" {
			dir = filepath.Dir(ttPath)
		}
	}
	if fi, err := os.Stat(dir); err != nil || !fi.IsDir() {
		return failf(exitError, "--out-dir %s is not a folder; create it or name another", dir)
	}
	srv, err := web.New(web.Options{Term: term, Schedule: sched, Source: ttPath, OutDir: dir, BaseName: serveBaseName(termPath, ttPath), Host: extra, Now: e.now})
	if err != nil {
		return wrapCode(exitError, err)
	}
	ln, err := net.Listen("tcp", o.addr)
	if err != nil {
		return failf(exitError, "cannot serve on %s (%v); pick another port with --addr", o.addr, err)
	}
	if extra != "" {
		fmt.Fprintf(e.stderr, "warning: serving on %s, which other machines may reach; the page has no login — anyone who can reach it can see and change the timetable\n", ln.Addr())
	}
	fmt.Fprintf(e.stderr, "termwright: serving %s at http://%s/ (saving versions in %s) — press Ctrl-C to stop\n", termPath, ln.Addr(), dir)
	hs := &http.Server{Handler: srv, ReadHeaderTimeout: 10 * time.Second}
	done := make(chan error, 1)
	go func() { done <- hs.Serve(ln) }()
	select {
	case err := <-done:
		return failf(exitError, "the web server stopped: %w", err)
	case <-ctx.Done():
	}
	sctx, cancel := context.WithTimeout(context.Background(), 5*time.Second)
	defer cancel()
	srv.Close() // stop a running re-plan or search: its answer has no page left to go to
	_ = hs.Shutdown(sctx)
	if err := <-done; err != nil && !errors.Is(err, http.ErrServerClosed) {
		return failf(exitError, "the web server stopped: %w", err)
	}
	fmt.Fprintf(e.stderr, "termwright: stopped serving (%s)\n", orText(interruptedBy(ctx), "stopped"))
	return nil
}

func orText(s, alt string) string {
	if s == "" {
		return alt
	}
	return s
}

// serveRead reads the timetable for the term, printing its problems.
func serveRead(e *env, term *timetable.Term, path string) (*timetable.Schedule, error) {
	s, ps, err := timetable.ReadSchedule(path, term)
	if err != nil {
		return nil, wrapCode(exitError, err)
	}
	for _, p := range ps {
		fmt.Fprintln(e.stderr, p.String())
	}
	if n := len(ps.Errors()); n > 0 {
		return nil, withCode(exitError, fmt.Sprintf("%s has %s; fix them, or leave TIMETABLE out to solve the term afresh", path, checkCount(n, "error")))
	}
	return s, nil
}

// serveSolve finds a timetable as solve does, within --time-limit.
func serveSolve(ctx context.Context, e *env, o *serveOptions, term *timetable.Term, termPath string) (*timetable.Schedule, error) {
	sctx := ctx
	if o.timeLimit > 0 {
		var cancel context.CancelFunc
		sctx, cancel = context.WithTimeout(ctx, o.timeLimit)
		defer cancel()
	}
	progress := newSolveProgress(e, o.quiet, term)
	res, err := planning.Plan(sctx, term, planning.Options{OptimizeOptions: encode.OptimizeOptions{Seed: o.seed, Progress: progress.show}})
	progress.done()
	if err != nil {
		return nil, wrapCode(exitError, err)
	}
	if sig := interruptedBy(ctx); sig != "" {
		return nil, withCode(exitError, fmt.Sprintf("interrupted (%s) while solving; nothing is served", sig))
	}
	switch res.Status {
	case solver.Unsatisfiable:
		return nil, withCode(exitNone, fmt.Sprintf("no timetable exists for %s: its hard requirements contradict each other — run `termwright explain %s` to see why", termPath, termPath))
	case solver.Satisfiable:
		return res.Schedule, nil
	}
	return nil, withCode(exitError, fmt.Sprintf("no timetable found within %v — allow more time with --time-limit, or give a TIMETABLE", o.timeLimit))
}

var versionSuffix = regexp.MustCompile(`-[0-9]+$`)

// serveBaseName is the stem of saved versions: the timetable's name
// without a version suffix ("spring-3.xlsx" → "spring"), or, for a solved
// timetable, the term's name with "-timetable".
func serveBaseName(termPath, ttPath string) string {
	if ttPath != "" {
		stem := strings.TrimSuffix(filepath.Base(ttPath), filepath.Ext(ttPath))
		if b := versionSuffix.ReplaceAllString(stem, ""); b != "" {
			return b
		}
		return stem
	}
	return strings.TrimSuffix(filepath.Base(termPath), filepath.Ext(termPath)) + "-timetable"
}
