package attitude

import (
	"math"

	"gonum.org/v1/gonum/num/quat"
	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit"
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
	return vecmath.Unit(v)
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
	q, _ := triad(pb, pi, sb, perpendicular(vecmath.Unit(pi)))
	return q
}

// alignAxes returns alignPair(primaryBody, pi, secondaryBody, si), zero body
// axes meaning the defaults +Z and +X, by a shorter road: the two TRIAD
// triads, the matrix C = Σ b_k i_kᵀ (Black 1964; Shuster & Oh 1981 eq. 9,
// from memory) and its quaternion by Shepperd's method, with one square
// root and one division per normalisation, and small values (vectors,
// not a 3×3 array) that the compiler keeps in registers.
// For the default axes the body triad is b = (+Z, +Y, −X) (triadBasis of
// +Z, +X: +Z × +X = +Y, +Z × +Y = −X), so the rows of C are −i3, i2, i1.
// Where either triad is near degenerate it calls alignPair itself.
func alignAxes(primaryBody, pi, secondaryBody, si r3.Vec) r3.Rotation {
	if m, ok := alignRows(primaryBody, pi, secondaryBody, si); ok {
		return orthoToQuat(m[0], m[1], m[2])
	}
	return alignPair(orDefault(primaryBody, unitZ), pi, orDefault(secondaryBody, unitX), si)
}

// alignRows is the matrix of alignAxes (rows: the body axes in ECI), built
// directly; ok is false in the degenerate cases alignPair handles.
func alignRows(primaryBody, pi, secondaryBody, si r3.Vec) (Rows, bool) {
	i1, i2, i3, ok := unitPair(pi, si)
	if (primaryBody == (r3.Vec{}) || primaryBody == unitZ) && (secondaryBody == (r3.Vec{}) || secondaryBody == unitX) {
		// The default axes: the rows are the inertial triad itself.
		if ok {
			return Rows{r3.Scale(-1, i3), i2, i1}, true
		}
	} else if b1, b2, b3, okB := unitPair(axisOr(primaryBody, unitZ), axisOr(secondaryBody, unitX)); ok && okB {
		row := func(x1, x2, x3 float64) r3.Vec { // Σ_k b_k[r]·i_k
			return r3.Add(r3.Add(r3.Scale(x1, i1), r3.Scale(x2, i2)), r3.Scale(x3, i3))
		}
		return Rows{row(b1.X, b2.X, b3.X), row(b1.Y, b2.Y, b3.Y), row(b1.Z, b2.Z, b3.Z)}, true
	}
	return Rows{}, false
}

// Rows is an attitude as a direction-cosine matrix: Rows[i] is body axis i
// in ECI, so Rows[i]·v is component i in body axes of the ECI vector v. It
// is the matrix of the rotation a Law returns (ToDCM).
type Rows [3]r3.Vec

// RowsLaw is a Law that also builds its matrix directly, without the
// quaternion a step loop would turn back into a matrix.
type RowsLaw interface {
	Law
	Rows(t float64, s orbit.State, sunDir r3.Vec) Rows
}

// RowsOf returns the matrix of a rotation (quatToDCM).
func RowsOf(q r3.Rotation) Rows {
	d := quatToDCM(q)
	return Rows{{X: d[0][0], Y: d[0][1], Z: d[0][2]}, {X: d[1][0], Y: d[1][1], Z: d[1][2]}, {X: d[2][0], Y: d[2][1], Z: d[2][2]}}
}

// axisOr is v, or def when v is zero. Unlike orDefault it does not
// normalise: unitPair does, and its parallel test does not depend on |s|.
func axisOr(v, def r3.Vec) r3.Vec {
	if v == (r3.Vec{}) {
		return def
	}
	return v
}

// unitPair is triadBasis(p, s) with the same operations, bit for bit, save
// the parallel test: it is made on squares, without a third square root,
// and with a factor 2 to spare (|p̂ × s|² > 2·10⁻²⁴·|s|²), so ok is false
// wherever triadBasis fails, and also in a thin band (10⁻¹² < |p̂ × s|/|s| ≤
// 1.4·10⁻¹²) where it passes; the caller falls back to alignPair there.
func unitPair(p, s r3.Vec) (t1, t2, t3 r3.Vec, ok bool) {
	p2 := r3.Norm2(p)
	if p2 == 0 {
		return t1, t2, t3, false
	}
	t1 = r3.Scale(1/math.Sqrt(p2), p)
	c := r3.Cross(t1, s)
	c2 := r3.Norm2(c)
	if !(c2 > 2e-24*r3.Norm2(s)) { // also false for NaN
		return t1, t2, t3, false
	}
	t2 = r3.Scale(1/math.Sqrt(c2), c)
	return t1, t2, r3.Cross(t1, t2), true
}

