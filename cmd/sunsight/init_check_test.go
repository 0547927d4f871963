package main

import (
	"bytes"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

func TestInitThenCheck(t *testing.T) {
	dir := t.TempDir()
	path := filepath.Join(dir, "s.yaml")
	var out, errb bytes.Buffer
	if code := runMain([]string{"init", "-example", "nadir-6u-sso", "-o", path}, &out, &errb); code != 0 {
		t.Fatalf("init exit %d: %s", code, errb.String())
	}
	if code := runMain([]string{"init", "-o", path}, &out, &errb); code != 2 || !strings.Contains(errb.String(), "-force") {
		t.Fatalf("overwrite without -force: exit %d, %s", code, errb.String())
	}
	if code := runMain([]string{"init", "-o", path, "-force"}, &out, &errb); code != 0 {
		t.Fatalf("init -force exit %d", code)
	}
	out.Reset()
	if code := runMain([]string{"check", path}, &out, &errb); code != 0 {
		t.Fatalf("check exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "propagator: j2-mean") {
		t.Errorf("check output lacks the record:\n%s", out.String())
	}
}

func TestCheckErrors(t *testing.T) {
	dir := t.TempDir()
	bad := filepath.Join(dir, "bad.yaml")
	os.WriteFile(bad, []byte("orbit: {altitude_km: -5, inclination_deg: 45}\nbody: {sensors: [{name: a, kind: cosine, face: \"+X\"}]}\n"), 0o644)
	var out, errb bytes.Buffer
	if code := runMain([]string{"check", bad}, &out, &errb); code != 2 || !strings.Contains(errb.String(), "orbit.altitude_km (line 1") {
		t.Errorf("bad file: exit %d, %q", code, errb.String())
	}
	errb.Reset()
	if code := runMain([]string{"check", filepath.Join(dir, "none.yaml")}, &out, &errb); code != 2 || !strings.Contains(errb.String(), "does not exist") {
		t.Errorf("missing file: exit %d, %q", code, errb.String())
	}
	if code := runMain([]string{"init", "-example", "nope", "-o", filepath.Join(dir, "x.yaml")}, &out, &errb); code != 2 {
		t.Errorf("unknown example: exit %d", code)
	}
	if _, err := os.Stat(filepath.Join(dir, "x.yaml")); err == nil {
		t.Errorf("unknown example left a file")
	}
}

// check prints where each sensor can see the sun: for a quadrant sensor its
// linear range, its detection range and its dead zone (the wall example:
// flat to atan(2.31/4) = 30.0°, read as straight above while the imbalance
// is below 0.03, to atan((2.31 + 6·0.03/1.03)/4) = 31.8°; closed form).
func TestCheckPrintsQuadrantRanges(t *testing.T) {
	var out, errb bytes.Buffer
	if code := runMain([]string{"check", "../../examples/hobby-3u-quadrants.yaml"}, &out, &errb); code != 0 {
		t.Fatalf("check exit %d: %s", code, errb.String())
	}
	for _, want := range []string{"#   wall-fwd: valid within ±52.6° per axis", "light on the cells to ±90.0°, dead zone ±31.8° (flat to ±30.0°, imbalance below 0.030 to ±31.8°; reads straight-above there)",
		"#   quad-zenith: valid within ±36.9° per axis", "light on the cells to ±68.5°, no dead zone"} {
		if !strings.Contains(out.String(), want) {
			t.Errorf("check output lacks %q:\n%s", want, out.String())
		}
	}
}
