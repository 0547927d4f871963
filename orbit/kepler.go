package orbit

import "math"

// keplerMaxIter bounds Newton's iteration. From Danby's start the method
// converges in a handful of steps for e ≤ 0.99 (measured over a grid of
// M in the tests); the bound only guards against NaN input.
const keplerMaxIter = 30

// EccentricAnomaly solves Kepler's equation M = E − e sin E for the
// eccentric anomaly E (radians) of an ellipse, 0 ≤ e < 1.
//
// Newton's method, Vallado 4th ed. (2013) Algorithm 2 p. 65, started at
// E0 = M + 0.85 e·sign(sin M) (Danby 1987, Celest. Mech. 40, 303, from
// memory), which converges for every M when e < 1. The result has the same
// whole number of turns as M: E − M is in (−π, π).
func EccentricAnomaly(M, e float64) float64 {
	if e == 0 {
		return M
	}
	// Reduce M to (−π, π] to keep the start near the root.
	turns := math.Round(M / (2 * math.Pi))
	m := M - turns*2*math.Pi
	E := m + 0.85*e*math.Copysign(1, math.Sin(m))
	for range keplerMaxIter {
		s, c := math.Sincos(E)
		// Vallado 4th ed. eq. (2-4) p. 65: Newton step on f(E) = E − e sin E − M.
		dE := (E - e*s - m) / (1 - e*c)
		E -= dE
		// Newton converges quadratically: once a step is below 1e-10 the
		// error left is about 1e-20·|f''/2f'|, so one more step reaches
		// round-off. (A tolerance at round-off itself may never be met.)
		if math.Abs(dE) < 1e-10 {
			s, c := math.Sincos(E)
			E -= (E - e*s - m) / (1 - e*c)
			break
		}
	}
	return E + turns*2*math.Pi
}

// TrueFromEccentric returns the true anomaly ν for eccentric anomaly E,
// tan(ν/2) = √((1+e)/(1−e)) tan(E/2) (Vallado 4th ed. eq. (2-14) p. 48),
// evaluated in the quadrant-safe form atan2(√(1−e²) sin E, cos E − e).
func TrueFromEccentric(E, e float64) float64 {
	s, c := math.Sincos(E)
	return math.Atan2(math.Sqrt(1-e*e)*s, c-e)
}

// EccentricFromTrue is the inverse of TrueFromEccentric:
// E = atan2(√(1−e²) sin ν, e + cos ν) (Vallado 4th ed. eq. (2-9) p. 47).
func EccentricFromTrue(nu, e float64) float64 {
	s, c := math.Sincos(nu)
	return math.Atan2(math.Sqrt(1-e*e)*s, e+c)
}
