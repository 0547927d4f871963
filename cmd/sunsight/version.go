package main

import (
	"fmt"
	"io"
	"runtime/debug"
)

func init() {
	register(command{name: "version", summary: "print the tool version and build details", run: runVersion})
}

// toolVersion returns the module version and VCS revision recorded at build time.
func toolVersion() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "unknown"
	}
	v := bi.Main.Version
	for _, s := range bi.Settings {
		if s.Key == "vcs.revision" && len(s.Value) >= 12 {
			v += " (" + s.Value[:12] + ")"
		}
	}
	return v
}

func runVersion(args []string, stdout, _ io.Writer) error {
	if len(args) > 0 {
		return usagef("version takes no arguments, got %q", args[0])
	}
	fmt.Fprintf(stdout, "sunsight %s\n", toolVersion())
	return nil
}
