package attitude

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"sunsight/orbit"
)

// Law gives the spacecraft attitude along the trajectory.
type Law interface {
	// Attitude returns body ← ECI at t seconds after the epoch, for the
	// spacecraft state and the sun unit vector (ECI).
	Attitude(t float64, s orbit.State, sunDir r3.Vec) r3.Rotation
}

// EclipseAware is a Law whose attitude also depends on whether the
// spacecraft is in eclipse. The simulation loop tells it with a plain bool.
type EclipseAware interface {
	Law
	AttitudeInEclipse(t float64, s orbit.State, sunDir r3.Vec, inEclipse bool) r3.Rotation
}

// At evaluates l, passing the eclipse flag when l is EclipseAware.
// It allocates nothing; a loop may also type-assert once outside the loop.
func At(l Law, t float64, s orbit.State, sunDir r3.Vec, inEclipse bool) r3.Rotation {
	if e, ok := l.(EclipseAware); ok {
		return e.AttitudeInEclipse(t, s, sunDir, inEclipse)
	}
	return l.Attitude(t, s, sunDir)
}

var (
	unitX = r3.Vec{X: 1}
	unitY = r3.Vec{Y: 1}
	unitZ = r3.Vec{Z: 1}
)

func orDefault(v, def r3.Vec) r3.Vec {
	if v == (r3.Vec{}) {
		return def
	}
	return vecUnit(v)
}

func offsetOrIdentity(q r3.Rotation) r3.Rotation {
	if q == (r3.Rotation{}) {
		return Identity
	}
	return q
}

// alignPair maps primaryECI exactly onto primaryBody and puts secondaryECI
// in the plane of the two body axes; if the secondary is parallel to the
// primary it falls back to a fixed perpendicular of the primary.
func alignPair(pb, pi, sb, si r3.Vec) r3.Rotation {
	if q, ok := triad(pb, pi, sb, si); ok {
		return q
	}
	q, _ := triad(pb, pi, sb, perpendicular(vecUnit(pi)))
	return q
}

// Nadir is LVLH pointing: NadirAxis (body) toward −r/|r|, VelocityAxis
// (body) toward the velocity within the plane perpendicular to nadir.
// The zero value is the trade default: +Z to nadir, +X along velocity
// (the LVLH frame of Vallado 2013 §3.3 names these axes as well, from
// memory), no offset. Offset, if set, is applied after the LVLH alignment
// (body ← nominal body), e.g. a fixed pitch bias.
type Nadir struct {
	NadirAxis    r3.Vec      // body axis to nadir; default +Z
	VelocityAxis r3.Vec      // body axis toward velocity; default +X
	Offset       r3.Rotation // body ← nominal body; zero means none
}

// Attitude implements Law.
func (n Nadir) Attitude(_ float64, s orbit.State, _ r3.Vec) r3.Rotation {
	q := alignPair(orDefault(n.NadirAxis, unitZ), r3.Scale(-1, s.R), orDefault(n.VelocityAxis, unitX), s.V)
	return then(q, offsetOrIdentity(n.Offset))
}

// SunReference names the direction the secondary axis of Sun pointing is
// turned toward.
type SunReference int

const (
	// TowardOrbitNormal turns the secondary axis toward r × v.
	TowardOrbitNormal SunReference = iota
	// TowardNadir turns the secondary axis toward −r.
	TowardNadir
	// TowardInertial turns the secondary axis toward Sun.InertialDir.
	TowardInertial
)

// Sun points SunAxis (body) at the sun and turns SecondaryAxis (body) as
// close as possible to the reference direction. With SpinRate ≠ 0 the body
// spins about the sun line by Phase + SpinRate·t from that orientation.
// The zero value is the common safe-mode default: +Z to the sun, +X toward
// the orbit normal, no spin (common practice, no source). When the
// reference is parallel to the sun line (β = ±90° for the orbit normal) a
// fixed perpendicular of the sun line is used instead.
type Sun struct {
	SunAxis       r3.Vec       // body axis to the sun; default +Z
	SecondaryAxis r3.Vec       // default +X
	Reference     SunReference // default TowardOrbitNormal
	InertialDir   r3.Vec       // ECI, used with TowardInertial
	SpinRate      float64      // rad/s about the sun line (right-handed about SunAxis)
	Phase         float64      // rad at t = 0
}

