package main

import (
	"bytes"
	"encoding/json"
	"fmt"
	"math"
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
		"sensors  coverage  p95_deg  meets  set", "ranked by margin, then coverage (closer than 4.9e-04, the lattice's resolution, is a tie), then p95_deg"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("output lacks %q:\n%s", want, out.String())
		}
	}
	if _, err := os.Stat(filepath.Join(dir, "layout.json")); err != nil {
		t.Error(err)
	}
}

// layoutExample is examples/layout-6u.yaml shortened to two hours at 60 s:
// the sky coverage does not depend on the duration, and the time targets
// stay loose enough that the coverage target decides.
func layoutExample(t *testing.T) (file string, text string) {
	t.Helper()
	b, err := os.ReadFile("../../examples/layout-6u.yaml")
	if err != nil {
		t.Fatal(err)
	}
	text = strings.Replace(strings.Replace(string(b), "duration: 1d", "duration: 2h", 1), "step: 30s", "step: 60s", 1)
	file = filepath.Join(t.TempDir(), "layout.yaml")
	if err := os.WriteFile(file, []byte(text), 0o644); err != nil {
		t.Fatal(err)
	}
	return file, text
}

// asBody returns the scenario text with the named candidates as its
// body.sensors (their lines copied from body.candidates).
func asBody(t *testing.T, text string, names []string) string {
	t.Helper()
	head, rest, ok := strings.Cut(text, "  sensors:")
	_, cands, ok2 := strings.Cut(rest, "  candidates:")
	if !ok || !ok2 {
		t.Fatal("layout example has no body.sensors and body.candidates")
	}
	var lines []string
	for _, n := range names {
		for _, l := range strings.Split(cands, "\n") {
			if strings.Contains(l, "{name: "+n+",") {
				lines = append(lines, l)
			}
		}
	}
	if len(lines) != len(names) {
		t.Fatalf("found %d of the candidates %v", len(lines), names)
	}
	return head + "  sensors:\n" + strings.Join(lines, "\n") + "\n  candidates:" + cands
}

// The set the layout search names, flown as body.sensors, passes the
// coverage target of run with the very coverage the search printed: the
// search judges the sky on the lattice run uses (it judged a 4096-point
// lattice, and any --sky-points, so that an 8-sensor set it chose at 10
// points failed run at 72.5 % of an 80 % target).
func TestLayoutChoicePassesRunCoverage(t *testing.T) {
	file, text := layoutExample(t)
	dir := filepath.Join(t.TempDir(), "out")
	var out, errb bytes.Buffer
	if code := runMain([]string{"layout", file, "--out", dir}, &out, &errb); code != exitOK {
		t.Fatalf("layout exit %d: %s\n%s", code, errb.String(), out.String())
	}
	if !strings.Contains(out.String(), "65536-point sky lattice run uses") {
		t.Errorf("the output does not say at what resolution the coverage was judged:\n%s", out.String())
	}
	var doc struct {
		Alternatives []struct {
			Sensors  []string `json:"sensors"`
			Coverage float64  `json:"coverage_fraction"`
		} `json:"alternatives"`
	}
	b, _ := os.ReadFile(filepath.Join(dir, "layout.json"))
	if err := json.Unmarshal(b, &doc); err != nil || len(doc.Alternatives) == 0 {
		t.Fatalf("layout.json: %v\n%s", err, b)
	}
	for i, a := range doc.Alternatives {
		body := filepath.Join(t.TempDir(), "body.yaml")
		os.WriteFile(body, []byte(asBody(t, text, a.Sensors)), 0o644)
		out.Reset()
		errb.Reset()
		runMain([]string{"run", body, "--json", "--quiet"}, &out, &errb)
		var rec struct {
			Sky struct {
				Seen3 float64 `json:"sky_seen_by_3_fraction"`
			} `json:"sky_coverage"`
			Targets []struct {
				Key  string `json:"key"`
				Pass bool   `json:"pass"`
			} `json:"targets"`
		}
		if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
			t.Fatalf("run of %v: %v: %s", a.Sensors, err, errb.String())
		}
		// run writes 10 significant digits; one lattice point is 1.5e-5.
		if math.Abs(rec.Sky.Seen3-a.Coverage) > 1e-9 {
			t.Errorf("alternative %d %v: layout coverage %.12f, run %.12f", i+1, a.Sensors, a.Coverage, rec.Sky.Seen3)
		}
		for _, tg := range rec.Targets {
			if tg.Key == "coverage" && !tg.Pass {
				t.Errorf("alternative %d %v fails run's coverage target", i+1, a.Sensors)
			}
		}
	}
}

// The sky lattice is the one run judges on; a flag that would judge
// another is refused (it accepted any --sky-points ≥ 1).
func TestLayoutRefusesSkyPoints(t *testing.T) {
	file, _ := layoutExample(t)
	var out, errb bytes.Buffer
	if code := runMain([]string{"layout", file, "--sky-points", "10"}, &out, &errb); code != exitUsage {
		t.Errorf("--sky-points 10: exit %d, want %d\n%s", code, exitUsage, out.String())
	}
}

// --max-runs that stops the search before any subset meets the targets is
// an incomplete search, not a miss: it says how many subsets it tried of
// how many and that this is no proof, and exits 1; the same search run to
// the end is a proven miss, exit 3. (It printed "no subset meets every
// target" and exited 3 after 200 of 855 subsets.)
func TestLayoutRunLimitIsNotAProof(t *testing.T) {
	file, text := layoutExample(t)
	text = strings.Replace(text, "max_error_p95_deg: 30", "max_error_p95_deg: 2", 1)
	os.WriteFile(file, []byte(text), 0o644)
	var out, errb bytes.Buffer
	if code := runMain([]string{"layout", file, "--max-sensors", "8"}, &out, &errb); code != exitTargetFailed {
		t.Fatalf("full search: exit %d, want %d\n%s", code, exitTargetFailed, out.String())
	}
	total := 0
	if _, err := fmt.Sscanf(out.String(), "layout search: 13 candidates, %d subsets simulated", &total); err != nil || total <= 3 {
		t.Fatalf("full search simulated %d subsets (%v):\n%s", total, err, out.String())
	}
	if !strings.Contains(out.String(), "no subset meets every target") {
		t.Errorf("full search:\n%s", out.String())
	}
	out.Reset()
	errb.Reset()
	code := runMain([]string{"layout", file, "--max-sensors", "8", "--max-runs", "3"}, &out, &errb)
	if code != exitFailure {
		t.Errorf("--max-runs 3: exit %d, want %d", code, exitFailure)
	}
	o := out.String()
	for _, want := range []string{fmt.Sprintf("3 of the %d subsets", total), "not a proof", "--max-runs 3"} {
		if !strings.Contains(o, want) {
			t.Errorf("--max-runs 3: output lacks %q:\n%s", want, o)
		}
	}
	if strings.Contains(o, "no subset meets every target") || !strings.Contains(errb.String(), "incomplete") {
		t.Errorf("--max-runs 3 states a result it has not proven:\n%s\n%s", o, errb.String())
	}
}
