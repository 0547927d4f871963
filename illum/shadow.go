package illum

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
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
	s := vecUnit(sunDir)
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
	dn := vecNorm(d)
	rn := vecNorm(rSat)
	a = math.Asin(math.Min(1, SunRadiusKm/dn))
	b = math.Asin(math.Min(1, EarthRadiusKm/rn))
	cosc := -r3.Dot(rSat, d) / (rn * dn)
	c = math.Acos(math.Max(-1, math.Min(1, cosc)))
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
	y := math.Sqrt(math.Max(0, a*a-x*x))
	A := a*a*math.Acos(clamp1(x/a)) + b*b*math.Acos(clamp1((c-x)/b)) - c*y
	ν := 1 - A/(math.Pi*a*a)
	return math.Max(0, math.Min(1, ν)), Penumbra
}

func clamp1(x float64) float64 { return math.Max(-1, math.Min(1, x)) }

// ShadowConical returns the visible fraction of the solar disc, lit in
// [0, 1], seen from rSat (km, geocentric, EME2000) with the sun at rSun (km,
// geocentric, true distance), and the shadow region. The Earth is a sphere of
// radius EarthRadiusKm; the atmosphere is ignored. It allocates nothing.
func ShadowConical(rSat, rSun r3.Vec) (lit float64, region Region) {
	a, b, c := discAngles(rSat, rSun)
	return visibleFraction(a, b, c)
}

// shadowMargins returns two functions of position that are continuous in time
// and change sign at the shadow boundaries: penumbra = c − (a+b) is negative
// inside the penumbra cone (partial or total shadow), umbra = c − (b−a) is
// negative inside the umbra.
func shadowMargins(rSat, rSun r3.Vec) (penumbra, umbra float64) {
	a, b, c := discAngles(rSat, rSun)
	return c - (a + b), c - (b - a)
}
