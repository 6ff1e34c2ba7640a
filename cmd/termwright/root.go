package main

import (
	"context"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"sort"
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
}

func newEnv() *env {
	fi, err := os.Stderr.Stat()
	tty := err == nil && fi.Mode()&os.ModeCharDevice != 0
	return &env{stdin: os.Stdin, stdout: os.Stdout, stderr: os.Stderr, now: time.Now, stderrIsTerminal: tty}
}

// exitCodeError carries a non-default exit code out of a command without
// printing anything more (the command has already explained itself).
type exitCodeError struct {
	code int
	msg  string
}

func (e *exitCodeError) Error() string { return e.msg }

// withCode makes an error that exits with code; msg may be "" when the
// command has already printed its explanation.
func withCode(code int, msg string) error { return &exitCodeError{code: code, msg: msg} }

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
	}
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
	return root
}

// run executes one command line and returns the process exit code; errors
// are printed here and nowhere else.
func run(args []string, e *env) int {
	ctx, stop := signal.NotifyContext(context.Background(), os.Interrupt)
	defer stop()
	root := newRoot(e)
	root.SetArgs(args)
	err := root.ExecuteContext(ctx)
	if err == nil {
		return exitOK
	}
	var ce *exitCodeError
	if errors.As(err, &ce) {
		if ce.msg != "" {
			fmt.Fprintln(e.stderr, "termwright:", ce.msg)
		}
		return ce.code
	}
	fmt.Fprintln(e.stderr, "termwright:", err)
	return exitError
}
