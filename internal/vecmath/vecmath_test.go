package vecmath

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Norm and Unit agree with gonum's r3.Norm and r3.Unit (the reference).
func TestMatchesGonum(t *testing.T) {
	for _, v := range []r3.Vec{{X: 3, Y: 4}, {X: -6378.137, Y: 1e-3, Z: 7000}, {X: 1e-9, Y: -2e-9, Z: 3e-9}} {
		if d := math.Abs(Norm(v) - r3.Norm(v)); d > 1e-15*r3.Norm(v) {
			t.Errorf("Norm(%v) = %v, r3.Norm %v", v, Norm(v), r3.Norm(v))
		}
		if d := r3.Norm(r3.Sub(Unit(v), r3.Unit(v))); d > 1e-15 {
			t.Errorf("Unit(%v) off by %g", v, d)
		}
	}
}
