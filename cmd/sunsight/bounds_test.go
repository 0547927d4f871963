package main

import (
	"bytes"
	"fmt"
	"os"
	"path/filepath"
	"strings"
	"testing"
	"time"
)

// Each bound refuses before any work, with exit 2 and a message naming the
// limit and the fix, quickly (no simulation is started).
func TestBounds(t *testing.T) {
	dir := t.TempDir()
	big := filepath.Join(dir, "big.yaml")
	if err := os.WriteFile(big, bytes.Repeat([]byte("# padding\n"), maxScenarioBytes/10+1), 0o644); err != nil {
		t.Fatal(err)
	}
	src, _ := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	grid := filepath.Join(dir, "grid.csv")
	f, err := os.Create(grid)
	if err != nil {
		t.Fatal(err)
	}
	if err := f.Truncate(129 << 20); err != nil { // sparse: no disk used
		t.Fatal(err)
	}
	f.Close()
	gridScen := filepath.Join(dir, "grid.yaml")
	text := strings.Replace(string(src), "  model: uniform\n  value: 0.30\n", "  model: grid\n  grid_file: grid.csv\n", 1)
	if text == string(src) {
		t.Fatal("example has no uniform albedo block")
	}
	os.WriteFile(gridScen, []byte(text), 0o644)
	for _, c := range []struct {
		name string
		args []string
		want string
	}{
		{"scenario file size", []string{"check", big}, "larger than 1048576 bytes"},
		{"endless scenario file", []string{"check", "/dev/zero"}, "larger than 1048576 bytes"},
		{"memory estimate", []string{"run", "../../examples/tumbling-3u.yaml", "--units", "1000000"}, "--max-memory-mib 4096"},
		{"memory limit lowered", []string{"run", "../../examples/tumbling-3u.yaml", "--units", "50", "--max-memory-mib", "20"}, "more than --max-memory-mib 20"},
		{"memory names the albedo tables", []string{"run", "../../examples/nadir-6u-sso.yaml", "--max-memory-mib", "20"}, "MiB of it albedo tables"},
		{"albedo grid file size", []string{"check", gridScen}, "more than the 134217728 bytes"},
		{"sweep cases", []string{"sweep", "../../examples/nadir-6u-sso.yaml", "--vary", "orbit.altitude_km=400:899:1", "--vary", "seed=1:100:1", "--out", filepath.Join(dir, "s")}, "more than 20000 cases"},
	} {
		var so, se bytes.Buffer
		start := time.Now()
		code := runMain(c.args, &so, &se)
		if code != exitUsage || !strings.Contains(se.String(), c.want) {
			t.Errorf("%s: exit %d, stderr %q; want 2 naming %q", c.name, code, se.String(), c.want)
		}
		if d := time.Since(start); d > 20*time.Second {
			t.Logf("%s: took %v", c.name, d) // reported, not asserted
		}
	}
}

// Every scenario error line names the file; at most maxErrorLines are
// printed, then how many more there are.
func TestScenarioErrorsNameFileAndAreCapped(t *testing.T) {
	src, _ := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	var extra strings.Builder
	extra.WriteString("output:\n")
	for i := range 30 {
		fmt.Fprintf(&extra, "  bogus_%02d: 1\n", i)
	}
	p := filepath.Join(t.TempDir(), "many.yaml")
	os.WriteFile(p, append(src, []byte(extra.String())...), 0o644)
	var so, se bytes.Buffer
	if code := runMain([]string{"check", p}, &so, &se); code != exitUsage {
		t.Fatalf("exit %d", code)
	}
	lines := strings.Split(strings.TrimSpace(se.String()), "\n")
	if len(lines) != maxErrorLines+1 || !strings.Contains(lines[len(lines)-1], "and 10 more problems") {
		t.Errorf("%d lines, last %q", len(lines), lines[len(lines)-1])
	}
	for _, l := range lines {
		if !strings.Contains(l, p+": ") {
			t.Errorf("line without the file name: %q", l)
		}
	}
}
