package sweep

import "testing"

// Sweep axes are labelled in words with the unit the key's name carries.
func TestAxisLabel(t *testing.T) {
	for key, want := range map[string]string{
		"orbit.altitude_km":     "orbit altitude (km)",
		"orbit.ltan":            "orbit LTAN (h, local time)",
		"epoch":                 "epoch (days after the first)",
		"duration":              "duration",
		"body.sensors.tilt_deg": "body sensors tilt (deg)",
	} {
		if got := axisLabel(key); got != want {
			t.Errorf("axisLabel(%q) = %q, want %q", key, got, want)
		}
	}
	if got := keyWords("orbit.ltan"); got != "orbit LTAN" {
		t.Errorf("keyWords = %q", got)
	}
}