// orthoToQuat is dcmToQuat for the matrix with rows c0, c1, c2, orthonormal
// to rounding as alignAxes builds it: the same four branches of Shepperd's
// method (Shepperd 1978, from memory) with one division, and without the
// final renormalisation, which would change the result by rounding only
// (the tests hold |q| to 1 within 1e-15).
func orthoToQuat(c0, c1, c2 r3.Vec) r3.Rotation {
	tr := c0.X + c1.Y + c2.Z
	var q r3.Rotation
	switch {
	case tr >= c0.X && tr >= c1.Y && tr >= c2.Z:
		w := 0.5 * math.Sqrt(1+tr) // 4w² = 1 + tr
		f := 0.25 / w
		q = r3.Rotation{Real: w, Imag: f * (c2.Y - c1.Z), Jmag: f * (c0.Z - c2.X), Kmag: f * (c1.X - c0.Y)}
	case c0.X >= c1.Y && c0.X >= c2.Z:
		x := 0.5 * math.Sqrt(1+c0.X-c1.Y-c2.Z) // 4x² = 1 + 2C₁₁ − tr
		f := 0.25 / x
		q = r3.Rotation{Real: f * (c2.Y - c1.Z), Imag: x, Jmag: f * (c0.Y + c1.X), Kmag: f * (c0.Z + c2.X)}
	case c1.Y >= c2.Z:
		y := 0.5 * math.Sqrt(1-c0.X+c1.Y-c2.Z)
		f := 0.25 / y
		q = r3.Rotation{Real: f * (c0.Z - c2.X), Imag: f * (c0.Y + c1.X), Jmag: y, Kmag: f * (c1.Z + c2.Y)}
	default:
		z := 0.5 * math.Sqrt(1-c0.X-c1.Y+c2.Z)
		f := 0.25 / z
		q = r3.Rotation{Real: f * (c1.X - c0.Y), Imag: f * (c0.Z + c2.X), Jmag: f * (c1.Z + c2.Y), Kmag: z}
	}
	return canonical(q)
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
	// YawToSun steers yaw: VelocityAxis is turned toward the sun's
	// projection on the plane perpendicular to nadir instead of the
	// velocity, so the sun stays in the plane of the two axes (yaw steering
	// of a nadir pointer; it flips by 180° where the sun crosses the
	// zenith or nadir line, as flight yaw steering does).
	YawToSun bool
}

// secondary is the ECI direction VelocityAxis is turned toward.
func (n Nadir) secondary(s orbit.State, sunDir r3.Vec) r3.Vec {
	if n.YawToSun {
		return sunDir
	}
	return s.V
}

// Attitude implements Law.
func (n Nadir) Attitude(_ float64, s orbit.State, sunDir r3.Vec) r3.Rotation {
	q := alignAxes(n.NadirAxis, r3.Scale(-1, s.R), n.VelocityAxis, n.secondary(s, sunDir))
	if n.Offset == (r3.Rotation{}) {
		return q
	}
	return then(q, n.Offset)
}

// Rows implements RowsLaw: the matrix of Attitude, built from the axes.
func (n Nadir) Rows(t float64, s orbit.State, sun r3.Vec) Rows {
	if n.Plain() {
		if m, ok := nadirRows(s.R, s.V); ok {
			return m
		}
	}
	if n.Offset == (r3.Rotation{}) {
		if m, ok := alignRows(n.NadirAxis, r3.Scale(-1, s.R), n.VelocityAxis, n.secondary(s, sun)); ok {
			return m
		}
	}
	return RowsOf(n.Attitude(t, s, sun))
}

// Plain reports whether n has the default axes (+Z to nadir, +X toward
// the velocity), no offset and no yaw steering: its Rows are then
// NadirRows wherever those exist, so a step loop that decides this once
// may call NadirRows itself, without the interface call and the copy of
// the law per step.
func (n Nadir) Plain() bool {
	return n.Offset == (r3.Rotation{}) && !n.YawToSun && isAxis(n.NadirAxis, unitZ) && isAxis(n.VelocityAxis, unitX)
}

// NadirRows is the matrix of a Plain nadir law at the state (r, v);
// false where it does not exist (r = 0 or r ∥ v), and Rows then takes
// the general path.
func NadirRows(r, v r3.Vec) (Rows, bool) { return nadirRows(r, v) }

// isAxis reports whether a body axis is def or zero (the default).
func isAxis(v, def r3.Vec) bool { return v == (r3.Vec{}) || v == def }

