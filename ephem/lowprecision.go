package ephem

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"
)

// LowPrecision is the Astronomical Almanac's low-precision solar
// ephemeris (AA section C, "Low-precision formulas for the Sun"; stated
// accuracy 0.01° for 1950–2050), with the mean-of-date result precessed to
// EME2000 by IAU 1976 precession. The direction is apparent (the AA mean
// longitude includes annual aberration); the distance is geometric.
// The zero value is ready to use.
type LowPrecision struct{}

// Position implements Sun.
func (LowPrecision) Position(jdTT float64) (r3.Vec, float64) {
	x, y, z, rAU := lowPrecisionOfDate(jdTT)
	P := precessionJ2000ToDate(CenturiesTT(jdTT))
	x, y, z = P.mulTrans(x, y, z)
	return r3.Vec{X: x, Y: y, Z: z}, rAU * AUKm
}

// lowPrecisionOfDate returns the AA low-precision unit vector to the sun on
// the mean equator and equinox of date, and the distance in AU.
func lowPrecisionOfDate(jdTT float64) (x, y, z, rAU float64) {
	n := jdTT - JDJ2000
	// AA section C, low-precision formulas for the Sun (degrees).
	L := math.Mod(280.460+0.9856474*n, 360)       // mean longitude, aberration included
	g := math.Mod(357.528+0.9856003*n, 360) * deg // mean anomaly
	sg, cg := math.Sincos(g)                      //
	s2g, c2g := 2*sg*cg, cg*cg-sg*sg              // sin 2g, cos 2g
	λ := (L + 1.915*sg + 0.020*s2g) * deg         // ecliptic longitude (β = 0)
	ε := (23.439 - 0.0000004*n) * deg             // obliquity of the ecliptic
	rAU = 1.00014 - 0.01671*cg - 0.00014*c2g      // distance, AU
	sλ, cλ := math.Sincos(λ)                      //
	sε, cε := math.Sincos(ε)                      //
	return cλ, cε * sλ, sε * sλ, rAU              // equatorial of date
}
