package sensor

import (
	"testing"

	"gonum.org/v1/gonum/spatial/r3"
)

// Closed form: a 1/σ²-weighted mean of two unit vectors 2δ apart with equal
// σ lies midway; Combined adds the exact least-squares cube direction.
func TestTwoAxisAndCombinedWeighting(t *testing.T) {
	c := cube(t, Errors{})
	m, _ := FaceMount(FacePlusZ, 0, FaceNone, 0)
	d1, _ := NewDigital(DigitalSpec{Name: "d1", Mount: m, HalfAngle: 60 * deg, Sigma: 0.1 * deg})
	d2, _ := NewDigital(DigitalSpec{Name: "d2", Mount: m, HalfAngle: 60 * deg, Sigma: 0.1 * deg})
	a, err := NewArray(append(c.Sensors(), d1, d2)...)
	if err != nil {
		t.Fatal(err)
	}
	s := sunAt(10*deg, 20*deg)
	r := make([]Reading, a.Len())
	a.Read(r, s, SolarConstant, nil, nil)
	for _, e := range []Estimator{TwoAxis{}, Combined{}} {
		got := e.Estimate(a, r)
		if !got.Valid || angle(got.Dir, s) > 1e-12 {
			t.Errorf("%s: %+v, error %.3g", e.Name(), got, angle(got.Dir, s))
		}
	}
	if n := (Combined{}).Estimate(a, r).N; n != 5 {
		t.Errorf("combined used %d sensors, want 2 digital + 3 lit cosine", n)
	}
	// Perturb the two digital readings symmetrically about s (rotations about one axis normal to s).
	r[6].Dir = r3.Rotate(s, 0.01, r3.Cross(s, r3.Vec{X: 1}))
	r[7].Dir = r3.Rotate(s, -0.01, r3.Cross(s, r3.Vec{X: 1}))
	if got := (TwoAxis{}).Estimate(a, r); angle(got.Dir, s) > 1e-12 {
		t.Errorf("two-axis mean off by %.3g rad, want midway", angle(got.Dir, s))
	}
}
