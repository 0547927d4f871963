// Command sunsight answers, for a small satellite's orbit, season and pointing
// mode, how often its sun sensors see the sun, when it is eclipsed, and how much
// the light reflected by the Earth corrupts the measured sun vector.
//
// Each subcommand lives in its own file and registers itself in init with
// register; main only dispatches. Every command parses its flags the same way
// (cli.go) and ends with one of the exit statuses of exitHelp.
package main

import (
	"bytes"
	"errors"
	"fmt"
	"io"
	"os"
	"os/signal"
	"sort"
	"strings"
	"sync"
	"syscall"

	"codeberg.org/sunsight/sunsight/internal/suggest"
)

// Exit statuses: the contract scripts and CI rely on.
const (
	exitOK           = 0 // success, and every stated target met
	exitFailure      = 1 // the run failed (including any write error, stdout too)
	exitUsage        = 2 // bad input: flags, arguments, scenario file
	exitTargetFailed = 3 // the run completed but a stated target was not met
)

// exitHelp is the exit-status paragraph of every help text and the README.
const exitHelp = `Exit status:
  0  success, and every target stated in the scenario met
  1  the run failed (including any error writing an output, standard output too)
  2  bad input (flag, argument or scenario file; the message names the fix)
  3  the run completed but a target was not met (run: a target; sweep, merge:
     any case; layout: no subset meets the targets; budget: the p95 misses
     the tolerance target)`

// command is one subcommand: its name, a one-line summary, the shape of its
// arguments and the function that runs it with the remaining arguments.
type command struct {
	name     string
	summary  string
	args     string   // after "sunsight NAME", e.g. "[flags] FILE"
	about    string   // what it does and what each positional argument is
	examples []string // whole command lines
	run      func(args []string, stdout, stderr io.Writer) error
}

var commands = map[string]command{}

// register adds a subcommand; it is called from init functions only.
func register(c command) {
	if _, dup := commands[c.name]; dup {
		panic("sunsight: command registered twice: " + c.name)
	}
	commands[c.name] = c
}

// usageError marks an error caused by the user's input (bad flag, bad value,
// bad scenario): it exits with status 2 instead of 1.
type usageError struct{ err error }

func (u usageError) Error() string { return u.err.Error() }
func (u usageError) Unwrap() error { return u.err }

// usagef builds a usageError.
func usagef(format string, a ...any) error { return usageError{fmt.Errorf(format, a...)} }

// targetsFailed is returned by a command that ran to the end and printed its
// results, but whose stated targets were not met (exit status 3). shown
// says the verdict naming what failed is already the last line on stdout,
// so standard error only explains the exit status.
type targetsFailed struct {
	what  string
	shown bool
}

func (t targetsFailed) Error() string { return t.what }

// errHelpShown is returned by a subcommand after it printed its help text.
var errHelpShown = errors.New("help shown")

func main() {
	os.Exit(runMain(os.Args[1:], os.Stdout, os.Stderr))
}

// runMain dispatches to a subcommand and maps its error to an exit status.
// A write error on stdout (a full disk, a closed pipe) is a run failure and
// the one verdict: the command's own message (its error, "a target failed")
// is not printed beside it.
func runMain(args []string, stdout, stderr io.Writer) int {
	pipeErrors.Do(func() {
		// With SIGPIPE asked for, a write to a closed pipe returns EPIPE
		// instead of killing the process; the signal itself is dropped.
		signal.Notify(make(chan os.Signal, 1), syscall.SIGPIPE)
	})
	out := &checkedWriter{w: stdout}
	var msg bytes.Buffer
	code := dispatch(args, out, stderr, &msg)
	if out.err != nil && code != exitUsage {
		fmt.Fprintf(stderr, "sunsight: writing to standard output: %v\n", out.err)
		return exitFailure
	}
	stderr.Write(msg.Bytes())
	return code
}

// pipeErrors turns SIGPIPE into write errors, once per process.
var pipeErrors sync.Once

