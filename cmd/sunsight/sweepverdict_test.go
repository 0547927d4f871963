package main

import (
	"bytes"
	"path/filepath"
	"strings"
	"testing"
)

// A sweep whose cases state no target says so; it said "every target met
// in all 2 cases".
func TestSweepVerdictWithoutTargets(t *testing.T) {
	file := scenarioText(t, `name: no targets
epoch: "2026-06-01T00:00:00Z"
duration: 2h
step: 30s
orbit: {altitude_km: 500, ltan: "10:30"}
attitude: {law: nadir}
body:
  sensors:
    - {name: c, kind: cosine, face: "-Z"}
albedo: {model: none}
`)
	var out, errb bytes.Buffer
	args := []string{"sweep", file, "--vary", "orbit.altitude_km=500,600", "--no-plots", "--quiet", "--out", filepath.Join(t.TempDir(), "sw")}
	if code := runMain(args, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "verdict: no targets set in any of the 2 cases") {
		t.Errorf("verdict:\n%s", out.String())
	}
}
