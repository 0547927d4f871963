// Command sunsight answers, for a small satellite's orbit, season and pointing
// mode, how often its sun sensors see the sun, when it is eclipsed, and how much
// the light reflected by the Earth corrupts the measured sun vector.
//
// Each subcommand lives in its own file and registers itself in init with
// register; main only dispatches. Exit codes: 0 success, 1 run failure,
// 2 usage or input error (the flag package's convention).
package main

import (
	"errors"
	"fmt"
	"io"
	"os"
	"sort"
)

// command is one subcommand: its name, a one-line summary and the function
// that runs it with the remaining arguments.
type command struct {
	name    string
	summary string
	run     func(args []string, stdout, stderr io.Writer) error
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

func main() {
	os.Exit(runMain(os.Args[1:], os.Stdout, os.Stderr))
}

// runMain dispatches to a subcommand and maps its error to an exit status.
func runMain(args []string, stdout, stderr io.Writer) int {
	if len(args) == 0 || args[0] == "help" || args[0] == "-h" || args[0] == "--help" || args[0] == "-help" {
		printUsage(stdout)
		if len(args) == 0 {
			return 2
		}
		return 0
	}
	c, ok := commands[args[0]]
	if !ok {
		fmt.Fprintf(stderr, "sunsight: unknown command %q; run 'sunsight help' for the list\n", args[0])
		return 2
	}
	err := c.run(args[1:], stdout, stderr)
	if err == nil {
		return 0
	}
	if errors.Is(err, errHelpShown) {
		return 0
	}
	fmt.Fprintf(stderr, "sunsight %s: %v\n", c.name, err)
	var u usageError
	if errors.As(err, &u) {
		return 2
	}
	return 1
}

// errHelpShown is returned by a subcommand after it printed its -help text.
var errHelpShown = errors.New("help shown")

func printUsage(w io.Writer) {
	fmt.Fprintln(w, "sunsight - sun-sensor layout, eclipse and albedo analysis for small satellites")
	fmt.Fprintln(w, "\nUsage: sunsight <command> [flags] [args]\n\nCommands:")
	names := make([]string, 0, len(commands))
	for n := range commands {
		names = append(names, n)
	}
	sort.Strings(names)
	for _, n := range names {
		fmt.Fprintf(w, "  %-9s %s\n", n, commands[n].summary)
	}
	fmt.Fprintln(w, "\nRun 'sunsight <command> -help' for the flags of one command.")
}
