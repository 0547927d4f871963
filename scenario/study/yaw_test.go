package study

import (
	"context"
	"math"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
	"codeberg.org/sunsight/sunsight/scenario/sim"
)

// A yaw-steered nadir run (align_to: sun) keeps the sun in the body XZ
// plane, so the ±Y sensors never see it, and its albedo equals the cell
// integral at every step (the LVLH albedo table, made for an attitude fixed
// in LVLH and used from 100 000 steps, does not apply to it).
func TestNadirYawSteeringRun(t *testing.T) {
	text := `
duration: 28h
step: 1s
orbit: {altitude_km: 550, ltan: "10:30"}
attitude: {law: nadir, align_to: sun}
albedo: {model: uniform, value: 0.3}
body:
  sensors:
    - {name: px, kind: cosine, face: "+X"}
    - {name: mx, kind: cosine, face: "-X"}
    - {name: py, kind: cosine, face: "+Y"}
    - {name: my, kind: cosine, face: "-Y"}
    - {name: pz, kind: cosine, face: "+Z"}
    - {name: mz, kind: cosine, face: "-Z"}
`
	s, err := scenario.Parse([]byte(text), ".")
	if err != nil {
		t.Fatal(err)
	}
	cfg, err := Config(s)
	if err != nil {
		t.Fatal(err)
	}
	res, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	for _, sn := range res.Nominal.Sensors {
		if (sn.Name == "py" || sn.Name == "my") && sn.InViewFraction != 0 {
			t.Errorf("%s sees the sun %.3f of the time; yaw steering keeps it in the XZ plane", sn.Name, sn.InViewFraction)
		}
	}
	cfg.NoAlbedoTable = true
	ref, err := sim.Run(context.Background(), cfg)
	if err != nil {
		t.Fatal(err)
	}
	a, b := res.Headline().P95AlbedoPartDeg, ref.Headline().P95AlbedoPartDeg
	if math.IsNaN(a) || math.IsNaN(b) {
		t.Fatalf("no valid estimate (%g, %g)", a, b)
	}
	t.Logf("p95 albedo part %.4f° (as run), %.4f° (cell integral at every step)", a, b)
	if math.Abs(a-b) > 0.02 {
		t.Errorf("p95 albedo part %.4f° against %.4f° from the cell integral", a, b)
	}
}
