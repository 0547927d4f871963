package plots

import "math"

// Hammer returns the Hammer (Hammer–Aitoff) equal-area projection of the
// direction at longitude λ and latitude φ (radians) on the unit sphere.
// The whole sphere maps into the ellipse x²/8 + y²/2 = 1, whose area 4π
// equals the sphere's.
//
// Snyder 1987, "Map Projections — A Working Manual", USGS PP 1395,
// section on the Hammer projection (from memory; equation number and page
// not checked). The test checks the closed-form centre and boundary and the
// equal-area property numerically:
//
//	x = 2√2 cos φ sin(λ/2) / √(1 + cos φ cos(λ/2))
//	y =  √2 sin φ          / √(1 + cos φ cos(λ/2))
func Hammer(λ, φ float64) (x, y float64) {
	sφ, cφ := math.Sincos(φ)
	sh, ch := math.Sincos(λ / 2)
	d := math.Sqrt(1 + cφ*ch)
	return 2 * math.Sqrt2 * cφ * sh / d, math.Sqrt2 * sφ / d
}

// InverseHammer returns the longitude λ and latitude φ (radians) of the
// point (x, y) of the Hammer projection; ok is false outside the boundary
// ellipse x²/8 + y²/2 = 1. Snyder 1987 (from memory), checked here by the
// round trip through Hammer:
//
//	z = √(1 − (x/4)² − (y/2)²)
//	λ = 2 atan2(z x, 2 (2z² − 1)),  φ = asin(z y)
func InverseHammer(x, y float64) (λ, φ float64, ok bool) {
	if x*x/8+y*y/2 > 1 {
		return 0, 0, false
	}
	z := math.Sqrt(max(0, 1-x*x/16-y*y/4))
	return 2 * math.Atan2(z*x, 2*(2*z*z-1)), math.Asin(max(-1, min(1, z*y))), true
}
