package orbit

import (
	"errors"
	"fmt"
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// singularTol is the eccentricity (and inclination, rad) below which an orbit
// is treated as circular (equatorial): the perigee (node) is then undefined
// and the angle is measured from the node (x axis) instead.
const singularTol = 1e-11

// Conic describes any Keplerian conic (ellipse, parabola or hyperbola) by its
// semi-latus rectum and true anomaly, as the published element ↔ state
// algorithms do. Angles in radians. The circular and equatorial conventions
// are those of Elements: ArgPerigee = 0 and TrueAnomaly holds the argument of
// latitude for circular orbits; RAAN = 0 and ArgPerigee (or TrueAnomaly when
// also circular) is measured from the x axis for equatorial ones.
type Conic struct {
	SemiLatusRectumKm float64
	Eccentricity      float64
	Inclination       float64
	RAAN              float64
	ArgPerigee        float64
	TrueAnomaly       float64
}

// StateFromConic returns the EME2000 state of a conic about the Earth.
func StateFromConic(c Conic) State { return stateFromConic(c, MuEarth) }

// stateFromConic is Vallado 4th ed. (2013) Algorithm 10 (COE2RV) p. 118,
// Curtis 3rd ed. Algorithm 4.5: perifocal position and velocity rotated by
// R3(−Ω) R1(−i) R3(−ω).
func stateFromConic(c Conic, mu float64) State {
	p, e := c.SemiLatusRectumKm, c.Eccentricity
	sν, cν := math.Sincos(c.TrueAnomaly)
	// Vallado 4th ed. eq. (2-110)/(2-111) p. 118, perifocal frame.
	r := p / (1 + e*cν)
	k := math.Sqrt(mu / p)
	P, Q := perifocalAxes(c.Inclination, c.RAAN, c.ArgPerigee)
	return State{
		R: r3.Add(r3.Scale(r*cν, P), r3.Scale(r*sν, Q)),
		V: r3.Add(r3.Scale(-k*sν, P), r3.Scale(k*(e+cν), Q)),
	}
}

// perifocalAxes returns the unit vectors P (to perigee) and Q (90° ahead in
// the orbit plane) in the inertial frame: the first two columns of
// R3(−Ω) R1(−i) R3(−ω), Vallado 4th ed. eq. (3-31) p. 168.
func perifocalAxes(i, Ω, ω float64) (P, Q r3.Vec) {
	si, ci := math.Sincos(i)
	sΩ, cΩ := math.Sincos(Ω)
	sω, cω := math.Sincos(ω)
	P = r3.Vec{X: cΩ*cω - sΩ*sω*ci, Y: sΩ*cω + cΩ*sω*ci, Z: sω * si}
	Q = r3.Vec{X: -cΩ*sω - sΩ*cω*ci, Y: -sΩ*sω + cΩ*cω*ci, Z: cω * si}
	return P, Q
}

// ConicFromState returns the conic of an EME2000 state about the Earth.
func ConicFromState(s State) Conic { return conicFromState(s, MuEarth) }

// conicFromState is Vallado 4th ed. (2013) Algorithm 9 (RV2COE) p. 113,
// Curtis 3rd ed. Algorithm 4.2, with atan2 in place of acos and the special
// cases of Vallado p. 114 (argument of latitude, true longitude of perigee,
// true longitude).
func conicFromState(s State, mu float64) Conic {
	r, v := s.R, s.V
	rn := vecmath.Norm(r)
	h := r3.Cross(r, v) // Vallado eq. (2-81)
	hn := vecmath.Norm(h)
	// Vallado eq. (2-78): eccentricity vector.
	ev := r3.Scale(1/mu, r3.Sub(r3.Scale(r3.Norm2(v)-mu/rn, r), r3.Scale(r3.Dot(r, v), v)))
	e := vecmath.Norm(ev)
	p := hn * hn / mu
	i := math.Atan2(math.Hypot(h.X, h.Y), h.Z)
	// Node vector n = ẑ × h.
	n := r3.Vec{X: -h.Y, Y: h.X}
	nn := vecmath.Norm(n)
	equatorial := i < singularTol || math.Pi-i < singularTol
	circular := e < singularTol
	c := Conic{SemiLatusRectumKm: p, Eccentricity: e, Inclination: i}
	// Angles in the orbit plane are measured with atan2 against the in-plane
	// unit vector ĥ × x̂_ref, which gives the right quadrant in one step.
	ĥ := r3.Scale(1/hn, h)
	angle := func(from, to r3.Vec) float64 {
		return wrap2π(math.Atan2(r3.Dot(ĥ, r3.Cross(from, to)), r3.Dot(from, to)))
	}
	switch {
	case !equatorial && !circular:
		c.RAAN = wrap2π(math.Atan2(n.Y, n.X))
		c.ArgPerigee = angle(r3.Scale(1/nn, n), ev)
		c.TrueAnomaly = angle(ev, r)
	case !equatorial && circular:
		c.RAAN = wrap2π(math.Atan2(n.Y, n.X))
		c.TrueAnomaly = angle(r3.Scale(1/nn, n), r) // argument of latitude u
	case equatorial && !circular:
		// True longitude of perigee, measured from x in the sense of motion.
		c.ArgPerigee = angle(r3.Vec{X: 1}, ev)
		c.TrueAnomaly = angle(ev, r)
	default:
		c.TrueAnomaly = angle(r3.Vec{X: 1}, r) // true longitude λ_true
	}
	return c
}

// wrap2π returns x reduced to [0, 2π).
func wrap2π(x float64) float64 {
	x = math.Mod(x, 2*math.Pi)
	if x < 0 {
		x += 2 * math.Pi
	}
	if x >= 2*math.Pi {
		x = 0
	}
	return x
}

// State returns the EME2000 state of elliptic elements (0 ≤ e < 1, a > 0).
func (el Elements) State() State {
	E := EccentricAnomaly(el.MeanAnomaly, el.Eccentricity)
	return stateFromConic(Conic{
		SemiLatusRectumKm: el.SemiMajorAxisKm * (1 - el.Eccentricity*el.Eccentricity),
		Eccentricity:      el.Eccentricity,
		Inclination:       el.Inclination,
		RAAN:              el.RAAN,
		ArgPerigee:        el.ArgPerigee,
		TrueAnomaly:       TrueFromEccentric(E, el.Eccentricity),
	}, MuEarth)
}

// ErrNotElliptic is returned when a state is on a parabola or hyperbola.
var ErrNotElliptic = errors.New("orbit: state is not on an ellipse (e ≥ 1)")

// ElementsFromState returns the osculating elements of an elliptic state.
func ElementsFromState(s State) (Elements, error) {
	c := conicFromState(s, MuEarth)
	if c.Eccentricity >= 1 {
		return Elements{}, ErrNotElliptic
	}
	return elementsFromConic(c), nil
}

func elementsFromConic(c Conic) Elements {
	e := c.Eccentricity
	E := EccentricFromTrue(c.TrueAnomaly, e)
	return Elements{
		SemiMajorAxisKm: c.SemiLatusRectumKm / (1 - e*e),
		Eccentricity:    e,
		Inclination:     c.Inclination,
		RAAN:            c.RAAN,
		ArgPerigee:      c.ArgPerigee,
		// Kepler's equation, Vallado 4th ed. eq. (2-4) p. 65.
		MeanAnomaly: wrap2π(E - e*math.Sin(E)),
	}
}

// Validate reports elements that no propagator here accepts.
func (el Elements) Validate() error {
	switch {
	case !(el.SemiMajorAxisKm > 0) || math.IsInf(el.SemiMajorAxisKm, 0):
		return fmt.Errorf("orbit: semi-major axis %g km must be a positive number", el.SemiMajorAxisKm)
	case !(el.Eccentricity >= 0 && el.Eccentricity < 1):
		return fmt.Errorf("orbit: eccentricity %g must be in [0, 1)", el.Eccentricity)
	case !(el.Inclination >= 0 && el.Inclination <= math.Pi):
		return fmt.Errorf("orbit: inclination %g rad must be in [0, π]", el.Inclination)
	case math.IsNaN(el.RAAN) || math.IsInf(el.RAAN, 0) || math.IsNaN(el.ArgPerigee) ||
		math.IsInf(el.ArgPerigee, 0) || math.IsNaN(el.MeanAnomaly) || math.IsInf(el.MeanAnomaly, 0):
		return fmt.Errorf("orbit: RAAN, argument of perigee and mean anomaly must be finite")
	}
	if rp := el.SemiMajorAxisKm * (1 - el.Eccentricity); rp < RadiusEarthKm {
		return fmt.Errorf("orbit: perigee radius %.1f km is inside the Earth (radius %.3f km)", rp, RadiusEarthKm)
	}
	return nil
}
