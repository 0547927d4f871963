package sensor

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// Bodies is where the Moon and the Earth stand in body axes at one step, as
// the spacecraft sees them: what the Moon- and Earth-in-view shares and the
// blinding rule of the digital kind read. Angular radii are kept as their
// sines and cosines, so the cone tests below are dot products.
type Bodies struct {
	// MoonDir is the unit vector from the spacecraft to the Moon's centre
	// (topocentric: the spacecraft's offset from the Earth's centre moves
	// the Moon by up to about 1° in LEO); MoonSin, MoonCos the sine and
	// cosine of its angular radius; MoonLit its illuminated fraction (Meeus
	// 1998 (48.1), from the Earth's centre); MoonHidden says its whole disc
	// is behind the Earth's.
	MoonDir          r3.Vec
	MoonSin, MoonCos float64
	MoonLit          float64
	MoonHidden       bool
	// NadirDir is the unit vector to the Earth's centre; EarthSin = R/r and
	// EarthCos the sine and cosine of the Earth's angular radius (a sphere,
	// no atmosphere); EarthLit says the sub-satellite point is sunlit (the
	// sun above its horizon there: r·ŝ > 0).
	NadirDir           r3.Vec
	EarthSin, EarthCos float64
	EarthLit           bool
}

// Cone is a field of view for the tests of Bodies: a unit axis and the
// cosine and sine of a half-angle in [0°, 90°].
type Cone struct {
	Axis     r3.Vec
	Cos, Sin float64
}

// NewCone returns the cone of half-angle half (rad, [0, π/2]) about the unit
// axis.
func NewCone(axis r3.Vec, half float64) Cone {
	s, c := math.Sincos(half)
	return Cone{Axis: axis, Cos: c, Sin: s}
}

// reaches reports whether some of a disc of angular radius ρ (sine sρ,
// cosine cρ; ρ ≤ 90°) about the unit direction d is inside the cone: the
// angle from the axis to d is below half + ρ ≤ 180°, i.e. axis·d >
// cos(half + ρ).
func (c Cone) reaches(d r3.Vec, sρ, cρ float64) bool {
	return r3.Dot(c.Axis, d) > c.Cos*cρ-c.Sin*sρ
}

// inFront reports whether a disc of angular radius ρ > 0 (sine sρ) about
// the unit direction d reaches in front of the plane of outward normal n:
// the angle from n to d is below 90° + ρ, i.e. n·d > −sin ρ. A zero n (no
// plane) gives 0 > −sin ρ, true.
func inFront(d, n r3.Vec, sρ float64) bool {
	return r3.Dot(d, n) > -sρ
}

// MoonInCone reports whether some of the Moon's disc is inside the cone,
// not hidden by the Earth and in front of the mounting plane of outward
// normal face (zero: none).
func (b *Bodies) MoonInCone(c Cone, face r3.Vec) bool {
	return !b.MoonHidden && c.reaches(b.MoonDir, b.MoonSin, b.MoonCos) && r3.Dot(b.MoonDir, face) > -b.MoonSin
}

// LitEarthInCone reports whether some of the Earth's disc is inside the
// cone and in front of the mounting plane of outward normal face (zero:
// none) while the sub-satellite point is sunlit.
func (b *Bodies) LitEarthInCone(c Cone, face r3.Vec) bool {
	return b.EarthLit && c.reaches(b.NadirDir, b.EarthSin, b.EarthCos) && inFront(b.NadirDir, face, b.EarthSin)
}

// EarthDepth returns how far (rad) the Earth's disc reaches inside the cone
// of half-angle half about the unit boresight bore: half + the Earth's
// angular radius minus the angle from the boresight to nadir. It is
// positive when some of the disc is in the cone, and below 180°.
func (b *Bodies) EarthDepth(bore r3.Vec, half float64) float64 {
	θ := math.Atan2(r3.Norm(r3.Cross(bore, b.NadirDir)), r3.Dot(bore, b.NadirDir))
	return half + math.Atan2(b.EarthSin, b.EarthCos) - θ
}

// Blindable is a sensor kind whose reading the Moon or the lit Earth in its
// field of view can invalidate. Blinding says whether the unit has a rule
// that can ever act (its thresholds are not at their "never" ends);
// Blinded whether the rule acts at this step.
type Blindable interface {
	Blinding() bool
	Blinded(b Bodies) bool
}
