package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// Every command's help goes to stdout with its usage line, flags, examples
// and the exit statuses, and exits 0; "sunsight help NAME" prints the same.
func TestHelpOfEveryCommand(t *testing.T) {
	for name := range commands {
		for _, args := range [][]string{{name, "--help"}, {name, "-h"}, {name, "-help"}, {"help", name}} {
			var out, errb bytes.Buffer
			code := runMain(args, &out, &errb)
			o := out.String()
			if code != exitOK || errb.Len() != 0 || !strings.HasPrefix(o, "Usage: sunsight "+name) ||
				!strings.Contains(o, "Examples:") || !strings.Contains(o, "Exit status:") {
				t.Errorf("%v: exit %d, stderr %q, stdout:\n%s", args, code, errb.String(), o)
			}
			if strings.Contains(o, "NaN") {
				t.Errorf("%v: help shows NaN:\n%s", args, o)
			}
		}
	}
}

// --version and version print the module version and the Go version.
func TestVersion(t *testing.T) {
	for _, args := range [][]string{{"--version"}, {"version"}} {
		var out, errb bytes.Buffer
		if code := runMain(args, &out, &errb); code != 0 || !strings.HasPrefix(out.String(), "sunsight ") || !strings.Contains(out.String(), "go1.") {
			t.Errorf("%v: exit %d, %q %q", args, code, out.String(), errb.String())
		}
	}
	var out, errb bytes.Buffer
	if code := runMain([]string{"version", "extra"}, &out, &errb); code != exitUsage {
		t.Errorf("version extra: exit %d", code)
	}
}

// An unknown flag is reported once, naming the flag, with exit 2.
func TestUnknownFlagOnce(t *testing.T) {
	for name := range commands {
		var out, errb bytes.Buffer
		code := runMain([]string{name, "--bogus-flag"}, &out, &errb)
		if code != exitUsage || strings.Count(errb.String(), "bogus-flag") != 1 || out.Len() != 0 {
			t.Errorf("%s: exit %d, stderr %q, stdout %q", name, code, errb.String(), out.String())
		}
	}
}

// Flags may come before or after the file, GNU (--quiet) or with one dash
// (-q, -quiet); "--" ends the flags.
func TestFlagsAnywhere(t *testing.T) {
	file := "../../examples/nadir-6u-sso.yaml"
	for _, args := range [][]string{
		{"check", file, "-q"}, {"check", "-q", file}, {"check", file, "--quiet"}, {"check", "-quiet", file}, {"check", "--quiet", "--", file},
	} {
		var out, errb bytes.Buffer
		if code := runMain(args, &out, &errb); code != 0 || out.Len() != 0 {
			t.Errorf("%v: exit %d, stdout %q, stderr %q", args, code, out.String(), errb.String())
		}
	}
}

// init -o - prints the scenario on stdout; check - reads it from stdin.
func TestInitToStdoutCheckFromStdin(t *testing.T) {
	var out, errb bytes.Buffer
	if code := runMain([]string{"init", "--example", "nadir-6u-sso", "-o", "-"}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	want, _ := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if out.String() != scenario.SchemaComment+string(want) {
		t.Fatalf("init -o - printed something else than the example")
	}
	old := stdin
	defer func() { stdin = old }()
	stdin = bytes.NewReader(out.Bytes())
	var out2 bytes.Buffer
	if code := runMain([]string{"check", "-"}, &out2, &errb); code != 0 || !strings.Contains(out2.String(), "(standard input): valid") {
		t.Fatalf("check -: exit %d, %q %q", code, out2.String(), errb.String())
	}
}

// Writing to a device or other non-regular path is refused; an existing file
// needs --force.
func TestOutputTargetRules(t *testing.T) {
	dir := t.TempDir()
	var out, errb bytes.Buffer
	if code := runMain([]string{"init", "-o", "/dev/null", "--force"}, &out, &errb); code != exitUsage || !strings.Contains(errb.String(), "not a regular file") {
		t.Errorf("init -o /dev/null: exit %d, %q", code, errb.String())
	}
	p := filepath.Join(dir, "s.yaml")
	os.WriteFile(p, []byte("mine"), 0o644)
	errb.Reset()
	if code := runMain([]string{"init", "-o", p}, &out, &errb); code != exitUsage || !strings.Contains(errb.String(), "--force") {
		t.Errorf("init over a file: exit %d, %q", code, errb.String())
	}
	if b, _ := os.ReadFile(p); string(b) != "mine" {
		t.Error("init replaced a file without --force")
	}
	errb.Reset()
	report := filepath.Join(dir, "r.html")
	os.WriteFile(report, []byte("old"), 0o644)
	if code := runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "1h", "--report", report}, &out, &errb); code != exitUsage || !strings.Contains(errb.String(), "--force") {
		t.Errorf("run --report over a file: exit %d, %q", code, errb.String())
	}
	// A folder of someone else's files is never replaced, even with --force.
	other := filepath.Join(dir, "other")
	os.Mkdir(other, 0o755)
	os.WriteFile(filepath.Join(other, "notes.txt"), []byte("keep"), 0o644)
	errb.Reset()
	if code := runMain([]string{"run", "../../examples/nadir-6u-sso.yaml", "--duration", "1h", "--csv", other, "--force"}, &out, &errb); code != exitUsage || !strings.Contains(errb.String(), "not a sunsight output set") {
		t.Errorf("run --csv into a foreign folder: exit %d, %q", code, errb.String())
	}
}

// A misspelt flag or command is refused with the one the user probably
// meant.
func TestMisspeltFlagAndCommandHint(t *testing.T) {
	for _, c := range []struct {
		args []string
		want string
	}{
		{[]string{"run", "--unit", "3", "x.yaml"}, `unknown flag: --unit (did you mean "--units"?)`},
		{[]string{"run", "--workr", "2", "x.yaml"}, `(did you mean "--workers"?)`},
		{[]string{"chek", "x.yaml"}, `unknown command "chek" (did you mean "check"?)`},
		{[]string{"help", "sweeep"}, `(did you mean "sweep"?)`},
	} {
		var out, errb bytes.Buffer
		if code := runMain(c.args, &out, &errb); code != exitUsage || !strings.Contains(errb.String(), c.want) {
			t.Errorf("%v: exit %d, stderr %q, want %q", c.args, code, errb.String(), c.want)
		}
	}
}

// init takes the file to write as an argument too; with -o naming another
// file it is refused.
func TestInitFileArgument(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.yaml")
	var out, errb bytes.Buffer
	if code := runMain([]string{"init", path, "--example", "nadir-6u-sso"}, &out, &errb); code != 0 {
		t.Fatalf("init FILE: exit %d: %s", code, errb.String())
	}
	got, _ := os.ReadFile(path)
	want, _ := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if string(got) != scenario.SchemaComment+string(want) {
		t.Errorf("init FILE wrote something else than the example")
	}
	other := filepath.Join(dir, "t.yaml")
	if code := runMain([]string{"init", other, "-o", path + ".b"}, &out, &errb); code != exitUsage || !strings.Contains(errb.String(), "give one") {
		t.Errorf("init FILE -o OTHER: exit %d, %q", code, errb.String())
	}
	if _, err := os.Stat(other); err == nil {
		t.Errorf("init FILE -o OTHER wrote %s", other)
	}
}
