package main

import (
	"fmt"
	"io"
	"runtime/debug"
	"strings"
)

func init() {
	register(command{name: "version", summary: "print the tool version and build details", args: "",
		about:    "Prints the module version and the version-control revision recorded when the binary was built.",
		examples: []string{"sunsight version", "sunsight --version"},
		run:      runVersion})
}

// toolVersion returns the module version and VCS revision recorded at build time.
func toolVersion() string {
	bi, ok := debug.ReadBuildInfo()
	if !ok {
		return "unknown"
	}
	v := bi.Main.Version
	if v == "" {
		v = "(devel)"
	}
	rev, dirty := "", false
	for _, s := range bi.Settings {
		switch s.Key {
		case "vcs.revision":
			rev = s.Value
		case "vcs.modified":
			dirty = s.Value == "true"
		}
	}
	// A pseudo-version (v0.0.0-date-revision) already names the revision.
	if len(rev) >= 12 && !strings.Contains(v, rev[:12]) {
		v += " (" + rev[:12] + ")"
	}
	if dirty && !strings.HasSuffix(v, "+dirty") {
		v += " (modified)"
	}
	return v
}

func runVersion(args []string, stdout, _ io.Writer) error {
	fs := newFlagSet("version")
	pos, err := fs.parse(args, stdout)
	if err != nil {
		return err
	}
	if err := wantArgs("version", pos, 0, 0); err != nil {
		return err
	}
	bi, _ := debug.ReadBuildInfo()
	goVersion := "unknown Go"
	if bi != nil {
		goVersion = bi.GoVersion
	}
	fmt.Fprintf(stdout, "sunsight %s %s\n", toolVersion(), goVersion)
	return nil
}
