package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

const layoutCLIScenario = `name: cli layout
epoch: "2026-03-20T12:00:00Z"
duration: 20m
step: 60s
orbit: {altitude_km: 500, inclination_deg: 30, propagator: two-body}
attitude: {law: nadir}
body:
  sensors:
    - {name: a, kind: cosine, face: "+X"}
  candidates:
    - {name: px, kind: cosine, face: "+X", half_angle_deg: 60}
    - {name: mx, kind: cosine, face: "-X", half_angle_deg: 60}
    - {name: py, kind: cosine, face: "+Y", half_angle_deg: 60}
    - {name: my, kind: cosine, face: "-Y", half_angle_deg: 60}
    - {name: pz, kind: cosine, face: "+Z", half_angle_deg: 60}
    - {name: mz, kind: cosine, face: "-Z", half_angle_deg: 60}
albedo: {model: none}
estimators: [least-squares]
targets: {coverage_sensors: 1, min_coverage: 1}
`

// At 60° half-angle the six faces are all needed to see the whole sky
// (closed form: with one face gone, its anti-normal is 90° from the rest).
func TestLayoutCommandPicksAllSixFaces(t *testing.T) {
	dir := t.TempDir()
	file := filepath.Join(dir, "s.yaml")
	os.WriteFile(file, []byte(layoutCLIScenario), 0o644)
	var out, errb bytes.Buffer
	dir = filepath.Join(dir, "out")
	if code := runMain([]string{"layout", file, "--out", dir}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "fewest sensors: 6 (px mx py my pz mz)") {
		t.Errorf("output:\n%s", out.String())
	}
	// Both tables name their columns, and the margin says what it measures.
	for _, want := range []string{"rank  sensors  coverage  p95_deg  margin  set", "margin: the smallest target margin over the modes",
		"sensors  coverage  p95_deg  meets  set"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("output lacks %q:\n%s", want, out.String())
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "layout.json")); err != nil {
		t.Error(err)
	}
}
