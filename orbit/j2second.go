package orbit

import "math"

// J2RatesSecondOrder returns the secular rates (rad/s) of RAAN, argument of
// perigee and mean anomaly to second order in J2 on mean elements el,
// Brouwer's secular terms (Brouwer 1959, AJ 64, 378, from memory), with
// γ = J2 R²/(2p²), η = √(1−e²), θ = cos i:
//
//	dM/dt = n[1 + (3/2)γη(3θ²−1) + (3/32)γ²η(−15+16η+25η² + (30−96η−90η²)θ² + (105+144η+25η²)θ⁴)]
//	dω/dt = n[(3/2)γ(5θ²−1) + (3/32)γ²(−35+24η+25η² + (90−192η−126η²)θ² + (385+360η+45η²)θ⁴)]
//	dΩ/dt = n[−3γθ + (3/8)γ²((−5+12η+9η²)θ + (−35−36η−5η²)θ³)]
//
// The first-order parts are J2Rates; at e = 0 the second-order parts reduce
// to the J2² terms of SGP4's secular rates (Hoots & Roehrich 1980,
// Spacetrack Report No. 3), which the tests check.
func J2RatesSecondOrder(el Elements) (dRAAN, dArgP, dM float64) {
	a, e := el.SemiMajorAxisKm, el.Eccentricity
	n := math.Sqrt(MuEarth / (a * a * a))
	p := a * (1 - e*e) / RadiusEarthKm
	γ := J2 / (2 * p * p)
	η := math.Sqrt(1 - e*e)
	θ := math.Cos(el.Inclination)
	θ2 := θ * θ
	dM = n * (1 + 1.5*γ*η*(3*θ2-1) +
		3.0/32*γ*γ*η*(-15+16*η+25*η*η+(30-96*η-90*η*η)*θ2+(105+144*η+25*η*η)*θ2*θ2))
	dArgP = n * (1.5*γ*(5*θ2-1) +
		3.0/32*γ*γ*(-35+24*η+25*η*η+(90-192*η-126*η*η)*θ2+(385+360*η+45*η*η)*θ2*θ2))
	dRAAN = n * (-3*γ*θ + 3.0/8*γ*γ*((-5+12*η+9*η*η)*θ+(-35-36*η-5*η*η)*θ2*θ))
	return dRAAN, dArgP, dM
}
