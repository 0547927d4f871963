package main

import (
	"fmt"
	"io"
)

func init() {
	register(command{name: "check", summary: "validate a scenario file and print it with every default", args: "[flags] FILE",
		about: `Checks the scenario FILE (YAML; - reads it from standard input) as run would, building
every model, and prints the resolved scenario with every default filled in. All problems
are reported together, each line naming the file, the key and what is allowed.`,
		examples: []string{"sunsight check examples/nadir-6u-sso.yaml", "sunsight check --quiet scenario.yaml && echo valid"},
		run:      runCheck})
}

func runCheck(args []string, stdout, stderr io.Writer) error {
	fs := newFlagSet("check")
	quiet := fs.BoolP("quiet", "q", false, "print nothing on success")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if len(pos) != 1 {
		return usagef("want one scenario file; usage: sunsight check [--quiet] FILE")
	}
	s, err := loadScenario(pos[0])
	if err != nil {
		return err
	}
	if !*quiet {
		fmt.Fprintf(stdout, "# %s: valid; resolved scenario with every default shown\n", describeFile(pos[0]))
		stdout.Write(s.Record())
	}
	return nil
}
