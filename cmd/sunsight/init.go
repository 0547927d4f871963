package main

import (
	"fmt"
	"io"

	"codeberg.org/sunsight/sunsight/scenario"
)

func init() {
	register(command{name: "init", summary: "write a commented starting scenario file", args: "[FILE] [flags]",
		about: "Writes a commented starting scenario from one of the bundled examples to FILE (or the file of -o; scenario.yaml without either); - prints it on standard output.",
		examples: []string{"sunsight init", "sunsight init my-sat.yaml --example nadir-6u-sso", "sunsight init --example nadir-6u-sso -o my-sat.yaml",
			"sunsight init -o - | sunsight check -"},
		run: runInit})
}

func runInit(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("init")
	example := fs.String("example", "tumbling-3u", "bundled example to start from (`NAME`): "+fmt.Sprint(scenario.ExampleNames()))
	out := fs.StringP("out", "o", "scenario.yaml", "file to write (`FILE`; - for standard output)")
	force := fs.Bool("force", false, "overwrite an existing file")
	fs.pathFlags(true, "out")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if err := wantArgs("init", pos, 0, 1); err != nil {
		return err
	}
	if len(pos) == 1 {
		if fs.Changed("out") && *out != pos[0] {
			return usagef("two files to write: %q and -o %q; give one", pos[0], *out)
		}
		*out = pos[0]
	}
	text, err := scenario.ExampleText(*example)
	if err != nil {
		return usagef("--example: %v", err)
	}
	// The first line names the scenario's JSON Schema for editors.
	text = append([]byte(scenario.SchemaComment), text...)
	if *out == stdinName {
		_, err := stdout.Write(text)
		return err
	}
	if err := writeOutput(*out, text, *force); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "wrote %s (from example %s); check it with: sunsight check %s\n", *out, *example, *out)
	return nil
}
