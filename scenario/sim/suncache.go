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

// sunCache serves the sun at seconds t after the epoch by linear
// interpolation between evaluations every sunKnotS seconds.
type sunCache struct {
	sun    ephem.Sun
	jd0    float64
	k      int // knot index held, −1 when empty
	u0, u1 r3.Vec
	d0, d1 float64
}

func newSunCache(sun ephem.Sun, jd0 float64) *sunCache {
	return &sunCache{sun: sun, jd0: jd0, k: -1}
}

// at returns the unit vector to the sun (EME2000) and its distance (km).
func (c *sunCache) at(t float64) (r3.Vec, float64) {
	k := int(math.Floor(t / sunKnotS))
	if k != c.k {
		c.k = k
		t0 := float64(k) * sunKnotS
		c.u0, c.d0 = c.sun.Position(c.jd0 + t0/86400)
		c.u1, c.d1 = c.sun.Position(c.jd0 + (t0+sunKnotS)/86400)
	}
	f := t/sunKnotS - float64(k)
	u := r3.Add(c.u0, r3.Scale(f, r3.Sub(c.u1, c.u0)))
	return r3.Scale(1/math.Sqrt(r3.Norm2(u)), u), c.d0 + f*(c.d1-c.d0)
}
