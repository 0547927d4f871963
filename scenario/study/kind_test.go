package study

import (
	"math"
	"strings"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/illum/sensor"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
	"codeberg.org/sunsight/sunsight/scenario"
)

// A sensor kind registered in illum/sensor alone is accepted by the scenario
// file with its own key and default, printed in the run record, refused on
// another kind, and built by the study: adding a kind needs no change in
// scenario or study.
func TestNewKindNeedsOnlyItsRegistryEntry(t *testing.T) {
	sensor.Register(sensor.KindInfo{
		Kind: "test-cutoff", Doc: "a cosine sensor with its own cut-off (test only)", Source: "closed form",
		HalfAngleDeg: 85,
		Params:       []sensor.Param{{Key: "cutoff_fraction", Default: 0.05, Min: 0, Max: 1, Allowed: "[0, 1]"}},
		Build: func(c sensor.Common, p sensor.Params) (sensor.Sensor, error) {
			return sensor.NewCosine(sensor.CosineSpec{Name: c.Name, Mount: c.Mount, HalfAngle: c.HalfAngle,
				Threshold: p.Num["cutoff_fraction"], Errors: c.Errors})
		},
	})
	const head = "orbit: {altitude_km: 500, ltan: \"10:30\"}\nbody:\n  sensors:\n"
	s, err := scenario.Parse([]byte(head+"    - {name: a, kind: test-cutoff, face: \"+Z\", cutoff_fraction: 0.2}\n    - {name: b, kind: test-cutoff, face: \"-Z\"}\n"), ".")
	if err != nil {
		t.Fatal(err)
	}
	if got := s.Body.Sensors[0].Params.Num["cutoff_fraction"]; got != 0.2 {
		t.Errorf("cutoff_fraction = %g, want 0.2", got)
	}
	rec := string(s.Record())
	if !strings.Contains(rec, "cutoff_fraction: 0.2") || !strings.Contains(rec, "cutoff_fraction: 0.05") || !strings.Contains(rec, "half_angle_deg: 85") {
		t.Errorf("record lacks the kind's keys and defaults:\n%s", rec)
	}
	arr, _, _, err := BuildSensors(s, s.Body.Sensors, "body.sensors")
	if err != nil {
		t.Fatal(err)
	}
	// Sun 80° off the boresight: cos 80° = 0.17 is below a 0.2 cut-off and
	// above the default 0.05 (closed form).
	sun := r3.Vec{X: math.Sin(80 * math.Pi / 180), Z: math.Cos(80 * math.Pi / 180)}
	if arr.Sensors()[0].Read(sun, sensor.SolarConstant, sensor.Albedo{}, nil).Valid {
		t.Error("cut-off 0.2: valid at cos θ = 0.17")
	}
	flipped := r3.Vec{X: sun.X, Z: -sun.Z}
	if !arr.Sensors()[1].Read(flipped, sensor.SolarConstant, sensor.Albedo{}, nil).Valid {
		t.Error("default cut-off 0.05: invalid at cos θ = 0.17")
	}
	_, err = scenario.Parse([]byte(head+"    - {name: a, kind: cosine, face: \"+Z\", cutoff_fraction: 0.2}\n"), ".")
	if err == nil || !strings.Contains(err.Error(), "does not apply to kind \"cosine\"; allowed for kind test-cutoff only") {
		t.Errorf("cutoff_fraction on a cosine sensor: %v", err)
	}
	_, err = scenario.Parse([]byte(head+"    - {name: a, kind: test-cutoff, face: \"+Z\", cutoff_fraction: 2}\n"), ".")
	if err == nil || !strings.Contains(err.Error(), "cutoff_fraction") {
		t.Errorf("cutoff_fraction 2: %v", err)
	}
}

// Every attitude law of the registry has a builder here, and no builder is
// left without a registered law.
func TestEveryLawHasABuilder(t *testing.T) {
	for _, l := range attitude.Laws() {
		if _, ok := lawBuilders[l.Name]; !ok {
			t.Errorf("law %q has no builder", l.Name)
		}
	}
	for name := range lawBuilders {
		if _, err := attitude.LookupLaw(name); err != nil {
			t.Errorf("builder %q: %v", name, err)
		}
	}
}
