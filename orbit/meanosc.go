package orbit

import "math"

// equinoctial are the non-singular elements (a, h, k, p, q, λ) of Broucke &
// Cefola 1972, Celest. Mech. 5, 303 (from memory), prograde form:
// h = e sin ϖ, k = e cos ϖ, p = tan(i/2) sin Ω, q = tan(i/2) cos Ω,
// λ = M + ϖ, ϖ = ω + Ω. They stay defined for circular and equatorial
// orbits, which is why the averaging below works in them.
type equinoctial struct{ a, h, k, p, q, λ float64 }

func toEquinoctial(el Elements) equinoctial {
	ϖ := el.ArgPerigee + el.RAAN
	t := math.Tan(el.Inclination / 2)
	sϖ, cϖ := math.Sincos(ϖ)
	sΩ, cΩ := math.Sincos(el.RAAN)
	return equinoctial{a: el.SemiMajorAxisKm, h: el.Eccentricity * sϖ, k: el.Eccentricity * cϖ,
		p: t * sΩ, q: t * cΩ, λ: el.MeanAnomaly + ϖ}
}

func (q equinoctial) elements() Elements {
	el := Elements{SemiMajorAxisKm: q.a, Eccentricity: math.Hypot(q.h, q.k), Inclination: 2 * math.Atan(math.Hypot(q.p, q.q))}
	if el.Inclination >= singularTol {
		el.RAAN = wrap2π(math.Atan2(q.p, q.q))
	}
	ϖ := el.RAAN
	if el.Eccentricity >= singularTol {
		ϖ = math.Atan2(q.h, q.k)
		el.ArgPerigee = wrap2π(ϖ - el.RAAN)
	}
	el.MeanAnomaly = wrap2π(q.λ - ϖ)
	return el
}

// wrapπ returns x reduced to [−π, π).
func wrapπ(x float64) float64 { return wrap2π(x+math.Pi) - math.Pi }

// rotate2 turns (x, y) by angle α.
func rotate2(x, y, α float64) (float64, float64) {
	s, c := math.Sincos(α)
	return c*x - s*y, s*x + c*y
}

// Averaging parameters: samples per orbit and refinement passes.
const (
	averageSamples = 96
	averagePasses  = 3
)

// OsculatingToMean returns the first-order J2 mean elements of osculating
// elements osc: mean elements in Kozai's sense (Kozai 1959, AJ 64, 367), the
// osculating elements with their short-period J2 terms removed, so that the
// mean elements move only with the secular rates of J2Rates.
//
// Instead of Kozai's closed-form short-period series, the short-period part
// is removed by averaging: the orbit is integrated over one anomalistic
// period with the point-mass + J2 force, the osculating equinoctial elements
// are sampled uniformly in time, the secular drift (J2Rates of the current
// mean estimate) is taken out, and the samples are averaged (the trapezoid
// rule, spectrally accurate for a periodic signal). To first order in J2
// this is Kozai's definition (short-period terms have zero mean over M).
// The period and rates are refined over three passes. Long-period terms
// (Brouwer 1959, with their 1/(1 − 5 cos² i) factor) are not removed.
func OsculatingToMean(osc Elements) Elements {
	s0 := osc.State()
	y0 := pack(s0)
	mean := osc
	for range averagePasses {
		dΩ, dω, dM := J2Rates(mean)
		T := 2 * math.Pi / dM
		rk := newDopri5(j2Deriv, 0, y0, T/1000, 1e-12, 1e-10, T/40)
		q0 := toEquinoctial(osc)
		var sum equinoctial
		for j := range averageSamples {
			t := T * float64(j) / averageSamples
			var y vec6
			rk.advanceTo(t, &y)
			el := elementsFromConic(conicFromState(unpack(&y), MuEarth))
			q := toEquinoctial(el)
			k, h := rotate2(q.k, q.h, -(dω+dΩ)*t)
			qq, p := rotate2(q.q, q.p, -dΩ*t)
			sum.a += q.a
			sum.h += h
			sum.k += k
			sum.p += p
			sum.q += qq
			sum.λ += wrapπ(q.λ - q0.λ - (dM+dω+dΩ)*t)
		}
		const n = averageSamples
		mean = equinoctial{a: sum.a / n, h: sum.h / n, k: sum.k / n, p: sum.p / n, q: sum.q / n, λ: q0.λ + sum.λ/n}.elements()
	}
	return mean
}

// j2Deriv is the point-mass + J2 right-hand side for the averaging.
func j2Deriv(_ float64, y *vec6, dy *vec6) {
	acc := accelJ2(unpack(y).R, true)
	dy[0], dy[1], dy[2] = y[3], y[4], y[5]
	dy[3], dy[4], dy[5] = acc.X, acc.Y, acc.Z
}

// MeanToOsculating returns the osculating elements whose first-order J2 mean
// elements (OsculatingToMean) are mean. It inverts OsculatingToMean by
// fixed-point iteration on the equinoctial elements: osc ← osc + (mean −
// OsculatingToMean(osc)), which converges geometrically (the short-period
// terms are of order J2 ≈ 1e-3), until the semi-major axis agrees to 1 mm.
func MeanToOsculating(mean Elements) Elements {
	target := toEquinoctial(mean)
	cur := target
	for range 12 {
		m := toEquinoctial(OsculatingToMean(cur.elements()))
		d := equinoctial{a: target.a - m.a, h: target.h - m.h, k: target.k - m.k,
			p: target.p - m.p, q: target.q - m.q, λ: wrapπ(target.λ - m.λ)}
		cur.a += d.a
		cur.h += d.h
		cur.k += d.k
		cur.p += d.p
		cur.q += d.q
		cur.λ += d.λ
		if math.Abs(d.a) < 1e-6 && math.Abs(d.λ) < 1e-10 && math.Abs(d.h)+math.Abs(d.k)+math.Abs(d.p)+math.Abs(d.q) < 1e-10 {
			break
		}
	}
	return cur.elements()
}
