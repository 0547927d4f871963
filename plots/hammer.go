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
