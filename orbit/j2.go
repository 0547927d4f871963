package orbit

import (
	"errors"
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// J2Rates returns the first-order secular rates (rad/s) of RAAN, argument of
// perigee and mean anomaly caused by J2 on MEAN elements el:
//
//	dΩ/dt = −(3/2) n J2 (R/p)² cos i
//	dω/dt = +(3/4) n J2 (R/p)² (5 cos² i − 1)
//	dM/dt = n + (3/4) n J2 (R/p)² √(1−e²) (3 cos² i − 1)
//
// Vallado 4th ed. (2013) eqs. (9-41) p. 650 (from memory for the page);
// Kozai 1959, AJ 64, 367; Brouwer 1959, AJ 64, 378. dM includes n.
func J2Rates(el Elements) (dRAAN, dArgP, dM float64) {
	a, e := el.SemiMajorAxisKm, el.Eccentricity
	n := math.Sqrt(MuEarth / (a * a * a))
	p := a * (1 - e*e)
	k := n * J2 * (RadiusEarthKm / p) * (RadiusEarthKm / p)
	c := math.Cos(el.Inclination)
	dRAAN = -1.5 * k * c
	dArgP = 0.75 * k * (5*c*c - 1)
	dM = n + 0.75*k*math.Sqrt(1-e*e)*(3*c*c-1)
	return dRAAN, dArgP, dM
}

// ErrNoSunSync is returned when no inclination gives a sun-synchronous node rate.
var ErrNoSunSync = errors.New("orbit: no sun-synchronous inclination exists for this orbit (J2 node rate too weak; lower the orbit)")

// SunSyncInclination returns the inclination (rad, > 90°) whose secular J2
// node rate equals the mean sun's rate SunMeanMotion. It starts from the
// first-order closed form
//
//	cos i = −Ω̇☉ / ((3/2) n J2 (R/p)²)
//
// (from J2Rates' dΩ/dt; Vallado 4th ed. §11.4 discusses the same design)
// and refines it on the second-order rate of J2RatesSecondOrder, which
// J2Mean uses: about 0.006° higher at 550 km. It fails with ErrNoSunSync when
// |cos i| would exceed 1 (a above about 12 350 km for circular orbits).
func SunSyncInclination(aKm, e float64) (float64, error) {
	if !(aKm > 0) || !(e >= 0 && e < 1) {
		return 0, errors.New("orbit: sun-synchronous inclination needs a > 0 and 0 ≤ e < 1")
	}
	n := math.Sqrt(MuEarth / (aKm * aKm * aKm))
	p := aKm * (1 - e*e)
	c := -SunMeanMotion / (1.5 * n * J2 * (RadiusEarthKm / p) * (RadiusEarthKm / p))
	if c < -1 {
		return 0, ErrNoSunSync
	}
	// Refine on the second-order node rate that J2Mean uses (Newton on
	// cos i; the J2² term moves i by about 0.01°), so the orbit keeps the
	// mean sun's rate to 1e-12 relative.
	el := Elements{SemiMajorAxisKm: aKm, Eccentricity: e}
	for range 20 {
		el.Inclination = math.Acos(c)
		f, _, _ := J2RatesSecondOrder(el)
		h := 1e-7
		el.Inclination = math.Acos(c + h)
		f2, _, _ := J2RatesSecondOrder(el)
		step := (f - SunMeanMotion) / ((f2 - f) / h)
		c -= step
		if c < -1 {
			return 0, ErrNoSunSync
		}
		if math.Abs(step) < 1e-15 {
			break
		}
	}
	return math.Acos(c), nil
}

// accelJ2 returns the point-mass plus J2 acceleration (km/s²) at r:
// a = −μ r/|r|³ + (3/2) J2 μ R²/|r|⁵ · (x(5z²/r² − 1), y(5z²/r² − 1), z(5z²/r² − 3)),
// Vallado 4th ed. eq. (8-29) p. 594 (from memory for the number); Curtis 3rd
// ed. eq. (10.30). With j2 false only the point mass acts.
func accelJ2(r r3.Vec, j2 bool) r3.Vec {
	r2 := r.X*r.X + r.Y*r.Y + r.Z*r.Z
	rn := math.Sqrt(r2)
	k0 := -MuEarth / (r2 * rn)
	if !j2 {
		return r3.Vec{X: k0 * r.X, Y: k0 * r.Y, Z: k0 * r.Z}
	}
	k := 1.5 * J2 * MuEarth * RadiusEarthKm * RadiusEarthKm / (r2 * r2 * rn)
	z2 := 5 * r.Z * r.Z / r2
	return r3.Vec{
		X: k0*r.X + k*r.X*(z2-1),
		Y: k0*r.Y + k*r.Y*(z2-1),
		Z: k0*r.Z + k*r.Z*(z2-3),
	}
}

// J2Mean propagates MEAN elements with the second-order secular J2 rates and
// returns the Keplerian state of the mean elements at t (no short-period
// terms); see the package doc for what that means for accuracy.
type J2Mean struct {
	el           Elements
	dΩ, dω, dM   float64
	n, b, si, ci float64
}

// NewJ2Mean returns the secular-J2 propagator of mean elements at t = 0,
// with the secular rates to second order in J2 (J2RatesSecondOrder).
func NewJ2Mean(mean Elements) *J2Mean {
	dΩ, dω, dM := J2RatesSecondOrder(mean)
	si, ci := math.Sincos(mean.Inclination)
	a := mean.SemiMajorAxisKm
	return &J2Mean{el: mean, dΩ: dΩ, dω: dω, dM: dM, n: math.Sqrt(MuEarth / (a * a * a)), b: math.Sqrt(1 - mean.Eccentricity*mean.Eccentricity), si: si, ci: ci}
}

// MeanElementsAt returns the mean elements at t (angles not wrapped).
func (p *J2Mean) MeanElementsAt(t float64) Elements {
	el := p.el
	el.RAAN += p.dΩ * t
	el.ArgPerigee += p.dω * t
	el.MeanAnomaly += p.dM * t
	return el
}

// StateAt returns the mean-element Keplerian state at t; any t costs the same.
func (p *J2Mean) StateAt(t float64) State {
	a, e := p.el.SemiMajorAxisKm, p.el.Eccentricity
	E := EccentricAnomaly(p.el.MeanAnomaly+p.dM*t, e)
	sΩ, cΩ := math.Sincos(p.el.RAAN + p.dΩ*t)
	sω, cω := math.Sincos(p.el.ArgPerigee + p.dω*t)
	ci, si := p.ci, p.si
	P := r3.Vec{X: cΩ*cω - sΩ*sω*ci, Y: sΩ*cω + cΩ*sω*ci, Z: sω * si}
	Q := r3.Vec{X: -cΩ*sω - sΩ*cω*ci, Y: -sΩ*sω + cΩ*cω*ci, Z: cω * si}
	// The velocity is the Keplerian one of the mean ellipse (mean motion n);
	// it differs from the time derivative of the returned position by the
	// secular rates, a relative 1e-3 in LEO.
	return ellipseState(a, e, p.b, p.n, E, P, Q)
}

// fillReseed is the number of steps after which Fill restarts its
// recurrences from exact sines and cosines.
const fillReseed = 1024

// Fill writes the states at t0 + k·dt into dst: the states of StateAt, with
// the node, the argument of perigee and (on a circular orbit, where it is
// the eccentric anomaly) the mean anomaly advanced by incremental rotation —
// (cos, sin) of each angle turned by the (cos, sin) of its step — instead of
// a sine and cosine per step. The recurrence restarts from exact values
// every fillReseed steps; each turn adds a few rounding errors of 1e-16, so
// the angles stay within about 1e-11 rad of StateAt's (the rounding of
// StateAt's own angle after a year) and the position within 1e-7 km
// (TestJ2MeanFillMatchesStateAt, a year at 10 s).
func (p *J2Mean) Fill(dst []State, t0, dt float64) {
	a, e := p.el.SemiMajorAxisKm, p.el.Eccentricity
	circular := e == 0
	sdΩ, cdΩ := math.Sincos(p.dΩ * dt)
	sdω, cdω := math.Sincos(p.dω * dt)
	sdM, cdM := math.Sincos(p.dM * dt)
	var sΩ, cΩ, sω, cω, sM, cM float64
	ci, si := p.ci, p.si
	for k := range dst {
		t := t0 + float64(k)*dt
		if k%fillReseed == 0 {
			sΩ, cΩ = math.Sincos(p.el.RAAN + p.dΩ*t)
			sω, cω = math.Sincos(p.el.ArgPerigee + p.dω*t)
			sM, cM = math.Sincos(p.el.MeanAnomaly + p.dM*t)
		} else {
			sΩ, cΩ = sΩ*cdΩ+cΩ*sdΩ, cΩ*cdΩ-sΩ*sdΩ
			sω, cω = sω*cdω+cω*sdω, cω*cdω-sω*sdω
			sM, cM = sM*cdM+cM*sdM, cM*cdM-sM*sdM
		}
		P := r3.Vec{X: cΩ*cω - sΩ*sω*ci, Y: sΩ*cω + cΩ*sω*ci, Z: sω * si}
		Q := r3.Vec{X: -cΩ*sω - sΩ*cω*ci, Y: -sΩ*sω + cΩ*cω*ci, Z: cω * si}
		if circular {
			dst[k] = ellipseStateSC(a, 0, 1, p.n, sM, cM, P, Q)
			continue
		}
		dst[k] = ellipseState(a, e, p.b, p.n, EccentricAnomaly(p.el.MeanAnomaly+p.dM*t, e), P, Q)
	}
}