// nadirRows is alignRows(+Z, −r, +X, v) written out for the default axes:
// the same operations in the same order (so the same numbers,
// TestNadirRowsWrittenOut), without the calls and the copies of the
// general path, which cost as much as the arithmetic.
func nadirRows(r, v r3.Vec) (Rows, bool) {
	px, py, pz := -1*r.X, -1*r.Y, -1*r.Z
	p2 := px*px + py*py + pz*pz
	if p2 == 0 {
		return Rows{}, false
	}
	f := 1 / math.Sqrt(p2)
	t1 := r3.Vec{X: f * px, Y: f * py, Z: f * pz}
	c := r3.Vec{X: t1.Y*v.Z - t1.Z*v.Y, Y: t1.Z*v.X - t1.X*v.Z, Z: t1.X*v.Y - t1.Y*v.X}
	c2 := c.X*c.X + c.Y*c.Y + c.Z*c.Z
	if !(c2 > 2e-24*(v.X*v.X+v.Y*v.Y+v.Z*v.Z)) {
		return Rows{}, false
	}
	g := 1 / math.Sqrt(c2)
	t2 := r3.Vec{X: g * c.X, Y: g * c.Y, Z: g * c.Z}
	t3 := r3.Vec{X: t1.Y*t2.Z - t1.Z*t2.Y, Y: t1.Z*t2.X - t1.X*t2.Z, Z: t1.X*t2.Y - t1.Y*t2.X}
	return Rows{{X: -1 * t3.X, Y: -1 * t3.Y, Z: -1 * t3.Z}, t2, t1}, true
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
	q := alignAxes(l.SunAxis, sunDir, l.SecondaryAxis, ref)
	if l.SpinRate == 0 && l.Phase == 0 {
		return q
	}
	return then(q, frameTurn(l.Phase+l.SpinRate*t, orDefault(l.SunAxis, unitZ)))
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

// SpinFrom returns the spin about the body axis bodyAxis at rate (rad/s)
// whose attitude at t = 0 is q0 (body ← ECI): the inertial axis is where q0
// puts the body axis, and the phase is the turn about it that brings the
// zero-phase attitude onto q0, so the whole starting attitude is kept.
func SpinFrom(q0 r3.Rotation, bodyAxis r3.Vec, rate float64) Spin {
	b := vecmath.Unit(orDefault(bodyAxis, unitZ))
	l := Spin{Axis: Inverse(q0).Rotate(b), BodyAxis: b, Rate: rate}
	z := l.Attitude(0, orbit.State{}, r3.Vec{})
	// q0 = then(z, frameTurn(φ, b)), so frameTurn(φ, b) = q0 ⊗ z̄, whose
	// vector part is sin(−φ/2)·b.
	r := quat.Mul(quat.Number(q0), quat.Conj(quat.Number(z)))
	l.Phase = -2 * math.Atan2(r.Imag*b.X+r.Jmag*b.Y+r.Kmag*b.Z, r.Real)
	return l
}

// Attitude implements Law.
func (l Spin) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	b := orDefault(l.BodyAxis, unitZ)
	a := orDefault(l.Axis, unitZ)
	q := alignPair(b, a, perpendicular(b), perpendicular(a))
	return then(q, frameTurn(l.Phase+l.Rate*t, b))
}

// Tumble is a fixed-axis spin: rotation at constant body rates,
// A(t) = exp(−ωt/2) ⊗ A₀ for A = body ← ECI, which is q(t) = q₀ ⊗ exp(ωt/2)
// for the ECI ← body quaternion (Markley & Crassidis 2014 §3.3, from
// memory). This solves Euler's equations exactly only for rotation about a
// principal axis or a body with equal moments of inertia; a real tumbling
// body nutates (its rate vector moves in the body): FreeTumble integrates
// Euler's equations for a given inertia tensor.
type Tumble struct {
	Q0   r3.Rotation // body ← ECI at t = 0
	Rate r3.Vec      // body rates, rad/s
}

// NewTumble draws a uniformly random initial attitude (Shoemake 1992) and
// a body rate vector of uniformly random direction whose magnitude is
// uniform on [0, maxRate] (rad/s), from a PCG source seeded with seed.
func NewTumble(seed uint64, maxRate float64) Tumble { return DrawTumble(seed, 0, maxRate) }

// DrawTumble draws a uniformly random initial attitude (Shoemake 1992) and
// a body rate vector of uniformly random (isotropic) direction whose
// magnitude is uniform on [minRate, maxRate] (rad/s), from a PCG source
// seeded with seed. With minRate 0 it draws what NewTumble draws.
func DrawTumble(seed uint64, minRate, maxRate float64) Tumble {
	src := newSource(seed, 0x7475_6d62_6c65) // "tumble"
	q0 := shoemake(src.Float64(), src.Float64(), src.Float64())
	// Uniform direction: z uniform on [−1, 1], longitude uniform
	// (Archimedes' hat-box theorem, closed form).
	z := 2*src.Float64() - 1
	φ := 2 * math.Pi * src.Float64()
	ρ := math.Sqrt(1 - z*z)
	dir := r3.Vec{X: ρ * math.Cos(φ), Y: ρ * math.Sin(φ), Z: z}
	return Tumble{Q0: q0, Rate: r3.Scale(minRate+(maxRate-minRate)*src.Float64(), dir)}
}

// Attitude implements Law.
func (l Tumble) Attitude(t float64, _ orbit.State, _ r3.Vec) r3.Rotation {
	w := vecmath.Norm(l.Rate)
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
