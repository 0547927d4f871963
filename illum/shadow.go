package illum

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// Radii used by the shadow models. They are defined here, with their
// sources, so that illum depends on no other sunsight package.
const (
	// EarthRadiusKm is the WGS 84 equatorial radius (NIMA TR8350.2, 3rd ed.
	// 2000, table 3.1; from memory).
	EarthRadiusKm = 6378.137
	// SunRadiusKm is the solar radius used for shadow cones (Montenbruck &
	// Gill 2000, §3.4.2; from memory).
	SunRadiusKm = 696000.0
)

// Region names the part of the Earth's shadow a point is in.
type Region int

const (
	// Sunlit: the whole solar disc is visible.
	Sunlit Region = iota
	// Penumbra: the Earth hides part of the solar disc.
	Penumbra
	// Umbra: the Earth hides the whole solar disc.
	Umbra
	// Annular: the Earth is seen inside the solar disc (only beyond the
	// umbra cone's tip, about 1.38e6 km behind the Earth).
	Annular
)

// String returns the region's lower-case name.
func (r Region) String() string {
	switch r {
	case Sunlit:
		return "sunlit"
	case Penumbra:
		return "penumbra"
	case Umbra:
		return "umbra"
	case Annular:
		return "annular"
	}
	return "unknown"
}

// ShadowCylindrical returns 1 when rSat (km, geocentric) is lit and 0 when it
// is inside the Earth's cylindrical shadow, for a sun in direction sunDir
// (need not be unit length). The point is in shadow when r·ŝ < 0 and its
// distance from the shadow axis |r − (r·ŝ)ŝ| is below the Earth radius
// (Vallado, Fundamentals of Astrodynamics and Applications, 4th ed. 2013,
// Algorithm 34 SHADOW, cylindrical option; from memory).
func ShadowCylindrical(rSat, sunDir r3.Vec) float64 {
	s := vecmath.Unit(sunDir)
	along := r3.Dot(rSat, s)
	if along >= 0 {
		return 1
	}
	perp := r3.Sub(rSat, r3.Scale(along, s))
	if r3.Norm2(perp) < EarthRadiusKm*EarthRadiusKm {
		return 0
	}
	return 1
}

// discAngles returns the apparent solar radius a, the apparent Earth radius
// b and the angular separation c of their centres seen from rSat, all in
// radians (Montenbruck & Gill 2000, §3.4.2; equation numbers from memory,
// (3.85)–(3.87)). rSun is the geocentric sun position in km.
func discAngles(rSat, rSun r3.Vec) (a, b, c float64) {
	d := r3.Sub(rSun, rSat)
	dn := vecmath.Norm(d)
	rn := vecmath.Norm(rSat)
	a = math.Asin(min(1, SunRadiusKm/dn))
	b = math.Asin(min(1, EarthRadiusKm/rn))
	cosc := -r3.Dot(rSat, d) / (rn * dn)
	c = math.Acos(max(-1, min(1, cosc)))
	return a, b, c
}

// visibleFraction is the shadow function ν: the visible fraction of a solar
// disc of angular radius a whose centre is c from the centre of an occulting
// disc of radius b, discs taken flat in angle space (Montenbruck & Gill 2000,
// §3.4.2, shadow function; equation numbers not checked).
func visibleFraction(a, b, c float64) (float64, Region) {
	switch {
	case c >= a+b:
		return 1, Sunlit
	case c <= b-a:
		return 0, Umbra
	case c <= a-b:
		return 1 - (b*b)/(a*a), Annular
	}
	// Overlap (lens) area of two discs whose centres are c apart; x is the
	// distance from the sun's centre to the chord through the intersections.
	x := (c*c + a*a - b*b) / (2 * c)
	y := math.Sqrt(max(0, a*a-x*x))
	A := a*a*math.Acos(clamp1(x/a)) + b*b*math.Acos(clamp1((c-x)/b)) - c*y
	ν := 1 - A/(math.Pi*a*a)
	return max(0, min(1, ν)), Penumbra
}

func clamp1(x float64) float64 { return max(-1, min(1, x)) }

// ShadowConical returns the visible fraction of the solar disc, lit in
// [0, 1], seen from rSat (km, geocentric, EME2000) with the sun at rSun (km,
// geocentric, true distance), and the shadow region. The Earth is a sphere of
// radius EarthRadiusKm; the atmosphere is ignored. It allocates nothing.
//
// Points that are clearly sunlit or clearly in the umbra are decided by the
// cone test of clearRegion, without inverse trigonometry; the rest go
// through the disc angles (shadowConicalExact). Both give the same result.
func ShadowConical(rSat, rSun r3.Vec) (lit float64, region Region) {
	if reg, ok := clearRegion(rSat, rSun); ok {
		if reg == Umbra {
			return 0, Umbra
		}
		return 1, Sunlit
	}
	return shadowConicalExact(rSat, rSun)
}

// shadowConicalExact is ShadowConical through the disc angles for every
// point. The tests hold the fast path to it.
func shadowConicalExact(rSat, rSun r3.Vec) (lit float64, region Region) {
	a, b, c := discAngles(rSat, rSun)
	return visibleFraction(a, b, c)
}

