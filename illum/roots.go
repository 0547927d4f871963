package illum

import "math"

// brentRoot finds a zero of f in [a, b], where f(a) and f(b) have opposite
// signs (or one is zero), to an absolute tolerance tol in x. It is Brent's
// method: inverse quadratic interpolation and secant steps safeguarded by
// bisection (Brent, Algorithms for Minimization without Derivatives,
// Prentice-Hall 1973, ch. 4, procedure zero; transcribed from memory).
func brentRoot(f func(float64) float64, a, b, fa, fb, tol float64) float64 {
	if fa == 0 {
		return a
	}
	if fb == 0 {
		return b
	}
	c, fc := a, fa
	d := b - a
	e := d
	for range 100 {
		if (fb > 0) == (fc > 0) {
			c, fc = a, fa
			d = b - a
			e = d
		}
		if math.Abs(fc) < math.Abs(fb) {
			a, b, c = b, c, b
			fa, fb, fc = fb, fc, fb
		}
		tol1 := 2*2.220446049250313e-16*math.Abs(b) + 0.5*tol
		m := 0.5 * (c - b)
		if math.Abs(m) <= tol1 || fb == 0 {
			return b
		}
		if math.Abs(e) >= tol1 && math.Abs(fa) > math.Abs(fb) {
			var p, q float64
			s := fb / fa
			if a == c {
				// Secant step.
				p = 2 * m * s
				q = 1 - s
			} else {
				// Inverse quadratic interpolation.
				q = fa / fc
				r := fb / fc
				p = s * (2*m*q*(q-r) - (b-a)*(r-1))
				q = (q - 1) * (r - 1) * (s - 1)
			}
			if p > 0 {
				q = -q
			} else {
				p = -p
			}
			if 2*p < min(3*m*q-math.Abs(tol1*q), math.Abs(e*q)) {
				e = d
				d = p / q
			} else {
				d = m
				e = m
			}
		} else {
			d = m
			e = m
		}
		a, fa = b, fb
		if math.Abs(d) > tol1 {
			b += d
		} else if m > 0 {
			b += tol1
		} else {
			b -= tol1
		}
		fb = f(b)
	}
	return b
}

// goldenMin returns the abscissa and value of a minimum of f on [a, b] by
// golden-section search to an absolute tolerance tol in x (Kiefer,
// Proc. AMS 4, 1953; common textbook method).
func goldenMin(f func(float64) float64, a, b, tol float64) (float64, float64) {
	const invφ = 0.6180339887498949 // (√5 − 1)/2
	x1 := b - invφ*(b-a)
	x2 := a + invφ*(b-a)
	f1, f2 := f(x1), f(x2)
	for b-a > tol {
		if f1 < f2 {
			b, x2, f2 = x2, x1, f1
			x1 = b - invφ*(b-a)
			f1 = f(x1)
		} else {
			a, x1, f1 = x1, x2, f2
			x2 = a + invφ*(b-a)
			f2 = f(x2)
		}
	}
	if f1 < f2 {
		return x1, f1
	}
	return x2, f2
}
