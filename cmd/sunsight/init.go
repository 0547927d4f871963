package main

import (
	"errors"
	"flag"
	"fmt"
	"io"
	"os"
	"path/filepath"

	"sunsight/scenario"
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
	if err := writeAtomic(*out, text); err != nil {
		return err
	}
	fmt.Fprintf(stdout, "wrote %s (from example %s); check it with: sunsight check %s\n", *out, *example, *out)
	return nil
}

// writeAtomic writes data to a temporary file in the target's folder and
// renames it into place, so a failed write leaves no partial file.
func writeAtomic(path string, data []byte) error {
	tmp, err := os.CreateTemp(filepath.Dir(path), ".sunsight-*.tmp")
	if err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	defer os.Remove(tmp.Name())
	if _, err := tmp.Write(data); err != nil {
		tmp.Close()
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err := tmp.Close(); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err := os.Chmod(tmp.Name(), 0o644); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	if err := os.Rename(tmp.Name(), path); err != nil {
		return fmt.Errorf("writing %s: %w", path, err)
	}
	return nil
}