// Bounds of the region where clearRegion decides.
const (
	// clearMinRadius: |r| ≥ 1.001 Rₑ, i.e. at least 6.4 km above the surface.
	clearMinRadius = 1.001 * EarthRadiusKm
	// clearSunFactor: the sun is at least 100·(R☉ + |r|) away, which holds
	// from the surface to beyond the umbra tip (1.38e6 km) for the true sun
	// distance, 0.983–1.017 au.
	clearSunFactor = 100.0
	// clearMargin is the band half-width around each cone surface, as a
	// fraction of |r|, left to the exact computation. Moving a point by δ
	// across a cone changes the separation of the solar and Earth limbs by
	// δ·cos f·(1/ℓₑ − 1/ℓ☉) ≈ δ/|r| rad, with ℓₑ, ℓ☉ the distances to the
	// Earth and sun tangent points (ℓₑ < |r|), so the band is ≈ 1e-5 rad wide
	// in the limb separation. Rounding in discAngles is below 2e-8 rad even
	// where acos is worst conditioned (own estimate: √(2·2⁻⁵²)).
	clearMargin = 1e-5
)

// clearRegion returns Sunlit or Umbra and ok when rSat is clearly so; ok is
// false near the cone surfaces, in the penumbra, inside the Earth, close to
// its surface and far from it.
//
// Shadow cones (Montenbruck & Gill 2000, §3.4.2, dual-cone geometry; closed
// form): with D = |rSun|, the penumbra cone has its apex D·Rₑ/(R☉+Rₑ) in
// front of the Earth and half-angle f₁, sin f₁ = (R☉+Rₑ)/D; the umbra cone
// has its apex D·Rₑ/(R☉−Rₑ) behind the Earth and half-angle f₂,
// sin f₂ = (R☉−Rₑ)/D. At a distance x behind the Earth along −ŝ their radii
// are
//
//	ρ₁(x) = Rₑ/cos f₁ + x·tan f₁,  ρ₂(x) = Rₑ/cos f₂ − x·tan f₂.
//
// A point with x > 0 is sunlit outside the penumbra cone and in the umbra
// inside the umbra cone (before its apex). The cones touch the Earth at
// x = −Rₑ sin f₁ and x = +Rₑ sin f₂; with |r| ≥ 1.001 Rₑ and sin f₂ < 0.01 no
// point within x < Rₑ sin f₂ is within ρ₂, so only the part of the umbra cone
// beyond its tangent circle is ever used.
//
// On the day side (r·ŝ ≥ 0) the sun is more than π/2 − asin(|r|/D) from the
// nadir, the solar disc radius a ≤ asin(R☉/(D−|r|)) and the Earth's
// b ≤ asin(1/1.001) = π/2 − 0.0447, so c − (a+b) > 0.0447 − 0.0100 − 0.0100
// rad under the bounds above: always sunlit (closed form).
func clearRegion(rSat, rSun r3.Vec) (reg Region, ok bool) {
	r2 := r3.Norm2(rSat)
	if r2 < clearMinRadius*clearMinRadius {
		return 0, false
	}
	rn := math.Sqrt(r2)
	D := math.Sqrt(r3.Norm2(rSun))
	if D < clearSunFactor*(SunRadiusKm+rn) {
		return 0, false
	}
	x := -r3.Dot(rSat, rSun) / D // distance behind the Earth along the shadow axis
	if x <= 0 {
		return Sunlit, true
	}
	ρ2 := r2 - x*x // squared distance from the shadow axis
	δ := clearMargin * rn
	s1 := (SunRadiusKm + EarthRadiusKm) / D
	c1 := math.Sqrt(1 - s1*s1)
	if ρ1 := (EarthRadiusKm+x*s1)/c1 + δ; ρ2 > ρ1*ρ1 {
		return Sunlit, true
	}
	s2 := (SunRadiusKm - EarthRadiusKm) / D
	c2 := math.Sqrt(1 - s2*s2)
	if ρ := (EarthRadiusKm-x*s2)/c2 - δ; ρ > 0 && ρ2 < ρ*ρ {
		return Umbra, true
	}
	return 0, false
}

// shadowMargins returns two functions of position that are continuous in time
// and change sign at the shadow boundaries: penumbra = c − (a+b) is negative
// inside the penumbra cone (partial or total shadow), umbra = c − (b−a) is
// negative inside the umbra.
func shadowMargins(rSat, rSun r3.Vec) (penumbra, umbra float64) {
	a, b, c := discAngles(rSat, rSun)
	return c - (a + b), c - (b - a)
}

// cylinderMargins returns the cylindrical shadow's margin twice (it has no
// penumbra): θ − asin(Rₑ/|r|), θ being the angle between r and the anti-sun
// direction −ŝ. It is continuous in time and negative exactly where
// ShadowCylindrical is 0: r·ŝ < 0 and |r| sin θ < Rₑ ⇔ θ < asin(Rₑ/|r|)
// (closed form).
func cylinderMargins(rSat, rSun r3.Vec) (penumbra, umbra float64) {
	anti := r3.Scale(-1, rSun)
	θ := math.Atan2(vecmath.Norm(r3.Cross(rSat, anti)), r3.Dot(rSat, anti))
	m := θ - math.Asin(min(1, EarthRadiusKm/vecmath.Norm(rSat)))
	return m, m
}
