package study

import (
	"strings"
	"testing"
)

// A digital sensor held 17 mm off the −Z face of a 6U in nadir pointing
// (Earth toward +Z), its boresight 30° above the horizontal away from the
// Earth, has the Earth's limb 6.9° inside its 60° cone (66.9° from nadir
// at 550 km: 90° − asin(R/r) = 23.1° below the horizontal) — but the bus
// lies between: from 17 mm above the face, every ray toward the Earth
// within the cone meets the bus (the ray 23° down at 30° azimuth reaches the
// face 40 mm out, inside the 113 × 50 mm half face; closed form). The
// lit Earth is then not in view, and the blinding rule does not fire: the
// sensor is as valid as without the rule.
func TestLitEarthBehindTheBusDoesNotBlind(t *testing.T) {
	const text = `name: digital shielded by the bus
epoch: "2026-03-20T00:00:00Z"
duration: 6h
step: 10s
orbit: {altitude_km: 550, ltan: "10:30"}
attitude: {law: nadir, point_axis: "+Z", align_axis: "+X"}
body:
  form_factor: 6U
  sensors:
    - {name: dss, kind: digital, boresight: [0.866, 0, -0.5], position_m: [0, 0, -0.2], half_angle_deg: 60, lit_earth_blind_depth_deg: DEPTH}
albedo: {model: uniform, value: 0.3}
`
	rule := runText(t, strings.Replace(text, "DEPTH", "3", 1))
	none := runText(t, strings.Replace(text, "DEPTH", "180", 1))
	s := rule.Nominal.Sensors[0]
	if s.LitEarthInViewFraction != 0 || s.BlindedFraction != 0 {
		t.Errorf("lit Earth in view %.3f, blinded %.3f: want 0 behind the bus", s.LitEarthInViewFraction, s.BlindedFraction)
	}
	if a, b := rule.Nominal.Estimators[0].ValidFraction, none.Nominal.Estimators[0].ValidFraction; a != b || !(a > 0.3) {
		t.Errorf("valid with the rule %.3f, without %.3f: want equal (and the sun seen)", a, b)
	}
}
