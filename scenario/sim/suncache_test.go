package sim

import (
	"math"
	"math/rand/v2"
	"testing"

	"gonum.org/v1/gonum/spatial/r3"

	"codeberg.org/sunsight/sunsight/ephem"
	"codeberg.org/sunsight/sunsight/internal/vecmath"
	"codeberg.org/sunsight/sunsight/orbit/attitude"
)

// worstInterpolation returns the worst direction (rad) and distance (km)
// error of a cache against the ephemeris it interpolates, over three days.
func worstInterpolation(c *sunCache, src ephem.Sun, jd0 float64) (ang, dist float64) {
	for ts := 0.0; ts < 3*86400; ts += 37 {
		u, d := c.at(ts)
		u2, d2 := src.Position(jd0 + ts/86400)
		ang = math.Max(ang, angleBetween(u, u2))
		dist = math.Max(dist, math.Abs(d-d2))
	}
	return ang, dist
}

// The interpolated sun stays within 1e-8 rad and 10 m of the ephemeris it
// interpolates (closed-form bound in suncache.go: 2e-9 rad, 5 m); the Moon
// within 1e-5 rad (2″) and 0.2 km of ephem.Moon (bound: 3e-6 rad, 60 m).
func TestCachesMatchTheirEphemerides(t *testing.T) {
	jd0 := 2461406.5
	for _, k := range []struct {
		name          string
		c             *sunCache
		src           ephem.Sun
		maxAng, maxKm float64
	}{
		{"sun", newSunCache(ephem.LowPrecision{}, jd0), ephem.LowPrecision{}, 1e-8, 0.01},
		{"Moon", newMoonCache(jd0), ephem.Moon{}, 1e-5, 0.2},
	} {
		ang, d := worstInterpolation(k.c, k.src, jd0)
		if ang > k.maxAng || d > k.maxKm {
			t.Errorf("%s: worst %g rad, %g km", k.name, ang, d)
		}
		t.Logf("%s: worst interpolation error %.2g rad, %.2g km", k.name, ang, d)
	}
}

// The attitude matrix rotates like the quaternion it comes from (gonum's
// r3.Rotation is the reference), both ways.
func TestBodyMatrixMatchesQuaternion(t *testing.T) {
	rng := rand.New(rand.NewPCG(5, 6))
	for range 1000 {
		q := attitude.UniformRotation(rng)
		A := attitudeRot(q)
		M := A.matrix()
		v := r3.Vec{X: rng.NormFloat64(), Y: rng.NormFloat64(), Z: rng.NormFloat64()}
		if d := vecmath.Norm(r3.Sub(M.toBody(v), A.toBody(v))); d > 1e-14*vecmath.Norm(v) {
			t.Fatalf("toBody differs by %g", d)
		}
		if d := vecmath.Norm(r3.Sub(M.toECI(v), A.toECI(v))); d > 1e-14*vecmath.Norm(v) {
			t.Fatalf("toECI differs by %g", d)
		}
	}
}
