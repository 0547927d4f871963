package main

import (
	"errors"
	"flag"
	"fmt"
	"io"

	"codeberg.org/sunsight/sunsight/scenario"
)

func init() {
	register(command{name: "check", summary: "validate a scenario file and print it with every default", run: runCheck})
}

func runCheck(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("check", flag.ContinueOnError)
	fs.SetOutput(stderr)
	quiet := fs.Bool("q", false, "print nothing on success")
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return errHelpShown
		}
		return usagef("%v", err)
	}
	if fs.NArg() != 1 {
		return usagef("want one scenario file; usage: sunsight check [-q] FILE")
	}
	s, err := scenario.Load(fs.Arg(0))
	if err != nil {
		return usageError{err}
	}
	if !*quiet {
		fmt.Fprintf(stdout, "# %s: valid; resolved scenario with every default shown\n", fs.Arg(0))
		stdout.Write(s.Record())
	}
	return nil
}
