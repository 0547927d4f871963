package illum

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/internal/vecmath"
)

// BetaAngle returns the sun's elevation above the orbit plane, rad, positive
// on the side of the orbit normal h = r × v: β = asin(ĥ · ŝ) (Rickman, NASA
// TFAWS 2014, "Introduction to On-Orbit Thermal Environments"; from memory).
func BetaAngle(r, v, sunDir r3.Vec) float64 {
	return math.Asin(SinBetaAngle(r, v, sunDir))
}

// SinBetaAngle is sin β, the sine of BetaAngle, without the arcsine (the
// step loop tracks extremes of sin β, which is monotonic in β).
func SinBetaAngle(r, v, sunDir r3.Vec) float64 {
	h := r3.Cross(r, v)
	return clamp1(r3.Dot(h, sunDir) / (vecmath.Norm(h) * vecmath.Norm(sunDir)))
}

// BetaAngleElements returns the beta angle, rad, from the orbit inclination
// and RAAN (equatorial frame), the sun's ecliptic longitude Γ and the
// obliquity ε, all in radians:
//
//	β = asin(cos Γ sin Ω sin i − sin Γ cos ε cos Ω sin i + sin Γ sin ε cos i)
//
// (Rickman, NASA TFAWS 2014; from memory). It is the dot product of the
// orbit normal ĥ = (sin i sin Ω, −sin i cos Ω, cos i) with the sun direction
// (cos Γ, sin Γ cos ε, sin Γ sin ε), so it neglects the sun's ecliptic
// latitude (< 1.2″).
func BetaAngleElements(inc, raan, sunEclLon, obliquity float64) float64 {
	si, ci := math.Sincos(inc)
	sΩ, cΩ := math.Sincos(raan)
	sΓ, cΓ := math.Sincos(sunEclLon)
	sε, cε := math.Sincos(obliquity)
	return math.Asin(clamp1(cΓ*sΩ*si - sΓ*cε*cΩ*si + sΓ*sε*ci))
}

// BetaCritical returns the beta angle above which a circular orbit of radius
// aKm has no eclipse in the cylindrical shadow: β* = asin(Rₑ/a) (Rickman,
// TFAWS 2014; from memory). It is the Earth's angular radius seen from the
// orbit, and NaN for a ≤ Rₑ.
func BetaCritical(aKm float64) float64 {
	if !(aKm > EarthRadiusKm) {
		return math.NaN()
	}
	return math.Asin(EarthRadiusKm / aKm)
}

// EclipseFractionCircular returns the fraction of a circular orbit at
// altitude altKm spent in the Earth's cylindrical shadow at beta angle beta
// (rad):
//
//	f = (1/π) acos(√(h² + 2Rₑh) / ((Rₑ + h) cos β))   for |β| < β*, else 0
//
// (Rickman, TFAWS 2014; Gilmore, Spacecraft Thermal Control Handbook Vol. I,
// 2nd ed. 2002, ch. 2; both from memory). It is NaN for altKm ≤ 0.
func EclipseFractionCircular(altKm, beta float64) float64 {
	if !(altKm > 0) {
		return math.NaN()
	}
	r := EarthRadiusKm + altKm
	if math.Abs(beta) >= BetaCritical(r) {
		return 0
	}
	return math.Acos(math.Sqrt(altKm*altKm+2*EarthRadiusKm*altKm)/(r*math.Cos(beta))) / math.Pi
}
