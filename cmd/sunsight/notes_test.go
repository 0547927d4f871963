package main

import (
	"bytes"
	"encoding/json"
	"os"
	"path/filepath"
	"strings"
	"testing"
)

// The drawn tumble of every unit is reported (summary line, JSON, CSV), and
// warnings reach stderr and the JSON record.
func TestRunReportsTumbleDrawsAndWarnings(t *testing.T) {
	dir := t.TempDir()
	f := filepath.Join(dir, "s.yaml")
	os.WriteFile(f, []byte("epoch: \"1800-06-01T00:00:00Z\"\nduration: 30m\nstep: 10s\norbit: {altitude_km: 500, inclination_deg: 51.6}\n"+
		"attitude: {law: tumble, min_rate_deg_s: 5, max_rate_deg_s: 10}\nmonte_carlo: {units: 7}\nalbedo: {model: none}\n"+
		"body:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}, {name: b, kind: cosine, face: \"-X\"}, {name: c, kind: cosine, face: \"+Z\"}]\n"), 0o644)
	var out, errb bytes.Buffer
	if code := runMain([]string{"run", "--quiet", "--json", f}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(errb.String(), "warning: the run (1800 to 1800) leaves 1950–2050") || !strings.Contains(errb.String(), "shorter than one orbit") {
		t.Errorf("stderr lacks the warnings: %q", errb.String())
	}
	var rec struct {
		Warnings []string `json:"warnings"`
		Draws    []struct {
			Attitude   string `json:"attitude"`
			TorqueFree bool   `json:"torque_free"`
			Units      []struct {
				Rate float64   `json:"rate_deg_s"`
				Axis []float64 `json:"axis_body"`
			} `json:"units"`
		} `json:"tumble_draws"`
	}
	if err := json.Unmarshal(out.Bytes(), &rec); err != nil {
		t.Fatal(err)
	}
	if len(rec.Warnings) != 2 || len(rec.Draws) != 1 || len(rec.Draws[0].Units) != 7 || rec.Draws[0].TorqueFree {
		t.Fatalf("record: %+v", rec)
	}
	for _, u := range rec.Draws[0].Units {
		if u.Rate < 5 || u.Rate > 10 || len(u.Axis) != 3 {
			t.Errorf("draw %+v outside 5–10°/s", u)
		}
	}
	out.Reset()
	csv := filepath.Join(dir, "csv")
	if code := runMain([]string{"run", "--quiet", "--csv", csv, f}, &out, &errb); code != 0 {
		t.Fatalf("exit %d: %s", code, errb.String())
	}
	if !strings.Contains(out.String(), "tumble (primary): rate drawn uniformly in [5, 10]°/s, axis isotropic, per unit; then fixed-axis spin (no inertia given)") ||
		!strings.Contains(out.String(), "unit 4:") || !strings.Contains(out.String(), "2 more unit(s)") {
		t.Errorf("summary lacks the draws:\n%s", out.String())
	}
	b, err := os.ReadFile(filepath.Join(csv, "tumble_draws.csv"))
	if err != nil || strings.Count(string(b), "\n") != 8 {
		t.Errorf("tumble_draws.csv: %v\n%s", err, b)
	}
}
