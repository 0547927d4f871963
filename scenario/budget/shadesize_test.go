package budget

import (
	"context"
	"slices"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// A shade that is not square (shade_size_mm_1sigma on a quadrant sensor)
// is a budget source of its own: listed, in mm, and with an effect on the
// p95 error — switched off, the error of a unit with only that error is
// zero up to the estimator's resolution; switched on, it is not (the
// measured tangent scales by (w − g)/(w' − g), see the sensor package;
// the sensor is tilted 20° so the sun is off its boresight, where the
// scale matters).
func TestShadeSizeIsASource(t *testing.T) {
	s, err := scenario.Parse([]byte(`orbit: {altitude_km: 500, ltan: "10:30"}
duration: 2h
attitude: {law: sun}
estimators: [two-axis]
body:
  sensors:
    - {name: q, kind: quadrant, face: "+Z", tilt_deg: 20, tilt_toward: "+X", shade_height_mm: 2, shade_size_mm_1sigma: 0.1}
`), ".")
	if err != nil {
		t.Fatal(err)
	}
	r, err := NewRunner(s, Options{Units: 8})
	if err != nil {
		t.Fatal(err)
	}
	if !slices.Contains(r.Sources(), ShadeSize) {
		t.Fatalf("sources %v lack %v", r.Sources(), ShadeSize)
	}
	if v, unit := r.Sigma(ShadeSize, 1); v != 0.1 || unit != "mm" {
		t.Errorf("σ at scale 1: %g %s, want 0.1 mm", v, unit)
	}
	var on, off Case
	on.Scale[ShadeSize] = 1
	mOn, err := r.Run(context.Background(), on)
	if err != nil {
		t.Fatal(err)
	}
	mOff, err := r.Run(context.Background(), off)
	if err != nil {
		t.Fatal(err)
	}
	if !(mOn.P95Deg() > 10*mOff.P95Deg()) || !(mOn.P95Deg() > 1e-3) {
		t.Errorf("p95 with the shade size error %.6g°, without %.6g°: want an effect", mOn.P95Deg(), mOff.P95Deg())
	}
}
