package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"

	"codeberg.org/sunsight/sunsight/internal/atomicfile"
	"codeberg.org/sunsight/sunsight/scenario"
)

func init() {
	register(command{name: "init", summary: "write a commented starting scenario file", run: runInit})
}

func runInit(args []string, stdout, stderr io.Writer) error {
	fs := flag.NewFlagSet("init", flag.ContinueOnError)
	fs.SetOutput(stderr)
	example := fs.String("example", "tumbling-3u", "bundled example to start from: "+fmt.Sprint(scenario.ExampleNames()))
	out := fs.String("o", "scenario.yaml", "file to write")
	force := fs.Bool("force", false, "overwrite an existing file")
	if err := fs.Parse(args); err != nil {
		if errors.Is(err, flag.ErrHelp) {
			return errHelpShown
		}
		return usagef("%v", err)
	}
	if fs.NArg() > 0 {
		return usagef("unexpected argument %q; usage: sunsight init [-example NAME] [-o FILE] [-force]", fs.Arg(0))
	}
	text, err := scenario.ExampleText(*example)
	if err != nil {
		return usagef("-example: %v", err)
	}
	if _, err := os.Stat(*out); err == nil && !*force {
		return usagef("-o: file %s exists; allowed a new path, or add -force to overwrite it", *out)
	}
	if err := atomicfile.Write(*out, text); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "wrote %s (from example %s); check it with: sunsight check %s\n", *out, *example, *out)
	return nil
}
