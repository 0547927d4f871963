package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// targets.max_error_p95_units_deg is judged and counted like every
// target: a run that meets it passes with it in the JSON record, one that
// misses it exits 3, and --units 1, which leaves no spread over units to
// judge, is refused before anything is written.
func TestUnitsP95Target(t *testing.T) {
	src, err := os.ReadFile("../../examples/nadir-6u-sso.yaml")
	if err != nil {
		t.Fatal(err)
	}
	dir := t.TempDir()
	write := func(limit string) string {
		i := strings.Index(string(src), "targets:\n")
		if i < 0 {
			t.Fatal("example has no targets block")
		}
		// The example's own targets replaced by this one alone (the
		// block is the file's last).
		text := string(src[:i]) + "monte_carlo: {units: 3}\ntargets:\n  max_error_p95_units_deg: " + limit + "\n"
		p := filepath.Join(dir, "units-"+limit+".yaml")
		if err := os.WriteFile(p, []byte(text), 0o644); err != nil {
			t.Fatal(err)
		}
		return p
	}
	loose, tight := write("179"), write("0.01")

	var so, se bytes.Buffer
	report := filepath.Join(dir, "r.html")
	if code := runMain([]string{"run", loose, "--quiet", "--units", "1", "--report", report}, &so, &se); code != exitUsage ||
		!strings.Contains(se.String(), "targets.max_error_p95_units_deg needs at least 2 Monte Carlo units") {
		t.Errorf("--units 1: exit %d, stderr %q; want 2 naming the target", code, se.String())
	}
	if _, err := os.Stat(report); !os.IsNotExist(err) {
		t.Errorf("refused run wrote %s (%v)", report, err)
	}

	var rec struct {
		Targets []struct {
			Key  string `json:"key"`
			Pass bool   `json:"pass"`
		} `json:"targets"`
	}
	for _, c := range []struct {
		file string
		code int
		pass bool
	}{{loose, 0, true}, {tight, exitTargetFailed, false}} {
		so.Reset()
		se.Reset()
		code := runMain([]string{"run", c.file, "--quiet", "--json", "--duration", "3h"}, &so, &se)
		if code != c.code {
			t.Fatalf("%s: exit %d, want %d (stderr %q)", c.file, code, c.code, se.String())
		}
		if err := json.Unmarshal(so.Bytes(), &rec); err != nil {
			t.Fatal(err)
		}
		found := false
		for _, tg := range rec.Targets {
			if tg.Key == "error-p95-units" {
				found = true
				if tg.Pass != c.pass {
					t.Errorf("%s: units target pass %v, want %v", c.file, tg.Pass, c.pass)
				}
			}
		}
		if !found {
			t.Errorf("%s: no error-p95-units target in the JSON record %+v", c.file, rec.Targets)
		}
	}
}
