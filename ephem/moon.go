package ephem

import (
	"math"

	"github.com/soniakeys/meeus/v3/moonposition"
	"github.com/soniakeys/meeus/v3/nutation"
	"gonum.org/v1/gonum/spatial/r3"
)

// MoonRadiusKm is the mean radius of the Moon (IAU WG on Cartographic
// Coordinates and Rotational Elements, Archinal et al. 2018: 1737.4 km).
const MoonRadiusKm = 1737.4

// MoonModel and MoonSource say what Moon models and where it comes from (the
// report's models table prints them).
const (
	MoonModel  = "geocentric Moon from the principal terms of ELP-2000/82 via github.com/soniakeys/meeus/v3/moonposition, precessed to EME2000; from the spacecraft by subtracting its position; illuminated fraction from the phase angle"
	MoonSource = "J. Meeus, Astronomical Algorithms, 2nd ed., 1998, ch. 47 and 48; checked against astropy get_body('moon') (built-in ephemeris) to 0.0001°"
)

// Moon is the lunar theory of Meeus, Astronomical Algorithms 2nd ed. 1998,
// ch. 47 (the principal terms of ELP-2000/82, stated about 10″ in longitude
// and 4″ in latitude) through github.com/soniakeys/meeus/v3/moonposition.
// Position gives the geocentric Moon in EME2000: the longitude and latitude
// on the mean ecliptic and equinox of date are turned into the mean equator
// of date by the mean obliquity of date (Meeus (22.2), nutation.MeanObliquity)
// and brought to J2000 by IAU 1976 precession. Nutation is not applied (the
// frame is the mean one). It has the method set of Sun, so the step loop's
// interpolation serves it as well. The zero value is ready to use.
type Moon struct{}

// MoonEclipticOfDate returns the geocentric longitude λ and latitude β (rad)
// of the Moon on the mean ecliptic and equinox of the date and its distance
// (km, centre to centre), at the TT Julian date jdTT (Meeus 1998 ch. 47;
// TDB = TT).
func MoonEclipticOfDate(jdTT float64) (λ, β, distKm float64) {
	l, b, d := moonposition.Position(jdTT)
	return l.Rad(), b.Rad(), d
}

// Position returns the unit vector from the Earth's centre to the Moon in
// EME2000 and the distance in km.
func (Moon) Position(jdTT float64) (r3.Vec, float64) {
	λ, β, d := MoonEclipticOfDate(jdTT)
	sε, cε := math.Sincos(nutation.MeanObliquity(jdTT).Rad())
	sλ, cλ := math.Sincos(λ)
	sβ, cβ := math.Sincos(β)
	// Ecliptic → equator of date: a rotation by ε about the x axis.
	x, y, z := cβ*cλ, cε*cβ*sλ-sε*sβ, sε*cβ*sλ+cε*sβ
	P := precessionJ2000ToDate(CenturiesTT(jdTT))
	x, y, z = P.mulTrans(x, y, z)
	return r3.Vec{X: x, Y: y, Z: z}, d
}

// MoonPhaseAngle returns the phase angle i (rad) of the Moon, the angle at
// the Moon between the sun and the Earth, from geocentric vectors to the
// Moon and to the sun (any common unit): Meeus 1998 (48.2) and (48.3),
// tan i = R·sin ψ / (Δ − R·cos ψ) with ψ the geocentric elongation.
// base.Illuminated(i) is then (48.1).
func MoonPhaseAngle(moon, sun r3.Vec) float64 {
	Δ, R := math.Sqrt(r3.Norm2(moon)), math.Sqrt(r3.Norm2(sun))
	cψ := r3.Dot(moon, sun) / (Δ * R)
	sψ := math.Sqrt(r3.Norm2(r3.Cross(moon, sun))) / (Δ * R)
	return math.Atan2(R*sψ, Δ-R*cψ)
}

// MoonIlluminatedFraction returns the illuminated fraction k of the Moon's
// disc seen from the Earth, k = (1 + cos i)/2 (Meeus 1998 (48.1)), from
// geocentric vectors to the Moon and to the sun. cos i is taken straight
// from the triangle Earth–Moon–sun, the angle at the Moon between the sun
// (sun − moon) and the Earth (−moon), which is (48.3) without its
// arctangent; the step loop calls it every step.
func MoonIlluminatedFraction(moon, sun r3.Vec) float64 {
	toSun := r3.Sub(sun, moon)
	cosI := -r3.Dot(toSun, moon) / math.Sqrt(r3.Norm2(toSun)*r3.Norm2(moon))
	return (1 + cosI) / 2
}
