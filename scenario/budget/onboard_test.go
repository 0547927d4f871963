package budget

import (
	"context"
	"testing"

	"codeberg.org/sunsight/sunsight/scenario"
)

// A layout with no sensor that can subtract a predicted albedo (a quadrant
// alone) gets no on-board correction row: it would repeat "as stated". The
// floor without albedo is still run.
func TestBudgetNoCorrectionWithoutASensorThatSubtracts(t *testing.T) {
	s, err := scenario.Parse([]byte(`name: quadrant alone
epoch: "2026-06-01T00:00:00Z"
duration: 2h
step: 20s
orbit: {altitude_km: 500, ltan: "10:30"}
attitude: {law: nadir}
albedo: {model: uniform, value: 0.3}
body:
  sensors:
    - {name: q, kind: quadrant, face: "-Z", errors: {noise_1sigma: 0.001}}
`), ".")
	if err != nil {
		t.Fatal(err)
	}
	rep, err := Study(context.Background(), s, StudyOptions{Units: 2, Workers: 1})
	if err != nil {
		t.Fatal(err)
	}
	if rep.CorrectedP95 != nil || rep.NoAlbedoP95 == nil {
		t.Errorf("corrected %v, floor %v: want no correction and a floor", rep.CorrectedP95, rep.NoAlbedoP95)
	}
}