// Attitude implements Law.
func (l Sun) Attitude(t float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	var ref r3.Vec
	switch l.Reference {
	case TowardNadir:
		ref = r3.Scale(-1, s.R)
	case TowardInertial:
		ref = l.InertialDir
	default:
		ref = r3.Cross(s.R, s.V)
	}
	axis := orDefault(l.SunAxis, unitZ)
	q := alignPair(axis, sunDir, orDefault(l.SecondaryAxis, unitX), ref)
	if l.SpinRate == 0 && l.Phase == 0 {
		return q
	}
	return then(q, frameTurn(l.Phase+l.SpinRate*t, axis))
}

// Inertial holds a fixed body ← ECI attitude.
type Inertial struct {
	Q r3.Rotation // body ← ECI; zero means identity
}

// InertialFromEuler returns the fixed attitude of three frame rotations
// (radians) in the named sequence, see FromEuler.
func InertialFromEuler(seq EulerSequence, φ1, φ2, φ3 float64) Inertial {
	return Inertial{Q: FromEuler(seq, φ1, φ2, φ3)}
}

// Attitude implements Law.
func (l Inertial) Attitude(float64, orbit.State, r3.Vec) r3.Rotation {
	return offsetOrIdentity(l.Q)
}

// Spin keeps BodyAxis along the inertial direction Axis and turns the body
// about it at Rate (rad/s, right-handed about Axis) from Phase at t = 0.
// At zero phase a fixed perpendicular of BodyAxis lies along a fixed
// perpendicular of Axis (each the cross product with the coordinate axis
// least aligned with it). BodyAxis defaults to +Z; Axis defaults to ECI +Z.
type Spin struct {
	Axis     r3.Vec  // ECI spin axis
	BodyAxis r3.Vec  // body spin axis; default +Z
	Rate     float64 // rad/s
	Phase    float64 // rad
}

// Attitude implements Law.
func (l Spin) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	b := orDefault(l.BodyAxis, unitZ)
	a := orDefault(l.Axis, unitZ)
	q := alignPair(b, a, perpendicular(b), perpendicular(a))
	return then(q, frameTurn(l.Phase+l.Rate*t, b))
}

// Tumble is torque-free rotation at constant body rates:
// A(t) = exp(−ωt/2) ⊗ A₀ for A = body ← ECI, which is q(t) = q₀ ⊗ exp(ωt/2)
// for the ECI ← body quaternion (Markley & Crassidis 2014 §3.3, from
// memory). This solves Euler's equations exactly only for rotation about a
// principal axis or a body with equal moments of inertia; a real tumbling
// body nutates (its rate vector moves in the body). For visibility
// statistics over many orbits the difference is second order (common
// practice, no source).
type Tumble struct {
	Q0   r3.Rotation // body ← ECI at t = 0
	Rate r3.Vec      // body rates, rad/s
}

// NewTumble draws a uniformly random initial attitude (Shoemake 1992) and
// a body rate vector of uniformly random direction whose magnitude is
// uniform on [0, maxRate] (rad/s), from a PCG source seeded with seed.
func NewTumble(seed uint64, maxRate float64) Tumble {
	src := newSource(seed, 0x7475_6d62_6c65) // "tumble"
	q0 := shoemake(src.Float64(), src.Float64(), src.Float64())
	// Uniform direction: z uniform on [−1, 1], longitude uniform
	// (Archimedes' hat-box theorem, closed form).
	z := 2*src.Float64() - 1
	φ := 2 * math.Pi * src.Float64()
	ρ := math.Sqrt(1 - z*z)
	dir := r3.Vec{X: ρ * math.Cos(φ), Y: ρ * math.Sin(φ), Z: z}
	return Tumble{Q0: q0, Rate: r3.Scale(maxRate*src.Float64(), dir)}
}

// Attitude implements Law.
func (l Tumble) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	w := vecNorm(l.Rate)
	if w == 0 {
		return offsetOrIdentity(l.Q0)
	}
	return then(offsetOrIdentity(l.Q0), frameTurn(w*t, r3.Scale(1/w, l.Rate)))
}

// Schedule flies one law in sunlight and another in eclipse (for example
// sun pointing in sunlight, inertial hold in eclipse). Called through Law
// it behaves as in sunlight; the loop passes the eclipse state through
// AttitudeInEclipse (or At).
type Schedule struct {
	Sunlit  Law
	Eclipse Law
}

// Attitude implements Law (sunlit branch).
func (l Schedule) Attitude(t float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	return l.Sunlit.Attitude(t, s, sunDir)
}

// AttitudeInEclipse implements EclipseAware.
func (l Schedule) AttitudeInEclipse(t float64, s orbit.State, sunDir r3.Vec, inEclipse bool) r3.Rotation {
	if inEclipse {
		return At(l.Eclipse, t, s, sunDir, true)
	}
	return At(l.Sunlit, t, s, sunDir, false)
}
