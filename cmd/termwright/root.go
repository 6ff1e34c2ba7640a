package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"runtime/debug"
	"sort"
	"syscall"
	"time"

	"github.com/spf13/cobra"
)

// Exit codes shared by every command.
const (
	exitOK    = 0 // done; a model or timetable was found
	exitError = 1 // bad input or a failure
	exitNone  = 2 // the question has no answer: no timetable / no model exists
)

// env is what commands may touch outside their arguments: injected so that
// commands are testable.
type env struct {
	stdin  io.Reader
	stdout io.Writer
	stderr io.Writer
	now    func() time.Time
	// stderrIsTerminal reports whether progress displays may draw.
	stderrIsTerminal bool
	// logEvery is the interval of progress lines when stderr is not a
	// terminal; 0 means solveLogEvery.
	logEvery time.Duration
	// signals, when set, starts delivering the signals that stop a search
	// gracefully (Ctrl-C, SIGTERM, SIGHUP) and returns a function that stops
	// that again.
	signals func() (<-chan os.Signal, func())
	// parsed, when set (by tests), receives each command's filled options
	// and arguments instead of the command running: a check of flag parsing
	// alone.
	parsed func(opts any, args []string)
	// columns is the --columns FILE of column renames applied to every
	// term read ("" for none).
	columns string
}

// runner is the RunE of a command with options o: it runs run, or with
// e.parsed set hands o and the arguments to it and runs nothing.
func (e *env) runner(o any, run func(cmd *cobra.Command, args []string) error) func(*cobra.Command, []string) error {
	return func(cmd *cobra.Command, args []string) error {
		if e.parsed != nil {
			e.parsed(o, args)
			return nil
		}
		return run(cmd, args)
	}
}

func newEnv() *env {
	fi, err := os.Stderr.Stat()
	tty := err == nil && fi.Mode()&os.ModeCharDevice != 0
	return &env{stdin: os.Stdin, stdout: os.Stdout, stderr: os.Stderr, now: time.Now, stderrIsTerminal: tty, signals: notifyStop}
}

// stopSignals are the signals after which a search ends early but keeps
// what it found: Ctrl-C, and the polite requests to stop that service
// managers, batch schedulers (SIGTERM) and closed terminals (SIGHUP) send.
var stopSignals = []os.Signal{os.Interrupt, syscall.SIGTERM, syscall.SIGHUP}

func notifyStop() (<-chan os.Signal, func()) {
	ch := make(chan os.Signal, 1)
	signal.Notify(ch, stopSignals...)
	return ch, func() { signal.Stop(ch) }
}

// interrupted is the cause of run's context when a stop signal arrived.
type interrupted struct{ sig os.Signal }

func (i interrupted) Error() string { return "interrupted (" + signalName(i.sig) + ")" }

// signalName is the name people know a stop signal by.
func signalName(sig os.Signal) string {
	switch sig {
	case os.Interrupt:
		return "Ctrl-C"
	case syscall.SIGTERM:
		return "SIGTERM"
	case syscall.SIGHUP:
		return "SIGHUP"
	}
	return sig.String()
}

// interruptedBy names the signal that cancelled ctx ("Ctrl-C", "SIGTERM",
// "SIGHUP"), or "" when none did.
func interruptedBy(ctx context.Context) string {
	var i interrupted
	if ctx != nil && errors.As(context.Cause(ctx), &i) {
		return signalName(i.sig)
	}
	return ""
}

// exitCodeError carries an exit code out of a command, with the error that
// caused it kept whole (errors.Is and errors.As see through it) until run
// prints it. An empty message prints nothing more: the command has already
// explained itself.
type exitCodeError struct {
	code int
	err  error // nil when there is nothing more to print
}

func (e *exitCodeError) Error() string {
	if e.err == nil {
		return ""
	}
	return e.err.Error()
}

func (e *exitCodeError) Unwrap() error { return e.err }

// withCode makes an error that exits with code; msg may be "" when the
// command has already printed its explanation.
func withCode(code int, msg string) error {
	if msg == "" {
		return &exitCodeError{code: code}
	}
	return &exitCodeError{code: code, err: errors.New(msg)}
}

// wrapCode makes an error that exits with code and prints err, keeping
// err's chain.
func wrapCode(code int, err error) error { return &exitCodeError{code: code, err: err} }

// wrapMsg makes an error that exits with code and prints msg in place of
// err's own text (already printed in detail), keeping err's chain.
func wrapMsg(code int, msg string, err error) error {
	return &exitCodeError{code: code, err: &summaryError{msg: msg, err: err}}
}

