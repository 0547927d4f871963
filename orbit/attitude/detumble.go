package attitude

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
)

// Detumble is a body whose rate decays exponentially with time constant
// Tau about a fixed body axis: ω(t) = Rate·e^(−t/Tau), so the angle turned
// is |Rate|·Tau·(1 − e^(−t/Tau)) and A(t) = exp(−θ(t)·ω̂/2) ⊗ Q0 for
// A = body ← ECI (the fixed-axis kinematics of Tumble with the turned
// angle in place of |ω|·t).
//
// The exponential decay is the linear-regime behaviour of a B-dot
// magnetic detumbling controller, whose rate error decays at a rate set by
// the gain and the mean field (Stickler & Alfriend, J. Spacecraft 13(5),
// 1976; Avanzini & Giulietti, J. Guid. Control Dyn. 35(4), 2012; both from
// memory). It needs no geomagnetic field model, which the tool does not
// have; a time constant taken from the controller's own analysis or test
// puts its outcome in. It does not model the slow tail of a real B-dot
// controller about the field line, nor nutation.
type Detumble struct {
	Q0   r3.Rotation // body ← ECI at t = 0
	Rate r3.Vec      // body rates at t = 0, rad/s
	Tau  float64     // s, > 0
}

// DrawDetumble draws the start of a detumble as DrawTumble draws a tumble
// (uniform attitude, isotropic axis, rate magnitude uniform on
// [minRate, maxRate] rad/s) and lets it decay with time constant tau (s).
func DrawDetumble(seed uint64, minRate, maxRate, tau float64) Detumble {
	d := DrawTumble(seed, minRate, maxRate)
	return Detumble{Q0: d.Q0, Rate: d.Rate, Tau: tau}
}

// Attitude implements Law.
func (l Detumble) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	w := vecmath.Norm(l.Rate)
	if w == 0 {
		return offsetOrIdentity(l.Q0)
	}
	θ := w * l.Tau * -math.Expm1(-t/l.Tau)
	return then(offsetOrIdentity(l.Q0), frameTurn(θ, r3.Scale(1/w, l.Rate)))
}

// BodyRate returns the body rates at t (rad/s).
func (l Detumble) BodyRate(t float64) r3.Vec { return r3.Scale(math.Exp(-t/l.Tau), l.Rate) }

// TimeToRate returns when the rate magnitude falls to bound (rad/s):
// Tau·ln(|Rate|/bound), or 0 when it starts at or below the bound.
func (l Detumble) TimeToRate(bound float64) float64 {
	w := vecmath.Norm(l.Rate)
	if w <= bound {
		return 0
	}
	return l.Tau * math.Log(w/bound)
}

// BodyRate returns the (constant) body rates of a fixed-axis tumble, so a
// detumble can start from them.
func (l Tumble) BodyRate(float64) r3.Vec { return l.Rate }
