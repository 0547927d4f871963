package attitude

import (
	"math"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/orbit"
)

// The detumble law's rate is ω₀·e^(−t/τ) about a fixed body axis, so the
// angle turned is ω₀τ(1 − e^(−t/τ)) (closed form: the integral of the rate)
// and the rate falls to ω_b at τ·ln(ω₀/ω_b).
func TestDetumbleClosedForm(t *testing.T) {
	d := Detumble{Q0: FromEuler(Seq321, 0.3, -0.2, 1.1), Rate: r3.Vec{X: 0.06, Y: -0.08}, Tau: 600}
	ω0 := 0.1
	if got := r3.Norm(d.BodyRate(0)); math.Abs(got-ω0) > 1e-15 {
		t.Fatalf("rate at 0 = %g, want %g", got, ω0)
	}
	for _, tt := range []float64{0, 10, 300, 600, 3000} {
		want := ω0 * math.Exp(-tt/600)
		if got := r3.Norm(d.BodyRate(tt)); math.Abs(got-want) > 1e-15 {
			t.Errorf("rate at %g s = %g, want %g", tt, got, want)
		}
		θ := AngleBetween(d.Q0, d.Attitude(tt, orbit.State{}, r3.Vec{}))
		wantθ := math.Mod(ω0*600*(1-math.Exp(-tt/600)), 2*math.Pi)
		if wantθ > math.Pi {
			wantθ = 2*math.Pi - wantθ
		}
		if math.Abs(θ-wantθ) > 1e-9 {
			t.Errorf("angle at %g s = %g rad, want %g", tt, θ, wantθ)
		}
	}
	if got, want := d.TimeToRate(0.01), 600*math.Log(10); math.Abs(got-want) > 1e-9 {
		t.Errorf("time to 0.01 rad/s = %g s, want %g", got, want)
	}
	if got := d.TimeToRate(0.2); got != 0 {
		t.Errorf("time to a bound above the start rate = %g, want 0", got)
	}
}

// Property: the attitude at t + h equals the attitude at t turned by the
// rate integrated over [t, t + h]: finite differences of the attitude give
// the stated body rate (definition of the body rate).
func TestDetumbleRateMatchesAttitude(t *testing.T) {
	d := DrawDetumble(7, 0.05, 0.2, 900)
	for _, tt := range []float64{0, 50, 900, 4000} {
		h := 1e-3
		θ := AngleBetween(d.Attitude(tt, orbit.State{}, r3.Vec{}), d.Attitude(tt+h, orbit.State{}, r3.Vec{}))
		if got, want := θ/h, r3.Norm(d.BodyRate(tt+h/2)); math.Abs(got-want) > 1e-6*want+1e-12 {
			t.Errorf("t = %g: turn rate %g rad/s, want %g", tt, got, want)
		}
	}
}
