package study

import (
	"math"
	"testing"

	"codeberg.org/sunsight/sunsight/illum/albedo"
	"codeberg.org/sunsight/sunsight/scenario"
)

// The scenario's default zonal mean is the published profile's own a₀, so
// an unset albedo.value leaves the Knocke profile unscaled.
func TestZonalDefaultIsThePublishedMean(t *testing.T) {
	s, err := scenario.Parse([]byte("orbit: {altitude_km: 550, inclination_deg: 97.6}\nbody:\n  sensors: [{name: a, kind: cosine, face: \"+X\"}]\nalbedo: {model: zonal}\n"), "")
	if err != nil {
		t.Fatal(err)
	}
	if s.Albedo.Value != albedo.KnockeZonal().A0 {
		t.Errorf("default zonal albedo.value %g, Knocke a₀ %g", s.Albedo.Value, albedo.KnockeZonal().A0)
	}
}

// albedo.value with the zonal model is used: it scales the profile, so the
// albedo part of the error grows with it (0.1 < 0.34 default < 0.5).
func TestZonalValueScalesTheProfile(t *testing.T) {
	part := func(value string) float64 {
		t.Helper()
		text := "duration: 3h\nstep: 30s\norbit: {altitude_km: 550, inclination_deg: 97.6}\nattitude: {law: nadir}\n" +
			"body:\n  sensors:\n" +
			"    - {name: a, kind: cosine, face: \"+X\"}\n    - {name: b, kind: cosine, face: \"-X\"}\n" +
			"    - {name: c, kind: cosine, face: \"+Y\"}\n    - {name: d, kind: cosine, face: \"-Y\"}\n" +
			"    - {name: e, kind: cosine, face: \"-Z\"}\n    - {name: f, kind: cosine, face: \"+Z\"}\n" +
			"albedo: {model: zonal" + value + "}\n"
		s, err := scenario.Parse([]byte(text), "")
		if err != nil {
			t.Fatal(err)
		}
		res := runScenario(t, s)
		return res.Nominal.Estimators[0].AlbedoPart.P95Deg
	}
	low, def, high := part(", value: 0.1"), part(""), part(", value: 0.5")
	t.Logf("albedo part p95: value 0.1 → %.3f°, default 0.34 → %.3f°, 0.5 → %.3f°", low, def, high)
	if !(low < def && def < high) {
		t.Errorf("albedo part p95 %.3f°, %.3f°, %.3f° not increasing with albedo.value 0.1, 0.34, 0.5", low, def, high)
	}
	if r := low / def; math.Abs(r-0.1/0.34) > 0.05 {
		t.Errorf("value 0.1 / default: albedo part ratio %.3f, want ≈ %.3f (albedo linear in reflectance)", r, 0.1/0.34)
	}
}
