package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"syscall"
	"testing"
	"time"
)

// A path flag whose value starts with "-" took the next flag as its value
// (run --csv --quiet made a folder named --quiet): it is refused, naming
// the flag, and nothing is made. init -o - still prints the scenario.
func TestPathFlagTakingAFlag(t *testing.T) {
	exampleNadir, err := filepath.Abs("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		t.Fatal(err)
	}
	t.Chdir(t.TempDir())
	for _, c := range []struct {
		flag string
		args []string
	}{
		{"--csv", []string{"run", exampleNadir, "--duration", "1h", "--csv", "--quiet"}},
		{"--plots", []string{"run", exampleNadir, "--duration", "1h", "--quiet", "--plots", "-q"}},
		{"--report", []string{"run", exampleNadir, "--duration", "1h", "--quiet", "--report", "-"}},
		{"--oem", []string{"export", exampleNadir, "--oem", "--force"}},
		{"--out", []string{"sweep", exampleNadir, "--vary", "duration=1h", "--out", "--no-plots"}},
		{"--out", []string{"init", "--out", "--force"}},
	} {
		var so, se bytes.Buffer
		code := runMain(c.args, &so, &se)
		if code != exitUsage || !strings.Contains(se.String(), c.flag) || !strings.Contains(se.String(), "looks like a flag") {
			t.Errorf("%v: exit %d, stderr %q; want 2 naming %s", c.args, code, se.String(), c.flag)
		}
		if ents, _ := os.ReadDir("."); len(ents) != 0 {
			t.Errorf("%v: made %v", c.args, ents)
			for _, e := range ents {
				os.RemoveAll(e.Name())
			}
		}
	}
	var so, se bytes.Buffer
	if code := runMain([]string{"init", "-o", "-"}, &so, &se); code != exitOK || !strings.Contains(so.String(), "orbit:") {
		t.Errorf("init -o -: exit %d, %s", code, se.String())
	}
}

// orbit --epoch and --ltan-solar-time only place the node of --ltan: with
// --inclination-deg and no --ltan they changed nothing, so they are refused.
func TestOrbitRefusesFlagsWithoutEffect(t *testing.T) {
	for _, args := range [][]string{
		{"orbit", "--altitude-km", "550", "--inclination-deg", "50", "--epoch", "2027-03-20T12:00:00Z"},
		{"orbit", "--altitude-km", "550", "--inclination-deg", "50", "--ltan-solar-time", "apparent"},
	} {
		var so, se bytes.Buffer
		code := runMain(args, &so, &se)
		if code != exitUsage || !strings.Contains(se.String(), args[5]) || !strings.Contains(se.String(), "--ltan") {
			t.Errorf("%v: exit %d, stderr %q; want 2 naming %s and --ltan", args, code, se.String(), args[5])
		}
	}
	var so, se bytes.Buffer
	if code := runMain([]string{"orbit", "--altitude-km", "550", "--inclination-deg", "50", "--ltan", "10:30", "--epoch", "2027-03-20T12:00:00Z", "--ltan-solar-time", "apparent"}, &so, &se); code != exitOK || !strings.Contains(so.String(), "RAAN") {
		t.Errorf("with --ltan: exit %d, %s", code, se.String())
	}
}

// An interrupted season or layout says "interrupted" as run does, not the
// library's "context canceled".
func TestInterruptedSeasonAndLayout(t *testing.T) {
	layoutScen := filepath.Join(t.TempDir(), "layout.yaml")
	src, err := os.ReadFile("../../examples/layout-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	os.WriteFile(layoutScen, src, 0o644)
	for _, args := range [][]string{
		{"season", "../../examples/nadir-6u-sso.yaml", "--quiet"},
		{"layout", layoutScen, "--top", "50"},
	} {
		c := child(false, args...)
		var cerr bytes.Buffer
		c.Stderr = &cerr
		if err := c.Start(); err != nil {
			t.Fatal(err)
		}
		time.Sleep(400 * time.Millisecond)
		c.Process.Signal(syscall.SIGTERM)
		code := exitCode(c.Wait())
		if code != exitFailure || !strings.Contains(cerr.String(), "interrupted") || strings.Contains(cerr.String(), "context canceled") {
			t.Errorf("%v: exit %d, stderr %q; want 1 and interrupted", args[0], code, cerr.String())
		}
	}
}
