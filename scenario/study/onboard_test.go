package study

import (
	"strings"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// An on-board albedo correction on a layout with no sensor that can
// subtract a prediction (here a quadrant alone) would change nothing: it
// is refused, naming the key; with a cosine sensor beside it, it is built.
func TestOnboardNeedsASensorThatSubtracts(t *testing.T) {
	base := `name: onboard
epoch: "2026-06-01T00:00:00Z"
duration: 3h
step: 10s
orbit: {altitude_km: 500, ltan: "10:30"}
attitude: {law: nadir}
albedo: {model: uniform, value: 0.3, onboard: {model: uniform, value: 0.2}}
body:
  sensors:
    - {name: q, kind: quadrant, face: "-Z"}
`
	s, err := scenario.Parse([]byte(base), ".")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Prepare(s); err == nil || !strings.Contains(err.Error(), "albedo.onboard: no sensor of the file can subtract") {
		t.Errorf("quadrant alone: %v; want a refusal", err)
	}
	s, err = scenario.Parse([]byte(base+`    - {name: c, kind: cosine, face: "+X"}
`), ".")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Prepare(s); err != nil {
		t.Errorf("with a cosine sensor: %v", err)
	}
}

// A cosine sensor at threshold 0 beside an on-board correction is refused:
// the residue of a dark sensor would count it lit by its sign.
func TestOnboardRefusesAZeroThreshold(t *testing.T) {
	s, err := scenario.Parse([]byte(`name: onboard
epoch: "2026-06-01T00:00:00Z"
duration: 3h
step: 10s
orbit: {altitude_km: 500, ltan: "10:30"}
attitude: {law: nadir}
albedo: {model: uniform, value: 0.3, onboard: {model: uniform, value: 0.3, cells: 1000}}
body:
  sensors:
    - {name: c, kind: cosine, face: "+X", threshold: 0}
`), ".")
	if err != nil {
		t.Fatal(err)
	}
	if _, err := Prepare(s); err == nil || !strings.Contains(err.Error(), "body.sensors[0] (c).threshold: 0 with albedo.onboard") {
		t.Errorf("threshold 0: %v; want a refusal", err)
	}
}
