package sensor

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Seeing the sun is the nominal reading from direct sun against the
// threshold: a cosine sensor with threshold 0.05 sees the sun up to
// acos 0.05 = 87.134° off its boresight (closed form), never edge-on
// whatever the rounding, and a drawn unit with large dark offsets answers
// as the nominal one (the error model is off).
func TestSeesSunIsASignalAboveThreshold(t *testing.T) {
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	c, err := NewCosine(CosineSpec{Name: "c", Mount: m, HalfAngle: 90 * deg, Threshold: 0.05, Errors: Errors{DarkSigma: 0.3}})
	if err != nil {
		t.Fatal(err)
	}
	edge := math.Acos(0.05)
	at := func(θ float64) r3.Vec { return r3.Vec{X: math.Sin(θ), Z: math.Cos(θ)} }
	if !c.SeesSun(at(edge-1e-6)) || c.SeesSun(at(edge+1e-6)) {
		t.Errorf("cosine threshold edge not at %.4f°", edge/deg)
	}
	zero, _ := NewCosine(CosineSpec{Name: "z", Mount: m, HalfAngle: 90 * deg})
	for _, ε := range []float64{0, 1e-17, -1e-17, 1e-9, -1e-9} {
		d := r3.Vec{X: 1, Z: ε}
		if c.SeesSun(d) || zero.SeesSun(d) {
			t.Errorf("edge-on sun (z = %g) is seen", ε)
		}
	}
	drawn := c.Draw(rand.New(rand.NewPCG(1, 2)))
	for θ := 0.0; θ < math.Pi; θ += 0.01 {
		if drawn.SeesSun(at(θ)) != c.SeesSun(at(θ)) {
			t.Fatalf("drawn unit answers differently at %.2f°", θ/deg)
		}
	}
	q, err := NewQuadrant(QuadrantSpec{Name: "q", Mount: m, ApertureSide: 2, Height: 1, CellSide: 2, Gap: 0.1, Threshold: 0.05, Sigma: deg,
		Errors: Errors{DarkSigma: 0.2}})
	if err != nil {
		t.Fatal(err)
	}
	if !q.SeesSun(r3.Vec{X: 0.1, Z: 1}) || q.SeesSun(r3.Vec{X: 1}) || q.SeesSun(r3.Vec{Z: -1}) {
		t.Error("quadrant: seen on the boresight, not edge-on or behind")
	}
	if qd := q.Draw(rand.New(rand.NewPCG(3, 4))); qd.SeesSun(r3.Vec{X: 0.1, Z: 1}) != q.SeesSun(r3.Vec{X: 0.1, Z: 1}) {
		t.Error("quadrant: drawn unit answers differently")
	}
	d, err := NewDigital(DigitalSpec{Name: "d", Mount: m, HalfAngle: 60 * deg, Sigma: 0.1 * deg, MinIrradiance: 0.1 * SolarConstant})
	if err != nil {
		t.Fatal(err)
	}
	if !d.SeesSun(at(59*deg)) || d.SeesSun(at(61*deg)) {
		t.Error("digital: field-of-view edge not at 60°")
	}
}
