package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// nadirWith returns the bundled nadir example with its max_error_p95_deg
// target replaced (written into a temporary folder).
func nadirWith(t *testing.T, p95 string) string {
	t.Helper()
	src, err := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		t.Fatal(err)
	}
	if !strings.Contains(string(src), "max_error_p95_deg: 5\n") {
		t.Fatal("example has no max_error_p95_deg: 5 line")
	}
	text := strings.Replace(string(src), "max_error_p95_deg: 5\n", "max_error_p95_deg: "+p95+"\n", 1)
	p := filepath.Join(t.TempDir(), "s.yaml")
	if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return p
}

// The exit statuses of run: 0 every target met, 3 a target missed (the
// example's p95 of about 15° against 5°; 40° passes), 2 bad input, 1 a write
// error on stdout. The summary ends with the verdict line either way.
func TestRunExitStatus(t *testing.T) {
	pass, fail := nadirWith(t, "40"), nadirWith(t, "5")
	for _, c := range []struct {
		file    string
		json    bool
		code    int
		verdict string
	}{
		{pass, false, exitOK, "verdict: all 4 targets met"},
		{fail, false, exitTargetFailed, "verdict: 1 of 4 targets failed: p95 sun-vector error (combined)"},
		{pass, true, exitOK, ""},
		{fail, true, exitTargetFailed, ""},
	} {
		args := []string{"run", c.file, "--duration", "3h", "--quiet"}
		if c.json {
			args = append(args, "--json")
		}
		var out, errb bytes.Buffer
		code := runMain(args, &out, &errb)
		lines := strings.Split(strings.TrimSpace(out.String()), "\n")
		if code != c.code || (c.verdict != "" && lines[len(lines)-1] != c.verdict) {
			t.Errorf("%v: exit %d (want %d), last line %q (want %q); stderr %q", args, code, c.code, lines[len(lines)-1], c.verdict, errb.String())
		}
	}
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", pass, "--duration", "0s"}, &out, &errb); code != exitUsage {
		t.Errorf("bad duration: exit %d", code)
	}
}

// Any write error on stdout is a run failure (exit 1), for every command
// that prints: /dev/full refuses every write with "no space left".
func TestStdoutFullDevice(t *testing.T) {
	full, err := os.OpenFile("/dev/full", os.O_WRONLY, 0)
	if err != nil {
		t.Skip("no /dev/full here")
	}
	defer full.Close()
	pass := nadirWith(t, "40")
	for _, args := range [][]string{
		{"run", pass, "--duration", "2h", "--quiet"},
		{"run", pass, "--duration", "2h", "--quiet", "--json"},
		{"check", pass},
		{"orbit", "--altitude-km", "550", "--ltan", "10:30", "--epoch", "2027-03-20T12:00:00Z"},
		{"init", "-o", "-"},
		{"version"},
		{"run", "--help"},
	} {
		var errb bytes.Buffer
		code := runMain(args, full, &errb)
		if code != exitFailure || !strings.Contains(errb.String(), "no space left") {
			t.Errorf("%v > /dev/full: exit %d, stderr %q; want 1 naming the write error", args, code, errb.String())
		}
	}
}