// summaryError reads as msg and unwraps to err.
type summaryError struct {
	msg string
	err error
}

func (s *summaryError) Error() string { return s.msg }
func (s *summaryError) Unwrap() error { return s.err }

// failf is wrapCode of fmt.Errorf: a %w verb keeps the cause's chain.
func failf(code int, format string, args ...any) error {
	return &exitCodeError{code: code, err: fmt.Errorf(format, args...)}
}

// commandMakers is filled by each command's file in init, keyed by the
// command's name, so that commands stay in files of their own.
var commandMakers = map[string]func(*env) *cobra.Command{}

func register(name string, make func(*env) *cobra.Command) { commandMakers[name] = make }

func newRoot(e *env) *cobra.Command {
	root := &cobra.Command{
		Use:           "termwright",
		Short:         "Build, check, explain and publish a term's timetable",
		SilenceErrors: true,
		SilenceUsage:  true,
		Version:       version(debug.ReadBuildInfo()),
	}
	root.SetVersionTemplate("termwright {{.Version}}\n")
	root.SetIn(e.stdin)
	root.SetOut(e.stdout)
	root.SetErr(e.stderr)
	names := make([]string, 0, len(commandMakers))
	for n := range commandMakers {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		root.AddCommand(commandMakers[n](e))
	}
	root.SetFlagErrorFunc(func(c *cobra.Command, err error) error { return &usageError{cmd: c, err: err} })
	wrapArgs(root)
	return root
}

// version describes this build from its build information: the module
// version ("v1.2.0" for go install of a release, "(devel)" for a build
// from a checkout) and, when the build recorded them, the version control
// revision, its time and whether the tree had uncommitted changes.
func version(bi *debug.BuildInfo, ok bool) string {
	if !ok || bi == nil {
		return "(unknown version: built without module information)"
	}
	v := bi.Main.Version
	if v == "" {
		v = "(devel)"
	}
	var rev, at, dirty string
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.time":
			at = s.Value
		case "vcs.modified":
			if s.Value == "true" {
				dirty = ", with uncommitted changes"
			}
		}
	}
	if rev != "" {
		if len(rev) > 12 {
			rev = rev[:12]
		}
		v += " (revision " + rev
		if at != "" {
			v += " of " + at
		}
		v += dirty + ")"
	}
	return v + ", " + bi.GoVersion
}

// usageError is a mistake in the command line itself (an unknown flag, a
// bad flag value, the wrong number of arguments): run prints it with the
// command's usage line.
type usageError struct {
	cmd *cobra.Command
	err error
}

func (u *usageError) Error() string { return u.err.Error() }
func (u *usageError) Unwrap() error { return u.err }

// wrapArgs makes the argument checks of c and its subcommands return
// usage errors.
func wrapArgs(c *cobra.Command) {
	if check := c.Args; check != nil {
		c.Args = func(cmd *cobra.Command, args []string) error {
			if err := check(cmd, args); err != nil {
				return &usageError{cmd: cmd, err: err}
			}
			return nil
		}
	}
	for _, sub := range c.Commands() {
		wrapArgs(sub)
	}
}

// run executes one command line and returns the process exit code; errors
// are printed here and nowhere else.
func run(args []string, e *env) int {
	ctx, cancel := context.WithCancelCause(context.Background())
	defer cancel(nil)
	if e.signals != nil {
		ch, stop := e.signals()
		defer stop()
		onSignal := func(sig os.Signal) {
			cancel(interrupted{sig})
			stop() // a second signal ends the process the default way
		}
		select { // a signal that came before the command starts counts too
		case sig := <-ch:
			onSignal(sig)
		default:
			go func() {
				select {
				case sig := <-ch:
					onSignal(sig)
				case <-ctx.Done():
				}
			}()
		}
	}
	root := newRoot(e)
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if err == nil {
		return exitOK
	}
	var ue *usageError
	if errors.As(err, &ue) {
		fmt.Fprintf(e.stderr, "termwright: %v\nUsage: %s\nRun '%s --help' for every flag.\n", ue.err, ue.cmd.UseLine(), ue.cmd.CommandPath())
		return exitError
	}
	var ce *exitCodeError
	if errors.As(err, &ce) {
		if ce.err != nil {
			fmt.Fprintln(e.stderr, "termwright:", ce.err)
		}
		return ce.code
	}
	fmt.Fprintln(e.stderr, "termwright:", err)
	return exitError
}
