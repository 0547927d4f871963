package sim

import (
	"math"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
)

// sunKnotS is the spacing of the sun evaluations the step loop interpolates
// between. The sun moves 0.0411°/h, so over a 600 s chord the linear
// interpolation of the unit vector errs by at most (ω·Δt)²/8 ≈ 2e-9 rad and
// the distance by about (Δt²/8)·|d̈| ≈ 5 m (closed form): far below the 0.01° of the
// ephemeris itself, at a fraction of its cost per step.
const sunKnotS = 600

// moonKnotS is the spacing of the Moon evaluations (newMoonCache). The Moon
// moves 2.66e-6 rad/s, so over a 1800 s chord the unit vector errs by at
// most (ω·Δt)²/8 ≈ 3e-6 rad (0.6″) and the distance by about 60 m (closed
// form), against Meeus's 10″: one evaluation of the lunar series (1.5 µs)
// per 180 steps of 10 s.
const moonKnotS = 1800

// sunCache serves the sun at seconds t after the epoch by linear
// interpolation between evaluations every knot seconds (sunKnotS); it
// serves the Moon as well (newMoonCache: ephem.Moon has the same method
// set).
type sunCache struct {
	sun    ephem.Sun
	jd0    float64
	knot   float64 // s
	k      int     // knot index held, −1 when empty
	u0, u1 r3.Vec
	d0, d1 float64
}

func newSunCache(sun ephem.Sun, jd0 float64) *sunCache {
	return &sunCache{sun: sun, jd0: jd0, knot: sunKnotS, k: -1}
}

// newMoonCache interpolates ephem.Moon between knots moonKnotS apart.
func newMoonCache(jd0 float64) *sunCache {
	return &sunCache{sun: ephem.Moon{}, jd0: jd0, knot: moonKnotS, k: -1}
}

// at returns the unit vector to the sun (EME2000) and its distance (km).
func (c *sunCache) at(t float64) (r3.Vec, float64) {
	k := int(math.Floor(t / c.knot))
	if k != c.k {
		t0 := float64(k) * c.knot
		if k == c.k+1 && c.k >= 0 {
			// The next chord starts where the last one ended (the same
			// evaluation, so the same numbers).
			c.u0, c.d0 = c.u1, c.d1
		} else {
			c.u0, c.d0 = c.sun.Position(c.jd0 + t0/86400)
		}
		c.k = k
		c.u1, c.d1 = c.sun.Position(c.jd0 + (t0+c.knot)/86400)
	}
	f := t/c.knot - float64(k)
	u := r3.Add(c.u0, r3.Scale(f, r3.Sub(c.u1, c.u0)))
	return r3.Scale(1/math.Sqrt(r3.Norm2(u)), u), c.d0 + f*(c.d1-c.d0)
}
