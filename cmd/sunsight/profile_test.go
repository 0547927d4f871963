package main

import (
	"bytes"
	"compress/gzip"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// --cpuprofile writes a profile (pprof's format is gzip-compressed protocol
// buffers) and leaves the run's output as it is; a path that cannot be
// created is refused with exit 2 naming the flag.
func TestRunCPUProfile(t *testing.T) {
	dir := t.TempDir()
	prof := filepath.Join(dir, "cpu.pprof")
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "-quiet", "-duration", "6h", "-cpuprofile", prof, "../../examples/nadir-6u-sso.yaml"}, &out, &errb); code != 0 && code != 3 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	f, err := os.Open(prof)
	if err != nil {
		t.Fatal(err)
	}
	defer f.Close()
	zr, err := gzip.NewReader(f)
	if err != nil {
		t.Fatalf("profile is not gzip-compressed: %v", err)
	}
	var body bytes.Buffer
	if _, err := body.ReadFrom(zr); err != nil || body.Len() == 0 {
		t.Fatalf("profile body: %d bytes, %v", body.Len(), err)
	}
	if !strings.Contains(out.String(), "sun") {
		t.Errorf("summary missing with -cpuprofile:\n%s", out.String())
	}

	out.Reset()
	errb.Reset()
	bad := filepath.Join(dir, "no-such-folder", "cpu.pprof")
	if code := runMain([]string{"run", "-quiet", "-duration", "1h", "-cpuprofile", bad, "../../examples/nadir-6u-sso.yaml"}, &out, &errb); code != 2 {
		t.Fatalf("bad profile path: exit %d, want 2", code)
	}
	if !strings.Contains(errb.String(), "--cpuprofile") {
		t.Errorf("message does not name the flag: %s", errb.String())
	}
}

// season and layout take --cpuprofile too: each writes a non-empty
// gzip-compressed profile, and a path that cannot be created is refused
// with exit 2 naming the flag.
func TestSeasonLayoutCPUProfile(t *testing.T) {
	for _, args := range [][]string{
		{"season", "--quiet", "--span", "10d", "--cases", "2", "--refine", "0", "--case-duration", "2h", "../../examples/nadir-6u-sso.yaml"},
		{"layout", "--max-runs", "3", "../../examples/layout-6u.yaml"},
	} {
		dir := t.TempDir()
		prof := filepath.Join(dir, "cpu.pprof")
		var out, errb bytes.Buffer
		// A layout search stopped by --max-runs before an answer exits 1.
		if code := runMain(append(args, "--cpuprofile", prof), &out, &errb); code != 0 && code != 3 && (args[0] != "layout" || code != 1) {
			t.Fatalf("%s: exit %d: %s", args[0], code, errb.String())
		}
		f, err := os.Open(prof)
		if err != nil {
			t.Fatalf("%s: %v", args[0], err)
		}
		zr, err := gzip.NewReader(f)
		if err != nil {
			t.Fatalf("%s: profile is not gzip-compressed: %v", args[0], err)
		}
		var body bytes.Buffer
		if _, err := body.ReadFrom(zr); err != nil || body.Len() == 0 {
			t.Errorf("%s: profile body: %d bytes, %v", args[0], body.Len(), err)
		}
		f.Close()
		errb.Reset()
		if code := runMain(append(args, "--cpuprofile", filepath.Join(dir, "no-such-folder", "cpu.pprof")), &out, &errb); code != 2 || !strings.Contains(errb.String(), "--cpuprofile") {
			t.Errorf("%s: bad profile path: exit %d, %s", args[0], code, errb.String())
		}
	}
}

// An existing file given to --cpuprofile is left as it was and the command
// refused with exit 2 (the same rule as every other output file); run
// replaces it with --force; sweep, which has no --force, does not offer it.
func TestCPUProfileKeepsAnExistingFile(t *testing.T) {
	dir := t.TempDir()
	prof := filepath.Join(dir, "mine.yaml")
	const mine = "a file of the user's\n"
	if err := os.WriteFile(prof, []byte(mine), 0o644); err != nil {
		t.Fatal(err)
	}
	scen := "../../examples/nadir-6u-sso.yaml"
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "-quiet", "-duration", "1h", "-cpuprofile", prof, scen}, &out, &errb); code != 2 {
		t.Fatalf("existing profile path: exit %d, want 2", code)
	}
	if msg := errb.String(); !strings.Contains(msg, "--cpuprofile") || !strings.Contains(msg, "--force") {
		t.Errorf("message lacks the flag or the fix: %s", msg)
	}
	if b, _ := os.ReadFile(prof); string(b) != mine {
		t.Fatalf("the existing file was changed: %q", b)
	}
	errb.Reset()
	if code := runMain([]string{"sweep", scen, "--vary", "orbit.altitude_km=500,600", "--vary", "duration=1h", "--quiet", "--out", filepath.Join(dir, "sw"), "--cpuprofile", prof}, &out, &errb); code != 2 {
		t.Fatalf("sweep, existing profile path: exit %d, want 2: %s", code, errb.String())
	}
	if msg := errb.String(); !strings.Contains(msg, "--cpuprofile") || strings.Contains(msg, "--force") {
		t.Errorf("sweep message names the flag and no --force: %s", msg)
	}
	if b, _ := os.ReadFile(prof); string(b) != mine {
		t.Fatalf("sweep changed the existing file: %q", b)
	}
	if _, err := os.Stat(filepath.Join(dir, "sw")); err == nil {
		t.Error("the refused sweep left its --out folder")
	}
	errb.Reset()
	if code := runMain([]string{"run", "-quiet", "-duration", "1h", "-force", "-cpuprofile", prof, scen}, &out, &errb); code != 0 && code != 3 {
		t.Fatalf("--force: exit %d: %s", code, errb.String())
	}
	if b, _ := os.ReadFile(prof); string(b) == mine || len(b) == 0 {
		t.Fatal("--force did not replace the file with a profile")
	}
}