// dispatch runs the command of args with stdout and stderr; its closing
// message (the error, the exit status explained) goes to closing.
func dispatch(args []string, stdout, stderr, closing io.Writer) int {
	if len(args) == 0 {
		printUsage(closing)
		return exitUsage
	}
	switch args[0] {
	case "help", "-h", "--help", "-help":
		if len(args) > 1 && args[0] == "help" {
			c, ok := commands[args[1]]
			if !ok {
				fmt.Fprintf(closing, "sunsight: unknown command %q%s; run 'sunsight help' for the list\n", args[1], commandHint(args[1]))
				return exitUsage
			}
			args = []string{c.name, "--help"}
			break
		}
		printUsage(stdout)
		return exitOK
	case "--version", "-version":
		args = []string{"version"}
	}
	c, ok := commands[args[0]]
	if !ok {
		fmt.Fprintf(closing, "sunsight: unknown command %q%s; run 'sunsight help' for the list\n", args[0], commandHint(args[0]))
		return exitUsage
	}
	err := c.run(args[1:], stdout, stderr)
	var u usageError
	var tf targetsFailed
	switch {
	case err == nil, errors.Is(err, errHelpShown):
		return exitOK
	case errors.As(err, &tf) && tf.shown:
		fmt.Fprintf(closing, "sunsight %s: exit status %d: a target failed (the verdict line names it)\n", c.name, exitTargetFailed)
		return exitTargetFailed
	case errors.As(err, &tf):
		fmt.Fprintf(closing, "sunsight %s: %v\n", c.name, err)
		return exitTargetFailed
	case errors.As(err, &u):
		fmt.Fprintf(closing, "sunsight %s: %v\n", c.name, err)
		return exitUsage
	}
	fmt.Fprintf(closing, "sunsight %s: %v\n", c.name, err)
	return exitFailure
}

// checkedWriter remembers the first write error; later writes are dropped.
type checkedWriter struct {
	w   io.Writer
	err error
}

func (c *checkedWriter) Write(p []byte) (int, error) {
	if c.err != nil {
		return 0, c.err
	}
	n, err := c.w.Write(p)
	if err == nil && n < len(p) {
		err = io.ErrShortWrite
	}
	c.err = err
	return n, err
}

func printUsage(w io.Writer) {
	fmt.Fprintln(w, "sunsight - sun-sensor layout, eclipse and albedo analysis for small satellites")
	fmt.Fprintln(w, "\nUsage: sunsight COMMAND [flags] [arguments]\n       sunsight --version\n\nCommands:")
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		fmt.Fprintf(w, "  %-9s %s\n", n, commands[n].summary)
	}
	fmt.Fprintln(w, "\nRun 'sunsight COMMAND --help' (or 'sunsight help COMMAND') for the flags and examples of one command.")
	fmt.Fprintln(w, "Flags are GNU style (--name value or --name=value) and may come before or after the arguments.")
	fmt.Fprintln(w, "\n"+exitHelp)
}

// printCommandHelp writes one command's help: usage line, description,
// flags, examples and the exit statuses.
func printCommandHelp(w io.Writer, c command, fs *flagSet) {
	fmt.Fprintf(w, "Usage: sunsight %s %s\n\n%s\n", c.name, c.args, strings.TrimSpace(c.about))
	// A switch is given as --name (or --name=false): the library's
	// "[=true|false]" becomes blanks of the same width, keeping the columns.
	if fl := strings.ReplaceAll(fs.FlagUsages(), "[=true|false]", "             "); fl != "" {
		fmt.Fprintf(w, "\nFlags:\n%s", fl)
	}
	if len(c.examples) > 0 {
		fmt.Fprintln(w, "\nExamples:")
		for _, e := range c.examples {
			fmt.Fprintf(w, "  %s\n", e)
		}
	}
	fmt.Fprintln(w, "\n"+exitHelp)
}

// commandHint is the command the user probably meant by name, or "".
func commandHint(name string) string {
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	return suggest.Hint(name, names)
}
