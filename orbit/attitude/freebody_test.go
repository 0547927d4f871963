package attitude

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// a 3U-like asymmetric body (invented values, kg·m²) with small products of
// inertia.
var testInertia = Inertia{
	{0.030, 0.001, -0.0005},
	{0.001, 0.032, 0.0008},
	{-0.0005, 0.0008, 0.008},
}

// Torque-free motion conserves the rotational kinetic energy ½ωᵀJω and the
// inertial angular momentum Aᵀ·J·ω (Euler's equations; Wertz 1978 §16.1,
// from memory): both to 1e-9 relative over a day, for rates of 1 to 20 °/s
// about random axes. The body rate vector moves in the body (nutation), so
// the fixed-axis Tumble would not conserve them.
func TestFreeTumbleInvariants(t *testing.T) {
	worstE, worstH := 0.0, 0.0
	for i, rateDeg := range []float64{1, 5, 10, 20} {
		d := DrawTumble(uint64(10+i), rateDeg*math.Pi/180, rateDeg*math.Pi/180)
		f, err := NewFreeTumble(d.Q0, d.Rate, testInertia)
		if err != nil {
			t.Fatal(err)
		}
		E0 := testInertia.Energy(d.Rate)
		H0 := testInertia.Momentum(f.Q0, d.Rate)
		moved := 0.0
		for k := 1; k <= 24; k++ {
			A, w := f.State(float64(k) * 3600)
			worstE = math.Max(worstE, math.Abs(testInertia.Energy(w)-E0)/E0)
			worstH = math.Max(worstH, r3.Norm(r3.Sub(testInertia.Momentum(A, w), H0))/r3.Norm(H0))
			moved = math.Max(moved, r3.Norm(r3.Sub(w, d.Rate))/r3.Norm(d.Rate))
		}
		if moved < 1e-3 {
			t.Errorf("%g°/s: body rates moved by %.2g only: no nutation", rateDeg, moved)
		}
	}
	t.Logf("over a day: worst relative energy error %.2e, momentum error %.2e", worstE, worstH)
	if worstE > 1e-9 || worstH > 1e-9 {
		t.Errorf("invariants drift: energy %.2e, momentum %.2e (want ≤ 1e-9)", worstE, worstH)
	}
}

// An axisymmetric body (I₁ = I₂ = I, I₃) has the closed-form solution
// ω₃ constant and the transverse rate turning in the body at
// λ = (I₃ − I)/I · ω₃: ω₁ + iω₂ = (ω₁₀ + iω₂₀)·e^{iλt} (Wertz 1978 §16.2;
// Markley & Crassidis 2014 §3.3; both from memory). The integration
// matches it to 1e-9 rad/s over six hours; and for a sphere it is the
// fixed-axis spin of Tumble.
func TestFreeTumbleAxisymmetricClosedForm(t *testing.T) {
	const I, I3 = 0.03, 0.01
	J := Inertia{{I, 0, 0}, {0, I, 0}, {0, 0, I3}}
	w0 := r3.Vec{X: 0.05, Y: -0.02, Z: 0.12}
	f, err := NewFreeTumble(Identity, w0, J)
	if err != nil {
		t.Fatal(err)
	}
	λ := (I3 - I) / I * w0.Z
	worst := 0.0
	for _, tt := range []float64{10, 100, 1000, 3600, 21600} {
		_, w := f.State(tt)
		s, c := math.Sincos(λ * tt)
		want := r3.Vec{X: w0.X*c - w0.Y*s, Y: w0.X*s + w0.Y*c, Z: w0.Z}
		worst = math.Max(worst, r3.Norm(r3.Sub(w, want)))
	}
	t.Logf("axisymmetric: worst |ω − closed form| = %.2e rad/s", worst)
	if worst > 1e-9 {
		t.Errorf("axisymmetric body rates off the closed form by %.2e rad/s", worst)
	}
	sphere := Inertia{{0.02, 0, 0}, {0, 0.02, 0}, {0, 0, 0.02}}
	d := DrawTumble(3, 0.1, 0.1)
	g, err := NewFreeTumble(d.Q0, d.Rate, sphere)
	if err != nil {
		t.Fatal(err)
	}
	for _, tt := range []float64{7, 500, 5000} {
		a := g.Attitude(tt, orbitState0, r3.Vec{})
		b := d.Attitude(tt, orbitState0, r3.Vec{})
		if e := rotationAngle(a, b); e > 1e-8 {
			t.Errorf("sphere at t=%g s: %.2e rad from the fixed-axis spin", tt, e)
		}
	}
}

// Going back in time restarts from a checkpoint and gives the same state.
func TestFreeTumbleRandomAccess(t *testing.T) {
	d := DrawTumble(5, 0.1, 0.2)
	f, _ := NewFreeTumble(d.Q0, d.Rate, testInertia)
	late := f.Attitude(20000, orbitState0, r3.Vec{})
	early := f.Attitude(300, orbitState0, r3.Vec{})
	g := f.Clone()
	if e := rotationAngle(g.Attitude(20000, orbitState0, r3.Vec{}), late); e > 1e-12 {
		t.Errorf("clone differs by %.2e rad", e)
	}
	h, _ := NewFreeTumble(d.Q0, d.Rate, testInertia)
	if e := rotationAngle(h.Attitude(300, orbitState0, r3.Vec{}), early); e > 1e-12 {
		t.Errorf("restart differs by %.2e rad", e)
	}
}

func TestInertiaCheck(t *testing.T) {
	for _, J := range []Inertia{
		{{1, 0, 0}, {0, 1, 0}, {0, 0, 3}},   // triangle inequality broken
		{{1, 0, 0}, {0, -1, 0}, {0, 0, 1}},  // not positive definite
		{{1, 0.1, 0}, {0, 1, 0}, {0, 0, 1}}, // not symmetric
	} {
		if J.Check() == nil {
			t.Errorf("%v accepted", J)
		}
	}
	if err := testInertia.Check(); err != nil {
		t.Error(err)
	}
}

var orbitState0 orbit.State

// rotationAngle is the angle of the rotation between a and b, rad.
func rotationAngle(a, b r3.Rotation) float64 {
	d := quat.Mul(quat.Number(b), quat.Conj(quat.Number(a)))
	return 2 * math.Atan2(math.Sqrt(d.Imag*d.Imag+d.Jmag*d.Jmag+d.Kmag*d.Kmag), math.Abs(d.Real))
}
