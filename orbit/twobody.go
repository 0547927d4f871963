package orbit

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Period returns the Keplerian period 2π√(a³/μ) in seconds of an orbit with
// semi-major axis aKm (Vallado 4th ed. eq. (1-26) p. 31).
func Period(aKm float64) float64 { return 2 * math.Pi * math.Sqrt(aKm*aKm*aKm/MuEarth) }

// TwoBody propagates a Keplerian ellipse analytically (Kepler's equation).
type TwoBody struct {
	el   Elements
	n    float64 // mean motion, rad/s
	b    float64 // semi-minor axis factor √(1−e²)
	P, Q r3.Vec  // perifocal axes
}

// NewTwoBody returns the two-body propagator of osculating elements el at t = 0.
// The elements are assumed valid (see Elements.Validate).
func NewTwoBody(el Elements) *TwoBody {
	P, Q := perifocalAxes(el.Inclination, el.RAAN, el.ArgPerigee)
	a := el.SemiMajorAxisKm
	return &TwoBody{el: el, n: math.Sqrt(MuEarth / (a * a * a)), b: math.Sqrt(1 - el.Eccentricity*el.Eccentricity), P: P, Q: Q}
}

// StateAt returns the state t seconds after the epoch; it costs one solution
// of Kepler's equation whatever t is.
func (p *TwoBody) StateAt(t float64) State {
	E := EccentricAnomaly(p.el.MeanAnomaly+p.n*t, p.el.Eccentricity)
	return ellipseState(p.el.SemiMajorAxisKm, p.el.Eccentricity, p.b, p.n, E, p.P, p.Q)
}

// Fill writes the states at t0 + k·dt into dst.
func (p *TwoBody) Fill(dst []State, t0, dt float64) {
	for k := range dst {
		dst[k] = p.StateAt(t0 + float64(k)*dt)
	}
}

// ellipseState is the position and velocity on an ellipse from the
// eccentric anomaly: r = a(cos E − e) P + a√(1−e²) sin E Q,
// v = n a /(1 − e cos E) (−sin E P + √(1−e²) cos E Q)
// (Montenbruck & Gill 2000, eqs. (2.34) and (2.36) p. 28, from memory).
func ellipseState(a, e, b, n, E float64, P, Q r3.Vec) State {
	sE, cE := math.Sincos(E)
	return ellipseStateSC(a, e, b, n, sE, cE, P, Q)
}

// ellipseStateSC is ellipseState given sin E and cos E.
func ellipseStateSC(a, e, b, n, sE, cE float64, P, Q r3.Vec) State {
	x, y := a*(cE-e), a*b*sE
	k := n * a / (1 - e*cE)
	vx, vy := -k*sE, k*b*cE
	return State{
		R: r3.Vec{X: x*P.X + y*Q.X, Y: x*P.Y + y*Q.Y, Z: x*P.Z + y*Q.Z},
		V: r3.Vec{X: vx*P.X + vy*Q.X, Y: vx*P.Y + vy*Q.Y, Z: vx*P.Z + vy*Q.Z},
	}
}
